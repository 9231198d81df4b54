//! The `sunlot` command line: parse, call the core, print.

mod args;
mod batch;
mod check;
mod compare;
mod day;
mod demo;
mod envelope;
mod facade;
mod figure;
mod hours;
mod insolation;
mod irradiance;
mod maps;
mod output;
mod point;
mod position;
mod progress;
mod seasons;
mod shadows;
mod sky;
mod tiles;
mod timeline;
mod view;
mod window;

use std::io::Write;
use std::process::ExitCode;

use clap::{CommandFactory, FromArgMatches, Parser, Subcommand};

/// Sun-exposure analysis for building lots. Angles in degrees, azimuth clockwise from true north;
/// times as RFC 3339 or local time with an IANA zone. Results are indicative.
#[derive(Debug, Parser)]
#[command(name = "sunlot", version, about, max_term_width = 100)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Debug, Subcommand)]
enum Command {
    /// Where the sun is (altitude, azimuth, zenith, declination, equation of time) at a moment, through
    /// a day, or for every row of a CSV on standard input.
    Position(position::PositionArgs),
    /// Sunrise, solar noon, sunset, day length and civil twilight for local dates.
    Day(day::DayArgs),
    /// Equinox and solstice instants of a year.
    Seasons(seasons::SeasonsArgs),
    /// Clear-sky irradiance (Bird model) on the horizontal and on a tilted surface.
    Irradiance(irradiance::IrradianceArgs),
    /// A site's shadows at a moment: polygons (GeoJSON) and the shade on each area.
    Shadows(shadows::ShadowsArgs),
    /// A site's shadow-length table through a day: sun angles, length per metre, each volume's tip.
    ShadowTable(shadows::ShadowTableArgs),
    /// Hours of direct sun per cell over a site's areas, for a date or a range, in a daily window.
    Hours(hours::HoursArgs),
    /// A sun-hours map cut into tiles for separate processes or machines: the plan, one tile, or the
    /// whole extent, each as a file of 32-bit floats.
    Tiles(tiles::TilesArgs),
    /// Stitches tile files from `sunlot tiles --index` into one map (refusing gaps and disagreements).
    Stitch(tiles::StitchArgs),
    /// Clear-sky energy per cell (kWh/m²): beam in direct sun plus diffuse by each cell's sky view.
    Insolation(insolation::InsolationArgs),
    /// Sun before and after the proposal, area by area, with maps of the hours lost and the ratio.
    Compare(compare::CompareArgs),
    /// Check a site against a sunlight rule (a published preset or a rule file), area by area.
    Check(check::CheckArgs),
    /// The solar envelope of a lot: the height each cell may reach without shading protected areas.
    Envelope(envelope::EnvelopeArgs),
    /// A point's day: the intervals of direct sun and shade, with times and what shades it.
    Timeline(timeline::TimelineArgs),
    /// A point's year: direct-sun hours and clear-sky insolation per month.
    Year(timeline::YearArgs),
    /// A window's vertical sky component and hours of direct sun, existing and with the proposal.
    Window(window::WindowArgs),
    /// Hours of direct sun and clear-sky beam on every face of a building, drawn as elevations.
    Facade(facade::FacadeArgs),
    /// The sun-path diagram of a site (PNG or SVG), with the skyline seen from a point.
    Sky(sky::SkyArgs),
    /// A 3-D view of a site's massing at a moment (PNG or SVG): faces shaded by the sun, exact shadows
    /// on the ground, roofs and walls.
    View(view::ViewArgs),
    /// Convert a site between sunlot's site file and GeoJSON.
    Convert(shadows::ConvertArgs),
    /// Whether a point of a site (a window, a balcony) is in direct sun, and the skyline it sees.
    Point(point::PointArgs),
    /// The sun at the built-in, invented demo site through the year's key dates.
    Demo(demo::DemoArgs),
}

/// The arguments, with negative numbers read as values in every command (`--pressure-hpa -5` is then
/// refused by its range, not taken for a flag).
fn parse() -> Cli {
    let mut cmd = Cli::command();
    let names: Vec<String> = cmd.get_subcommands().map(|s| s.get_name().to_string()).collect();
    for name in names {
        cmd = cmd.mut_subcommand(name, |s| s.allow_negative_numbers(true));
    }
    let matches = cmd.get_matches();
    Cli::from_arg_matches(&matches).unwrap_or_else(|e| e.exit())
}

fn main() -> ExitCode {
    let cli = parse();
    let result = match &cli.command {
        Command::Position(a) => position::run(a),
        Command::Day(a) => day::run(a),
        Command::Seasons(a) => seasons::run(a),
        Command::Irradiance(a) => irradiance::run(a),
        Command::Shadows(a) => shadows::run_shadows(a),
        Command::ShadowTable(a) => shadows::run_shadow_table(a),
        Command::Hours(a) => hours::run(a),
        Command::Tiles(a) => tiles::run_tiles(a),
        Command::Stitch(a) => tiles::run_stitch(a),
        Command::Insolation(a) => insolation::run(a),
        Command::Compare(a) => compare::run(a),
        Command::Check(a) => check::run(a),
        Command::Envelope(a) => envelope::run(a),
        Command::Timeline(a) => timeline::run_timeline(a),
        Command::Year(a) => timeline::run_year(a),
        Command::Window(a) => window::run(a),
        Command::Facade(a) => facade::run(a),
        Command::Sky(a) => sky::run(a),
        Command::View(a) => view::run(a),
        Command::Convert(a) => shadows::run_convert(a),
        Command::Point(a) => point::run(a),
        Command::Demo(a) => demo::run(a),
    };
    match result {
        Ok(text) => {
            let mut out = std::io::stdout().lock();
            if out.write_all(text.as_bytes()).and_then(|_| out.flush()).is_err() {
                return ExitCode::from(1);
            }
            ExitCode::SUCCESS
        }
        Err(message) => {
            eprintln!("sunlot: error: {message}");
            ExitCode::from(2)
        }
    }
}
