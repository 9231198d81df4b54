//! Hatching: parallel lines across a filled shape, so two fills stay apart in greyscale print and for
//! readers who cannot tell their colours apart.

/// The segments of diagonal lines (rising to the right on the figure, y down) `spacing_px` apart
/// that lie inside `rings` (pixel rings, even-odd), for stroking.
pub fn hatch_segments(rings: &[Vec<(f64, f64)>], spacing_px: f64) -> Vec<[(f64, f64); 2]> {
    if !(spacing_px.is_finite() && spacing_px > 0.0) {
        return Vec::new();
    }
    // Lines of constant c = x + y; along a line, x alone orders the crossings.
    let c = |p: (f64, f64)| p.0 + p.1;
    let (lo, hi) =
        rings.iter().flatten().fold((f64::INFINITY, f64::NEG_INFINITY), |(lo, hi), &p| (lo.min(c(p)), hi.max(c(p))));
    if !(lo.is_finite() && hi.is_finite()) {
        return Vec::new();
    }
    let step = spacing_px * std::f64::consts::SQRT_2;
    let mut out = Vec::new();
    let mut k = (lo / step).ceil();
    while k * step < hi {
        let line = k * step;
        let mut xs: Vec<f64> = Vec::new();
        for ring in rings {
            for (i, &a) in ring.iter().enumerate() {
                let b = ring[(i + 1) % ring.len()];
                let (ca, cb) = (c(a), c(b));
                // Half-open in c so a vertex on the line is counted once.
                if (ca <= line) != (cb <= line) {
                    let t = (line - ca) / (cb - ca);
                    xs.push(a.0 + t * (b.0 - a.0));
                }
            }
        }
        xs.sort_by(f64::total_cmp);
        // A line touching the shape at a corner meets it in a point: nothing to draw.
        for pair in xs.chunks_exact(2).filter(|p| p[1] - p[0] > 1e-6) {
            out.push([(pair[0], line - pair[0]), (pair[1], line - pair[1])]);
        }
        k += 1.0;
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_square_is_crossed_by_diagonals_that_end_on_its_edges() {
        let square = vec![(0.0, 0.0), (100.0, 0.0), (100.0, 100.0), (0.0, 100.0)];
        let segs = hatch_segments(&[square], 10.0);
        // c = x + y runs over (0, 200): lines every 10·√2 ≈ 14.14 px, k = 1 … 14.
        assert_eq!(segs.len(), 14);
        for [a, b] in &segs {
            for p in [a, b] {
                let on_edge =
                    p.0.abs() < 1e-9 || (p.0 - 100.0).abs() < 1e-9 || p.1.abs() < 1e-9 || (p.1 - 100.0).abs() < 1e-9;
                assert!(on_edge, "{p:?}");
            }
        }
    }

    #[test]
    fn a_hole_is_left_unhatched() {
        let outer = vec![(0.0, 0.0), (100.0, 0.0), (100.0, 100.0), (0.0, 100.0)];
        let hole = vec![(40.0, 40.0), (60.0, 40.0), (60.0, 60.0), (40.0, 60.0)];
        let segs = hatch_segments(&[outer, hole], 10.0);
        // The line through the centre (c = 100 is not a multiple of 14.14; take c = 98.99, k = 7).
        let through: Vec<_> =
            segs.iter().filter(|[a, _]| (a.0 + a.1 - 7.0 * 10.0 * 2f64.sqrt()).abs() < 1e-6).collect();
        assert_eq!(through.len(), 2, "split by the hole");
        assert!(hatch_segments(&[], 10.0).is_empty());
    }
}
