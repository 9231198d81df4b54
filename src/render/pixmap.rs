//! The raster back end (native only): a figure drawn as SVG and rasterised by `resvg`, with DejaVu Sans
//! (from the `dejavu` crate) embedded as the only font, so a PNG is the SVG export's own picture —
//! anti-aliased shapes, dashes, proportional text — on any machine, with no system fonts.

use std::sync::{Arc, OnceLock};

use super::draw::{Anchor, Colour, Draw, Image};
use super::svg::Svg;

/// Why a figure could not be rasterised.
#[derive(Debug, Clone, PartialEq, Eq, thiserror::Error)]
pub enum RasterError {
    /// The SVG the figure drew was refused by the SVG reader (a defect of the figure).
    #[error("the figure's SVG could not be read: {0}")]
    Svg(String),
    /// The figure has no pixels or more than the rasteriser takes.
    #[error("a {0} × {1} px figure cannot be rasterised")]
    Size(u32, u32),
    /// The PNG encoder failed.
    #[error("the PNG encoder failed: {0}")]
    Png(String),
}

/// An RGBA image drawn through the SVG back end and rasterised on demand.
#[derive(Debug, Clone)]
pub struct Pixmap {
    svg: Svg,
}

/// The rasterised pixels of a figure.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Raster {
    /// Width, pixels.
    pub width: u32,
    /// Height, pixels.
    pub height: u32,
    /// RGBA, row-major from the top, not premultiplied.
    pub rgba: Vec<u8>,
}

impl Raster {
    /// The RGB of the pixel at (`x`, `y`); white outside the image.
    pub fn rgb(&self, x: u32, y: u32) -> [u8; 3] {
        if x >= self.width || y >= self.height {
            return [255, 255, 255];
        }
        let i = ((y * self.width + x) * 4) as usize;
        [self.rgba[i], self.rgba[i + 1], self.rgba[i + 2]]
    }

    /// The image as PNG.
    ///
    /// # Errors
    /// [`RasterError::Png`] if the encoder fails.
    pub fn to_png(&self) -> Result<Vec<u8>, RasterError> {
        let size = resvg::tiny_skia::IntSize::from_wh(self.width, self.height)
            .ok_or(RasterError::Size(self.width, self.height))?;
        let pixmap = resvg::tiny_skia::Pixmap::from_vec(self.rgba.clone(), size)
            .ok_or(RasterError::Size(self.width, self.height))?;
        pixmap.encode_png().map_err(|e| RasterError::Png(e.to_string()))
    }
}

/// The font database every rasterised figure uses: DejaVu Sans regular and bold, nothing else.
fn fonts() -> Arc<resvg::usvg::fontdb::Database> {
    static FONTS: OnceLock<Arc<resvg::usvg::fontdb::Database>> = OnceLock::new();
    FONTS
        .get_or_init(|| {
            let mut db = resvg::usvg::fontdb::Database::new();
            db.load_font_data(dejavu::sans::regular().to_vec());
            db.load_font_data(dejavu::sans::bold().to_vec());
            db.set_sans_serif_family("DejaVu Sans");
            Arc::new(db)
        })
        .clone()
}

/// Rasterises an SVG document at its own size onto white paper.
///
/// # Errors
/// [`RasterError`] when the document cannot be read or sized.
pub fn rasterise_svg(svg: &str) -> Result<Raster, RasterError> {
    let options =
        resvg::usvg::Options { font_family: "DejaVu Sans".into(), fontdb: fonts(), ..resvg::usvg::Options::default() };
    let tree = resvg::usvg::Tree::from_str(svg, &options).map_err(|e| RasterError::Svg(e.to_string()))?;
    let size = tree.size().to_int_size();
    let (w, h) = (size.width(), size.height());
    let mut pixmap = resvg::tiny_skia::Pixmap::new(w, h).ok_or(RasterError::Size(w, h))?;
    pixmap.fill(resvg::tiny_skia::Color::WHITE);
    resvg::render(&tree, resvg::tiny_skia::Transform::identity(), &mut pixmap.as_mut());
    // Opaque paper under everything: premultiplied and plain RGBA are the same bytes.
    Ok(Raster { width: w, height: h, rgba: pixmap.take() })
}

