//! The NREL Solar Position Algorithm, step by step.
//!
//! Every step follows Reda, I. & Andreas, A. (2004, revised January 2008), *Solar position algorithm for
//! solar radiation applications*, NREL/TP-560-34302 (Solar Energy 76(5), 577–589), section 3; equation
//! numbers in the comments are the paper's. Stated accuracy ±0.0003° in zenith and azimuth for the
//! years −2000 to 6000. The work is split in two: [`Geocentric`] holds everything that depends only on
//! the instant (heliocentric terms, nutation, obliquity, the sun's right ascension and declination), and
//! [`Topocentric::observe`] adds the observer. Many sites at one instant reuse one [`Geocentric`].
//!
//! Angles are in degrees unless a name says otherwise; longitudes are positive east.

use super::terms;

/// Degrees to radians.
#[inline]
fn rad(deg: f64) -> f64 {
    deg.to_radians()
}

/// An angle reduced to 0 ≤ a < 360°.
#[inline]
pub(crate) fn limit_360(deg: f64) -> f64 {
    let a = deg.rem_euclid(360.0);
    if a >= 360.0 {
        0.0
    } else {
        a
    }
}

/// Σ A·cos(B + C·τ) over one table (eq. 9).
#[inline]
fn periodic_sum(rows: &[[f64; 3]], jme: f64) -> f64 {
    rows.iter().map(|r| r[0] * (r[1] + r[2] * jme).cos()).sum()
}

/// The polynomial in τ of the series sums (eq. 10–11), divided by 10⁸.
fn earth_value(series: &[&[[f64; 3]]], jme: f64) -> f64 {
    let mut acc = 0.0;
    for rows in series.iter().rev() {
        acc = acc * jme + periodic_sum(rows, jme);
    }
    acc / 1e8
}

/// The sun as seen from the Earth's centre at one instant: the time-only part of the SPA.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Geocentric {
    /// Julian day (UT), in days.
    pub jd: f64,
    /// Julian ephemeris day (TT), in days (eq. 5).
    pub jde: f64,
    /// Earth heliocentric longitude L, degrees (eq. 9–12).
    pub heliocentric_longitude_deg: f64,
    /// Earth heliocentric latitude B, degrees.
    pub heliocentric_latitude_deg: f64,
    /// Earth–Sun distance R, astronomical units.
    pub earth_sun_distance_au: f64,
    /// Nutation in longitude Δψ, degrees (eq. 22).
    pub nutation_longitude_deg: f64,
    /// Nutation in obliquity Δε, degrees (eq. 23).
    pub nutation_obliquity_deg: f64,
    /// True obliquity of the ecliptic ε, degrees (eq. 25).
    pub true_obliquity_deg: f64,
    /// Apparent sun longitude λ, degrees (eq. 27).
    pub apparent_longitude_deg: f64,
    /// Apparent sidereal time at Greenwich ν, degrees (eq. 29).
    pub sidereal_time_deg: f64,
    /// Geocentric right ascension α, degrees 0–360 (eq. 30).
    pub right_ascension_deg: f64,
    /// Geocentric declination δ, degrees (eq. 31).
    pub declination_deg: f64,
    /// Equation of time E, minutes, within ±20 (eq. A.1).
    pub equation_of_time_min: f64,
}

/// The costly, slowly varying part of the SPA: the Earth's heliocentric position (eq. 9–12, 195 periodic
/// terms) and the nutation (eq. 15–23, 63 terms). Functions of the Julian ephemeris day alone.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SlowTerms {
    /// Earth heliocentric longitude L, degrees 0–360.
    pub l_deg: f64,
    /// Earth heliocentric latitude B, degrees.
    pub b_deg: f64,
    /// Earth–Sun distance R, AU.
    pub r_au: f64,
    /// Nutation in longitude Δψ, degrees.
    pub dpsi_deg: f64,
    /// Nutation in obliquity Δε, degrees.
    pub deps_deg: f64,
}

impl SlowTerms {
    /// The terms at Julian ephemeris day `jde`.
    pub fn at_jde(jde: f64) -> Self {
        let jce = (jde - 2_451_545.0) / 36_525.0; // eq. 7
        let jme = jce / 10.0; // eq. 8
        let (dpsi_deg, deps_deg) = nutation(jce);
        SlowTerms {
            l_deg: limit_360(
                earth_value(&[&terms::L0, &terms::L1, &terms::L2, &terms::L3, &terms::L4, &terms::L5], jme)
                    .to_degrees(),
            ),
            b_deg: earth_value(&[&terms::B0, &terms::B1], jme).to_degrees(),
            r_au: earth_value(&[&terms::R0, &terms::R1, &terms::R2, &terms::R3, &terms::R4], jme),
            dpsi_deg,
            deps_deg,
        }
    }
}

