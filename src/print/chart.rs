//! Vector line charts: axes with tick labels, gridlines, one curve, and
//! labelled markers. Kept apart from the numbers: the caller hands in the
//! points already computed.

use super::canvas::Canvas;
use super::draw::{Colour as Color, Face, grey, rgb};
use super::geometry::Rect;

/// One labelled point on a chart.
pub struct Mark {
    pub x: f64,
    pub y: f64,
    pub label: String,
    /// The label on two lines, for where one line does not fit.
    pub stacked: Option<[String; 2]>,
}

/// A label's lines, their width and the positions to try for it.
type Placing = (Vec<String>, f64, Vec<(f64, f64)>);

/// Whether a label `(position, width, lines)` may go there.
type PositionTest<'a> = &'a dyn Fn(&(f64, f64), f64, usize) -> bool;

/// Baseline to baseline of a stacked label, mm.
const LABEL_LEAD: f64 = 2.64;

/// What to draw.
pub struct Chart<'a> {
    pub title: &'a str,
    pub x_label: &'a str,
    pub y_label: &'a str,
    pub x_max: f64,
    pub y_max: f64,
    /// Format a tick value on each axis, given the tick step.
    pub x_tick: &'a dyn Fn(f64, f64) -> String,
    pub y_tick: &'a dyn Fn(f64, f64) -> String,
    pub curve: &'a [(f64, f64)],
    pub marks: &'a [Mark],
    /// A vertical dashed guide with its label (e.g. the indifference quality).
    pub guide: Option<(f64, String)>,
}

/// A "nice" tick step for a range: 1, 2 or 5 times a power of ten giving
/// four to eight intervals.
pub fn nice_step(range: f64) -> f64 {
    let raw = range / 5.0;
    let magnitude = 10f64.powf(raw.log10().floor());
    let m = raw / magnitude;
    let nice = if m < 1.5 {
        1.0
    } else if m < 3.0 {
        2.0
    } else if m < 7.0 {
        5.0
    } else {
        10.0
    };
    nice * magnitude
}

/// The nice step after `step`: 1 -> 2 -> 5 -> 10 times a power of ten.
pub fn next_step(step: f64) -> f64 {
    let magnitude = 10f64.powf(step.log10().floor());
    let m = (step / magnitude).round();
    let next = if m < 2.0 {
        2.0
    } else if m < 5.0 {
        5.0
    } else {
        10.0
    };
    next * magnitude
}

/// Rounds an axis end up to a whole number of nice steps.
pub fn nice_ceiling(v: f64) -> f64 {
    let step = nice_step(v);
    (v / step).ceil() * step
}

/// The axes of a chart: title, labels, ranges and tick formats.
pub struct Axes<'a> {
    pub title: &'a str,
    pub x_label: &'a str,
    pub y_label: &'a str,
    pub x_max: f64,
    pub y_max: f64,
    /// Format a tick value on each axis, given the tick step.
    pub x_tick: &'a dyn Fn(f64, f64) -> String,
    pub y_tick: &'a dyn Fn(f64, f64) -> String,
    /// The tick steps; `None` takes [`nice_step`] of the range.
    pub x_step: Option<f64>,
    pub y_step: Option<f64>,
}

/// The plotting area of a chart in the box `(x, y, w, h)`, with the scale
/// from data to page.
#[derive(Clone, Copy, Debug)]
pub struct Plot {
    /// The chart's whole box.
    pub x: f64,
    pub y: f64,
    pub w: f64,
    pub h: f64,
    /// The plotting area inside it, mm.
    pub left: f64,
    pub bottom: f64,
    pub right: f64,
    pub top: f64,
    x_max: f64,
    y_max: f64,
}

impl Plot {
    /// The plot of data `0..=x_max` by `0..=y_max` in the box `(x, y, w, h)`,
    /// leaving room for the title, the tick labels and the axis labels.
    pub fn new(x: f64, y: f64, w: f64, h: f64, x_max: f64, y_max: f64) -> Self {
        Plot {
            x,
            y,
            w,
            h,
            left: x + 13.0,
            bottom: y + 11.0,
            right: x + w - 3.0,
            top: y + h - 12.0,
            x_max,
            y_max,
        }
    }

