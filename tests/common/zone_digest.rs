//! The digest of every zone's transitions over 1970–2037 that the native and the browser tests compare
//! (`tests/zone_table.rs`, `tests/web.rs`; the committed value is in
//! `tests/fixtures/zone_transitions_1970_2037.txt`).

/// 1970-01-01T00:00Z and 2038-01-01T00:00Z, Unix seconds: transitions at or after the first, before
/// the second.
pub const SPAN_S: (i64, i64) = (0, 2_145_916_800);

/// FNV-1a over every zone's name and its transitions in 1970–2037 (instant, offset, abbreviation).
pub fn digest(zones: impl Iterator<Item = (String, Vec<(i64, i32, String)>)>) -> (u64, usize) {
    let (mut h, mut n) = (0xcbf2_9ce4_8422_2325u64, 0);
    let mut eat = |bytes: &[u8]| {
        for &b in bytes {
            h = (h ^ u64::from(b)).wrapping_mul(0x100_0000_01b3);
        }
    };
    for (name, transitions) in zones {
        eat(name.as_bytes());
        for (t, off, ab) in transitions {
            eat(format!("|{t},{off},{ab}").as_bytes());
            n += 1;
        }
        eat(b"\n");
    }
    (h, n)
}

/// The digest as the fixture writes it: 16 hex digits, a space, the count.
pub fn line((h, n): (u64, usize)) -> String {
    format!("{h:016x} {n}")
}

/// The fixture's value line (the first line not starting with `#`).
pub fn committed(fixture: &str) -> &str {
    fixture.lines().find(|l| !l.starts_with('#')).unwrap_or_default()
}
