//! The cells of a panel: coloured along the ramp, or grey or hatched where
//! there is no plan; blocks of equal paint merged into rectangles and
//! filled as one path per paint.

use std::collections::BTreeMap;

use super::field::{Gap, LogScale, blocks, tiles};
use super::plot::{AxisMap, Panel};
use super::ramp;
use super::style::{SEAM, gap_fill, hatch_direction, hatch_lines};
use crate::print::canvas::Canvas;
use crate::print::draw::grey;
use crate::print::geometry::Corners;

/// The most blocks of cells drawn along an axis: 160 blocks keep a block
/// above 0.6 mm on any panel, finer than the eye sees on paper or a
/// projector; a finer grid is drawn a block of neighbouring cells at a time
/// (the colour of the block's middle cell), and its contours are still
/// traced over every cell.
pub const MOST_BLOCKS: usize = 160;

/// How a block of cells is painted.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord)]
enum Paint {
    /// A step of the colour ramp.
    Step(usize),
    /// No plan, for this reason.
    Gap(Gap),
}

/// Fills the cells: block by block (each cell its own block up to
/// [`MOST_BLOCKS`] a side, painted as the block's middle cell), blocks of
/// equal paint merged into rectangles ([`tiles`]), all rectangles of one
/// paint filled as one path; then the hatching of the cells without a
/// plan.
pub fn cells(
    c: &mut Canvas,
    p: &Panel,
    xs: &AxisMap,
    ys: &AxisMap,
    col_edges: &[f64],
    row_edges: &[f64],
    scale: Option<LogScale>,
) {
    let cols = p.rql.len();
    let (row_blocks, col_blocks) = (blocks(p.aql.len(), MOST_BLOCKS), blocks(cols, MOST_BLOCKS));
    let paint = |bi: usize, bj: usize| {
        let (r0, r1) = row_blocks[bi];
        let (c0, c1) = col_blocks[bj];
        match p.field.cells[(r0 + (r1 - r0) / 2) * cols + c0 + (c1 - c0) / 2] {
            // A value means the field has a range, hence a scale.
            Ok(v) => scale.map_or(Paint::Gap(Gap::NoPlan), |s| Paint::Step(ramp::step(s.t(v)))),
            Err(g) => Paint::Gap(g),
        }
    };
    let mut groups: BTreeMap<Paint, Vec<Corners>> = BTreeMap::new();
    for t in tiles(row_blocks.len(), col_blocks.len(), paint) {
        let (x0, x1) = (
            xs.page(col_edges[col_blocks[t.j0].0]),
            xs.page(col_edges[col_blocks[t.j1 - 1].1]),
        );
        let (y0, y1) = (
            ys.page(row_edges[row_blocks[t.i0].0]),
            ys.page(row_edges[row_blocks[t.i1 - 1].1]),
        );
        // Reach into the right and upper neighbour, never past the plot.
        let x1 = if x1 < xs.p1 - 1e-9 { x1 + SEAM } else { x1 };
        let y1 = if y1 < ys.p1 - 1e-9 { y1 + SEAM } else { y1 };
        groups.entry(t.value).or_default().push((x0, y0, x1, y1));
    }
    for (paint, rects) in &groups {
        let colour = match paint {
            Paint::Step(k) => ramp::colour(*k),
            Paint::Gap(g) => gap_fill(*g),
        };
        c.fill_rects(rects, colour);
    }
    let plot = (xs.p0, ys.p0, xs.p1, ys.p1);
    for (paint, rects) in &groups {
        if let Paint::Gap(g) = paint
            && let Some(dir) = hatch_direction(*g)
        {
            let lines = hatch_lines(plot, dir);
            c.clipped(rects, |c| c.polylines(&lines, 0.5, grey(0.4)));
        }
    }
}
