//! The solar envelope against the exact shadow polygons of the shadows module, on the demo site.

use chrono::{NaiveDate, NaiveTime};
use geo::{Area, BooleanOps, MultiPolygon};
use sunlot::envelope::{cell_footprint, solar_envelope, EnvelopeRequest};
use sunlot::exposure::{Grid, Period, Window, DEFAULT_MAX_CELLS, MIN_CAST_ALTITUDE_DEG};
use sunlot::shadow::{shadow_offset_per_m, volume_shadow};
use sunlot::site::{AreaKind, Status, Volume};
use sunlot::solar::Ephemeris;
use sunlot::time::DeltaT;

#[test]
fn a_massing_filling_the_envelope_keeps_off_the_protected_areas_and_one_step_more_does_not() {
    let m = sunlot::demo::demo();
    let lot = m.areas.iter().find(|a| a.id == "lot-14").unwrap();
    let protected: Vec<_> = m.areas.iter().filter(|a| a.kind == AreaKind::Garden).map(|a| a.polygon.clone()).collect();
    let grid = Grid::over_polygon(&lot.polygon, 1.0, DEFAULT_MAX_CELLS).unwrap();
    let date = NaiveDate::from_ymd_opt(2026, 3, 21).unwrap();
    let t = |h| NaiveTime::from_hms_opt(h, 0, 0).unwrap();
    let period = Period { first: date, last: date, window: Window::Clock { from: t(9), to: t(15) }, step_min: 15 };
    let step_m = 0.1;
    let req = EnvelopeRequest {
        model: &m,
        grid: &grid,
        protected: &protected,
        period,
        max_height_m: 40.0,
        height_step_m: step_m,
        delta_t: DeltaT::EspenakMeeus,
    };
    let env = solar_envelope(&req, |_| true).unwrap();
    let heights: Vec<f64> = env.height_m.values().collect();
    assert!(heights.iter().any(|&h| h > 3.0) && heights.iter().any(|&h| h < 40.0), "a shaped envelope");

    // The same steps' shadow offsets, from the solar engine.
    let mut eph = Ephemeris::new();
    let offsets: Vec<_> = period
        .steps_of(&m, date, DeltaT::EspenakMeeus, &mut eph)
        .unwrap()
        .iter()
        .filter_map(|s| {
            shadow_offset_per_m(m.plan_azimuth_deg(s.sun.azimuth_deg), s.sun.altitude_deg.max(MIN_CAST_ALTITUDE_DEG))
        })
        .collect();
    assert_eq!(offsets.len(), env.steps);
    let protected_mp = MultiPolygon::new(protected.clone());
    let overlap = |col: usize, row: usize, h: f64| -> f64 {
        if h <= 0.0 {
            return 0.0;
        }
        let v = Volume::new("cell", Status::Proposed, cell_footprint(&grid, col, row), 0.0, h).unwrap();
        offsets
            .iter()
            .map(|&o| volume_shadow(&v, o, 0.0).intersection(&protected_mp).unsigned_area())
            .fold(0.0, f64::max)
    };
    let mut raised_checked = 0;
    for row in 0..grid.rows {
        for col in 0..grid.cols {
            let i = row * grid.cols + col;
            let Some(h) = env.height_m.get(i) else { continue };
            // Filling the envelope: no shadow on protected land (beyond the boolean engine's noise).
            assert!(overlap(col, row, h) < 1e-6, "cell {col},{row} at {h} m overlaps");
            if !env.capped[i] && h > 0.0 && (row + col) % 3 == 0 {
                assert!(overlap(col, row, h + step_m) > 1e-6, "cell {col},{row} raised to {} m casts none", h + step_m);
                raised_checked += 1;
            }
        }
    }
    assert!(raised_checked > 20, "{raised_checked}");
}

#[test]
fn bad_envelope_requests_are_refused() {
    let m = sunlot::demo::demo();
    let lot = m.areas.iter().find(|a| a.id == "lot-14").unwrap();
    let grid = Grid::over_polygon(&lot.polygon, 1.0, DEFAULT_MAX_CELLS).unwrap();
    let date = NaiveDate::from_ymd_opt(2026, 3, 21).unwrap();
    let protected = vec![m.areas[1].polygon.clone()];
    let ok = EnvelopeRequest {
        model: &m,
        grid: &grid,
        protected: &protected,
        period: Period::day(date, 15),
        max_height_m: 30.0,
        height_step_m: 0.1,
        delta_t: DeltaT::EspenakMeeus,
    };
    assert!(solar_envelope(&EnvelopeRequest { max_height_m: -1.0, ..ok.clone() }, |_| true).is_err());
    assert!(solar_envelope(&EnvelopeRequest { height_step_m: 0.0, ..ok.clone() }, |_| true).is_err());
    assert!(solar_envelope(&EnvelopeRequest { protected: &[], ..ok.clone() }, |_| true).is_err());
    assert_eq!(solar_envelope(&ok, |_| false).unwrap_err().to_string(), "cancelled");
}
