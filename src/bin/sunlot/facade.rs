//! `sunlot facade`: hours of direct sun and clear-sky beam insolation on every face of a building, per
//! face as a table and per cell as CSV, drawn as elevations (PNG, SVG) with the site's windows.

use std::path::PathBuf;

use clap::{Args, ValueEnum};
use sunlot::exposure::{facade_map, FacadeLayer, FacadeRequest, FaceMap, SunSteps};
use sunlot::render::{draw_elevation, elevation_size, Elevation};
use sunlot::rules::CAUTION;

use crate::args::{AirArgs, ClearSkyArgs, DeltaTArgs};
use crate::maps::PeriodArgs;
use crate::output::{Cell, Format, Table};
use crate::progress::Bar;
use crate::shadows::SiteFileArgs;

/// Which values the elevations show (as [`FacadeLayer`]).
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum Show {
    /// Hours of direct sun.
    Hours,
    /// Clear-sky beam insolation, kWh/m².
    Beam,
    /// Clear-sky insolation, beam and sky diffuse, kWh/m².
    Insolation,
    /// Hours of direct sun lost to the proposal (existing massing alone minus with the proposal).
    Lost,
}

impl Show {
    fn layer(self) -> FacadeLayer {
        match self {
            Show::Hours => FacadeLayer::Hours,
            Show::Beam => FacadeLayer::Beam,
            Show::Insolation => FacadeLayer::Insolation,
            Show::Lost => FacadeLayer::Lost,
        }
    }
}

#[derive(Debug, Args)]
pub struct FacadeArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    /// The building: a volume id of the site.
    #[arg(long)]
    pub volume: String,
    #[command(flatten)]
    pub period: PeriodArgs,
    /// Largest cell side on the faces, metres (cells fit each face exactly, so they may be smaller).
    #[arg(long, default_value_t = sunlot::exposure::DEFAULT_FACADE_CELL_M)]
    pub cell_m: f64,
    /// The existing massing alone (before the proposal); the building itself always stands.
    #[arg(long)]
    pub existing_only: bool,
    #[command(flatten)]
    pub sky: ClearSkyArgs,
    #[command(flatten)]
    pub air: AirArgs,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    /// What the elevations show.
    #[arg(long, value_enum, default_value_t = Show::Hours)]
    pub show: Show,
    /// Write every cell as CSV (face, column, row, plan x, y, height and the values) to this file.
    #[arg(long = "cells-csv", alias = "csv", value_name = "FILE")]
    pub csv: Option<PathBuf>,
    /// Write the elevations as a PNG figure to this file.
    #[arg(long, value_name = "FILE")]
    pub png: Option<PathBuf>,
    /// Write the same figure as SVG to this file.
    #[arg(long, value_name = "FILE")]
    pub svg: Option<PathBuf>,
    /// No progress bar.
    #[arg(long)]
    pub quiet: bool,
    /// Output on standard output: the per-face summary as a table, JSON or CSV.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
}

fn stats(values: &[f64]) -> (f64, f64, f64) {
    let n = values.len().max(1) as f64;
    let min = values.iter().copied().fold(f64::INFINITY, f64::min);
    let max = values.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    (min, values.iter().sum::<f64>() / n, max)
}

fn cells_csv(faces: &[FaceMap]) -> Result<Vec<u8>, String> {
    let mut w = csv::Writer::from_writer(Vec::new());
    let header =
        ["face", "facing_deg", "col", "row", "x_m", "y_m", "z_m", "sun_hours", "beam_kwh_m2", "diffuse_kwh_m2"];
    w.write_record(header).map_err(|e| e.to_string())?;
    for f in faces {
        for row in 0..f.rows {
            for col in 0..f.cols {
                let p = f.sample(col, row);
                let i = row * f.cols + col;
                let rec = [
                    f.face.number.to_string(),
                    format!("{:.1}", f.face.facing_deg),
                    col.to_string(),
                    row.to_string(),
                    format!("{:.3}", p.x_m),
                    format!("{:.3}", p.y_m),
                    format!("{:.3}", p.z_m),
                    format!("{:.4}", f.sun_hours[i]),
                    format!("{:.4}", f.beam_kwh_m2[i]),
                    format!("{:.4}", f.diffuse_kwh_m2[i]),
                ];
                w.write_record(&rec).map_err(|e| e.to_string())?;
            }
        }
    }
    w.into_inner().map_err(|e| e.to_string())
}

