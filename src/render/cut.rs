//! Shadows longer than the drawing: the plan's frame grown toward them within reason, and where
//! they still run past it, the frame's edge marked with a break line (the drafting mark for a thing
//! drawn cut short; common practice), so a reader never takes a cut shadow for its whole length.

use geo::{BooleanOps, BoundingRect, Coord, MultiPolygon, Rect};

use super::draw::{Colour, Draw};

/// How far the frame may grow past the site's own frame on each side, as a share of that frame's
/// larger side: the site then still fills at least a third of the drawing's width.
pub const MAX_GROWTH: f64 = 1.0;

/// The frame `site` grown to hold `shadows` with a small margin, each side by at most
/// [`MAX_GROWTH`] × the larger side, and kept a little inside `analysis` (the extent the shadows were
/// cut to when computed), so a shadow cut there shows as running past the frame.
pub fn grown_extent(site: Rect<f64>, shadows: &MultiPolygon<f64>, analysis: Option<Rect<f64>>) -> Rect<f64> {
    let Some(s) = shadows.bounding_rect() else { return site };
    let size = site.width().max(site.height());
    let (most, margin) = (MAX_GROWTH * size, 0.02 * size);
    let (lo, hi) = (site.min(), site.max());
    let (mut a, mut b) = (
        Coord { x: (s.min().x - margin).max(lo.x - most), y: (s.min().y - margin).max(lo.y - most) },
        Coord { x: (s.max().x + margin).min(hi.x + most), y: (s.max().y + margin).min(hi.y + most) },
    );
    if let Some(r) = analysis {
        let inset = 0.01 * r.width().min(r.height());
        a = Coord { x: a.x.max(r.min().x + inset), y: a.y.max(r.min().y + inset) };
        b = Coord { x: b.x.min(r.max().x - inset), y: b.y.min(r.max().y - inset) };
    }
    Rect::new(Coord { x: a.x.min(lo.x), y: a.y.min(lo.y) }, Coord { x: b.x.max(hi.x), y: b.y.max(hi.y) })
}

/// The stretches of `extent`'s edges that `shadows` (before clipping) cross: where the shadow runs on
/// past the frame. Each is a segment on the frame, plan metres.
pub fn cut_edges(shadows: &MultiPolygon<f64>, extent: Rect<f64>) -> Vec<[Coord<f64>; 2]> {
    let (lo, hi) = (extent.min(), extent.max());
    // A strip just outside each side: the shadow reaches past the frame where it covers the strip.
    let e = 1e-3 * extent.width().max(extent.height());
    let strips = [
        (Rect::new(Coord { x: lo.x - e, y: lo.y }, Coord { x: lo.x, y: hi.y }), false), // west
        (Rect::new(Coord { x: hi.x, y: lo.y }, Coord { x: hi.x + e, y: hi.y }), false), // east
        (Rect::new(Coord { x: lo.x, y: lo.y - e }, Coord { x: hi.x, y: lo.y }), true),  // south
        (Rect::new(Coord { x: lo.x, y: hi.y }, Coord { x: hi.x, y: hi.y + e }), true),  // north
    ];
    let mut out = Vec::new();
    for (k, (strip, along_x)) in strips.into_iter().enumerate() {
        let hit = shadows.intersection(&MultiPolygon::new(vec![strip.to_polygon()]));
        let mut spans: Vec<(f64, f64)> = hit
            .0
            .iter()
            .filter_map(|p| p.bounding_rect())
            .map(|r| if along_x { (r.min().x, r.max().x) } else { (r.min().y, r.max().y) })
            .filter(|(a, b)| b - a > e)
            .collect();
        spans.sort_by(|a, b| a.0.total_cmp(&b.0));
        let mut merged: Vec<(f64, f64)> = Vec::new();
        for s in spans {
            match merged.last_mut() {
                Some(m) if s.0 <= m.1 + e => m.1 = m.1.max(s.1),
                _ => merged.push(s),
            }
        }
        let fixed = [lo.x, hi.x, lo.y, hi.y][k];
        for (a, b) in merged {
            out.push(if along_x {
                [Coord { x: a, y: fixed }, Coord { x: b, y: fixed }]
            } else {
                [Coord { x: fixed, y: a }, Coord { x: fixed, y: b }]
            });
        }
    }
    out
}

