//! The shadow-length table architects put in proposals: through a day, the sun's altitude and azimuth,
//! how long a shadow falls per metre of height and in which direction, and each volume's shadow tip.

use chrono::{DateTime, Duration, NaiveDate, Utc};
use serde::Serialize;

use super::cast::shadow_length_per_m;
use crate::site::SiteModel;
use crate::solar::{day_events, Atmosphere, Crossing, Ephemeris, InputError};
use crate::time::DeltaT;

/// One time of the table.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ShadowRow {
    /// The instant.
    pub time: DateTime<Utc>,
    /// Sun altitude (refracted), degrees.
    pub altitude_deg: f64,
    /// Sun azimuth, clockwise from true north, degrees.
    pub azimuth_deg: f64,
    /// Shadow length on flat ground per metre of height, metres (1 / tan altitude; common practice).
    pub shadow_length_m_per_m: f64,
    /// Direction the shadow points, clockwise from true north, degrees (azimuth + 180°).
    pub shadow_azimuth_deg: f64,
    /// For each volume (by id), the distance from its foot to the tip of its top's shadow on flat
    /// ground, metres (top height × length per metre).
    pub tips_m: Vec<(String, f64)>,
}

/// Step of a day's shadow table (and of the CLI's hourly day tables), minutes: on the hour, as
/// shadow studies are read (common practice).
pub const DEFAULT_TABLE_STEP_MIN: u32 = 60;

/// The table for local `date` at `step_min` minutes from local midnight, the steps from sunrise to
/// sunset (an empty table when the sun does not rise; every step on a polar day).
///
/// # Errors
/// [`InputError`] for a date outside the solar engine's range or a step outside 1…720 minutes.
pub fn shadow_table(
    model: &SiteModel,
    date: NaiveDate,
    step_min: u32,
    delta_t: DeltaT,
) -> Result<Vec<ShadowRow>, InputError> {
    if !(1..=720).contains(&step_min) {
        return Err(InputError::OutOfRange { field: "step_min", value: f64::from(step_min), min: 1.0, max: 720.0 });
    }
    let ev = day_events(&model.location, date, &model.zone, delta_t)?;
    let start = model.zone.start_of_day(date);
    let in_day = |t: DateTime<Utc>| match ev.sun {
        Crossing::Crosses { rise, set } => t >= rise && t <= set,
        Crossing::AlwaysAbove => true,
        Crossing::AlwaysBelow => false,
    };
    let air = Atmosphere::default();
    let mut eph = Ephemeris::new();
    let mut rows = Vec::new();
    let steps = (24 * 60 / step_min) + 1;
    for k in 0..steps {
        let t = start + Duration::minutes(i64::from(k * step_min));
        if model.zone.local_date(t) != date || !in_day(t) {
            continue;
        }
        let p = eph.sun_at(t, delta_t)?.observe(&model.location, &air);
        let Some(len) = shadow_length_per_m(p.altitude_deg) else { continue };
        rows.push(ShadowRow {
            time: t,
            altitude_deg: p.altitude_deg,
            azimuth_deg: p.azimuth_deg,
            shadow_length_m_per_m: len,
            shadow_azimuth_deg: (p.azimuth_deg + 180.0) % 360.0,
            tips_m: model.volumes.iter().map(|v| (v.id.clone(), v.top_m * len)).collect(),
        });
    }
    Ok(rows)
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_abs_diff_eq;

    #[test]
    fn equinox_table_runs_sunrise_to_sunset_with_consistent_lengths() {
        let m = SiteModel::from_json(include_str!("../../demo-site/hollin-vale.site.json")).unwrap();
        let rows = shadow_table(&m, NaiveDate::from_ymd_opt(2026, 3, 20).unwrap(), 60, DeltaT::EspenakMeeus).unwrap();
        assert_eq!(rows.len(), 12, "07:00 to 18:00 at 52.6° N on the equinox");
        for r in &rows {
            assert_abs_diff_eq!(r.shadow_length_m_per_m, 1.0 / r.altitude_deg.to_radians().tan(), epsilon = 1e-12);
            let upper = r.tips_m.iter().find(|(id, _)| id == "proposal-upper").unwrap().1;
            assert_abs_diff_eq!(upper, 15.0 * r.shadow_length_m_per_m, epsilon = 1e-9);
        }
        // Shortest shadow near solar noon (about 12:15 local; REFERENCES: noon altitude ≈ 90° − φ).
        let noon = rows.iter().min_by(|a, b| a.shadow_length_m_per_m.total_cmp(&b.shadow_length_m_per_m)).unwrap();
        assert!((noon.altitude_deg - (90.0 - 52.62)).abs() < 1.0);
        assert!(shadow_table(&m, NaiveDate::from_ymd_opt(2026, 3, 20).unwrap(), 0, DeltaT::EspenakMeeus).is_err());
    }
}