pub fn run(a: &FacadeArgs) -> Result<String, String> {
    let loaded = a.site.load()?;
    let model = &loaded.model;
    let period = a.period.period()?;
    let delta_t = a.delta_t.delta_t()?;
    let atmosphere = a.sky.bird(a.air.pressure_hpa)?;
    let req = FacadeRequest {
        model,
        volume_id: &a.volume,
        cell_m: a.cell_m,
        massing: crate::maps::massing(a.existing_only),
        delta_t,
        atmosphere,
    };
    let mut bar = Bar::new("facade map", a.quiet);
    let steps = SunSteps::of(model, &period, delta_t, |f| bar.update(0.2 * f)).map_err(|e| e.to_string())?;
    let bad = |e: sunlot::exposure::ExposureError| format!("--volume, --cell-m: {e}");
    let layer = a.show.layer();
    let lost = layer.needs_before();
    let share = if lost { 0.4 } else { 0.8 };
    let faces = facade_map(&req, &steps, |f| bar.update(0.2 + share * f)).map_err(bad)?;
    // Before the proposal, for the hours lost.
    let before = if lost {
        let req = FacadeRequest { massing: sunlot::exposure::Massing::Existing, ..req.clone() };
        Some(facade_map(&req, &steps, |f| bar.update(0.6 + share * f)).map_err(bad)?)
    } else {
        None
    };
    drop(bar);
    let which = if a.existing_only { "existing massing" } else { "existing and proposed massing" };
    let values = layer.values(&faces, before.as_deref()).unwrap_or_default();
    let mut t = Table::new(
        format!("Faces of {} — {}, {which}", a.volume, a.period.describe()),
        vec![
            "face",
            "facing",
            "facing_deg",
            "width_m",
            "height_m",
            "cells",
            "min_sun_h",
            "mean_sun_h",
            "max_sun_h",
            "mean_beam_kwh_m2",
            "mean_diffuse_kwh_m2",
            "windows",
        ],
    );
    if lost {
        t.columns.extend(["mean_lost_h".to_string(), "max_lost_h".to_string()]);
    }
    for (k, f) in faces.iter().enumerate() {
        let (lo, mean, hi) = stats(&f.sun_hours);
        let (_, beam, _) = stats(&f.beam_kwh_m2);
        let (_, diffuse, _) = stats(&f.diffuse_kwh_m2);
        let windows: Vec<&str> = f.windows.iter().map(|w| w.id.as_str()).collect();
        t.rows.push(vec![
            Cell::num(f.face.number as f64, 0),
            Cell::text(f.face.compass()),
            Cell::num(f.face.facing_deg, 1),
            Cell::num(f.face.length_m(), 2),
            Cell::num(f.face.top_m - f.face.base_m, 2),
            Cell::num((f.cols * f.rows) as f64, 0),
            Cell::num(lo, 2),
            Cell::num(mean, 2),
            Cell::num(hi, 2),
            Cell::num(beam, 2),
            Cell::num(diffuse, 2),
            Cell::text(windows.join(" ")),
        ]);
        if let Some(l) = values.get(k).filter(|_| lost) {
            let (_, mean, hi) = stats(l);
            t.rows.last_mut().into_iter().for_each(|r| r.extend([Cell::num(mean, 2), Cell::num(hi, 2)]));
        }
    }
    t.notes.push(format!(
        "Cells at most {} m a side, fitted to each face, sampled at their centres {} m in front of it; the sun counts \
         when it is in front of the face and the ray to it is clear. Beam: Bird clear sky (AOD500 {}), DNI · cos i on \
         the face; sky diffuse: the diffuse horizontal times each cell's view of the isotropic sky (½ for an open face); \
         light reflected from the ground and buildings is not counted.",
        a.cell_m,
        sunlot::exposure::SAMPLE_OFFSET_M,
        a.sky.aod_500
    ));
    let e = Elevation::of_layer(
        layer,
        &faces,
        &values,
        (&a.volume, &model.name),
        format!("{}, {which}", a.period.describe()),
    );
    let write =
        |path: &PathBuf, bytes: &[u8]| std::fs::write(path, bytes).map_err(|e| format!("{}: {e}", path.display()));
    let size = elevation_size(&faces);
    if let Some(path) = &a.csv {
        write(path, &cells_csv(&faces)?)?;
        t.notes.push(format!("Cells written to {}.", path.display()));
    }
    t.notes.extend(crate::figure::write_figure(size, a.png.as_deref(), a.svg.as_deref(), "Elevations", |d| {
        draw_elevation(d, &e);
        Ok(())
    })?);
    t.notes.push(CAUTION.into());
    Ok(t.render(a.format))
}
