//! Reference images: each figure the command line writes, compared with a stored PNG of it
//! (tests/reference_images/), in the manner of renderer test suites (resvg's, for one): decoded and
//! compared pixel by pixel with a tolerance, so a change of look shows up as a failing test with the
//! new picture and a difference image beside it, and is taken on purpose by regenerating:
//!
//! ```text
//! SUNLOT_BLESS_IMAGES=1 cargo test --test reference_images
//! ```
//!
//! The figures are drawn from SVG by resvg with the font embedded in the binary, so they do not
//! depend on the fonts of the machine. The tolerance (a channel 24 levels off, on at most 0.01 % of
//! the pixels) takes anti-aliasing noise between builds of the rasteriser, not a moved line or label.

#![cfg(not(target_arch = "wasm32"))]

use std::path::{Path, PathBuf};
use std::process::Command;

/// A pixel differs when any channel is more than this many levels (of 255) off.
const CHANNEL_TOLERANCE: u8 = 24;
/// A figure passes while no more than this share of its pixels differ.
const MAX_DIFFERING_SHARE: f64 = 1e-4;

/// Each figure: its name and the command that writes it (the PNG path is appended after `--png`).
const FIGURES: &[(&str, &[&str])] = &[
    ("shadow-plan", &["shadows", "--demo", "--local", "2026-03-21T15:00", "--format", "table"]),
    // A low winter sun: the frame grown toward the shadows, and a break line where they still run on.
    ("shadow-plan-cut", &["shadows", "--demo", "--local", "2026-12-21T09:00", "--format", "table"]),
    ("sun-path", &["sky", "--demo", "--year", "2026", "--at", "14,41,1.5", "--local", "2026-06-21T15:00"]),
    (
        "hours-lost",
        &["compare", "--demo", "--date", "2026-03-21", "--cell-m", "1", "--step-min", "15", "--format", "csv"],
    ),
    (
        "facade-lost",
        &[
            "facade",
            "--demo",
            "--volume",
            "terrace-east",
            "--date",
            "2026-03-21",
            "--show",
            "lost",
            "--step-min",
            "30",
            "--cell-m",
            "1",
            "--format",
            "csv",
        ],
    ),
    // A rule stricter than any preset (invented for the test), so areas pass and fail.
    (
        "rule-check",
        &[
            "check",
            "--demo",
            "--year",
            "2026",
            "--cell-m",
            "1",
            "--step-min",
            "30",
            "--quiet",
            "--rule-file",
            "tests/fixtures/strict_garden_rule.json",
        ],
    ),
    // The 3-D view: a parallel view from the south-west and a perspective from the north-east.
    ("massing-view", &["view", "--demo", "--local", "2026-03-21T15:00"]),
    (
        "massing-view-perspective",
        &[
            "view",
            "--demo",
            "--local",
            "2026-03-21T10:00",
            "--view-from-deg",
            "40",
            "--view-elevation-deg",
            "30",
            "--perspective-m",
            "120",
        ],
    ),
    // With the lot's solar envelope as translucent steps.
    (
        "massing-view-envelope",
        &["view", "--demo", "--local", "2026-03-21T11:00", "--view-from-deg", "160", "--envelope-lot", "lot-14"],
    ),
    (
        "envelope",
        &[
            "envelope",
            "--demo",
            "--lot",
            "lot-14",
            "--date",
            "2026-03-21",
            "--window",
            "09:00-15:00",
            "--cell-m",
            "2",
            "--step-min",
            "30",
            "--format",
            "csv",
        ],
    ),
];

fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

struct Image {
    width: u32,
    height: u32,
    rgba: Vec<u8>,
}

fn decode(path: &Path) -> Image {
    let file = std::fs::File::open(path).unwrap_or_else(|e| panic!("{}: {e}", path.display()));
    let mut decoder = png::Decoder::new(std::io::BufReader::new(file));
    decoder.set_transformations(png::Transformations::normalize_to_color8() | png::Transformations::ALPHA);
    let mut reader = decoder.read_info().unwrap();
    let mut buf = vec![0; reader.output_buffer_size().unwrap()];
    let info = reader.next_frame(&mut buf).unwrap();
    buf.truncate(info.buffer_size());
    let rgba = match info.color_type {
        png::ColorType::Rgba => buf,
        png::ColorType::GrayscaleAlpha => buf.chunks(2).flat_map(|p| [p[0], p[0], p[0], p[1]]).collect(),
        other => panic!("{}: unexpected colour type {other:?}", path.display()),
    };
    Image { width: info.width, height: info.height, rgba }
}

