//! `sunlot sky`: the sun-path diagram of a site, optionally with the skyline seen from a point, as
//! PNG or SVG.

use std::path::PathBuf;

use clap::{Args, ValueEnum};
use sunlot::render::{draw_sky_chart, monthly_dates, Projection, SkyChart};

use crate::args::{self, DeltaTArgs};
use crate::point::parse_point;
use crate::shadows::SiteFileArgs;

/// The projection of the sky.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum ProjectionArg {
    /// Polar, stereographic.
    Stereographic,
    /// Polar, equidistant in zenith angle.
    Equidistant,
    /// Azimuth across, altitude up.
    Rectangular,
}

#[derive(Debug, Args)]
pub struct SkyArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    /// Draw the skyline of obstructions seen from this point: plan X,Y and height Z, metres.
    #[arg(long, value_name = "X,Y,Z", allow_hyphen_values = true)]
    pub at: Option<String>,
    /// Year of the paths and hour lines (default: this year).
    #[arg(long)]
    pub year: Option<i32>,
    /// Dates of the day paths, comma-separated YYYY-MM-DD (default: the 21st of every month).
    #[arg(long, value_delimiter = ',')]
    pub dates: Vec<String>,
    /// Mark the sun at this local time YYYY-MM-DDTHH:MM.
    #[arg(long)]
    pub local: Option<String>,
    /// Projection.
    #[arg(long, value_enum, default_value_t = ProjectionArg::Stereographic)]
    pub projection: ProjectionArg,
    /// Without the proposal (the skyline of the existing massing).
    #[arg(long)]
    pub existing_only: bool,
    /// Write the diagram as PNG to this file.
    #[arg(long, value_name = "FILE")]
    pub png: Option<PathBuf>,
    /// Write the diagram as SVG to this file.
    #[arg(long, value_name = "FILE")]
    pub svg: Option<PathBuf>,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
}

const SIZE: (u32, u32) = (900, 720);

pub fn run(a: &SkyArgs) -> Result<String, String> {
    if a.png.is_none() && a.svg.is_none() {
        return Err("give --png FILE and/or --svg FILE for the diagram".into());
    }
    let model = a.site.load()?.model;
    let year = a.year.unwrap_or_else(|| chrono::Datelike::year(&chrono::Utc::now()));
    let dates = if a.dates.is_empty() {
        monthly_dates(year)
    } else {
        a.dates
            .iter()
            .map(|d| args::date(d, "--dates").map(|x| (x, x.format("%d %b %Y").to_string())))
            .collect::<Result<_, _>>()?
    };
    let now = match &a.local {
        Some(l) => {
            let zones = args::ZoneArgs { zone: Some(model.zone.to_string()), fold: None };
            args::instant(None, Some(l), &zones, false)?.map(|(t, _)| t)
        }
        None => None,
    };
    let from = match &a.at {
        Some(at) => Some((parse_point(at)?, crate::maps::massing(a.existing_only))),
        None => None,
    };
    let projection = match a.projection {
        ProjectionArg::Stereographic => Projection::Stereographic,
        ProjectionArg::Equidistant => Projection::Equidistant,
        ProjectionArg::Rectangular => Projection::Rectangular,
    };
    let request = sunlot::render::SkyChartRequest {
        year,
        dates: Some(dates),
        now,
        from,
        projection,
        delta_t: a.delta_t.delta_t()?,
    };
    let chart = SkyChart::for_site(&model, request).map_err(|e| match e {
        sunlot::render::SkyChartError::Dates(b) => format!("--{b}"),
        sunlot::render::SkyChartError::Point(p) => format!("--at: {p}"),
    })?;
    let notes = crate::figure::write_figure(SIZE, a.png.as_deref(), a.svg.as_deref(), "sun-path diagram", |d| {
        draw_sky_chart(d, &chart).map_err(|e| e.to_string())
    })?;
    Ok(notes.iter().map(|n| format!("{n}\n")).collect())
}