    /// Page x of data x.
    pub fn sx(&self, v: f64) -> f64 {
        self.left + v / self.x_max * (self.right - self.left)
    }

    /// Page y of data y.
    pub fn sy(&self, v: f64) -> f64 {
        self.bottom + v / self.y_max * (self.top - self.bottom)
    }

    /// The page point of a data point, held inside the plot vertically.
    pub fn at(&self, (a, b): (f64, f64)) -> (f64, f64) {
        (self.sx(a), self.sy(b.min(self.y_max)))
    }
}

/// Claims the chart's box as `name` and draws the title, gridlines, tick
/// labels, axes and axis labels of `axes` on `plot`.
pub fn frame(c: &mut Canvas, name: &str, plot: &Plot, axes: &Axes) {
    let (x, y, w, h) = (plot.x, plot.y, plot.w, plot.h);
    c.claim(name, Rect::new(x, y, w, h));
    let (left, bottom, right, top) = (plot.left, plot.bottom, plot.right, plot.top);
    let pw = right - left;
    c.text(x, y + h - 3.5, axes.title, Face::Bold, 8.0, grey(0.0));
    // Gridlines and ticks.
    let mut xs = axes.x_step.unwrap_or_else(|| nice_step(axes.x_max));
    // On a narrow chart, fewer ticks, so that their labels keep apart.
    while xs < axes.x_max {
        let widest = (0..)
            .map(|i| i as f64 * xs)
            .take_while(|v| *v <= axes.x_max * (1.0 + 1e-9))
            .map(|v| c.width(&(axes.x_tick)(v, xs), Face::Regular, 6.5))
            .fold(0.0, f64::max);
        if plot.sx(xs) - plot.sx(0.0) >= widest + 1.5 {
            break;
        }
        xs = next_step(xs);
    }
    let ys = axes.y_step.unwrap_or_else(|| nice_step(axes.y_max));
    let mut v = 0.0;
    while v <= axes.x_max * (1.0 + 1e-9) {
        c.line(
            &[(plot.sx(v), bottom), (plot.sx(v), top)],
            0.3,
            grey(0.85),
            None,
        );
        let label = (axes.x_tick)(v, xs);
        let lw = c.width(&label, Face::Regular, 6.5);
        c.text(
            plot.sx(v) - lw / 2.0,
            bottom - 3.5,
            &label,
            Face::Regular,
            6.5,
            grey(0.2),
        );
        v += xs;
    }
    let mut v = 0.0;
    while v <= axes.y_max * (1.0 + 1e-9) {
        c.line(
            &[(left, plot.sy(v)), (right, plot.sy(v))],
            0.3,
            grey(0.85),
            None,
        );
        c.text_right(
            left - 1.2,
            plot.sy(v) - 0.9,
            &(axes.y_tick)(v, ys),
            Face::Regular,
            6.5,
            grey(0.2),
        );
        v += ys;
    }
    c.line(
        &[(left, top), (left, bottom), (right, bottom)],
        0.7,
        grey(0.0),
        None,
    );
    let xl = c.width(axes.x_label, Face::Regular, 7.0);
    c.text(
        left + (pw - xl) / 2.0,
        y + 1.5,
        axes.x_label,
        Face::Regular,
        7.0,
        grey(0.0),
    );
    c.text(x, top + 3.0, axes.y_label, Face::Regular, 7.0, grey(0.0));
    // Every label of a chart stays inside its box.
    for (label, face, size) in [
        (axes.title, Face::Bold, 8.0),
        (axes.x_label, Face::Regular, 7.0),
        (axes.y_label, Face::Regular, 7.0),
    ] {
        if c.width(label, face, size) > w {
            c.fault(format!("{name}: '{label}' is wider than the chart"));
        }
    }
}

/// A label's box on the page: `(x0, y0, x1, y1)`, a little larger than
/// its glyphs at 6.5 points.
pub type LabelBox = (f64, f64, f64, f64);

