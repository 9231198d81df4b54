//! `sunlot shadows` and `sunlot shadow-table`: a site's shadows at a moment, and the shadow-length
//! table through a day.

use std::path::PathBuf;

use clap::{Args, ValueEnum};
use sunlot::shadow::{shadow_study, shadow_table, Study};
use sunlot::site::{FootprintOptions, SiteModel};

use crate::args::{self, input_message, DeltaTArgs};
use crate::output::{Cell, Format, Table};

/// The site to study: a file, or the demo.
#[derive(Debug, Clone, Args)]
pub struct SiteFileArgs {
    /// A sunlot site file (JSON, see schemas/site-v2.schema.json) or a GeoJSON FeatureCollection
    /// (WGS84; see README for the feature properties).
    #[arg(value_name = "SITE", required_unless_present = "demo")]
    pub path: Option<PathBuf>,
    /// Use the built-in, invented demo site (demo-site/hollin-vale.site.json).
    #[arg(long, conflicts_with = "path")]
    pub demo: bool,
    /// Plain GeoJSON building footprints (no sunlot members): the site's time zone, an IANA name such as
    /// Europe/London. Without it such a file is refused with a zone suggested from its longitude.
    #[arg(long, value_name = "ZONE", help_heading = "Plain GeoJSON footprints")]
    pub zone: Option<String>,
    /// Plain GeoJSON footprints: metres a storey for buildings given by a levels count.
    #[arg(long, value_name = "M", default_value_t = sunlot::site::DEFAULT_STOREY_HEIGHT_M, help_heading = "Plain GeoJSON footprints")]
    pub storey_height_m: f64,
    /// Plain GeoJSON footprints: the height of buildings with neither height nor levels (else such a
    /// building is refused by name).
    #[arg(long, value_name = "M", help_heading = "Plain GeoJSON footprints")]
    pub default_height_m: Option<f64>,
}

/// A loaded site, and whether it came from GeoJSON (results then go out in WGS84 too).
pub struct Loaded {
    pub model: SiteModel,
    pub from_geojson: bool,
}

impl SiteFileArgs {
    pub fn load(&self) -> Result<Loaded, String> {
        if self.demo {
            return Ok(Loaded { model: sunlot::demo::demo(), from_geojson: false });
        }
        let path = self.path.as_ref().ok_or("give a site file, or --demo")?;
        let text = std::fs::read_to_string(path).map_err(|e| format!("{}: {e}", path.display()))?;
        let zone = match &self.zone {
            Some(z) => Some(z.parse().map_err(|e| format!("--zone: {e}"))?),
            None => None,
        };
        let name = path.file_stem().map(|s| s.to_string_lossy().to_string()).unwrap_or_default();
        let footprints = FootprintOptions {
            zone,
            storey_height_m: self.storey_height_m,
            default_height_m: self.default_height_m,
            name: name.clone(),
        };
        let read = SiteModel::read_with(&text, &footprints).map_err(|e| {
            use sunlot::site::{GeoJsonError, SiteReadError};
            let hint = match &e {
                SiteReadError::GeoJson(GeoJsonError::ZoneNeeded { .. }) => " (give --zone)",
                SiteReadError::GeoJson(GeoJsonError::Footprint { problem, .. })
                    if problem.contains("has no height") =>
                {
                    " (or give --default-height-m)"
                }
                _ => "",
            };
            format!("{}: {e}{hint}", path.display())
        })?;
        for said in &read.assumptions {
            eprintln!("sunlot: note: {said}");
        }
        let mut model = read.model;
        if model.name.trim().is_empty() {
            eprintln!("sunlot: note: the site has no name: it is called {name:?} after its file");
            model.name = name;
        }
        Ok(Loaded { model, from_geojson: read.from_geojson })
    }
}

/// How `shadows` writes its result.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum ShadowFormat {
    /// The shade on each area, as an aligned table.
    Table,
    /// The shade on each area, as JSON.
    Json,
    /// The shade on each area, as CSV.
    Csv,
    /// The shadow polygons and the areas with their figures, as a GeoJSON FeatureCollection: in WGS84
    /// when the site came from GeoJSON, else in the site's plan frame (metres).
    Geojson,
}

#[derive(Debug, Args)]
pub struct ShadowsArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    #[command(flatten)]
    pub moment: args::MomentArgs,
    /// Output.
    #[arg(long, value_enum, default_value_t = ShadowFormat::Geojson)]
    pub format: ShadowFormat,
    /// Also write the shadow plan (existing shade and the shade the proposal adds) as PNG here.
    #[arg(long, value_name = "FILE")]
    pub png: Option<PathBuf>,
    /// Also write the shadow plan as SVG here.
    #[arg(long, value_name = "FILE")]
    pub svg: Option<PathBuf>,
}

