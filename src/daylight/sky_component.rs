//! The sky component of a plane under the CIE standard overcast sky: the illuminance the plane receives
//! directly from the visible sky, as a percentage of the illuminance an unobstructed horizontal plane
//! receives from the whole sky at the same moment. For a vertical window it is the vertical sky
//! component (VSC) used in daylight planning guidance.
//!
//! # Method
//! The overcast sky's luminance at altitude θ is L(θ) = Lz (1 + 2 sin θ)/3 (Moon & Spencer 1942; the
//! CIE standard overcast sky, CIE S 011/E:2003 and ISO 15469:2004, sky type 16). The unobstructed
//! horizontal illuminance is ∫ L sin θ dω = (7π/9) Lz. The sky is cut into azimuth bins of the
//! step (plan frame); in each bin the obstruction skyline ([`crate::shadow::skyline`]: the highest
//! obstruction, overhangs counted solid up to their top, sloping ground uphill) is taken at the bin's
//! centre, and the visible sky above it is integrated exactly in altitude with the closed forms
//!
//! - vertical plane facing azimuth β, φ = azimuth − β in −90°…90°: ∫ (1 + 2 sin θ) cos²θ dθ cos φ dφ,
//!   with G(θ) = θ/2 + sin 2θ/4 − (2/3) cos³θ, integrated exactly in φ over the bin;
//! - horizontal plane: ∫ (1 + 2 sin θ) cos θ sin θ dθ dφ, with H(θ) = sin²θ/2 + (2/3) sin³θ.
//!
//! The only approximation is the skyline sampled once per bin: at most half a bin of error at each
//! edge of an obstruction in azimuth (the bins grazing the window's own wall may see the wall). The unobstructed vertical value is
//! 100 · (2/3)(π/4 + 2/3) / (7π/9) = 39.62 % (the "almost 40 %" of daylight guidance).

use std::f64::consts::{FRAC_PI_2, PI};

use crate::exposure::{ExposureError, Massing};
use crate::shadow::{analysis_extent, skyline, Receiver, ViewPoint};
use crate::site::SiteModel;

/// Azimuth bins of this width unless the caller asks otherwise, degrees: the skyline sampled at a
/// quarter degree puts an edge of an obstruction within an eighth of a degree.
pub const DEFAULT_AZIMUTH_STEP_DEG: f64 = 0.25;

/// The sky component of an unobstructed vertical plane, percent: 100 · (2/3)(π/4 + 2/3) / (7π/9).
pub const UNOBSTRUCTED_VERTICAL_PCT: f64 = 100.0 * (2.0 / 3.0) * (PI / 4.0 + 2.0 / 3.0) / (7.0 * PI / 9.0);

/// Which plane receives the light.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum SkyPlane {
    /// A vertical plane (a window in a wall) whose outward normal faces this true azimuth, degrees.
    Vertical { facing_deg: f64 },
    /// A horizontal plane facing up (a rooflight, a patch of ground).
    Horizontal,
}

/// The CIE standard overcast sky's luminance at `altitude_deg` relative to its zenith luminance:
/// (1 + 2 sin θ)/3 (Moon & Spencer 1942; CIE S 011/E:2003, sky type 16).
pub fn overcast_relative_luminance(altitude_deg: f64) -> f64 {
    (1.0 + 2.0 * altitude_deg.to_radians().sin()) / 3.0
}

/// ∫ (1 + 2 sin t) cos² t dt from 0 to θ (plus a constant): θ/2 + sin 2θ/4 − (2/3) cos³θ.
fn vertical_band(theta: f64) -> f64 {
    theta / 2.0 + (2.0 * theta).sin() / 4.0 - 2.0 / 3.0 * theta.cos().powi(3)
}

/// ∫ (1 + 2 sin t) cos t sin t dt from 0 to θ: sin²θ/2 + (2/3) sin³θ.
fn horizontal_band(theta: f64) -> f64 {
    let s = theta.sin();
    s * s / 2.0 + 2.0 / 3.0 * s.powi(3)
}

