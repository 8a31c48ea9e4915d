//! A panel's colour bar: the ramp's steps on the panel's log scale, a
//! dark line at each contour level, and the labels beside it.

use super::contour::Path;
use super::field::{LogScale, MapQuantity, value_label};
use super::ramp;
use super::style::{AXIS, BAR_W, DIGIT_HEIGHT, SEAM, TICK, TICK_LEN, contour_strokes};
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey};
use crate::print::geometry::{MM_PER_PT, Rect};
use crate::print::wording::map as text;

/// A colour bar label: position (page y), text, face and size.
pub type BarLabel = (f64, String, Face, f64);

/// The colour bar's labels: each contour level, and the smallest and
/// largest value (lighter, where they keep clear of the levels' labels);
/// one label in the middle when every cell has the same value.
pub fn bar_labels(
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

/// The colour bar of `quantity` in `bar`: the ramp's steps on the
/// panel's log `scale`, a dark line at each of the contour `levels` (as
/// the contours are drawn) and the `labels` beside it; its title above.
pub fn colour_bar(
    c: &mut Canvas,
    (quantity, scale): (MapQuantity, Option<LogScale>),
    (levels, labels): (&[f64], &[BarLabel]),
    bar: Rect,
) {
    let (bx, bottom, top) = (bar.x, bar.y, bar.top());
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
    let span = bar.h;
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
