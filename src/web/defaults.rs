//! The defaults of the module's requests, as serde default functions over the core's constants (the
//! CLI's clap defaults read the same constants: one place for each).

use crate::envelope::{DEFAULT_ENVELOPE_CELL_M, DEFAULT_HEIGHT_STEP_M, DEFAULT_MAX_HEIGHT_M};
use crate::exposure::{DEFAULT_CELL_M, DEFAULT_FACADE_CELL_M, DEFAULT_LONG_STEP_MIN, DEFAULT_STEP_MIN};

/// [`DEFAULT_CELL_M`]: ground maps and rule checks.
pub(super) fn cell_m() -> f64 {
    DEFAULT_CELL_M
}

/// [`DEFAULT_STEP_MIN`]: a day's map, a rule check, a window's light.
pub(super) fn step_min() -> u32 {
    DEFAULT_STEP_MIN
}

/// [`DEFAULT_LONG_STEP_MIN`]: facades, a point's year, the envelope.
pub(super) fn long_step_min() -> u32 {
    DEFAULT_LONG_STEP_MIN
}

/// [`crate::shadow::DEFAULT_TABLE_STEP_MIN`]: a day's shadow table.
pub(super) fn table_step_min() -> u32 {
    crate::shadow::DEFAULT_TABLE_STEP_MIN
}

/// [`DEFAULT_FACADE_CELL_M`].
pub(super) fn facade_cell_m() -> f64 {
    DEFAULT_FACADE_CELL_M
}

/// [`DEFAULT_ENVELOPE_CELL_M`].
pub(super) fn envelope_cell_m() -> f64 {
    DEFAULT_ENVELOPE_CELL_M
}

/// [`DEFAULT_MAX_HEIGHT_M`].
pub(super) fn max_height_m() -> f64 {
    DEFAULT_MAX_HEIGHT_M
}

/// [`DEFAULT_HEIGHT_STEP_M`].
pub(super) fn height_step_m() -> f64 {
    DEFAULT_HEIGHT_STEP_M
}
