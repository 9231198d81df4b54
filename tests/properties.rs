//! Properties that hold for every valid input (proptest): ranges, identities, and no panics.
#![cfg(not(target_arch = "wasm32"))]

use chrono::{DateTime, Duration, NaiveDate, Utc};
use proptest::prelude::*;
use sunlot::solar::{day_events, solar_position, Atmosphere, Crossing, Site};
use sunlot::time::{DeltaT, Fold, Zone};

fn instant_1900_2100() -> impl Strategy<Value = DateTime<Utc>> {
    (-2_208_988_800_i64..4_133_894_400_i64).prop_map(|s| DateTime::from_timestamp(s, 0).unwrap())
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(2_000))]

    /// Zenith 0–180°, azimuth 0–360°, altitude = 90° − zenith, incidence 0–180°, for any site and time.
    #[test]
    fn position_angles_stay_in_their_ranges(lat in -90.0..=90.0_f64, lon in -180.0..=180.0_f64, elev in -500.0..9000.0_f64,
                                            t in instant_1900_2100(), p in 300.0..1100.0_f64, temp in -60.0..60.0_f64,
                                            tilt in 0.0..=180.0_f64, face in 0.0..360.0_f64) {
        let site = Site::new(lat, lon, elev).unwrap();
        let air = Atmosphere::new(p, temp, true).unwrap();
        let s = solar_position(&site, t, &air, DeltaT::EspenakMeeus).unwrap();
        prop_assert!((0.0..=180.0).contains(&s.zenith_deg));
        prop_assert!((0.0..360.0).contains(&s.azimuth_deg));
        prop_assert!((s.altitude_deg - (90.0 - s.zenith_deg)).abs() < 1e-12);
        prop_assert!((-180.0..=180.0).contains(&s.hour_angle_deg));
        prop_assert!(s.equation_of_time_min.abs() < 17.0, "equation of time {}", s.equation_of_time_min);
        prop_assert!((0.97..1.02).contains(&s.earth_sun_distance_au));
        prop_assert!(s.declination_deg.abs() < 23.5);
        let i = s.incidence_deg(tilt, face);
        prop_assert!((0.0..=180.0).contains(&i));
        // A flat surface sees the sun at its zenith angle (SPA eq. 47 with ω = 0).
        prop_assert!((s.incidence_deg(0.0, face) - s.zenith_deg).abs() < 1e-9);
        // Refraction only ever lifts the sun, and by less than a degree.
        let refr = s.altitude_deg - s.altitude_unrefracted_deg;
        prop_assert!((-1e-9..1.0).contains(&refr), "refraction {refr}");
    }

    /// Outside the polar circles the sun rises before solar noon and sets after it, on the asked date.
    #[test]
    fn sunrise_before_noon_before_sunset(lat in -65.0..65.0_f64, lon in -180.0..180.0_f64, day in 0_i64..73_000) {
        let date = NaiveDate::from_ymd_opt(1900, 1, 1).unwrap() + Duration::days(day);
        let site = Site::new(lat, lon, 0.0).unwrap();
        let ev = day_events(&site, date, &Zone::utc(), DeltaT::EspenakMeeus).unwrap();
        let Crossing::Crosses { rise, set } = ev.sun else { return Err(TestCaseError::fail("no sunrise at |lat| < 65°")) };
        prop_assert!(rise < ev.transit && ev.transit < set);
        // The transit is on the asked date except where solar time runs ~12 h off the clock (UTC near
        // ±180° longitude), where it is the one nearest midday.
        if lon.abs() < 170.0 {
            prop_assert_eq!(ev.transit.date_naive(), date);
        }
        let midday = date.and_hms_opt(12, 0, 0).unwrap().and_utc();
        prop_assert!((ev.transit - midday).num_minutes().abs() < 12 * 60 + 20);
        let len = ev.day_length();
        // At 65° the solstice day with refraction and the sun's semidiameter runs a little over 22 h
        // (common practice; found by this test at 64.99° N: 22 h 01 min), and the winter day about 3 h.
        prop_assert!(len > Duration::hours(2) && len < Duration::hours(23), "day length {len}");
        // Civil twilight brackets the day.
        if let Crossing::Crosses { rise: dawn, set: dusk } = ev.civil_twilight {
            prop_assert!(dawn < rise && set < dusk);
        }
    }

    /// Every wall time in a zone with daylight saving is resolved, refused as skipped, or refused as
    /// repeated — and an accepted one reads back as itself.
    #[test]
    fn wall_times_resolve_or_say_why(minutes in 0_i64..(60 * 24 * 366 * 3), zone in prop::sample::select(vec!["Europe/London", "America/New_York", "Australia/Sydney", "Asia/Kolkata", "Pacific/Chatham"])) {
        let z: Zone = zone.parse().unwrap();
        let wall = NaiveDate::from_ymd_opt(2024, 1, 1).unwrap().and_hms_opt(0, 0, 0).unwrap() + Duration::minutes(minutes);
        match z.resolve(wall, Fold::Reject) {
            Ok(t) => prop_assert_eq!(z.local(t).naive_local(), wall),
            Err(e) => {
                let text = e.to_string();
                prop_assert!(text.contains("does not exist") || text.contains("occurs twice"), "{}", text);
            }
        }
    }
}