impl Geocentric {
    /// The time-only part of the SPA at Julian day `jd` (UT), with ΔT in seconds.
    pub fn at(jd: f64, delta_t_s: f64) -> Self {
        let jde = jd + delta_t_s / 86_400.0; // eq. 5
        Self::from_slow_terms(jd, jde, &SlowTerms::at_jde(jde))
    }

    /// The rest of the time-only part, from [`SlowTerms`] computed (or interpolated) for `jde`.
    pub fn from_slow_terms(jd: f64, jde: f64, slow: &SlowTerms) -> Self {
        let jc = (jd - 2_451_545.0) / 36_525.0; // eq. 6
        let jce = (jde - 2_451_545.0) / 36_525.0; // eq. 7
        let jme = jce / 10.0; // eq. 8
        let SlowTerms { l_deg, b_deg, r_au, dpsi_deg: dpsi, deps_deg: deps } = *slow;

        let theta = limit_360(l_deg + 180.0); // eq. 13
        let beta = -b_deg; // eq. 14

        let u = jme / 10.0;
        // eq. 24, arcseconds
        let eps0 = 84_381.448
            + u * (-4_680.93
                + u * (-1.55
                    + u * (1_999.25
                        + u * (-51.38
                            + u * (-249.67 + u * (-39.05 + u * (7.12 + u * (27.87 + u * (5.79 + u * 2.45)))))))));
        let eps = eps0 / 3600.0 + deps; // eq. 25
        let aberration = -20.4898 / (3600.0 * r_au); // eq. 26
        let lambda = theta + dpsi + aberration; // eq. 27

        let nu0 = limit_360(
            280.460_618_37 + 360.985_647_366_29 * (jd - 2_451_545.0) + 0.000_387_933 * jc * jc
                - jc * jc * jc / 38_710_000.0,
        ); // eq. 28
        let nu = nu0 + dpsi * rad(eps).cos(); // eq. 29

        let (sl, cl) = rad(lambda).sin_cos();
        let (se, ce) = rad(eps).sin_cos();
        let alpha = limit_360((sl * ce - rad(beta).tan() * se).atan2(cl).to_degrees()); // eq. 30
        let delta = (rad(beta).sin() * ce + rad(beta).cos() * se * sl).asin().to_degrees(); // eq. 31

        // Equation of time (eq. A.1–A.2)
        let m = limit_360(
            280.466_456_7
                + jme
                    * (360_007.698_277_9
                        + jme * (0.030_320_28 + jme * (1.0 / 49_931.0 + jme * (-1.0 / 15_300.0 - jme / 2_000_000.0)))),
        );
        let mut e_deg = (m - 0.005_718_3 - alpha + dpsi * ce).rem_euclid(360.0);
        if e_deg > 180.0 {
            e_deg -= 360.0;
        }

        Geocentric {
            jd,
            jde,
            heliocentric_longitude_deg: l_deg,
            heliocentric_latitude_deg: b_deg,
            earth_sun_distance_au: r_au,
            nutation_longitude_deg: dpsi,
            nutation_obliquity_deg: deps,
            true_obliquity_deg: eps,
            apparent_longitude_deg: limit_360(lambda),
            sidereal_time_deg: limit_360(nu),
            right_ascension_deg: alpha,
            declination_deg: delta,
            equation_of_time_min: 4.0 * e_deg,
        }
    }
}

/// Nutation in longitude and obliquity, degrees (eq. 15–23).
fn nutation(jce: f64) -> (f64, f64) {
    let t = jce;
    let x = [
        297.850_36 + t * (445_267.111_480 + t * (-0.001_914_2 + t / 189_474.0)),
        357.527_72 + t * (35_999.050_340 + t * (-0.000_160_3 - t / 300_000.0)),
        134.962_98 + t * (477_198.867_398 + t * (0.008_697_2 + t / 56_250.0)),
        93.271_91 + t * (483_202.017_538 + t * (-0.003_682_5 + t / 327_270.0)),
        125.044_52 + t * (-1_934.136_261 + t * (0.002_070_8 + t / 450_000.0)),
    ];
    let mut dpsi = 0.0;
    let mut deps = 0.0;
    for (y, abcd) in terms::NUTATION_Y.iter().zip(terms::NUTATION_ABCD.iter()) {
        let arg = rad(y[0] * x[0] + y[1] * x[1] + y[2] * x[2] + y[3] * x[3] + y[4] * x[4]);
        let (s, c) = arg.sin_cos();
        dpsi += (abcd[0] + abcd[1] * t) * s;
        deps += (abcd[2] + abcd[3] * t) * c;
    }
    (dpsi / 36_000_000.0, deps / 36_000_000.0)
}

