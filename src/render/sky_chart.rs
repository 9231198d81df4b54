//! The sun-path diagram: the sky seen from a point of the site, with the sun's daily paths on chosen
//! dates, hour lines in local clock time (each an analemma over the year), the sun at a moment, and
//! the obstruction skyline, so the hours a point is shaded can be read off.
//!
//! Projections of the sky hemisphere (common practice for sun-path diagrams): stereographic,
//! r = R·tan(z / 2) / tan 45° for zenith angle z; equidistant, r = R·z / 90°; both with north up and
//! east to the right as seen looking down on a plan (azimuth clockwise); and rectangular, azimuth
//! across (0–360°, north at both edges) and altitude up.

use chrono::{DateTime, Duration, NaiveDate, NaiveTime, Utc};

use super::draw::{heading, Anchor, Colour, Draw, INK, LABEL_PX, MUTED, PAPER, TEXT_PX};
use super::hatch::hatch_segments;
use crate::exposure::Massing;
use crate::shadow::{analysis_extent, skyline, Receiver, ViewPoint};
use crate::site::SiteModel;
use crate::solar::{Atmosphere, Ephemeris, InputError, Site};
use crate::time::{DeltaT, Fold, Zone};

const GRID: Colour = Colour::rgb(200, 200, 200);
const HOUR: Colour = Colour::rgb(150, 130, 110);
/// The obstructed sky: a pale veil, hatched, under a dark skyline.
const OBSTRUCTION: Colour = Colour { r: 70, g: 70, b: 70, a: 60 };
const OBSTRUCTION_LINE: Colour = Colour::rgb(70, 70, 70);
const SUN: Colour = Colour::rgb(230, 159, 0);

/// Colours of the day paths, sunlot's own: winter deep blue through the equinox's near-black to
/// summer deep red-orange, in the order of the sun's height, every one dark enough to read on white
/// paper (CIE L* 25–55) and ordered in lightness and hue so neighbours stay apart for readers with
/// red-green colour-vision deficiency. Index 0 is December, 6 June (see `key` in [`draw_sky_chart`]).
const PATH_COLOURS: [Colour; 7] = [
    Colour::rgb(24, 52, 130),
    Colour::rgb(40, 96, 168),
    Colour::rgb(48, 128, 150),
    Colour::rgb(40, 40, 40),
    Colour::rgb(170, 110, 20),
    Colour::rgb(196, 80, 24),
    Colour::rgb(160, 36, 24),
];

/// How the sky is drawn.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Projection {
    /// Polar, stereographic.
    Stereographic,
    /// Polar, equidistant in zenith angle.
    Equidistant,
    /// Azimuth across, altitude up.
    Rectangular,
}

/// A sun-path diagram to draw.
#[derive(Debug, Clone)]
pub struct SkyChart {
    /// Title line.
    pub title: String,
    /// Where.
    pub site: Site,
    /// The zone of the hour lines and labels.
    pub zone: Zone,
    /// Dates whose day paths are drawn, each with a label.
    pub dates: Vec<(NaiveDate, String)>,
    /// Year of the hour lines' analemmas.
    pub year: i32,
    /// The sun at this moment is marked, if given.
    pub now: Option<DateTime<Utc>>,
    /// Obstruction skyline as (true azimuth, altitude) pairs, degrees, in azimuth order.
    pub skyline: Vec<(f64, f64)>,
    /// Projection.
    pub projection: Projection,
    /// ΔT.
    pub delta_t: DeltaT,
}

