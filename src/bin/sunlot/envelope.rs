//! `sunlot envelope`: the solar envelope of a lot (Knowles) — how tall a building may stand on each
//! cell without shading the protected areas in the protected period.

use clap::Args;
use geo::MapCoords;
use geojson::{Feature, FeatureCollection, Geometry, GeometryValue, JsonObject};
use serde_json::json;
use sunlot::envelope::{height_bands, solar_envelope, Envelope, EnvelopeRequest};
use sunlot::exposure::{map_stats, Grid, Period, Window, DEFAULT_MAX_CELLS};
use sunlot::rules::CAUTION;

use crate::args::{self, DeltaTArgs};
use crate::maps::{self, Layer, MapFiles, Picture};
use crate::output::{Cell, Format, Table};
use crate::progress::Bar;
use crate::shadows::{Loaded, SiteFileArgs};
use sunlot::site::{Area, SiteModel};

#[derive(Debug, Args)]
pub struct EnvelopeArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    /// Id of the subject lot.
    #[arg(long)]
    pub lot: String,
    /// Ids of the protected areas, comma-separated (default: every garden, terrace and amenity area
    /// other than the lot).
    #[arg(long, value_delimiter = ',')]
    pub protect: Vec<String>,
    /// First local date of the protected period, YYYY-MM-DD.
    #[arg(long)]
    pub date: String,
    /// Last local date (default: the first).
    #[arg(long)]
    pub to: Option<String>,
    /// Protected daily hours, local clock time HH:MM-HH:MM ("daylight" for sunrise to sunset, whose
    /// very long low-sun shadows allow little height).
    #[arg(long, default_value = sunlot::envelope::DEFAULT_ENVELOPE_WINDOW)]
    pub window: String,
    /// Time step, minutes.
    #[arg(long, default_value_t = sunlot::exposure::DEFAULT_LONG_STEP_MIN)]
    pub step_min: u32,
    /// Cell size, metres.
    #[arg(long, default_value_t = sunlot::envelope::DEFAULT_ENVELOPE_CELL_M)]
    pub cell_m: f64,
    /// Height cap, metres.
    #[arg(long, default_value_t = sunlot::envelope::DEFAULT_MAX_HEIGHT_M)]
    pub max_height_m: f64,
    /// Heights are rounded down to a multiple of this, metres.
    #[arg(long, default_value_t = sunlot::envelope::DEFAULT_HEIGHT_STEP_M)]
    pub height_step_m: f64,
    /// Height of the bands written by --geojson, metres.
    #[arg(long, default_value_t = sunlot::envelope::DEFAULT_BAND_M)]
    pub band_m: f64,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    /// --cells-csv writes cells (x_m, y_m, height_m); --geojson writes height bands; --png / --svg a map.
    #[command(flatten)]
    pub files: MapFiles,
    /// Output on standard output: the summary as a table, JSON or CSV.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
}

pub fn run(a: &EnvelopeArgs) -> Result<String, String> {
    let loaded = a.site.load()?;
    let model = &loaded.model;
    let (lot, protected) = lot_and_protected(a, model)?;
    let first = args::date(&a.date, "--date")?;
    let last = a.to.as_deref().map_or(Ok(first), |t| args::date(t, "--to"))?;
    let window = if a.window == "daylight" { Window::Daylight } else { maps::window(&a.window, "--window")? };
    let grid = Grid::over_polygon(&lot.polygon, a.cell_m, DEFAULT_MAX_CELLS).map_err(|e| format!("--cell-m: {e}"))?;
    let polys: Vec<_> = protected.iter().map(|x| x.polygon.clone()).collect();
    let req = EnvelopeRequest {
        model,
        grid: &grid,
        protected: &polys,
        period: Period { first, last, window, step_min: a.step_min },
        max_height_m: a.max_height_m,
        height_step_m: a.height_step_m,
        delta_t: a.delta_t.delta_t()?,
    };
    let mut bar = Bar::new("solar envelope", a.files.quiet);
    let env = solar_envelope(&req, |f| bar.update(f)).map_err(|e| e.to_string())?;
    drop(bar);
    let period = req.period.describe();
    let names: Vec<&str> = protected.iter().map(|x| x.id.as_str()).collect();
    let title = format!("Solar envelope of {} keeping shadows off {} ({period})", lot.id, names.join(", "));
    let mut t = summary(a, title, lot, &grid, &env)?;
    let picture = Picture {
        layer: 0,
        unit: "height, m",
        range: (0.0, maps::top_of(&env.height_m, a.height_step_m)),
        title: sunlot::render::titled("Solar envelope", &model.name),
        subtitle: period.clone(),
    };
    let cells_only = MapFiles { geojson: None, ..a.files.clone() };
    let layers = [Layer { name: "height_m", values: &env.height_m }];
    t.notes.extend(maps::write_files(&cells_only, &loaded, &grid, &layers, &picture)?);
    if let Some(path) = &a.files.geojson {
        write_bands(path, a, &loaded, &lot.id, &grid, &env, &period)?;
        t.notes.push(format!("height bands written to {} (GeoJSON)", path.display()));
    }
    t.notes.push(CAUTION.into());
    Ok(t.render(a.format))
}

