//! Exposure over areas: analysis grids, exact rasterising of shadow polygons at cell centres, and
//! hours of direct sun per cell.

mod grid;
mod raster;
mod sun_hours;

pub use grid::{ExposureError, Grid, DEFAULT_MAX_CELLS};
pub use raster::{polygon_row_spans, RowSpans};
pub use sun_hours::{sun_hours, Massing, SunHours, SunHoursRequest, Window};
