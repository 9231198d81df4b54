//! Sunlight at the top of the atmosphere.

/// Total solar irradiance at 1 AU, W/m²: the nominal value of IAU 2015 Resolution B3 (from memory),
/// within the measured 1360.8 ± 0.5 W/m² of Kopp & Lean (2011), Geophys. Res. Lett. 38, L01706.
pub const SOLAR_CONSTANT_W_M2: f64 = 1361.0;

/// The Earth–Sun distance factor (r₀/r)² on day `day_of_year` (1–366), dimensionless.
///
/// # References
/// Spencer, J. W. (1971), "Fourier series representation of the position of the sun", Search 2(5), 172,
/// as given by Iqbal, M. (1983), *An Introduction to Solar Radiation*, eq. 1.2.1.
pub fn earth_sun_distance_factor(day_of_year: u32) -> f64 {
    let g = 2.0 * std::f64::consts::PI * (f64::from(day_of_year) - 1.0) / 365.0;
    1.000_110 + 0.034_221 * g.cos() + 0.001_280 * g.sin() + 0.000_719 * (2.0 * g).cos() + 0.000_077 * (2.0 * g).sin()
}

/// Extraterrestrial irradiance on a plane normal to the sun on `day_of_year`, W/m²:
/// [`SOLAR_CONSTANT_W_M2`] × (r₀/r)² (Spencer 1971).
///
/// # Examples
/// ```
/// // Early January, near perihelion, the sun is about 3.4 % brighter than at 1 AU.
/// let e = sunlot::sky::extraterrestrial_normal_w_m2(3);
/// assert!((e / 1361.0 - 1.0345).abs() < 0.001);
/// ```
pub fn extraterrestrial_normal_w_m2(day_of_year: u32) -> f64 {
    SOLAR_CONSTANT_W_M2 * earth_sun_distance_factor(day_of_year)
}
