//! The numbers a panel of the map is drawn from: one value per cell (the
//! sample size, the ASN at the AQL or the cost per lot) or the reason the
//! cell has none; the log scale of the colours; the contour levels; and
//! the blocks of cells drawn as one when the grid is finer than the page.

use crate::design::DesignError;
use crate::design::TradeoffGrid;
use crate::numeric::round_significant;

/// What a panel of the map shows.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum MapQuantity {
    /// The sample size `n` of a single plan.
    SampleSize,
    /// The average sample number at the AQL of a double plan.
    AsnAtAql,
    /// The expected inspection cost per lot at the process average
    /// (cost per unit times ATI).
    CostPerLot,
}

/// Why a cell has no plan, as the key tells it.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord)]
pub enum Gap {
    /// The AQL is not below the RQL.
    NotBelow,
    /// The plan would pass the designer's caps.
    BeyondCap,
    /// No plan meets both points (a finite lot too small to tell them
    /// apart, or no double plan of the family).
    NoPlan,
    /// 100% inspection: the points need a sample larger than the lot. In
    /// a cost panel such a cell has a value, the cost of the whole lot.
    WholeLot,
}

/// A panel's values, row-major like the grid (rows are AQL values).
pub struct Field {
    /// One value (positive) or gap per cell.
    pub cells: Vec<Result<f64, Gap>>,
}

impl Field {
    /// The values of `quantity` over `grid`.
    pub fn new(grid: &TradeoffGrid, quantity: MapQuantity) -> Field {
        let cells = grid
            .cells
            .iter()
            .map(|cell| match &cell.outcome {
                Ok(plan) => {
                    let v = match quantity {
                        MapQuantity::SampleSize => plan.n() as f64,
                        MapQuantity::AsnAtAql => plan.asn_at_aql,
                        // A grid with a cost holds one in every plan.
                        MapQuantity::CostPerLot => plan.cost.map_or(f64::NAN, |k| k.cost),
                    };
                    // The scale is logarithmic: a value it cannot place is
                    // shown as a cell without a plan rather than guessed.
                    if v.is_finite() && v > 0.0 {
                        Ok(v)
                    } else {
                        Err(Gap::NoPlan)
                    }
                }
                Err(_) if cell.aql >= cell.rql => Err(Gap::NotBelow),
                Err(DesignError::WholeLot { .. }) => match quantity {
                    // Every unit inspected: the cost of the whole lot.
                    MapQuantity::CostPerLot => grid
                        .full_inspection_cost(cell)
                        .filter(|v| v.is_finite() && *v > 0.0)
                        .ok_or(Gap::WholeLot),
                    _ => Err(Gap::WholeLot),
                },
                // A cell whose search passes the work budget is beyond the
                // designer's limits as well.
                Err(DesignError::BeyondCap { .. } | DesignError::OverBudget(_)) => {
                    Err(Gap::BeyondCap)
                }
                Err(DesignError::NoPlan { .. } | DesignError::NoRectifyingPlan { .. }) => {
                    Err(Gap::NoPlan)
                }
            })
            .collect();
        Field { cells }
    }

    /// The smallest and largest value, when any cell has one.
    pub fn range(&self) -> Option<(f64, f64)> {
        self.cells.iter().filter_map(|v| v.ok()).fold(None, |r, v| {
            Some(r.map_or((v, v), |(lo, hi): (f64, f64)| (lo.min(v), hi.max(v))))
        })
    }

    /// The natural logarithm of each value, for contouring.
    pub fn logs(&self) -> Vec<Option<f64>> {
        self.cells.iter().map(|v| v.ok().map(f64::ln)).collect()
    }

    /// The reasons for cells without a plan that occur, in the key's order.
    pub fn gaps(&self) -> Vec<Gap> {
        let mut gaps: Vec<Gap> = self.cells.iter().filter_map(|v| v.err()).collect();
        gaps.sort();
        gaps.dedup();
        gaps
    }
}

/// The colour scale: the position in `[0, 1]` of a value between the
/// panel's smallest and largest, on a log scale (`n` spans tens to
/// thousands, and a step from 20 to 40 matters as much as one from 500 to
/// 1000).
#[derive(Clone, Copy, Debug)]
pub struct LogScale {
    lo: f64,
    hi: f64,
}

impl LogScale {
    /// The scale from `lo` to `hi` (both positive).
    pub fn new(lo: f64, hi: f64) -> Self {
        LogScale {
            lo: lo.ln(),
            hi: hi.ln(),
        }
    }

    /// The position of `v`; the middle when all values are equal.
    pub fn t(&self, v: f64) -> f64 {
        if self.hi - self.lo < 1e-12 {
            0.5
        } else {
            (v.ln() - self.lo) / (self.hi - self.lo)
        }
    }

    /// Whether the scale spans a range (not a single value).
    pub fn spans(&self) -> bool {
        self.hi - self.lo >= 1e-12
    }
}

