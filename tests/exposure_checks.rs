//! Sun-hours maps against the exact point ray test (the shadows module), on the demo site.
//!
//! The same steps (10 minutes, midpoints between sunrise and sunset) are run both ways: rasterised
//! shadow polygons per cell, and a ray toward the sun from each cell's centre. They must agree within
//! one time step (the bar); in practice they agree exactly except where a centre lies on a
//! shadow edge.

use chrono::{Duration, NaiveDate};
use sunlot::exposure::{sun_hours, CellValues, Grid, Period, SunHoursRequest, DEFAULT_MAX_CELLS};
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
            let Some(h) = map.hours.get(row * g.cols + col) else { continue };
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

fn demo_grid(m: &sunlot::site::SiteModel, cell_m: f64) -> Grid {
    let polys: Vec<_> = m.areas.iter().map(|a| a.polygon.clone()).collect();
    Grid::over(&geo::MultiPolygon::new(polys), cell_m, DEFAULT_MAX_CELLS).unwrap()
}

/// The sun-hours request of the ground plane with the proposal built.
fn with_proposed<'a>(m: &'a sunlot::site::SiteModel, g: &'a Grid, period: Period) -> SunHoursRequest<'a> {
    SunHoursRequest {
        model: m,
        grid: g,
        period,
        plane_m: 0.0,
        delta_t: DeltaT::EspenakMeeus,
        massing: sunlot::exposure::Massing::WithProposed,
    }
}

#[test]
fn tiles_with_halos_stitched_equal_the_whole_map_exactly() {
    use sunlot::exposure::{massing_near, shadow_halo_m, Window};
    let m = sunlot::demo::demo();
    let g = demo_grid(&m, 0.5);
    let date = NaiveDate::from_ymd_opt(2026, 3, 21).unwrap();
    let window = Window::Clock {
        from: chrono::NaiveTime::from_hms_opt(9, 0, 0).unwrap(),
        to: chrono::NaiveTime::from_hms_opt(15, 0, 0).unwrap(),
    };
    let period = Period { first: date, last: date + Duration::days(2), window, step_min: 7 };
    let req = with_proposed(&m, &g, period);
    let whole = sun_hours(&req, |_| true).unwrap();
    let halo = shadow_halo_m(&m, &period, 0.0, DeltaT::EspenakMeeus).unwrap();
    assert!(halo.is_finite() && halo > 10.0, "halo {halo} m");
    let mut stitched = vec![f64::NAN; g.rows * g.cols];
    let tiles = g.tiles(37, 23);
    assert!(tiles.len() > 4);
    let mut dropped = 0;
    for t in &tiles {
        let near = massing_near(&m, t, halo);
        dropped += m.volumes.len() - near.volumes.len();
        let part = sun_hours(&SunHoursRequest { model: &near, grid: t, ..req.clone() }, |_| true).unwrap();
        g.stitch(t, part.hours.as_nan_coded(), &mut stitched);
    }
    assert!(dropped > 0, "some tiles must leave far volumes out for the halo to be tested");
    assert_eq!(CellValues::from_nan_coded(stitched), whole.hours);
}

