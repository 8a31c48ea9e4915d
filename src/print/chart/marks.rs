//! Labelled markers on a chart: each label goes to the nearest position
//! that keeps inside the plot and clear of the curves, the guides and the
//! other labels; a label with no room is a layout fault, never printed on
//! another.

use super::guides::{LABEL_LEAD, lines_box};
use super::plot::Plot;
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, rgb};
use crate::print::geometry::{Corners, segment_hits};

/// One labelled point on a chart.
pub struct Mark {
    /// Where, in data units.
    pub x: f64,
    /// Where, in data units.
    pub y: f64,
    /// The label on one line.
    pub label: String,
    /// The label on two lines, for where one line does not fit.
    pub stacked: Option<[String; 2]>,
}

/// A label's lines, their width and the positions to try for it.
type Placing = (Vec<String>, f64, Vec<(f64, f64)>);

/// Whether a label `(position, width, lines)` may go there.
type PositionTest<'a> = &'a dyn Fn(&(f64, f64), f64, usize) -> bool;

/// What the marks' labels keep clear of.
#[derive(Clone, Copy, Default)]
pub struct Keep<'a> {
    /// A vertical guide at this page x.
    pub guide_x: Option<f64>,
    /// A horizontal guide at this page y.
    pub guide_y: Option<f64>,
    /// Curves, as data points.
    pub curves: &'a [&'a [(f64, f64)]],
    /// Labels placed already (page boxes).
    pub labels: &'a [Corners],
}

