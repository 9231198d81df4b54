//! Facade maps: hours of direct sun and clear-sky insolation (beam and diffuse) on a grid over each
//! face of a building, for elevations (the faces unfolded side by side).
//!
//! # Method
//! Each edge of a volume's footprint (outer ring) is a vertical face from the volume's base to its
//! top, facing the edge's outward normal. The face is cut into columns and rows no wider or taller than
//! the cell size asked for (so the cells fit the face exactly), each sampled at its centre 1 cm in front
//! of the face. A cell has sun at a sun-up step when the sun is in front of the face (within 90° of its
//! normal) and the exact ray toward it is clear of the massing ([`super::window_sun`]'s test, the
//! steps of [`SunSteps`]); its beam insolation adds DNI · cos i over those steps, i the angle of
//! incidence on the vertical face (cos i = cos α · cos(A − β); Duffie & Beckman, *Solar Engineering of
//! Thermal Processes*, eq. 1.6.3 with tilt 90°) and DNI from the Bird clear-sky model (Bird & Hulstrom
//! 1981). Its diffuse insolation is the Bird diffuse horizontal irradiance summed over every sun-up
//! step, times the cell's view factor of the visible sky for an isotropic sky
//! ([`crate::daylight::isotropic_sky_view`], ½ for an open face; Liu & Jordan 1963), skyline sampled
//! every [`FACADE_SKY_STEP_DEG`]. Light reflected from the ground and from buildings is not counted.

use geo::Coord;

use super::grid::ExposureError;
use super::insolation::step_sky;
use super::shade::Massing;
use super::sun_hours::MIN_CAST_ALTITUDE_DEG;
use super::timeline::PointSky;
use super::window_sun::{in_front_of_wall, SunSteps};
use crate::shadow::{Exposure, ViewPoint};
use crate::site::{SiteModel, Status};
use crate::sky::BirdAtmosphere;
use crate::time::DeltaT;

/// Azimuth bins of the cells' sky view, degrees.
pub const FACADE_SKY_STEP_DEG: f64 = 1.0;

/// How far in front of the face a cell is sampled, metres.
pub const SAMPLE_OFFSET_M: f64 = 0.01;

/// Most cells of one facade map (all faces together).
pub const MAX_FACADE_CELLS: usize = 200_000;
/// Largest side of a face's cells when a request does not say, metres.
pub const DEFAULT_FACADE_CELL_M: f64 = 1.0;

/// One face of a volume.
#[derive(Debug, Clone, PartialEq)]
pub struct Face {
    /// The face's number around the footprint, from 1.
    pub number: usize,
    /// Plan start of the face's base line (the left end seen from outside), metres.
    pub start: Coord<f64>,
    /// Plan end (the right end seen from outside), metres.
    pub end: Coord<f64>,
    /// Bottom and top of the face above the ground, metres.
    pub base_m: f64,
    /// Top of the face.
    pub top_m: f64,
    /// Direction the face looks, degrees clockwise from true north.
    pub facing_deg: f64,
}

impl Face {
    /// Length along the ground, metres.
    pub fn length_m(&self) -> f64 {
        ((self.end.x - self.start.x).powi(2) + (self.end.y - self.start.y).powi(2)).sqrt()
    }

    /// A compass label of the facing: N, NE, E, … (8 points).
    pub fn compass(&self) -> &'static str {
        const POINTS: [&str; 8] = ["N", "NE", "E", "SE", "S", "SW", "W", "NW"];
        POINTS[((self.facing_deg / 45.0).round() as usize) % 8]
    }
}

/// A site window drawn on a face: where along and up the face, and its opening. Serialized with
/// snake_case keys and, in the wasm build, camelCase keys (the JavaScript facade's naming).
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
#[cfg_attr(target_arch = "wasm32", serde(rename_all = "camelCase"))]
pub struct FaceWindow {
    /// Window id.
    pub id: String,
    /// Distance of its reference point from the face's start, metres.
    pub along_m: f64,
    /// Height of its reference point above the ground, metres.
    pub z_m: f64,
    /// Opening width and height, metres.
    pub width_m: f64,
    /// Opening height.
    pub height_m: f64,
}

