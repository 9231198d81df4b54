//! A lot's solar envelope for the 3-D view: Knowles' envelope ([`crate::envelope::solar_envelope`])
//! with the envelope command's defaults (cells, step, cap, height step), keeping shadows off the
//! site's other gardens, terraces and amenity areas, as treads every `band_m` metres.

use chrono::NaiveDate;

use super::scene::{envelope_faces, Face3};
use crate::envelope::{default_protected, height_bands, solar_envelope, EnvelopeRequest};
use crate::exposure::{Grid, Period, Window, DEFAULT_LONG_STEP_MIN, DEFAULT_MAX_CELLS};
use crate::site::SiteModel;
use crate::time::DeltaT;

/// Why an envelope cannot be shown.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum EnvelopeViewError {
    /// No area of that id.
    #[error("the site has no area {0:?}")]
    NoLot(String),
    /// Nothing for the envelope to keep shadows off.
    #[error("the site has no gardens, terraces or amenity areas besides the lot to keep shadows off")]
    NothingProtected,
    /// The envelope's computation refused the request.
    #[error("{0}")]
    Envelope(String),
}

/// The treads of the envelope of lot `lot_id` on `date` in the daily `window`, every `band_m` metres.
///
/// # Errors
/// [`EnvelopeViewError`] for an unknown lot, nothing to protect, or a request the envelope refuses.
pub fn envelope_treads(
    model: &SiteModel,
    lot_id: &str,
    date: NaiveDate,
    window: Window,
    band_m: f64,
    delta_t: DeltaT,
) -> Result<Vec<Face3>, EnvelopeViewError> {
    let lot = model.areas.iter().find(|a| a.id == lot_id).ok_or_else(|| EnvelopeViewError::NoLot(lot_id.into()))?;
    let protected: Vec<_> = default_protected(model, &lot.id).iter().map(|x| x.polygon.clone()).collect();
    if protected.is_empty() {
        return Err(EnvelopeViewError::NothingProtected);
    }
    let grid = Grid::over_polygon(&lot.polygon, crate::envelope::DEFAULT_ENVELOPE_CELL_M, DEFAULT_MAX_CELLS)
        .map_err(|e| EnvelopeViewError::Envelope(e.to_string()))?;
    let req = EnvelopeRequest {
        model,
        grid: &grid,
        protected: &protected,
        period: Period { first: date, last: date, window, step_min: DEFAULT_LONG_STEP_MIN },
        max_height_m: crate::envelope::DEFAULT_MAX_HEIGHT_M,
        height_step_m: crate::envelope::DEFAULT_HEIGHT_STEP_M,
        delta_t,
    };
    let env = solar_envelope(&req, |_| true).map_err(|e| EnvelopeViewError::Envelope(e.to_string()))?;
    Ok(envelope_faces(&lot.id, &height_bands(&grid, &env, band_m)))
}