impl SkyChart {
    /// The chart of `model`'s site: day paths on `dates` (default: the 21st of every month of
    /// `year`), the sun at `now`, and, seen `from` a point with a massing, the obstruction skyline at
    /// 1° steps.
    ///
    /// # Errors
    /// [`SkyChartError`]: more dates than [`crate::limits::MAX_SKY_DATES`], or a point whose skyline
    /// cannot be traced.
    pub fn for_site(model: &SiteModel, request: SkyChartRequest) -> Result<SkyChart, SkyChartError> {
        let SkyChartRequest { year, dates, now, from, projection, delta_t } = request;
        if let Some(d) = &dates {
            crate::limits::within("dates", d.len() as f64, crate::limits::MAX_SKY_DATES as f64, "day paths")
                .map_err(SkyChartError::Dates)?;
        }
        let mut title = super::titled("Sun path", &model.name);
        let mut sky = Vec::new();
        if let Some((p, massing)) = from {
            let volumes: Vec<_> = model.volumes.iter().filter(|v| massing.includes(v.status)).cloned().collect();
            let walls: Vec<_> = model.walls.iter().filter(|w| massing.includes(w.status)).cloned().collect();
            let reach = analysis_extent(model).map_or(1_000.0, |r| r.width().hypot(r.height()));
            let ground = Receiver::on(&model.ground, model.plan_rotation_deg, 0.0);
            title =
                super::titled(&format!("Sun path and skyline from ({}, {}, {} m)", p.x_m, p.y_m, p.z_m), &model.name);
            sky = skyline(p, &volumes, &walls, &ground, 1.0, reach)
                .map_err(SkyChartError::Point)?
                .into_iter()
                .map(|(az, alt)| ((az + model.plan_rotation_deg).rem_euclid(360.0), alt))
                .collect();
            sky.sort_by(|x, y| x.0.total_cmp(&y.0));
        }
        Ok(SkyChart {
            title,
            site: model.location,
            zone: model.zone,
            dates: dates.unwrap_or_else(|| monthly_dates(year)),
            year,
            now,
            skyline: sky,
            projection,
            delta_t,
        })
    }
}

/// What a sun-path diagram shows (see [`SkyChart::for_site`]).
#[derive(Debug, Clone)]
pub struct SkyChartRequest {
    /// Year of the day paths and hour lines.
    pub year: i32,
    /// Dates of the day paths with their labels; `None`: the 21st of every month.
    pub dates: Option<Vec<(NaiveDate, String)>>,
    /// The sun marked at this moment.
    pub now: Option<DateTime<Utc>>,
    /// The point the skyline is seen from, and the massing that makes it.
    pub from: Option<(ViewPoint, Massing)>,
    pub projection: Projection,
    pub delta_t: DeltaT,
}

impl SkyChartRequest {
    /// The year's monthly paths in the stereographic projection, no sun, no skyline.
    pub fn year(year: i32) -> Self {
        SkyChartRequest {
            year,
            dates: None,
            now: None,
            from: None,
            projection: Projection::Stereographic,
            delta_t: DeltaT::EspenakMeeus,
        }
    }
}

/// Why a sun-path diagram cannot be made; each variant names its field.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum SkyChartError {
    /// More day paths than allowed.
    #[error("{0}")]
    Dates(crate::limits::OverBudget),
    /// The point the skyline is seen from.
    #[error("{0}")]
    Point(crate::shadow::ShadowError),
}

/// The default dates: the 21st of every month, labelled (solstices and equinoxes fall within two days
/// of it; common practice for sun-path diagrams).
pub fn monthly_dates(year: i32) -> Vec<(NaiveDate, String)> {
    (1..=12).filter_map(|m| NaiveDate::from_ymd_opt(year, m, 21).map(|d| (d, d.format("%d %b").to_string()))).collect()
}

/// (azimuth, altitude) of the sun, true north, apparent altitude.
/// The sun's azimuth and refracted altitude, degrees, through the figures' daily interpolated
/// ephemeris (within 1e-6° of the direct NREL SPA; the charts ask for thousands of positions).
fn sun(eph: &mut Ephemeris, site: &Site, t: DateTime<Utc>, dt: DeltaT) -> Result<(f64, f64), InputError> {
    let p = eph.sun_at(t, dt)?.observe(site, &Atmosphere::default());
    Ok((p.azimuth_deg, p.altitude_deg))
}

/// The chart's plotting area and projection.
struct Frame {
    projection: Projection,
    cx: f64,
    cy: f64,
    r: f64,
    x0: f64,
    y0: f64,
    w: f64,
    h: f64,
}

impl Frame {
    /// Pixel position of (azimuth, altitude).
    fn at(&self, az: f64, alt: f64) -> (f64, f64) {
        let alt = alt.clamp(0.0, 90.0);
        match self.projection {
            Projection::Rectangular => {
                (self.x0 + az.rem_euclid(360.0) / 360.0 * self.w, self.y0 + self.h * (1.0 - alt / 90.0))
            }
            p => {
                let z = 90.0 - alt;
                let rho = if p == Projection::Stereographic { (z / 2.0).to_radians().tan() } else { z / 90.0 };
                let (s, c) = az.to_radians().sin_cos();
                (self.cx + self.r * rho * s, self.cy - self.r * rho * c)
            }
        }
    }
}

