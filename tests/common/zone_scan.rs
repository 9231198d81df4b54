//! Reads every zone's history out of `chrono-tz` through its public interface, for the compact zone
//! table (`src/time/zones.bin`): the generator `examples/zone_table.rs` and `tests/zone_table.rs` share it.
//!
//! Each zone is sampled once a day from 1800 to 2101 and every change of offset or abbreviation is
//! narrowed down to its second by bisection. That finds every transition as long as no two are less
//! than a day apart: in chrono-tz 0.10.4 (tz 2025b) the closest two of any zone are 6.9 days apart
//! (America/Cambridge_Bay, 2000; measured on its generated source), and `tests/zone_table.rs` checks
//! the table's closest pair stays above two days.

use chrono::{DateTime, Offset, TimeZone};
use chrono_tz::{Tz, TzOffset, TZ_VARIANTS};

pub use sunlot::time::ZoneHistory;

/// 1800-01-01T00:00Z and 2101-01-01T00:00Z: chrono-tz's transitions run from 1845 to 2099.
pub const SCAN_FROM_S: i64 = -5_364_662_400;
pub const SCAN_TO_S: i64 = 4_133_980_800;
const DAY_S: i64 = 86_400;

/// chrono-tz's offset of zone `tz` at Unix second `t`.
pub fn offset(tz: Tz, t: i64) -> TzOffset {
    let utc = DateTime::from_timestamp(t, 0).expect("scan instants are in chrono's range").naive_utc();
    tz.offset_from_utc_datetime(&utc)
}

/// What a user sees of an offset: seconds east of UTC and the abbreviation chrono-tz prints.
pub fn kind(off: TzOffset) -> (i32, String) {
    (off.fix().local_minus_utc(), off.to_string())
}

/// One zone's history: only changes a user can see (offset or abbreviation) are kept.
pub fn history(tz: Tz) -> ZoneHistory {
    let mut prev = offset(tz, SCAN_FROM_S);
    let (initial, mut out) = (kind(prev), Vec::new());
    let mut seen = initial.clone();
    let mut t = SCAN_FROM_S;
    while t < SCAN_TO_S {
        let next = offset(tz, t + DAY_S);
        if next != prev {
            // The first second of (t, t + a day] under the new offset.
            let (mut lo, mut hi) = (t, t + DAY_S);
            while hi - lo > 1 {
                let mid = lo + (hi - lo) / 2;
                if offset(tz, mid) == prev {
                    lo = mid;
                } else {
                    hi = mid;
                }
            }
            let k = kind(next);
            if k != seen {
                out.push((hi, k.0, k.1.clone()));
                seen = k;
            }
            prev = next;
        }
        t += DAY_S;
    }
    (tz.name().to_string(), initial, out)
}

/// Every zone chrono-tz knows (links included), sorted by name.
pub fn all() -> Vec<ZoneHistory> {
    let mut v: Vec<ZoneHistory> = TZ_VARIANTS.iter().map(|&tz| history(tz)).collect();
    v.sort_by(|a, b| a.0.cmp(&b.0));
    v
}
