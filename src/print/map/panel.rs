//! One panel of the map: the cells coloured on the log ramp, the cells
//! without a plan in grey or hatched, the contour lines with their labels,
//! the axes and the colour bar. The numbers come in as a [`Field`]; this
//! file only places and draws them.

use std::collections::BTreeMap;

use super::contour::{Lattice, Path};
use super::field::{Field, Gap, LogScale, MapQuantity, blocks, levels, tiles, value_label};
use super::{ContourLabel, MapContour, MapPanel, ramp};
use crate::print::canvas::Canvas;
use crate::print::chart::{next_step, nice_step, tick_label};
use crate::print::draw::{Colour as Color, Face, grey};
use crate::print::geometry::{Corners, MM_PER_PT, Rect, Region, segment_hits};
use crate::print::text::Shrink;
use crate::print::wording::map as text;

/// Type sizes, points: large enough to read across a meeting room.
const TITLE: f64 = 10.5;
const AXIS: f64 = 9.0;
const TICK: f64 = 8.0;
const LABEL: f64 = 9.0;

/// Height of the digits of DejaVu Sans, as a fraction of the type size.
const DIGIT_HEIGHT: f64 = 0.73;

/// Room above the plot (title and the AQL axis label) and below it (tick
/// labels and the RQL axis label), mm.
const TOP_ROOM: f64 = 12.0;
const BOTTOM_ROOM: f64 = 12.5;

/// The colour bar: gap from the plot, width, tick length (mm).
const BAR_GAP: f64 = 5.0;
const BAR_W: f64 = 6.0;
const TICK_LEN: f64 = 1.2;

/// The most blocks of cells drawn along an axis: 160 blocks keep a block
/// above 0.6 mm on any panel, finer than the eye sees on paper or a
/// projector; a finer grid is drawn a block of neighbouring cells at a time
/// (the colour of the block's middle cell), and its contours are still
/// traced over every cell.
pub const MOST_BLOCKS: usize = 160;

/// How far a cell's rectangle reaches into its neighbour, mm, so that the
/// anti-aliasing of a viewer shows no hairline seams between cells.
const SEAM: f64 = 0.12;

/// Spacing of the hatching of cells without a plan, mm across the plot.
const HATCH: f64 = 2.0;

/// Contour labels: padding of the white box around the digits (mm), the
/// least gap between two labels, and the least distance along one line
/// between two of its labels.
const PAD_X: f64 = 0.9;
const PAD_Y: f64 = 0.8;
const LABEL_GAP: f64 = 2.0;
const LABEL_SPACING: f64 = 100.0;

/// Where along a line its labels are tried, as fractions of its length:
/// the middle first, then outwards.
const FRACTIONS: [f64; 9] = [0.5, 0.38, 0.62, 0.26, 0.74, 0.15, 0.85, 0.07, 0.93];

/// Simplification tolerance of the drawn lines, mm: far below the width of
/// the line.
const SIMPLIFY: f64 = 0.05;

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
}

/// One axis of the plot: data `lo..hi` onto page `p0..p1`.
#[derive(Clone, Copy)]
struct AxisMap {
    lo: f64,
    hi: f64,
    p0: f64,
    p1: f64,
}

impl AxisMap {
    fn page(&self, v: f64) -> f64 {
        self.p0 + (v - self.lo) / (self.hi - self.lo) * (self.p1 - self.p0)
    }

    fn data(&self, p: f64) -> f64 {
        self.lo + (p - self.p0) / (self.p1 - self.p0) * (self.hi - self.lo)
    }
}

/// The edges of the cells centred on `values` (at least two, increasing):
/// halfway between neighbours, half a step beyond the ends.
fn edges(values: &[f64]) -> Vec<f64> {
    let n = values.len();
    let mut e = Vec::with_capacity(n + 1);
    e.push(values[0] - (values[1] - values[0]) / 2.0);
    e.extend(values.windows(2).map(|w| (w[0] + w[1]) / 2.0));
    e.push(values[n - 1] + (values[n - 1] - values[n - 2]) / 2.0);
    e
}

