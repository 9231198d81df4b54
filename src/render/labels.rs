//! Placing labels on a plan: inside the shape they name where they fit (level, then turned upright
//! for a tall narrow shape), otherwise beside it with a leader line, never over a label already placed.

use super::draw::{Anchor, Colour, Draw, PAPER};

/// A box on the figure: left, top, right, bottom, pixels.
type Box = (f64, f64, f64, f64);

/// Labels placed so far on one figure, within its plan box.
#[derive(Debug, Clone)]
pub struct LabelPlacer {
    placed: Vec<Box>,
    bounds: Box,
}

/// Whether `p` lies inside the even-odd `rings`.
fn inside(rings: &[Vec<(f64, f64)>], p: (f64, f64)) -> bool {
    let mut odd = false;
    for ring in rings {
        for (i, &a) in ring.iter().enumerate() {
            let b = ring[(i + 1) % ring.len()];
            if (a.1 > p.1) != (b.1 > p.1) && p.0 < a.0 + (p.1 - a.1) / (b.1 - a.1) * (b.0 - a.0) {
                odd = !odd;
            }
        }
    }
    odd
}

/// Whether the box lies inside `rings`: its corners, edge midpoints and centre inside and no vertex of
/// the rings within it.
fn box_inside(rings: &[Vec<(f64, f64)>], b: Box) -> bool {
    let (x0, y0, x1, y1) = b;
    let (xm, ym) = ((x0 + x1) / 2.0, (y0 + y1) / 2.0);
    let probes = [(x0, y0), (x1, y0), (x1, y1), (x0, y1), (xm, y0), (xm, y1), (x0, ym), (x1, ym), (xm, ym)];
    probes.iter().all(|&p| inside(rings, p))
        && !rings.iter().flatten().any(|&(x, y)| x > x0 && x < x1 && y > y0 && y < y1)
}

fn bounds_of(rings: &[Vec<(f64, f64)>]) -> Option<Box> {
    let mut it = rings.iter().flatten();
    let &(x, y) = it.next()?;
    Some(it.fold((x, y, x, y), |(a, b, c, d), &(x, y)| (a.min(x), b.min(y), c.max(x), d.max(y))))
}

impl LabelPlacer {
    /// No labels yet; labels stay within `bounds` (`x`, `y`, width, height, pixels).
    pub fn new((x, y, w, h): (f64, f64, f64, f64)) -> Self {
        LabelPlacer { placed: Vec::new(), bounds: (x, y, x + w, y + h) }
    }

    fn free(&self, b: Box) -> bool {
        let (bx0, by0, bx1, by1) = self.bounds;
        b.0 >= bx0
            && b.1 >= by0
            && b.2 <= bx1
            && b.3 <= by1
            && self.placed.iter().all(|p| b.2 < p.0 || b.0 > p.2 || b.3 < p.1 || b.1 > p.3)
    }

