//! Daylight at windows and on planes: the sky component under the CIE standard overcast sky (the
//! vertical sky component of a window, and its horizontal counterpart).

mod sky_component;

pub use sky_component::{
    overcast_relative_luminance, sky_component_pct, SkyPlane, DEFAULT_AZIMUTH_STEP_DEG, UNOBSTRUCTED_VERTICAL_PCT,
};