/// Labelled markers. The positions tried, nearest first: right-above,
/// left-above, right-below, left-below, a little further below or above,
/// level on either side; then, farther, higher above, and right of the
/// point higher above. A position must stay
/// inside the plot (or the chart's margin right of it), off the vertical
/// guide and the horizontal one of `keep`, and clear of its curves (data
/// points), its labels and the labels placed before it. The near positions on one line, then on two
/// lines, then the far ones; then all again allowing 3 mm above the plot
/// and across the vertical guide (better than across the curve). Failing
/// that, across the curve: the first of the four nearest inside the plot,
/// then right-above while it stays in the chart's box, then the first
/// position on two lines inside the plot or 3 mm above it. No label is put
/// on another: a label with no room, or that leaves the chart's box, is a
/// layout fault.
pub fn marks(c: &mut Canvas, plot: &Plot, marks: &[Mark], keep: &Keep) {
    let Keep {
        guide_x,
        guide_y,
        curves,
        labels: avoid,
    } = *keep;
    let (left, bottom, top) = (plot.left, plot.bottom, plot.top);
    // Labels may use the margin right of the plot, inside the chart's box.
    let right_edge = plot.area.right() - 0.5;
    let curves: Vec<Vec<(f64, f64)>> = curves
        .iter()
        .map(|pts| pts.iter().map(|&p| plot.at(p)).collect())
        .collect();
    let mut placed: Vec<Corners> = avoid.to_vec();
    for m in marks {
        let (mx, my) = (plot.sx(m.x), plot.sy(m.y));
        c.marker(mx, my, 1.3, rgb(0.75, 0.2, 0.1));
        let one = vec![m.label.clone()];
        let mut variants = vec![one];
        if let Some(two) = &m.stacked {
            variants.push(two.to_vec());
        }
        // (lines, their width, candidate last-baseline starts)
        let layouts: Vec<Placing> = variants
            .into_iter()
            .map(|lines| {
                let lw = lines
                    .iter()
                    .map(|l| c.width(l, Face::Regular, 6.5))
                    .fold(0.0, f64::max);
                let up = LABEL_LEAD * (lines.len() as f64 - 1.0);
                let candidates = vec![
                    (mx + 2.0, my + 1.2),
                    (mx - 2.0 - lw, my + 1.2),
                    (mx + 2.0, my - 3.6 - up),
                    (mx - 2.0 - lw, my - 3.6 - up),
                    (mx - lw / 2.0, my - 6.0 - up),
                    (mx + 2.0, my - 6.0 - up),
                    (mx - 2.0 - lw, my - 6.0 - up),
                    (mx - lw / 2.0, my + 3.5),
                    (mx + 3.0, my - 1.0 - up / 2.0),
                    (mx - 3.0 - lw, my - 1.0 - up / 2.0),
                    (mx - lw / 2.0, my + 7.0),
                    (mx - lw + 1.0, my + 7.0),
                    (mx - lw / 2.0, my + 11.0),
                    (mx + 1.0, my + 11.0),
                    // Right and higher above, over a second curve that
                    // passes just above the point.
                    (mx + 2.0, my + 3.6),
                    (mx + 2.0, my + 5.5),
                ];
                (lines, lw, candidates)
            })
            .collect();
        // Inside the plot and off the vertical guide, or with `rise` mm
        // more above the plot and across the guide.
        let within = |&(lx, ly): &(f64, f64), lw: f64, n: usize, rise: f64| {
            let up = LABEL_LEAD * (n as f64 - 1.0);
            lx >= left
                && lx + lw <= right_edge
                && ly >= bottom + 0.5
                && ly + 2.5 + up <= top + rise
                && (rise > 0.0 || guide_x.is_none_or(|g| g < lx - 0.5 || g > lx + lw + 0.5))
                && guide_y.is_none_or(|g| g < ly - 1.0 || g > ly + 3.0 + up)
        };
        let inside = |p: &(f64, f64), lw: f64, n: usize| within(p, lw, n, 0.0);
        // Off the labels placed so far.
        let free = |&(lx, ly): &(f64, f64), lw: f64, n: usize| {
            let r = lines_box(lx, ly, lw, n);
            let overlaps = |o: &Corners| r.0 < o.2 && o.0 < r.2 && r.1 < o.3 && o.1 < r.3;
            !placed.iter().any(overlaps)
        };
        let clear = |&(lx, ly): &(f64, f64), lw: f64, n: usize| {
            let r = lines_box(lx, ly, lw, n);
            free(&(lx, ly), lw, n)
                && !curves
                    .iter()
                    .any(|pts| pts.windows(2).any(|s| segment_hits(s[0], s[1], r)))
        };
        // The near positions (one line, then two) before the far ones.
        let near = 10;
        let search = |ok: PositionTest| {
            [(0, near), (near, usize::MAX)]
                .iter()
                .find_map(|&(from, to)| {
                    layouts.iter().find_map(|(lines, lw, cands)| {
                        cands[from..to.min(cands.len())]
                            .iter()
                            .find(|p| ok(p, *lw, lines.len()))
                            .map(|&p| (lines, *lw, p))
                    })
                })
        };
        let pick = search(&|p, lw, n| inside(p, lw, n) && clear(p, lw, n))
            // Then the same, rising into the room under the axis label
            // above the plot (for a point near the top) and crossing the
            // dashed guide if need be: better than crossing the curve.
            .or_else(|| search(&|p, lw, n| within(p, lw, n, 3.0) && clear(p, lw, n)))
            // Then across a vertical guide just right of the point, at the
            // point's height: where a steep curve near the top leaves no
            // room between the point and the guide, nor above them.
            .or_else(|| {
                let g = guide_x.filter(|&g| g > mx && g - mx < 25.0)?;
                layouts.iter().find_map(|(lines, lw, _)| {
                    let up = LABEL_LEAD * (lines.len() as f64 - 1.0);
                    [(g + 1.5, my - 1.0 - up / 2.0), (g + 1.5, my - 3.6 - up)]
                        .into_iter()
                        .find(|p| within(p, *lw, lines.len(), 3.0) && clear(p, *lw, lines.len()))
                        .map(|p| (lines, *lw, p))
                })
            })
            // As before the curve check: the first of the four nearest
            // that is inside, else right-above.
            .or_else(|| {
                let (lines, lw, cands) = &layouts[0];
                cands[..4]
                    .iter()
                    .find(|p| inside(p, *lw, 1) && free(p, *lw, 1))
                    .map(|&p| (lines, *lw, p))
            });
        let in_box = |(lx, ly): (f64, f64), lw: f64, n: usize| {
            let b = lines_box(lx, ly, lw, n);
            b.0 >= plot.area.x - 0.5
                && b.2 <= plot.area.right() + 0.5
                && b.1 >= plot.area.y
                && b.3 <= plot.area.top()
        };
        let (lines, lw, (lx, ly)) = match pick {
            Some(p) => p,
            None => {
                // Right-above while it stays in the chart's box, else the
                // first position on two lines inside the plot (or 3 mm
                // above it), even across the curve or the guide, else
                // right-above (and an overflow).
                let (lines, lw, cands) = &layouts[0];
                if in_box(cands[0], *lw, 1) && free(&cands[0], *lw, 1) {
                    (lines, *lw, cands[0])
                } else {
                    layouts[1..]
                        .iter()
                        .find_map(|(l2, w2, c2)| {
                            c2.iter()
                                .find(|p| within(p, *w2, l2.len(), 3.0) && free(p, *w2, l2.len()))
                                .map(|&p| (l2, *w2, p))
                        })
                        .unwrap_or((lines, *lw, cands[0]))
                }
            }
        };
        let b = lines_box(lx, ly, lw, lines.len());
        if !in_box((lx, ly), lw, lines.len()) || !free(&(lx, ly), lw, lines.len()) {
            c.fault(format!(
                "chart label '{}' has no room in its chart",
                m.label
            ));
        }
        placed.push(b);
        for (i, line) in lines.iter().enumerate() {
            let y = ly + LABEL_LEAD * (lines.len() - 1 - i) as f64;
            c.text(lx, y, line, Face::Regular, 6.5, rgb(0.55, 0.1, 0.05));
        }
    }
}