/// The sky component at `point` on `plane`, percent, seen past `massing` (see the module's method).
/// The point is where the light is measured: for a window, on the outside face of the wall (its own
/// building is behind the plane and plays no part).
///
/// # Errors
/// [`ExposureError`] for a step outside 0.01–5°, a facing that is not a finite number, a non-finite
/// point, or more ray tests than [`crate::limits::MAX_RAY_TESTS`].
pub fn sky_component_pct(
    model: &SiteModel,
    point: ViewPoint,
    plane: SkyPlane,
    massing: Massing,
    azimuth_step_deg: f64,
) -> Result<f64, ExposureError> {
    // Both integrals carry the luminance's 1/3; the unobstructed horizontal one is 2π · 7/6 of them.
    let bands = Bands { vertical: vertical_band, horizontal: horizontal_band, whole_horizontal: 2.0 * PI * 7.0 / 6.0 };
    Ok(100.0 * seen_sky(model, point, plane, massing, azimuth_step_deg, &bands)?)
}

/// The view factor of the visible sky from `point` on `plane` past `massing` for a sky of uniform
/// radiance (the isotropic diffuse model; Liu & Jordan 1963): the diffuse irradiance on the plane as a
/// share (0–1) of the diffuse horizontal irradiance of the whole sky. An unobstructed vertical plane
/// gets (1 + cos 90°)/2 = ½, a horizontal one 1. Integrated as [`sky_component_pct`], with
/// ∫ cos²θ dθ = θ/2 + sin 2θ/4 and ∫ cos θ sin θ dθ = sin²θ/2.
///
/// # Errors
/// As [`sky_component_pct`].
pub fn isotropic_sky_view(
    model: &SiteModel,
    point: ViewPoint,
    plane: SkyPlane,
    massing: Massing,
    azimuth_step_deg: f64,
) -> Result<f64, ExposureError> {
    let bands = Bands {
        vertical: |t| t / 2.0 + (2.0 * t).sin() / 4.0,
        horizontal: |t| t.sin().powi(2) / 2.0,
        whole_horizontal: PI,
    };
    seen_sky(model, point, plane, massing, azimuth_step_deg, &bands)
}

/// A sky's altitude integrals: on a vertical plane, on the horizontal, and the whole sky's on the
/// horizontal (over every azimuth).
struct Bands {
    vertical: fn(f64) -> f64,
    horizontal: fn(f64) -> f64,
    whole_horizontal: f64,
}

