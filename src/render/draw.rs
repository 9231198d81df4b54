//! The drawing abstraction every figure is drawn through.

/// An sRGB colour with alpha, 0–255.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Colour {
    /// Red.
    pub r: u8,
    /// Green.
    pub g: u8,
    /// Blue.
    pub b: u8,
    /// Opacity (255 opaque).
    pub a: u8,
}

impl Colour {
    /// An opaque colour.
    pub const fn rgb(r: u8, g: u8, b: u8) -> Self {
        Colour { r, g, b, a: 255 }
    }

    /// An opaque colour from CSS hex `#rrggbb` (or `#rgb`); `None` for anything else.
    pub fn from_hex(text: &str) -> Option<Self> {
        let h = text.trim().strip_prefix('#')?;
        let digit = |i: usize, n: usize| u8::from_str_radix(h.get(i..i + n)?, 16).ok();
        match h.len() {
            6 => Some(Colour::rgb(digit(0, 2)?, digit(2, 2)?, digit(4, 2)?)),
            3 => Some(Colour::rgb(digit(0, 1)? * 17, digit(1, 1)? * 17, digit(2, 1)? * 17)),
            _ => None,
        }
    }

    /// `#rrggbb`, or `rgba(…)` when not opaque (SVG and CSS).
    pub fn css(&self) -> String {
        if self.a == 255 {
            format!("#{:02x}{:02x}{:02x}", self.r, self.g, self.b)
        } else {
            format!("rgba({},{},{},{:.3})", self.r, self.g, self.b, f64::from(self.a) / 255.0)
        }
    }
}

/// The ink (text, lines) every figure is drawn in.
pub const INK: Colour = Colour::rgb(30, 30, 30);
/// The paper (background) every figure is drawn on.
pub const PAPER: Colour = Colour::rgb(255, 255, 255);

/// Where a text's reference point is along its line.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Anchor {
    /// At its start.
    Start,
    /// At its middle.
    Middle,
    /// At its end.
    End,
}

/// A safe estimate of a line's width, pixels: the wider of the bitmap font (8 pixels a character,
/// scaled by whole pixels) and a monospace face at 0.6 em a character.
pub fn text_width_px(size_px: f64, text: &str) -> f64 {
    let n = text.chars().count() as f64;
    n * (8.0 * (size_px / 10.0).round().max(1.0)).max(0.6 * size_px)
}

/// `text` broken at spaces into lines no wider than `width_px` at `size_px`.
pub fn wrap(text: &str, size_px: f64, width_px: f64) -> Vec<String> {
    let mut lines: Vec<String> = Vec::new();
    let mut line = String::new();
    for word in text.split_whitespace() {
        let candidate = if line.is_empty() { word.to_string() } else { format!("{line} {word}") };
        if !line.is_empty() && text_width_px(size_px, &candidate) > width_px {
            lines.push(std::mem::replace(&mut line, word.to_string()));
        } else {
            line = candidate;
        }
    }
    if !line.is_empty() {
        lines.push(line);
    }
    lines
}

/// An RGBA image: `width` × `height` pixels, row-major, top row first, 4 bytes a pixel.
#[derive(Debug, Clone, Copy)]
pub struct Image<'a> {
    /// The pixels.
    pub rgba: &'a [u8],
    /// Width, pixels.
    pub width: u32,
    /// Height, pixels.
    pub height: u32,
}

/// A surface to draw on, in pixels with y down.
pub trait Draw {
    /// Width and height, pixels.
    fn size(&self) -> (u32, u32);
    /// Fills a polygon (even-odd; several rings may be passed one after another in `rings`).
    fn fill_polygon(&mut self, rings: &[Vec<(f64, f64)>], fill: Colour);
    /// Strokes a polyline, closed or not, `width_px` wide.
    fn stroke(&mut self, points: &[(f64, f64)], width_px: f64, colour: Colour, closed: bool);
    /// Writes one line of text with its baseline at `y`, `size_px` tall.
    fn text(&mut self, x: f64, y: f64, size_px: f64, text: &str, colour: Colour, anchor: Anchor);
    /// Draws `image` scaled into the rectangle at (`x`, `y`), `width` × `height`, without smoothing.
    fn image(&mut self, x: f64, y: f64, width: f64, height: f64, image: &Image);
    /// Limits what is drawn next to the rectangle `(x, y, width, height)`; `None` lifts the limit.
    fn clip(&mut self, rect: Option<(f64, f64, f64, f64)>);
    /// Fills a rectangle.
    fn fill_rect(&mut self, x: f64, y: f64, w: f64, h: f64, fill: Colour) {
        self.fill_polygon(&[vec![(x, y), (x + w, y), (x + w, y + h), (x, y + h)]], fill);
    }
}

/// A figure's title (wrapped onto the subtitle line when too long) and subtitle, at the top left.
pub fn heading(d: &mut dyn Draw, title: &str, subtitle: &str) {
    let width = f64::from(d.size().0) - 48.0;
    let lines = wrap(title, 16.0, width);
    let ink = INK;
    d.text(24.0, 30.0, 16.0, lines.first().map_or("", |s| s.as_str()), ink, Anchor::Start);
    let sub = if lines.len() > 1 { format!("{} · {subtitle}", lines[1..].join(" ")) } else { subtitle.to_string() };
    d.text(24.0, 52.0, 12.0, &sub, Colour::rgb(110, 110, 110), Anchor::Start);
}

/// The footnote (the caution), wrapped, at the bottom left.
pub fn footnote(d: &mut dyn Draw, text: &str) {
    let (w, h) = d.size();
    let lines = wrap(text, 11.0, f64::from(w) - 48.0);
    for (k, line) in lines.iter().enumerate() {
        let y = f64::from(h) - 12.0 - 16.0 * (lines.len() - 1 - k) as f64;
        d.text(24.0, y, 11.0, line, Colour::rgb(110, 110, 110), Anchor::Start);
    }
}
