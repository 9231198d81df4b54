//! Sun-hours maps against the exact point ray test (the shadows module), on the demo site.
//!
//! The same steps (10 minutes, midpoints between sunrise and sunset) are run both ways: rasterised
//! shadow polygons per cell, and a ray toward the sun from each cell's centre. They must agree within
//! one time step (the bar); in practice they agree exactly except where a centre lies on a
//! shadow edge.

use chrono::{Duration, NaiveDate};
use sunlot::exposure::{sun_hours, Grid, Period, SunHoursRequest, DEFAULT_MAX_CELLS};
use sunlot::shadow::{exposure, Exposure, Receiver, ViewPoint};
use sunlot::solar::{day_events, Atmosphere, Crossing, Ephemeris};
use sunlot::time::DeltaT;

#[test]
fn cell_sun_hours_match_point_ray_tests_within_one_step() {
    let m = sunlot::demo::demo();
    let garden = m.areas.iter().find(|a| a.id == "garden-16").unwrap();
    let g = Grid::over_polygon(&garden.polygon, 1.0, DEFAULT_MAX_CELLS).unwrap();
    let date = NaiveDate::from_ymd_opt(2026, 3, 20).unwrap();
    let req = SunHoursRequest {
        model: &m,
        grid: &g,
        period: Period::day(date, 10),
        plane_m: 0.0,
        delta_t: DeltaT::EspenakMeeus,
        massing: sunlot::exposure::Massing::WithProposed,
    };
    let map = sun_hours(&req, |_| true).unwrap();

    let ev = day_events(&m.location, date, &m.zone, DeltaT::EspenakMeeus).unwrap();
    let Crossing::Crosses { rise, set } = ev.sun else { panic!("the sun rises") };
    let ground = Receiver::flat_ground();
    let mut eph = Ephemeris::new();
    let (start, end) = (m.zone.start_of_day(date), m.zone.start_of_day(date + Duration::days(1)));
    let mut suns = Vec::new();
    let mut t0 = start;
    while t0 < end {
        let mid = t0 + Duration::minutes(5);
        t0 += Duration::minutes(10);
        if mid >= rise && mid <= set {
            suns.push(eph.sun_at(mid, DeltaT::EspenakMeeus).unwrap().observe(&m.location, &Atmosphere::default()));
        }
    }
    let mut compared = 0;
    for row in (0..g.rows).step_by(3) {
        for col in 0..g.cols {
            let Some(h) = map.hours[row * g.cols + col] else { continue };
            let c = g.centre(col, row);
            let p = ViewPoint { x_m: c.x, y_m: c.y, z_m: 0.0 };
            let lit = suns
                .iter()
                .filter(|s| {
                    let e = exposure(
                        p,
                        &m.volumes,
                        &m.walls,
                        &ground,
                        m.plan_azimuth_deg(s.azimuth_deg),
                        s.altitude_deg.max(0.01),
                    )
                    .unwrap();
                    e == Exposure::Sunlit
                })
                .count();
            let ray_h = lit as f64 * 10.0 / 60.0;
            assert!((h - ray_h).abs() <= 10.0 / 60.0 + 1e-9, "cell {col},{row}: map {h} h, rays {ray_h} h");
            compared += 1;
        }
    }
    assert!(compared > 50);
}