/// The visible sky's light on `plane` as a share of the whole sky's on the horizontal.
fn seen_sky(
    model: &SiteModel,
    point: ViewPoint,
    plane: SkyPlane,
    massing: Massing,
    azimuth_step_deg: f64,
    bands: &Bands,
) -> Result<f64, ExposureError> {
    if !(azimuth_step_deg.is_finite() && (0.01..=5.0).contains(&azimuth_step_deg)) {
        return Err(ExposureError::Period(format!(
            "azimuth_step_deg must be 0.01 to 5 degrees, got {azimuth_step_deg}"
        )));
    }
    if let SkyPlane::Vertical { facing_deg } = plane {
        if !facing_deg.is_finite() {
            return Err(ExposureError::Period(format!("facing_deg must be a finite azimuth, got {facing_deg}")));
        }
    }
    let volumes: Vec<_> = model.volumes.iter().filter(|v| massing.includes(v.status)).cloned().collect();
    let walls: Vec<_> = model.walls.iter().filter(|w| massing.includes(w.status)).cloned().collect();
    let bins = (360.0 / azimuth_step_deg).round();
    crate::limits::ray_tests("azimuth_step_deg", bins, volumes.len() + walls.len(), "use a larger azimuth step")?;
    let reach = analysis_extent(model).map_or(1_000.0, |r| r.width().hypot(r.height()));
    let ground = Receiver::on(&model.ground, model.plan_rotation_deg, 0.0);
    let sky = skyline(point, &volumes, &walls, &ground, azimuth_step_deg, reach)
        .map_err(|e| ExposureError::Period(e.to_string()))?;
    let half = azimuth_step_deg.to_radians() / 2.0;
    let total = match plane {
        SkyPlane::Vertical { facing_deg } => {
            let facing = model.plan_azimuth_deg(facing_deg).to_radians();
            let sum: f64 = sky
                .iter()
                .filter_map(|&(az, alt)| {
                    // The bin's azimuths relative to the normal, clipped to the half-space in front.
                    let mid = (az.to_radians() - facing + PI).rem_euclid(2.0 * PI) - PI;
                    let (lo, hi) = ((mid - half).max(-FRAC_PI_2), (mid + half).min(FRAC_PI_2));
                    (hi > lo).then(|| {
                        let g = bands.vertical;
                        let seen = g(FRAC_PI_2) - g(alt.to_radians().clamp(0.0, FRAC_PI_2));
                        (hi.sin() - lo.sin()) * seen
                    })
                })
                .sum();
            sum
        }
        SkyPlane::Horizontal => sky
            .iter()
            .map(|&(_, alt)| {
                let h = bands.horizontal;
                2.0 * half * (h(FRAC_PI_2) - h(alt.to_radians().clamp(0.0, FRAC_PI_2)))
            })
            .sum(),
    };
    Ok(total / bands.whole_horizontal)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::site::test_sites::{block, flat_site};
    use crate::site::Volume;

    fn site(volumes: Vec<Volume>) -> SiteModel {
        flat_site(volumes, 51.5)
    }

    /// ∫ f(φ) dφ over −90°…90° by Simpson's rule on 20,000 intervals.
    fn simpson_over_front(f: impl Fn(f64) -> f64) -> f64 {
        let n = 20_000;
        let h = PI / n as f64;
        let mut s = f(-FRAC_PI_2) + f(FRAC_PI_2);
        for k in 1..n {
            s += f(-FRAC_PI_2 + k as f64 * h) * if k % 2 == 1 { 4.0 } else { 2.0 };
        }
        s * h / 3.0
    }

    /// The closed form of an unobstructed vertical plane under the CIE overcast sky, derived here from
    /// L(θ) = Lz (1 + 2 sin θ)/3: E_v = (2/3) Lz (π/4 + 2/3), E_h = (7π/9) Lz, ratio 39.62 %. Daylight
    /// guidance quotes "almost 40 %" for an unobstructed window (BRE BR 209; from memory).
    #[test]
    fn an_unobstructed_window_gets_39_62_percent_and_a_horizontal_plane_100() {
        assert!((UNOBSTRUCTED_VERTICAL_PCT - 39.6177).abs() < 1e-4, "{UNOBSTRUCTED_VERTICAL_PCT}");
        // The window on the south face of its own house, nothing else around: the house is behind it.
        let m = site(vec![block("house", -5.0, 0.0, 5.0, 8.0, 7.0)]);
        let p = ViewPoint { x_m: 0.0, y_m: 0.0, z_m: 1.5 };
        let v =
            sky_component_pct(&m, p, SkyPlane::Vertical { facing_deg: 180.0 }, Massing::WithProposed, 0.25).unwrap();
        // The two bins grazing the wall itself may see the house (a ray along the face, rounded into
        // it): 2.4e-6 of the sky's weight each, 5e-5 %.
        assert!((v - UNOBSTRUCTED_VERTICAL_PCT).abs() < 1e-4, "{v}");
        let roof = ViewPoint { x_m: 0.0, y_m: 4.0, z_m: 7.5 };
        let h = sky_component_pct(&m, roof, SkyPlane::Horizontal, Massing::WithProposed, 1.0).unwrap();
        assert!((h - 100.0).abs() < 1e-9, "{h}");
        assert_eq!(overcast_relative_luminance(90.0), 1.0);
        assert!((overcast_relative_luminance(0.0) - 1.0 / 3.0).abs() < 1e-15);
    }

    /// A long obstruction parallel to the window wall, its top at angle α above the window seen
    /// square-on: at azimuth φ off the normal its top stands at atan(tan α cos φ), and the sky component
    /// is (3/7π) ∫ cos φ [G(π/2) − G(atan(tan α cos φ))] dφ over −90°…90°, integrated here by Simpson's
    /// rule on 20,000 intervals (CIE overcast sky as above). Daylight guidance relates a 25° obstruction
    /// to a VSC of about 27 % (BRE BR 209; from memory): the closed form gives 27.31 %.
    #[test]
    fn a_long_obstruction_matches_the_closed_form() {
        let closed = |alpha: f64| {
            let f = |phi: f64| phi.cos() * (vertical_band(FRAC_PI_2) - vertical_band((alpha.tan() * phi.cos()).atan()));
            100.0 * 3.0 / (7.0 * PI) * simpson_over_front(f)
        };
        assert!((closed(25f64.to_radians()) - 27.31).abs() < 0.01);
        for (distance, height) in [(20.0, 1.5 + 20.0 * 25f64.to_radians().tan()), (12.0, 9.0), (30.0, 40.0)] {
            // The window faces south at y = 0; the obstruction runs 40 km east-west, `distance` m south.
            let m = site(vec![
                block("house", -5.0, 0.0, 5.0, 8.0, 7.0),
                block("wall", -20_000.0, -distance - 10.0, 20_000.0, -distance, height),
            ]);
            let p = ViewPoint { x_m: 0.0, y_m: 0.0, z_m: 1.5 };
            let alpha = ((height - 1.5) / distance).atan();
            let v = sky_component_pct(&m, p, SkyPlane::Vertical { facing_deg: 180.0 }, Massing::WithProposed, 0.25)
                .unwrap();
            // The skyline sampled per quarter degree, integrated exactly in altitude: within 0.01 %.
            assert!((v - closed(alpha)).abs() < 0.01, "α {:.2}°: {v} against {}", alpha.to_degrees(), closed(alpha));
        }
    }

    /// The isotropic sky: ½ on an unobstructed vertical plane and 1 on a horizontal one (Liu & Jordan's
    /// (1 + cos β)/2 at tilts 90° and 0°; pvlib's `isotropic` gives 0.5 × DHI at 90°), and behind a long
    /// wall of angular height α seen square-on from the ground beside it, ∫ cos φ [π/4 −
    /// B(atan(tan α cos φ))] dφ / π with B(θ) = θ/2 + sin 2θ/4 (Simpson's rule, as above).
    #[test]
    fn the_isotropic_view_factor_is_a_half_on_a_wall_and_follows_the_closed_form() {
        let m = site(vec![block("house", -5.0, 0.0, 5.0, 8.0, 7.0)]);
        let p = ViewPoint { x_m: 0.0, y_m: 0.0, z_m: 1.5 };
        let v =
            isotropic_sky_view(&m, p, SkyPlane::Vertical { facing_deg: 180.0 }, Massing::WithProposed, 0.25).unwrap();
        assert!((v - 0.5).abs() < 1e-6, "{v}");
        let roof = ViewPoint { x_m: 0.0, y_m: 4.0, z_m: 7.5 };
        let h = isotropic_sky_view(&m, roof, SkyPlane::Horizontal, Massing::WithProposed, 1.0).unwrap();
        assert!((h - 1.0).abs() < 1e-9, "{h}");
        let b = |t: f64| t / 2.0 + (2.0 * t).sin() / 4.0;
        let closed = |alpha: f64| {
            let f = |phi: f64| phi.cos() * (b(FRAC_PI_2) - b((alpha.tan() * phi.cos()).atan()));
            simpson_over_front(f) / PI
        };
        let (distance, height) = (12.0, 9.0);
        let m = site(vec![
            block("house", -5.0, 0.0, 5.0, 8.0, 7.0),
            block("wall", -20_000.0, -distance - 10.0, 20_000.0, -distance, height),
        ]);
        let alpha = ((height - 1.5) / distance).atan();
        let v =
            isotropic_sky_view(&m, p, SkyPlane::Vertical { facing_deg: 180.0 }, Massing::WithProposed, 0.25).unwrap();
        assert!((v - closed(alpha)).abs() < 1e-4, "{v} against {}", closed(alpha));
    }

    #[test]
    fn the_plan_rotation_and_bad_input() {
        // A plan turned 90°: the wall's plan south face looks to true west (plan up is true east).
        let mut m = site(vec![block("house", -5.0, 0.0, 5.0, 8.0, 7.0), block("o", -50.0, -20.0, 50.0, -10.0, 12.0)]);
        let p = ViewPoint { x_m: 0.0, y_m: 0.0, z_m: 1.5 };
        let square =
            sky_component_pct(&m, p, SkyPlane::Vertical { facing_deg: 180.0 }, Massing::WithProposed, 0.5).unwrap();
        m.plan_rotation_deg = 90.0;
        let turned =
            sky_component_pct(&m, p, SkyPlane::Vertical { facing_deg: 90.0 }, Massing::WithProposed, 0.5).unwrap();
        assert!((square - turned).abs() < 1e-9, "{square} against {turned}");
        assert!(square < UNOBSTRUCTED_VERTICAL_PCT - 5.0);
        for step in [0.0, 6.0, f64::NAN] {
            let e = sky_component_pct(&m, p, SkyPlane::Horizontal, Massing::WithProposed, step).unwrap_err();
            assert!(e.to_string().contains("azimuth_step_deg"), "{e}");
        }
        let e = sky_component_pct(&m, p, SkyPlane::Vertical { facing_deg: f64::NAN }, Massing::WithProposed, 1.0)
            .unwrap_err();
        assert!(e.to_string().contains("facing_deg"), "{e}");
    }
}