/// The mantissas of the series levels are taken from, coarsest first:
/// decades; 1-2-5; then finer ones for a narrow range.
const SERIES: [&[f64]; 4] = [
    &[1.0],
    &[1.0, 2.0, 5.0],
    &[1.0, 1.5, 2.0, 3.0, 5.0, 7.0],
    &[1.0, 1.2, 1.5, 2.0, 2.5, 3.0, 4.0, 5.0, 6.0, 8.0],
];

/// The most contour levels a panel carries.
const MOST_LEVELS: usize = 9;

/// The contour levels strictly between `lo` and `hi`: the 1-2-5 series
/// when it gives 3 to [`MOST_LEVELS`] levels; decades when 1-2-5 gives
/// more; a finer series when it gives fewer (as long as the finer one
/// stays within [`MOST_LEVELS`]).
pub fn levels(lo: f64, hi: f64) -> Vec<f64> {
    let of = |series: &[f64]| -> Vec<f64> {
        if lo.partial_cmp(&hi) != Some(std::cmp::Ordering::Less) || lo <= 0.0 {
            return Vec::new();
        }
        let first = lo.log10().floor() as i32;
        let last = hi.log10().ceil() as i32;
        (first..=last)
            .flat_map(|e| series.iter().map(move |m| level_value(*m, e)))
            .filter(|&v| v > lo * (1.0 + 1e-12) && v < hi * (1.0 - 1e-12))
            .collect()
    };
    let standard = of(SERIES[1]);
    if standard.len() > MOST_LEVELS {
        return of(SERIES[0]);
    }
    let mut best = standard;
    for series in &SERIES[2..] {
        if best.len() >= 3 {
            break;
        }
        let finer = of(series);
        if finer.len() > MOST_LEVELS {
            break;
        }
        best = finer;
    }
    best
}

/// `m` times ten to the `e`, rounded to the two digits a mantissa of
/// [`SERIES`] has, so that a level prints and compares as the number it is
/// (0.3, not 0.30000000000000004).
fn level_value(m: f64, e: i32) -> f64 {
    round_significant(m * 10f64.powi(e), 2)
}

/// A value as a contour label or a colour bar tick: whole numbers grouped
/// by thousands with a space from 10 000 on, smaller ones with the digits
/// they need (at most three significant).
pub fn value_label(v: f64) -> String {
    if v >= 100.0 || (v >= 1.0 && (v - v.round()).abs() < 1e-9) {
        let whole = v.round() as u64;
        let digits = whole.to_string();
        if whole < 10_000 {
            return digits;
        }
        let mut out = String::new();
        for (k, ch) in digits.chars().enumerate() {
            if k > 0 && (digits.len() - k).is_multiple_of(3) {
                out.push(' ');
            }
            out.push(ch);
        }
        return out;
    }
    crate::numeric::format_short(v, 3)
}

/// The blocks of at most `most` that `count` cells are drawn as: each cell
/// its own block when they fit, else consecutive runs of nearly equal
/// length, as `[start, end)`.
pub fn blocks(count: usize, most: usize) -> Vec<(usize, usize)> {
    let k = count.min(most.max(1));
    (0..k)
        .map(|b| (b * count / k, (b + 1) * count / k))
        .collect()
}

/// A rectangle of equal values on a lattice of `rows` x `cols` blocks:
/// rows `i0..i1`, columns `j0..j1`.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Tile<T> {
    /// First row.
    pub i0: usize,
    /// One past the last row.
    pub i1: usize,
    /// First column.
    pub j0: usize,
    /// One past the last column.
    pub j1: usize,
    /// The value all its blocks share.
    pub value: T,
}

/// The blocks of a lattice merged into rectangles of equal value: runs
/// along each row, each run joined to an identical run (same columns and
/// value) in the row below it; and the same along columns. The way that
/// gives fewer rectangles is taken, so that a field constant along its
/// columns (the sample size within one acceptance number, which depends on
/// the RQL alone) is drawn as a few tall rectangles rather than many
/// squares.
pub fn tiles<T: Copy + PartialEq>(
    rows: usize,
    cols: usize,
    at: impl Fn(usize, usize) -> T,
) -> Vec<Tile<T>> {
    let by_rows = runs(rows, cols, &at);
    let by_cols: Vec<Tile<T>> = runs(cols, rows, &|j, i| at(i, j))
        .into_iter()
        .map(|t| Tile {
            i0: t.j0,
            i1: t.j1,
            j0: t.i0,
            j1: t.i1,
            value: t.value,
        })
        .collect();
    if by_cols.len() < by_rows.len() {
        by_cols
    } else {
        by_rows
    }
}

