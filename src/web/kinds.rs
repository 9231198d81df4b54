//! Maps by name for the widgets (wasm32 only): the table of kinds the core owns
//! ([`crate::exposure::MAP_KINDS`]) and one call that computes a kind for a site and a date, so the
//! page holds no cell sizes, steps, periods or titles of its own.

use serde::{Deserialize, Serialize};
use wasm_bindgen::prelude::*;

use super::maps::{
    compare_of, date, envelope_of, insolation_of, progress, sun_hours_of, sunlit_shares_of, EnvelopeIn, InsolationIn,
    MapIn,
};
use super::outputs::{GridGeometry, MapFigures, Values};
use super::{read, site, write};
use crate::exposure::{
    map_kind, BeforeAfter, CellValues, Grid, MapCall, MapKind, MapSpan, Massing, Period, StepShare, SunlitMs, MAP_KINDS,
};

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
    /// Whether `mapOfKind` computes the kind in parts (`part`) that `joinMapParts` joins into the
    /// whole map exactly.
    parts: bool,
}

/// The map kinds, in menu order: `[{id, title, label, unit, column, menu, span, cellM, stepMin, parts}]`;
/// `menu` is the text of the kind's choice in a page's menu of maps (`null`: not offered there);
/// `parts`: whether the kind can be computed in parts by several workers.
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
            parts: splits(k),
        })
        .collect();
    write(&rows)
}

/// Whether a kind is computed in parts that join exactly: the sun-hours and hours-lost maps in shares
/// of the period's steps ([`StepShare`]: each part casts a share of the directions over every cell,
/// so no work is done twice), the insolation map in row bands ([`Grid::row_band`]: its diffuse sum
/// runs over every step in order); tests/exposure_checks.rs checks both joins against the whole map.
/// The envelope is not split.
fn splits(kind: &MapKind) -> bool {
    !matches!(kind.call, MapCall::Envelope)
}

/// Whether a kind's parts are shares of its steps (else row bands).
fn splits_by_steps(kind: &MapKind) -> bool {
    matches!(kind.call, MapCall::SunHours(_) | MapCall::Lost)
}

/// The most parts a map is split into (one per worker; more gains nothing on a laptop).
const MAX_PARTS: usize = 16;

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct KindIn {
    kind: String,
    site: String,
    /// The date the page shows, YYYY-MM-DD (a year's kind covers its calendar year).
    date: String,
    /// Only part `index` of `of` (see [`splits`]).
    part: Option<PartIn>,
}

#[derive(Deserialize, Clone, Copy)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct PartIn {
    index: usize,
    of: usize,
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
    /// The cells computed: the whole grid, or the band a `part` of a kind split by rows asked for.
    grid: GridGeometry,
    /// The kind's values per cell (hours, hours lost, kWh/m², envelope metres). A `part` of a kind
    /// split by steps gives what `joinMapParts` sums instead: each massing's milliseconds of sun per
    /// cell (the existing massing's first for the hours lost), then the share's open milliseconds.
    values: Values,
    /// End of the colour range ([`MapKind::range_top`]); it starts at 0.
    range_top: f64,
    stats: Option<MapFigures>,
    /// The value of a cell nothing shades (hours or kWh/m² of the open site; NaN for the envelope),
    /// which `joinMapParts` needs for the colour range.
    open_value: f64,
}

/// A kind and its period from the page's kind id and date.
fn kind_period(kind: &str, day: &str) -> Result<(&'static MapKind, Period), JsError> {
    let kind = map_kind(kind).map_err(|e| JsError::new(&format!("kind: {e}")))?;
    let period = kind.period(date(day, "date")?).map_err(|e| JsError::new(&format!("kind: {e}")))?;
    Ok((kind, period))
}

