//! What a panel of the map shows, and how its grid lies on the page: the
//! axes from data to page, the cells' edges halfway between the grid's
//! values, the lattice the contours are traced on, and the ticks.

use super::field::{Field, MapQuantity};
use super::style::TICK;
use crate::print::canvas::Canvas;
use crate::print::chart::scale::{next_step, nice_step, tick_label};
use crate::print::draw::Face;
use crate::print::geometry::MM_PER_PT;

/// What a panel shows.
pub struct Panel<'a> {
    /// What the values are.
    pub quantity: MapQuantity,
    /// The title above the plot.
    pub title: String,
    /// One value or gap per cell.
    pub field: &'a Field,
    /// The consumer's qualities (columns, x).
    pub rql: &'a [f64],
    /// The producer's qualities (rows, y).
    pub aql: &'a [f64],
    /// Qualities per unit (Poisson) rather than percent.
    pub per_unit: bool,
    /// The agreed risk points as `(RQL, AQL)`, ringed when given.
    pub agreed: Option<(f64, f64)>,
}

/// One axis of the plot: data `lo..hi` onto page `p0..p1`.
#[derive(Clone, Copy)]
pub struct AxisMap {
    /// The data at the axis's start.
    pub lo: f64,
    /// The data at its end.
    pub hi: f64,
    /// The page position of its start, mm.
    pub p0: f64,
    /// The page position of its end, mm.
    pub p1: f64,
}

impl AxisMap {
    /// The page position of data `v`.
    pub fn page(&self, v: f64) -> f64 {
        self.p0 + (v - self.lo) / (self.hi - self.lo) * (self.p1 - self.p0)
    }

    /// The data at page position `p`.
    pub fn data(&self, p: f64) -> f64 {
        self.lo + (p - self.p0) / (self.p1 - self.p0) * (self.hi - self.lo)
    }
}

/// The edges of the cells centred on `values` (at least two, increasing):
/// halfway between neighbours, half a step beyond the ends.
pub fn edges(values: &[f64]) -> Vec<f64> {
    let n = values.len();
    let mut e = Vec::with_capacity(n + 1);
    e.push(values[0] - (values[1] - values[0]) / 2.0);
    e.extend(values.windows(2).map(|w| (w[0] + w[1]) / 2.0));
    e.push(values[n - 1] + (values[n - 1] - values[n - 2]) / 2.0);
    e
}

/// The coordinates of the lattice the contours are traced on: the cell
/// centres `values`, and the plot's outer `edges` around them.
pub fn bordered(values: &[f64], edges: &[f64]) -> Vec<f64> {
    let mut out = Vec::with_capacity(values.len() + 2);
    out.push(edges[0]);
    out.extend_from_slice(values);
    out.push(edges[edges.len() - 1]);
    out
}

/// The values on the bordered lattice: each point on the plot's edges
/// takes the value of the cell it borders, so that a line that reaches the
/// outer cells runs on to the frame, straight across the half cell where
/// the value does not change (and stops where that cell has no plan).
pub fn bordered_values(z: &[Option<f64>], cols: usize) -> Vec<Option<f64>> {
    let rows = z.len() / cols;
    let clamp = |k: usize, n: usize| k.saturating_sub(1).min(n - 1);
    (0..rows + 2)
        .flat_map(|i| (0..cols + 2).map(move |j| z[clamp(i, rows) * cols + clamp(j, cols)]))
        .collect()
}

/// Ticks at multiples of a nice step inside `lo..hi`, as `(value, label)`:
/// the step grows until neighbouring labels keep apart on `span` mm.
pub fn ticks(
    c: &Canvas,
    lo: f64,
    hi: f64,
    span: f64,
    per_unit: bool,
    across: bool,
) -> Vec<(f64, String)> {
    let (scale, suffix) = if per_unit { (1.0, "") } else { (100.0, "%") };
    let mut step = nice_step(hi - lo);
    loop {
        let first = (lo / step).ceil() as i64;
        let last = (hi / step).floor() as i64;
        let ticks: Vec<(f64, String)> = (first..=last)
            .map(|k| {
                let v = k as f64 * step;
                (v, tick_label(v, step, scale, suffix))
            })
            .collect();
        let need = if across {
            ticks
                .iter()
                .map(|(_, l)| c.width(l, Face::Regular, TICK))
                .fold(0.0, f64::max)
                + 4.0
        } else {
            3.0 * TICK * MM_PER_PT
        };
        if step / (hi - lo) * span >= need || ticks.len() <= 2 {
            return ticks;
        }
        step = next_step(step);
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn cell_edges_lie_halfway_and_half_a_step_beyond_the_ends() {
        assert_eq!(edges(&[1.0, 2.0, 4.0]), vec![0.5, 1.5, 3.0, 5.0]);
    }

    #[test]
    fn the_border_repeats_the_outer_cells() {
        assert_eq!(
            bordered(&[1.0, 2.0], &[0.5, 1.5, 2.5]),
            vec![0.5, 1.0, 2.0, 2.5]
        );
        let z = [Some(1.0), Some(2.0), None, Some(4.0)];
        let b = bordered_values(&z, 2);
        let rows: Vec<&[Option<f64>]> = b.chunks(4).collect();
        assert_eq!(rows[0], &[Some(1.0), Some(1.0), Some(2.0), Some(2.0)]);
        assert_eq!(rows[1], &[Some(1.0), Some(1.0), Some(2.0), Some(2.0)]);
        assert_eq!(rows[2], &[None, None, Some(4.0), Some(4.0)]);
        assert_eq!(rows[3], &[None, None, Some(4.0), Some(4.0)]);
    }
}
