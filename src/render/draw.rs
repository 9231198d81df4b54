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

/// The font family of every figure's text: DejaVu Sans (embedded in the native PNG export, so PNG and
/// SVG read the same), then faces of nearly the same widths, then the reader's sans-serif.
pub const FONT_FAMILY: &str = "'DejaVu Sans', Verdana, sans-serif";

/// A line's width, pixels, set in DejaVu Sans at `size_px` (its advance widths; a character outside
/// the table counts as 0.7 em, wider than most).
pub fn text_width_px(size_px: f64, text: &str) -> f64 {
    text.chars().map(advance_em).sum::<f64>() * size_px
}

fn advance_em(c: char) -> f64 {
    let table = &super::font_widths::WIDTHS;
    match u32::from(c) {
        32..=126 => table[(u32::from(c) - 32) as usize].1,
        _ => table.iter().find(|(k, _)| *k == c).map_or(0.7, |(_, w)| *w),
    }
}

/// A figure title naming its site: "`title` — `site_name`", or `title` alone when the site has no name
/// (an imported file may have none).
pub fn titled(title: &str, site_name: &str) -> String {
    match site_name.trim() {
        "" => title.to_string(),
        name => format!("{title} — {name}"),
    }
}

/// `text` broken into lines no wider than `width_px` at `size_px`: whole phrases (the parts between
/// " — ") where they fit, words within a phrase that does not; a word wider than the line stands alone.
pub fn wrap(text: &str, size_px: f64, width_px: f64) -> Vec<String> {
    wrap_by(text, width_px, |s| text_width_px(size_px, s))
}

/// As [`wrap`], measured by the back end `d` draws with ([`Draw::measure_px`]).
pub fn wrap_on(d: &dyn Draw, text: &str, size_px: f64, width_px: f64) -> Vec<String> {
    wrap_by(text, width_px, |s| d.measure_px(size_px, s))
}

fn wrap_by(text: &str, width_px: f64, measure: impl Fn(&str) -> f64) -> Vec<String> {
    let fits = |s: &str| measure(s) <= width_px;
    let mut lines: Vec<String> = Vec::new();
    let mut line = String::new();
    for phrase in text.split(" — ").map(str::trim).filter(|p| !p.is_empty()) {
        let joined = if line.is_empty() { phrase.to_string() } else { format!("{line} — {phrase}") };
        if fits(&joined) {
            line = joined;
            continue;
        }
        if !line.is_empty() {
            lines.push(std::mem::take(&mut line));
        }
        if fits(phrase) {
            line = phrase.to_string();
            continue;
        }
        for word in phrase.split_whitespace() {
            let candidate = if line.is_empty() { word.to_string() } else { format!("{line} {word}") };
            if !line.is_empty() && !fits(&candidate) {
                lines.push(std::mem::replace(&mut line, word.to_string()));
            } else {
                line = candidate;
            }
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
    /// Writes one line of text turned a quarter anticlockwise (read from bottom to top), its baseline
    /// through (`x`, `y`) upright and `anchor` along it, `size_px` tall.
    fn text_vertical(&mut self, x: f64, y: f64, size_px: f64, text: &str, colour: Colour, anchor: Anchor);
    /// Draws `image` scaled into the rectangle at (`x`, `y`), `width` × `height`, without smoothing.
    fn image(&mut self, x: f64, y: f64, width: f64, height: f64, image: &Image);
    /// Limits what is drawn next to the rectangle `(x, y, width, height)`; `None` lifts the limit.
    fn clip(&mut self, rect: Option<(f64, f64, f64, f64)>);
    /// Fills a rectangle.
    fn fill_rect(&mut self, x: f64, y: f64, w: f64, h: f64, fill: Colour) {
        self.fill_polygon(&[vec![(x, y), (x + w, y), (x + w, y + h), (x, y + h)]], fill);
    }
    /// The advance width of `text` at `size_px` in the font this back end writes with, pixels; by
    /// default DejaVu Sans's ([`text_width_px`], the font of the SVG and PNG figures).
    fn measure_px(&self, size_px: f64, text: &str) -> f64 {
        text_width_px(size_px, text)
    }
}

/// Size of a figure's title, pixels.
pub const TITLE_PX: f64 = 20.0;
/// Size of a figure's subtitle, footnote and keys, pixels.
pub const TEXT_PX: f64 = 14.0;
/// Size of labels on a drawing (areas, axes, ticks), pixels: the smallest text of any figure.
pub const LABEL_PX: f64 = 13.0;
/// Grey of secondary text.
pub const MUTED: Colour = Colour::rgb(95, 95, 95);

/// A figure's title and subtitle at the top left, each wrapped to the figure's width; returns the y
/// below them, where the figure's drawing may begin.
pub fn heading(d: &mut dyn Draw, title: &str, subtitle: &str) -> f64 {
    let width = f64::from(d.size().0) - 48.0;
    let mut y = 14.0;
    for line in wrap_on(d, title, TITLE_PX, width) {
        y += TITLE_PX * 1.25;
        d.text(24.0, y, TITLE_PX, &line, INK, Anchor::Start);
    }
    for line in wrap_on(d, subtitle, TEXT_PX, width) {
        y += TEXT_PX * 1.35;
        d.text(24.0, y, TEXT_PX, &line, MUTED, Anchor::Start);
    }
    y + 16.0
}

/// Height of a footnote of `text` at the bottom of the figure `d` draws, pixels.
pub fn footnote_px(d: &dyn Draw, text: &str) -> f64 {
    12.0 + LABEL_PX * 1.35 * wrap_on(d, text, LABEL_PX, f64::from(d.size().0) - 48.0).len() as f64
}

/// The footnote (the caution), wrapped, at the bottom left.
pub fn footnote(d: &mut dyn Draw, text: &str) {
    let (w, h) = d.size();
    let lines = wrap_on(d, text, LABEL_PX, f64::from(w) - 48.0);
    for (k, line) in lines.iter().enumerate() {
        let y = f64::from(h) - 12.0 - LABEL_PX * 1.35 * (lines.len() - 1 - k) as f64;
        d.text(24.0, y, LABEL_PX, line, MUTED, Anchor::Start);
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn widths_are_dejavu_sans_advances() {
        // DejaVu Sans 2.37: 'M' 1767/2048 em, space 651/2048 em (the font's hmtx table).
        assert!((text_width_px(2048.0, "M") - 1767.0).abs() < 0.2);
        assert!((text_width_px(2048.0, " ") - 651.0).abs() < 0.2);
        assert!(text_width_px(10.0, "°") > 0.0 && text_width_px(10.0, "漢") == 7.0);
    }

    #[test]
    fn wrapping_keeps_phrases_whole_where_they_fit() {
        let t = "Shadows at 2026-03-21 15:00 GMT — Hollin Vale proposal";
        let w = text_width_px(20.0, "Shadows at 2026-03-21 15:00 GMT") + 1.0;
        assert_eq!(wrap(t, 20.0, w), vec!["Shadows at 2026-03-21 15:00 GMT", "Hollin Vale proposal"]);
        assert_eq!(wrap(t, 20.0, 1e6), vec![t.to_string()]);
        let narrow = wrap(t, 20.0, 120.0);
        assert!(narrow.len() > 3 && narrow.iter().all(|l| text_width_px(20.0, l) <= 120.0 || !l.contains(' ')));
    }
}
