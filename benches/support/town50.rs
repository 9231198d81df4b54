//! The exposure benchmark's case: the invented 50-block town of `benches/data/town50.site.json`
//! (written by `benches/make_town50.py`) and a 500 × 500 grid of 0.2 m cells over its 100 m square.

use sunlot::exposure::{Grid, DEFAULT_MAX_CELLS};
use sunlot::site::SiteModel;

/// The site.
pub fn site() -> SiteModel {
    SiteModel::from_json(include_str!("../data/town50.site.json")).expect("the benchmark site reads")
}

/// The 500 × 500 grid.
pub fn grid(m: &SiteModel) -> Grid {
    let g = Grid::over_polygon(&m.areas[0].polygon, 0.2, DEFAULT_MAX_CELLS).expect("grid");
    assert_eq!((g.cols, g.rows), (500, 500));
    g
}
