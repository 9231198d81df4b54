//! Writing a figure to the files asked for: drawn once as SVG; the PNG is that SVG rasterised
//! (`sunlot::render::rasterise_svg`), so both files show one picture.

use std::path::Path;

use sunlot::render::Svg;

/// Draws a `size` figure with `draw` and writes it to `png` and/or `svg`; returns a note per file
/// ("`what` written to FILE (PNG)"). Nothing is drawn when neither file is asked for.
///
/// # Errors
/// The drawing's own error, or a file that cannot be written (named).
pub fn write_figure(
    size: (u32, u32),
    png: Option<&Path>,
    svg: Option<&Path>,
    what: &str,
    draw: impl FnOnce(&mut Svg) -> Result<(), String>,
) -> Result<Vec<String>, String> {
    if png.is_none() && svg.is_none() {
        return Ok(Vec::new());
    }
    let mut doc = Svg::new(size.0, size.1);
    draw(&mut doc)?;
    let text = doc.finish();
    let write = |path: &Path, bytes: &[u8]| std::fs::write(path, bytes).map_err(|e| format!("{}: {e}", path.display()));
    let mut notes = Vec::new();
    if let Some(path) = png {
        let bytes = png_of(&text).map_err(|e| format!("{}: {e}", path.display()))?;
        write(path, &bytes)?;
        notes.push(format!("{what} written to {} (PNG)", path.display()));
    }
    if let Some(path) = svg {
        write(path, text.as_bytes())?;
        notes.push(format!("{what} written to {} (SVG)", path.display()));
    }
    Ok(notes)
}

#[cfg(not(target_arch = "wasm32"))]
fn png_of(svg: &str) -> Result<Vec<u8>, String> {
    sunlot::render::rasterise_svg(svg).and_then(|r| r.to_png()).map_err(|e| e.to_string())
}

/// The command line is a native program; a wasm32 build of it (for lints) has no rasteriser.
#[cfg(target_arch = "wasm32")]
fn png_of(_svg: &str) -> Result<Vec<u8>, String> {
    Err("PNG export needs the native build of sunlot".into())
}