mod shadows {
    use geo::{Area, BooleanOps, Coord, Rect};
    use proptest::prelude::*;
    use sunlot::shadow::{cast_shadows, shadow_offset_per_m, volume_shadow, Shadows};
    use sunlot::site::{Status, Volume};

    fn block(x: f64, y: f64, w: f64, d: f64, base: f64, h: f64) -> Volume {
        Volume::from_vertices("b", Status::Existing, &[(x, y), (x + w, y), (x + w, y + d), (x, y + d)], base, base + h)
            .unwrap()
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(300))]

        /// At a fixed azimuth, a lower sun never casts a smaller shadow (for a volume on the ground).
        #[test]
        fn shadow_grows_as_the_sun_lowers(w in 1.0..30.0_f64, d in 1.0..30.0_f64, h in 1.0..40.0_f64,
                                          az in 0.0..360.0_f64, alt in 5.0..80.0_f64, drop in 0.5..4.0_f64) {
            let v = block(0.0, 0.0, w, d, 0.0, h);
            let high = volume_shadow(&v, shadow_offset_per_m(az, alt).unwrap(), 0.0).unsigned_area();
            let low = volume_shadow(&v, shadow_offset_per_m(az, alt - drop).unwrap(), 0.0).unsigned_area();
            prop_assert!(low >= high - 1e-6 * high, "{low} < {high}");
            prop_assert!(high >= w * d - 1e-6, "a grounded volume shades at least its footprint");
        }

        /// The union covers each volume's own shadow and is no larger than their sum (to 1e-7 of the area:
        /// the boolean operations work on a fixed-precision grid).
        #[test]
        fn union_covers_every_shadow(xs in prop::collection::vec((-40.0..40.0_f64, -40.0..40.0_f64, 2.0..15.0_f64, 0.0..6.0_f64, 1.0..25.0_f64), 1..6),
                                     az in 0.0..360.0_f64, alt in 10.0..80.0_f64) {
            let vols: Vec<Volume> = xs.iter().map(|&(x, y, w, b, h)| block(x, y, w, w * 0.7, b, h)).collect();
            let extent = Rect::new(Coord { x: -2_000.0, y: -2_000.0 }, Coord { x: 2_000.0, y: 2_000.0 });
            let Shadows::Sun { per_feature, union, clipped } = cast_shadows(&vols, &[], az, alt, &sunlot::shadow::Receiver::flat_ground(), extent).unwrap() else {
                return Err(TestCaseError::fail("sun is up"));
            };
            prop_assert!(!clipped);
            let sum: f64 = per_feature.iter().map(|(_, s)| s.unsigned_area()).sum();
            prop_assert!(union.unsigned_area() <= sum * (1.0 + 1e-7) + 1e-6, "union {} > sum {sum}", union.unsigned_area());
            for (_, s) in &per_feature {
                prop_assert!(s.difference(&union).unsigned_area() < 1e-7 * s.unsigned_area().max(1.0));
            }
        }
    }
}