/// The coordinates of the lattice the contours are traced on: the cell
/// centres `values`, and the plot's outer `edges` around them.
fn bordered(values: &[f64], edges: &[f64]) -> Vec<f64> {
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
fn bordered_values(z: &[Option<f64>], cols: usize) -> Vec<Option<f64>> {
    let rows = z.len() / cols;
    let clamp = |k: usize, n: usize| k.saturating_sub(1).min(n - 1);
    (0..rows + 2)
        .flat_map(|i| (0..cols + 2).map(move |j| z[clamp(i, rows) * cols + clamp(j, cols)]))
        .collect()
}

/// Ticks at multiples of a nice step inside `lo..hi`, as `(value, label)`:
/// the step grows until neighbouring labels keep apart on `span` mm.
fn ticks(
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

/// How a block of cells is painted.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord)]
enum Paint {
    /// A step of the colour ramp.
    Step(usize),
    /// No plan, for this reason.
    Gap(Gap),
}

/// The fill of a cell without a plan: light grey where the AQL is not
/// below the RQL (nothing to negotiate there), dark grey where the answer
/// is 100% inspection (the points need more units than the lot holds),
/// white under hatching for the other reasons.
fn gap_fill(g: Gap) -> Color {
    match g {
        Gap::NotBelow => grey(0.78),
        Gap::WholeLot => grey(0.45),
        Gap::BeyondCap | Gap::NoPlan => grey(1.0),
    }
}

/// The hatching of a reason: rising lines for points too close, falling
/// ones when no plan meets both points, none for an AQL not below the RQL.
fn hatch_direction(g: Gap) -> Option<f64> {
    match g {
        Gap::NotBelow | Gap::WholeLot => None,
        Gap::BeyondCap => Some(1.0),
        Gap::NoPlan => Some(-1.0),
    }
}

/// Hatching lines at 45 degrees over the rectangle `r`, rising
/// (`dir > 0`) or falling, on a lattice fixed to the rectangle's corner.
fn hatch_lines(r: Corners, dir: f64) -> Vec<Path> {
    let (x0, y0, x1, y1) = r;
    let h = y1 - y0;
    let count = ((x1 - x0 + h) / HATCH).ceil() as usize + 1;
    (0..count)
        .map(|k| {
            let sx = x0 - h + k as f64 * HATCH;
            if dir > 0.0 {
                vec![(sx, y0), (sx + h, y1)]
            } else {
                vec![(sx, y1), (sx + h, y0)]
            }
        })
        .collect()
}

/// A sample of a reason's look in the box `r`, for the key.
pub fn gap_swatch(c: &mut Canvas, g: Gap, r: Corners) {
    c.fill_rects(&[r], gap_fill(g));
    if let Some(dir) = hatch_direction(g) {
        let lines = hatch_lines(r, dir);
        c.clipped(&[r], |c| c.polylines(&lines, 0.5, grey(0.4)));
    }
    c.rect_stroke(Rect::new(r.0, r.1, r.2 - r.0, r.3 - r.1), 0.3, grey(0.5));
}

/// A sample of a contour line from `(x, y)`, `w` mm long, for the key.
pub fn contour_swatch(c: &mut Canvas, x: f64, y: f64, w: f64) {
    contour_strokes(c, &[vec![(x, y), (x + w, y)]]);
}

/// Contour lines: a white casing under a dark line, so that they read on
/// the palest and the darkest colours alike.
fn contour_strokes(c: &mut Canvas, paths: &[Path]) {
    c.polylines(paths, 2.8, grey(1.0));
    c.polylines(paths, 1.1, grey(0.05));
}

/// Draws panel `p` in the box `(x, y, w, h)` (mm, bottom-left corner),
/// claimed as `name`, and returns what it placed.
pub fn draw(c: &mut Canvas, name: &str, area: Rect, p: &Panel) -> MapPanel {
    let (x, y, w, h) = (area.x, area.y, area.w, area.h);
    c.claim(name, area);
    let range = p.field.range();
    let scale = range.map(|(lo, hi)| LogScale::new(lo, hi));
    let levels = range.map_or_else(Vec::new, |(lo, hi)| levels(lo, hi));
    let (bottom, top) = (y + BOTTOM_ROOM, y + h - TOP_ROOM);
    let (row_edges, col_edges) = (edges(p.aql), edges(p.rql));
    let ys_lo_hi = (row_edges[0], row_edges[row_edges.len() - 1]);
    let y_ticks = ticks(c, ys_lo_hi.0, ys_lo_hi.1, top - bottom, p.per_unit, false);
    let y_tick_w = y_ticks
        .iter()
        .map(|(_, l)| c.width(l, Face::Regular, TICK))
        .fold(0.0, f64::max);
    let left = x + y_tick_w + TICK_LEN + 1.0;
    let ys = AxisMap {
        lo: ys_lo_hi.0,
        hi: ys_lo_hi.1,
        p0: bottom,
        p1: top,
    };
    let bar_labels = bar_labels(range, scale, &levels, bottom, top);
    let bar_label_w = bar_labels
        .iter()
        .map(|(_, l, face, size)| c.width(l, *face, *size))
        .fold(0.0, f64::max);
    let right = x + w - (BAR_GAP + BAR_W + TICK_LEN + 0.8 + bar_label_w);
    let xs = AxisMap {
        lo: col_edges[0],
        hi: col_edges[col_edges.len() - 1],
        p0: left,
        p1: right,
    };
    if right - left < 30.0 || top - bottom < 30.0 {
        c.fault(format!("{name}: the plot has no room (under 30 mm)"));
    }
    cells(c, p, &xs, &ys, &col_edges, &row_edges, scale);
    let (lattice_xs, lattice_ys) = (bordered(p.rql, &col_edges), bordered(p.aql, &row_edges));
    let logs = bordered_values(&p.field.logs(), p.rql.len());
    let lattice = Lattice {
        xs: &lattice_xs,
        ys: &lattice_ys,
        z: &logs,
    };
    // Each level's paths in data coordinates, on the page, and as drawn.
    let traced: Vec<Vec<Path>> = levels.iter().map(|l| lattice.trace(l.ln())).collect();
    let on_page: Vec<Vec<Path>> = traced
        .iter()
        .map(|paths| {
            paths
                .iter()
                .map(|path| {
                    path.iter()
                        .map(|&(a, b)| (xs.page(a), ys.page(b)))
                        .collect()
                })
                .collect()
        })
        .collect();
    let drawn: Vec<Vec<Path>> = on_page
        .iter()
        .map(|paths| paths.iter().map(|path| simplify(path, SIMPLIFY)).collect())
        .collect();
    let all: Vec<Path> = drawn.iter().flatten().cloned().collect();
    contour_strokes(c, &all);
    let plot = (left, bottom, right, top);
    let labels = place_labels(c, &levels, &on_page, &drawn, plot);
    for (level, boxes) in levels.iter().zip(&labels) {
        let text = value_label(*level);
        for r in boxes {
            draw_label(c, &text, *r);
        }
    }
    if range.is_none() {
        let tw = c.width(text::NO_CELL, Face::Bold, AXIS);
        let (cx, cy) = ((left + right) / 2.0, (bottom + top) / 2.0);
        draw_box_text(
            c,
            text::NO_CELL,
            Face::Bold,
            AXIS,
            (cx - tw / 2.0 - 2.0, cy - 3.0, cx + tw / 2.0 + 2.0, cy + 3.0),
        );
    }
    axes(c, name, p, &xs, &ys, &y_ticks, area);
    colour_bar(
        c,
        p.quantity,
        scale,
        &levels,
        &bar_labels,
        right + BAR_GAP,
        bottom,
        top,
    );
    let contours = levels
        .iter()
        .zip(traced)
        .zip(labels)
        .map(|((&level, paths), boxes)| MapContour {
            level,
            label: value_label(level),
            paths,
            labels: boxes
                .iter()
                .map(|&(x0, y0, x1, y1)| ContourLabel {
                    at: (xs.data((x0 + x1) / 2.0), ys.data((y0 + y1) / 2.0)),
                    page: Region {
                        name: format!("{name}: contour label {}", value_label(level)),
                        x: x0,
                        y: y0,
                        w: x1 - x0,
                        h: y1 - y0,
                    },
                })
                .collect(),
        })
        .collect();
    MapPanel {
        quantity: p.quantity,
        plot: Region {
            name: format!("{name}: plot"),
            x: left,
            y: bottom,
            w: right - left,
            h: top - bottom,
        },
        range,
        contours,
    }
}

/// Fills the cells: block by block (each cell its own block up to
/// [`MOST_BLOCKS`] a side, painted as the block's middle cell), blocks of
/// equal paint merged into rectangles ([`tiles`]), all rectangles of one
/// paint filled as one path; then the hatching of the cells without a
/// plan.
fn cells(
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

/// The labels of every level: for each path of a level, longest first,
/// the positions along it (the middle first, then outwards, at least
/// [`LABEL_SPACING`] apart along the line) where a label's box stays
/// inside the plot, keeps [`LABEL_GAP`] from every label placed before it
/// and is crossed by no other line. A line with no such position, or
/// shorter than three labels, goes unlabelled: a missing label is better
/// than a crowded one. Returns the boxes per level.
fn place_labels(
    c: &Canvas,
    levels: &[f64],
    on_page: &[Vec<Path>],
    drawn: &[Vec<Path>],
    (left, bottom, right, top): Corners,
) -> Vec<Vec<Corners>> {
    let bounds: Vec<Vec<Corners>> = drawn
        .iter()
        .map(|paths| paths.iter().map(|p| bounding_box(p)).collect())
        .collect();
    let crossed_by_another = |r: Corners, level: usize, path: usize| {
        drawn.iter().enumerate().any(|(li, paths)| {
            paths.iter().enumerate().any(|(k, pts)| {
                let b = bounds[li][k];
                (li, k) != (level, path)
                    && b.0 <= r.2
                    && r.0 <= b.2
                    && b.1 <= r.3
                    && r.1 <= b.3
                    && pts.windows(2).any(|s| segment_hits(s[0], s[1], r))
            })
        })
    };
    let mut placed: Vec<Corners> = Vec::new();
    let mut out = Vec::with_capacity(levels.len());
    let bh = DIGIT_HEIGHT * LABEL * MM_PER_PT + 2.0 * PAD_Y;
    for (li, &level) in levels.iter().enumerate() {
        let bw = c.width(&value_label(level), Face::Bold, LABEL) + 2.0 * PAD_X;
        let lengths: Vec<Vec<f64>> = on_page[li].iter().map(|p| cumulative(p)).collect();
        let mut order: Vec<usize> = (0..on_page[li].len()).collect();
        order.sort_by(|&a, &b| {
            let total = |k: usize| lengths[k].last().copied().unwrap_or(0.0);
            total(b).total_cmp(&total(a))
        });
        let mut boxes = Vec::new();
        for k in order {
            let total = lengths[k].last().copied().unwrap_or(0.0);
            if total < 3.0 * bw {
                continue;
            }
            let mut along: Vec<f64> = Vec::new();
            for f in FRACTIONS {
                let s = f * total;
                if along.iter().any(|&a| (a - s).abs() < LABEL_SPACING) {
                    continue;
                }
                let (px, py) = point_along(&on_page[li][k], &lengths[k], s);
                let r = (px - bw / 2.0, py - bh / 2.0, px + bw / 2.0, py + bh / 2.0);
                let inside = r.0 >= left + 0.6
                    && r.2 <= right - 0.6
                    && r.1 >= bottom + 0.6
                    && r.3 <= top - 0.6;
                let apart = placed.iter().all(|o| {
                    r.0 > o.2 + LABEL_GAP
                        || o.0 > r.2 + LABEL_GAP
                        || r.1 > o.3 + LABEL_GAP
                        || o.1 > r.3 + LABEL_GAP
                });
                let grown = (r.0 - 0.3, r.1 - 0.3, r.2 + 0.3, r.3 + 0.3);
                if inside && apart && !crossed_by_another(grown, li, k) {
                    placed.push(r);
                    boxes.push(r);
                    along.push(s);
                }
            }
        }
        out.push(boxes);
    }
    out
}

/// A contour label: its value in bold on a white box that interrupts the
/// line.
fn draw_label(c: &mut Canvas, text: &str, r: Corners) {
    draw_box_text(c, text, Face::Bold, LABEL, r);
}

/// `text` centred in a white box `r`.
fn draw_box_text(c: &mut Canvas, text: &str, face: Face, size: f64, r: Corners) {
    c.fill_rects(&[r], grey(1.0));
    let tw = c.width(text, face, size);
    let baseline = (r.1 + r.3) / 2.0 - DIGIT_HEIGHT * size * MM_PER_PT / 2.0;
    c.text(
        (r.0 + r.2 - tw) / 2.0,
        baseline,
        text,
        face,
        size,
        grey(0.05),
    );
}

/// The smallest rectangle holding `path`.
fn bounding_box(path: &[(f64, f64)]) -> Corners {
    path.iter().fold(
        (
            f64::INFINITY,
            f64::INFINITY,
            f64::NEG_INFINITY,
            f64::NEG_INFINITY,
        ),
        |(a, b, c, d), &(x, y)| (a.min(x), b.min(y), c.max(x), d.max(y)),
    )
}

/// The length along `path` to each of its points.
fn cumulative(path: &[(f64, f64)]) -> Vec<f64> {
    let mut out = Vec::with_capacity(path.len());
    let mut total = 0.0;
    for (k, p) in path.iter().enumerate() {
        if k > 0 {
            let q = path[k - 1];
            total += (p.0 - q.0).hypot(p.1 - q.1);
        }
        out.push(total);
    }
    out
}

/// The point `s` mm along `path`, whose cumulative lengths are `lengths`.
fn point_along(path: &[(f64, f64)], lengths: &[f64], s: f64) -> (f64, f64) {
    let k = lengths.partition_point(|&l| l < s).clamp(1, path.len() - 1);
    let (a, b) = (path[k - 1], path[k]);
    let seg = lengths[k] - lengths[k - 1];
    let t = if seg > 0.0 {
        ((s - lengths[k - 1]) / seg).clamp(0.0, 1.0)
    } else {
        0.0
    };
    (a.0 + t * (b.0 - a.0), a.1 + t * (b.1 - a.1))
}

/// `path` with the points dropped that lie within `tol` mm of the line
/// through the points kept on either side (Ramer-Douglas-Peucker).
fn simplify(path: &[(f64, f64)], tol: f64) -> Path {
    if path.len() <= 2 {
        return path.to_vec();
    }
    let mut keep = vec![false; path.len()];
    keep[0] = true;
    keep[path.len() - 1] = true;
    let mut stack = vec![(0, path.len() - 1)];
    while let Some((a, b)) = stack.pop() {
        let (pa, pb) = (path[a], path[b]);
        let (dx, dy) = (pb.0 - pa.0, pb.1 - pa.1);
        let len = dx.hypot(dy);
        let distance = |p: (f64, f64)| {
            if len == 0.0 {
                (p.0 - pa.0).hypot(p.1 - pa.1)
            } else {
                ((p.0 - pa.0) * dy - (p.1 - pa.1) * dx).abs() / len
            }
        };
        let far = (a + 1..b)
            .map(|k| (k, distance(path[k])))
            .max_by(|x, y| x.1.total_cmp(&y.1));
        if let Some((k, d)) = far
            && d > tol
        {
            keep[k] = true;
            stack.push((a, k));
            stack.push((k, b));
        }
    }
    path.iter()
        .zip(keep)
        .filter_map(|(&p, k)| k.then_some(p))
        .collect()
}

/// The plot's frame, its ticks and tick labels, the axis labels and the
/// panel's title, with a fault for any that leaves the panel.
fn axes(
    c: &mut Canvas,
    name: &str,
    p: &Panel,
    xs: &AxisMap,
    ys: &AxisMap,
    y_ticks: &[(f64, String)],
    area: Rect,
) {
    let (x, y, w, h) = (area.x, area.y, area.w, area.h);
    let (left, bottom, right, top) = (xs.p0, ys.p0, xs.p1, ys.p1);
    let x_ticks = ticks(c, xs.lo, xs.hi, right - left, p.per_unit, true);
    let mut marks: Vec<Path> = Vec::new();
    for (v, label) in &x_ticks {
        let px = xs.page(*v);
        marks.push(vec![(px, bottom), (px, bottom - TICK_LEN)]);
        let lw = c.width(label, Face::Regular, TICK);
        c.text(
            px - lw / 2.0,
            bottom - TICK_LEN - 3.4,
            label,
            Face::Regular,
            TICK,
            grey(0.1),
        );
    }
    for (v, label) in y_ticks {
        let py = ys.page(*v);
        marks.push(vec![(left - TICK_LEN, py), (left, py)]);
        c.text_right(
            left - TICK_LEN - 0.6,
            py - DIGIT_HEIGHT * TICK * MM_PER_PT / 2.0,
            label,
            Face::Regular,
            TICK,
            grey(0.1),
        );
    }
    c.polylines(&marks, 0.6, grey(0.0));
    c.rect_stroke(
        Rect::new(left, bottom, right - left, top - bottom),
        0.7,
        grey(0.0),
    );
    let x_label = text::rql_axis(p.per_unit);
    let xw = c.width(x_label, Face::Regular, AXIS);
    c.text(
        (left + right - xw) / 2.0,
        y + 1.5,
        x_label,
        Face::Regular,
        AXIS,
        grey(0.0),
    );
    if xw > w {
        c.fault(format!("{name}: '{x_label}' is wider than the panel"));
    }
    let y_label = text::aql_axis(p.per_unit);
    c.text(x, top + 2.6, y_label, Face::Regular, AXIS, grey(0.0));
    let bar_title_x = right + BAR_GAP;
    if x + c.width(y_label, Face::Regular, AXIS) + 3.0 > bar_title_x {
        c.fault(format!(
            "{name}: '{y_label}' runs into the colour bar's title"
        ));
    }
    let fit = c.fit(
        &p.title,
        Face::Bold,
        w,
        TITLE * MM_PER_PT * 1.3,
        Shrink::new(TITLE, 7.5),
    );
    if !fit.fits {
        c.overflow(format!("{name}: '{}'", p.title));
    }
    c.text(x, y + h - 4.0, &p.title, Face::Bold, fit.size, grey(0.0));
}

/// A colour bar label: position (page y), text, face and size.
type BarLabel = (f64, String, Face, f64);

/// The colour bar's labels: each contour level, and the smallest and
/// largest value (lighter, where they keep clear of the levels' labels);
/// one label in the middle when every cell has the same value.
fn bar_labels(
    range: Option<(f64, f64)>,
    scale: Option<LogScale>,
    levels: &[f64],
    bottom: f64,
    top: f64,
) -> Vec<BarLabel> {
    let (Some((lo, hi)), Some(s)) = (range, scale) else {
        return Vec::new();
    };
    if !s.spans() {
        return vec![((bottom + top) / 2.0, value_label(lo), Face::Bold, TICK)];
    }
    let at = |v: f64| bottom + s.t(v) * (top - bottom);
    let mut out: Vec<BarLabel> = levels
        .iter()
        .map(|&l| (at(l), value_label(l), Face::Bold, TICK))
        .collect();
    let clear = 3.0 * TICK * MM_PER_PT;
    for v in [lo, hi] {
        let py = at(v);
        if levels.iter().all(|&l| (at(l) - py).abs() >= clear) {
            out.push((py, value_label(v), Face::Regular, TICK - 0.5));
        }
    }
    out
}

/// The colour bar from `bottom` to `top` at page x `bx`: the ramp's
/// steps on the panel's log scale, a dark line at each contour level
/// (as the contours are drawn) and the labels beside it; its title above.
#[allow(clippy::too_many_arguments)]
fn colour_bar(
    c: &mut Canvas,
    quantity: MapQuantity,
    scale: Option<LogScale>,
    levels: &[f64],
    labels: &[BarLabel],
    bx: f64,
    bottom: f64,
    top: f64,
) {
    c.text(
        bx,
        top + 2.6,
        text::bar_title(quantity),
        Face::Bold,
        AXIS,
        grey(0.0),
    );
    let Some(s) = scale else {
        return;
    };
    let span = top - bottom;
    if s.spans() {
        let last = (ramp::STEPS - 1) as f64;
        for k in 0..ramp::STEPS {
            let t0 = ((k as f64 - 0.5) / last).max(0.0);
            let t1 = ((k as f64 + 0.5) / last).min(1.0);
            let y1 = bottom + t1 * span + if t1 < 1.0 { SEAM } else { 0.0 };
            c.fill_rects(&[(bx, bottom + t0 * span, bx + BAR_W, y1)], ramp::colour(k));
        }
    } else {
        c.fill_rects(
            &[(bx, bottom, bx + BAR_W, top)],
            ramp::colour(ramp::step(0.5)),
        );
    }
    let marks: Vec<Path> = levels
        .iter()
        .map(|&l| {
            let py = bottom + s.t(l) * span;
            vec![(bx, py), (bx + BAR_W + TICK_LEN, py)]
        })
        .collect();
    contour_strokes(c, &marks);
    c.rect_stroke(Rect::new(bx, bottom, BAR_W, span), 0.5, grey(0.0));
    for (py, label, face, size) in labels {
        c.text(
            bx + BAR_W + TICK_LEN + 0.8,
            py - DIGIT_HEIGHT * size * MM_PER_PT / 2.0,
            label,
            *face,
            *size,
            grey(0.05),
        );
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Places the labels of `paths` (one path per level, levels 10, 20,
    /// ...) on a plot from (0, 0) to (200, 100) mm.
    fn labels_of(paths: &[Path]) -> Vec<Vec<Corners>> {
        let fonts = crate::print::fonts::Fonts::embedded().unwrap();
        let mut page = crate::print::draw::Recorder::default();
        let c = Canvas::new(&mut page, &fonts);
        let levels: Vec<f64> = (1..=paths.len()).map(|k| 10.0 * k as f64).collect();
        let per_level: Vec<Vec<Path>> = paths.iter().map(|p| vec![p.clone()]).collect();
        place_labels(
            &c,
            &levels,
            &per_level,
            &per_level,
            (0.0, 0.0, 200.0, 100.0),
        )
    }

    fn gap_between(a: Corners, b: Corners) -> f64 {
        let dx = (b.0 - a.2).max(a.0 - b.2).max(0.0);
        let dy = (b.1 - a.3).max(a.1 - b.3).max(0.0);
        dx.max(dy)
    }

    #[test]
    fn labels_of_close_lines_step_aside_to_keep_apart() {
        // Two lines 5 mm apart: both labels at the middle would come closer
        // than the gap, so the second moves along its line.
        let labels = labels_of(&[
            vec![(20.0, 40.0), (140.0, 40.0)],
            vec![(20.0, 45.0), (140.0, 45.0)],
        ]);
        assert_eq!(labels[0].len(), 1);
        assert_eq!(labels[1].len(), 1);
        assert!((labels[0][0].0 + labels[0][0].2) / 2.0 == 80.0);
        assert!(gap_between(labels[0][0], labels[1][0]) > LABEL_GAP);
    }

    #[test]
    fn a_label_crossed_by_another_line_or_leaving_the_plot_is_skipped() {
        // Lines 2 mm apart cross each other's labels wherever they go; a
        // line along the plot's bottom edge has no room for a box.
        let labels = labels_of(&[
            vec![(20.0, 60.0), (140.0, 60.0)],
            vec![(20.0, 62.0), (140.0, 62.0)],
            vec![(20.0, 0.5), (140.0, 0.5)],
        ]);
        assert!(labels.iter().all(Vec::is_empty), "{labels:?}");
    }

    #[test]
    fn a_short_line_goes_unlabelled_and_a_long_one_gets_spaced_labels() {
        let labels = labels_of(&[
            vec![(20.0, 20.0), (30.0, 20.0)],
            vec![(0.0, 60.0), (200.0, 60.0), (200.0, 0.0), (0.0, 0.0)],
        ]);
        assert!(labels[0].is_empty());
        // Along the 460 mm line, labels at least LABEL_SPACING apart.
        let long = &labels[1];
        assert!(long.len() >= 2, "{long:?}");
        for (i, a) in long.iter().enumerate() {
            for b in &long[i + 1..] {
                let (ca, cb) = ((a.0 + a.2) / 2.0, (b.0 + b.2) / 2.0);
                let (ya, yb) = ((a.1 + a.3) / 2.0, (b.1 + b.3) / 2.0);
                assert!((ca - cb).abs() + (ya - yb).abs() >= LABEL_SPACING - 1e-9);
            }
        }
    }

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

    #[test]
    fn simplifying_drops_only_points_near_the_line() {
        let path = vec![(0.0, 0.0), (1.0, 0.01), (2.0, 0.0), (3.0, 1.0)];
        assert_eq!(
            simplify(&path, 0.05),
            vec![(0.0, 0.0), (2.0, 0.0), (3.0, 1.0)]
        );
        assert_eq!(simplify(&path, 0.001), path);
    }

    #[test]
    fn a_point_along_a_path_is_measured_by_its_length() {
        let path = vec![(0.0, 0.0), (3.0, 0.0), (3.0, 4.0)];
        let lengths = cumulative(&path);
        assert_eq!(lengths, vec![0.0, 3.0, 7.0]);
        assert_eq!(point_along(&path, &lengths, 5.0), (3.0, 2.0));
        assert_eq!(point_along(&path, &lengths, 1.5), (1.5, 0.0));
    }

    #[test]
    fn hatching_covers_the_rectangle() {
        // Every point of the rectangle's bottom edge lies within one
        // spacing of a rising line.
        let r = (10.0, 20.0, 30.0, 25.0);
        let lines = hatch_lines(r, 1.0);
        let starts: Vec<f64> = lines.iter().map(|l| l[0].0).collect();
        for k in 0..=200 {
            let x = 10.0 + 20.0 * k as f64 / 200.0;
            assert!(starts.iter().any(|&s| (s - x).abs() <= HATCH), "{x}");
        }
        // A rising line climbs the rectangle's height over the same width.
        assert_eq!(lines[0][1].0 - lines[0][0].0, 5.0);
    }
}