/// One face's cells.
#[derive(Debug, Clone, PartialEq)]
pub struct FaceMap {
    /// The face.
    pub face: Face,
    /// Columns along the face (from its start) and rows up it (from its base).
    pub cols: usize,
    /// Rows.
    pub rows: usize,
    /// Hours of direct sun per cell, row-major, row 0 at the bottom.
    pub sun_hours: Vec<f64>,
    /// Clear-sky beam insolation on the face per cell, kWh/m².
    pub beam_kwh_m2: Vec<f64>,
    /// Clear-sky diffuse insolation from the visible sky per cell (isotropic sky), kWh/m².
    pub diffuse_kwh_m2: Vec<f64>,
    /// The site's windows on this face.
    pub windows: Vec<FaceWindow>,
}

impl FaceMap {
    /// Cell width along the face and height up it, metres.
    pub fn cell_size_m(&self) -> (f64, f64) {
        (self.face.length_m() / self.cols as f64, (self.face.top_m - self.face.base_m) / self.rows as f64)
    }

    /// The plan point and height of cell (`col`, `row`)'s sample.
    pub fn sample(&self, col: usize, row: usize) -> ViewPoint {
        let f = &self.face;
        let (u, v) = ((col as f64 + 0.5) / self.cols as f64, (row as f64 + 0.5) / self.rows as f64);
        let (dx, dy) = (f.end.x - f.start.x, f.end.y - f.start.y);
        let len = f.length_m();
        // The outward normal: to the right of start → end, seen from above, for an anticlockwise ring.
        let (nx, ny) = (dy / len, -dx / len);
        ViewPoint {
            x_m: f.start.x + u * dx + SAMPLE_OFFSET_M * nx,
            y_m: f.start.y + u * dy + SAMPLE_OFFSET_M * ny,
            z_m: f.base_m + v * (f.top_m - f.base_m),
        }
    }
}

/// What a facade elevation shows.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum FacadeLayer {
    /// Hours of direct sun.
    Hours,
    /// Clear-sky beam insolation, kWh/m².
    Beam,
    /// Clear-sky insolation, beam and sky diffuse, kWh/m².
    Insolation,
    /// Hours of direct sun lost to the proposal (the existing massing alone minus with it).
    Lost,
}

impl FacadeLayer {
    /// The layer named `hours`, `beam`, `insolation` or `lost`.
    pub fn named(name: &str) -> Option<Self> {
        match name {
            "hours" => Some(FacadeLayer::Hours),
            "beam" => Some(FacadeLayer::Beam),
            "insolation" => Some(FacadeLayer::Insolation),
            "lost" => Some(FacadeLayer::Lost),
            _ => None,
        }
    }

    /// What the values are, for a figure's title.
    pub fn label(self) -> &'static str {
        match self {
            FacadeLayer::Hours => "Hours of direct sun",
            FacadeLayer::Beam => "Clear-sky beam insolation",
            FacadeLayer::Insolation => "Clear-sky insolation (beam and sky diffuse)",
            FacadeLayer::Lost => "Hours of direct sun lost to the proposal",
        }
    }

    /// The values' unit, for the legend.
    pub fn unit(self) -> &'static str {
        match self {
            FacadeLayer::Hours | FacadeLayer::Lost => "h",
            FacadeLayer::Beam | FacadeLayer::Insolation => "kWh/m²",
        }
    }

    /// Whether the layer needs the faces before the proposal too.
    pub fn needs_before(self) -> bool {
        self == FacadeLayer::Lost
    }

    /// The values per face, row-major as the face's cells; `before` (the same faces with the
    /// existing massing alone) is used by [`FacadeLayer::Lost`] only, and `None` there gives `None`.
    pub fn values(self, faces: &[FaceMap], before: Option<&[FaceMap]>) -> Option<Vec<Vec<f64>>> {
        Some(match self {
            FacadeLayer::Hours => faces.iter().map(|f| f.sun_hours.clone()).collect(),
            FacadeLayer::Beam => faces.iter().map(|f| f.beam_kwh_m2.clone()).collect(),
            FacadeLayer::Insolation => faces
                .iter()
                .map(|f| f.beam_kwh_m2.iter().zip(&f.diffuse_kwh_m2).map(|(b, d)| b + d).collect())
                .collect(),
            FacadeLayer::Lost => before?
                .iter()
                .zip(faces)
                .map(|(b, f)| b.sun_hours.iter().zip(&f.sun_hours).map(|(b, a)| (b - a).max(0.0)).collect())
                .collect(),
        })
    }
}

