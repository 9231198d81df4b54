//! The IANA time-zone database as a compact transition table, the same in the native and the wasm build.
//!
//! `zones.bin` holds, for every zone name of the IANA tz release that `chrono-tz` (the version in
//! `Cargo.lock`) carries — links included — the zone's UTC offsets and abbreviations and every instant
//! its offset or abbreviation changes (1845–2099 in tz 2025b; after the last one the last offset holds,
//! as in `chrono-tz`). It is written by `cargo run --release --example zone_table` from `chrono-tz`, and
//! `tests/zone_table.rs` checks it is what that example writes and that it gives chrono-tz's offsets,
//! abbreviations, gaps and overlaps for every zone. 199 KB raw, 28 KB gzipped; replacing `chrono-tz`'s
//! generated code with it took the wasm module from 2,253 KB raw / 585 KB gzipped to 1,545 / 486 KB.
//!
//! The format is our own. Every integer is an unsigned LEB128 varint, signed ones zigzag-coded first:
//!
//! ```text
//! "SLTZ1\n" · tz release (len, bytes) · abbreviations: n, then (len, bytes) each
//! records: n, then each: its length in bytes, then types n, (offset_s signed, abbreviation
//!          index) each; initial type; transitions n, (seconds since the previous transition
//!          signed — the first since 1970-01-01T00:00Z —, type) each
//! names:   n, sorted, then each: (len, bytes, record index)
//! ```

use std::sync::OnceLock;

static TABLE: &[u8] = include_bytes!("zones.bin");

/// One offset a zone keeps for a while: seconds east of UTC and its abbreviation (as `chrono-tz`
/// prints it: `BST`, or `+0530` where the database gives none).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) struct Kind {
    pub offset_s: i32,
    pub abbreviation: &'static str,
}

/// A zone's history: the kind in force before the first transition, then each transition's instant
/// (Unix seconds, increasing) and the kind that starts at it.
#[derive(Debug)]
pub(crate) struct Record {
    pub initial: Kind,
    pub at_s: Vec<i64>,
    pub kinds: Vec<Kind>,
}

/// The table: the tz release, the zone names (sorted) with their record, and the records, each
/// decoded when a zone first needs it (a page or a worker that uses one zone decodes one record).
#[derive(Debug)]
pub(crate) struct Table {
    pub release: &'static str,
    pub names: Vec<(&'static str, usize)>,
    abbreviations: Vec<&'static str>,
    /// Each record's bytes, and the record once decoded.
    records: Vec<(&'static [u8], OnceLock<Record>)>,
}

/// What a wall-clock time in a zone names: the kinds of offset under which it occurs (none in a gap,
/// two in an overlap, earlier first).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum LocalKinds {
    None,
    Single(Kind),
    Ambiguous(Kind, Kind),
}

impl Record {
    /// The index of the span holding Unix second `t`: 0 before the first transition, i + 1 from
    /// transition i on.
    fn span_at(&self, t: i64) -> usize {
        self.at_s.partition_point(|&a| a <= t)
    }

    fn kind(&self, span: usize) -> Kind {
        if span == 0 {
            self.initial
        } else {
            self.kinds[span - 1]
        }
    }

    /// The kind in force at Unix second `t`.
    pub fn at(&self, t: i64) -> Kind {
        self.kind(self.span_at(t))
    }

    /// The kinds under which wall-clock second `wall` (local seconds since 1970-01-01T00:00) occurs.
    /// Span i holds the local seconds [start + offset, end + offset) of its own offset, as in
    /// `chrono-tz` (a skipped hour's first second does not exist; a repeated hour's does, twice).
    pub fn local(&self, wall: i64) -> LocalKinds {
        // Offsets are within ±26 h: only spans near the one holding `wall` read as UTC can hold it.
        let lo = self.span_at(wall - 26 * 3600);
        let hi = self.span_at(wall + 26 * 3600);
        let mut found = (lo..=hi).filter(|&i| {
            let k = self.kind(i);
            let utc = wall - i64::from(k.offset_s);
            (i == 0 || self.at_s[i - 1] <= utc) && (i == self.at_s.len() || utc < self.at_s[i])
        });
        match (found.next(), found.next()) {
            (None, _) => LocalKinds::None,
            (Some(a), None) => LocalKinds::Single(self.kind(a)),
            (Some(a), Some(b)) => LocalKinds::Ambiguous(self.kind(a), self.kind(b)),
        }
    }
}

impl Table {
    /// The record index of a zone name (exact spelling, as the database writes it).
    pub fn find(&self, name: &str) -> Option<usize> {
        self.names.binary_search_by(|(n, _)| (*n).cmp(name)).ok()
    }

