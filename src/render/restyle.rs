//! Page colours on the figures: a drawing surface that passes everything to another one with the
//! figures' ink, paper and proposal colours swapped for a page's own (its CSS custom properties).

use super::draw::{Anchor, Colour, Draw, Image, INK, PAPER};
use super::plan::PROPOSED;

/// Colours to use instead of the figures' own; `None` keeps a colour.
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq)]
pub struct Palette {
    /// Instead of [`INK`].
    pub ink: Option<Colour>,
    /// Instead of [`PAPER`].
    pub paper: Option<Colour>,
    /// Instead of the proposal colour (outlines and the shade a proposal adds).
    pub proposed: Option<Colour>,
}

impl Palette {
    /// The colour to draw for `c`: swapped when its red, green and blue are one of the figure
    /// colours, keeping its opacity.
    pub fn swap(&self, c: Colour) -> Colour {
        let same = |k: Colour| (k.r, k.g, k.b) == (c.r, c.g, c.b);
        let pick = |to: Option<Colour>| to.map(|t| Colour { a: c.a, ..t });
        let to = if same(INK) {
            pick(self.ink)
        } else if same(PAPER) {
            pick(self.paper)
        } else if same(PROPOSED) {
            pick(self.proposed)
        } else {
            None
        };
        to.unwrap_or(c)
    }
}

/// `inner` drawn with `palette`'s colours.
pub struct Restyle<'a> {
    /// The surface drawn on.
    pub inner: &'a mut dyn Draw,
    /// The colours swapped.
    pub palette: Palette,
}

impl Draw for Restyle<'_> {
    fn size(&self) -> (u32, u32) {
        self.inner.size()
    }
    fn fill_polygon(&mut self, rings: &[Vec<(f64, f64)>], fill: Colour) {
        self.inner.fill_polygon(rings, self.palette.swap(fill));
    }
    fn stroke(&mut self, points: &[(f64, f64)], width_px: f64, colour: Colour, closed: bool) {
        self.inner.stroke(points, width_px, self.palette.swap(colour), closed);
    }
    fn text(&mut self, x: f64, y: f64, size_px: f64, text: &str, colour: Colour, anchor: Anchor) {
        self.inner.text(x, y, size_px, text, self.palette.swap(colour), anchor);
    }
    fn text_vertical(&mut self, x: f64, y: f64, size_px: f64, text: &str, colour: Colour, anchor: Anchor) {
        self.inner.text_vertical(x, y, size_px, text, self.palette.swap(colour), anchor);
    }
    fn image(&mut self, x: f64, y: f64, width: f64, height: f64, image: &Image) {
        self.inner.image(x, y, width, height, image);
    }
    fn clip(&mut self, rect: Option<(f64, f64, f64, f64)>) {
        self.inner.clip(rect);
    }
    fn measure_px(&self, size_px: f64, text: &str) -> f64 {
        self.inner.measure_px(size_px, text)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::render::Svg;

    #[test]
    fn figure_colours_are_swapped_and_others_kept() {
        let p = Palette { ink: Colour::from_hex("#102030"), paper: Colour::from_hex("#fed"), proposed: None };
        assert_eq!(p.swap(INK), Colour::rgb(16, 32, 48));
        assert_eq!(p.swap(Colour { a: 100, ..PAPER }), Colour { r: 255, g: 238, b: 221, a: 100 });
        assert_eq!(p.swap(PROPOSED), PROPOSED);
        assert_eq!(p.swap(Colour::rgb(1, 2, 3)), Colour::rgb(1, 2, 3));
        let mut svg = Svg::new(10, 10);
        Restyle { inner: &mut svg, palette: p }.text(1.0, 1.0, 10.0, "x", INK, Anchor::Start);
        assert!(svg.finish().contains("#102030"));
        assert_eq!(Colour::from_hex("red"), None);
        assert_eq!(Colour::from_hex("#12345"), None);
    }
}
