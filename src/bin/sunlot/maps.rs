//! What the map commands share: the period, the grid, the map files they write.

use std::path::PathBuf;

use clap::Args;
use geo::{MultiPolygon, Polygon};
use sunlot::exposure::{map_geojson, CellValues, Grid, MapColumn, Period, Window, DEFAULT_MAX_CELLS};
use sunlot::render::{draw_heat_map, HeatMap, FIGURE_PX};
use sunlot::rules::CAUTION;
use sunlot::site::SiteModel;

use crate::args;
use crate::shadows::Loaded;

/// The massing a command's `--existing-only` flag asks for.
pub fn massing(existing_only: bool) -> sunlot::exposure::Massing {
    use sunlot::exposure::Massing;
    if existing_only {
        Massing::Existing
    } else {
        Massing::WithProposed
    }
}

/// Dates, daily window and step.
#[derive(Debug, Args)]
pub struct PeriodArgs {
    /// First local date, YYYY-MM-DD.
    #[arg(long)]
    pub date: String,
    /// Last local date, YYYY-MM-DD (default: the first).
    #[arg(long)]
    pub to: Option<String>,
    /// Daily window in local clock time, HH:MM-HH:MM (default: sunrise to sunset).
    #[arg(long)]
    pub window: Option<String>,
    /// Time step, minutes (1 to 60).
    #[arg(long, default_value_t = sunlot::exposure::DEFAULT_STEP_MIN)]
    pub step_min: u32,
}

/// A daily window `HH:MM-HH:MM`.
pub fn window(text: &str, flag: &str) -> Result<Window, String> {
    Window::parse(text).map_err(|e| format!("{flag}: {e}"))
}

impl PeriodArgs {
    pub fn period(&self) -> Result<Period, String> {
        let first = args::date(&self.date, "--date")?;
        let last = self.to.as_deref().map_or(Ok(first), |t| args::date(t, "--to"))?;
        let window = self.window.as_deref().map(|w| window(w, "--window")).transpose()?.unwrap_or(Window::Daylight);
        Ok(Period { first, last, window, step_min: self.step_min })
    }

    /// "2026-03-21, sunrise to sunset, 5-minute steps".
    /// (The core's [`Period::describe`]; empty for a period that does not read, refused before.)
    pub fn describe(&self) -> String {
        self.period().map(|p| p.describe()).unwrap_or_default()
    }
}

/// The cells to map.
#[derive(Debug, Clone, Args)]
pub struct GridArgs {
    /// Ids of the areas to map, comma-separated (default: every area of the site).
    #[arg(long, value_delimiter = ',')]
    pub area: Vec<String>,
    /// Cell size, metres (at least 0.01).
    #[arg(long, default_value_t = sunlot::exposure::DEFAULT_CELL_M)]
    pub cell_m: f64,
    /// Height of the receiving plane above the ground, metres (a terrace, a first-floor sill).
    #[arg(long, default_value_t = 0.0)]
    pub plane_m: f64,
    /// Most cells allowed.
    #[arg(long, default_value_t = DEFAULT_MAX_CELLS)]
    pub max_cells: usize,
}

/// The areas picked by `ids` (all when empty), refusing unknown ids.
pub fn pick_areas<'a>(model: &'a SiteModel, ids: &[String], flag: &str) -> Result<Vec<&'a sunlot::site::Area>, String> {
    for id in ids {
        if !model.areas.iter().any(|a| &a.id == id) {
            let known: Vec<&str> = model.areas.iter().map(|a| a.id.as_str()).collect();
            return Err(format!("{flag}: the site has no area {id:?} (it has: {})", known.join(", ")));
        }
    }
    let out: Vec<_> = model.areas.iter().filter(|a| ids.is_empty() || ids.contains(&a.id)).collect();
    if out.is_empty() {
        return Err("the site has no areas to map; add one to the site file".into());
    }
    Ok(out)
}

impl GridArgs {
    /// One grid over the picked areas.
    pub fn grid(&self, model: &SiteModel) -> Result<Grid, String> {
        let polys: Vec<Polygon<f64>> =
            pick_areas(model, &self.area, "--area")?.iter().map(|a| a.polygon.clone()).collect();
        Grid::covering(&MultiPolygon::new(polys), self.cell_m, self.max_cells).map_err(|e| format!("--cell-m: {e}"))
    }
}