/// Splits a path where it wraps across north on the rectangular projection.
fn polylines(frame: &Frame, pts: &[(f64, f64)]) -> Vec<Vec<(f64, f64)>> {
    let mut out: Vec<Vec<(f64, f64)>> = vec![Vec::new()];
    let mut last: Option<f64> = None;
    for &(az, alt) in pts {
        if frame.projection == Projection::Rectangular && last.is_some_and(|l| (az - l).abs() > 180.0) {
            out.push(Vec::new());
        }
        if let Some(line) = out.last_mut() {
            line.push(frame.at(az, alt));
        }
        last = Some(az);
    }
    out.retain(|l| l.len() > 1);
    out
}

/// Draws the chart onto `d`.
///
/// # Errors
/// [`InputError`] when the solar engine refuses a date (out of its years).
pub fn draw_sky_chart(d: &mut dyn Draw, chart: &SkyChart) -> Result<(), InputError> {
    let (w, h) = d.size();
    let (w, h) = (f64::from(w), f64::from(h));
    let mut eph = Ephemeris::for_figures();
    d.fill_rect(0.0, 0.0, w, h, PAPER);
    let sub = format!(
        "{:.3}° {}, {:.3}° {}, clock times {}",
        chart.site.latitude_deg.abs(),
        if chart.site.latitude_deg >= 0.0 { "N" } else { "S" },
        chart.site.longitude_deg.abs(),
        if chart.site.longitude_deg >= 0.0 { "E" } else { "W" },
        chart.zone
    );
    let top = heading(d, &chart.title, &sub);
    let layout = SkyLayout::of((w, h), top, chart.projection);
    draw_obstruction(d, &layout.frame, chart);
    draw_grid(d, &layout.frame, chart);
    draw_hour_lines(d, &layout.frame, chart, &mut eph)?;
    let (legend, boxes) = draw_day_paths(d, &layout, chart, &mut eph)?;
    draw_sun(d, &layout.frame, chart, &mut eph, &boxes)?;
    draw_key_notes(d, &layout, chart, legend.len());
    d.text(24.0, h - 14.0, LABEL_PX, "Indicative; NREL SPA positions.", MUTED, Anchor::Start);
    Ok(())
}

/// Where a sun-path diagram's parts go on a figure: the chart's frame and the key's column.
struct SkyLayout {
    frame: Frame,
    /// Left of the key column, and the top of the drawing (below the heading), pixels.
    key_x: f64,
    top: f64,
}

impl SkyLayout {
    /// The layout of a figure `(w, h)` pixels whose heading ends at `top`.
    fn of((w, h): (f64, f64), top: f64, projection: Projection) -> Self {
        let (plot_w, plot_h) = (w - 240.0, h - top - 40.0);
        let r = (plot_w.min(plot_h) / 2.0 - 28.0).max(10.0);
        let frame = Frame {
            projection,
            cx: 24.0 + plot_w / 2.0,
            cy: top + plot_h / 2.0,
            r,
            x0: 48.0,
            y0: top + 10.0,
            w: plot_w - 48.0,
            h: plot_h - 50.0,
        };
        SkyLayout { frame, key_x: w - 200.0, top }
    }
}

/// The obstructed sky: the skyline filled down to the horizon, under everything.
fn draw_obstruction(d: &mut dyn Draw, frame: &Frame, chart: &SkyChart) {
    if chart.skyline.len() > 1 {
        let mut ring: Vec<(f64, f64)> = chart.skyline.iter().map(|&(az, alt)| frame.at(az, alt)).collect();
        if chart.projection == Projection::Rectangular {
            ring.push(frame.at(359.999, chart.skyline[0].1));
            ring.push(frame.at(359.999, 0.0));
            ring.push(frame.at(0.0, 0.0));
            obstruction(d, &[ring]);
        } else {
            // Between the horizon circle and the skyline: the horizon as the outer ring, the skyline
            // as a hole (even-odd), so only the obstructed band is filled.
            let horizon: Vec<(f64, f64)> = (0..360).map(|a| frame.at(f64::from(a), 0.0)).collect();
            obstruction(d, &[horizon, ring.clone()]);
        }
        for line in polylines(frame, &chart.skyline) {
            d.stroke(&line, 1.5, OBSTRUCTION_LINE, chart.projection != Projection::Rectangular);
        }
    }
}