/// [`tiles`] merging along rows first.
fn runs<T: Copy + PartialEq>(
    rows: usize,
    cols: usize,
    at: &impl Fn(usize, usize) -> T,
) -> Vec<Tile<T>> {
    let mut out: Vec<Tile<T>> = Vec::new();
    // The tiles that reach the row before, by their first column.
    let mut open: Vec<Option<usize>> = vec![None; cols];
    for i in 0..rows {
        let mut next: Vec<Option<usize>> = vec![None; cols];
        let mut j0 = 0;
        while j0 < cols {
            let value = at(i, j0);
            let mut j1 = j0 + 1;
            while j1 < cols && at(i, j1) == value {
                j1 += 1;
            }
            let grown = open[j0].filter(|&k| out[k].j1 == j1 && out[k].value == value);
            let k = match grown {
                Some(k) => {
                    out[k].i1 = i + 1;
                    k
                }
                None => {
                    out.push(Tile {
                        i0: i,
                        i1: i + 1,
                        j0,
                        j1,
                        value,
                    });
                    out.len() - 1
                }
            };
            next[j0] = Some(k);
            j0 = j1;
        }
        open = next;
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn levels_follow_the_one_two_five_series_inside_the_range() {
        assert_eq!(
            levels(18.0, 2700.0),
            vec![20.0, 50.0, 100.0, 200.0, 500.0, 1000.0, 2000.0]
        );
    }

    #[test]
    fn a_narrow_range_takes_a_finer_series_and_a_wide_one_decades() {
        // 1-2-5 gives only 50 and 100; the ends themselves are no level.
        assert_eq!(levels(20.0, 200.0), vec![30.0, 50.0, 70.0, 100.0, 150.0]);
        assert_eq!(levels(10.0, 1e6), vec![100.0, 1000.0, 10000.0, 100000.0]);
        assert_eq!(levels(0.12, 0.9), vec![0.15, 0.2, 0.3, 0.5, 0.7]);
        assert!(levels(80.0, 80.5).is_empty());
        assert!(levels(100.0, 100.0).is_empty());
    }

    #[test]
    fn values_print_as_people_write_them() {
        let got: Vec<String> = [10000.0, 2000.0, 150.0, 12.5, 1.5, 0.5, 250000.0]
            .iter()
            .map(|&v| value_label(v))
            .collect();
        assert_eq!(
            got,
            ["10 000", "2000", "150", "12.5", "1.5", "0.5", "250 000"]
        );
        // A tiny cost keeps its exponent whole.
        assert_eq!(value_label(1.5e-10), "1.5e-10");
        assert_eq!(value_label(1e-10), "1e-10");
    }

    #[test]
    fn blocks_cover_every_cell_once() {
        assert_eq!(blocks(3, 160), vec![(0, 1), (1, 2), (2, 3)]);
        let b = blocks(500, 160);
        assert_eq!(b.len(), 160);
        assert_eq!(b[0].0, 0);
        assert_eq!(b[159].1, 500);
        for w in b.windows(2) {
            assert_eq!(w[0].1, w[1].0);
            assert!((3..=4).contains(&(w[0].1 - w[0].0)));
        }
    }

    /// Every block covered by exactly one tile of its own value.
    fn assert_cover(rows: usize, cols: usize, z: &[u8], tiles: &[Tile<u8>]) {
        let mut seen = vec![0; rows * cols];
        for t in tiles {
            for i in t.i0..t.i1 {
                for j in t.j0..t.j1 {
                    seen[i * cols + j] += 1;
                    assert_eq!(z[i * cols + j], t.value, "{t:?}");
                }
            }
        }
        assert!(seen.iter().all(|&s| s == 1), "{seen:?}");
    }

    #[test]
    fn tiles_cover_every_block_once_and_take_the_fewer_rectangles() {
        // Constant along columns: three tall tiles, not nine squares.
        let z = [1, 2, 3, 1, 2, 3, 1, 2, 3];
        let t = tiles(3, 3, |i, j| z[i * 3 + j]);
        assert_cover(3, 3, &z, &t);
        assert_eq!(t.len(), 3);
        // Constant along rows: three wide tiles.
        let z = [1, 1, 1, 2, 2, 2, 3, 3, 3];
        let t = tiles(3, 3, |i, j| z[i * 3 + j]);
        assert_cover(3, 3, &z, &t);
        assert_eq!(t.len(), 3);
        // A staircase of two values.
        let z = [1, 2, 2, 2, 1, 1, 2, 2, 1, 1, 1, 2];
        let t = tiles(3, 4, |i, j| z[i * 4 + j]);
        assert_cover(3, 4, &z, &t);
        assert_eq!(t.len(), 6);
    }

    #[test]
    fn the_log_scale_puts_the_geometric_mean_in_the_middle() {
        let s = LogScale::new(10.0, 1000.0);
        assert!((s.t(100.0) - 0.5).abs() < 1e-12);
        assert!(s.t(10.0).abs() < 1e-12 && (s.t(1000.0) - 1.0).abs() < 1e-12);
        assert_eq!(LogScale::new(40.0, 40.0).t(40.0), 0.5);
    }
}