/// The compass sides of `extent` that `cuts` lie on ("east", "south and west"), for a caption.
pub fn cut_sides(cuts: &[[Coord<f64>; 2]], extent: Rect<f64>) -> String {
    let (lo, hi) = (extent.min(), extent.max());
    let side = |[a, b]: &[Coord<f64>; 2]| match () {
        _ if a.y == hi.y && b.y == hi.y => 0,
        _ if a.x == hi.x && b.x == hi.x => 1,
        _ if a.y == lo.y && b.y == lo.y => 2,
        _ => 3,
    };
    let sides: Vec<&str> = ["north", "east", "south", "west"]
        .into_iter()
        .enumerate()
        .filter(|(k, _)| cuts.iter().any(|c| side(c) == *k))
        .map(|(_, name)| name)
        .collect();
    match sides.as_slice() {
        [] => String::new(),
        [one] => (*one).to_string(),
        [rest @ .., last] => format!("{} and {last}", rest.join(", ")),
    }
}

/// A break line from `a` to `b` (pixels): a straight line with a zigzag in each 40 px of it.
pub fn draw_break_line(d: &mut dyn Draw, a: (f64, f64), b: (f64, f64), colour: Colour) {
    let len = (b.0 - a.0).hypot(b.1 - a.1);
    if len < 1.0 {
        return;
    }
    let (ux, uy) = ((b.0 - a.0) / len, (b.1 - a.1) / len);
    let (nx, ny) = (-uy, ux);
    let at = |t: f64, off: f64| (a.0 + ux * t + nx * off, a.1 + uy * t + ny * off);
    let zig = 5.0;
    let mut points = vec![a];
    let mut t = 0.0;
    while t + 40.0 <= len {
        let m = t + 20.0;
        points.extend([at(m - 3.0, 0.0), at(m - 1.5, -zig), at(m + 1.5, zig), at(m + 3.0, 0.0)]);
        t += 40.0;
    }
    if len < 40.0 {
        let m = len / 2.0;
        points = vec![a, at(m - 3.0, 0.0), at(m - 1.5, -zig), at(m + 1.5, zig), at(m + 3.0, 0.0)];
    }
    points.push(b);
    d.stroke(&points, 2.0, colour, false);
}

#[cfg(test)]
mod tests {
    use super::*;
    use geo::{LineString, Polygon};

    fn rect(x0: f64, y0: f64, x1: f64, y1: f64) -> Rect<f64> {
        Rect::new(Coord { x: x0, y: y0 }, Coord { x: x1, y: y1 })
    }

    fn shadow(x0: f64, y0: f64, x1: f64, y1: f64) -> MultiPolygon<f64> {
        let r = LineString::from(vec![(x0, y0), (x1, y0), (x1, y1), (x0, y1)]);
        MultiPolygon::new(vec![Polygon::new(r, vec![])])
    }

    #[test]
    fn the_frame_grows_to_a_shadow_within_the_cap_and_no_further() {
        let site = rect(0.0, 0.0, 50.0, 40.0);
        // A shadow 30 m past the east side: the frame takes it whole.
        // A shadow 30 m past the east side: the frame takes it whole, with a 1 m (2 %) margin.
        let g = grown_extent(site, &shadow(40.0, 10.0, 80.0, 20.0), None);
        assert_eq!((g.min().x, g.max().x, g.min().y, g.max().y), (0.0, 81.0, 0.0, 40.0));
        assert!(cut_edges(&shadow(40.0, 10.0, 80.0, 20.0), g).is_empty());
        // 300 m past it: 50 m (one larger side) and a cut on the east edge from y 10 to 20.
        let long = shadow(40.0, 10.0, 340.0, 20.0);
        let g = grown_extent(site, &long, None);
        assert_eq!(g.max().x, 100.0);
        let cuts = cut_edges(&long, g);
        assert_eq!(cuts.len(), 1);
        let [a, b] = cuts[0];
        assert!((a.x - 100.0).abs() < 1e-9 && (a.y - 10.0).abs() < 1e-6 && (b.y - 20.0).abs() < 1e-6, "{cuts:?}");
        assert_eq!(cut_sides(&cuts, g), "east");
        // A shadow cut at the analysis extent (80 m east) within the cap: the frame stops short of that
        // extent, so the shadow shows as running on.
        let at_extent = shadow(40.0, 10.0, 80.0, 20.0);
        let g = grown_extent(site, &at_extent, Some(rect(-40.0, -40.0, 80.0, 80.0)));
        assert!(g.max().x < 80.0 && g.max().x > 78.0, "{g:?}");
        assert_eq!(cut_sides(&cut_edges(&at_extent, g), g), "east");
        // A shadow inside the site's frame leaves it as it is.
        assert_eq!(grown_extent(site, &shadow(5.0, 5.0, 10.0, 10.0), None), site);
    }
}
