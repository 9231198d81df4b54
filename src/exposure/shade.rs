//! Shade accumulated over many sun (or sky) directions, cell by cell.
//!
//! # Method
//! For each direction the exact shadow of every volume and wall is cut into pieces whose union is the
//! shadow (see [`crate::shadow::volume_faces_on`]); the pieces are rasterised at cell centres by
//! scanlines and each row's spans are merged, so the cost of a direction grows with the rows and edges
//! the shadows cross, not with the area they cover. Each merged span adds the direction's weights to a
//! per-row difference array (two additions per span); one prefix sum at the end gives every cell's
//! total. No boolean union and no clipping is needed: a span is cut at the grid's edge, and shadows of
//! any length are rasterised exactly. Directions are split over two threads (one in wasm).

use geo::{BoundingRect, Coord, Polygon, Rect};

use super::grid::Grid;
use super::raster::RowSpans;
use crate::shadow::{volume_faces_on, volume_levels_m, wall_faces_on, Receiver};
use crate::site::{SiteModel, Status, Volume, Wall};

/// Directions are split over this many threads (the machines we target have two cores; one in wasm).
const THREADS: usize = 2;

/// Which massing casts shadows.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Massing {
    /// The existing volumes and walls alone (before).
    Existing,
    /// Existing and proposed together (after).
    WithProposed,
}

impl Massing {
    /// Whether a feature of status `s` casts in this massing.
    pub fn includes(self, s: Status) -> bool {
        self == Massing::WithProposed || s == Status::Existing
    }
}

/// One direction to cast in: the flat-ground shadow offset per metre of height (plan frame) and the
/// `K` weights it adds to every cell it shades.
pub(crate) type Cast<const K: usize> = (Coord<f64>, [f64; K]);

/// Per-cell totals of the weights of the directions that shade each cell.
pub(crate) struct ShadeSums<'a, const K: usize> {
    model: &'a SiteModel,
    grid: &'a Grid,
    receiver: Receiver,
    massing: Massing,
    bounds: Rect<f64>,
    /// Per thread, per weight: rows × (cols + 1) difference arrays.
    diff: Vec<[Vec<f64>; K]>,
}

impl<'a, const K: usize> ShadeSums<'a, K> {
    pub(crate) fn new(model: &'a SiteModel, grid: &'a Grid, receiver: Receiver, massing: Massing) -> Self {
        let threads = if cfg!(target_arch = "wasm32") { 1 } else { THREADS };
        let n = grid.rows * (grid.cols + 1);
        let diff = (0..threads).map(|_| std::array::from_fn(|_| written_zeros(n))).collect();
        ShadeSums { model, grid, receiver, massing, bounds: grid.bounds(), diff }
    }

    /// Adds the shade of each of `casts`.
    pub(crate) fn add(&mut self, casts: &[Cast<K>]) {
        if casts.is_empty() {
            return;
        }
        let chunk = casts.len().div_ceil(self.diff.len());
        let (model, grid, receiver, massing, bounds) =
            (self.model, self.grid, self.receiver, self.massing, self.bounds);
        let work = move |part: &[Cast<K>], diff: &mut [Vec<f64>; K]| {
            Worker::new(model, grid, receiver, massing, bounds).run(part, diff);
        };
        if self.diff.len() == 1 || casts.len() < 2 {
            work(casts, &mut self.diff[0]);
            return;
        }
        std::thread::scope(|s| {
            for (part, diff) in casts.chunks(chunk).zip(self.diff.iter_mut()) {
                s.spawn(move || work(part, diff));
            }
        });
    }

    /// The totals, per weight, row-major as the grid (every cell, inside the area or not). The prefix
    /// sums are formed in place in the first thread's difference arrays (no new storage).
    pub(crate) fn finish(mut self) -> [Vec<f64>; K] {
        let (first, rest) = self.diff.split_at_mut(1);
        for other in rest.iter() {
            for (a, b) in first[0].iter_mut().zip(other.iter()) {
                a.iter_mut().zip(b.iter()).for_each(|(x, y)| *x += y);
            }
        }
        let (rows, cols) = (self.grid.rows, self.grid.cols);
        let diffs = self.diff.swap_remove(0);
        diffs.map(|mut d| {
            // Cell (row, col) moves from row·(cols+1)+col down to row·cols+col: never past a value
            // still to be read, as the walk goes forward.
            for row in 0..rows {
                let mut acc = 0.0;
                for col in 0..cols {
                    acc += d[row * (cols + 1) + col];
                    d[row * cols + col] = acc;
                }
            }
            d.truncate(rows * cols);
            d
        })
    }
}

