//! The raster back end: an RGBA pixmap written as PNG. Polygons are filled at pixel centres with the
//! same exact scanline rasteriser as the maps (no anti-aliasing); text uses the public-domain 8 × 8
//! bitmap font of the `font8x8` crate, scaled by whole pixels.

use font8x8::UnicodeFonts;
use geo::{Coord, LineString, Polygon};

use super::draw::{Anchor, Colour, Draw, Image};
use crate::exposure::{Grid, RowSpans};

/// An RGBA image being drawn, white to begin with.
#[derive(Debug, Clone)]
pub struct Pixmap {
    width: u32,
    height: u32,
    rgba: Vec<u8>,
    /// The pixels as a grid of unit cells (y down), for the rasteriser.
    lattice: Grid,
    /// The clip rectangle: left, top, right, bottom, pixels.
    clip: Option<(f64, f64, f64, f64)>,
}

/// PNG bytes of an RGBA image.
pub fn encode_png(rgba: &[u8], w: u32, h: u32) -> Vec<u8> {
    let mut out = Vec::new();
    {
        let mut enc = png::Encoder::new(&mut out, w, h);
        enc.set_color(png::ColorType::Rgba);
        enc.set_depth(png::BitDepth::Eight);
        if let Ok(mut writer) = enc.write_header() {
            let _ = writer.write_image_data(rgba);
        }
    }
    out
}

impl Pixmap {
    /// A white image.
    pub fn new(width: u32, height: u32) -> Self {
        let (w, h) = (width.max(1), height.max(1));
        let lattice = Grid {
            origin: Coord { x: 0.0, y: 0.0 },
            col0: 0,
            row0: 0,
            cell_m: 1.0,
            cols: w as usize,
            rows: h as usize,
            inside: Vec::new(),
        };
        Pixmap { width: w, height: h, rgba: vec![255; (w * h * 4) as usize], lattice, clip: None }
    }

    /// The pixels, RGBA row-major from the top.
    pub fn rgba(&self) -> &[u8] {
        &self.rgba
    }

    /// The image as PNG.
    pub fn to_png(&self) -> Vec<u8> {
        encode_png(&self.rgba, self.width, self.height)
    }

    fn blend(&mut self, x: usize, y: usize, c: Colour) {
        if x >= self.width as usize || y >= self.height as usize {
            return;
        }
        if let Some((x0, y0, x1, y1)) = self.clip {
            let (fx, fy) = (x as f64 + 0.5, y as f64 + 0.5);
            if fx < x0 || fx >= x1 || fy < y0 || fy >= y1 {
                return;
            }
        }
        let i = (y * self.width as usize + x) * 4;
        let a = u32::from(c.a);
        for (k, v) in [c.r, c.g, c.b].into_iter().enumerate() {
            let old = u32::from(self.rgba[i + k]);
            self.rgba[i + k] = ((u32::from(v) * a + old * (255 - a)) / 255) as u8;
        }
        self.rgba[i + 3] = 255;
    }
}

impl Draw for Pixmap {
    fn size(&self) -> (u32, u32) {
        (self.width, self.height)
    }

    fn fill_polygon(&mut self, rings: &[Vec<(f64, f64)>], fill: Colour) {
        let Some((outer, holes)) = rings.split_first() else { return };
        let ls = |r: &Vec<(f64, f64)>| LineString::from(r.clone());
        let poly = Polygon::new(ls(outer), holes.iter().map(ls).collect());
        let mut spans = RowSpans::new(&self.lattice);
        spans.add_polygon(&self.lattice, &poly);
        for row in 0..self.lattice.rows {
            for (a, b) in spans.merged(row) {
                for x in a..b {
                    self.blend(x, row, fill);
                }
            }
        }
    }

    fn stroke(&mut self, points: &[(f64, f64)], width_px: f64, colour: Colour, closed: bool) {
        let n = points.len();
        let segs = if closed { n } else { n.saturating_sub(1) };
        let hw = (width_px / 2.0).max(0.5);
        for i in 0..segs {
            let (a, b) = (points[i], points[(i + 1) % n]);
            let (dx, dy) = (b.0 - a.0, b.1 - a.1);
            let len = dx.hypot(dy);
            if len == 0.0 {
                continue;
            }
            // The segment as a rectangle, extended by half the width at both ends (square caps).
            let (ux, uy) = (dx / len * hw, dy / len * hw);
            let (nx, ny) = (-uy, ux);
            let quad = vec![
                (a.0 - ux + nx, a.1 - uy + ny),
                (b.0 + ux + nx, b.1 + uy + ny),
                (b.0 + ux - nx, b.1 + uy - ny),
                (a.0 - ux - nx, a.1 - uy - ny),
            ];
            self.fill_polygon(&[quad], colour);
        }
    }

    fn text(&mut self, x: f64, y: f64, size_px: f64, text: &str, colour: Colour, anchor: Anchor) {
        let scale = (size_px / 10.0).round().max(1.0) as usize;
        let advance = 8 * scale;
        let chars: Vec<char> = text.chars().map(|c| if c == '–' || c == '—' { '-' } else { c }).collect();
        let width = (chars.len() * advance) as f64;
        let x0 = match anchor {
            Anchor::Start => x,
            Anchor::Middle => x - width / 2.0,
            Anchor::End => x - width,
        };
        let top = y - (7 * scale) as f64;
        for (k, ch) in chars.iter().enumerate() {
            let Some(glyph) = font8x8::BASIC_FONTS.get(*ch).or_else(|| font8x8::LATIN_FONTS.get(*ch)) else { continue };
            for (gy, bits) in glyph.iter().enumerate() {
                for gx in 0..8 {
                    if bits & (1 << gx) != 0 {
                        for sy in 0..scale {
                            for sx in 0..scale {
                                let px = x0 + (k * advance + gx * scale + sx) as f64;
                                let py = top + (gy * scale + sy) as f64;
                                if px >= 0.0 && py >= 0.0 {
                                    self.blend(px as usize, py as usize, colour);
                                }
                            }
                        }
                    }
                }
            }
        }
    }

    fn clip(&mut self, rect: Option<(f64, f64, f64, f64)>) {
        self.clip = rect.map(|(x, y, w, h)| (x, y, x + w, y + h));
    }

    fn image(&mut self, x: f64, y: f64, width: f64, height: f64, image: &Image) {
        let (rgba, w, h) = (image.rgba, image.width, image.height);
        if w == 0 || h == 0 || rgba.len() < (w * h * 4) as usize {
            return;
        }
        let (x0, y0) = (x.round().max(0.0) as usize, y.round().max(0.0) as usize);
        let (x1, y1) = ((x + width).round() as usize, (y + height).round() as usize);
        for py in y0..y1.min(self.height as usize) {
            let sy = (((py as f64 + 0.5 - y) / height * f64::from(h)) as usize).min(h as usize - 1);
            for px in x0..x1.min(self.width as usize) {
                let sx = (((px as f64 + 0.5 - x) / width * f64::from(w)) as usize).min(w as usize - 1);
                let i = (sy * w as usize + sx) * 4;
                let c = Colour { r: rgba[i], g: rgba[i + 1], b: rgba[i + 2], a: rgba[i + 3] };
                if c.a > 0 {
                    self.blend(px, py, c);
                }
            }
        }
    }
}
