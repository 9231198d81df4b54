//! `sunlot insolation`: clear-sky energy per cell (beam in direct sun plus diffuse by sky view).

use clap::Args;
use sunlot::exposure::{insolation, map_stats, CellValues, InsolationRequest, DEFAULT_SKY_STEP_DEG};
use sunlot::rules::CAUTION;

use crate::args::{AirArgs, ClearSkyArgs, DeltaTArgs};
use crate::maps::{self, GridArgs, Layer, MapFiles, PeriodArgs, Picture};
use crate::output::{Cell, Format, Table};
use crate::progress::Bar;
use crate::shadows::SiteFileArgs;

#[derive(Debug, Args)]
pub struct InsolationArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    #[command(flatten)]
    pub period: PeriodArgs,
    #[command(flatten)]
    pub grid: GridArgs,
    /// Map the existing massing alone (before the proposal) instead of existing and proposed.
    #[arg(long)]
    pub existing_only: bool,
    /// Sky patch size for the sky-view factor, degrees (0.5 to 30).
    #[arg(long, default_value_t = DEFAULT_SKY_STEP_DEG)]
    pub sky_step_deg: f64,
    #[command(flatten)]
    pub sky: ClearSkyArgs,
    #[command(flatten)]
    pub air: AirArgs,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    #[command(flatten)]
    pub files: MapFiles,
    /// Output on standard output: the per-area summary as a table, JSON or CSV.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
}

pub fn run(a: &InsolationArgs) -> Result<String, String> {
    let loaded = a.site.load()?;
    let model = &loaded.model;
    let grid = a.grid.grid(model)?;
    let massing = maps::massing(a.existing_only);
    let req = InsolationRequest {
        model,
        grid: &grid,
        period: a.period.period()?,
        plane_m: a.grid.plane_m,
        delta_t: a.delta_t.delta_t()?,
        massing,
        atmosphere: a.sky.bird(a.air.pressure_hpa)?,
        sky_step_deg: a.sky_step_deg,
    };
    let mut bar = Bar::new("insolation", a.files.quiet);
    let map = insolation(&req, |f| bar.update(f)).map_err(|e| e.to_string())?;
    drop(bar);
    let mut t = Table::new(
        format!("Clear-sky insolation on the horizontal, {}", a.period.describe()),
        vec![
            "area",
            "name",
            "area_m2",
            "min_kwh_m2",
            "mean_kwh_m2",
            "max_kwh_m2",
            "mean_beam_kwh_m2",
            "mean_diffuse_kwh_m2",
            "mean_sky_view",
            "mean_sun_h",
        ],
    );
    for area in maps::pick_areas(model, &a.grid.area, "--area")? {
        let cover = grid.cover_of(&area.polygon);
        let stats = |v: &CellValues| map_stats(&grid, v, Some(&cover), 0.0);
        let (Some(total), Some(beam), Some(diffuse), Some(svf), Some(hours)) = (
            stats(&map.total_kwh_m2),
            stats(&map.beam_kwh_m2),
            stats(&map.diffuse_kwh_m2),
            stats(&map.sky_view),
            stats(&map.sun_hours),
        ) else {
            continue;
        };
        t.rows.push(vec![
            Cell::text(&area.id),
            Cell::text(&area.name),
            Cell::num(total.area_m2, 1),
            Cell::num(total.min, 3),
            Cell::num(total.mean, 3),
            Cell::num(total.max, 3),
            Cell::num(beam.mean, 3),
            Cell::num(diffuse.mean, 3),
            Cell::num(svf.mean, 3),
            Cell::num(hours.mean, 2),
        ]);
    }
    t.notes.push(format!(
        "An open horizontal cell gets {:.3} kWh/m² ({:.3} beam, {:.3} diffuse; Bird clear sky). Diffuse is weighted by each cell's sky-view factor ({}° sky patches); reflections from buildings are not counted.",
        map.open.total_kwh_m2, map.open.beam_kwh_m2, map.open.diffuse_kwh_m2, a.sky_step_deg
    ));
    let layers = [
        Layer { name: "insolation_kwh_m2", values: &map.total_kwh_m2 },
        Layer { name: "beam_kwh_m2", values: &map.beam_kwh_m2 },
        Layer { name: "diffuse_kwh_m2", values: &map.diffuse_kwh_m2 },
        Layer { name: "sky_view", values: &map.sky_view },
        Layer { name: "sun_hours", values: &map.sun_hours },
    ];
    let picture = Picture {
        layer: 0,
        unit: "kWh/m²",
        range: (0.0, map.open.total_kwh_m2.max(1e-3)),
        title: sunlot::render::titled("Clear-sky insolation", &model.name),
        subtitle: a.period.describe(),
    };
    t.notes.extend(maps::write_files(&a.files, &loaded, &grid, &layers, &picture)?);
    t.notes.push(CAUTION.into());
    Ok(t.render(a.format))
}
