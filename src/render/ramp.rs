//! The colour ramp of every map: cividis (see `ramp_table.rs`), perceptually uniform and readable
//! with red-green colour-vision deficiency.

use super::draw::Colour;
use super::ramp_table::STOPS;

/// The ramp's colour at `t` (0 low – 1 high, clamped), linearly between stops.
pub fn ramp(t: f64) -> Colour {
    let t = if t.is_finite() { t.clamp(0.0, 1.0) } else { 0.0 };
    let x = t * (STOPS.len() - 1) as f64;
    let i = (x.floor() as usize).min(STOPS.len() - 2);
    let f = x - i as f64;
    let mix = |a: u8, b: u8| (f64::from(a) + (f64::from(b) - f64::from(a)) * f).round() as u8;
    let (a, b) = (STOPS[i], STOPS[i + 1]);
    Colour::rgb(mix(a[0], b[0]), mix(a[1], b[1]), mix(a[2], b[2]))
}

/// The ramp's colour for `value` between `lo` and `hi`.
pub fn ramp_colour(value: f64, lo: f64, hi: f64) -> Colour {
    ramp(if hi > lo { (value - lo) / (hi - lo) } else { 1.0 })
}
