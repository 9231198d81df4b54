//! `sunlot position --format csv` on standard input: one solar position per CSV row.
//!
//! The input header must have `lat`, `lon` and `time` (RFC 3339 with offset); `elevation_m`,
//! `pressure_hpa` and `temperature_c` are optional per row, else the command's options apply. Every
//! input column is written back, followed by `zenith_deg,altitude_deg,azimuth_deg`. The whole input is
//! checked before anything is written, so a bad row never leaves half a file; the message names the
//! row (1 = first data row), its line and the column. The costly time-only terms of the algorithm are
//! computed once per three hours of the rows' instants and shared by all rows ([`Ephemeris`]).

use std::fmt::Write as _;
use std::io::Read;

use csv::StringRecord;
use sunlot::solar::{Atmosphere, Ephemeris, InputError, Site};
use sunlot::time::{parse_instant, DeltaT};

use crate::args::{AirArgs, DeltaTArgs};

/// Rows are split into this many parts, one thread each (the machines we target have two cores).
const THREADS: usize = 2;

/// Column positions in the input.
struct Columns {
    lat: usize,
    lon: usize,
    time: usize,
    elevation_m: Option<usize>,
    pressure_hpa: Option<usize>,
    temperature_c: Option<usize>,
}

impl Columns {
    fn find(header: &StringRecord) -> Result<Self, String> {
        let at = |name: &str| header.iter().position(|h| h.trim() == name);
        let need = |name: &str| {
            at(name).ok_or_else(|| {
                format!(
                    "input CSV header has no {name:?} column (need lat,lon,time; got {:?})",
                    header.iter().collect::<Vec<_>>().join(",")
                )
            })
        };
        Ok(Columns {
            lat: need("lat")?,
            lon: need("lon")?,
            time: need("time")?,
            elevation_m: at("elevation_m"),
            pressure_hpa: at("pressure_hpa"),
            temperature_c: at("temperature_c"),
        })
    }
}

/// Defaults for the optional columns, from the command line.
struct Defaults {
    atmosphere: Atmosphere,
    delta_t: DeltaT,
}

pub fn run(air: &AirArgs, delta_t: &DeltaTArgs) -> Result<String, String> {
    let mut input = String::new();
    std::io::stdin().read_to_string(&mut input).map_err(|e| format!("reading standard input: {e}"))?;
    let defaults = Defaults { atmosphere: air.atmosphere()?, delta_t: delta_t.delta_t()? };
    convert(&input, &defaults)
}

fn convert(input: &str, defaults: &Defaults) -> Result<String, String> {
    let header_end = input.find('\n').map_or(input.len(), |i| i + 1);
    let mut rdr = csv::ReaderBuilder::new().has_headers(true).from_reader(&input.as_bytes()[..header_end]);
    let header = rdr.headers().map_err(|e| format!("input CSV header: {e}"))?.clone();
    let cols = Columns::find(&header)?;

    // Parts of whole lines for the threads; quoted fields may hold line breaks, so such input is one part.
    let body = &input[header_end..];
    let mut parts: Vec<(&str, u64)> = Vec::new();
    if body.contains('"') {
        parts.push((body, 1));
    } else {
        let (mut from, mut lines_before) = (0, 1);
        for k in 1..=THREADS {
            let target = body.len() * k / THREADS;
            let to = if k == THREADS {
                body.len()
            } else {
                // Bytes, not chars: `target` may fall inside a multi-byte character; a '\n' byte never does.
                body.as_bytes()[target..].iter().position(|&b| b == b'\n').map_or(body.len(), |i| target + i + 1)
            };
            if to > from {
                parts.push((&body[from..to], lines_before));
                lines_before += body[from..to].bytes().filter(|&b| b == b'\n').count() as u64;
                from = to;
            }
        }
    }

    let outputs: Vec<Result<Vec<u8>, String>> = std::thread::scope(|s| {
        let handles: Vec<_> = parts
            .iter()
            .map(|&(text, lines_before)| {
                let (cols, width) = (&cols, header.len());
                s.spawn(move || convert_part(text, lines_before, width, cols, defaults))
            })
            .collect();
        handles
            .into_iter()
            .map(|h| h.join().unwrap_or_else(|_| Err("internal error in a worker thread".into())))
            .collect()
    });

    let mut w = csv::Writer::from_writer(Vec::with_capacity(input.len() * 2));
    let mut out_header = header.clone();
    for c in ["zenith_deg", "altitude_deg", "azimuth_deg"] {
        out_header.push_field(c);
    }
    w.write_record(&out_header).map_err(|e| e.to_string())?;
    let mut out = w.into_inner().map_err(|e| e.to_string())?;
    for p in outputs {
        out.extend_from_slice(&p?);
    }
    String::from_utf8(out).map_err(|e| e.to_string())
}

