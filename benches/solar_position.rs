//! Criterion benchmarks of the solar engine: positions per second, one instant per position and many
//! sites sharing one instant. Ratios against pvlib are measured by `benches/side_by_side.py`.

#[cfg(not(target_arch = "wasm32"))]
mod native {
    use chrono::{Duration, TimeZone, Utc};
    use criterion::{black_box, Criterion, Throughput};
    use sunlot::solar::{day_events, solar_position, Atmosphere, Ephemeris, Site, SunAtInstant};
    use sunlot::time::{DeltaT, Zone};

    pub fn benches(c: &mut Criterion) {
        let site = Site::new(52.62, -1.87, 118.0).unwrap();
        let air = Atmosphere::default();
        let t0 = Utc.with_ymd_and_hms(2026, 6, 21, 0, 0, 0).unwrap();
        let times: Vec<_> = (0..1000).map(|k| t0 + Duration::minutes(k * 7)).collect();

        let mut g = c.benchmark_group("solar_position");
        g.throughput(Throughput::Elements(times.len() as u64));
        g.bench_function("distinct_instants", |b| {
            b.iter(|| {
                for &t in &times {
                    black_box(solar_position(&site, t, &air, DeltaT::EspenakMeeus).unwrap());
                }
            })
        });
        g.bench_function("distinct_instants_hourly_ephemeris", |b| {
            b.iter(|| {
                let mut eph = Ephemeris::new();
                for &t in &times {
                    black_box(eph.sun_at(t, DeltaT::EspenakMeeus).unwrap().observe(&site, &air));
                }
            })
        });
        let sites: Vec<_> =
            (0..1000).map(|k| Site::new(-60.0 + 0.12 * k as f64, 0.3 * k as f64 - 150.0, 0.0).unwrap()).collect();
        g.bench_function("shared_instant_1000_sites", |b| {
            b.iter(|| {
                let sun = SunAtInstant::new(t0, DeltaT::EspenakMeeus).unwrap();
                for s in &sites {
                    black_box(sun.observe(s, &air));
                }
            })
        });
        g.finish();

        let zone: Zone = "Europe/London".parse().unwrap();
        c.bench_function("day_events", |b| {
            b.iter(|| day_events(&site, black_box(t0.date_naive()), &zone, DeltaT::EspenakMeeus).unwrap())
        });
    }
}

#[cfg(not(target_arch = "wasm32"))]
criterion::criterion_group!(benches, native::benches);
#[cfg(not(target_arch = "wasm32"))]
criterion::criterion_main!(benches);

#[cfg(target_arch = "wasm32")]
fn main() {}