/// The faces of volume `volume_id`, anticlockwise around its footprint.
///
/// # Errors
/// [`ExposureError::Period`] naming the volume when the site has none of that id.
pub fn faces_of(model: &SiteModel, volume_id: &str) -> Result<Vec<Face>, ExposureError> {
    let v = model.volumes.iter().find(|v| v.id == volume_id).ok_or_else(|| {
        let ids: Vec<&str> = model.volumes.iter().map(|v| v.id.as_str()).collect();
        ExposureError::Period(format!("volume: the site has no volume {volume_id:?}; volumes: {}", ids.join(", ")))
    })?;
    let mut ring: Vec<Coord<f64>> = v.footprint.exterior().0.clone();
    if ring.len() > 1 && ring.first() == ring.last() {
        ring.pop();
    }
    let twice_area: f64 = (0..ring.len())
        .map(|i| ring[i].x * ring[(i + 1) % ring.len()].y - ring[(i + 1) % ring.len()].x * ring[i].y)
        .sum();
    if twice_area < 0.0 {
        ring.reverse();
    }
    let n = ring.len();
    let mut faces = Vec::new();
    for i in 0..n {
        let (a, b) = (ring[i], ring[(i + 1) % n]);
        let (dx, dy) = (b.x - a.x, b.y - a.y);
        if dx.hypot(dy) < 1e-6 {
            continue;
        }
        // Outward normal (dy, −dx) in the plan; its plan azimuth, then true.
        let plan_az = dy.atan2(-dx).to_degrees();
        let facing_deg = (plan_az - model.plan_rotation_deg).rem_euclid(360.0);
        faces.push(Face { number: faces.len() + 1, start: a, end: b, base_m: v.base_m, top_m: v.top_m, facing_deg });
    }
    Ok(faces)
}

/// What to map.
#[derive(Debug, Clone)]
pub struct FacadeRequest<'a> {
    /// The site.
    pub model: &'a SiteModel,
    /// The volume whose faces are mapped.
    pub volume_id: &'a str,
    /// Largest cell side, metres.
    pub cell_m: f64,
    /// The massing that casts (the mapped volume itself always stands).
    pub massing: Massing,
    /// ΔT.
    pub delta_t: DeltaT,
    /// The clear-sky atmosphere of the beam.
    pub atmosphere: BirdAtmosphere,
}

/// Maps every face of the volume over the steps `steps`. `progress` gets the fraction done and may
/// cancel.
///
/// # Errors
/// [`ExposureError`] for an unknown volume, a cell under 5 cm, too many cells, too many ray tests, or
/// a cancelled run.
pub fn facade_map(
    req: &FacadeRequest,
    steps: &SunSteps,
    mut progress: impl FnMut(f64) -> bool,
) -> Result<Vec<FaceMap>, ExposureError> {
    let model = req.model;
    if !(req.cell_m.is_finite() && req.cell_m >= 0.05) {
        return Err(ExposureError::Period(format!("cell_m must be at least 0.05 m on a facade, got {}", req.cell_m)));
    }
    let faces = faces_of(model, req.volume_id)?;
    let mut maps: Vec<FaceMap> = faces
        .into_iter()
        .map(|face| {
            let cols = (face.length_m() / req.cell_m).ceil().max(1.0) as usize;
            let rows = ((face.top_m - face.base_m) / req.cell_m).ceil().max(1.0) as usize;
            let windows = windows_on(model, &face);
            FaceMap { face, cols, rows, sun_hours: vec![], beam_kwh_m2: vec![], diffuse_kwh_m2: vec![], windows }
        })
        .collect();
    let cells: usize = maps.iter().map(|m| m.cols * m.rows).sum();
    crate::limits::within("cell_m", cells as f64, MAX_FACADE_CELLS as f64, "facade cells")?;
    let casters = model.volumes.len() + model.walls.len();
    let per_cell = steps.max_steps() + 360.0 / FACADE_SKY_STEP_DEG;
    crate::limits::ray_tests(
        "cell_m, step_min",
        per_cell * cells as f64,
        casters,
        "use larger cells, a longer step or a shorter period",
    )?;
    // The whole sky's diffuse on the horizontal over the period, Wh/m².
    let dhi_wh: f64 = steps.all().map(|s| step_sky(s, &req.atmosphere).dhi_w_m2 * s.dt_s / 3600.0).sum();
    // The mapped volume stands whatever the massing (a proposed building's own faces, before: nothing
    // to map, so it counts as built).
    let mut massing = req.massing;
    if model.volumes.iter().any(|v| v.id == req.volume_id && v.status == Status::Proposed) {
        massing = Massing::WithProposed;
    }
    // One ray test over the massing, moved from cell to cell.
    let mut s = PointSky::new(model, ViewPoint { x_m: 0.0, y_m: 0.0, z_m: 0.0 }, massing, req.delta_t);
    let mut done = 0usize;
    for m in &mut maps {
        let (n, facing) = (m.cols * m.rows, m.face.facing_deg);
        m.sun_hours = vec![0.0; n];
        m.beam_kwh_m2 = vec![0.0; n];
        m.diffuse_kwh_m2 = vec![0.0; n];
        let plane = crate::daylight::SkyPlane::Vertical { facing_deg: facing };
        for row in 0..m.rows {
            for col in 0..m.cols {
                let p = m.sample(col, row);
                s.set_point(p);
                let (mut hours, mut wh) = (0.0, 0.0);
                for step in steps.all() {
                    if !in_front_of_wall(step.sun.azimuth_deg, facing) {
                        continue;
                    }
                    let az = model.plan_azimuth_deg(step.sun.azimuth_deg);
                    if s.toward(az, step.sun.altitude_deg.max(MIN_CAST_ALTITUDE_DEG))? != Exposure::Sunlit {
                        continue;
                    }
                    hours += step.dt_s / 3600.0;
                    let cos_i = step.sun.altitude_deg.max(0.0).to_radians().cos()
                        * (step.sun.azimuth_deg - facing).to_radians().cos();
                    wh += step_sky(step, &req.atmosphere).dni_w_m2 * cos_i.max(0.0) * step.dt_s / 3600.0;
                }
                m.sun_hours[row * m.cols + col] = hours;
                m.beam_kwh_m2[row * m.cols + col] = wh / 1000.0;
                let view = crate::daylight::isotropic_sky_view(model, p, plane, massing, FACADE_SKY_STEP_DEG)?;
                m.diffuse_kwh_m2[row * m.cols + col] = view * dhi_wh / 1000.0;
                done += 1;
            }
            if !progress(done as f64 / cells as f64) {
                return Err(ExposureError::Cancelled);
            }
        }
    }
    Ok(maps)
}

