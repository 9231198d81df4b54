//! Daylight at windows and on planes: the sky component under the CIE standard overcast sky (the
//! vertical sky component of a window, and its horizontal counterpart), and the isotropic sky's view
//! factor of a plane (for diffuse irradiance).

mod sky_component;

pub use sky_component::{
    isotropic_sky_view, overcast_relative_luminance, sky_component_pct, SkyPlane, DEFAULT_AZIMUTH_STEP_DEG,
    UNOBSTRUCTED_VERTICAL_PCT,
};
