//! The solar envelope (Knowles): how tall a building may stand on each cell of a lot without casting
//! a shadow onto protected areas during a protected period.
//!
//! # Method
//! Knowles, R. L. (1981), *Sun Rhythm Form*, MIT Press (reference from memory): the envelope is the largest volume on a lot
//! whose shadows stay off the protected land during the protected hours. Here the lot is cut into
//! square cells and each cell is a square prism standing on the ground. At a step with shadow
//! offset o per metre of height the prism of height h casts the square swept along h·o (its shadow is
//! the Minkowski sum of the square and that segment), so the tallest prism that casts nothing onto a
//! protected area is D / |o|, where D is how far the square can slide along o before it meets a
//! protected area: the least distance along o from a corner of the square to a protected edge, or back
//! along o from a protected vertex to an edge of the square (exact for polygons). The envelope height
//! of a cell is the least of these over the period's sun-up steps (see [`crate::exposure::Period`]),
//! rounded down to `height_step_m` and capped at `max_height_m`. A shadow that only touches a protected
//! boundary counts as none. On sloping ground o is replaced by o / (1 + k·o) (where a tip lands on
//! the inclined plane) and heights are taken above the ground at each point, i.e. roofs parallel to
//! the slope. Existing buildings' shade on the protected areas is not credited (the envelope is
//! conservative).

use geo::{BooleanOps, Coord, Line, LineString, MultiPolygon, Polygon};
use serde::Serialize;

use crate::exposure::{CellValues, ExposureError, Grid, Period};
use crate::shadow::Receiver;
use crate::site::SiteModel;
use crate::solar::Ephemeris;
use crate::time::DeltaT;

/// The envelope's defaults when a request does not say (the CLI's and the module's): the protected
/// window 09:00-15:00, 15-minute steps, 1 m cells, a 30 m cap, heights in 0.1 m, GeoJSON bands of 3 m.
pub const DEFAULT_ENVELOPE_WINDOW: &str = "09:00-15:00";
pub const DEFAULT_ENVELOPE_CELL_M: f64 = 1.0;
pub const DEFAULT_MAX_HEIGHT_M: f64 = 30.0;
pub const DEFAULT_HEIGHT_STEP_M: f64 = 0.1;
pub const DEFAULT_BAND_M: f64 = 3.0;

/// What to compute.
#[derive(Debug, Clone)]
pub struct EnvelopeRequest<'a> {
    /// The site (location, zone, ground).
    pub model: &'a SiteModel,
    /// The cells of the subject lot (see [`Grid::over`]).
    pub grid: &'a Grid,
    /// The protected areas.
    pub protected: &'a [Polygon<f64>],
    /// The protected period.
    pub period: Period,
    /// Height cap, metres.
    pub max_height_m: f64,
    /// Heights are rounded down to a multiple of this, metres.
    pub height_step_m: f64,
    /// ΔT.
    pub delta_t: DeltaT,
}

/// The envelope's heights per cell.
#[derive(Debug, Clone, PartialEq)]
pub struct Envelope {
    /// Height per cell, metres, row-major as the grid; `None` outside the lot.
    pub height_m: CellValues,
    /// Whether each cell's height is the cap rather than a shadow limit.
    pub capped: Vec<bool>,
    /// Sun-up steps considered.
    pub steps: usize,
}

/// The lot an envelope is for when none is named: the proposal's lot (the first lot marked proposed),
/// else the first lot, else the first area; `None` for a site without areas.
pub fn subject_lot(model: &SiteModel) -> Option<&crate::site::Area> {
    use crate::site::{AreaKind, Status};
    let mut lots = model.areas.iter().filter(|a| a.kind == AreaKind::Lot);
    let first = lots.clone().next();
    lots.find(|a| a.status == Status::Proposed).or(first).or(model.areas.first())
}

/// The areas an envelope protects by default: every garden, terrace and amenity area other than the
/// lot `lot_id`.
pub fn default_protected<'a>(model: &'a SiteModel, lot_id: &str) -> Vec<&'a crate::site::Area> {
    use crate::site::AreaKind;
    let kinds = [AreaKind::Garden, AreaKind::Terrace, AreaKind::Amenity];
    model.areas.iter().filter(|a| a.id != lot_id && kinds.contains(&a.kind)).collect()
}