/// Altitude rings and azimuth spokes with their labels.
fn draw_grid(d: &mut dyn Draw, frame: &Frame, chart: &SkyChart) {
    for alt in (0..90).step_by(10) {
        let alt = f64::from(alt);
        let line: Vec<(f64, f64)> = (0..=360).map(|a| frame.at(f64::from(a), alt)).collect();
        d.stroke(&line, if alt == 0.0 { 1.5 } else { 0.7 }, if alt == 0.0 { INK } else { GRID }, false);
        if alt > 0.0 {
            let (x, y) = frame.at(0.0, alt);
            d.text(x + 4.0, y + 14.0, LABEL_PX, &format!("{alt:.0}°"), MUTED, Anchor::Start);
        }
    }
    for az in (0..360).step_by(30) {
        let az = f64::from(az);
        d.stroke(&[frame.at(az, 0.0), frame.at(az, 90.0)], 0.7, GRID, false);
        let label = match az as i32 {
            0 => "N".to_string(),
            90 => "E".to_string(),
            180 => "S".to_string(),
            270 => "W".to_string(),
            a => format!("{a}°"),
        };
        let (x, y) = match chart.projection {
            Projection::Rectangular => (frame.at(az, 0.0).0, frame.y0 + frame.h + 20.0),
            _ => {
                let (s, c) = az.to_radians().sin_cos();
                (frame.cx + (frame.r + 18.0) * s, frame.cy - (frame.r + 18.0) * c + 5.0)
            }
        };
        d.text(x, y, TEXT_PX, &label, INK, Anchor::Middle);
    }
}

/// Hour lines: the sun at each whole local hour on every third day of the year, each labelled in a
/// ring at its summer end.
fn draw_hour_lines(d: &mut dyn Draw, frame: &Frame, chart: &SkyChart, eph: &mut Ephemeris) -> Result<(), InputError> {
    let dt = chart.delta_t;
    let jan1 = NaiveDate::from_ymd_opt(chart.year, 1, 1).ok_or(InputError::YearOutOfRange { year: chart.year })?;
    for hour in 0..24 {
        // Points of one UTC offset and above the horizon form one line; a daylight-saving change
        // breaks the clock-time figure into two.
        let mut pts: Vec<(f64, f64)> = Vec::new();
        let mut offset: Option<i32> = None;
        // The hour is labelled at the highest point of its figure (the summer-solstice end).
        let mut best: Option<(f64, f64)> = None;
        let flush = |d: &mut dyn Draw, pts: &mut Vec<(f64, f64)>| {
            for line in polylines(frame, pts) {
                d.stroke(&line, 0.8, HOUR, false);
            }
            pts.clear();
        };
        for k in (0..366).step_by(3) {
            let date = jan1 + Duration::days(k);
            let Some(time) = NaiveTime::from_hms_opt(hour, 0, 0) else { continue };
            let Ok(t) = chart.zone.resolve(date.and_time(time), Fold::Earlier) else { continue };
            let off = chart.zone.local(t).offset().local_minus_utc();
            if offset.is_some_and(|o| o != off) {
                flush(d, &mut pts);
            }
            offset = Some(off);
            let (az, alt) = sun(eph, &chart.site, t, dt)?;
            if alt > 2.0 && best.is_none_or(|b| alt > b.1) {
                best = Some((az, alt));
            }
            if alt > 0.0 {
                pts.push((az, alt));
            } else {
                flush(d, &mut pts);
            }
        }
        flush(d, &mut pts);
        if let Some((az, alt)) = best {
            // The hour in a small ring at the figure's summer end.
            let (x, y) = frame.at(az, alt);
            let ring: Vec<(f64, f64)> = (0..20)
                .map(|k| {
                    let a = f64::from(k) * 18f64.to_radians();
                    (x + 10.0 * a.cos(), y - 12.0 + 10.0 * a.sin())
                })
                .collect();
            d.fill_polygon(std::slice::from_ref(&ring), PAPER);
            d.stroke(&ring, 0.8, HOUR, true);
            d.text(x, y - 8.0, 11.0, &format!("{hour}"), Colour::rgb(110, 90, 70), Anchor::Middle);
        }
    }

    Ok(())
}