pub fn run_shadows(a: &ShadowsArgs) -> Result<String, String> {
    let Loaded { model, from_geojson } = a.site.load()?;
    let (t, zone) = a.moment.instant(&model)?;
    let study = shadow_study(&model, t, a.moment.delta_t.delta_t()?).map_err(|e| e.to_string())?;
    let when = args::rfc3339(t, &zone);
    if a.png.is_some() || a.svg.is_some() {
        use sunlot::render::{draw_shadow_plan, PlanExtras, ShadowPlan, FIGURE_PX};
        let plan = ShadowPlan::of_study(&model, &study, &zone.label(t));
        crate::figure::write_figure(FIGURE_PX, a.png.as_deref(), a.svg.as_deref(), "shadow plan", |d| {
            draw_shadow_plan(d, &plan, &PlanExtras::default());
            Ok(())
        })?;
    }
    if a.format == ShadowFormat::Geojson {
        return Ok(sunlot::shadow::study_geojson(&model, &study, &when, from_geojson));
    }
    let (sun, areas, clipped) = match study {
        Study::Sun { sun, areas, clipped, .. } => (sun, areas, clipped),
        other => {
            let why = if matches!(other, Study::NoSun { .. }) {
                "the sun is below the horizon: no direct sun, no shadows"
            } else {
                "the sun is behind the sloping ground: the whole site is in the slope's own shade"
            };
            return Ok(format!("At {when} at {}, {why}.\n", model.name));
        }
    };
    let mut t = Table::new(
        format!("Shade on the areas of {} at {when}", model.name),
        vec![
            "area",
            "name",
            "area_m2",
            "existing_m2",
            "existing_pct",
            "proposed_m2",
            "proposed_pct",
            "combined_m2",
            "combined_pct",
        ],
    );
    for a in &areas {
        t.rows.push(vec![
            Cell::text(&a.id),
            Cell::text(&a.name),
            Cell::num(a.area_m2, 1),
            Cell::num(a.existing_m2, 1),
            Cell::num(100.0 * a.fraction(a.existing_m2), 1),
            Cell::num(a.proposed_m2, 1),
            Cell::num(100.0 * a.fraction(a.proposed_m2), 1),
            Cell::num(a.combined_m2, 1),
            Cell::num(100.0 * a.fraction(a.combined_m2), 1),
        ]);
    }
    let ground = if model.ground.slope_deg > 0.0 {
        format!("on ground sloping {}° and facing {}°; areas in plan", model.ground.slope_deg, model.ground.aspect_deg)
    } else {
        "on flat ground".to_string()
    };
    t.notes.push(format!(
        "Sun altitude {:.2}°, azimuth {:.2}° from true north; shadows {ground}.",
        sun.altitude_deg, sun.azimuth_deg
    ));
    if clipped {
        t.notes.push("Low sun: some shadows reach past the analysis extent and are cut there.".into());
    }
    t.notes.push("Indicative; local planning codes and a licensed professional's assessment govern.".into());
    let format = match a.format {
        ShadowFormat::Json => Format::Json,
        ShadowFormat::Csv => Format::Csv,
        _ => Format::Table,
    };
    Ok(t.render(format))
}

#[derive(Debug, Args)]
pub struct ShadowTableArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    /// The local date, YYYY-MM-DD.
    #[arg(long)]
    pub date: String,
    /// Step, minutes from local midnight (1 to 720).
    #[arg(long, default_value_t = sunlot::shadow::DEFAULT_TABLE_STEP_MIN)]
    pub step_min: u32,
    #[command(flatten)]
    pub delta_t: DeltaTArgs,
    /// Output: an aligned table, JSON, or CSV.
    #[arg(long, value_enum, default_value_t = Format::Table)]
    pub format: Format,
}

pub fn run_shadow_table(a: &ShadowTableArgs) -> Result<String, String> {
    let model = a.site.load()?.model;
    let date = args::date(&a.date, "--date")?;
    let rows = shadow_table(&model, date, a.step_min, a.delta_t.delta_t()?)
        .map_err(|e| format!("--{}", input_message(&e).replace('_', "-")))?;
    let mut cols = vec![
        "time".to_string(),
        "altitude_deg".into(),
        "azimuth_deg".into(),
        "shadow_length_m_per_m".into(),
        "shadow_azimuth_deg".into(),
    ];
    cols.extend(model.volumes.iter().map(|v| format!("tip_{}_m", v.id)));
    let mut t =
        Table::new(format!("Shadow lengths at {} on {date} ({}), sunrise to sunset", model.name, model.zone), vec![]);
    t.columns = cols;
    for r in &rows {
        let mut row = vec![
            Cell::text(if a.format == Format::Table {
                model.zone.local(r.time).format("%H:%M").to_string()
            } else {
                args::rfc3339(r.time, &model.zone)
            }),
            Cell::num(r.altitude_deg, 2),
            Cell::num(r.azimuth_deg, 2),
            Cell::num(r.shadow_length_m_per_m, 3),
            Cell::num(r.shadow_azimuth_deg, 1),
        ];
        row.extend(r.tips_m.iter().map(|(_, m)| Cell::num(*m, 1)));
        t.rows.push(row);
    }
    t.notes.push(
        "Flat ground; shadow length per metre of height = 1 / tan(altitude); shadow azimuth = sun azimuth + 180°, clockwise from true north.".into(),
    );
    t.notes.push("tip_<volume>_m: distance from the volume's face to the tip of the shadow of its top.".into());
    if rows.is_empty() {
        t.notes.insert(0, "The sun does not rise on this date.".into());
    }
    Ok(t.render(a.format))
}

/// What `convert` writes.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum SiteFormat {
    /// sunlot's site file (plan metres).
    Site,
    /// GeoJSON FeatureCollection (WGS84).
    Geojson,
}

#[derive(Debug, Args)]
pub struct ConvertArgs {
    #[command(flatten)]
    pub site: SiteFileArgs,
    /// Format to write on standard output.
    #[arg(long, value_enum)]
    pub format: SiteFormat,
}

pub fn run_convert(a: &ConvertArgs) -> Result<String, String> {
    let model = a.site.load()?.model;
    Ok(match a.format {
        SiteFormat::Site => model.to_json(),
        SiteFormat::Geojson => model.to_geojson(),
    } + "\n")
}
