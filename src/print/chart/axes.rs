//! A chart's frame: its title, gridlines, tick labels, axes and axis
//! labels, with a fault for a label wider than the chart.

use super::plot::Plot;
use super::scale::{next_step, nice_step};
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey};
use crate::print::geometry::Rect;

/// The axes of a chart: title, labels, ranges and tick formats.
pub struct Axes<'a> {
    /// The title above the plot.
    pub title: &'a str,
    /// The label under the quality (x) axis.
    pub x_label: &'a str,
    /// The label above the y axis.
    pub y_label: &'a str,
    /// The end of the x axis (data units).
    pub x_max: f64,
    /// The end of the y axis (data units).
    pub y_max: f64,
    /// Format a tick value on each axis, given the tick step.
    pub x_tick: &'a dyn Fn(f64, f64) -> String,
    /// Format a y tick value, given the tick step.
    pub y_tick: &'a dyn Fn(f64, f64) -> String,
    /// The tick steps; `None` takes [`nice_step`] of the range.
    pub x_step: Option<f64>,
    /// The y tick step; `None` takes [`nice_step`] of the range.
    pub y_step: Option<f64>,
}

/// Claims the chart's box as `name` and draws the title, gridlines, tick
/// labels, axes and axis labels of `axes` on `plot`.
pub fn frame(c: &mut Canvas, name: &str, plot: &Plot, axes: &Axes) {
    let Rect { x, y, w, h } = plot.area;
    c.claim(name, plot.area);
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
