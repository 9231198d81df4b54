//! The SVG back end: draws into an SVG document string.

use std::fmt::Write;

use super::draw::{Anchor, Colour, Draw, Image, FONT_FAMILY};

/// Encodes an image as the URL of an SVG `<image>` (a PNG data URL); `None` leaves the image out.
pub type ImageEncoder = fn(&Image) -> Option<String>;

/// An SVG document being drawn.
#[derive(Debug, Clone)]
pub struct Svg {
    width: u32,
    height: u32,
    body: String,
    /// Clip paths made so far, and whether a clipped group is open.
    clips: usize,
    clipped: bool,
    encoder: ImageEncoder,
}

/// Natively: the `png` crate's PNG, base64 in a data URL.
#[cfg(not(target_arch = "wasm32"))]
fn png_data_url(image: &Image) -> Option<String> {
    let png = super::png::encode_png(image.rgba, image.width, image.height);
    use base64::Engine;
    Some(format!("data:image/png;base64,{}", base64::engine::general_purpose::STANDARD.encode(png)))
}

/// In wasm no PNG encoder is built in (it would weigh ~48 KB gzipped): the facade gives the browser's
/// (a canvas's `toDataURL`) through [`Svg::with_image_encoder`]; without one images are left out.
#[cfg(target_arch = "wasm32")]
fn png_data_url(_image: &Image) -> Option<String> {
    None
}

fn esc(s: &str) -> String {
    s.replace('&', "&amp;").replace('<', "&lt;").replace('>', "&gt;").replace('"', "&quot;")
}

fn path(points: &[(f64, f64)], closed: bool) -> String {
    let mut d = String::new();
    for (i, (x, y)) in points.iter().enumerate() {
        let _ = write!(d, "{}{:.2},{:.2}", if i == 0 { "M" } else { "L" }, x, y);
    }
    if closed {
        d.push('Z');
    }
    d
}

impl Svg {
    /// A blank document.
    pub fn new(width: u32, height: u32) -> Self {
        Svg { width, height, body: String::new(), clips: 0, clipped: false, encoder: png_data_url }
    }

    /// The same document, its images encoded by `encoder`.
    pub fn with_image_encoder(mut self, encoder: ImageEncoder) -> Self {
        self.encoder = encoder;
        self
    }

    /// The document.
    pub fn finish(&self) -> String {
        format!(
            "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{w}\" height=\"{h}\" viewBox=\"0 0 {w} {h}\" \
             font-family=\"{font}\">\n{}{}</svg>\n",
            self.body,
            if self.clipped { "</g>\n" } else { "" },
            w = self.width,
            h = self.height,
            font = FONT_FAMILY.replace('\'', "&apos;")
        )
    }
}

impl Svg {
    #[allow(clippy::too_many_arguments)]
    fn text_turned(&mut self, x: f64, y: f64, size_px: f64, text: &str, colour: Colour, anchor: Anchor, turn: &str) {
        let a = match anchor {
            Anchor::Start => "start",
            Anchor::Middle => "middle",
            Anchor::End => "end",
        };
        let _ = writeln!(
            self.body,
            "<text x=\"{x:.1}\" y=\"{y:.1}\" font-size=\"{size_px}\" fill=\"{}\" text-anchor=\"{a}\"{turn}>{}</text>",
            colour.css(),
            esc(text)
        );
    }
}

impl Draw for Svg {
    fn size(&self) -> (u32, u32) {
        (self.width, self.height)
    }

    fn fill_polygon(&mut self, rings: &[Vec<(f64, f64)>], fill: Colour) {
        let d: String = rings.iter().map(|r| path(r, true)).collect();
        let _ = writeln!(self.body, "<path d=\"{d}\" fill=\"{}\" fill-rule=\"evenodd\"/>", fill.css());
    }

    fn stroke(&mut self, points: &[(f64, f64)], width_px: f64, colour: Colour, closed: bool) {
        let _ = writeln!(
            self.body,
            "<path d=\"{}\" fill=\"none\" stroke=\"{}\" stroke-width=\"{width_px}\" stroke-linejoin=\"round\"/>",
            path(points, closed),
            colour.css()
        );
    }

    fn text(&mut self, x: f64, y: f64, size_px: f64, text: &str, colour: Colour, anchor: Anchor) {
        self.text_turned(x, y, size_px, text, colour, anchor, "");
    }

    fn text_vertical(&mut self, x: f64, y: f64, size_px: f64, text: &str, colour: Colour, anchor: Anchor) {
        self.text_turned(x, y, size_px, text, colour, anchor, &format!(" transform=\"rotate(-90 {x:.1} {y:.1})\""));
    }

    fn clip(&mut self, rect: Option<(f64, f64, f64, f64)>) {
        if self.clipped {
            self.body.push_str("</g>\n");
            self.clipped = false;
        }
        if let Some((x, y, w, h)) = rect {
            self.clips += 1;
            let _ = writeln!(
                self.body,
                "<clipPath id=\"clip{n}\"><rect x=\"{x:.2}\" y=\"{y:.2}\" width=\"{w:.2}\" height=\"{h:.2}\"/></clipPath>\n\
                 <g clip-path=\"url(#clip{n})\">",
                n = self.clips
            );
            self.clipped = true;
        }
    }

    fn image(&mut self, x: f64, y: f64, width: f64, height: f64, image: &Image) {
        let Some(href) = (self.encoder)(image) else { return };
        let _ = writeln!(
            self.body,
            "<image x=\"{x:.2}\" y=\"{y:.2}\" width=\"{width:.2}\" height=\"{height:.2}\" preserveAspectRatio=\"none\" \
             image-rendering=\"optimizeSpeed\" style=\"image-rendering:pixelated\" href=\"{href}\"/>"
        );
    }
}