/// The lot (`--lot`) and the areas its envelope keeps shadows off (`--protect`, else the default).
fn lot_and_protected<'m>(a: &EnvelopeArgs, model: &'m SiteModel) -> Result<(&'m Area, Vec<&'m Area>), String> {
    let lot = maps::pick_areas(model, std::slice::from_ref(&a.lot), "--lot")?[0];
    let protected: Vec<_> = if a.protect.is_empty() {
        sunlot::envelope::default_protected(model, &lot.id)
    } else {
        maps::pick_areas(model, &a.protect, "--protect")?
    };
    if protected.is_empty() {
        return Err("--protect: the site has no gardens, terraces or amenity areas to protect; name some".into());
    }
    Ok((lot, protected))
}

/// The one-row summary of the envelope: cells, area, heights, volume, share at the cap, steps.
fn summary(a: &EnvelopeArgs, title: String, lot: &Area, grid: &Grid, env: &Envelope) -> Result<Table, String> {
    let stats = map_stats(grid, &env.height_m, None, a.max_height_m).ok_or("the lot is smaller than one cell")?;
    let mut t = Table::new(
        title,
        vec![
            "lot",
            "cells",
            "area_m2",
            "min_height_m",
            "mean_height_m",
            "max_height_m",
            "volume_m3",
            "at_cap_pct",
            "steps",
        ],
    );
    t.single = true;
    let volume: f64 = env.height_m.iter().flatten().sum::<f64>() * grid.cell_m * grid.cell_m;
    t.rows.push(vec![
        Cell::text(&lot.id),
        Cell::Int(stats.cells as i64),
        Cell::num(stats.area_m2, 1),
        Cell::num(stats.min, 2),
        Cell::num(stats.mean, 2),
        Cell::num(stats.max, 2),
        Cell::num(volume, 0),
        Cell::num(100.0 * stats.at_least_share, 1),
        Cell::Int(env.steps as i64),
    ]);
    t.notes.push(format!(
        "Each {} m cell is a prism from the ground; heights rounded down to {} m, capped at {} m. Existing buildings' shade is not credited.",
        a.cell_m, a.height_step_m, a.max_height_m
    ));
    Ok(t)
}

/// Writes the envelope's height bands (every `--band-m`) to `path` as GeoJSON: WGS 84 when the site
/// came as GeoJSON, else plan metres.
fn write_bands(
    path: &std::path::Path,
    a: &EnvelopeArgs,
    loaded: &Loaded,
    lot_id: &str,
    grid: &Grid,
    env: &Envelope,
    period: &str,
) -> Result<(), String> {
    let model = &loaded.model;
    let frame = model.frame();
    let features: Vec<Feature> = height_bands(grid, env, a.band_m)
        .into_iter()
        .map(|b| {
            let outline =
                if loaded.from_geojson { b.outline.map_coords(|c| model.plan_to_wgs84(&frame, c)) } else { b.outline };
            let props = json!({"from_m": b.from_m, "to_m": b.to_m.min(a.max_height_m)});
            Feature {
                geometry: Some(Geometry::new(GeometryValue::from(&outline))),
                properties: props.as_object().cloned(),
                ..Default::default()
            }
        })
        .collect();
    let mut fc = FeatureCollection::new(features);
    let mut members = JsonObject::new();
    members.insert(
        "sunlot".into(),
        json!({"map": "solar envelope height bands", "lot": lot_id, "period": period, "caution": CAUTION}),
    );
    fc.foreign_members = Some(members);
    std::fs::write(path, serde_json::to_string(&fc).unwrap_or_default()).map_err(|e| format!("{}: {e}", path.display()))
}
