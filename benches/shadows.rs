//! Criterion: the shadow union of 200 volumes at one sun position (target under 2 ms native), one
//! volume's shadow, and the vertical sky component of 50 windows against the demo massing (target
//! under 100 ms native). The side-by-side ratio against shapely is `benches/shadows_side_by_side.py`.

#[cfg(not(target_arch = "wasm32"))]
#[path = "support/grid_town.rs"]
mod grid_town;

#[cfg(not(target_arch = "wasm32"))]
mod native {
    use criterion::{black_box, Criterion};
    use geo::{Coord, Rect};
    use sunlot::daylight::{sky_component_pct, SkyPlane, DEFAULT_AZIMUTH_STEP_DEG};
    use sunlot::exposure::Massing;
    use sunlot::shadow::{cast_shadows, shadow_offset_per_m, volume_shadow, ViewPoint};

    pub fn benches(c: &mut Criterion) {
        let town = super::grid_town::grid();
        let extent = Rect::new(Coord { x: -10_000.0, y: -10_000.0 }, Coord { x: 10_000.0, y: 10_000.0 });
        c.bench_function("shadow_union_200_volumes", |b| {
            b.iter(|| {
                cast_shadows(black_box(&town), &[], 200.0, 25.0, &sunlot::shadow::Receiver::flat_ground(), extent)
                    .unwrap()
            })
        });
        let o = shadow_offset_per_m(200.0, 25.0).unwrap();
        c.bench_function("one_volume_shadow", |b| b.iter(|| volume_shadow(black_box(&town[0]), o, 0.0)));
        // 50 windows on the neighbours' rear walls (y = 12, facing north) and the front of 9 Weir Close
        // (y = 63, facing south), at ground and first floor.
        let demo = sunlot::demo::demo();
        let windows: Vec<(ViewPoint, f64)> = (0..50)
            .map(|k| {
                let (x, z) = (-13.0 + (k % 25) as f64 * 2.5, if k % 2 == 0 { 1.2 } else { 4.0 });
                if k < 25 {
                    (ViewPoint { x_m: x, y_m: 12.0, z_m: z }, 0.0)
                } else {
                    (ViewPoint { x_m: 3.5 + (k % 25) as f64 * 0.85, y_m: 63.0, z_m: z }, 180.0)
                }
            })
            .collect();
        c.bench_function("vsc_50_windows_demo", |b| {
            b.iter(|| {
                windows
                    .iter()
                    .map(|&(p, facing)| {
                        sky_component_pct(
                            black_box(&demo),
                            p,
                            SkyPlane::Vertical { facing_deg: facing },
                            Massing::WithProposed,
                            DEFAULT_AZIMUTH_STEP_DEG,
                        )
                        .unwrap()
                    })
                    .sum::<f64>()
            })
        });
    }
}

#[cfg(not(target_arch = "wasm32"))]
criterion::criterion_group!(benches, native::benches);
#[cfg(not(target_arch = "wasm32"))]
criterion::criterion_main!(benches);

#[cfg(target_arch = "wasm32")]
fn main() {}
