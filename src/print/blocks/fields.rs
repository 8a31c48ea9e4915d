//! The blanks an inspector fills in: a labelled writing line, and the
//! decision with its two boxes to tick. The lot record and the variables
//! sheet's results share them.

use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey};
use crate::print::geometry::Rect;
use crate::print::palette::{ACCEPT, REJECT};
use crate::print::wording::variables;

/// A blank field: its label (formula markup) and `=` at `(x, y)`, then a
/// writing line to `x_end`.
pub fn field(c: &mut Canvas, x: f64, x_end: f64, y: f64, label: &str, equals: bool) {
    let size = 7.5;
    let label = if equals {
        format!("{label} =")
    } else {
        label.to_string()
    };
    c.formula(x, y, &label, Face::Regular, size, grey(0.1));
    let start = x + c.formula_width(&label, Face::Regular, size) + 1.0;
    if x_end - start < 10.0 {
        c.fault(format!("results: '{label}' leaves no room to write"));
    }
    c.line(&[(start, y - 0.8), (x_end, y - 0.8)], 0.4, grey(0.35), None);
}

/// The decision with its baseline at `(x, y)`: two boxes to tick, accept
/// and reject.
pub fn decision_row(c: &mut Canvas, x: f64, y: f64) {
    c.text(x, y, variables::DECISION, Face::Bold, 7.5, grey(0.1));
    let mut bx = x + c.width(variables::DECISION, Face::Bold, 7.5) + 4.0;
    for (label, color) in [
        (variables::ACCEPT_BOX, ACCEPT),
        (variables::REJECT_BOX, REJECT),
    ] {
        c.rect_stroke(Rect::new(bx, y - 0.8, 3.6, 3.6), 0.6, color);
        c.text(bx + 5.0, y, label, Face::Bold, 7.5, color);
        bx += 5.0 + c.width(label, Face::Bold, 7.5) + 6.0;
    }
}