/// A label's box on the chart: left, top, right, bottom, pixels.
type LabelBox = (f64, f64, f64, f64);
/// A row of the day paths' key: colour index, the dates' labels.
type KeyRow = (usize, String);
/// A colour's highest point on its path: colour index, (azimuth, altitude) in degrees.
type PathTop = (usize, (f64, f64));

/// The colours of the day paths and their key's rows.
struct PathKey {
    /// Every date is a 21st: the 21st of month m and of month 12 − m follow nearly the same path
    /// (a month either side of a solstice) and share a colour and one row of the key.
    paired: bool,
    /// The key's rows: colour index, the dates' labels.
    rows: Vec<KeyRow>,
}

impl PathKey {
    fn of(chart: &SkyChart) -> Self {
        let paired = chart.dates.iter().all(|(d, _)| chrono::Datelike::day(d) == 21);
        let mut key = PathKey { paired, rows: Vec::new() };
        for (k, (date, label)) in chart.dates.iter().enumerate() {
            let c = key.colour(k, date);
            match key.rows.iter_mut().find(|(j, _)| *j == c) {
                Some((_, text)) => *text = format!("{text}, {label}"),
                None => key.rows.push((c, label.clone())),
            }
        }
        if paired {
            key.rows.sort_by_key(|(c, _)| *c);
        }
        key
    }

    /// The colour index of the `k`th date, `date`.
    fn colour(&self, k: usize, date: &NaiveDate) -> usize {
        if !self.paired {
            return k % PATH_COLOURS.len();
        }
        let m = chrono::Datelike::month(date) as usize;
        if m == 12 {
            0
        } else {
            m.min(12 - m)
        }
    }
}

/// The day paths, their key and their labels on the chart; returns the key's rows (colour, label) and
/// the boxes of the labels drawn on the chart.
fn draw_day_paths(
    d: &mut dyn Draw,
    layout: &SkyLayout,
    chart: &SkyChart,
    eph: &mut Ephemeris,
) -> Result<(Vec<KeyRow>, Vec<LabelBox>), InputError> {
    let key = PathKey::of(chart);
    draw_path_key(d, layout, &key.rows);
    let tops = draw_paths(d, &layout.frame, chart, eph, &key)?;
    let boxes = draw_path_labels(d, &layout.frame, &key, tops);
    Ok((key.rows, boxes))
}

/// The key of the day paths in the key column.
fn draw_path_key(d: &mut dyn Draw, layout: &SkyLayout, rows: &[KeyRow]) {
    let (key_x, top) = (layout.key_x, layout.top);
    d.text(key_x, top + 10.0, TEXT_PX, "Day paths", INK, Anchor::Start);
    for (row, (c, label)) in rows.iter().enumerate() {
        let ly = top + 36.0 + 22.0 * row as f64;
        d.stroke(&[(key_x, ly - 5.0), (key_x + 26.0, ly - 5.0)], path_width(*c), PATH_COLOURS[*c], false);
        d.text(key_x + 34.0, ly, LABEL_PX, label, INK, Anchor::Start);
    }
}

/// Each date's path (the sun every 5 minutes while it is up); returns each colour's highest point
/// (azimuth, altitude, degrees), where its label goes.
fn draw_paths(
    d: &mut dyn Draw,
    frame: &Frame,
    chart: &SkyChart,
    eph: &mut Ephemeris,
    key: &PathKey,
) -> Result<Vec<PathTop>, InputError> {
    let mut tops: Vec<PathTop> = Vec::new();
    for (k, (date, _)) in chart.dates.iter().enumerate() {
        let c = key.colour(k, date);
        let start = chart.zone.start_of_day(*date);
        let mut pts = Vec::new();
        for m in (0..=24 * 60).step_by(5) {
            let (az, alt) = sun(eph, &chart.site, start + Duration::minutes(m), chart.delta_t)?;
            if alt > 0.0 {
                pts.push((az, alt));
            }
        }
        for line in polylines(frame, &pts) {
            d.stroke(&line, path_width(c), PATH_COLOURS[c], false);
        }
        if let Some(high) = pts.iter().copied().max_by(|a, b| a.1.total_cmp(&b.1)) {
            if !tops.iter().any(|(j, _)| *j == c) {
                tops.push((c, high));
            }
        }
    }
    Ok(tops)
}