/// Converts the rows in `text`, which starts after `lines_before` lines of the input; `width` is the
/// header's number of columns.
fn convert_part(text: &str, lines_before: u64, width: usize, cols: &Columns, d: &Defaults) -> Result<Vec<u8>, String> {
    let mut rdr = csv::ReaderBuilder::new().has_headers(false).flexible(true).from_reader(text.as_bytes());
    let mut w = csv::Writer::from_writer(Vec::with_capacity(text.len() * 2));
    let mut ephemeris = Ephemeris::new();
    let mut r = StringRecord::new();
    let mut numbers = [String::new(), String::new(), String::new()];
    while rdr.read_record(&mut r).map_err(|e| format!("not valid CSV after line {lines_before}: {e}"))? {
        let line = lines_before + r.position().map_or(0, |p| p.line());
        let n = line - 1;
        let at = |msg: String| format!("row {n} (line {line}): {msg}");
        if r.len() != width {
            return Err(at(format!("has {} fields, the header has {width}", r.len())));
        }
        let num = |idx: usize, name: &str| -> Result<f64, String> {
            let text = r.get(idx).unwrap_or("").trim();
            text.parse::<f64>().map_err(|_| at(format!("{name} {text:?} is not a number")))
        };
        let opt = |idx: Option<usize>, name: &str, default: f64| idx.map_or(Ok(default), |i| num(i, name));
        let site = Site::new(num(cols.lat, "lat")?, num(cols.lon, "lon")?, opt(cols.elevation_m, "elevation_m", 0.0)?)
            .map_err(|e| at(column_message(&e)))?;
        let air = Atmosphere::new(
            opt(cols.pressure_hpa, "pressure_hpa", d.atmosphere.pressure_hpa)?,
            opt(cols.temperature_c, "temperature_c", d.atmosphere.temperature_c)?,
            d.atmosphere.refraction,
        )
        .map_err(|e| at(column_message(&e)))?;
        let (t, _) = parse_instant(r.get(cols.time).unwrap_or("")).map_err(|e| at(format!("time: {e}")))?;
        let sun = ephemeris.sun_at(t, d.delta_t).map_err(|e| at(column_message(&e)))?;
        let p = sun.observe(&site, &air);
        for (buf, v) in numbers.iter_mut().zip([p.zenith_deg, p.altitude_deg, p.azimuth_deg]) {
            buf.clear();
            let _ = write!(buf, "{v}");
        }
        w.write_record(r.iter().chain(numbers.iter().map(String::as_str))).map_err(|e| format!("line {line}: {e}"))?;
    }
    w.into_inner().map_err(|e| e.to_string())
}

