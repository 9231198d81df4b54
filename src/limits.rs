//! The budget of every request: sizes checked before any allocation or long computation, so that
//! hostile or mistaken input is refused with an error naming the field, the request's size and the
//! limit, instead of exhausting memory or hanging a page.
//!
//! The numbers are ours (common practice for a lot- to town-scale tool on a laptop): each is far above
//! what a site study needs and far below what would exhaust 4 GiB of WebAssembly memory or run for
//! minutes in a browser.

/// Largest site text (site file or GeoJSON) read, bytes.
pub const MAX_SITE_TEXT_BYTES: usize = 32 * 1024 * 1024;
/// Most features (areas, volumes and walls together) in a site.
pub const MAX_FEATURES: usize = 20_000;
/// Most vertices in all of a site's outlines and lines together.
pub const MAX_VERTICES: usize = 1_000_000;
/// Most vertices in one ring or line (a traced lot boundary has hundreds, a building tens).
pub const MAX_RING_VERTICES: usize = 10_000;
/// Farthest a plan coordinate may lie from the plan origin, metres (a town, not a country: beyond
/// this a flat local frame is no longer a fair model of the ground).
pub const MAX_PLAN_EXTENT_M: f64 = 100_000.0;
/// Highest top of a volume or wall above the ground, metres (the tallest buildings stand under 1 km).
pub const MAX_HEIGHT_M: f64 = 2_000.0;
/// Most cells in an analysis grid, whatever the caller allows.
pub const MAX_GRID_CELLS: usize = 16_000_000;
/// Most cell-steps (cells inside the areas × sun-up steps, counted from the period's longest possible
/// days) of one map: about a minute and a half of work natively at the measured ~2e9 cell-steps/s.
pub const MAX_CELL_STEPS: f64 = 2e11;
/// Most ray tests (directions or moments × volumes and walls) of one point's calculation: a point's
/// sky-view factor, its year, its day.
pub const MAX_RAY_TESTS: f64 = 2e8;
/// Most days in one period.
pub const MAX_PERIOD_DAYS: usize = 3_660;
/// Largest side of a figure (canvas or SVG), pixels.
pub const MAX_FIGURE_SIDE_PX: u32 = 8_192;
/// Most pixels in a figure (a 8192 × 4096 canvas).
pub const MAX_FIGURE_PIXELS: u64 = 8_192 * 4_096;
/// Most day paths on a sun-path diagram.
pub const MAX_SKY_DATES: usize = 64;

/// A request larger than its budget: names the field, the request's size and the limit.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
#[error("{field}: {size} {unit} is more than the limit of {limit} {unit}{hint}")]
pub struct OverBudget {
    /// The field (or what the request asks for) in the caller's terms.
    pub field: String,
    /// The request's size.
    pub size: String,
    /// The limit.
    pub limit: String,
    /// What is counted.
    pub unit: &'static str,
    /// What to do about it, with a leading separator, or empty.
    pub hint: String,
}

/// `Ok` when `size` ≤ `limit`, else an [`OverBudget`] for `field` counting `unit`.
///
/// # Errors
/// [`OverBudget`] naming the field, the size and the limit.
pub fn within(field: &str, size: f64, limit: f64, unit: &'static str) -> Result<(), OverBudget> {
    if size <= limit {
        return Ok(());
    }
    Err(OverBudget { field: field.to_string(), size: count(size), limit: count(limit), unit, hint: String::new() })
}

impl OverBudget {
    /// The same error with advice appended.
    pub fn hint(mut self, hint: &str) -> Self {
        self.hint = format!("; {hint}");
        self
    }
}

/// A point's work within [`MAX_RAY_TESTS`]: `directions` (sky patches, azimuths or time steps) ×
/// `casters` (the volumes and walls a ray is tested against), named `field`.
///
/// # Errors
/// [`OverBudget`] naming `field`, with `hint`.
pub fn ray_tests(field: &str, directions: f64, casters: usize, hint: &str) -> Result<(), OverBudget> {
    within(field, directions * casters as f64, MAX_RAY_TESTS, "ray tests").map_err(|e| e.hint(hint))
}

/// A count written with thousands separators (`16,000,000`), or in scientific notation when huge.
pub fn count(x: f64) -> String {
    if !x.is_finite() {
        return "an unbounded number of".into();
    }
    if x >= 1e15 {
        return format!("{x:.2e}");
    }
    let digits = format!("{:.0}", x.max(0.0));
    let mut out = String::new();
    for (i, ch) in digits.chars().enumerate() {
        if i > 0 && (digits.len() - i) % 3 == 0 {
            out.push(',');
        }
        out.push(ch);
    }
    out
}

/// A figure's size checked against [`MAX_FIGURE_SIDE_PX`] and [`MAX_FIGURE_PIXELS`]; at least 1 × 1.
///
/// # Errors
/// [`OverBudget`] naming `field` (or a zero size, as a budget of at least one pixel).
pub fn figure_size(field: &str, width: u32, height: u32) -> Result<(), OverBudget> {
    if width == 0 || height == 0 {
        return Err(OverBudget {
            field: field.to_string(),
            size: format!("{width} × {height}"),
            limit: format!("at least 1 × 1, at most {MAX_FIGURE_SIDE_PX} × {MAX_FIGURE_SIDE_PX}"),
            unit: "pixels",
            hint: String::new(),
        }
        .hint("a figure needs a size"));
    }
    let side = f64::from(width.max(height));
    within(field, side, f64::from(MAX_FIGURE_SIDE_PX), "pixels a side")?;
    within(field, f64::from(width) * f64::from(height), MAX_FIGURE_PIXELS as f64, "pixels")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn messages_name_field_size_and_limit() {
        let e = within("cellM", 2.5e7, MAX_GRID_CELLS as f64, "cells").unwrap_err().hint("use larger cells");
        assert_eq!(
            e.to_string(),
            "cellM: 25,000,000 cells is more than the limit of 16,000,000 cells; use larger cells"
        );
        assert!(within("x", 3.0, 3.0, "things").is_ok());
        assert_eq!(count(999.0), "999");
        assert_eq!(count(1000.0), "1,000");
        assert_eq!(count(1e20), "1.00e20");
        assert!(within("x", f64::INFINITY, 3.0, "things").unwrap_err().to_string().contains("unbounded"));
        assert!(within("x", f64::NAN, 3.0, "things").is_err());
    }

    #[test]
    fn figure_sizes() {
        assert!(figure_size("width", 800, 600).is_ok());
        assert!(figure_size("width", 8192, 4096).is_ok());
        let e = figure_size("canvas", 20_000, 20_000).unwrap_err().to_string();
        assert!(e.contains("canvas: 20,000 pixels a side is more than the limit of 8,192"), "{e}");
        let e = figure_size("canvas", 8192, 8192).unwrap_err().to_string();
        assert!(e.contains("67,108,864 pixels is more than the limit of 33,554,432"), "{e}");
        assert!(figure_size("height", 100, 0).unwrap_err().to_string().contains("at least 1 × 1"));
        assert!(figure_size("height", u32::MAX, 3).is_err());
    }
}
