//! Maps by name for the widgets (wasm32 only): the table of kinds the core owns
//! ([`crate::exposure::MAP_KINDS`]) and one call that computes a kind for a site and a date, so the
//! page holds no cell sizes, steps, periods or titles of its own.

use serde::{Deserialize, Serialize};
use wasm_bindgen::prelude::*;

use super::maps::{
    compare_of, date, envelope_of, insolation_of, progress, sun_hours_of, EnvelopeIn, InsolationIn, MapIn,
};
use super::outputs::{GridGeometry, MapFigures, Values};
use super::{read, site, write};
use crate::exposure::{map_kind, Grid, MapCall, MapSpan, MAP_KINDS};

/// A row of `mapKinds` (`MapKindInfo`).
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
struct KindInfo {
    id: &'static str,
    title: &'static str,
    label: &'static str,
    unit: &'static str,
    column: &'static str,
    menu: Option<&'static str>,
    /// `day` or `year`.
    span: &'static str,
    cell_m: f64,
    step_min: u32,
}

/// The map kinds, in menu order: `[{id, title, label, unit, column, menu, span, cellM, stepMin}]`;
/// `menu` is the text of the kind's choice in a page's menu of maps (`null`: not offered there).
#[wasm_bindgen(js_name = mapKinds, unchecked_return_type = "MapKindInfo[]")]
pub fn map_kinds() -> Result<JsValue, JsError> {
    let rows: Vec<KindInfo> = MAP_KINDS
        .iter()
        .map(|k| KindInfo {
            id: k.id,
            title: k.title,
            label: k.label,
            unit: k.unit,
            column: k.column,
            menu: k.menu,
            span: if k.span == MapSpan::Year { "year" } else { "day" },
            cell_m: k.cell_m,
            step_min: k.step_min,
        })
        .collect();
    write(&rows)
}

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct KindIn {
    kind: String,
    site: String,
    /// The date the page shows, YYYY-MM-DD (a year's kind covers its calendar year).
    date: String,
}

/// `mapOfKind`: a map of a kind with what it needs to be drawn, labelled and exported.
#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
struct KindMap {
    kind: &'static str,
    title: &'static str,
    label: &'static str,
    unit: &'static str,
    column: &'static str,
    /// The period in words and the cell size ([`MapKind::caption`]).
    caption: String,
    grid: GridGeometry,
    /// The kind's values per cell (hours, hours lost, kWh/m², envelope metres).
    values: Values,
    /// End of the colour range ([`MapKind::range_top`]); it starts at 0.
    range_top: f64,
    stats: Option<MapFigures>,
}

/// Computes the map `kind` (a `mapKinds` id) of `site` for `date`: `{kind, title, label, unit, column,
/// caption, grid, values: Float64Array, rangeTop, stats}`. `onProgress(f)` gets the fraction done and
/// may return `false` to cancel.
#[wasm_bindgen(js_name = mapOfKind, unchecked_return_type = "KindMap")]
pub fn map_of_kind(
    #[wasm_bindgen(unchecked_param_type = "KindInput")] input: JsValue,
    on_progress: Option<js_sys::Function>,
) -> Result<JsValue, JsError> {
    let i: KindIn = read(input, "mapOfKind")?;
    let kind = map_kind(&i.kind).map_err(|e| JsError::new(&format!("kind: {e}")))?;
    let period = kind.period(date(&i.date, "date")?).map_err(|e| JsError::new(&format!("kind: {e}")))?;
    let progress = progress(&on_progress);
    let (grid, values, open): (Grid, Vec<Option<f64>>, f64) = match kind.call {
        MapCall::SunHours(_) => {
            let (grid, _, m) = sun_hours_of(&MapIn::of_kind(kind, i.site, &period), progress)?;
            (grid, m.hours, m.open_hours)
        }
        MapCall::Lost => {
            let (grid, _, ba) = compare_of(&MapIn::of_kind(kind, i.site, &period), progress)?;
            (grid, ba.lost_h, ba.before.open_hours)
        }
        MapCall::Insolation => {
            let map = MapIn::of_kind(kind, i.site, &period);
            let (grid, _, m) = insolation_of(&map, &InsolationIn::default(), progress)?;
            (grid, m.total_kwh_m2, m.open.total_kwh_m2)
        }
        MapCall::Envelope => {
            let model = site(&i.site)?;
            let lot = crate::envelope::subject_lot(&model).ok_or_else(|| JsError::new("site: has no lot"))?.id.clone();
            let (grid, _, env) = envelope_of(&EnvelopeIn::of_kind(kind, i.site, lot, &period), progress)?;
            (grid, env.height_m, f64::NAN)
        }
    };
    write(&KindMap {
        kind: kind.id,
        title: kind.title,
        label: kind.label,
        unit: kind.unit,
        column: kind.column,
        caption: kind.caption(&period),
        grid: (&grid).into(),
        values: (&values).into(),
        range_top: kind.range_top(&values, open),
        stats: MapFigures::of(&grid, &values),
    })
}