    /// The record of the name at `name_index`, decoded on first use.
    pub fn record(&self, name_index: usize) -> &Record {
        let (bytes, decoded) = &self.records[self.names[name_index].1];
        decoded.get_or_init(|| {
            read_record(&mut Reader { bytes, at: 0 }, &self.abbreviations)
                .expect("every record of zones.bin decodes (checked by decode and tests/zone_table.rs)")
        })
    }

    /// How many distinct histories the table holds (zones that are links share one).
    #[cfg(test)]
    pub fn record_count(&self) -> usize {
        self.records.len()
    }
}

/// The table, decoded on first use.
pub(crate) fn table() -> &'static Table {
    static DECODED: OnceLock<Table> = OnceLock::new();
    DECODED.get_or_init(|| decode(TABLE).expect("zones.bin is checked by tests/zone_table.rs"))
}

struct Reader<'a> {
    bytes: &'a [u8],
    at: usize,
}

impl<'a> Reader<'a> {
    fn varint(&mut self) -> Option<u64> {
        let mut v = 0u64;
        for shift in (0..64).step_by(7) {
            let b = *self.bytes.get(self.at)?;
            self.at += 1;
            v |= u64::from(b & 0x7f) << shift;
            if b & 0x80 == 0 {
                return Some(v);
            }
        }
        None
    }

    fn signed(&mut self) -> Option<i64> {
        let v = self.varint()?;
        Some((v >> 1) as i64 ^ -((v & 1) as i64))
    }

    fn count(&mut self) -> Option<usize> {
        usize::try_from(self.varint()?).ok()
    }

    fn text(&mut self) -> Option<&'a str> {
        let n = self.count()?;
        let s = self.bytes.get(self.at..self.at.checked_add(n)?)?;
        self.at += n;
        std::str::from_utf8(s).ok()
    }
}

/// Decodes a table in the format above; `None` if it is not one.
pub(crate) fn decode(bytes: &'static [u8]) -> Option<Table> {
    let mut r = Reader { bytes: bytes.strip_prefix(b"SLTZ1\n")?, at: 0 };
    let release = r.text()?;
    let abbreviations: Vec<&'static str> = (0..r.count()?).map(|_| r.text()).collect::<Option<_>>()?;
    let records = (0..r.count()?)
        .map(|_| {
            let n = r.count()?;
            let bytes = r.bytes.get(r.at..r.at.checked_add(n)?)?;
            r.at += n;
            Some((bytes, OnceLock::new()))
        })
        .collect::<Option<Vec<_>>>()?;
    let names = (0..r.count()?)
        .map(|_| {
            let name = r.text()?;
            let record = r.count()?;
            (record < records.len()).then_some((name, record))
        })
        .collect::<Option<Vec<_>>>()?;
    let sorted = names.windows(2).all(|w| w[0].0 < w[1].0);
    (sorted && r.at == r.bytes.len()).then_some(Table { release, names, abbreviations, records })
}

/// Whether every record of `table` decodes whole (what [`Table::record`] relies on; the tests check
/// the committed table).
#[cfg(test)]
pub(crate) fn all_records_decode(table: &Table) -> bool {
    table.records.iter().all(|(bytes, _)| {
        let mut r = Reader { bytes, at: 0 };
        read_record(&mut r, &table.abbreviations).is_some() && r.at == bytes.len()
    })
}

fn read_record(r: &mut Reader<'_>, abbreviations: &[&'static str]) -> Option<Record> {
    let kinds: Vec<Kind> = (0..r.count()?)
        .map(|_| {
            let offset_s = i32::try_from(r.signed()?).ok()?;
            let abbreviation = *abbreviations.get(r.count()?)?;
            Some(Kind { offset_s, abbreviation })
        })
        .collect::<Option<_>>()?;
    let initial = *kinds.get(r.count()?)?;
    let n = r.count()?;
    let (mut at_s, mut starts) = (Vec::with_capacity(n), Vec::with_capacity(n));
    let mut t = 0i64;
    for _ in 0..n {
        t = t.checked_add(r.signed()?)?;
        at_s.push(t);
        starts.push(*kinds.get(r.count()?)?);
    }
    Some(Record { initial, at_s, kinds: starts })
}

/// A zone's history as the generator reads it: name, the kind before the first transition
/// (offset_s, abbreviation), and the transitions (Unix s, offset_s, abbreviation).
pub type ZoneHistory = (String, (i32, String), Vec<(i64, i32, String)>);