/// Each colour's label at its path's highest point (the day dropped when every date is a 21st),
/// neighbouring paths' labels on alternate sides; returns their boxes, which the sun's label keeps
/// off.
fn draw_path_labels(
    d: &mut dyn Draw,
    frame: &Frame,
    key: &PathKey,
    mut tops: Vec<(usize, (f64, f64))>,
) -> Vec<LabelBox> {
    let mut boxes: Vec<LabelBox> = Vec::new();
    tops.sort_by(|a, b| a.1 .1.total_cmp(&b.1 .1));
    for (n, (c, (az, alt))) in tops.into_iter().enumerate() {
        let Some((_, text)) = key.rows.iter().find(|(j, _)| *j == c) else { continue };
        let text = if key.paired { text.replace("21 ", "") } else { text.clone() };
        let (x, y) = frame.at(az, alt);
        let tw = d.measure_px(LABEL_PX, &text);
        let (left, anchor, tx) =
            if n % 2 == 0 { (x + 6.0, Anchor::Start, x + 9.0) } else { (x - tw - 12.0, Anchor::End, x - 9.0) };
        d.fill_rect(left, y - 16.0, tw + 6.0, 16.0, Colour { a: 210, ..PAPER });
        d.text(tx, y - 4.0, LABEL_PX, &text, PATH_COLOURS[c], anchor);
        boxes.push((left, y - 16.0, left + tw + 6.0, y));
    }
    boxes
}

/// The sun at the chart's moment, if it is up, labelled clear of `boxes`.
fn draw_sun(
    d: &mut dyn Draw,
    frame: &Frame,
    chart: &SkyChart,
    eph: &mut Ephemeris,
    boxes: &[LabelBox],
) -> Result<(), InputError> {
    if let Some(t) = chart.now {
        let (az, alt) = sun(eph, &chart.site, t, chart.delta_t)?;
        if alt > 0.0 {
            let (x, y) = frame.at(az, alt);
            let disc: Vec<(f64, f64)> = (0..24)
                .map(|k| {
                    let a = f64::from(k) * 15f64.to_radians();
                    (x + 7.0 * a.cos(), y + 7.0 * a.sin())
                })
                .collect();
            d.fill_polygon(std::slice::from_ref(&disc), SUN);
            d.stroke(&disc, 1.0, INK, true);
            let label = chart.zone.local(t).format("sun at %H:%M").to_string();
            // Beside the disc, on the first side clear of the paths' labels (above right, below right,
            // above left, below left), on a paper backing.
            let (tw, th) = (d.measure_px(TEXT_PX, &label) + 6.0, TEXT_PX + 4.0);
            let sides = [
                (x + 10.0, y - 10.0 - th),
                (x + 10.0, y + 10.0),
                (x - 10.0 - tw, y - 10.0 - th),
                (x - 10.0 - tw, y + 10.0),
            ];
            let clear =
                |&(bx, by): &(f64, f64)| boxes.iter().all(|b| bx + tw < b.0 || bx > b.2 || by + th < b.1 || by > b.3);
            let (bx, by) = sides.iter().copied().find(clear).unwrap_or(sides[0]);
            d.fill_rect(bx, by, tw, th, Colour { a: 210, ..PAPER });
            d.text(bx + 3.0, by + th - 5.0, TEXT_PX, &label, INK, Anchor::Start);
        }
    }
    Ok(())
}

/// Under the key's `rows` day paths: the obstruction's swatch and the note on hour lines.
fn draw_key_notes(d: &mut dyn Draw, layout: &SkyLayout, chart: &SkyChart, rows: usize) {
    let (key_x, top) = (layout.key_x, layout.top);
    let mut y = top + 36.0 + 22.0 * rows as f64 + 14.0;
    if !chart.skyline.is_empty() {
        let swatch = vec![(key_x, y - 12.0), (key_x + 26.0, y - 12.0), (key_x + 26.0, y + 4.0), (key_x, y + 4.0)];
        obstruction(d, std::slice::from_ref(&swatch));
        d.stroke(&swatch, 1.0, OBSTRUCTION_LINE, true);
        d.text(key_x + 34.0, y, LABEL_PX, "sky hidden by", INK, Anchor::Start);
        d.text(key_x + 34.0, y + 17.0, LABEL_PX, "buildings and ground", INK, Anchor::Start);
        y += 44.0;
    }
    for (k, line) in super::draw::wrap_on(
        d,
        "Hour lines: the sun at each whole hour of local clock time through the year.",
        LABEL_PX,
        190.0,
    )
    .iter()
    .enumerate()
    {
        d.text(key_x, y + 17.0 * k as f64, LABEL_PX, line, MUTED, Anchor::Start);
    }
}

