//! Shadows of massing: exact ground polygons and their union, shadow lengths, and exact ray tests for
//! points at height with the obstruction skyline they see.
//!
//! The shadow of a solid on a plane is the union of the shadows of its faces (a ray from a ground point
//! toward the sun that meets the solid meets its boundary). For an extruded footprint the faces are the
//! top, the underside and one wall quadrilateral per edge of every ring, holes included, so a courtyard
//! fills with the shadow of its own walls as the sun lowers. Unions are `geo`'s boolean operations.

mod cast;
mod geojson_out;
mod ground;
mod ray;
mod study;
mod table;

pub use cast::{
    cast_shadows, shadow_length_per_m, shadow_offset_per_m, volume_shadow, wall_shadow, ShadowError, Shadows,
};
pub use geojson_out::study_geojson;
pub use ground::{volume_faces_on, volume_levels_m, volume_shadow_on, wall_faces_on, wall_shadow_on, Receiver};
pub use ray::{exposure, skyline, Exposure, ViewPoint};
pub use study::{analysis_extent, shadow_study, AreaShade, Study, StudyError, EXTENT_HEIGHTS, MIN_MARGIN_M};
pub use table::{shadow_table, ShadowRow, DEFAULT_TABLE_STEP_MIN};