/// An input error named by its CSV column.
fn column_message(e: &InputError) -> String {
    let col = |f: &str| match f {
        "latitude_deg" => "lat".to_string(),
        "longitude_deg" => "lon".to_string(),
        other => other.to_string(),
    };
    match e {
        InputError::NotFinite { field, value } => format!("{} must be a finite number, got {value}", col(field)),
        InputError::OutOfRange { field, value, min, max } => {
            format!("{} must be between {min} and {max}, got {value}", col(field))
        }
        other => other.to_string(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn defaults() -> Defaults {
        Defaults { atmosphere: Atmosphere::default(), delta_t: DeltaT::Seconds(67.0) }
    }

    #[test]
    fn keeps_input_columns_and_adds_three() {
        let out =
            convert("lat,lon,time,note\n39.742476,-105.1786,2003-10-17T12:30:30-07:00,\"a, quoted\"\n", &defaults())
                .unwrap();
        let mut lines = out.lines();
        assert_eq!(lines.next(), Some("lat,lon,time,note,zenith_deg,altitude_deg,azimuth_deg"));
        let row = lines.next().unwrap();
        assert!(row.starts_with("39.742476,-105.1786,2003-10-17T12:30:30-07:00,\"a, quoted\",50.1"), "{row}");
    }

    #[test]
    fn bad_row_is_named_and_nothing_is_written() {
        let e =
            convert("lat,lon,time\n10,20,2020-01-01T00:00:00Z\n95,20,2020-01-01T00:00:00Z\n", &defaults()).unwrap_err();
        assert_eq!(e, "row 2 (line 3): lat must be between -90 and 90, got 95");
        let e = convert("lat,lon,time\n10,20,yesterday\n", &defaults()).unwrap_err();
        assert!(e.starts_with("row 1 (line 2): time: time \"yesterday\" is not an RFC 3339"), "{e}");
        let e = convert("lat,lon,time\n10,x,2020-01-01T00:00:00Z\n", &defaults()).unwrap_err();
        assert_eq!(e, "row 1 (line 2): lon \"x\" is not a number");
        let e = convert("lat,lon,when\n", &defaults()).unwrap_err();
        assert!(e.contains("no \"time\" column"), "{e}");
        let e = convert("lat,lon,time\n1,2\n", &defaults()).unwrap_err();
        assert_eq!(e, "row 1 (line 2): has 2 fields, the header has 3");
    }

    #[test]
    fn optional_columns_override_the_defaults() {
        let out = convert("lat,lon,time,elevation_m,pressure_hpa,temperature_c\n39.742476,-105.1786,2003-10-17T12:30:30-07:00,1830.14,820,11\n", &defaults()).unwrap();
        let z: f64 = out.lines().nth(1).unwrap().split(',').nth(6).unwrap().parse().unwrap();
        assert!((z - 50.11162).abs() < 5e-6, "{z}"); // SPA paper, Table A5.2
    }
}

/// Mutation fuzzing of the batch reader (see `tests/fuzz_readers.rs` for the harness and its
/// environment variables): every mutated CSV gives an output of finite numbers or an error naming a
/// row or the header, never a panic.
#[cfg(test)]
#[allow(dead_code)]
#[path = "../../../tests/fuzz/support.rs"]
mod support;

#[cfg(test)]
mod fuzz {
    use super::*;

    #[test]
    fn batch_reader_never_panics() {
        let seed = include_str!("../../../tests/fuzz/corpus/batch/rows.csv");
        let d = Defaults { atmosphere: Atmosphere::default(), delta_t: DeltaT::EspenakMeeus };
        let secs = std::env::var("SUNLOT_FUZZ_SECS").ok().and_then(|s| s.parse::<f64>().ok()).unwrap_or(4.0);
        let mut m = support::Mutator::new(0xba7c4);
        let (start, mut cases, mut accepted) = (std::time::Instant::now(), 0, 0);
        assert!(convert(seed, &d).is_ok());
        while start.elapsed().as_secs_f64() < secs {
            let input = m.mutate(seed);
            cases += 1;
            let outcome = std::panic::catch_unwind(|| convert(&input, &d));
            let Ok(result) = outcome else { panic!("batch case {cases} panicked on:\n{input}") };
            match result {
                Ok(out) => {
                    accepted += 1;
                    // Read back as CSV (fields may be quoted and hold line breaks): the last three
                    // fields of every row are finite numbers.
                    let mut rdr = csv::ReaderBuilder::new().flexible(true).from_reader(out.as_bytes());
                    for row in rdr.records() {
                        let row = row.unwrap_or_else(|e| panic!("output is not CSV ({e}) from:\n{input}"));
                        for x in row.iter().rev().take(3) {
                            let v: f64 = x.parse().unwrap_or_else(|_| panic!("{x:?} in {row:?} from:\n{input}"));
                            assert!(v.is_finite(), "{row:?} from:\n{input}");
                        }
                    }
                }
                Err(e) => assert!(e.contains("row") || e.contains("header") || e.contains("CSV"), "{e}"),
            }
        }
        println!("fuzz batch: {cases} cases, {accepted} accepted");
    }
}

#[cfg(test)]
mod split_tests {
    use super::*;

    #[test]
    fn parts_keep_every_row_in_order_with_true_line_numbers() {
        let d = Defaults { atmosphere: Atmosphere::default(), delta_t: DeltaT::Seconds(67.0) };
        let mut input = String::from("lat,lon,time\n");
        for k in 0..101 {
            input += &format!("{},{},2026-06-21T12:00:00Z\n", k % 90, k);
        }
        let out = convert(&input, &d).unwrap();
        let lons: Vec<i32> = out.lines().skip(1).map(|l| l.split(',').nth(1).unwrap().parse().unwrap()).collect();
        assert_eq!(lons, (0..101).collect::<Vec<_>>());
        let bad = input.replace("\n77,77,", "\n77,777,");
        assert_eq!(convert(&bad, &d).unwrap_err(), "row 78 (line 79): lon must be between -180 and 180, got 777");
    }
}