impl Pixmap {
    /// A blank figure, `width` × `height` pixels (at least 1 × 1).
    pub fn new(width: u32, height: u32) -> Self {
        Pixmap { svg: Svg::new(width.max(1), height.max(1)) }
    }

    /// The figure's pixels.
    ///
    /// # Errors
    /// [`RasterError`] if the drawing cannot be rasterised.
    pub fn render(&self) -> Result<Raster, RasterError> {
        rasterise_svg(&self.svg.finish())
    }

    /// The figure as PNG.
    ///
    /// # Errors
    /// [`RasterError`] if the drawing cannot be rasterised or encoded.
    pub fn to_png(&self) -> Result<Vec<u8>, RasterError> {
        self.render()?.to_png()
    }

    /// The SVG document drawn so far.
    pub fn svg(&self) -> String {
        self.svg.finish()
    }
}

impl Draw for Pixmap {
    fn size(&self) -> (u32, u32) {
        self.svg.size()
    }
    fn fill_polygon(&mut self, rings: &[Vec<(f64, f64)>], fill: Colour) {
        self.svg.fill_polygon(rings, fill);
    }
    fn stroke(&mut self, points: &[(f64, f64)], width_px: f64, colour: Colour, closed: bool) {
        self.svg.stroke(points, width_px, colour, closed);
    }
    fn text(&mut self, x: f64, y: f64, size_px: f64, text: &str, colour: Colour, anchor: Anchor) {
        self.svg.text(x, y, size_px, text, colour, anchor);
    }
    fn text_vertical(&mut self, x: f64, y: f64, size_px: f64, text: &str, colour: Colour, anchor: Anchor) {
        self.svg.text_vertical(x, y, size_px, text, colour, anchor);
    }
    fn image(&mut self, x: f64, y: f64, width: f64, height: f64, image: &Image) {
        self.svg.image(x, y, width, height, image);
    }
    fn clip(&mut self, rect: Option<(f64, f64, f64, f64)>) {
        self.svg.clip(rect);
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::render::INK;

    #[test]
    fn text_is_set_in_the_embedded_font_with_anti_aliasing() {
        let mut px = Pixmap::new(200, 60);
        px.text(10.0, 40.0, 30.0, "Sun", INK, Anchor::Start);
        let r = px.render().unwrap();
        let inked: Vec<u8> = (0..200).flat_map(|x| (0..60).map(move |y| (x, y))).map(|(x, y)| r.rgb(x, y)[0]).collect();
        // Glyphs drawn (dark pixels) with grey edges (anti-aliasing), not bare black and white.
        assert!(inked.iter().any(|&v| v < 60));
        assert!(inked.iter().filter(|&&v| v > 60 && v < 200).count() > 20);
        // The ink spans the measured width of "Sun" in DejaVu Sans within a few pixels.
        let cols: Vec<u32> = (0..200).filter(|&x| (0..60).any(|y| r.rgb(x, y)[0] < 128)).collect();
        let span = f64::from(cols[cols.len() - 1] - cols[0] + 1);
        let want = crate::render::text_width_px(30.0, "Sun");
        assert!((span - want).abs() < 6.0, "{span} px inked, {want} px measured");
    }

    #[test]
    fn the_png_is_the_svg_rasterised() {
        let mut px = Pixmap::new(40, 30);
        px.fill_rect(0.0, 0.0, 20.0, 30.0, Colour::rgb(0, 114, 178));
        let png = px.to_png().unwrap();
        assert_eq!(&png[1..4], b"PNG");
        let again = rasterise_svg(&px.svg()).unwrap();
        assert_eq!(again.rgb(5, 5), [0, 114, 178]);
        assert_eq!(again.rgb(35, 5), [255, 255, 255]);
    }
}
