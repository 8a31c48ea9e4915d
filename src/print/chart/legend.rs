//! A chart's legend: a sample of each line, or a block of each zone's
//! colour, with its label, in a white box at a corner no curve crosses.

use super::plot::Plot;
use crate::print::canvas::Canvas;
use crate::print::draw::{Colour, Face, grey};
use crate::print::geometry::{Corners, Rect, segment_hits};

/// One entry of a chart's legend: a sample of its line, or a block of its
/// colour for a shaded zone, and the label.
pub struct LegendEntry {
    /// What the entry stands for.
    pub label: String,
    /// The line's or the zone's colour.
    pub color: Colour,
    /// The line's width, points.
    pub thickness: f64,
    /// The line's dash, points.
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
) -> Corners {
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
