//! ΔT = TT − UT, in seconds.
//!
//! # References
//! Espenak, F. & Meeus, J. (2006), *Five Millennium Canon of Solar Eclipses: −1999 to +3000*,
//! NASA/TP-2006-214141, section 2.6 ("Polynomial expressions for ΔT"), as published on NASA's eclipse
//! web site. The same polynomials are in pvlib-python's `spa.calculate_deltat`, against which
//! `tests/delta_t.rs` checks this module. After 2015 the 2005–2050 polynomial runs a few seconds above
//! measured values (≈ 69.4 s measured at 2020.0 by IERS/USNO against 71.6 s here): the resulting error in
//! the sun's position is under 0.0003°. Users who know ΔT set it with [`DeltaT::Seconds`].

use chrono::{DateTime, Utc};
use serde::{Deserialize, Serialize};

/// Where ΔT comes from.
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum DeltaT {
    /// The Espenak–Meeus (2006) polynomials at the instant's decimal year.
    #[default]
    EspenakMeeus,
    /// A value given by the user, in seconds.
    Seconds(f64),
}

impl DeltaT {
    /// ΔT in seconds at an instant.
    pub fn seconds_at(self, instant: DateTime<Utc>) -> f64 {
        match self {
            DeltaT::EspenakMeeus => delta_t_espenak_meeus_s(super::year_fraction(instant)),
            DeltaT::Seconds(s) => s,
        }
    }
}

/// ΔT in seconds for a decimal year, by the Espenak–Meeus (2006) polynomials.
///
/// # Examples
/// ```
/// // 2010.0 → 66.70 s and 2020.0 → 71.60 s (Espenak & Meeus 2006, 2005–2050 polynomial).
/// assert!((sunlot::time::delta_t_espenak_meeus_s(2010.0) - 66.70).abs() < 0.01);
/// assert!((sunlot::time::delta_t_espenak_meeus_s(2020.0) - 71.60).abs() < 0.01);
/// ```
pub fn delta_t_espenak_meeus_s(y: f64) -> f64 {
    let long_term = |y: f64| {
        let u = (y - 1820.0) / 100.0;
        -20.0 + 32.0 * u * u
    };
    if y < -500.0 {
        long_term(y)
    } else if y < 500.0 {
        let u = y / 100.0;
        poly(u, &[10583.6, -1014.41, 33.78311, -5.952053, -0.1798452, 0.022174192, 0.0090316521])
    } else if y < 1600.0 {
        let u = (y - 1000.0) / 100.0;
        poly(u, &[1574.2, -556.01, 71.23472, 0.319781, -0.8503463, -0.005050998, 0.0083572073])
    } else if y < 1700.0 {
        let t = y - 1600.0;
        poly(t, &[120.0, -0.9808, -0.01532, 1.0 / 7129.0])
    } else if y < 1800.0 {
        let t = y - 1700.0;
        poly(t, &[8.83, 0.1603, -0.0059285, 0.00013336, -1.0 / 1_174_000.0])
    } else if y < 1860.0 {
        let t = y - 1800.0;
        poly(t, &[13.72, -0.332447, 0.0068612, 0.0041116, -0.00037436, 0.0000121272, -0.0000001699, 0.000000000875])
    } else if y < 1900.0 {
        let t = y - 1860.0;
        poly(t, &[7.62, 0.5737, -0.251754, 0.01680668, -0.0004473624, 1.0 / 233_174.0])
    } else if y < 1920.0 {
        let t = y - 1900.0;
        poly(t, &[-2.79, 1.494119, -0.0598939, 0.0061966, -0.000197])
    } else if y < 1941.0 {
        let t = y - 1920.0;
        poly(t, &[21.20, 0.84493, -0.076100, 0.0020936])
    } else if y < 1961.0 {
        let t = y - 1950.0;
        poly(t, &[29.07, 0.407, -1.0 / 233.0, 1.0 / 2547.0])
    } else if y < 1986.0 {
        let t = y - 1975.0;
        poly(t, &[45.45, 1.067, -1.0 / 260.0, -1.0 / 718.0])
    } else if y < 2005.0 {
        let t = y - 2000.0;
        poly(t, &[63.86, 0.3345, -0.060374, 0.0017275, 0.000651814, 0.00002373599])
    } else if y < 2050.0 {
        let t = y - 2000.0;
        poly(t, &[62.92, 0.32217, 0.005589])
    } else if y < 2150.0 {
        long_term(y) - 0.5628 * (2150.0 - y)
    } else {
        long_term(y)
    }
}

/// Horner evaluation of `c[0] + c[1]·x + c[2]·x² + …`.
fn poly(x: f64, c: &[f64]) -> f64 {
    c.iter().rev().fold(0.0, |acc, &ci| acc * x + ci)
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_abs_diff_eq;

    #[test]
    fn polynomial_pieces_meet_within_a_second_at_their_boundaries() {
        // Espenak & Meeus fitted the pieces to join; a typo in a coefficient shows up as a jump.
        for b in [1600.0, 1700.0, 1800.0, 1860.0, 1900.0, 1920.0, 1941.0, 1961.0, 1986.0, 2005.0, 2050.0] {
            let before = delta_t_espenak_meeus_s(b - 1e-9);
            let after = delta_t_espenak_meeus_s(b);
            assert!((before - after).abs() < 1.0, "jump of {} s at {b}", after - before);
        }
    }

    #[test]
    fn user_value_wins() {
        let t = chrono::DateTime::<Utc>::from_timestamp(0, 0).unwrap();
        assert_abs_diff_eq!(DeltaT::Seconds(67.0).seconds_at(t), 67.0);
        // 1970 in the 1961–1986 piece: measured ΔT at 1970.0 is 40.2 s (USNO; value from memory).
        assert_abs_diff_eq!(DeltaT::EspenakMeeus.seconds_at(t), 40.2, epsilon = 0.5);
    }
}