/// The box of a label of `lines` lines `lw` wide whose last baseline
/// starts at `(lx, ly)`.
fn label_box(lx: f64, ly: f64, lw: f64) -> LabelBox {
    lines_box(lx, ly, lw, 1)
}

fn lines_box(lx: f64, ly: f64, lw: f64, lines: usize) -> LabelBox {
    let above = 2.6 + LABEL_LEAD * (lines as f64 - 1.0);
    (lx - 0.4, ly - 0.9, lx + lw + 0.4, ly + above)
}

/// A vertical dashed guide at data x `gx`, labelled left of the line near
/// the axis, where a falling curve leaves room; when the label does not
/// fit there, right of the line three quarters up, where a falling curve
/// that crosses the guide halfway up (the OC at its indifference quality)
/// does not come and the risk points' labels near the top and the bottom
/// are not, on one line or, broken before its last " at ", on two.
/// Returns the label's box.
pub fn vertical_guide(c: &mut Canvas, plot: &Plot, gx: f64, label: &str) -> LabelBox {
    let (left, bottom) = (plot.left, plot.bottom);
    let x = plot.sx(gx);
    c.line(&[(x, bottom), (x, plot.top)], 0.5, grey(0.45), Some(2.0));
    let lw = c.width(label, Face::Regular, 6.5);
    let right_edge = plot.x + plot.w - 0.5;
    let lines: Vec<&str> = if x - 1.0 - lw >= left || x + 1.0 + lw <= right_edge {
        vec![label]
    } else {
        match label.rfind(" at ") {
            Some(i) => vec![&label[..i], &label[i + 1..]],
            None => vec![label],
        }
    };
    let lw = lines
        .iter()
        .map(|l| c.width(l, Face::Regular, 6.5))
        .fold(0.0, f64::max);
    let (lx, ly) = if x - 1.0 - lw >= left && lines.len() == 1 {
        (x - 1.0 - lw, bottom + 2.0)
    } else {
        // Three quarters up: above where the curve crosses the guide,
        // below the producer's point near the top.
        let y = bottom + 0.72 * (plot.top - bottom);
        (x + 1.0, y - LABEL_LEAD * (lines.len() as f64 - 1.0) / 2.0)
    };
    for (i, line) in lines.iter().enumerate() {
        let y = ly + LABEL_LEAD * (lines.len() - 1 - i) as f64;
        c.text(lx, y, line, Face::Regular, 6.5, grey(0.3));
    }
    if lx + lw > plot.x + plot.w {
        c.fault(format!("chart guide '{label}' leaves its chart"));
    }
    lines_box(lx, ly, lw, lines.len())
}

/// A horizontal dashed reference at data y `gy`, labelled above it at the
/// right end of the plot. Returns the label's box.
pub fn horizontal_guide(c: &mut Canvas, plot: &Plot, gy: f64, label: &str) -> LabelBox {
    let y = plot.sy(gy);
    c.line(
        &[(plot.left, y), (plot.right, y)],
        0.6,
        grey(0.35),
        Some(2.0),
    );
    let lw = c.width(label, Face::Regular, 6.5);
    let lx = plot.right - lw - 0.5;
    c.text(lx, y + 1.0, label, Face::Regular, 6.5, grey(0.25));
    if lx < plot.left {
        c.fault(format!("chart guide '{label}' leaves its chart"));
    }
    label_box(lx, y + 1.0, lw)
}

/// A line through data points.
pub fn curve(
    c: &mut Canvas,
    plot: &Plot,
    pts: &[(f64, f64)],
    thickness: f64,
    color: Color,
    dash: Option<f32>,
) {
    let pts: Vec<(f64, f64)> = pts.iter().map(|&p| plot.at(p)).collect();
    c.line(&pts, thickness, color, dash);
}

/// A filled area bounded by data points.
pub fn zone(c: &mut Canvas, plot: &Plot, pts: &[(f64, f64)], color: Color) {
    let pts: Vec<(f64, f64)> = pts.iter().map(|&p| plot.at(p)).collect();
    c.fill(&pts, color);
}

/// The curve's colour.
pub fn curve_colour() -> Color {
    rgb(0.05, 0.25, 0.55)
}

