//! Pictures: one drawing abstraction ([`Draw`]) with a raster back end that writes PNG
//! ([`Pixmap`]) and an SVG back end ([`Svg`]), so every figure drawn once can be exported either
//! way (a canvas back end in the browser implements the same trait). Figures are composed in
//! pixel coordinates, y down.

mod draw;
mod heat_map;
mod pixmap;
mod ramp;
mod ramp_table;
mod svg;

pub use draw::{text_width_px, wrap, Anchor, Colour, Draw, Image};
pub use heat_map::{draw_heat_map, HeatMap, Outline, OutlineKind, FIGURE_PX};
pub use pixmap::Pixmap;
pub use ramp::{ramp, ramp_colour};
pub use svg::Svg;