/// The sun as seen by an observer on the Earth's surface.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Topocentric {
    /// Observer local hour angle H, degrees 0–360 (eq. 32).
    pub local_hour_angle_deg: f64,
    /// Parallax in right ascension Δα, degrees (eq. 37).
    pub parallax_right_ascension_deg: f64,
    /// Topocentric right ascension α′, degrees (eq. 38).
    pub right_ascension_deg: f64,
    /// Topocentric declination δ′, degrees (eq. 39).
    pub declination_deg: f64,
    /// Topocentric local hour angle H′, degrees (eq. 40).
    pub hour_angle_deg: f64,
    /// Elevation angle without refraction e₀, degrees (eq. 41).
    pub altitude_unrefracted_deg: f64,
    /// Refraction correction Δe, degrees (eq. 42); zero when refraction is off or the sun is far down.
    pub refraction_deg: f64,
    /// Topocentric zenith angle θ, degrees (eq. 44).
    pub zenith_deg: f64,
    /// Topocentric azimuth Φ, clockwise from true north, degrees 0–360 (eq. 46).
    pub azimuth_deg: f64,
}

/// Refraction at the apparent horizon that the SPA uses to decide when to apply its refraction formula
/// and for sunrise and sunset, degrees (Reda & Andreas 2004, Table A5.1 "atmospheric refraction").
pub const HORIZON_REFRACTION_DEG: f64 = 0.5667;

/// Apparent radius of the sun's disc the SPA uses, degrees (eq. 43 condition, A.2 step 3).
pub const SUN_RADIUS_DEG: f64 = 0.26667;

impl Topocentric {
    /// Adds an observer at latitude φ and longitude σ (degrees, east positive) and elevation (metres)
    /// to `geo`. `refraction` is `Some((pressure_hpa, temperature_c))` for apparent positions (eq. 43),
    /// or `None` for the true geometric position.
    pub fn observe(
        geo: &Geocentric,
        latitude_deg: f64,
        longitude_deg: f64,
        elevation_m: f64,
        refraction: Option<(f64, f64)>,
    ) -> Self {
        let phi = rad(latitude_deg);
        let h = limit_360(geo.sidereal_time_deg + longitude_deg - geo.right_ascension_deg); // eq. 32
        let xi = rad(8.794 / (3600.0 * geo.earth_sun_distance_au)); // eq. 33
        let u = (0.996_647_19 * phi.tan()).atan(); // eq. 34
        let x = u.cos() + elevation_m / 6_378_140.0 * phi.cos(); // eq. 35
        let y = 0.996_647_19 * u.sin() + elevation_m / 6_378_140.0 * phi.sin(); // eq. 36

        let (sh, ch) = rad(h).sin_cos();
        let delta = rad(geo.declination_deg);
        let (sd, cd) = delta.sin_cos();
        let (sxi, _) = xi.sin_cos();
        let d_alpha = (-x * sxi * sh).atan2(cd - x * sxi * ch); // eq. 37
        let delta_p = ((sd - y * sxi) * d_alpha.cos()).atan2(cd - x * sxi * ch); // eq. 39
        let h_p = rad(h) - d_alpha; // eq. 40

        let (sp, cp) = phi.sin_cos();
        let (sdp, cdp) = delta_p.sin_cos();
        let e0 = (sp * sdp + cp * cdp * h_p.cos()).asin().to_degrees(); // eq. 41
        let de = match refraction {
            Some((pressure_hpa, temperature_c)) if e0 >= -(SUN_RADIUS_DEG + HORIZON_REFRACTION_DEG) => {
                pressure_hpa / 1010.0 * 283.0 / (273.0 + temperature_c) * 1.02
                    / (60.0 * rad(e0 + 10.3 / (e0 + 5.11)).tan()) // eq. 42
            }
            _ => 0.0,
        };
        let e = e0 + de; // eq. 43
        let gamma = h_p.sin().atan2(h_p.cos() * sp - delta_p.tan() * cp).to_degrees(); // eq. 45
        Topocentric {
            local_hour_angle_deg: h,
            parallax_right_ascension_deg: d_alpha.to_degrees(),
            right_ascension_deg: limit_360(geo.right_ascension_deg + d_alpha.to_degrees()),
            declination_deg: delta_p.to_degrees(),
            hour_angle_deg: h_p.to_degrees(),
            altitude_unrefracted_deg: e0,
            refraction_deg: de,
            zenith_deg: 90.0 - e,                  // eq. 44
            azimuth_deg: limit_360(gamma + 180.0), // eq. 46
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn limit_360_wraps_both_ways() {
        assert_eq!(limit_360(-1.0), 359.0);
        assert_eq!(limit_360(721.0), 1.0);
        assert_eq!(limit_360(-1e-17), 0.0);
    }
}
