//! The sun's time-only terms for many instants, computed every three hours and interpolated.
//!
//! The SPA's costly terms ([`SlowTerms`]: 258 periodic terms) change slowly: the fastest of them, a
//! nutation term of about 5.6 days' period and 0.0001° amplitude, and the Earth's orbital motion, are
//! reproduced by four-point (cubic) Lagrange interpolation on a three-hour grid in TT to far better than
//! 1e-9° (the error bound is 9h⁴/384·max|f⁗|; `tests` check 1e-9° over two centuries). Everything
//! else — sidereal time, obliquity, aberration, right ascension, declination — is computed exactly per
//! instant. Batch work on many distinct instants (CSV rows, sun-hours steps) shares the hourly nodes.
//!
//! Figures ([`Ephemeris::for_figures`]) use a one-day grid: the same bound gives 4e-6° for that
//! nutation term (`tests` measure 1.4e-7° in position over 2000–2040), far inside the SPA's own ±0.0003° and
//! ten thousand times finer than a pixel of a sun-path diagram, for a third of the nodes an
//! hour-line figure needs.

use std::collections::HashMap;

use chrono::{DateTime, Utc};

use super::input::InputError;
use super::position::SunAtInstant;
use super::spa::{limit_360, Geocentric, SlowTerms};
use crate::time::DeltaT;

/// Grid step of the interpolation nodes, days (three hours).
const STEP_DAYS: f64 = 3.0 / 24.0;

/// Nodes kept before the cache is emptied, so memory stays bounded (two years of three-hour nodes is 5,856).
const MAX_NODES: usize = 20_000;

/// Grid step of the figures' nodes, days.
const FIGURE_STEP_DAYS: f64 = 1.0;

/// A cache of [`SlowTerms`] nodes on a fixed grid (three-hourly unless made for figures).
#[derive(Debug, Clone)]
pub struct Ephemeris {
    nodes: HashMap<i64, SlowTerms>,
    step_days: f64,
}

impl Default for Ephemeris {
    fn default() -> Self {
        Ephemeris { nodes: HashMap::new(), step_days: STEP_DAYS }
    }
}

impl Ephemeris {
    /// An empty cache on the three-hour grid (within 1e-9° of the direct terms).
    pub fn new() -> Self {
        Self::default()
    }

    /// An empty cache on a one-day grid, for drawings that ask for thousands of positions spread
    /// over a year (within 1e-6° of the direct SPA in position; see the module's note).
    pub fn for_figures() -> Self {
        Ephemeris { nodes: HashMap::new(), step_days: FIGURE_STEP_DAYS }
    }

    fn node(&mut self, k: i64) -> SlowTerms {
        if self.nodes.len() >= MAX_NODES {
            self.nodes.clear();
        }
        let step = self.step_days;
        *self.nodes.entry(k).or_insert_with(|| SlowTerms::at_jde(k as f64 * step))
    }

    /// The slow terms at `jde`, interpolated between the four nearest nodes.
    pub fn slow_terms(&mut self, jde: f64) -> SlowTerms {
        let x = jde / self.step_days;
        let k = x.floor();
        let p = x - k; // 0 ≤ p < 1, between nodes k and k+1
        let k = k as i64;
        let n = [self.node(k - 1), self.node(k), self.node(k + 1), self.node(k + 2)];
        // Lagrange weights for nodes at −1, 0, 1, 2.
        let w = [
            -p * (p - 1.0) * (p - 2.0) / 6.0,
            (p + 1.0) * (p - 1.0) * (p - 2.0) / 2.0,
            -(p + 1.0) * p * (p - 2.0) / 2.0,
            (p + 1.0) * p * (p - 1.0) / 6.0,
        ];
        let mix = |f: &dyn Fn(&SlowTerms) -> f64| w.iter().zip(&n).map(|(w, t)| w * f(t)).sum::<f64>();
        // L wraps at 360°: interpolate its offsets from node k.
        let l0 = n[1].l_deg;
        let unwrap = |t: &SlowTerms| (t.l_deg - l0 + 180.0).rem_euclid(360.0) - 180.0;
        SlowTerms {
            l_deg: limit_360(l0 + mix(&unwrap)),
            b_deg: mix(&|t| t.b_deg),
            r_au: mix(&|t| t.r_au),
            dpsi_deg: mix(&|t| t.dpsi_deg),
            deps_deg: mix(&|t| t.deps_deg),
        }
    }