/// The site's windows whose reference point lies within 0.3 m of the face's plane, over its length and
/// height, facing within 30° of it.
fn windows_on(model: &SiteModel, face: &Face) -> Vec<FaceWindow> {
    let (dx, dy, len) = (face.end.x - face.start.x, face.end.y - face.start.y, face.length_m());
    let (ux, uy) = (dx / len, dy / len);
    model
        .windows
        .iter()
        .filter_map(|w| {
            let (px, py) = (w.at.x - face.start.x, w.at.y - face.start.y);
            let along = px * ux + py * uy;
            let off = px * uy - py * ux; // distance in front of the face (outward positive)
            let turn = (w.facing_deg - face.facing_deg + 540.0).rem_euclid(360.0) - 180.0;
            let on = off.abs() <= 0.3
                && (0.0..=len).contains(&along)
                && (face.base_m..=face.top_m).contains(&w.z_m)
                && turn.abs() <= 30.0;
            on.then(|| FaceWindow {
                id: w.id.clone(),
                along_m: along,
                z_m: w.z_m,
                width_m: w.opening_width_m,
                height_m: w.opening_height_m,
            })
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::exposure::{Period, Window};
    use crate::site::test_sites::{block, flat_site};
    use chrono::NaiveDate;

    fn request<'a>(m: &'a SiteModel, id: &'a str, cell_m: f64) -> FacadeRequest<'a> {
        FacadeRequest {
            model: m,
            volume_id: id,
            cell_m,
            massing: Massing::WithProposed,
            delta_t: DeltaT::EspenakMeeus,
            atmosphere: BirdAtmosphere::default(),
        }
    }

    #[test]
    fn a_box_has_four_faces_facing_the_compass_points_with_cells_that_fit() {
        let m = flat_site(vec![block("house", 0.0, 0.0, 10.0, 6.0, 7.5)], 52.0);
        let faces = faces_of(&m, "house").unwrap();
        let facing: Vec<f64> = faces.iter().map(|f| f.facing_deg).collect();
        assert_eq!(facing, vec![180.0, 90.0, 0.0, 270.0], "{faces:?}");
        assert_eq!(faces[0].compass(), "S");
        let e = faces_of(&m, "shed").unwrap_err().to_string();
        assert!(e.contains("shed") && e.contains("house"), "{e}");
        let steps = SunSteps::of(
            &m,
            &Period::day(NaiveDate::from_ymd_opt(2026, 3, 20).unwrap(), 30),
            DeltaT::EspenakMeeus,
            |_| true,
        )
        .unwrap();
        let maps = facade_map(&request(&m, "house", 0.8), &steps, |_| true).unwrap();
        let south = &maps[0];
        assert_eq!((south.cols, south.rows), (13, 10));
        let (w, h) = south.cell_size_m();
        assert!((w * 13.0 - 10.0).abs() < 1e-12 && (h * 10.0 - 7.5).abs() < 1e-12);
        let p = south.sample(0, 0);
        assert!((p.y_m + SAMPLE_OFFSET_M).abs() < 1e-12 && p.x_m > 0.0 && p.x_m < 0.8);
    }

    /// On an open site every cell of a face gets the hours the sun is in front of it (the window test
    /// for an unobstructed window, checked there against the closed form), the south face at the
    /// equinox all day; a tall block to the south shades the lower rows of the south face and not the
    /// top ones; the beam on the south face at noon-ish is below the DNI.
    #[test]
    fn open_faces_get_the_window_hours_and_an_obstruction_shades_the_lower_rows() {
        let date = NaiveDate::from_ymd_opt(2026, 3, 20).unwrap();
        let open = flat_site(vec![block("house", 0.0, 0.0, 10.0, 6.0, 7.5)], 52.0);
        let period = Period { first: date, last: date, window: Window::Daylight, step_min: 10 };
        let steps = SunSteps::of(&open, &period, DeltaT::EspenakMeeus, |_| true).unwrap();
        let maps = facade_map(&request(&open, "house", 1.0), &steps, |_| true).unwrap();
        let p = maps[0].sample(4, 3);
        let aim = crate::exposure::WindowAim::at(p, 180.0);
        let want = crate::exposure::window_sun_hours(&open, &aim, &period, DeltaT::EspenakMeeus, |_| true).unwrap();
        assert!(maps[0].sun_hours.iter().all(|h| (h - want.sun_hours).abs() < 1e-9), "{:?}", maps[0].sun_hours);
        assert!(maps[0].beam_kwh_m2.iter().all(|&k| k > 1.0 && k < 8.0), "{:?}", maps[0].beam_kwh_m2[0]);
        // An open face sees half the isotropic sky: half the day's diffuse horizontal.
        let dhi: f64 = steps.all().map(|s| step_sky(s, &BirdAtmosphere::default()).dhi_w_m2 * s.dt_s / 3.6e6).sum();
        assert!(
            maps[0].diffuse_kwh_m2.iter().all(|&k| (k - dhi / 2.0).abs() < 1e-3 * dhi),
            "{} vs {dhi}",
            maps[0].diffuse_kwh_m2[0]
        );
        let shaded = flat_site(
            vec![block("house", 0.0, 0.0, 10.0, 6.0, 7.5), block("wall", -50.0, -14.0, 60.0, -10.0, 12.0)],
            52.0,
        );
        let maps = facade_map(&request(&shaded, "house", 1.0), &steps, |_| true).unwrap();
        let s = &maps[0];
        let (bottom, top) = (s.sun_hours[4], s.sun_hours[(s.rows - 1) * s.cols + 4]);
        assert!(bottom < top - 2.0 && top <= want.sun_hours + 1e-9, "bottom {bottom}, top {top}");
    }

    #[test]
    fn windows_on_a_face_are_found_and_oversized_requests_refused() {
        let mut m = flat_site(vec![block("house", 0.0, 0.0, 10.0, 6.0, 7.5)], 52.0);
        m.windows.push(
            crate::site::WindowPoint {
                id: "w".into(),
                name: "w".into(),
                status: Status::Existing,
                at: Coord { x: 3.0, y: -0.05 },
                z_m: 1.2,
                facing_deg: 180.0,
                opening_width_m: 1.0,
                opening_height_m: 1.2,
            }
            .checked()
            .unwrap(),
        );
        let faces = faces_of(&m, "house").unwrap();
        let on: Vec<usize> = faces.iter().map(|f| windows_on(&m, f).len()).collect();
        assert_eq!(on, vec![1, 0, 0, 0]);
        assert!((windows_on(&m, &faces[0])[0].along_m - 3.0).abs() < 1e-12);
        let steps = SunSteps::of(
            &m,
            &Period::day(NaiveDate::from_ymd_opt(2026, 3, 20).unwrap(), 60),
            DeltaT::EspenakMeeus,
            |_| true,
        )
        .unwrap();
        let e = facade_map(&request(&m, "house", 0.01), &steps, |_| true).unwrap_err().to_string();
        assert!(e.contains("cell_m"), "{e}");
    }
}
