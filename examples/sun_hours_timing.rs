//! Times a sun-hours map of the demo site: a 500 × 500 grid (0.2 m cells over 100 m × 100 m), one day
//! at 5-minute steps. Prints the median of 5 runs and the cell-steps per second.
//! Run: cargo run --release --example sun_hours_timing

use std::time::Instant;

use chrono::NaiveDate;
use geo::{LineString, Polygon};
use sunlot::exposure::{sun_hours, Grid, Period, SunHoursRequest, DEFAULT_MAX_CELLS};
use sunlot::time::DeltaT;

fn main() {
    let m = sunlot::demo::demo();
    let square = Polygon::new(
        LineString::from(vec![(-30.0, -20.0), (70.0, -20.0), (70.0, 80.0), (-30.0, 80.0), (-30.0, -20.0)]),
        vec![],
    );
    let g = Grid::over_polygon(&square, 0.2, DEFAULT_MAX_CELLS).unwrap();
    for (label, date) in [
        ("equinox", NaiveDate::from_ymd_opt(2026, 3, 20).unwrap()),
        ("winter", NaiveDate::from_ymd_opt(2026, 12, 21).unwrap()),
    ] {
        let req = SunHoursRequest {
            model: &m,
            grid: &g,
            period: Period::day(date, 5),
            plane_m: 0.0,
            delta_t: DeltaT::EspenakMeeus,
            massing: sunlot::exposure::Massing::WithProposed,
        };
        let mut times = Vec::new();
        let mut steps = 0;
        for _ in 0..5 {
            let t = Instant::now();
            steps = sun_hours(&req, |_| true).unwrap().steps;
            times.push(t.elapsed().as_secs_f64());
        }
        times.sort_by(f64::total_cmp);
        let med = times[2];
        let cell_steps = (g.cols * g.rows * steps) as f64;
        println!(
            "{label}: {} × {} cells, {steps} steps, median {:.1} ms, {:.2e} cell-steps/s",
            g.cols,
            g.rows,
            med * 1e3,
            cell_steps / med
        );
    }
}