/// Encodes a table (used by the generator, `examples/zone_table.rs`, and the tests).
///
/// `zones` are (name, initial kind, transitions) with the kinds as (offset_s, abbreviation); names
/// with the same history share one record.
pub fn encode(release: &str, zones: &[ZoneHistory]) -> Vec<u8> {
    use std::collections::BTreeMap;
    let mut abbreviations: Vec<String> = Vec::new();
    let abbr_index = |a: &str, list: &mut Vec<String>| match list.iter().position(|x| x == a) {
        Some(i) => i,
        None => {
            list.push(a.to_string());
            list.len() - 1
        }
    };
    let mut records: Vec<Vec<u8>> = Vec::new();
    let mut record_of: BTreeMap<String, usize> = BTreeMap::new();
    let mut by_history: BTreeMap<Vec<u8>, usize> = BTreeMap::new();
    for (name, initial, transitions) in zones {
        let mut kinds: Vec<(i32, usize)> = Vec::new();
        let mut kind_index = |k: (i32, usize)| match kinds.iter().position(|x| *x == k) {
            Some(i) => i,
            None => {
                kinds.push(k);
                kinds.len() - 1
            }
        };
        let first = kind_index((initial.0, abbr_index(&initial.1, &mut abbreviations)));
        let mut body = Vec::new();
        put(&mut body, transitions.len() as u64);
        let mut prev = 0i64;
        for (t, off, ab) in transitions {
            put_signed(&mut body, t - prev);
            prev = *t;
            put(&mut body, kind_index((*off, abbr_index(ab, &mut abbreviations))) as u64);
        }
        let mut rec = Vec::new();
        put(&mut rec, kinds.len() as u64);
        for (off, ab) in &kinds {
            put_signed(&mut rec, i64::from(*off));
            put(&mut rec, *ab as u64);
        }
        put(&mut rec, first as u64);
        rec.extend(body);
        let next = records.len();
        let i = *by_history.entry(rec.clone()).or_insert(next);
        if i == next {
            records.push(rec);
        }
        record_of.insert(name.clone(), i);
    }
    let mut out = b"SLTZ1\n".to_vec();
    put_text(&mut out, release);
    put(&mut out, abbreviations.len() as u64);
    abbreviations.iter().for_each(|a| put_text(&mut out, a));
    put(&mut out, records.len() as u64);
    for r in &records {
        put(&mut out, r.len() as u64);
        out.extend(r);
    }
    put(&mut out, record_of.len() as u64);
    for (name, i) in &record_of {
        put_text(&mut out, name);
        put(&mut out, *i as u64);
    }
    out
}

fn put(out: &mut Vec<u8>, mut v: u64) {
    loop {
        let b = (v & 0x7f) as u8;
        v >>= 7;
        if v == 0 {
            out.push(b);
            return;
        }
        out.push(b | 0x80);
    }
}

fn put_signed(out: &mut Vec<u8>, v: i64) {
    put(out, ((v << 1) ^ (v >> 63)) as u64);
}

fn put_text(out: &mut Vec<u8>, s: &str) {
    put(out, s.len() as u64);
    out.extend(s.as_bytes());
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_committed_table_decodes() {
        let t = table();
        assert!(all_records_decode(t));
        assert!(t.names.len() > 500, "{} names", t.names.len());
        let london = t.record(t.find("Europe/London").unwrap());
        // 2024-03-31T01:00Z: GMT to BST (UK Summer Time Order; common practice).
        assert_eq!(london.at(1_711_846_799), Kind { offset_s: 0, abbreviation: "GMT" });
        assert_eq!(london.at(1_711_846_800), Kind { offset_s: 3600, abbreviation: "BST" });
        assert!(t.find("Mars/Olympus").is_none());
    }

    #[test]
    fn a_round_trip_keeps_every_transition() {
        let zones = vec![
            ("B/Two".to_string(), (0, "X".to_string()), vec![(-100, 3600, "Y".to_string()), (50, 0, "X".to_string())]),
            ("A/One".to_string(), (0, "X".to_string()), vec![(-100, 3600, "Y".to_string()), (50, 0, "X".to_string())]),
        ];
        let bytes: &'static [u8] = Vec::leak(encode("test", &zones));
        let t = decode(bytes).unwrap();
        assert!(all_records_decode(&t));
        assert_eq!(t.record_count(), 1, "the same history is stored once");
        assert_eq!(t.names, vec![("A/One", 0), ("B/Two", 0)]);
        let r = t.record(0);
        assert_eq!(r.at(-101).offset_s, 0);
        assert_eq!(r.at(-100).abbreviation, "Y");
        assert_eq!(r.at(50).abbreviation, "X");
        // Local seconds: X before -100, Y over [3500, 3650), X again from 50 on.
        let (x, y) = (Kind { offset_s: 0, abbreviation: "X" }, Kind { offset_s: 3600, abbreviation: "Y" });
        assert_eq!(r.local(-200), LocalKinds::Single(x));
        assert_eq!(r.local(-50), LocalKinds::None);
        assert_eq!(r.local(3600), LocalKinds::Ambiguous(y, x));
        assert_eq!(r.local(3700), LocalKinds::Single(x));
        assert!(decode(b"SLTZ1\n\x01").is_none());
    }
}