/// Line width of day path colour `c`: the solstices and equinoxes heavier.
fn path_width(c: usize) -> f64 {
    if matches!(c, 0 | 3 | 6) {
        2.8
    } else {
        1.6
    }
}

/// Fills the obstructed sky in `rings` (even-odd): a pale veil with hatching.
fn obstruction(d: &mut dyn Draw, rings: &[Vec<(f64, f64)>]) {
    d.fill_polygon(rings, OBSTRUCTION);
    for [a, b] in hatch_segments(rings, 6.0) {
        d.stroke(&[a, b], 0.8, OBSTRUCTION_LINE, false);
    }
}

#[cfg(all(test, not(target_arch = "wasm32")))]
mod tests {
    use super::*;

    /// The layout keeps the chart's round and its labels clear of the key column and inside the figure,
    /// at the design size and at the smallest size the widgets draw.
    #[test]
    fn the_layout_keeps_the_chart_clear_of_the_key() {
        for (w, h) in [(900.0, 720.0), (640.0, 512.0)] {
            let l = SkyLayout::of((w, h), 90.0, Projection::Stereographic);
            let f = &l.frame;
            // The compass labels sit 18 px outside the horizon ring and are about 20 px wide.
            assert!(f.cx + f.r + 18.0 + 20.0 < l.key_x, "{w}: {} + {} vs {}", f.cx, f.r, l.key_x);
            assert!(f.cx - f.r - 38.0 > 0.0 && f.cy - f.r - 18.0 > l.top - 10.0 && f.cy + f.r + 24.0 < h, "{w}");
            assert_eq!(f.at(0.0, 90.0), (f.cx, f.cy), "the zenith at the centre");
            let (x, y) = f.at(90.0, 0.0);
            assert!((x - (f.cx + f.r)).abs() < 1e-9 && (y - f.cy).abs() < 1e-9, "east on the horizon at the right");
        }
    }
    use crate::render::Pixmap;

    #[test]
    fn the_chart_draws_paths_where_the_sun_is() {
        let site = Site { latitude_deg: 52.0, longitude_deg: 0.0, elevation_m: 0.0 };
        let zone: Zone = "UTC".parse().unwrap();
        let june = NaiveDate::from_ymd_opt(2026, 6, 21).unwrap();
        let chart = SkyChart {
            title: "t".into(),
            site,
            zone,
            dates: vec![(june, "21 Jun".into())],
            year: 2026,
            now: None,
            skyline: vec![],
            projection: Projection::Stereographic,
            delta_t: DeltaT::EspenakMeeus,
        };
        let mut px = Pixmap::new(900, 700);
        draw_sky_chart(&mut px, &chart).unwrap();
        // Solar noon at 52° N on the June solstice: altitude 90 − 52 + 23.44 = 61.44°, due south
        // (common practice); the path's colour is found at that point of the chart.
        let top = heading(&mut crate::render::Svg::new(900, 700), &chart.title, "52.000° N, 0.000° E, clock times UTC");
        let frame_r = ((900.0_f64 - 240.0).min(700.0 - top - 40.0) / 2.0 - 28.0).max(10.0);
        let (cx, cy) = (24.0 + (900.0 - 240.0) / 2.0, top + (700.0 - top - 40.0) / 2.0);
        let rho = ((90.0_f64 - 61.44) / 2.0).to_radians().tan();
        let (x, y) = (cx, cy + frame_r * rho);
        let c = PATH_COLOURS[6]; // June: the solstice colour of the paired monthly scheme
        let r = px.render().unwrap();
        let found = (-3..=3).any(|dy| r.rgb(x as u32, (y + f64::from(dy)) as u32) == [c.r, c.g, c.b]);
        assert!(found, "the June path crosses due south at 61.4°");
    }
}
