//! The lot record of a standard-indexed plan's sheet: the blanks an
//! inspector fills in for each lot: the lot number, the severity it was
//! inspected on, each class's count (a box per stage for a double or
//! multiple plan), the decision, who inspected it and when.

use super::fields::{decision_row, field};
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey};
use crate::print::geometry::Rect;
use crate::print::standard_facts::{StandardClassFacts, StandardFacts};
use crate::print::wording::{sheet, standard as words, variables};

/// The row pitch and the heading's room, mm.
const PITCH: f64 = 5.4;
const HEAD_H: f64 = 5.0;

/// The size of the labels, points; the width of a count box, mm.
const SIZE: f64 = 7.5;
const BOX_W: f64 = 7.0;

/// The boxes a class's count needs: one per stage of its longest plan.
fn boxes(f: &StandardFacts, cl: &StandardClassFacts) -> usize {
    f.severities()
        .into_iter()
        .filter_map(|s| cl.at(s))
        .filter_map(|p| p.plan())
        .map(|p| p.stages.stages().len())
        .max()
        .unwrap_or(1)
}

/// The classes' count fields laid out in lines `w` mm wide: each line
/// holds `(x offset, class)` items.
fn count_lines(c: &Canvas, f: &StandardFacts, w: f64) -> Vec<Vec<(f64, usize)>> {
    let indent = indent(c);
    let mut lines: Vec<Vec<(f64, usize)>> = vec![Vec::new()];
    let mut x = indent;
    for (k, cl) in f.classes.iter().enumerate() {
        let item = item_width(c, f, cl);
        if x > indent && x + item > w {
            lines.push(Vec::new());
            x = indent;
        }
        if let Some(line) = lines.last_mut() {
            line.push((x, k));
        }
        x += item + 4.0;
    }
    lines
}

/// Where the count fields start: after the label of the first line.
fn indent(c: &Canvas) -> f64 {
    c.width(words::FOUND, Face::Regular, SIZE) + 2.0
}

/// The width of a class's count field: its name and its boxes.
fn item_width(c: &Canvas, f: &StandardFacts, cl: &StandardClassFacts) -> f64 {
    let n = boxes(f, cl) as f64;
    c.width(&cl.name, Face::Regular, SIZE) + 1.5 + n * BOX_W + (n - 1.0) * 1.0
}

/// The record's height `w` mm wide.
pub fn class_record_height(c: &Canvas, f: &StandardFacts, w: f64) -> f64 {
    let counts = count_lines(c, f, w - 4.0).len();
    HEAD_H + PITCH * (4 + counts) as f64 + 0.5
}

/// The lot record in `area`: the lot number and the date; the severity
/// the lot was inspected on; each class's count; the decision; who
/// inspected it.
pub fn class_record(c: &mut Canvas, f: &StandardFacts, area: Rect) {
    let (x, top, w) = (area.x, area.top(), area.w);
    c.claim("record", area);
    c.rect_stroke(area, 0.5, grey(0.0));
    c.heading(x + 2.0, top - 3.8, sheet::RECORD);
    let (inner, end) = (x + 2.0, x + w - 2.0);
    let row_y = |i: usize| top - HEAD_H - PITCH * (i as f64 + 1.0) + 1.5;
    let split = inner + (end - inner) * 0.6;
    field(
        c,
        inner,
        split - 3.0,
        row_y(0),
        variables::LOT_NUMBER,
        false,
    );
    field(c, split, end, row_y(0), variables::INSPECTED_ON, false);
    let mut bx = inner;
    c.text(
        bx,
        row_y(1),
        words::INSPECTION,
        Face::Regular,
        SIZE,
        grey(0.1),
    );
    bx += c.width(words::INSPECTION, Face::Regular, SIZE) + 2.0;
    for s in f.severities() {
        c.rect_stroke(Rect::new(bx, row_y(1) - 0.8, 3.2, 3.2), 0.5, grey(0.2));
        c.text(bx + 4.2, row_y(1), s.name(), Face::Regular, SIZE, grey(0.1));
        bx += 4.2 + c.width(s.name(), Face::Regular, SIZE) + 3.0;
    }
    if bx - 3.0 > end {
        c.fault("lot record: the severity boxes leave no room".to_string());
    }
    let lines = count_lines(c, f, end - inner);
    c.text(
        inner,
        row_y(2),
        words::FOUND,
        Face::Regular,
        SIZE,
        grey(0.1),
    );
    for (i, line) in lines.iter().enumerate() {
        let y = row_y(2 + i);
        for &(at, k) in line {
            count_boxes(c, f, k, (inner + at, y), end);
        }
    }
    let after = 2 + lines.len();
    decision_row(c, inner, row_y(after));
    field(
        c,
        inner,
        end,
        row_y(after + 1),
        variables::INSPECTED_BY,
        false,
    );
}

/// The count field of class `k` from `(x, y)`: its name and a box per
/// stage, numbered when there are several; a fault past `end`.
fn count_boxes(c: &mut Canvas, f: &StandardFacts, k: usize, (x, y): (f64, f64), end: f64) {
    let cl = &f.classes[k];
    c.text(x, y, &cl.name, Face::Regular, SIZE, grey(0.1));
    let mut b = x + c.width(&cl.name, Face::Regular, SIZE) + 1.5;
    let n = boxes(f, cl);
    for stage in 0..n {
        c.rect_stroke(Rect::new(b, y - 1.2, BOX_W, 4.4), 0.5, grey(0.2));
        if n > 1 {
            let label = (stage + 1).to_string();
            c.text(b + 0.5, y + 1.5, &label, Face::Regular, 4.5, grey(0.45));
        }
        b += BOX_W + 1.0;
    }
    if b - 1.0 > end + 1e-6 {
        c.fault(format!(
            "lot record: the count boxes of {} leave no room",
            cl.name
        ));
    }
}