fn encode(path: &Path, image: &Image) {
    let file = std::fs::File::create(path).unwrap();
    let mut e = png::Encoder::new(std::io::BufWriter::new(file), image.width, image.height);
    e.set_color(png::ColorType::Rgba);
    e.set_depth(png::BitDepth::Eight);
    e.write_header().unwrap().write_image_data(&image.rgba).unwrap();
}

/// The number of differing pixels, and an image of them (red where they differ, faded elsewhere).
fn compare(want: &Image, got: &Image) -> (usize, Image) {
    let mut diff = Vec::with_capacity(got.rgba.len());
    let mut differing = 0;
    for (w, g) in want.rgba.chunks(4).zip(got.rgba.chunks(4)) {
        let off = w.iter().zip(g).any(|(a, b)| a.abs_diff(*b) > CHANNEL_TOLERANCE);
        if off {
            differing += 1;
            diff.extend([220, 0, 0, 255]);
        } else {
            let grey = 255 - (255 - g[0].min(g[1]).min(g[2])) / 4;
            diff.extend([grey, grey, grey, 255]);
        }
    }
    (differing, Image { width: got.width, height: got.height, rgba: diff })
}

#[test]
fn every_figure_matches_its_reference_image() {
    let bless = std::env::var_os("SUNLOT_BLESS_IMAGES").is_some();
    let stored = root().join("tests/reference_images");
    let out = root().join("target/reference-images");
    std::fs::create_dir_all(&out).unwrap();
    let mut failures = Vec::new();
    for (name, args) in FIGURES {
        let got_path = out.join(format!("{name}.png"));
        let o = Command::new(env!("CARGO_BIN_EXE_sunlot"))
            .args(*args)
            .arg("--png")
            .arg(&got_path)
            .output()
            .expect("sunlot runs");
        assert!(o.status.success(), "{name}: {}", String::from_utf8_lossy(&o.stderr));
        let want_path = stored.join(format!("{name}.png"));
        if bless {
            std::fs::copy(&got_path, &want_path).unwrap();
            eprintln!("blessed {}", want_path.display());
            continue;
        }
        assert!(
            want_path.exists(),
            "{name}: no reference image at {}; make it with SUNLOT_BLESS_IMAGES=1 and look at it",
            want_path.display()
        );
        let (want, got) = (decode(&want_path), decode(&got_path));
        if (want.width, want.height) != (got.width, got.height) {
            failures.push(format!(
                "{name}: {}×{} px, the reference is {}×{} px ({})",
                got.width,
                got.height,
                want.width,
                want.height,
                got_path.display()
            ));
            continue;
        }
        let (differing, diff) = compare(&want, &got);
        let share = differing as f64 / f64::from(got.width * got.height);
        if share > MAX_DIFFERING_SHARE {
            let diff_path = out.join(format!("{name}-diff.png"));
            encode(&diff_path, &diff);
            failures.push(format!(
                "{name}: {differing} pixels ({:.3} %) differ from the reference; see {} and {}",
                100.0 * share,
                got_path.display(),
                diff_path.display()
            ));
        }
    }
    assert!(
        failures.is_empty(),
        "{}\n(if the change of look is meant, regenerate with SUNLOT_BLESS_IMAGES=1 and look at the images)",
        failures.join("\n")
    );
}

/// The comparison itself: equal images pass, a moved block fails, noise within the tolerance passes.
#[test]
fn the_comparison_tells_a_change_from_noise() {
    let blank = Image { width: 100, height: 100, rgba: vec![255; 100 * 100 * 4] };
    let (n, _) = compare(&blank, &blank);
    assert_eq!(n, 0);
    let mut noisy = Image { width: 100, height: 100, rgba: blank.rgba.clone() };
    for (k, v) in noisy.rgba.iter_mut().enumerate() {
        *v -= (k % 7) as u8 * 3; // at most 18 levels off
    }
    assert_eq!(compare(&blank, &noisy).0, 0);
    let mut moved = Image { width: 100, height: 100, rgba: blank.rgba.clone() };
    for y in 10..20 {
        for x in 10..30 {
            moved.rgba[(y * 100 + x) * 4..][..3].copy_from_slice(&[0, 0, 0]);
        }
    }
    let (n, _) = compare(&blank, &moved);
    assert_eq!(n, 200);
    assert!(n as f64 / 10_000.0 > MAX_DIFFERING_SHARE);
}