#[test]
fn row_bands_stitched_equal_the_whole_map_exactly_for_every_kind_the_page_splits() {
    // The page's two map workers each compute one row band (Grid::row_band) of the sun-hours, lost-hours
    // and insolation maps; joined, the bands must be the whole map bit for bit. Bands of whole rows
    // with the whole massing: the same directions, spans and sums per row.
    use sunlot::exposure::{before_after, insolation, InsolationRequest, Massing, Window};
    let m = sunlot::demo::demo();
    let g = demo_grid(&m, 0.7);
    let date = NaiveDate::from_ymd_opt(2026, 11, 2).unwrap();
    let period = Period { first: date, last: date + Duration::days(1), window: Window::Daylight, step_min: 11 };
    let req = with_proposed(&m, &g, period);
    fn ins<'a>(m: &'a sunlot::site::SiteModel, grid: &'a Grid, period: Period) -> InsolationRequest<'a> {
        InsolationRequest {
            model: m,
            grid,
            period,
            plane_m: 0.0,
            delta_t: DeltaT::EspenakMeeus,
            massing: Massing::WithProposed,
            atmosphere: sunlot::sky::BirdAtmosphere::default(),
            sky_step_deg: 10.0,
        }
    }
    let whole = (
        sun_hours(&req, |_| true).unwrap(),
        before_after(&req, |_| true).unwrap(),
        insolation(&ins(&m, &g, period), |_| true).unwrap(),
    );
    for of in [2, 3] {
        let (mut hours, mut lost, mut total) =
            (vec![f64::NAN; g.rows * g.cols], vec![f64::NAN; g.rows * g.cols], vec![f64::NAN; g.rows * g.cols]);
        for index in 0..of {
            let band = g.row_band(index, of);
            assert!(band.rows > 0 && band.rows < g.rows, "band {index} of {of}: {} rows", band.rows);
            let part = SunHoursRequest { grid: &band, ..req.clone() };
            g.stitch(&band, sun_hours(&part, |_| true).unwrap().hours.as_nan_coded(), &mut hours);
            g.stitch(&band, before_after(&part, |_| true).unwrap().lost_h.as_nan_coded(), &mut lost);
            g.stitch(
                &band,
                insolation(&ins(&m, &band, period), |_| true).unwrap().total_kwh_m2.as_nan_coded(),
                &mut total,
            );
        }
        assert_eq!(CellValues::from_nan_coded(hours), whole.0.hours, "{of} bands: sun hours");
        assert_eq!(CellValues::from_nan_coded(lost), whole.1.lost_h, "{of} bands: hours lost");
        assert_eq!(CellValues::from_nan_coded(total), whole.2.total_kwh_m2, "{of} bands: insolation");
    }
    // More bands than rows: the extra bands are empty, the rest still the whole grid.
    let thin = g.row_band(0, g.rows);
    assert_eq!(thin.rows, 1);
    let bands: Vec<Grid> = (0..2 * g.rows).map(|i| g.row_band(i, 2 * g.rows)).collect();
    assert_eq!(bands.iter().map(|b| b.rows).sum::<usize>(), g.rows);
    assert!(bands.iter().any(|b| b.rows == 0));
}

#[test]
fn step_shares_joined_equal_the_whole_map_bit_for_bit() {
    // The page's map workers each cast one interleaved share of the period's steps (StepShare: by
    // days when the period has at least as many days as shares, else by steps) of the sun-hours and
    // lost-hours maps; the shares' sunlit milliseconds are whole numbers, so summed they are the whole
    // period's exactly, and the hours and the comparison formed from them equal the maps computed
    // whole, bit for bit (f64 equality of every cell, NaN outside).
    use sunlot::exposure::{before_after, sunlit_ms, BeforeAfter, Massing, StepShare, SunlitMs, Window};
    let m = sunlot::demo::demo();
    let g = demo_grid(&m, 0.7);
    let date = NaiveDate::from_ymd_opt(2026, 11, 2).unwrap();
    let bits = |v: &CellValues| v.as_nan_coded().iter().map(|x| x.to_bits()).collect::<Vec<_>>();
    // Two days at 11 minutes (shared by days for 2 shares, by steps for 3 and 7), nine days at 30.
    for (days, step_min, shares) in [(2, 11, vec![1, 2, 3, 7]), (9, 30, vec![2, 4])] {
        let last = date + Duration::days(days - 1);
        let period = Period { first: date, last, window: Window::Daylight, step_min };
        let req = with_proposed(&m, &g, period);
        let (whole, whole_ba) = (sun_hours(&req, |_| true).unwrap(), before_after(&req, |_| true).unwrap());
        for of in shares {
            let shares = |massing: Massing| -> SunlitMs {
                let r = SunHoursRequest { massing, ..req.clone() };
                let parts: Vec<SunlitMs> =
                    (0..of).map(|index| sunlit_ms(&r, StepShare { index, of }, |_| true).unwrap()).collect();
                assert!(parts.iter().all(|p| p.steps > 0), "{days} days, {of} shares: every share casts");
                SunlitMs::join(parts).unwrap()
            };
            let joined = shares(Massing::WithProposed).hours();
            assert_eq!(bits(&joined.hours), bits(&whole.hours), "{days} days, {of} shares: sun hours");
            assert_eq!(joined.open_hours.to_bits(), whole.open_hours.to_bits());
            assert_eq!(joined.steps, whole.steps);
            let ba = BeforeAfter::of(shares(Massing::Existing).hours(), joined);
            assert_eq!(bits(&ba.lost_h), bits(&whole_ba.lost_h), "{days} days, {of} shares: hours lost");
            assert_eq!(bits(&ba.ratio), bits(&whole_ba.ratio), "{days} days, {of} shares: ratio");
        }
    }
    let period = Period { first: date, last: date, window: Window::Daylight, step_min: 30 };
    let req = with_proposed(&m, &g, period);
    // A share that is not one is refused, not computed.
    assert!(sunlit_ms(&req, StepShare { index: 2, of: 2 }, |_| true).is_err());
    assert!(sunlit_ms(&req, StepShare { index: 0, of: 0 }, |_| true).is_err());
    assert!(SunlitMs::join(Vec::new()).is_none());
}