    /// Labels the shape `rings` (pixels) with `text` (lines split at `\n`): inside it, level or upright, at the free spot
    /// nearest its middle; else beside it with a leader line; returns `false` if no free spot was found.
    pub fn label(
        &mut self,
        d: &mut dyn Draw,
        rings: &[Vec<(f64, f64)>],
        text: &str,
        size_px: f64,
        colour: Colour,
    ) -> bool {
        let Some((x0, y0, x1, y1)) = bounds_of(rings) else { return false };
        let lines: Vec<&str> = text.lines().collect();
        let line_px = size_px * 1.15;
        let widest = lines.iter().map(|l| d.measure_px(size_px, l)).fold(0.0, f64::max);
        let (tw, th) = (widest + 4.0, line_px * lines.len() as f64 - 0.05 * size_px);
        // Line k's offset across the label from its middle (down the figure, or right when upright).
        let across = |k: usize| -th / 2.0 + line_px * (k as f64 + 0.5) + size_px * 0.35 - 0.025 * size_px;
        let (cx, cy) = ((x0 + x1) / 2.0, (y0 + y1) / 2.0);
        // Candidate middles on a 17 × 17 lattice over the shape's bounds, nearest its middle first.
        let mut spots: Vec<(f64, f64)> = (0..289)
            .map(|k| (x0 + (x1 - x0) * f64::from(k % 17) / 16.0, y0 + (y1 - y0) * f64::from(k / 17) / 16.0))
            .collect();
        spots.sort_by(|a, b| (a.0 - cx).hypot(a.1 - cy).total_cmp(&(b.0 - cx).hypot(b.1 - cy)));
        spots.insert(0, (cx, cy));
        for upright in [false, true] {
            let (hw, hh) = if upright { (th / 2.0, tw / 2.0) } else { (tw / 2.0, th / 2.0) };
            for &(x, y) in &spots {
                let b = (x - hw, y - hh, x + hw, y + hh);
                if box_inside(rings, b) && self.free(b) {
                    // A paper-coloured backing keeps the label readable over shade, hatching and map
                    // cells (a cartographer's halo); on plain paper it does not show.
                    d.fill_rect(b.0 + 1.0, b.1 + 1.0, b.2 - b.0 - 2.0, b.3 - b.1 - 2.0, Colour { a: 200, ..PAPER });
                    for (k, line) in lines.iter().enumerate() {
                        if upright {
                            d.text_vertical(x + across(k), y, size_px, line, colour, Anchor::Middle);
                        } else {
                            d.text(x, y + across(k), size_px, line, colour, Anchor::Middle);
                        }
                    }
                    self.placed.push(b);
                    return true;
                }
            }
        }
        // Beside it: above, below, right or left of its bounds, a little out, with a leader from an
        // inner point.
        let at = spots.iter().copied().find(|&p| inside(rings, p)).unwrap_or((cx, cy));
        let gap = 10.0;
        let sides = [
            (cx, y0 - gap - th / 2.0),
            (cx, y1 + gap + th / 2.0),
            (x1 + gap + tw / 2.0, cy),
            (x0 - gap - tw / 2.0, cy),
        ];
        for (x, y) in sides {
            let b = (x - tw / 2.0, y - th / 2.0, x + tw / 2.0, y + th / 2.0);
            if self.free(b) {
                let end = (
                    x.clamp(b.0, b.2),
                    if y < at.1 {
                        b.3
                    } else if y > at.1 {
                        b.1
                    } else {
                        y
                    },
                );
                d.stroke(&[at, end], 1.0, colour, false);
                d.fill_rect(b.0, b.1, b.2 - b.0, b.3 - b.1, Colour { a: 220, ..PAPER });
                for (k, line) in lines.iter().enumerate() {
                    d.text(x, y + across(k), size_px, line, colour, Anchor::Middle);
                }
                self.placed.push(b);
                return true;
            }
        }
        false
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::render::{Svg, INK};

    fn rect(x0: f64, y0: f64, x1: f64, y1: f64) -> Vec<Vec<(f64, f64)>> {
        vec![vec![(x0, y0), (x1, y0), (x1, y1), (x0, y1)]]
    }

    #[test]
    fn a_label_goes_level_inside_a_wide_shape_and_upright_inside_a_narrow_one() {
        let mut svg = Svg::new(600, 600);
        let mut placer = LabelPlacer::new((0.0, 0.0, 600.0, 600.0));
        assert!(placer.label(&mut svg, &rect(10.0, 10.0, 300.0, 100.0), "garden-9", 13.0, INK));
        assert!(placer.label(&mut svg, &rect(400.0, 10.0, 430.0, 300.0), "garden-16", 13.0, INK));
        let doc = svg.finish();
        assert!(
            doc.contains(">garden-9<") && !doc.lines().find(|l| l.contains(">garden-9<")).unwrap().contains("rotate")
        );
        assert!(doc.lines().find(|l| l.contains(">garden-16<")).unwrap().contains("rotate(-90"));
    }

    #[test]
    fn a_shape_too_small_gets_a_leader_and_labels_never_overlap() {
        let mut svg = Svg::new(600, 600);
        let mut placer = LabelPlacer::new((0.0, 0.0, 600.0, 600.0));
        assert!(placer.label(&mut svg, &rect(300.0, 300.0, 306.0, 306.0), "tiny-area", 13.0, INK));
        assert!(svg.finish().contains("<path d=\"M303"), "a leader from inside the shape");
        // The same spot again: the second label must find another side.
        assert!(placer.label(&mut svg, &rect(300.0, 300.0, 306.0, 306.0), "tiny-again", 13.0, INK));
        for (i, a) in placer.placed.iter().enumerate() {
            for b in &placer.placed[i + 1..] {
                assert!(a.2 < b.0 || a.0 > b.2 || a.3 < b.1 || a.1 > b.3, "{a:?} overlaps {b:?}");
            }
        }
    }
}
