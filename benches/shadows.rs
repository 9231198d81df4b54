//! Criterion: the shadow union of 200 volumes at one sun position (target under 2 ms native), and one
//! volume's shadow. The side-by-side ratio against shapely is `benches/shadows_side_by_side.py`.

#[cfg(not(target_arch = "wasm32"))]
#[path = "support/grid_town.rs"]
mod grid_town;

#[cfg(not(target_arch = "wasm32"))]
mod native {
    use criterion::{black_box, Criterion};
    use geo::{Coord, Rect};
    use sunlot::shadow::{cast_shadows, shadow_offset_per_m, volume_shadow};

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
    }
}

#[cfg(not(target_arch = "wasm32"))]
criterion::criterion_group!(benches, native::benches);
#[cfg(not(target_arch = "wasm32"))]
criterion::criterion_main!(benches);

#[cfg(target_arch = "wasm32")]
fn main() {}
