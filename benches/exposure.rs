//! Criterion: sun-hours maps of the 50-block town on a 500 × 500 grid (0.2 m cells over 100 m):
//! one equinox day at 5-minute steps (target under 20 ms on two cores) and a full year at
//! 15-minute steps (target under 2 s). The ratio against a per-cell ray test, cell-steps per
//! second and peak memory are printed by `cargo run --release --example exposure_timing`. Also the
//! demo's five windows against BR 209's year test at 10-minute steps, and the facade map of one
//! demo building (1 m cells, an equinox day at 5-minute steps, with sky diffuse).

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
        let demo = sunlot::demo::demo();
        let sunlot::rules::AnyRule::Window(rule) = sunlot::rules::preset("bre-br209-window-sun").unwrap() else {
            unreachable!("a window preset")
        };
        let windows = sunlot::rules::WindowCheckRequest {
            model: &demo,
            rule: &rule,
            year: 2026,
            step_min: 10,
            azimuth_step_deg: 0.25,
            delta_t: DeltaT::EspenakMeeus,
        };
        group.bench_function("window_year_test_demo_5_windows_10min", |b| {
            b.iter(|| sunlot::rules::check_windows(&windows, |_| true).unwrap())
        });
        group.finish();
        let steps =
            sunlot::exposure::SunSteps::of(&demo, &Period::day(day, 5), DeltaT::EspenakMeeus, |_| true).unwrap();
        let facade = sunlot::exposure::FacadeRequest {
            model: &demo,
            volume_id: "terrace-east",
            cell_m: 1.0,
            massing: Massing::WithProposed,
            delta_t: DeltaT::EspenakMeeus,
            atmosphere: sunlot::sky::BirdAtmosphere::default(),
        };
        c.bench_function("facade_terrace_east_1m_day_5min", |b| {
            b.iter(|| sunlot::exposure::facade_map(&facade, &steps, |_| true).unwrap())
        });
    }
}

#[cfg(not(target_arch = "wasm32"))]
criterion::criterion_group!(benches, native::benches);
#[cfg(not(target_arch = "wasm32"))]
criterion::criterion_main!(benches);

#[cfg(target_arch = "wasm32")]
fn main() {}
