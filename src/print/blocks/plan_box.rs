//! The plan box: a tinted box with a blue rule that holds the plan's
//! numbers on the left and the inspector's procedure on the right. This
//! file draws the frame and the boxes of a single plan and of a variables
//! plan; a staged plan's box holds a table (`table_box.rs`).

use super::procedure::{PROCEDURE_SIZES, procedure_column, steps_height};
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey, rgb};
use crate::print::facts::{Facts, VariablesFacts};
use crate::print::geometry::Rect;
use crate::print::palette::{ACCEPT, PLAN, REJECT};
use crate::print::text::Shrink;
use crate::print::wording::{sheet, variables};
use crate::report::words;

/// The plan box's frame `r`: a tinted box with a blue rule.
pub fn plan_frame(c: &mut Canvas, r: Rect) {
    c.claim("plan", r);
    c.rect_fill(r, rgb(0.93, 0.95, 0.98));
    c.rect_stroke(r, 1.2, PLAN);
}

/// The width of the single plan box's left column (sample size and
/// decisions).
pub const SINGLE_PLAN_COL: f64 = 76.0;

/// The single plan's box: the sample size and the two decisions on the
/// left, the procedure on the right; `n` units, accepted with at most
/// `ac` found.
pub fn single_plan_box(c: &mut Canvas, f: &Facts, plan: Rect, (n, ac): (u64, u64)) {
    let (left, top) = (plan.x, plan.top());
    plan_frame(c, plan);
    let col = SINGLE_PLAN_COL;
    c.heading(left + 4.0, top - 7.0, sheet::SAMPLE_SIZE);
    c.text(
        left + 4.0,
        top - 19.0,
        &format!("n = {n}"),
        Face::Bold,
        24.0,
        grey(0.0),
    );
    let what = words::counted(f.common.per_unit);
    let decisions = [
        (format!("Accept if ≤ {ac} {what}"), top - 27.0, ACCEPT),
        (format!("Reject if ≥ {} {what}", ac + 1), top - 32.5, REJECT),
    ];
    for (line, y, color) in decisions {
        if c.width(&line, Face::Bold, 9.5) > col - 6.0 {
            c.overflow(format!("plan box: '{line}'"));
        }
        c.text(left + 4.0, y, &line, Face::Bold, 9.5, color);
    }
    procedure_column(c, &f.steps(), plan, col, 8.0);
}

/// Widths: the variables plan box's left column.
const PLAN_COL: f64 = 60.0;

/// The variables plan box's height when the procedure is short.
const PLAN_MIN_H: f64 = 40.0;

/// The variables plan's box, hanging from the top edge `at`: heading, n
/// and the constant large, sigma, the limits and the attributes plan on
/// the left; the procedure on the right. Returns the box height.
pub fn variables_plan_box(c: &mut Canvas, f: &VariablesFacts, at: Rect) -> f64 {
    let (left, top, width) = (at.x, at.top(), at.w);
    let spec = f.plan.spec();
    let steps = variables::procedure(&f.plan, f.unit, f.on_log());
    let proc_w = width - PLAN_COL - 8.0;
    // The largest procedure size that keeps the box low, else the
    // smallest.
    let size = PROCEDURE_SIZES
        .iter()
        .copied()
        .find(|&s| steps_height(c, &steps, proc_w, s) <= PLAN_MIN_H + 2.0)
        .unwrap_or(PROCEDURE_SIZES[PROCEDURE_SIZES.len() - 1]);
    let small = [
        variables::sigma_line(spec, f.unit),
        variables::limits_line(spec, f.unit),
        variables::comparison(f.attributes.as_ref(), f.plan.n()),
    ];
    let col_w = PLAN_COL - 6.0;
    let small_h: f64 = small
        .iter()
        .map(|t| {
            c.fit(t, Face::Regular, col_w, f64::INFINITY, Shrink::fixed(7.0))
                .height
                + 0.6
        })
        .sum();
    let n_line = format!("n = {}", f.plan.n());
    let constant = variables::constant(&f.plan);
    let n_w = c.width(&n_line, Face::Bold, 18.0);
    let k_w = c.width(&constant, Face::Bold, 14.0);
    // n and the constant on one line when they fit, else one under the
    // other; then the small lines.
    let one_line = n_w + 6.0 + k_w <= col_w;
    let small_top = if one_line { 17.5 } else { 23.0 };
    let left_need = small_top + small_h + 1.5;
    let plan_h = left_need
        .max(steps_height(c, &steps, proc_w, size))
        .max(PLAN_MIN_H);
    let plan = Rect::from_top(left, top, width, plan_h);
    plan_frame(c, plan);
    let x = left + 4.0;
    c.heading(x, top - 7.0, variables::plan_heading(spec));
    let blue = PLAN;
    if one_line {
        c.text(x, top - 14.0, &n_line, Face::Bold, 18.0, blue);
        c.text(x + n_w + 6.0, top - 14.0, &constant, Face::Bold, 14.0, blue);
    } else {
        for (line, y, size) in [(&n_line, top - 14.0, 18.0), (&constant, top - 20.5, 14.0)] {
            if c.width(line, Face::Bold, size) > col_w {
                c.overflow(format!("plan box: '{line}'"));
            }
            c.text(x, y, line, Face::Bold, size, blue);
        }
    }
    let mut y = top - small_top;
    for t in &small {
        let used = c.paragraph(
            "plan box",
            Rect::from_top(x, y, col_w, y - (top - plan_h + 1.5)),
            t,
            Face::Regular,
            Shrink::new(7.0, 6.0),
        );
        y -= used + 0.6;
    }
    procedure_column(c, &steps, plan, PLAN_COL, size);
    plan_h
}