/// `n` zeros written one by one rather than taken from the allocator's zeroed pages: a zeroed page
/// is first mapped read-only and copied on the first write, and with a second thread running that
/// copy costs every core a TLB flush (measured: a third of a 500² sun-hours run went to those
/// flushes).
fn written_zeros(n: usize) -> Vec<f64> {
    // Neither `vec![0.0; n]` (it asks for zeroed memory when the value is zero) nor a fill the
    // compiler can see is of zeros (it turns it back into a zeroed allocation).
    let mut v = Vec::with_capacity(n);
    v.resize(n, std::hint::black_box(0.0));
    v
}

/// A feature that casts, with what culling needs on flat receivers.
struct Caster<'a> {
    feature: Feature<'a>,
    /// Plan bounding box of the footprint or line.
    bbox: Rect<f64>,
    /// Highest point above the receiving plane, metres.
    top_m: f64,
}

enum Feature<'a> {
    Volume(&'a Volume),
    Wall(&'a Wall),
}

/// One thread's scratch.
struct Worker<'a> {
    grid: &'a Grid,
    receiver: Receiver,
    bounds: Rect<f64>,
    casters: Vec<Caster<'a>>,
    spans: RowSpans,
    faces: Vec<Polygon<f64>>,
    merged: Vec<(usize, usize)>,
}

impl<'a> Worker<'a> {
    fn new(model: &'a SiteModel, grid: &'a Grid, receiver: Receiver, massing: Massing, bounds: Rect<f64>) -> Self {
        let mut casters = Vec::new();
        for v in model.volumes.iter().filter(|v| massing.includes(v.status)) {
            if let Some(bbox) = v.footprint.bounding_rect() {
                let top_m = volume_levels_m(v, &receiver).1 - receiver.height_m;
                casters.push(Caster { feature: Feature::Volume(v), bbox, top_m });
            }
        }
        for w in model.walls.iter().filter(|w| massing.includes(w.status)) {
            if let Some(bbox) = w.line.bounding_rect() {
                casters.push(Caster { feature: Feature::Wall(w), bbox, top_m: w.height_m - receiver.height_m });
            }
        }
        Worker { grid, receiver, bounds, casters, spans: RowSpans::new(grid), faces: Vec::new(), merged: Vec::new() }
    }

    /// Whether a caster's shadow (on a flat receiver) can reach the grid for offset `o`.
    fn may_reach(&self, c: &Caster, o: Coord<f64>) -> bool {
        if c.top_m <= 0.0 {
            return false;
        }
        if self.receiver.gradient != (Coord { x: 0.0, y: 0.0 }) {
            return true;
        }
        let (lo, hi) = (c.bbox.min(), c.bbox.max());
        let d = Coord { x: o.x * c.top_m, y: o.y * c.top_m };
        let (x0, x1) = (lo.x + d.x.min(0.0), hi.x + d.x.max(0.0));
        let (y0, y1) = (lo.y + d.y.min(0.0), hi.y + d.y.max(0.0));
        let (b0, b1) = (self.bounds.min(), self.bounds.max());
        x1 >= b0.x && x0 <= b1.x && y1 >= b0.y && y0 <= b1.y
    }

    fn run<const K: usize>(&mut self, casts: &[Cast<K>], diff: &mut [Vec<f64>; K]) {
        let stride = self.grid.cols + 1;
        for &(o, w) in casts {
            self.spans.clear();
            self.faces.clear();
            if !self.receiver.faces_sun(o) {
                // The direction is behind the receiving plane: every cell is in the ground's own shade.
                for row in 0..self.grid.rows {
                    for (k, weight) in w.iter().enumerate() {
                        diff[k][row * stride] += weight;
                        diff[k][row * stride + self.grid.cols] -= weight;
                    }
                }
                continue;
            }
            for c in &self.casters {
                if self.may_reach(c, o) {
                    match c.feature {
                        Feature::Volume(v) => volume_faces_on(v, o, &self.receiver, &mut self.faces),
                        Feature::Wall(w) => wall_faces_on(w, o, &self.receiver, &mut self.faces),
                    };
                }
            }
            for f in &self.faces {
                self.spans.add_polygon(self.grid, f);
            }
            for row in 0..self.grid.rows {
                self.spans.merged_into(row, &mut self.merged);
                for &(a, b) in &self.merged {
                    for (k, weight) in w.iter().enumerate() {
                        diff[k][row * stride + a] += weight;
                        diff[k][row * stride + b] -= weight;
                    }
                }
            }
        }
    }
}
