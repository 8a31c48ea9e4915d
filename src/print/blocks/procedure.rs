//! The inspector's procedure: numbered steps under their heading, in the
//! right-hand column of a plan box, beside the plan's numbers.

use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey};
use crate::print::geometry::Rect;
use crate::print::text::Shrink;
use crate::print::wording::sheet;

/// Sizes of the procedure text, largest first, that a plan box tries.
pub const PROCEDURE_SIZES: [f64; 3] = [8.0, 7.5, 7.0];

/// Numbered steps under the procedure heading at the top of `area`, one
/// paragraph per step, each in what the earlier steps left above the
/// bottom of `area`; `size` points, shrinking to 7 where a step needs it.
pub fn steps_block(c: &mut Canvas, steps: &[String], area: Rect, size: f64) {
    headed_steps(c, sheet::PROCEDURE, steps, area, size);
}

/// [`steps_block`] under the heading `heading`.
pub fn headed_steps(c: &mut Canvas, heading: &str, steps: &[String], area: Rect, size: f64) {
    let (x, top, w, bottom) = (area.x, area.top(), area.w, area.y);
    c.heading(x, top - 7.0, heading);
    let mut step_top = top - 9.0;
    for step in steps {
        let used = c.paragraph(
            "procedure",
            Rect::from_top(x, step_top, w, step_top - bottom),
            step,
            Face::Regular,
            Shrink::new(size, 7.0),
        );
        step_top -= used + 0.8;
    }
}

/// Height of [`steps_block`] in a column `w` mm wide at `size`, heading
/// and bottom padding included.
pub fn steps_height(c: &Canvas, steps: &[String], w: f64, size: f64) -> f64 {
    let text: f64 = steps
        .iter()
        .map(|s| {
            c.fit(s, Face::Regular, w, f64::INFINITY, Shrink::fixed(size))
                .height
        })
        .sum();
    11.0 + text + 0.8 * (steps.len() as f64 - 1.0)
}

/// The procedure in the plan box `plan`, right of its left column of
/// `col` mm, with the rule between the two columns.
pub fn procedure_column(c: &mut Canvas, steps: &[String], plan: Rect, col: f64, size: f64) {
    let (left, top, width, plan_h) = (plan.x, plan.top(), plan.w, plan.h);
    let bottom = top - plan_h + 2.0;
    let x = left + col + 4.0;
    steps_block(
        c,
        steps,
        Rect::new(x, bottom, width - col - 8.0, top - bottom),
        size,
    );
    c.line(
        &[(left + col, top - 3.0), (left + col, top - plan_h + 3.0)],
        0.4,
        grey(0.6),
        None,
    );
}