/// Whether the segment `a`-`b` passes through the rectangle
/// `(x0, y0)`-`(x1, y1)` (Liang-Barsky clipping).
pub fn segment_hits(a: (f64, f64), b: (f64, f64), (x0, y0, x1, y1): (f64, f64, f64, f64)) -> bool {
    let (dx, dy) = (b.0 - a.0, b.1 - a.1);
    let (mut t0, mut t1) = (0.0_f64, 1.0_f64);
    for (p, q) in [
        (-dx, a.0 - x0),
        (dx, x1 - a.0),
        (-dy, a.1 - y0),
        (dy, y1 - a.1),
    ] {
        if p == 0.0 {
            if q < 0.0 {
                return false;
            }
        } else {
            let r = q / p;
            if p < 0.0 {
                t0 = t0.max(r);
            } else {
                t1 = t1.min(r);
            }
            if t0 > t1 {
                return false;
            }
        }
    }
    true
}

/// Labelled markers. The positions tried, nearest first: right-above,
/// left-above, right-below, left-below, a little further below or above,
/// level on either side; then, farther, higher above, and right of the
/// point higher above. A position must stay
/// inside the plot (or the chart's margin right of it), off the vertical
/// guide at page x `guide_x` and the horizontal one at page y `guide_y`,
/// and clear of the `curves` (data points), the labels `avoid` and the
/// labels placed before it. The near positions on one line, then on two
/// lines, then the far ones; then all again allowing 3 mm above the plot
/// and across the vertical guide (better than across the curve). Failing
/// that, across the curve: the first of the four nearest inside the plot,
/// then right-above while it stays in the chart's box, then the first
/// position on two lines inside the plot or 3 mm above it. No label is put
/// on another: a label with no room, or that leaves the chart's box, is a
/// layout fault.
#[allow(clippy::too_many_arguments)]
pub fn marks(
    c: &mut Canvas,
    plot: &Plot,
    marks: &[Mark],
    guide_x: Option<f64>,
    guide_y: Option<f64>,
    curves: &[&[(f64, f64)]],
    avoid: &[LabelBox],
) {
    let (left, bottom, top) = (plot.left, plot.bottom, plot.top);
    // Labels may use the margin right of the plot, inside the chart's box.
    let right_edge = plot.x + plot.w - 0.5;
    let curves: Vec<Vec<(f64, f64)>> = curves
        .iter()
        .map(|pts| pts.iter().map(|&p| plot.at(p)).collect())
        .collect();
    let mut placed: Vec<LabelBox> = avoid.to_vec();
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
            let overlaps = |o: &LabelBox| r.0 < o.2 && o.0 < r.2 && r.1 < o.3 && o.1 < r.3;
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
            b.0 >= plot.x - 0.5
                && b.2 <= plot.x + plot.w + 0.5
                && b.1 >= plot.y
                && b.3 <= plot.y + plot.h
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

/// Draws `chart` in the box `(x, y, w, h)` (mm, bottom-left corner).
pub fn draw(c: &mut Canvas, name: &str, x: f64, y: f64, w: f64, h: f64, chart: &Chart) {
    let plot = Plot::new(x, y, w, h, chart.x_max, chart.y_max);
    frame(
        c,
        name,
        &plot,
        &Axes {
            title: chart.title,
            x_label: chart.x_label,
            y_label: chart.y_label,
            x_max: chart.x_max,
            y_max: chart.y_max,
            x_tick: chart.x_tick,
            y_tick: chart.y_tick,
            x_step: None,
            y_step: None,
        },
    );
    let mut avoid: Vec<LabelBox> = chart
        .guide
        .iter()
        .map(|(gx, label)| vertical_guide(c, &plot, *gx, label))
        .collect();
    // The axis label above the plot: a mark near the top may rise into
    // the room beside it, not over it. Its glyphs reach 0.6 mm below its
    // baseline (3 mm above the plot); a label's box reaches 0.85 mm above
    // its glyphs, so the box avoided starts that much higher.
    let y_label_w = c.width(chart.y_label, Face::Regular, 7.0);
    let base = plot.top + 3.0;
    avoid.push((
        plot.x - 0.4,
        base - 0.6 + 0.85,
        plot.x + y_label_w + 0.4,
        base + 2.6,
    ));
    curve(c, &plot, chart.curve, 1.3, curve_colour(), None);
    let guide_x = chart.guide.as_ref().map(|(g, _)| plot.sx(*g));
    marks(c, &plot, chart.marks, guide_x, None, &[chart.curve], &avoid);
}

/// A tick label with as many decimals as the step needs; `scale` turns a
/// fraction into percent (100) or leaves it (1), `suffix` follows.
pub fn tick_label(v: f64, step: f64, scale: f64, suffix: &str) -> String {
    if v == 0.0 {
        return "0".to_string();
    }
    let decimals = (-(step * scale).log10().floor()).max(0.0) as usize;
    format!("{:.*}{suffix}", decimals, v * scale)
}

/// One entry of a chart's legend: a sample of its line, or a block of its
/// colour for a shaded zone, and the label.
pub struct LegendEntry {
    pub label: String,
    pub color: Color,
    pub thickness: f64,
    pub dash: Option<f32>,
    /// A filled block instead of a line sample.
    pub block: bool,
}

/// Size of a legend's labels, and its line pitch (mm).
const LEGEND_SIZE: f64 = 6.5;
const LEGEND_PITCH: f64 = 3.3;

/// A legend in a white box at the first corner of the plot, of top right,
/// bottom left and middle right, that none of the `curves` (data points)
/// crosses; a fault when none is clear. Returns the box, for the marks'
/// labels to avoid.
pub fn legend(
    c: &mut Canvas,
    plot: &Plot,
    name: &str,
    entries: &[LegendEntry],
    curves: &[&[(f64, f64)]],
) -> LabelBox {
    let sample = 6.0;
    let label_w = entries
        .iter()
        .map(|e| c.width(&e.label, Face::Regular, LEGEND_SIZE))
        .fold(0.0, f64::max);
    let w = 1.2 + sample + 1.5 + label_w + 1.2;
    let h = 1.0 + LEGEND_PITCH * entries.len() as f64 + 0.4;
    let pages: Vec<Vec<(f64, f64)>> = curves
        .iter()
        .map(|pts| pts.iter().map(|&p| plot.at(p)).collect())
        .collect();
    let clear = |(x0, y0): (f64, f64)| {
        let r = (x0, y0, x0 + w, y0 + h);
        !pages
            .iter()
            .any(|pts| pts.windows(2).any(|s| segment_hits(s[0], s[1], r)))
    };
    let corners = [
        (plot.right - w - 1.0, plot.top - h - 1.0),
        (plot.left + 1.0, plot.bottom + 1.0),
        (
            plot.right - w - 1.0,
            0.5 * (plot.top + plot.bottom) - h / 2.0,
        ),
    ];
    let at = corners.iter().copied().find(|&p| clear(p));
    if at.is_none() || w > plot.right - plot.left - 2.0 {
        c.fault(format!(
            "{name}: the legend has no room clear of the curves"
        ));
    }
    let (x0, y0) = at.unwrap_or(corners[0]);
    c.rect_fill(Rect::new(x0, y0, w, h), grey(1.0));
    c.rect_stroke(Rect::new(x0, y0, w, h), 0.3, grey(0.6));
    for (i, e) in entries.iter().enumerate() {
        let base = y0 + h - 0.9 - LEGEND_PITCH * (i as f64 + 1.0) + 0.9;
        let mid = base + 0.8;
        let sx = x0 + 1.2;
        if e.block {
            c.rect_fill(Rect::new(sx, mid - 1.1, sample, 2.2), e.color);
        } else {
            c.line(
                &[(sx, mid), (sx + sample, mid)],
                e.thickness,
                e.color,
                e.dash,
            );
        }
        c.text(
            sx + sample + 1.5,
            base,
            &e.label,
            Face::Regular,
            LEGEND_SIZE,
            grey(0.1),
        );
    }
    (x0, y0, x0 + w, y0 + h)
}
