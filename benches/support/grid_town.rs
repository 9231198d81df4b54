//! The benchmark town: 200 blocks on a 20 × 10 grid (12 × 10 m plots 18 m apart east-west and 16 m
//! north-south, every third one L-shaped, heights 6–30 m). `benches/shadows_side_by_side.py` builds the
//! same one.

use sunlot::site::{Status, Volume};

/// The 200 blocks.
pub fn grid() -> Vec<Volume> {
    let mut out = Vec::new();
    for i in 0..20 {
        for j in 0..10 {
            let (x, y) = (f64::from(i) * 18.0, f64::from(j) * 16.0);
            let h = 6.0 + f64::from((i * 7 + j * 13) % 25);
            let xy: Vec<(f64, f64)> = if (i + j) % 3 == 0 {
                vec![(x, y), (x + 12.0, y), (x + 12.0, y + 4.0), (x + 5.0, y + 4.0), (x + 5.0, y + 10.0), (x, y + 10.0)]
            } else {
                vec![(x, y), (x + 12.0, y), (x + 12.0, y + 10.0), (x, y + 10.0)]
            };
            out.push(Volume::from_vertices(&format!("g{i}-{j}"), Status::Existing, &xy, 0.0, h).unwrap());
        }
    }
    out
}
