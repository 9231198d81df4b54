//! The solar engine against general-purpose reference libraries: pvlib-python and astropy.
//!
//! Fixtures: `tests/fixtures/*.csv`, written by `tests/fixtures/generate_pvlib.py` (pvlib 0.16.1) and
//! `tests/fixtures/generate_astropy.py` (astropy 8.0.2); versions and date are in each file's first line.

mod common;

use approx::assert_abs_diff_eq;
use common::{fixture_rows, num};
use sunlot::sky::{bird_clear_sky, BirdAtmosphere};
use sunlot::solar::{solar_position, Atmosphere, Site};
use sunlot::time::{delta_t_espenak_meeus_s, parse_instant, DeltaT};

/// Angular difference folded into −180…180°.
fn angle_diff(a: f64, b: f64) -> f64 {
    (a - b + 540.0).rem_euclid(360.0) - 180.0
}

#[test]
fn positions_agree_with_pvlib_spa_within_half_a_ten_thousandth_degree() {
    let rows = fixture_rows("spa_positions.csv");
    assert!(rows.len() >= 2000, "fixture has {} rows", rows.len());
    let (mut worst_z, mut worst_a, mut worst_e) = (0.0_f64, 0.0_f64, 0.0_f64);
    for (i, r) in rows.iter().enumerate() {
        let site = Site::new(num(r, "lat"), num(r, "lon"), num(r, "elevation_m")).unwrap();
        let air = Atmosphere::new(num(r, "pressure_hpa"), num(r, "temperature_c"), true).unwrap();
        let (t, _) = parse_instant(&r["time"]).unwrap();
        let p = solar_position(&site, t, &air, DeltaT::Seconds(num(r, "delta_t_s"))).unwrap();
        let dz = (p.zenith_deg - num(r, "zenith_deg")).abs();
        let du = (90.0 - p.altitude_unrefracted_deg - num(r, "zenith_unrefracted_deg")).abs();
        // Azimuth is undefined with the sun at the zenith: compare the horizontal direction there.
        let da = angle_diff(p.azimuth_deg, num(r, "azimuth_deg")).abs() * p.zenith_deg.to_radians().sin();
        let de = (p.equation_of_time_min - num(r, "equation_of_time_min")).abs();
        assert!(dz < 0.0005 && du < 0.0005 && da < 0.0005, "row {i}: dz {dz} du {du} da {da} {r:?}");
        worst_z = worst_z.max(dz.max(du));
        worst_a = worst_a.max(da);
        worst_e = worst_e.max(de);
    }
    assert!(worst_e < 1e-4, "equation of time differs by {worst_e} min");
    println!("worst zenith {worst_z:e}°, azimuth {worst_a:e}°, equation of time {worst_e:e} min");
}

#[test]
fn espenak_meeus_delta_t_matches_pvlib() {
    for r in fixture_rows("delta_t.csv") {
        let y = num(&r, "year") + (num(&r, "month") - 0.5) / 12.0;
        assert_abs_diff_eq!(
            delta_t_espenak_meeus_s(y),
            num(&r, "delta_t_s"),
            epsilon = 1e-6 * num(&r, "delta_t_s").abs().max(1.0)
        );
    }
}

#[test]
fn bird_clear_sky_matches_pvlib() {
    for (i, r) in fixture_rows("bird.csv").iter().enumerate() {
        let atm = BirdAtmosphere {
            aod_380: num(r, "aod_380"),
            aod_500: num(r, "aod_500"),
            precipitable_water_cm: num(r, "precipitable_water_cm"),
            ozone_cm: num(r, "ozone_cm"),
            forward_scattering: num(r, "forward_scattering"),
            albedo: num(r, "albedo"),
            pressure_hpa: num(r, "pressure_hpa"),
        };
        let s = bird_clear_sky(num(r, "zenith_deg"), num(r, "extraterrestrial_w_m2"), &atm);
        for (ours, key) in [(s.dni_w_m2, "dni_w_m2"), (s.dhi_w_m2, "dhi_w_m2"), (s.ghi_w_m2, "ghi_w_m2")] {
            let want = num(r, key);
            assert!((ours - want).abs() < 1e-6 * want.max(1.0), "row {i} {key}: {ours} vs {want}");
        }
    }
}

/// Season instants against astropy (fixture `seasons_astropy.csv`, from `generate_astropy.py`): within
/// one minute is the bar; the SPA's truncated VSOP87 does far better.
#[test]
fn season_instants_agree_with_astropy_within_a_minute() {
    let rows = fixture_rows("seasons_astropy.csv");
    assert_eq!(rows.len(), 201 * 4);
    let mut worst_s = 0.0_f64;
    for r in &rows {
        let jde = sunlot::solar::season_jde(num(r, "year") as i32, num(r, "longitude_deg"));
        let diff_s = (jde - num(r, "jde_tt")).abs() * 86_400.0;
        assert!(diff_s < 60.0, "{r:?}: {diff_s} s");
        worst_s = worst_s.max(diff_s);
    }
    println!("worst season instant difference {worst_s:.1} s");
}
