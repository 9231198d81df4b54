//! An elevation figure: the faces of a building unfolded side by side, each face's cells in the colour
//! ramp, the site's windows on them outlined and named, with the same legend, title and caution as the
//! ground maps.

use super::draw::{footnote, heading, Anchor, Colour, Draw, Image, INK, PAPER};
use super::layer::draw_legend;
use super::ramp::ramp_colour;
use crate::exposure::{FacadeLayer, FaceMap};

/// Figure width and largest height, pixels; [`elevation_size`] fits the height to the faces.
pub const ELEVATION_PX: (u32, u32) = (1200, 640);

/// Space above the faces (title) and below them (labels, scale bar, notes, caution), pixels.
const TOP_PX: f64 = 110.0;
const BOTTOM_PX: f64 = 120.0;

/// The figure size for `faces`: [`ELEVATION_PX`]'s width, and a height that fits the faces at the
/// scale the width allows (never less than the legend needs).
pub fn elevation_size(faces: &[FaceMap]) -> (u32, u32) {
    let (w, h_max) = (f64::from(ELEVATION_PX.0), f64::from(ELEVATION_PX.1));
    let px_per_m = scale(faces, w - 24.0 - 250.0, h_max - TOP_PX - BOTTOM_PX);
    let tallest = faces.iter().map(|f| f.face.top_m).fold(0.0_f64, f64::max);
    let h = (TOP_PX + tallest * px_per_m + BOTTOM_PX).clamp(TOP_PX + super::layer::LEGEND_PX + 80.0, h_max);
    (ELEVATION_PX.0, h.ceil() as u32)
}

/// Pixels per metre that fit the faces side by side into `width` × `height` pixels.
fn scale(faces: &[FaceMap], width: f64, height: f64) -> f64 {
    let total_m: f64 = faces.iter().map(|f| f.face.length_m()).sum();
    let tallest_m = faces.iter().map(|f| f.face.top_m).fold(0.0_f64, f64::max);
    let gaps = GAP_PX * faces.len().saturating_sub(1) as f64;
    if total_m <= 0.0 || tallest_m <= 0.0 {
        return 0.0;
    }
    ((width - gaps) / total_m).min(height / tallest_m)
}

/// Gap between faces, pixels.
const GAP_PX: f64 = 28.0;

/// An elevation to draw.
#[derive(Debug, Clone)]
pub struct Elevation<'a> {
    /// Title line.
    pub title: String,
    /// Second line (period, settings).
    pub subtitle: String,
    /// The unit of the values, for the legend.
    pub unit: String,
    /// The faces, in order around the building.
    pub faces: &'a [FaceMap],
    /// One value per cell of each face, row-major, row 0 at the bottom.
    pub values: Vec<&'a [f64]>,
    /// Values mapped to the ends of the ramp.
    pub range: (f64, f64),
    /// Footnote (the caution).
    pub caution: String,
}

impl<'a> Elevation<'a> {
    /// The elevation of `layer`'s `values` on `faces` of the building `volume` of the site `site_name`,
    /// the ramp from 0 to the largest value, with the caution.
    pub fn of_layer(
        layer: FacadeLayer,
        faces: &'a [FaceMap],
        values: &'a [Vec<f64>],
        (volume, site_name): (&str, &str),
        subtitle: String,
    ) -> Self {
        let top = values.iter().flatten().copied().fold(0.0_f64, f64::max);
        Elevation {
            title: super::titled(&format!("{} on the faces of {volume}", layer.label()), site_name),
            subtitle,
            unit: layer.unit().into(),
            faces,
            values: values.iter().map(Vec::as_slice).collect(),
            range: (0.0, if top > 0.0 { top } else { 1.0 }),
            caution: crate::rules::CAUTION.into(),
        }
    }
}

