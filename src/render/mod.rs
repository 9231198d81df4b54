//! Pictures: one drawing abstraction ([`Draw`]) with a raster back end that writes PNG
//! ([`Pixmap`]) and an SVG back end ([`Svg`]), so every figure drawn once can be exported either
//! way (a canvas back end in the browser implements the same trait). Figures: the heat map of any
//! exposure map and the sun-path diagram. They are composed in pixel coordinates, y down.

mod draw;
mod elevation;
mod heat_map;
mod layer;
mod pixmap;
mod plan;
mod plan_view;
mod ramp;
mod ramp_table;
mod restyle;
mod sky_chart;
mod svg;

pub use draw::{footnote, heading, text_width_px, wrap, Anchor, Colour, Draw, Image, INK, PAPER};
pub use elevation::{draw_elevation, elevation_size, Elevation, ELEVATION_PX};
pub use heat_map::{draw_heat_map, HeatMap, FIGURE_PX};
pub use layer::{draw_cells, draw_legend, MapLayer, LEGEND_PX};
pub use pixmap::Pixmap;
pub use plan::{site_bounds, site_outlines, Outline, OutlineKind, PlanFrame};
pub use plan_view::{draw_shadow_plan, PlanExtras, ShadowPlan};
pub use ramp::{ramp, ramp_colour};
pub use restyle::{Palette, Restyle};
pub use sky_chart::{draw_sky_chart, monthly_dates, Projection, SkyChart};
pub use svg::Svg;
