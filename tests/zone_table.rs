//! The compact zone table (`src/time/zones.bin`) against `chrono-tz`, the source it is made from
//! (`examples/zone_table.rs`): the committed table is what the generator writes from the chrono-tz in
//! `Cargo.lock`, and for every zone it gives chrono-tz's offset and abbreviation on each side of every
//! transition, and chrono-tz's reading of wall-clock times in every gap and overlap. The digest of all
//! transitions 1970–2037 in `tests/fixtures/zone_transitions_1970_2037.txt` is checked here against
//! chrono-tz and in the browser (`tests/web.rs`) against the wasm build's own reading of the table.

mod common;
#[path = "common/zone_digest.rs"]
mod zone_digest;
#[path = "common/zone_scan.rs"]
mod zone_scan;

use zone_digest::digest;

use std::sync::OnceLock;

use chrono::{DateTime, LocalResult, NaiveDateTime, Offset, TimeZone, Utc};
use chrono_tz::Tz;
use sunlot::time::{Fold, IanaZone, TimeError, Zone};

const COMMITTED: &[u8] = include_bytes!("../src/time/zones.bin");

fn at(t: i64) -> DateTime<Utc> {
    DateTime::from_timestamp(t, 0).unwrap()
}

/// Every zone's history read from chrono-tz, once for all the tests here.
fn scanned() -> &'static [zone_scan::ZoneHistory] {
    static ZONES: OnceLock<Vec<zone_scan::ZoneHistory>> = OnceLock::new();
    ZONES.get_or_init(zone_scan::all)
}

#[test]
fn the_committed_table_is_what_the_generator_makes_and_agrees_with_chrono_tz() {
    let zones = scanned();
    let made = sunlot::time::encode_zone_table(chrono_tz::IANA_TZDB_VERSION, zones);
    assert!(
        made == COMMITTED,
        "src/time/zones.bin is not what chrono-tz {} makes: run `cargo run --release --example zone_table`",
        chrono_tz::IANA_TZDB_VERSION
    );
    assert_eq!(sunlot::time::tz_release(), chrono_tz::IANA_TZDB_VERSION);
    assert_eq!(IanaZone::all().count(), chrono_tz::TZ_VARIANTS.len());
    let mut closest = i64::MAX;
    for (name, _, transitions) in zones {
        let tz: Tz = name.parse().unwrap();
        let ours: Zone = name.parse().unwrap();
        assert_eq!(ours.to_string(), *name);
        for w in transitions.windows(2) {
            closest = closest.min(w[1].0 - w[0].0);
        }
        for &(t, _, _) in transitions {
            for s in [t - 1, t] {
                let theirs = at(s).with_timezone(&tz);
                assert_eq!(ours.local(at(s)), at(s).with_timezone(&theirs.offset().fix()), "{name} at {s}");
                assert_eq!(ours.label(at(s)), theirs.format("%Y-%m-%d %H:%M %Z").to_string(), "{name} at {s}");
            }
            wall_times_agree(name, tz, ours, t);
        }
    }
    // The generator samples daily: two transitions within a day would hide each other.
    assert!(closest > 2 * 86_400, "two transitions {closest} s apart: sample the zones more often");
}

/// Wall-clock times around the transition at `t` (the old and the new offset's view of it, ± 1 s)
/// resolve as chrono-tz resolves them: the same instant, the same gap, the same two instants.
fn wall_times_agree(name: &str, tz: Tz, ours: Zone, t: i64) {
    let before = zone_scan::kind(zone_scan::offset(tz, t - 1)).0;
    let after = zone_scan::kind(zone_scan::offset(tz, t)).0;
    for base in [t + i64::from(before), t + i64::from(after)] {
        for wall_s in [base - 1, base, base + 1] {
            let wall: NaiveDateTime = at(wall_s).naive_utc();
            let theirs = tz.from_local_datetime(&wall).map(|d| d.with_timezone(&Utc));
            match theirs {
                LocalResult::None => assert!(
                    matches!(ours.resolve(wall, Fold::Earlier), Err(TimeError::Nonexistent { .. })),
                    "{name} {wall}: chrono-tz finds a gap"
                ),
                LocalResult::Single(u) => assert_eq!(ours.resolve(wall, Fold::Reject), Ok(u), "{name} {wall}"),
                LocalResult::Ambiguous(a, b) => {
                    let (a, b) = (a.min(b), a.max(b));
                    assert!(matches!(ours.resolve(wall, Fold::Reject), Err(TimeError::Ambiguous { .. })));
                    assert_eq!(ours.resolve(wall, Fold::Earlier), Ok(a), "{name} {wall}");
                    assert_eq!(ours.resolve(wall, Fold::Later), Ok(b), "{name} {wall}");
                }
            }
        }
    }
}

#[test]
fn the_transitions_of_1970_to_2037_have_the_committed_digest() {
    let (from, to) = zone_digest::SPAN_S;
    let theirs = digest(
        scanned()
            .iter()
            .map(|(name, _, t)| (name.clone(), t.iter().filter(|x| (from..to).contains(&x.0)).cloned().collect())),
    );
    let ours = digest(IanaZone::all().map(|z| {
        let t = z.transitions(at(from), at(to));
        (z.name().to_string(), t.into_iter().map(|(i, o, a)| (i.timestamp(), o, a.to_string())).collect())
    }));
    assert_eq!(ours, theirs, "sunlot's table against chrono-tz");
    let fixture = common::fixture_text("zone_transitions_1970_2037.txt");
    assert_eq!(
        zone_digest::line(ours),
        zone_digest::committed(&fixture),
        "the fixture tests/web.rs checks the wasm build against"
    );
}