#[test]
fn rasterised_shadow_area_matches_the_exact_polygons_within_a_cell_per_metre_of_boundary() {
    // One step at a time: the cells a 1-step map finds shaded, times the cell area, against the
    // area of the exact union of shadows (the shadows module, clipped to the grid) inside the grid.
    use geo::{Area, BooleanOps, Euclidean, Length};
    use sunlot::shadow::{cast_shadows, Shadows};
    let m = sunlot::demo::demo();
    let g = demo_grid(&m, 0.25);
    let mut square = g.clone();
    square.inside.iter_mut().for_each(|c| *c = true);
    let frame = g.bounds().to_polygon();
    let receiver = Receiver::on(&m.ground, m.plan_rotation_deg, 0.0);
    for (date, hh) in
        [(NaiveDate::from_ymd_opt(2026, 3, 20).unwrap(), 9), (NaiveDate::from_ymd_opt(2026, 6, 21).unwrap(), 15)]
    {
        let t0 = m.zone.resolve(date.and_hms_opt(hh, 0, 0).unwrap(), sunlot::time::Fold::Earlier).unwrap();
        let period = Period {
            first: date,
            last: date,
            window: sunlot::exposure::Window::Clock {
                from: chrono::NaiveTime::from_hms_opt(hh, 0, 0).unwrap(),
                to: chrono::NaiveTime::from_hms_opt(hh, 2, 0).unwrap(),
            },
            step_min: 2,
        };
        let req = SunHoursRequest {
            model: &m,
            grid: &square,
            period,
            plane_m: 0.0,
            delta_t: DeltaT::EspenakMeeus,
            massing: sunlot::exposure::Massing::WithProposed,
        };
        let map = sun_hours(&req, |_| true).unwrap();
        let shaded_cells = map.hours.iter().filter(|h| h.unwrap() < map.open_hours * 0.5).count();
        let mid = t0 + Duration::minutes(1);
        let sun =
            Ephemeris::new().sun_at(mid, DeltaT::EspenakMeeus).unwrap().observe(&m.location, &Atmosphere::default());
        let s = cast_shadows(
            &m.volumes,
            &m.walls,
            m.plan_azimuth_deg(sun.azimuth_deg),
            sun.altitude_deg,
            &receiver,
            g.bounds(),
        )
        .unwrap();
        let Shadows::Sun { union, .. } = s else { panic!("sun up") };
        let exact = union.intersection(&geo::MultiPolygon::new(vec![frame.clone()]));
        let boundary: f64 = exact
            .0
            .iter()
            .flat_map(|p| std::iter::once(p.exterior()).chain(p.interiors()))
            .map(|r| Euclidean.length(r))
            .sum();
        let raster = shaded_cells as f64 * g.cell_m * g.cell_m;
        let tol = g.cell_m * g.cell_m * boundary; // one cell's area per metre of boundary
        assert!(
            (raster - exact.unsigned_area()).abs() <= tol,
            "{date} {hh}h: {raster} vs {} m² (tol {tol})",
            exact.unsigned_area()
        );
    }
}

#[test]
fn sun_hours_at_points_match_the_point_timeline_within_one_step() {
    use sunlot::exposure::day_timeline;
    let m = sunlot::demo::demo();
    let garden = m.areas.iter().find(|a| a.id == "garden-16").unwrap();
    let g = Grid::over_polygon(&garden.polygon, 1.5, DEFAULT_MAX_CELLS).unwrap();
    let date = NaiveDate::from_ymd_opt(2026, 3, 20).unwrap();
    let req = SunHoursRequest {
        model: &m,
        grid: &g,
        period: Period::day(date, 5),
        plane_m: 0.0,
        delta_t: DeltaT::EspenakMeeus,
        massing: sunlot::exposure::Massing::WithProposed,
    };
    let map = sun_hours(&req, |_| true).unwrap();
    let mut compared = 0;
    for row in (0..g.rows).step_by(2) {
        for col in (0..g.cols).step_by(2) {
            let Some(h) = map.hours.get(row * g.cols + col) else { continue };
            let c = g.centre(col, row);
            let t =
                day_timeline(&m, ViewPoint { x_m: c.x, y_m: c.y, z_m: 0.0 }, date, req.massing, DeltaT::EspenakMeeus)
                    .unwrap();
            // Each change of state can be off by up to one step in the map; count them.
            let changes = t.intervals.len().max(1) as f64;
            assert!(
                (h - t.sun_hours).abs() <= changes * 5.0 / 60.0,
                "cell {col},{row}: map {h} h, timeline {} h",
                t.sun_hours
            );
            compared += 1;
        }
    }
    assert!(compared > 10);
}