/// Draws `e` onto `d` (sized by [`elevation_size`]).
pub fn draw_elevation(d: &mut dyn Draw, e: &Elevation) {
    let (w, h) = d.size();
    let (w, h) = (f64::from(w), f64::from(h));
    d.fill_rect(0.0, 0.0, w, h, PAPER);
    heading(d, &e.title, &e.subtitle);
    let (bx, by, bw, bh) = (24.0, TOP_PX, w - 24.0 - 250.0, h - TOP_PX - BOTTOM_PX);
    let px_per_m = scale(e.faces, bw, bh);
    if px_per_m <= 0.0 {
        footnote(d, &e.caution);
        return;
    }
    let ground_y = by + bh;
    let mut x = bx;
    let grey = Colour::rgb(110, 110, 110);
    for (f, values) in e.faces.iter().zip(&e.values) {
        let fw = f.face.length_m() * px_per_m;
        let (top, bottom) = (ground_y - f.face.top_m * px_per_m, ground_y - f.face.base_m * px_per_m);
        let mut rgba = vec![0u8; f.cols * f.rows * 4];
        for row in 0..f.rows {
            for col in 0..f.cols {
                let c = ramp_colour(values[row * f.cols + col], e.range.0, e.range.1);
                let i = ((f.rows - 1 - row) * f.cols + col) * 4;
                rgba[i..i + 4].copy_from_slice(&[c.r, c.g, c.b, 255]);
            }
        }
        d.image(x, top, fw, bottom - top, &Image { rgba: &rgba, width: f.cols as u32, height: f.rows as u32 });
        d.stroke(&[(x, top), (x + fw, top), (x + fw, bottom), (x, bottom)], 1.0, INK, true);
        for win in &f.windows {
            let cx = x + win.along_m * px_per_m;
            let cy = ground_y - win.z_m * px_per_m;
            let (hw, hh) = (win.width_m * px_per_m / 2.0, win.height_m * px_per_m / 2.0);
            let rect = [(cx - hw, cy - hh), (cx + hw, cy - hh), (cx + hw, cy + hh), (cx - hw, cy + hh)];
            d.stroke(&rect, 3.0, PAPER, true);
            d.stroke(&rect, 1.5, INK, true);
            let tw = d.measure_px(11.0, &win.id);
            d.fill_rect(cx - tw / 2.0 - 2.0, cy - hh - 16.0, tw + 4.0, 14.0, PAPER);
            d.text(cx, cy - hh - 4.0, 11.0, &win.id, INK, Anchor::Middle);
        }
        let label = format!("{} · {} {:.0}°", f.face.number, f.face.compass(), f.face.facing_deg);
        d.text(x + fw / 2.0, ground_y + 18.0, 12.0, &label, INK, Anchor::Middle);
        d.text(x + fw / 2.0, ground_y + 34.0, 11.0, &format!("{:.1} m", f.face.length_m()), grey, Anchor::Middle);
        x += fw + GAP_PX;
    }
    d.stroke(&[(bx - 8.0, ground_y), (x - GAP_PX + 8.0, ground_y)], 1.5, INK, false);
    // A 5 m or 10 m scale bar under the faces.
    let bar_m = if 10.0 * px_per_m < 200.0 { 10.0 } else { 5.0 };
    let y = ground_y + 60.0;
    d.stroke(&[(bx, y), (bx + bar_m * px_per_m, y)], 2.0, INK, false);
    d.text(bx + bar_m * px_per_m + 8.0, y + 4.0, 11.0, &format!("{bar_m:.0} m"), INK, Anchor::Start);
    d.text(
        bx,
        y + 24.0,
        11.0,
        "Faces unfolded left to right, anticlockwise seen from above; each seen from outside.",
        grey,
        Anchor::Start,
    );
    draw_legend(d, w - 200.0, by + 10.0, "", &e.unit, e.range);
    footnote(d, &e.caution);
}

#[cfg(all(test, not(target_arch = "wasm32")))]
mod tests {
    use super::*;
    use crate::exposure::{Face, FaceWindow};
    use crate::render::{Pixmap, Svg};
    use geo::Coord;

    fn face(number: usize, len: f64, facing_deg: f64) -> FaceMap {
        FaceMap {
            face: Face {
                number,
                start: Coord { x: 0.0, y: 0.0 },
                end: Coord { x: len, y: 0.0 },
                base_m: 0.0,
                top_m: 6.0,
                facing_deg,
            },
            cols: 4,
            rows: 3,
            sun_hours: (0..12).map(f64::from).collect(),
            beam_kwh_m2: vec![0.0; 12],
            diffuse_kwh_m2: vec![0.0; 12],
            windows: vec![FaceWindow { id: "w-1".into(), along_m: 2.0, z_m: 1.5, width_m: 1.0, height_m: 1.2 }],
        }
    }

    #[test]
    fn both_back_ends_draw_the_faces_the_windows_and_the_legend() {
        let faces = vec![face(1, 8.0, 180.0), face(2, 4.0, 90.0)];
        let e = Elevation {
            title: "Facade test".into(),
            subtitle: "sub".into(),
            unit: "h".into(),
            values: faces.iter().map(|f| f.sun_hours.as_slice()).collect(),
            faces: &faces,
            range: (0.0, 11.0),
            caution: "caution".into(),
        };
        assert_eq!(elevation_size(&faces), ELEVATION_PX, "6 m tall faces over 12 m fill the height");
        let mut px = Pixmap::new(ELEVATION_PX.0, ELEVATION_PX.1);
        draw_elevation(&mut px, &e);
        // The bottom-left cell of the first face has the lowest value: the ramp's low end, just above
        // the ground line at its left edge.
        let (bw, bh) = (f64::from(ELEVATION_PX.0) - 274.0, f64::from(ELEVATION_PX.1) - 230.0);
        let ppm = ((bw - GAP_PX) / 12.0).min(bh / 6.0);
        let (x, y) = ((24.0 + 0.5 * ppm) as usize, (110.0 + bh - 0.3 * ppm) as usize);
        let lo = ramp_colour(0.0, 0.0, 11.0);
        assert_eq!(px.render().unwrap().rgb(x as u32, y as u32), [lo.r, lo.g, lo.b]);
        let mut svg = Svg::new(ELEVATION_PX.0, ELEVATION_PX.1);
        draw_elevation(&mut svg, &e);
        let text = svg.finish();
        assert!(
            text.contains("Facade test") && text.contains("w-1") && text.contains("1 · S 180°"),
            "{}",
            &text[..200]
        );
    }
}