/// Distance along unit direction `u` from `p` to segment `e`, if the ray meets it.
fn ray_to_segment(p: Coord<f64>, u: Coord<f64>, e: Line<f64>) -> Option<f64> {
    let d = e.delta();
    let denom = u.x * d.y - u.y * d.x;
    if denom.abs() < 1e-15 {
        return None; // parallel: a grazing contact slides along, the other ends decide
    }
    let w = Coord { x: e.start.x - p.x, y: e.start.y - p.y };
    let t = (w.x * d.y - w.y * d.x) / denom;
    let s = (w.x * u.y - w.y * u.x) / denom;
    (t >= -1e-12 && (-1e-12..=1.0 + 1e-12).contains(&s)).then_some(t.max(0.0))
}

/// How far `square` (its four corners, counter-clockwise) can slide along unit `u` before meeting a
/// protected polygon; 0 when it already overlaps one.
fn slide_distance(square: &[Coord<f64>; 4], u: Coord<f64>, edges: &[Line<f64>], vertices: &[Coord<f64>]) -> f64 {
    let mut d = f64::INFINITY;
    for &c in square {
        for &e in edges {
            if let Some(t) = ray_to_segment(c, u, e) {
                d = d.min(t);
            }
        }
    }
    let back = Coord { x: -u.x, y: -u.y };
    for &v in vertices {
        for i in 0..4 {
            if let Some(t) = ray_to_segment(v, back, Line::new(square[i], square[(i + 1) % 4])) {
                d = d.min(t);
            }
        }
    }
    d
}

fn cell_square(g: &Grid, col: usize, row: usize) -> [Coord<f64>; 4] {
    let c = g.centre(col, row);
    let h = g.cell_m / 2.0;
    [
        Coord { x: c.x - h, y: c.y - h },
        Coord { x: c.x + h, y: c.y - h },
        Coord { x: c.x + h, y: c.y + h },
        Coord { x: c.x - h, y: c.y + h },
    ]
}

/// The square prism of a cell, as a footprint polygon.
pub fn cell_footprint(g: &Grid, col: usize, row: usize) -> Polygon<f64> {
    let s = cell_square(g, col, row);
    Polygon::new(LineString::from(vec![s[0], s[1], s[2], s[3], s[0]]), vec![])
}

/// The solar envelope of the lot.
///
/// # Errors
/// [`ExposureError`] for a bad period, cap or step, no protected area, or a cancelled run.
pub fn solar_envelope(req: &EnvelopeRequest, mut progress: impl FnMut(f64) -> bool) -> Result<Envelope, ExposureError> {
    req.period.check(req.model, req.delta_t)?;
    req.period.check_work(req.grid.inside_count())?;
    if !(req.max_height_m.is_finite() && req.max_height_m > 0.0 && req.max_height_m <= 1_000.0) {
        return Err(ExposureError::Period(format!(
            "max_height_m must be above 0 and at most 1000 m, got {}",
            req.max_height_m
        )));
    }
    if !(req.height_step_m.is_finite() && req.height_step_m >= 0.001 && req.height_step_m <= req.max_height_m) {
        return Err(ExposureError::Period(format!(
            "height_step_m must be 0.001 m to max_height_m, got {}",
            req.height_step_m
        )));
    }
    if req.protected.is_empty() {
        return Err(ExposureError::Period("there are no protected areas to keep the shadows off".into()));
    }
    let model = req.model;
    let g = req.grid;
    let ground = Receiver::on(&model.ground, model.plan_rotation_deg, 0.0);
    let k = ground.gradient;
    let edges: Vec<Line<f64>> = req
        .protected
        .iter()
        .flat_map(|p| std::iter::once(p.exterior()).chain(p.interiors()))
        .flat_map(|r| r.lines())
        .collect();
    let vertices: Vec<Coord<f64>> = edges.iter().map(|e| e.start).collect();
    let protected = MultiPolygon::new(req.protected.to_vec());

    // Cells that already lie on protected land may not be built on.
    let mut limit = vec![f64::INFINITY; g.rows * g.cols];
    for row in 0..g.rows {
        for col in 0..g.cols {
            if g.inside[row * g.cols + col] {
                let overlap = geo::Area::unsigned_area(&cell_footprint(g, col, row).intersection(&protected));
                if overlap > 1e-9 {
                    limit[row * g.cols + col] = 0.0;
                }
            }
        }
    }
    // The offsets of the period's steps, as unit direction and length per metre of height.
    let mut dirs: Vec<(Coord<f64>, f64)> = Vec::new();
    let mut eph = Ephemeris::new();
    for date in req.period.dates() {
        for s in req.period.steps_of(model, date, req.delta_t, &mut eph)? {
            // No offset when the sun is behind the slope: nothing casts a shadow then.
            let Some(o) = crate::exposure::step_offset(model, &ground, &s) else { continue };
            let f = 1.0 + k.x * o.x + k.y * o.y;
            let o = Coord { x: o.x / f, y: o.y / f };
            let len = o.x.hypot(o.y);
            dirs.push((Coord { x: o.x / len, y: o.y / len }, len));
        }
    }
    let total = g.rows.max(1);
    for row in 0..g.rows {
        for col in 0..g.cols {
            let i = row * g.cols + col;
            if !g.inside[i] || limit[i] == 0.0 {
                continue;
            }
            let square = cell_square(g, col, row);
            for &(u, len) in &dirs {
                let h = slide_distance(&square, u, &edges, &vertices) / len;
                if h < limit[i] {
                    limit[i] = h;
                    if h == 0.0 {
                        break;
                    }
                }
            }
        }
        if !progress((row + 1) as f64 / total as f64) {
            return Err(ExposureError::Cancelled);
        }
    }
    let step = req.height_step_m;
    let mut capped = vec![false; g.rows * g.cols];
    let height_m = limit
        .iter()
        .enumerate()
        .map(|(i, &l)| {
            g.inside[i].then(|| {
                if l >= req.max_height_m {
                    capped[i] = true;
                    req.max_height_m
                } else {
                    // Rounded down to the step; a hair of tolerance keeps exact multiples.
                    ((l / step + 1e-9).floor() * step).min(l).max(0.0)
                }
            })
        })
        .collect();
    Ok(Envelope { height_m, capped, steps: dirs.len() })
}

