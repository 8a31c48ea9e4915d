//! The decision chart of an item-by-item plan: units inspected across,
//! running count up; the accept, continue and reject zones shaded and
//! bounded by the stepped acceptance and rejection numbers; the two lines
//! of the sequential test dashed; the truncation marked.

use super::axes::{Axes, frame};
use super::plot::Plot;
use super::scale::{nice_step, plain_tick};
use crate::plan::SequentialLines;
use crate::print::canvas::Canvas;
use crate::print::draw::{Colour, Face, grey, rgb};
use crate::print::geometry::{MM_PER_PT, Rect};
use crate::print::palette::{ACCEPT, REJECT};
use crate::print::wording::sheet;

/// The decision chart of an item-by-item plan: units inspected across,
/// running count up; the accept, continue and reject zones shaded and
/// bounded by the stepped acceptance and rejection numbers; the two lines
/// dashed; the truncation marked.
///
/// A number applies after `n` units, so each run of units `first..=last`
/// is drawn from `first - 1` to `last`.
pub fn decision_chart(c: &mut Canvas, lines: &SequentialLines, per_unit: bool, area: Rect) {
    let Rect { x, y, h, .. } = area;
    let runs = lines.runs();
    let t = lines.truncation as f64;
    let top_reject = runs.iter().map(|r| r.reject).max().unwrap_or(1);
    let y_max = (top_reject + 1) as f64;
    let plot = Plot::new(area, t, y_max);
    // The stepped numbers as page polylines in data units.
    let mut reject_steps = Vec::new();
    let mut accept_steps = Vec::new();
    for r in &runs {
        let (a, b) = ((r.first - 1) as f64, r.last as f64);
        reject_steps.push((a, r.reject as f64));
        reject_steps.push((b, r.reject as f64));
        if let Some(acc) = r.accept {
            accept_steps.push((a, acc as f64));
            accept_steps.push((b, acc as f64));
        }
    }
    // Zones first, so that the gridlines stay visible over them.
    plot.zone(
        c,
        &[(0.0, 0.0), (t, 0.0), (t, y_max), (0.0, y_max)],
        rgb(1.0, 0.97, 0.86),
    );
    let mut reject_zone = reject_steps.clone();
    reject_zone.extend([(t, y_max), (0.0, y_max)]);
    plot.zone(c, &reject_zone, rgb(0.98, 0.86, 0.84));
    if let (Some(&(a0, _)), Some(&(b1, _))) = (accept_steps.first(), accept_steps.last()) {
        let mut accept_zone = vec![(a0, 0.0)];
        accept_zone.extend(accept_steps.iter().copied());
        accept_zone.push((b1, 0.0));
        plot.zone(c, &accept_zone, rgb(0.84, 0.94, 0.85));
    }
    let y_label = sheet::decision_y(per_unit);
    frame(
        c,
        "decision chart",
        &plot,
        &Axes {
            title: sheet::DECISION_TITLE,
            x_label: sheet::DECISION_X,
            y_label: &y_label,
            x_max: t,
            y_max,
            x_tick: &plain_tick,
            y_tick: &plain_tick,
            x_step: None,
            y_step: Some(if y_max <= 12.0 { 1.0 } else { nice_step(y_max) }),
        },
    );
    // The lines, where they lie inside the chart.
    let line_at = |n: f64, intercept: f64| lines.slope * n + intercept;
    let dash = Some(1.5);
    plot.curve(
        c,
        &[
            (0.0, line_at(0.0, lines.h_reject)),
            (t, line_at(t, lines.h_reject)),
        ],
        0.6,
        grey(0.25),
        dash,
    );
    let n0 = lines.h_accept / lines.slope;
    if n0 < t {
        plot.curve(
            c,
            &[(n0, 0.0), (t, line_at(t, -lines.h_accept))],
            0.6,
            grey(0.25),
            dash,
        );
    }
    plot.curve(c, &reject_steps, 1.2, REJECT, None);
    if !accept_steps.is_empty() {
        plot.curve(c, &accept_steps, 1.2, ACCEPT, None);
    }
    // The truncation: the last unit decides every count.
    let tx = plot.sx(t);
    let fa = plot.sy(lines.final_acceptance as f64);
    c.line(&[(tx, plot.bottom), (tx, fa)], 2.0, ACCEPT, None);
    c.line(
        &[
            (tx, plot.sy((lines.final_acceptance + 1) as f64)),
            (tx, plot.top),
        ],
        2.0,
        REJECT,
        None,
    );
    // Zone labels, each where it fits inside its zone. The numbers never
    // fall as n grows (before the truncation item), so over a span of
    // units the zone between them is narrowest at its ends: one test per
    // position. A label without room is left out; the colours say the same.
    let size = 6.5;
    let label_h = size * MM_PER_PT * 0.75;
    let pad = 0.8;
    let per_unit_mm = (plot.right - plot.left) / t;
    // The unit whose step the page x `px` lies on (units n - 1 to n).
    let unit_at = |px: f64| {
        (((px - plot.left) / per_unit_mm).floor() as u64 + 1)
            .min(lines.truncation - 1)
            .max(1)
    };
    let accept_at = |n: u64| lines.acceptance_number(n).map_or(0.0, |a| a as f64);
    let reject_at = |n: u64| lines.rejection_number(n) as f64;
    let last_open = (t - 1.0).max(0.0);
    let zone_label = |c: &mut Canvas, lx: f64, ly: f64, label: &str, color: Colour| {
        c.text(lx, ly, label, Face::Bold, size, color);
    };
    // Reject: top left, above the rejection numbers.
    let rw = c.width(sheet::REJECT_ZONE, Face::Bold, size);
    let (rx, ry) = (plot.left + 1.5, plot.top - 1.0 - label_h);
    if plot.sy(reject_at(unit_at(rx + rw))) + pad <= ry - 0.3 {
        zone_label(c, rx, ry, sheet::REJECT_ZONE, REJECT);
    }
    // Accept: bottom right, below the acceptance numbers, clear of the
    // truncation item.
    let aw = c.width(sheet::ACCEPT_ZONE, Face::Bold, size);
    let (ax, ay) = (plot.sx(last_open) - 1.5 - aw, plot.bottom + 1.0);
    if ax > plot.left && plot.sy(accept_at(unit_at(ax))) >= ay + label_h + pad {
        zone_label(c, ax, ay, sheet::ACCEPT_ZONE, ACCEPT);
    }
    // Go on: where the open counts leave the most room, away from the
    // other two labels.
    let cw = c.width(sheet::CONTINUE_ZONE, Face::Bold, size);
    let room = |lx: f64| {
        let (n0, n1) = (unit_at(lx), unit_at(lx + cw));
        (plot.sy(reject_at(n0)), plot.sy(accept_at(n1)))
    };
    let span = plot.sx(last_open) - plot.left - cw - 2.0;
    let best = (0..=40)
        .map(|i| plot.left + 1.0 + span * i as f64 / 40.0)
        // Left of the accept label, which sits at the bottom right.
        .filter(|&lx| lx + cw < ax - 1.0)
        .map(|lx| {
            let (top_y, bottom_y) = room(lx);
            (lx, top_y - bottom_y, 0.5 * (top_y + bottom_y))
        })
        .max_by(|p, q| p.1.total_cmp(&q.1));
    if let Some((lx, gap, mid_y)) = best
        && gap >= label_h + 2.0 * pad
    {
        zone_label(
            c,
            lx,
            mid_y - label_h / 2.0,
            sheet::CONTINUE_ZONE,
            rgb(0.45, 0.35, 0.05),
        );
    }
    // The truncation, on the title's line at the right, above its bar.
    let trunc = sheet::truncation(lines.truncation, lines.final_acceptance);
    let tw = c.width(&trunc, Face::Regular, size);
    c.text(
        tx - tw,
        y + h - 3.5,
        &trunc,
        Face::Regular,
        size,
        grey(0.15),
    );
    let title_w = c.width(sheet::DECISION_TITLE, Face::Bold, 8.0);
    if title_w + 2.0 + tw > tx - x {
        c.fault(format!("decision chart: '{trunc}' has no room"));
    }
}
