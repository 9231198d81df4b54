//! Published worked examples and facts of the trade for the sun's position, day events and seasons.

use approx::assert_abs_diff_eq;
use chrono::{Datelike, NaiveDate, TimeZone, Utc};
use sunlot::solar::spa::Geocentric;
use sunlot::solar::{day_events, season_instants, solar_position, Atmosphere, Crossing, Site};
use sunlot::time::{julian_day, DeltaT, Zone};

fn utc() -> Zone {
    Zone::utc()
}

/// Meeus (1998) Example 25.b, the Sun by the full VSOP87 theory, 1992 October 13.0 TD (JDE 2448908.5):
/// apparent longitude 199°54′21.818″, α 198.378178°, δ −7.783871°, R 0.99760775 AU. The SPA uses a
/// truncated VSOP87, so the tolerance is the SPA's stated accuracy, 0.0003°.
#[test]
fn meeus_example_25b_sun_full_theory() {
    let g = Geocentric::at(2_448_908.5, 0.0);
    assert_abs_diff_eq!(g.apparent_longitude_deg, 199.0 + 54.0 / 60.0 + 21.818 / 3600.0, epsilon = 3e-4);
    assert_abs_diff_eq!(g.right_ascension_deg, 198.378178, epsilon = 3e-4);
    assert_abs_diff_eq!(g.declination_deg, -7.783871, epsilon = 3e-4);
    assert_abs_diff_eq!(g.earth_sun_distance_au, 0.99760775, epsilon = 1e-6);
}

/// Meeus (1998) Example 27.a: the June solstice of 1962 is at 1962 June 21, 21h24m42s TD by the full
/// theory (the issue asks for season instants within one minute).
#[test]
fn meeus_example_27a_june_solstice_1962() {
    let jde = season_jde(1962, 90.0);
    let published = julian_day(Utc.with_ymd_and_hms(1962, 6, 21, 21, 24, 42).unwrap());
    let diff_s = (jde - published) * 86_400.0;
    assert!(diff_s.abs() < 60.0, "off by {diff_s} s");
}

fn season_jde(year: i32, target: f64) -> f64 {
    sunlot::solar::season_jde(year, target)
}

#[test]
fn season_instants_come_in_order_with_the_right_longitudes() {
    let s = season_instants(2031, DeltaT::EspenakMeeus).unwrap();
    assert!(
        s.march_equinox < s.june_solstice
            && s.june_solstice < s.september_equinox
            && s.september_equinox < s.december_solstice
    );
    assert_eq!(
        (s.march_equinox.month(), s.june_solstice.month(), s.september_equinox.month(), s.december_solstice.month()),
        (3, 6, 9, 12)
    );
    // At the equinoxes the geocentric declination passes through zero (common practice).
    for t in [s.march_equinox, s.september_equinox] {
        let p = solar_position(&Site::new(0.0, 0.0, 0.0).unwrap(), t, &Atmosphere::default(), DeltaT::EspenakMeeus)
            .unwrap();
        assert!(p.declination_deg.abs() < 0.01, "declination {} at {t}", p.declination_deg);
    }
    assert!(matches!(
        season_instants(6001, DeltaT::EspenakMeeus),
        Err(sunlot::solar::InputError::YearOutOfRange { year: 6001 })
    ));
}

/// Common practice: at an equinox the sun's noon altitude is 90° − |latitude| (REFERENCES, "Sun geometry").
#[test]
fn equinox_noon_altitude_is_ninety_minus_latitude() {
    let s = season_instants(2025, DeltaT::EspenakMeeus).unwrap();
    let date = s.march_equinox.date_naive();
    for lat in [-60.0, -33.9, 0.0, 20.0, 51.5, 64.0] {
        let site = Site::new(lat, 0.0, 0.0).unwrap();
        let ev = day_events(&site, date, &utc(), DeltaT::EspenakMeeus).unwrap();
        let p = solar_position(
            &site,
            ev.transit,
            &Atmosphere { refraction: false, ..Default::default() },
            DeltaT::EspenakMeeus,
        )
        .unwrap();
        // Within half a degree: the equinox instant is not at this meridian's noon (0.4°/day drift).
        assert_abs_diff_eq!(p.altitude_deg, 90.0 - f64::abs(lat), epsilon = 0.5);
        assert_abs_diff_eq!(p.altitude_unrefracted_deg, ev.transit_altitude_deg, epsilon = 0.01);
    }
}

/// Common practice: at 51.5° N the noon sun stands about 61.9° high at the June solstice and 15.1° at
/// the December solstice (REFERENCES, "Sun geometry").
#[test]
fn solstice_noon_altitudes_at_51_5_north() {
    let site = Site::new(51.5, 0.0, 0.0).unwrap();
    let s = season_instants(2024, DeltaT::EspenakMeeus).unwrap();
    for (t, want) in [(s.june_solstice, 61.9), (s.december_solstice, 15.1)] {
        let ev = day_events(&site, t.date_naive(), &utc(), DeltaT::EspenakMeeus).unwrap();
        assert_abs_diff_eq!(ev.transit_altitude_deg, want, epsilon = 0.1);
    }
}

