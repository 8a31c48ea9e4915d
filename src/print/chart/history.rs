//! The charts of a ledger's history: the p-chart (or u-chart) of each
//! lot's first sample with its three-sigma limits as steps, the AQL line,
//! the severity as bands behind the points and rejected lots marked; and
//! the running process average with its 95% interval.

use super::axes::{Axes, frame};
use super::plot::Plot;
use super::scale::{nice_ceiling, quality_tick};
use crate::ledger::History;
use crate::print::canvas::Canvas;
use crate::print::draw::{Colour, grey, rgb};
use crate::print::geometry::{Point, Rect};
use crate::print::palette::{ACCEPT, PLAN, REJECT};

/// The band behind a lot on tightened inspection.
pub const TIGHTENED_BAND: Colour = rgb(0.98, 0.86, 0.80);

/// The band behind a lot on reduced inspection.
pub const REDUCED_BAND: Colour = rgb(0.84, 0.94, 0.84);

/// The colour of the control limits and centre line.
const LIMITS: Colour = grey(0.35);

/// Lot numbers across: ticks at whole lots, none at 0.
fn lot_tick(v: f64, _step: f64) -> String {
    if v < 0.5 {
        String::new()
    } else {
        format!("{v:.0}")
    }
}

/// The top of the y axis: above every value shown, with room.
fn y_top(values: impl Iterator<Item = f64>) -> f64 {
    let top = values.filter(|v| v.is_finite()).fold(0.0, f64::max);
    if top > 0.0 {
        nice_ceiling(top * 1.1)
    } else {
        0.01
    }
}

/// Step lines through `(lot, value)`: one flat step per lot, from half a
/// lot before to half a lot after, broken where a lot has no value.
fn steps(values: impl Iterator<Item = (f64, Option<f64>)>) -> Vec<Vec<Point>> {
    let mut paths: Vec<Vec<Point>> = Vec::new();
    let mut open = false;
    for (x, v) in values {
        match v {
            Some(v) => {
                if !open {
                    paths.push(Vec::new());
                    open = true;
                }
                if let Some(path) = paths.last_mut() {
                    path.push((x - 0.5, v));
                    path.push((x + 0.5, v));
                }
            }
            None => open = false,
        }
    }
    paths
}

/// The control chart of `history` in `area`: bands, limits, centre, AQL,
/// points, rejected lots in red with a ring.
pub fn control_chart(c: &mut Canvas, history: &History, area: Rect) {
    let per_unit = history.per_unit();
    let lots = history.lots.len().max(1) as f64;
    let y_max = y_top(
        history
            .lots
            .iter()
            .flat_map(|l| [l.fraction, l.upper_limit])
            .flatten()
            .chain(history.aql),
    );
    let plot = Plot::new(area, lots + 0.5, y_max);
    let title = match &history.class {
        Some(class) => format!("{}-chart of first samples, class {class}", history.chart),
        None => format!("{}-chart of first samples", history.chart),
    };
    let y_label = if per_unit {
        "Nonconformities per unit"
    } else {
        "Fraction nonconforming"
    };
    let tick = quality_tick(per_unit);
    // Bands first, behind everything.
    for (i, l) in history.lots.iter().enumerate() {
        let band = match l.severity {
            Some("tightened") => TIGHTENED_BAND,
            Some("reduced") => REDUCED_BAND,
            _ => continue,
        };
        let x = i as f64 + 1.0;
        let (x0, x1) = (plot.sx(x - 0.5), plot.sx(x + 0.5));
        c.rect_fill(
            Rect::new(x0, plot.bottom, x1 - x0, plot.top - plot.bottom),
            band,
        );
    }
    frame(
        c,
        "control chart",
        &plot,
        &Axes {
            title: &title,
            x_label: "Lot (ledger seq)",
            y_label,
            x_max: lots + 0.5,
            y_max,
            x_tick: &lot_tick,
            y_tick: &tick,
            x_step: None,
            y_step: None,
        },
    );
    let at = |i: usize| i as f64 + 1.0;
    for limit in [
        steps(
            history
                .lots
                .iter()
                .enumerate()
                .map(|(i, l)| (at(i), l.upper_limit)),
        ),
        steps(
            history
                .lots
                .iter()
                .enumerate()
                .map(|(i, l)| (at(i), l.lower_limit)),
        ),
    ] {
        for path in limit {
            plot.curve(c, &path, 0.6, LIMITS, Some(2.0));
        }
    }
    if let Some(centre) = history.centre {
        plot.curve(c, &[(0.5, centre), (lots + 0.5, centre)], 0.6, LIMITS, None);
    }
    if let Some(aql) = history.aql.filter(|a| *a <= y_max) {
        plot.curve(c, &[(0.5, aql), (lots + 0.5, aql)], 0.8, ACCEPT, Some(4.0));
        c.text(
            plot.right - 10.0,
            plot.sy(aql) + 0.8,
            "AQL",
            crate::print::draw::Face::Regular,
            6.0,
            ACCEPT,
        );
    }
    let points: Vec<Point> = history
        .lots
        .iter()
        .enumerate()
        .filter_map(|(i, l)| l.fraction.map(|f| (at(i), f)))
        .collect();
    if points.len() > 1 {
        plot.curve(c, &points, 0.4, PLAN, None);
    }
    for (i, l) in history.lots.iter().enumerate() {
        let Some(f) = l.fraction else { continue };
        let (x, y) = plot.at((at(i), f));
        if l.rejected() {
            c.marker(x, y, 1.6, REJECT);
            c.marker(x, y, 1.0, grey(1.0));
            c.marker(x, y, 0.6, REJECT);
        } else {
            c.marker(x, y, 0.8, PLAN);
        }
    }
}

/// The running process average of `history` with its 95% interval as a
/// shaded band, and the AQL line, in `area`.
pub fn running_chart(c: &mut Canvas, history: &History, area: Rect) {
    let per_unit = history.per_unit();
    let lots = history.lots.len().max(1) as f64;
    let runs: Vec<(f64, crate::model::Interval)> = history
        .lots
        .iter()
        .enumerate()
        .filter_map(|(i, l)| l.running.map(|r| (i as f64 + 1.0, r)))
        .collect();
    let y_max = y_top(runs.iter().map(|(_, r)| r.upper).chain(history.aql));
    let plot = Plot::new(area, lots + 0.5, y_max);
    let tick = quality_tick(per_unit);
    frame(
        c,
        "running average",
        &plot,
        &Axes {
            title: "Running process average with its 95% interval",
            x_label: "Lot (ledger seq)",
            y_label: "Process average",
            x_max: lots + 0.5,
            y_max,
            x_tick: &lot_tick,
            y_tick: &tick,
            x_step: None,
            y_step: None,
        },
    );
    if runs.len() > 1 {
        let mut band: Vec<Point> = runs.iter().map(|(x, r)| (*x, r.upper)).collect();
        band.extend(runs.iter().rev().map(|(x, r)| (*x, r.lower)));
        plot.zone(c, &band, rgb(0.80, 0.86, 0.95));
    }
    let line: Vec<Point> = runs.iter().map(|(x, r)| (*x, r.estimate)).collect();
    plot.curve(c, &line, 0.9, PLAN, None);
    if let Some(aql) = history.aql.filter(|a| *a <= y_max) {
        plot.curve(c, &[(0.5, aql), (lots + 0.5, aql)], 0.8, ACCEPT, Some(4.0));
    }
}
