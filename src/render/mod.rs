//! Pictures: one drawing abstraction ([`Draw`]) with an SVG back end ([`Svg`]) and, natively, a raster
//! back end that rasterises that same SVG with an embedded font and writes PNG (`Pixmap`), so every
//! figure drawn once can be exported either way (a canvas back end in the browser implements the same
//! trait). Figures: the heat map of any
//! exposure map and the sun-path diagram. They are composed in pixel coordinates, y down.

mod cut;
mod draw;
mod elevation;
mod font_widths;
mod hatch;
mod heat_map;
mod labels;
mod layer;
mod massing_view;
#[cfg(not(target_arch = "wasm32"))]
mod pixmap;
mod plan;
mod plan_view;
#[cfg(not(target_arch = "wasm32"))]
mod png;
mod ramp;
mod ramp_table;
mod restyle;
mod sky_chart;
mod svg;
mod verdict_plan;

pub use draw::{
    footnote, footnote_px, heading, text_width_px, titled, wrap, Anchor, Colour, Draw, Image, FONT_FAMILY, INK,
    LABEL_PX, MUTED, PAPER, TEXT_PX, TITLE_PX,
};
pub use elevation::{draw_elevation, elevation_size, Elevation, ELEVATION_PX};
pub use hatch::hatch_segments;
pub use heat_map::{draw_heat_map, HeatMap, FIGURE_PX};
pub use labels::LabelPlacer;
pub use layer::{draw_cells, draw_legend, MapLayer, LEGEND_PX};
pub use massing_view::{draw_massing_view, MassingLight, MassingView, VIEW_PX};
#[cfg(not(target_arch = "wasm32"))]
pub use pixmap::{rasterise_svg, Pixmap, Raster, RasterError};
pub use plan::{site_bounds, site_outlines, Outline, OutlineKind, PlanFrame};
pub use plan_view::{draw_shadow_plan, PlanExtras, ShadowPlan};
#[cfg(not(target_arch = "wasm32"))]
pub use png::encode_png;
pub use ramp::{ramp, ramp_colour};
pub use restyle::{Palette, Restyle};
pub use sky_chart::{draw_sky_chart, monthly_dates, Projection, SkyChart, SkyChartError, SkyChartRequest};
pub use svg::{ImageEncoder, Svg};
pub use verdict_plan::{draw_verdict_plan, AreaVerdict, VerdictPlan, FAILS, PASSES};