/// Common practice: the equinox sun rises close to due east (a little north of it, by refraction and
/// the upper-limb convention) and sets close to due west.
#[test]
fn equinox_sun_rises_near_due_east() {
    let s = season_instants(2026, DeltaT::EspenakMeeus).unwrap();
    for lat in [-45.0, 0.0, 40.0, 52.62] {
        let site = Site::new(lat, 10.0, 0.0).unwrap();
        let ev = day_events(&site, s.march_equinox.date_naive(), &utc(), DeltaT::EspenakMeeus).unwrap();
        let Crossing::Crosses { rise, set } = ev.sun else { panic!("no sunrise at {lat}") };
        let air = Atmosphere::default();
        let at_rise = solar_position(&site, rise, &air, DeltaT::EspenakMeeus).unwrap();
        let at_set = solar_position(&site, set, &air, DeltaT::EspenakMeeus).unwrap();
        assert!((at_rise.azimuth_deg - 90.0).abs() < 2.0, "rise azimuth {} at {lat}", at_rise.azimuth_deg);
        assert!((at_set.azimuth_deg - 270.0).abs() < 2.0, "set azimuth {} at {lat}", at_set.azimuth_deg);
        if lat > 30.0 {
            assert!(at_rise.azimuth_deg < 90.0, "north of east at {lat}: {}", at_rise.azimuth_deg);
        }
        // Equinox day length: a little over 12 h (common practice: about 12 h 7 min at 40–50°).
        let h = ev.day_length().num_seconds() as f64 / 3600.0;
        assert!((12.0..12.4).contains(&h), "day length {h} h at {lat}");
    }
}

/// Common practice: inside the polar circles there is no sunrise at the winter solstice and no sunset
/// at the summer solstice; the boundary is near 90° − 23.44° = 66.56°.
#[test]
fn polar_night_and_polar_day_are_values() {
    let s = season_instants(2024, DeltaT::EspenakMeeus).unwrap();
    let dec = s.december_solstice.date_naive();
    let jun = s.june_solstice.date_naive();
    let north = Site::new(70.0, 25.0, 0.0).unwrap();
    let south = Site::new(-75.0, 0.0, 0.0).unwrap();
    let ev = |site: &Site, d: NaiveDate| day_events(site, d, &utc(), DeltaT::EspenakMeeus).unwrap();
    assert_eq!(ev(&north, dec).sun, Crossing::AlwaysBelow);
    assert_eq!(ev(&north, dec).day_length(), chrono::Duration::zero());
    assert_eq!(ev(&north, jun).sun, Crossing::AlwaysAbove);
    assert_eq!(ev(&north, jun).day_length(), chrono::Duration::hours(24));
    assert_eq!(ev(&south, jun).sun, Crossing::AlwaysBelow);
    assert_eq!(ev(&south, dec).sun, Crossing::AlwaysAbove);
    // Civil twilight still comes at 70° N on the winter solstice (the sun is only ~3.4° below).
    assert!(matches!(ev(&north, dec).civil_twilight, Crossing::Crosses { .. }));
    // The poles themselves.
    assert_eq!(ev(&Site::new(90.0, 0.0, 0.0).unwrap(), jun).sun, Crossing::AlwaysAbove);
    assert_eq!(ev(&Site::new(-90.0, 0.0, 0.0).unwrap(), jun).sun, Crossing::AlwaysBelow);
    // Just south of the circle the sun still rises on the December solstice.
    assert!(matches!(ev(&Site::new(65.5, 25.0, 0.0).unwrap(), dec).sun, Crossing::Crosses { .. }));
}

#[test]
fn events_fall_on_the_local_date_asked_for_in_far_zones() {
    // Zones far from their meridian: UTC+14 at 157° W, UTC−11 at 170° E, UTC+13 at 175° W.
    for (lat, lon, zone) in [
        (1.87, -157.4, "Pacific/Kiritimati"),
        (-14.3, -170.7, "Pacific/Pago_Pago"),
        (-21.1, -175.2, "Pacific/Tongatapu"),
        (52.62, -1.87, "Europe/London"),
    ] {
        let zone: Zone = zone.parse().unwrap();
        let site = Site::new(lat, lon, 0.0).unwrap();
        for day in [1, 80, 172, 266, 355] {
            let date = NaiveDate::from_yo_opt(2025, day).unwrap();
            let ev = day_events(&site, date, &zone, DeltaT::EspenakMeeus).unwrap();
            assert_eq!(zone.local_date(ev.transit), date, "{zone} day {day}");
            let Crossing::Crosses { rise, set } = ev.sun else { panic!() };
            assert!(rise < ev.transit && ev.transit < set);
            // Sunrise and sunset are at the SPA's h0′ = −0.8333° of geometric altitude (A.2); the
            // position algorithm agrees within 0.02° (topocentric parallax and one-step correction).
            let air = Atmosphere { refraction: false, ..Default::default() };
            for t in [rise, set] {
                let p = solar_position(&site, t, &air, DeltaT::EspenakMeeus).unwrap();
                assert_abs_diff_eq!(p.altitude_unrefracted_deg, -0.8333, epsilon = 0.02);
            }
        }
    }
}
