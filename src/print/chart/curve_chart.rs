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
    /// The title above the plot.
    pub title: &'a str,
    /// The label under the x axis.
    pub x_label: &'a str,
    /// The label above the y axis.
    pub y_label: &'a str,
    /// The end of the x axis.
    pub x_max: f64,
    /// The end of the y axis.
    pub y_max: f64,
    /// Format a tick value on each axis, given the tick step.
    pub x_tick: &'a dyn Fn(f64, f64) -> String,
    /// Format a y tick value.
    pub y_tick: &'a dyn Fn(f64, f64) -> String,
    /// The curve, in data units.
    pub curve: &'a [(f64, f64)],
    /// The labelled points.
    pub marks: &'a [Mark],
    /// A vertical dashed guide with its label (e.g. the indifference quality).
    pub guide: Option<(f64, String)>,
}

/// Draws `chart` in the box `area`, claimed as `name`.
pub fn draw(c: &mut Canvas, name: &str, area: Rect, chart: &Chart) {
    let plot = Plot::new(area, chart.x_max, chart.y_max);
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
    let mut avoid: Vec<Corners> = chart
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
