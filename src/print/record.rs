//! The lot record and the plan's approval on an attribute sheet, beside
//! the measures table: above, the blanks an inspector fills in for each
//! lot (the lot number, the count found, the decision, who inspected and
//! when); below, who prepared and who approved the plan, with lines to
//! sign and date.
//!
//! The count field follows the plan: one box for a single plan, one box
//! per stage (numbered in its corner) for a double or multiple plan, and
//! for an item-by-item plan the unit at which the lot was decided with the
//! running count there, the two figures `lotsman judge --inspected N
//! --found K` takes.

use super::canvas::Canvas;
use super::draw::{Face, grey};
use super::geometry::Rect;
use super::text::Shrink;
use super::variables::{decision_row, field};
use super::wording::variables as words;
use super::{Common, Facts, given, sheet_words};

/// Height of the approval block, and the gap above it.
const APPROVAL_H: f64 = 17.0;
const APPROVAL_GAP: f64 = 2.0;

/// Rows of the record block below its heading, and the heading's room.
const RECORD_ROWS: usize = 4;
const RECORD_HEAD_H: f64 = 5.5;

/// The narrowest box a stage's count is written in.
const MIN_BOX_W: f64 = 4.0;

/// The record block over the approval block, in the column `(x, top, w,
/// h)`; the record takes what the approval leaves.
pub(super) fn record_column(c: &mut Canvas, f: &Facts, x: f64, top: f64, w: f64, h: f64) {
    let record_h = h - APPROVAL_H - APPROVAL_GAP;
    record_block(c, f, x, top, w, record_h);
    approval_block(
        c,
        &f.common,
        x,
        top - record_h - APPROVAL_GAP,
        w,
        APPROVAL_H,
    );
}

/// The lot record: lot number, the count found, the decision, inspector
/// and date, one row each.
fn record_block(c: &mut Canvas, f: &Facts, x: f64, top: f64, w: f64, h: f64) {
    c.claim("record", Rect::new(x, top - h, w, h));
    c.rect_stroke(Rect::new(x, top - h, w, h), 0.5, grey(0.0));
    c.heading(x + 2.0, top - 3.8, sheet_words::RECORD);
    let (inner, end) = (x + 2.0, x + w - 2.0);
    let pitch = (h - RECORD_HEAD_H) / RECORD_ROWS as f64;
    // Each row's baseline sits a little above its foot.
    let row_y = |i: usize| top - RECORD_HEAD_H - pitch * (i as f64 + 1.0) + 1.4;
    field(c, inner, end, row_y(0), words::LOT_NUMBER, false);
    let box_h = (pitch - 0.8).min(4.6);
    counts_row(c, f, inner, end, row_y(1), box_h);
    decision_row(c, inner, row_y(2));
    let split = inner + (end - inner) * 0.6;
    field(c, inner, split - 3.0, row_y(3), words::INSPECTED_BY, false);
    field(c, split, end, row_y(3), words::INSPECTED_ON, false);
}

/// The count field at baseline `y` from `x` to `end`: a box for a single
/// plan, a numbered box per stage, or the deciding unit and its running
/// count for an item-by-item plan.
fn counts_row(c: &mut Canvas, f: &Facts, x: f64, end: f64, y: f64, box_h: f64) {
    let size = 7.5;
    let label = |c: &mut Canvas, at: f64, t: &str| {
        c.text(at, y, t, Face::Regular, size, grey(0.1));
        at + c.width(t, Face::Regular, size) + 1.5
    };
    let bottom = y - 1.2;
    if f.plan.sequential_lines().is_some() {
        let bx = label(c, x, sheet_words::DECIDED_AT_UNIT);
        c.rect_stroke(Rect::new(bx, bottom, 9.0, box_h), 0.5, grey(0.2));
        let bx = label(c, bx + 11.0, sheet_words::RUNNING_COUNT);
        c.rect_stroke(Rect::new(bx, bottom, 8.0, box_h), 0.5, grey(0.2));
        if bx + 8.0 > end {
            c.fault("lot record: the count fields leave no room".to_string());
        }
        return;
    }
    let stages = f.plan.stages().len();
    if stages == 1 {
        let bx = label(c, x, &sheet_words::found(f.common.per_unit));
        c.rect_stroke(Rect::new(bx, bottom, 12.0, box_h), 0.5, grey(0.2));
        if bx + 12.0 > end {
            c.fault("lot record: the count field leaves no room".to_string());
        }
        return;
    }
    let start = label(c, x, sheet_words::FOUND_AT_STAGE);
    let gap = 1.2;
    let box_w = ((end - start + gap) / stages as f64 - gap).min(9.0);
    if box_w < MIN_BOX_W {
        c.fault(format!(
            "lot record: {stages} stage boxes leave {box_w:.1} mm to write each count in"
        ));
    }
    for i in 0..stages {
        let bx = start + (box_w + gap) * i as f64;
        c.rect_stroke(Rect::new(bx, bottom, box_w, box_h), 0.5, grey(0.2));
        c.text(
            bx + 0.5,
            bottom + box_h - 1.7,
            &(i + 1).to_string(),
            Face::Regular,
            4.5,
            grey(0.45),
        );
    }
}

/// The approval of the plan: who prepared it and who approved it, side by
/// side, each with a line to sign and one to date.
fn approval_block(c: &mut Canvas, f: &Common, x: f64, top: f64, w: f64, h: f64) {
    c.claim("approval", Rect::new(x, top - h, w, h));
    c.rect_stroke(Rect::new(x, top - h, w, h), 0.5, grey(0.0));
    let half = w / 2.0;
    c.line(
        &[(x + half, top - 2.0), (x + half, top - h + 2.0)],
        0.3,
        grey(0.6),
        None,
    );
    let people = [
        (sheet_words::PREPARED_BY, given(&f.source.prepared_by)),
        (sheet_words::APPROVED_BY, given(&f.source.approved_by)),
    ];
    for (i, (label, name)) in people.iter().enumerate() {
        let hx = x + half * i as f64 + 2.0;
        let hw = half - 4.0;
        c.text(hx, top - 3.5, label, Face::Bold, 7.0, grey(0.3));
        c.paragraph(
            label,
            Rect::from_top(hx, top - 4.3, hw, 6.4),
            name,
            Face::Regular,
            Shrink::new(7.0, 5.5),
        );
        let line_y = top - h + 4.2;
        let date_w = 10.0;
        c.line(
            &[(hx, line_y), (hx + hw - date_w - 2.0, line_y)],
            0.4,
            grey(0.0),
            None,
        );
        c.line(
            &[(hx + hw - date_w, line_y), (hx + hw, line_y)],
            0.4,
            grey(0.0),
            None,
        );
        c.text(
            hx,
            line_y - 2.4,
            sheet_words::SIGNATURE,
            Face::Regular,
            6.0,
            grey(0.4),
        );
        c.text(
            hx + hw - date_w,
            line_y - 2.4,
            sheet_words::SIGNED_ON,
            Face::Regular,
            6.0,
            grey(0.4),
        );
    }
}
