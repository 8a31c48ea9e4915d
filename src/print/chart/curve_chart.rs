//! A chart of one curve against quality, with labelled points and an
//! optional vertical guide: the OC and AOQ charts of an attributes plan.

use super::axes::{Axes, frame};
use super::guides::vertical_guide;
use super::marks::{Keep, Mark, marks};
use super::plot::Plot;
use crate::print::canvas::Canvas;
use crate::print::draw::Face;
use crate::print::geometry::{Corners, Rect};
use crate::print::palette::PLAN;

/// What to draw.
pub struct Chart<'a> {
    /// The frame: title, axis labels, ranges and tick formats.
    pub axes: Axes<'a>,
    /// The curve, in data units.
    pub curve: &'a [(f64, f64)],
    /// The labelled points.
    pub marks: &'a [Mark],
    /// A vertical dashed guide with its label (e.g. the indifference quality).
    pub guide: Option<(f64, String)>,
}

/// Draws `chart` in the box `area`, claimed as `name`.
pub fn draw(c: &mut Canvas, name: &str, area: Rect, chart: &Chart) {
    let plot = Plot::new(area, chart.axes.x_max, chart.axes.y_max);
    frame(c, name, &plot, &chart.axes);
    let mut avoid: Vec<Corners> = chart
        .guide
        .iter()
        .map(|(gx, label)| vertical_guide(c, &plot, *gx, label))
        .collect();
    // The axis label above the plot: a mark near the top may rise into
    // the room beside it, not over it. Its glyphs reach 0.6 mm below its
    // baseline (3 mm above the plot); a label's box reaches 0.85 mm above
    // its glyphs, so the box avoided starts that much higher.
    let y_label_w = c.width(chart.axes.y_label, Face::Regular, 7.0);
    let base = plot.top + 3.0;
    avoid.push((
        plot.area.x - 0.4,
        base - 0.6 + 0.85,
        plot.area.x + y_label_w + 0.4,
        base + 2.6,
    ));
    plot.curve(c, chart.curve, 1.3, PLAN, None);
    let guide_x = chart.guide.as_ref().map(|(g, _)| plot.sx(*g));
    let keep = Keep {
        guide_x,
        guide_y: None,
        curves: &[chart.curve],
        labels: &avoid,
    };
    marks(c, &plot, chart.marks, &keep);
}
