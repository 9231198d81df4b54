//! Instants, zones and the astronomical time scales the solar engine needs.
//!
//! An instant is a [`chrono::DateTime<Utc>`]; a [`Zone`] (IANA or a fixed offset) is carried beside it
//! for reading and writing local clock times. [`julian`] turns instants into Julian days (UT) and
//! [`delta_t`] gives ΔT = TT − UT, the gap to the Julian ephemeris day the SPA's terms need.

pub mod delta_t;
pub mod julian;
mod zone;
mod zone_table;

pub use delta_t::{delta_t_espenak_meeus_s, DeltaT};
pub use julian::{instant_from_julian_day, julian_day, year_fraction};
pub use zone::{parse_instant, tz_release, Fold, IanaZone, TimeError, Zone};
pub use zone_table::{encode as encode_zone_table, ZoneHistory};