mod invariance {
    use geo::{Coord, Point, Polygon, Rotate, Translate};
    use proptest::prelude::*;
    use sunlot::shadow::{shadow_study, Study};
    use sunlot::site::{Area, AreaKind, SiteModel, Status, Volume};
    use sunlot::time::DeltaT;

    fn site(blocks: &[(f64, f64, f64, f64)], rotation: f64) -> SiteModel {
        let mut m = sunlot::demo::demo();
        m.plan_rotation_deg = rotation;
        m.walls.clear();
        m.volumes = blocks
            .iter()
            .enumerate()
            .map(|(i, &(x, y, w, h))| {
                let xy = [(x, y), (x + w, y), (x + w, y + 0.6 * w), (x, y + 0.6 * w)];
                Volume::from_vertices(
                    &format!("v{i}"),
                    if i % 2 == 0 { Status::Existing } else { Status::Proposed },
                    &xy,
                    0.0,
                    h,
                )
                .unwrap()
            })
            .collect();
        let ring = vec![(-30.0, -30.0), (30.0, -30.0), (30.0, 30.0), (-30.0, 30.0), (-30.0, -30.0)];
        m.areas =
            vec![Area::new("yard", "", AreaKind::Garden, Status::Existing, Polygon::new(ring.into(), vec![])).unwrap()];
        m
    }

    fn figures(m: &SiteModel) -> Vec<f64> {
        let t = chrono::DateTime::parse_from_rfc3339("2026-06-21T10:00:00Z").unwrap().to_utc();
        match shadow_study(m, t, DeltaT::EspenakMeeus).unwrap() {
            Study::Sun { areas, .. } => {
                areas.iter().flat_map(|a| [a.existing_m2, a.proposed_m2, a.combined_m2]).collect()
            }
            Study::NoSun { .. } | Study::SunBehindGround { .. } => vec![],
        }
    }

    fn close(a: &[f64], b: &[f64]) -> bool {
        a.len() == b.len() && a.iter().zip(b).all(|(x, y)| (x - y).abs() <= 1e-6 * x.abs().max(1.0))
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(60))]

        /// Turning the whole plan and its rotation to true north together changes no figure.
        #[test]
        fn rotating_site_and_plan_rotation_together_changes_nothing(
            blocks in prop::collection::vec((-25.0..20.0_f64, -25.0..20.0_f64, 3.0..10.0_f64, 2.0..20.0_f64), 1..4),
            theta in -180.0..180.0_f64) {
            let m = site(&blocks, 10.0);
            let mut turned = m.clone();
            // geo rotates counter-clockwise for positive angles; the plan turns clockwise by theta.
            let c = Point::new(0.0, 0.0);
            for v in &mut turned.volumes { v.footprint = v.footprint.rotate_around_point(-theta, c); }
            for a in &mut turned.areas { a.polygon = a.polygon.rotate_around_point(-theta, c); }
            turned.plan_rotation_deg = m.plan_rotation_deg + theta;
            prop_assert!(close(&figures(&m), &figures(&turned)), "{:?} vs {:?}", figures(&m), figures(&turned));
        }

        /// Moving the whole plan changes no figure.
        #[test]
        fn translating_changes_nothing(
            blocks in prop::collection::vec((-25.0..20.0_f64, -25.0..20.0_f64, 3.0..10.0_f64, 2.0..20.0_f64), 1..4),
            dx in -500.0..500.0_f64, dy in -500.0..500.0_f64) {
            let m = site(&blocks, 0.0);
            let mut moved = m.clone();
            let d = Coord { x: dx, y: dy };
            for v in &mut moved.volumes { v.footprint = v.footprint.translate(d.x, d.y); }
            for a in &mut moved.areas { a.polygon = a.polygon.translate(d.x, d.y); }
            prop_assert!(close(&figures(&m), &figures(&moved)));
        }
    }
}