/// The files a map command can write.
#[derive(Debug, Clone, Args)]
pub struct MapFiles {
    /// Write every cell as CSV (x_m, y_m and the map's values) to this file.
    #[arg(long = "cells-csv", alias = "csv", value_name = "FILE")]
    pub csv: Option<PathBuf>,
    /// Write the cells as GeoJSON polygons with their values to this file (WGS84 when the site came
    /// from GeoJSON, else plan metres).
    #[arg(long, value_name = "FILE")]
    pub geojson: Option<PathBuf>,
    /// Write a PNG heat map with legend, scale bar and north arrow to this file.
    #[arg(long, value_name = "FILE")]
    pub png: Option<PathBuf>,
    /// Write the same heat map as SVG to this file.
    #[arg(long, value_name = "FILE")]
    pub svg: Option<PathBuf>,
    /// No progress bar.
    #[arg(long)]
    pub quiet: bool,
}

/// One layer of values over a grid.
pub struct Layer<'a> {
    /// Column / property name with its unit, e.g. `sun_hours`.
    pub name: &'a str,
    /// Values per cell.
    pub values: &'a CellValues,
}

/// The heat map's look: which layer, its unit and range, titles.
pub struct Picture<'a> {
    pub layer: usize,
    pub unit: &'a str,
    pub range: (f64, f64),
    pub title: String,
    pub subtitle: String,
}

fn write(path: &PathBuf, bytes: &[u8]) -> Result<(), String> {
    std::fs::write(path, bytes).map_err(|e| format!("{}: {e}", path.display()))
}

/// Writes the files asked for; returns a note per file written.
pub fn write_files(
    files: &MapFiles,
    loaded: &Loaded,
    grid: &Grid,
    layers: &[Layer],
    picture: &Picture,
) -> Result<Vec<String>, String> {
    let model = &loaded.model;
    let mut notes = Vec::new();
    if let Some(path) = &files.csv {
        let mut w = csv::Writer::from_writer(Vec::new());
        let mut header = vec!["x_m".to_string(), "y_m".to_string()];
        header.extend(layers.iter().map(|l| l.name.to_string()));
        w.write_record(&header).map_err(|e| e.to_string())?;
        for row in 0..grid.rows {
            for col in 0..grid.cols {
                let i = row * grid.cols + col;
                if !grid.inside[i] {
                    continue;
                }
                let c = grid.centre(col, row);
                let mut rec = vec![format!("{:.3}", c.x), format!("{:.3}", c.y)];
                rec.extend(layers.iter().map(|l| l.values.get(i).map_or(String::new(), |v| format!("{v:.4}"))));
                w.write_record(&rec).map_err(|e| e.to_string())?;
            }
        }
        write(path, &w.into_inner().map_err(|e| e.to_string())?)?;
        notes.push(format!("cells written to {} (CSV)", path.display()));
    }
    if let Some(path) = &files.geojson {
        let columns: Vec<MapColumn> = layers.iter().map(|l| MapColumn { name: l.name, values: l.values }).collect();
        let text = map_geojson(model, grid, &columns, (&picture.title, &picture.subtitle), loaded.from_geojson);
        write(path, text.as_bytes())?;
        notes.push(format!("cells written to {} (GeoJSON)", path.display()));
    }
    if files.png.is_some() || files.svg.is_some() {
        let map = HeatMap {
            title: picture.title.clone(),
            subtitle: picture.subtitle.clone(),
            unit: picture.unit.into(),
            grid,
            values: layers[picture.layer].values,
            range: picture.range,
            outlines: sunlot::render::site_outlines(model),
            plan_rotation_deg: model.plan_rotation_deg,
            caution: CAUTION.into(),
        };
        notes.extend(crate::figure::write_figure(
            FIGURE_PX,
            files.png.as_deref(),
            files.svg.as_deref(),
            "heat map",
            |d| {
                draw_heat_map(d, &map);
                Ok(())
            },
        )?);
    }
    Ok(notes)
}

/// The largest value of a map (at least `floor`), for a legend's top.
pub fn top_of(values: &CellValues, floor: f64) -> f64 {
    values.values().fold(floor, f64::max)
}