/// One band of envelope heights.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct HeightBand {
    /// Lowest height in the band, metres (inclusive).
    pub from_m: f64,
    /// Highest, metres (exclusive, except the top band at the cap).
    pub to_m: f64,
    /// The cells of the band, merged.
    #[serde(skip)]
    pub outline: MultiPolygon<f64>,
}

/// The envelope's cells merged into bands `band_m` tall, lowest first.
pub fn height_bands(grid: &Grid, env: &Envelope, band_m: f64) -> Vec<HeightBand> {
    let band_m = if band_m.is_finite() && band_m > 0.0 { band_m } else { 1.0 };
    let mut by_band: std::collections::BTreeMap<i64, Vec<Polygon<f64>>> = Default::default();
    for row in 0..grid.rows {
        for col in 0..grid.cols {
            if let Some(h) = env.height_m.get(row * grid.cols + col) {
                by_band.entry((h / band_m + 1e-9).floor() as i64).or_default().push(cell_footprint(grid, col, row));
            }
        }
    }
    by_band
        .into_iter()
        .map(|(b, cells)| HeightBand {
            from_m: b as f64 * band_m,
            to_m: (b + 1) as f64 * band_m,
            outline: geo::unary_union(&cells),
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_subject_lot_is_the_proposals_lot_else_the_first_lot_else_the_first_area() {
        use crate::site::{AreaKind, Status};
        let mut model = crate::demo::demo();
        assert_eq!(subject_lot(&model).map(|a| a.id.as_str()), Some("lot-14"));
        for a in model.areas.iter_mut() {
            a.status = Status::Existing;
        }
        let first_lot = model.areas.iter().find(|a| a.kind == AreaKind::Lot).unwrap().id.clone();
        assert_eq!(subject_lot(&model).unwrap().id, first_lot);
        model.areas.retain(|a| a.kind != AreaKind::Lot);
        assert_eq!(subject_lot(&model).unwrap().id, model.areas[0].id);
        model.areas.clear();
        assert!(subject_lot(&model).is_none());
    }

    #[test]
    fn slide_distance_of_a_unit_square_toward_a_wall() {
        let sq =
            [Coord { x: 0.0, y: 0.0 }, Coord { x: 1.0, y: 0.0 }, Coord { x: 1.0, y: 1.0 }, Coord { x: 0.0, y: 1.0 }];
        let edges = vec![Line::new(Coord { x: -5.0, y: 4.0 }, Coord { x: 5.0, y: 4.0 })];
        let verts = vec![edges[0].start, edges[0].end];
        assert!((slide_distance(&sq, Coord { x: 0.0, y: 1.0 }, &edges, &verts) - 3.0).abs() < 1e-12);
        // A protected vertex pointing at the square's top edge decides.
        let spike = vec![
            Line::new(Coord { x: 0.5, y: 2.0 }, Coord { x: 0.0, y: 9.0 }),
            Line::new(Coord { x: 1.0, y: 9.0 }, Coord { x: 0.5, y: 2.0 }),
        ];
        let verts = vec![Coord { x: 0.5, y: 2.0 }];
        assert!((slide_distance(&sq, Coord { x: 0.0, y: 1.0 }, &spike, &verts) - 1.0).abs() < 1e-12);
    }
}
