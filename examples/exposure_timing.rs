//! Times the sun-hours map of the benchmark town (50 blocks, 500 × 500 cells of 0.2 m) against a
//! straightforward per-cell ray test of the same map, and prints medians, cell-steps per second, the
//! ratio and the peak memory. Run: cargo run --release --example exposure_timing

use std::time::Instant;

use chrono::NaiveDate;
use sunlot::exposure::{sun_hours, Massing, Period, SunHoursRequest, Window, MIN_CAST_ALTITUDE_DEG};
use sunlot::shadow::{exposure, Exposure, Receiver, ViewPoint};
use sunlot::solar::Ephemeris;
use sunlot::time::DeltaT;

#[path = "../benches/support/town50.rs"]
mod town50;

fn median(mut v: Vec<f64>) -> f64 {
    v.sort_by(f64::total_cmp);
    v[v.len() / 2]
}

fn peak_rss_mb() -> Option<f64> {
    let s = std::fs::read_to_string("/proc/self/status").ok()?;
    let line = s.lines().find(|l| l.starts_with("VmHWM:"))?;
    Some(line.split_whitespace().nth(1)?.parse::<f64>().ok()? / 1024.0)
}

fn main() {
    let m = town50::site();
    let g = town50::grid(&m);
    let cells = (g.cols * g.rows) as f64;
    let req = |period| SunHoursRequest {
        model: &m,
        grid: &g,
        period,
        plane_m: 0.0,
        delta_t: DeltaT::EspenakMeeus,
        massing: Massing::WithProposed,
    };
    let date = NaiveDate::from_ymd_opt(2026, 3, 20).unwrap();
    let day = req(Period::day(date, 5));
    let mut steps = 0;
    let day_s = median(
        (0..9)
            .map(|_| {
                let t = Instant::now();
                steps = sun_hours(&day, |_| true).unwrap().steps;
                t.elapsed().as_secs_f64()
            })
            .collect(),
    );
    let map_rate = cells * steps as f64 / day_s;
    println!("day (equinox, 5 min): {steps} steps, median {:.1} ms, {:.2e} cell-steps/s", day_s * 1e3, map_rate);

    // The same day by the ray test from each cell centre, on every 10th row and column.
    let mut eph = Ephemeris::new();
    let suns: Vec<_> = day
        .period
        .steps_of(&m, date, DeltaT::EspenakMeeus, &mut eph)
        .unwrap()
        .iter()
        .map(|s| (m.plan_azimuth_deg(s.sun.azimuth_deg), s.sun.altitude_deg.max(MIN_CAST_ALTITUDE_DEG)))
        .collect();
    let ground = Receiver::flat_ground();
    let sample: Vec<_> = (0..g.rows).step_by(10).flat_map(|r| (0..g.cols).step_by(10).map(move |c| (c, r))).collect();
    let ray_s = median(
        (0..3)
            .map(|_| {
                let t = Instant::now();
                let mut lit = 0usize;
                for &(c, r) in &sample {
                    let p = g.centre(c, r);
                    let vp = ViewPoint { x_m: p.x, y_m: p.y, z_m: 0.0 };
                    for &(az, alt) in &suns {
                        if exposure(vp, &m.volumes, &m.walls, &ground, az, alt).unwrap() == Exposure::Sunlit {
                            lit += 1;
                        }
                    }
                }
                std::hint::black_box(lit);
                t.elapsed().as_secs_f64()
            })
            .collect(),
    );
    let ray_rate = (sample.len() * suns.len()) as f64 / ray_s;
    println!(
        "per-cell ray test (one thread, {} cells sampled): {:.2e} cell-steps/s; the whole map would take {:.1} s",
        sample.len(),
        ray_rate,
        cells * steps as f64 / ray_rate
    );
    println!("ratio: the map is {:.0}× faster per cell-step than the ray test", map_rate / ray_rate);

    let year = req(Period {
        first: NaiveDate::from_ymd_opt(2026, 1, 1).unwrap(),
        last: NaiveDate::from_ymd_opt(2026, 12, 31).unwrap(),
        window: Window::Daylight,
        step_min: 15,
    });
    let year_s = median(
        (0..3)
            .map(|_| {
                let t = Instant::now();
                steps = sun_hours(&year, |_| true).unwrap().steps;
                t.elapsed().as_secs_f64()
            })
            .collect(),
    );
    println!(
        "year (15 min): {steps} steps, median {:.2} s, {:.2e} cell-steps/s",
        year_s,
        cells * steps as f64 / year_s
    );
    if let Some(mb) = peak_rss_mb() {
        println!("peak resident memory: {mb:.0} MB");
    }
}
