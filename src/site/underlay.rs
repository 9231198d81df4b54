//! Placing a scanned site plan under the plan: the similarity transform (scale, rotation, shift)
//! from the image's pixels to plan metres given two reference points on the image, where the first
//! lies on the plan, the distance between them and, optionally, the plan bearing from the first to
//! the second.

use thiserror::Error;

/// Image pixels (u right, v down) to plan metres (x east, y north):
/// `x = a·u + c·v + e`, `y = b·u + d·v + f`.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize)]
pub struct Placement {
    /// ∂x/∂u, metres per pixel.
    pub a: f64,
    /// ∂y/∂u.
    pub b: f64,
    /// ∂x/∂v.
    pub c: f64,
    /// ∂y/∂v.
    pub d: f64,
    /// x of the image's pixel (0, 0), metres.
    pub e: f64,
    /// y of the image's pixel (0, 0), metres.
    pub f: f64,
}

/// Why reference points do not place an image.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum UnderlayError {
    /// The two image points coincide.
    #[error("imageA, imageB: the two reference points are the same pixel")]
    SamePoint,
    /// A distance that is not a positive length.
    #[error("distanceM: {0} is not a positive length in metres")]
    Distance(f64),
    /// A coordinate or bearing that is not a finite number.
    #[error("{0}: not a finite number")]
    NotFinite(&'static str),
}

impl Placement {
    /// The placement that puts image pixel `a_px` at plan point `a_plan`, image pixel `b_px`
    /// `distance_m` metres from it, on the plan bearing `bearing_deg` (degrees clockwise from the
    /// plan's north) from A to B; `None` keeps the image's up as the plan's north.
    ///
    /// # Errors
    /// [`UnderlayError`] for coincident image points, a non-positive distance or non-finite input.
    pub fn from_reference(
        a_px: (f64, f64),
        b_px: (f64, f64),
        a_plan: (f64, f64),
        distance_m: f64,
        bearing_deg: Option<f64>,
    ) -> Result<Placement, UnderlayError> {
        for (v, field) in [(a_px.0, "imageA"), (a_px.1, "imageA"), (b_px.0, "imageB"), (b_px.1, "imageB")]
            .into_iter()
            .chain([(a_plan.0, "planA"), (a_plan.1, "planA"), (bearing_deg.unwrap_or(0.0), "bearingDeg")])
        {
            if !v.is_finite() {
                return Err(UnderlayError::NotFinite(field));
            }
        }
        if !(distance_m.is_finite() && distance_m > 0.0) {
            return Err(UnderlayError::Distance(distance_m));
        }
        let (du, dv) = (b_px.0 - a_px.0, b_px.1 - a_px.1);
        let len_px = du.hypot(dv);
        if len_px == 0.0 {
            return Err(UnderlayError::SamePoint);
        }
        let s = distance_m / len_px;
        // Bearing of A→B as drawn (image up taken as north), and the turn onto the wanted bearing.
        let drawn = du.atan2(-dv);
        let turn = bearing_deg.map_or(0.0, |b| b.to_radians() - drawn);
        let (sin, cos) = turn.sin_cos();
        let (a, c, b, d) = (s * cos, -s * sin, -s * sin, -s * cos);
        Ok(Placement { a, b, c, d, e: a_plan.0 - a * a_px.0 - c * a_px.1, f: a_plan.1 - b * a_px.0 - d * a_px.1 })
    }

    /// The plan point of an image pixel, metres.
    pub fn to_plan(&self, (u, v): (f64, f64)) -> (f64, f64) {
        (self.a * u + self.c * v + self.e, self.b * u + self.d * v + self.f)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_abs_diff_eq;

    #[test]
    fn the_reference_points_land_where_they_were_put() {
        // A at pixel (100, 400) on the plan's (0, 0); B 300 px to its right is 30 m due east.
        let p = Placement::from_reference((100.0, 400.0), (400.0, 400.0), (0.0, 0.0), 30.0, Some(90.0)).unwrap();
        let (bx, by) = p.to_plan((400.0, 400.0));
        assert_abs_diff_eq!(bx, 30.0, epsilon = 1e-9);
        assert_abs_diff_eq!(by, 0.0, epsilon = 1e-9);
        // Up the image is north: 100 px up is 10 m north.
        let (ux, uy) = p.to_plan((100.0, 300.0));
        assert_abs_diff_eq!(ux, 0.0, epsilon = 1e-9);
        assert_abs_diff_eq!(uy, 10.0, epsilon = 1e-9);
    }

    #[test]
    fn a_bearing_turns_the_image_and_keeps_lengths() {
        // A→B drawn to the right (east) but known to run due north: the image turns 90° anticlockwise.
        let p = Placement::from_reference((0.0, 0.0), (200.0, 0.0), (5.0, 5.0), 20.0, Some(0.0)).unwrap();
        let (bx, by) = p.to_plan((200.0, 0.0));
        assert_abs_diff_eq!(bx, 5.0, epsilon = 1e-9);
        assert_abs_diff_eq!(by, 25.0, epsilon = 1e-9);
        // Without a bearing the drawn direction is kept.
        let q = Placement::from_reference((0.0, 0.0), (200.0, 0.0), (5.0, 5.0), 20.0, None).unwrap();
        assert_abs_diff_eq!(q.to_plan((200.0, 0.0)).0, 25.0, epsilon = 1e-9);
        assert_abs_diff_eq!((p.a * p.d - p.b * p.c).abs(), 0.01, epsilon = 1e-12);
    }

    #[test]
    fn bad_reference_points_are_named() {
        let e = Placement::from_reference((1.0, 1.0), (1.0, 1.0), (0.0, 0.0), 5.0, None).unwrap_err();
        assert_eq!(e, UnderlayError::SamePoint);
        let e = Placement::from_reference((0.0, 0.0), (1.0, 1.0), (0.0, 0.0), -5.0, None).unwrap_err();
        assert!(e.to_string().starts_with("distanceM"));
        let e = Placement::from_reference((0.0, f64::NAN), (1.0, 1.0), (0.0, 0.0), 5.0, None).unwrap_err();
        assert!(e.to_string().starts_with("imageA"));
    }
}
