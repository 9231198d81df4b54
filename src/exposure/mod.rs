//! Exposure over areas: analysis grids, exact rasterising of shadow polygons at cell centres, hours
//! of direct sun, sky-view factors and clear-sky insolation per cell, before and after a proposal,
//! and the periods they run over; a point's day and year, and a window's hours of direct sun.

mod cell_values;
mod compare;
mod cover;
mod facade;
mod geojson_out;
mod grid;
mod insolation;
mod map_kind;
mod period;
mod raster;
mod shade;
mod sky_view;
mod sun_hours;
mod tile_file;
mod tiles;
mod timeline;
mod window_sun;
mod year_profile;

pub use cell_values::CellValues;
pub use compare::{before_after, map_stats, BeforeAfter, MapStats};
pub use cover::MIN_COVER;
pub use facade::{
    facade_map, faces_of, FacadeLayer, FacadeRequest, Face, FaceMap, FaceWindow, DEFAULT_FACADE_CELL_M,
    FACADE_SKY_STEP_DEG, MAX_FACADE_CELLS, SAMPLE_OFFSET_M,
};
pub use geojson_out::{map_geojson, MapColumn};
pub use grid::{ExposureError, Grid, DEFAULT_MAX_CELLS};
pub use insolation::{insolation, Insolation, InsolationRequest, OpenSky};
pub use map_kind::{map_kind, MapCall, MapKind, MapSpan, RangeTop, MAP_KINDS};
pub use period::{Period, Step, Window, WindowError, DEFAULT_CELL_M, DEFAULT_LONG_STEP_MIN, DEFAULT_STEP_MIN};
pub use raster::{polygon_row_spans, RowSpans};
pub use shade::Massing;
pub use sky_view::{sky_patches, sky_view_at, sky_view_map, SkyPatch, DEFAULT_SKY_STEP_DEG};
pub(crate) use sun_hours::step_offset;
pub use sun_hours::{sun_hours, sunlit_ms, StepShare, SunHours, SunHoursRequest, SunlitMs, MIN_CAST_ALTITUDE_DEG};
pub use tile_file::{read_tile, stitch_tiles, tile_bytes, TileFileError, TileValues, TILE_HEADER_BYTES, TILE_MAGIC};
pub use tiles::{massing_near, shadow_halo, shadow_halo_m, Halo};
pub use timeline::{day_timeline, Interval, Timeline};
pub use window_sun::{in_front_of_wall, window_sun_hours, SunSteps, WindowAim, WindowSun};
pub use year_profile::{year_profile, MonthProfile, YearProfile, YearProfileRequest};
