//! The results of a variables sheet: the sums and statistics an inspector
//! works out and writes in, the decision, and who inspected the lot.

use super::fields::{decision_row, field};
use crate::plan::VariablesPlan;
use crate::print::canvas::Canvas;
use crate::print::geometry::Rect;
use crate::print::wording::variables;

/// Pitch of the result lines.
const RESULT_PITCH: f64 = 5.5;

/// The result lines of `plan`, hanging from the top edge `at`: the sums
/// and statistics to write in, the decision boxes, and who inspected the
/// lot and when. Returns the height.
pub fn results_block(c: &mut Canvas, plan: &VariablesPlan, at: Rect) -> f64 {
    let (x, top, w) = (at.x, at.top(), at.w);
    let rows = variables::result_rows(plan);
    let h = 5.5 + RESULT_PITCH * (rows.len() + 2) as f64;
    c.claim("results", Rect::from_top(x, top, w, h));
    c.heading(x, top - 3.5, variables::RESULTS_HEADING);
    let row_y = |i: usize| top - 5.5 - RESULT_PITCH * (i as f64 + 1.0) + 1.5;
    let gutter = 3.0;
    for (i, row) in rows.iter().enumerate() {
        let cell = (w - gutter * (row.len() as f64 - 1.0)) / row.len() as f64;
        for (j, label) in row.iter().enumerate() {
            let cx = x + (cell + gutter) * j as f64;
            field(c, cx, cx + cell, row_y(i), label, true);
        }
    }
    decision_row(c, x, row_y(rows.len()));
    let y = row_y(rows.len() + 1);
    let split = x + w * 0.62;
    field(c, x, split - gutter, y, variables::INSPECTED_BY, false);
    field(c, split, x + w, y, variables::INSPECTED_ON, false);
    h
}