/// The map for the page, its figures over `values` (the whole grid's or a band's).
fn kind_map(kind: &'static MapKind, period: &Period, grid: &Grid, values: &CellValues, open: f64) -> KindMap {
    KindMap {
        kind: kind.id,
        title: kind.title,
        label: kind.label,
        unit: kind.unit,
        column: kind.column,
        caption: kind.caption(period),
        grid: grid.into(),
        values: values.into(),
        range_top: kind.range_top(values, open),
        stats: MapFigures::of(grid, values),
        open_value: open,
    }
}

/// Computes the map `kind` (a `mapKinds` id) of `site` for `date`: `{kind, title, label, unit, column,
/// caption, grid, values: Float64Array, rangeTop, stats, openValue}`. With `part: {index, of}` only
/// part `index` of `of` is computed (kinds with `parts` in `mapKinds`: a share of the steps or a band
/// of rows, see [`splits`]), for `joinMapParts`.
/// `onProgress(f)` gets the fraction done and may return `false` to cancel.
#[wasm_bindgen(js_name = mapOfKind, unchecked_return_type = "KindMap")]
pub fn map_of_kind(
    #[wasm_bindgen(unchecked_param_type = "KindInput")] input: JsValue,
    on_progress: Option<js_sys::Function>,
) -> Result<JsValue, JsError> {
    let i: KindIn = read(input, "mapOfKind")?;
    let (kind, period) = kind_period(&i.kind, &i.date)?;
    let band = match i.part {
        None => None,
        Some(p) if p.of == 0 || p.of > MAX_PARTS || p.index >= p.of => {
            return Err(JsError::new(&format!(
                "part: index {} of {} is not a part (of: 1 to {MAX_PARTS}, index: 0 to of − 1)",
                p.index, p.of
            )))
        }
        Some(_) if !splits(kind) => {
            return Err(JsError::new(&format!("part: the map {:?} is computed whole, not in parts", kind.id)))
        }
        Some(p) => Some((p.index, p.of)),
    };
    let progress = progress(&on_progress);
    if let Some((index, of)) = band.filter(|_| splits_by_steps(kind)) {
        // The hours lost: the existing massing's share, then the proposal's; the same steps, so one
        // open time.
        let (massings, beside_lots) = match kind.call {
            MapCall::SunHours(massing) => (vec![massing], false),
            _ => (vec![Massing::Existing, Massing::WithProposed], true),
        };
        let m = MapIn::of_kind(kind, i.site.clone(), &period);
        let (grid, shares) = sunlit_shares_of(&m, &massings, beside_lots, StepShare { index, of }, progress)?;
        let open_ms = shares.first().map_or(0.0, |s| s.open_ms);
        let mut values: Vec<f64> = shares.into_iter().flat_map(|s| s.ms).collect();
        values.push(open_ms);
        return write(&KindMap {
            values: Values::from(&CellValues::from_nan_coded(values)),
            stats: None,
            range_top: f64::NAN,
            open_value: open_ms / 3.6e6,
            ..kind_map(kind, &period, &grid, &CellValues::default(), f64::NAN)
        });
    }
    let map_in = || {
        let mut m = MapIn::of_kind(kind, i.site.clone(), &period);
        m.band = band;
        m
    };
    let (grid, values, open): (Grid, CellValues, f64) = match kind.call {
        MapCall::SunHours(_) => {
            let (grid, _, m) = sun_hours_of(&map_in(), progress)?;
            (grid, m.hours, m.open_hours)
        }
        MapCall::Lost => {
            let (grid, _, ba) = compare_of(&map_in(), progress)?;
            (grid, ba.lost_h, ba.before.open_hours)
        }
        MapCall::Insolation => {
            let (grid, _, m) = insolation_of(&map_in(), &InsolationIn::default(), progress)?;
            (grid, m.total_kwh_m2, m.open.total_kwh_m2)
        }
        MapCall::Envelope => {
            let model = site(&i.site)?;
            let lot = crate::envelope::subject_lot(&model).ok_or_else(|| JsError::new("site: has no lot"))?.id.clone();
            let (grid, _, env) = envelope_of(&EnvelopeIn::of_kind(kind, i.site, lot, &period), progress)?;
            (grid, env.height_m, f64::NAN)
        }
    };
    write(&kind_map(kind, &period, &grid, &values, open))
}