    /// The sun's time-only part at `instant`, as [`SunAtInstant::new`] gives it but from the cache.
    ///
    /// # Errors
    /// As [`SunAtInstant::new`].
    pub fn sun_at(&mut self, instant: DateTime<Utc>, delta_t: DeltaT) -> Result<SunAtInstant, InputError> {
        let (jd, delta_t_s) = SunAtInstant::checked_inputs(instant, delta_t)?;
        let jde = jd + delta_t_s / 86_400.0;
        let slow = self.slow_terms(jde);
        Ok(SunAtInstant::from_geocentric(Geocentric::from_slow_terms(jd, jde, &slow), delta_t_s))
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::solar::{Atmosphere, Site};
    use crate::time::julian_day;
    use chrono::TimeZone;

    #[test]
    fn interpolated_terms_match_direct_ones_within_1e9_degrees() {
        let mut eph = Ephemeris::new();
        let t0 = Utc.with_ymd_and_hms(1900, 1, 1, 0, 0, 0).unwrap().timestamp();
        let span = Utc.with_ymd_and_hms(2100, 12, 31, 0, 0, 0).unwrap().timestamp() - t0;
        let mut worst = 0.0_f64;
        // A fixed quasi-random walk over 1900–2100 (golden-ratio steps), with seconds off the grid.
        for i in 0..5_000_i64 {
            let frac = (i as f64 * 0.618_033_988_749_895).fract();
            let t = Utc.timestamp_opt(t0 + (frac * span as f64) as i64, 0).unwrap();
            let jde = julian_day(t) + 69.0 / 86_400.0;
            let a = eph.slow_terms(jde);
            let b = SlowTerms::at_jde(jde);
            let dl = ((a.l_deg - b.l_deg + 180.0).rem_euclid(360.0) - 180.0).abs();
            for d in [dl, (a.b_deg - b.b_deg).abs(), (a.dpsi_deg - b.dpsi_deg).abs(), (a.deps_deg - b.deps_deg).abs()] {
                worst = worst.max(d);
            }
            assert!((a.r_au - b.r_au).abs() < 1e-11);
        }
        assert!(worst < 1e-9, "worst interpolation error {worst:e}°");
        eprintln!("worst interpolation error {worst:e}°");
    }

    #[test]
    fn positions_from_the_cache_equal_direct_positions() {
        let mut eph = Ephemeris::new();
        let site = Site::new(52.62, -1.87, 118.0).unwrap();
        let air = Atmosphere::default();
        for m in 0..2_000 {
            let t = Utc.with_ymd_and_hms(2026, 1, 1, 0, 0, 0).unwrap() + chrono::Duration::seconds(m * 15_731);
            let a = eph.sun_at(t, DeltaT::EspenakMeeus).unwrap().observe(&site, &air);
            let b = SunAtInstant::new(t, DeltaT::EspenakMeeus).unwrap().observe(&site, &air);
            assert!((a.zenith_deg - b.zenith_deg).abs() < 1e-9 && (a.azimuth_deg - b.azimuth_deg).abs() < 1e-9);
        }
    }

    #[test]
    fn the_figures_daily_grid_stays_within_1e6_degrees_of_direct_positions() {
        // Every 7,919 s (off any grid) through 2000–2040, at a mid-latitude and a polar site, sun up.
        let mut eph = Ephemeris::for_figures();
        let air = Atmosphere::default();
        let sites = [Site::new(52.62, -1.87, 118.0).unwrap(), Site::new(-69.0, 39.6, 20.0).unwrap()];
        let t0 = Utc.with_ymd_and_hms(2000, 1, 1, 0, 0, 0).unwrap();
        let (mut worst, mut checked) = (0.0_f64, 0);
        for m in 0..160_000 {
            let t = t0 + chrono::Duration::seconds(m * 7_919);
            let a = eph.sun_at(t, DeltaT::EspenakMeeus).unwrap();
            let b = SunAtInstant::new(t, DeltaT::EspenakMeeus).unwrap();
            for site in &sites {
                let (p, q) = (a.observe(site, &air), b.observe(site, &air));
                if q.altitude_deg < 5.0 {
                    continue; // azimuth is what a figure reads; it is steady with the sun up
                }
                checked += 1;
                let daz = ((p.azimuth_deg - q.azimuth_deg + 180.0).rem_euclid(360.0) - 180.0).abs();
                worst = worst.max((p.zenith_deg - q.zenith_deg).abs()).max(daz);
            }
        }
        assert!(checked > 50_000, "{checked} positions");
        assert!(worst < 1e-6, "worst difference on the daily grid {worst:e}°");
        eprintln!("worst difference on the daily grid {worst:e}° over {checked} positions");
    }
}
