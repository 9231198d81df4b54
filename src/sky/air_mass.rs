//! Optical air mass.

/// Relative optical air mass at zenith angle `zenith_deg` (apparent), dimensionless; `None` for the sun
/// below the horizon (zenith above 90°).
///
/// # References
/// Kasten, F. & Young, A. T. (1989), "Revised optical air mass tables and approximation formula",
/// Applied Optics 28(22), 4735–4738: AM = 1 / (cos z + 0.50572·(96.07995° − z)^−1.6364).
///
/// # Examples
/// ```
/// let am = sunlot::sky::relative_air_mass_kasten_young(60.0).unwrap();
/// assert!((am - 1.9943).abs() < 1e-4);
/// ```
pub fn relative_air_mass_kasten_young(zenith_deg: f64) -> Option<f64> {
    if !zenith_deg.is_finite() || zenith_deg > 90.0 {
        return None;
    }
    let z = zenith_deg.max(0.0);
    Some(1.0 / (z.to_radians().cos() + 0.505_72 * (96.079_95 - z).powf(-1.636_4)))
}

/// Absolute (pressure-corrected) air mass: relative air mass × pressure / 1013.25 hPa.
pub fn absolute_air_mass(relative: f64, pressure_hpa: f64) -> f64 {
    relative * pressure_hpa / 1013.25
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_abs_diff_eq;

    #[test]
    fn kasten_young_published_points() {
        // Values computed from the Kasten & Young (1989) formula, as listed in shared REFERENCES:
        // 0° → 0.9997, 80° → 5.5860, 85° → 10.3058, 90° → 37.92.
        for (z, am, tol) in [(0.0, 0.9997, 1e-4), (80.0, 5.5860, 1e-4), (85.0, 10.3058, 1e-4), (90.0, 37.92, 0.01)] {
            assert_abs_diff_eq!(relative_air_mass_kasten_young(z).unwrap(), am, epsilon = tol);
        }
    }

    #[test]
    fn sun_below_horizon_has_no_air_mass() {
        assert_eq!(relative_air_mass_kasten_young(90.5), None);
        assert_eq!(relative_air_mass_kasten_young(f64::NAN), None);
    }
}