/// The whole map of a kind split by steps from its parts' values one after the other (see
/// [`KindMap::values`]): the shares' milliseconds summed cell by cell, then turned into hours (and
/// for the hours lost, compared) exactly as the whole map's.
fn join_step_shares(kind: &'static MapKind, period: &Period, grid: &Grid, values: &[f64]) -> Result<JsValue, JsError> {
    let n = grid.rows * grid.cols;
    let maps = if kind.call == MapCall::Lost { 2 } else { 1 };
    let per = maps * n + 1;
    let of = values.len() / per;
    if values.len() % per != 0 || !(1..=MAX_PARTS).contains(&of) {
        return Err(JsError::new(&format!(
            "values: {} given; the parts of the map of {:?} give {per} each ({maps} × {n} cells and the open \
             milliseconds), 1 to {MAX_PARTS} parts",
            values.len(),
            kind.id
        )));
    }
    // Each massing's shares joined: the parts' cells of that massing and their open milliseconds.
    let joined = |m: usize| {
        SunlitMs::join(values.chunks_exact(per).map(|part| SunlitMs {
            ms: part[m * n..(m + 1) * n].iter().map(|&v| if v.is_finite() { v } else { f64::NAN }).collect(),
            open_ms: part[per - 1],
            steps: 0,
        }))
        .map(SunlitMs::hours)
        .ok_or_else(|| JsError::new("values: no parts"))
    };
    let (cells, open) = if maps == 2 {
        let ba = BeforeAfter::of(joined(0)?, joined(1)?);
        let open = ba.before.open_hours;
        (ba.lost_h, open)
    } else {
        let h = joined(0)?;
        (h.hours, h.open_hours)
    };
    write(&kind_map(kind, period, grid, &cells, open))
}

#[derive(Deserialize)]
#[serde(rename_all = "camelCase", deny_unknown_fields)]
struct JoinIn {
    kind: String,
    site: String,
    date: String,
    /// `openValue` of the parts of a kind split by rows (one period, so every part's is the same);
    /// the parts of a kind split by steps carry their own.
    open_value: Option<f64>,
}

/// The whole map from its parts: `joinMapParts({kind, site, date, openValue}, values)`, `values` the
/// parts' values one after the other, part 0 first (NaN where a cell has none). Gives what
/// `mapOfKind` gives for the whole grid, bit for bit: its geometry, values, the colour range and
/// figures over every cell.
#[wasm_bindgen(js_name = joinMapParts, unchecked_return_type = "KindMap")]
pub fn join_map_parts(
    #[wasm_bindgen(unchecked_param_type = "JoinInput")] input: JsValue,
    values: &[f64],
) -> Result<JsValue, JsError> {
    let i: JoinIn = read(input, "joinMapParts")?;
    let (kind, period) = kind_period(&i.kind, &i.date)?;
    if !splits(kind) {
        return Err(JsError::new(&format!("kind: the map {:?} is computed whole, not in parts", kind.id)));
    }
    let (_, grid, _, _) = MapIn::of_kind(kind, i.site, &period).parts_over(kind.call == MapCall::Lost)?;
    if splits_by_steps(kind) {
        return join_step_shares(kind, &period, &grid, values);
    }
    if values.len() != grid.rows * grid.cols {
        return Err(JsError::new(&format!(
            "values: {} cells given, the map of {:?} has {} ({} × {})",
            values.len(),
            kind.id,
            grid.rows * grid.cols,
            grid.cols,
            grid.rows
        )));
    }
    let cells: CellValues = values.iter().map(|&v| v.is_finite().then_some(v)).collect();
    write(&kind_map(kind, &period, &grid, &cells, i.open_value.unwrap_or(f64::NAN)))
}
