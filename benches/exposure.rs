//! Criterion: sun-hours maps of the 50-block town on a 500 × 500 grid (0.2 m cells over 100 m):
//! one equinox day at 5-minute steps (target under 20 ms on two cores) and a full year at
//! 15-minute steps (target under 2 s). The ratio against a per-cell ray test, cell-steps per
//! second and peak memory are printed by `cargo run --release --example exposure_timing`.

#[cfg(not(target_arch = "wasm32"))]
#[path = "support/town50.rs"]
mod town50;

#[cfg(not(target_arch = "wasm32"))]
mod native {
    use chrono::NaiveDate;
    use criterion::Criterion;
    use sunlot::exposure::{sun_hours, Massing, Period, SunHoursRequest, Window};
    use sunlot::time::DeltaT;

    pub fn benches(c: &mut Criterion) {
        let m = super::town50::site();
        let g = super::town50::grid(&m);
        let day = NaiveDate::from_ymd_opt(2026, 3, 20).unwrap();
        let req = |period| SunHoursRequest {
            model: &m,
            grid: &g,
            period,
            plane_m: 0.0,
            delta_t: DeltaT::EspenakMeeus,
            massing: Massing::WithProposed,
        };
        let day_req = req(Period::day(day, 5));
        c.bench_function("sun_hours_500x500_50_volumes_day_5min", |b| {
            b.iter(|| sun_hours(&day_req, |_| true).unwrap())
        });
        let year = Period {
            first: NaiveDate::from_ymd_opt(2026, 1, 1).unwrap(),
            last: NaiveDate::from_ymd_opt(2026, 12, 31).unwrap(),
            window: Window::Daylight,
            step_min: 15,
        };
        let year_req = req(year);
        let mut group = c.benchmark_group("year");
        group.sample_size(10);
        group.bench_function("sun_hours_500x500_50_volumes_year_15min", |b| {
            b.iter(|| sun_hours(&year_req, |_| true).unwrap())
        });
        group.finish();
    }
}

#[cfg(not(target_arch = "wasm32"))]
criterion::criterion_group!(benches, native::benches);
#[cfg(not(target_arch = "wasm32"))]
criterion::criterion_main!(benches);

#[cfg(target_arch = "wasm32")]
fn main() {}
