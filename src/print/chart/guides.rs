//! Dashed guides across a chart, each with its label: a vertical one at a
//! quality (the indifference quality on the OC chart), a horizontal one
//! at a level (the single plan's sample size on the ASN chart).

use super::plot::Plot;
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey};
use crate::print::geometry::Corners;

/// Baseline to baseline of a stacked label, mm.
pub const LABEL_LEAD: f64 = 2.64;

/// The box of a one-line label `lw` wide whose baseline starts at
/// `(lx, ly)`.
fn label_box(lx: f64, ly: f64, lw: f64) -> Corners {
    lines_box(lx, ly, lw, 1)
}

/// The box of a label of `lines` lines `lw` wide whose last baseline
/// starts at `(lx, ly)`, a little larger than its glyphs at 6.5 points.
pub fn lines_box(lx: f64, ly: f64, lw: f64, lines: usize) -> Corners {
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
pub fn vertical_guide(c: &mut Canvas, plot: &Plot, gx: f64, label: &str) -> Corners {
    let (left, bottom) = (plot.left, plot.bottom);
    let x = plot.sx(gx);
    c.line(&[(x, bottom), (x, plot.top)], 0.5, grey(0.45), Some(2.0));
    let lw = c.width(label, Face::Regular, 6.5);
    let right_edge = plot.area.right() - 0.5;
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
    if lx + lw > plot.area.right() {
        c.fault(format!("chart guide '{label}' leaves its chart"));
    }
    lines_box(lx, ly, lw, lines.len())
}

/// A horizontal dashed reference at data y `gy`, labelled above it at the
/// right end of the plot. Returns the label's box.
pub fn horizontal_guide(c: &mut Canvas, plot: &Plot, gy: f64, label: &str) -> Corners {
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
