//! The lot record on an attribute sheet, beside the measures table: the
//! blanks an inspector fills in for each lot (the lot number, the count
//! found, the decision, who inspected and when), over the plan's approval
//! (who prepared and who approved it, in `signatures.rs`).
//!
//! The count field follows the plan: one box for a single plan, one box
//! per stage (numbered in its corner) for a double or multiple plan, and
//! for an item-by-item plan the unit at which the lot was decided with the
//! running count there, the two figures `lotsman judge --inspected N
//! --found K` takes.

use super::fields::{decision_row, field};
use super::signatures::approval_block;
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey};
use crate::print::facts::Facts;
use crate::print::geometry::Rect;
use crate::print::wording::{sheet, variables};

/// Height of the approval block, and the gap above it.
const APPROVAL_H: f64 = 17.0;
const APPROVAL_GAP: f64 = 2.0;

/// Rows of the record block below its heading, and the heading's room.
const RECORD_ROWS: usize = 4;
const RECORD_HEAD_H: f64 = 5.5;

/// The narrowest box a stage's count is written in.
const MIN_BOX_W: f64 = 4.0;

/// The record block over the approval block, in the column `area`; the
/// record takes what the approval leaves.
pub fn record_column(c: &mut Canvas, f: &Facts, area: Rect) {
    let (x, top, w, h) = (area.x, area.top(), area.w, area.h);
    let record_h = h - APPROVAL_H - APPROVAL_GAP;
    record_block(c, f, Rect::from_top(x, top, w, record_h));
    let approval_top = top - record_h - APPROVAL_GAP;
    approval_block(c, &f.common, Rect::from_top(x, approval_top, w, APPROVAL_H));
}

/// The lot record in `area`: lot number, the count found, the decision,
/// inspector and date, one row each.
fn record_block(c: &mut Canvas, f: &Facts, area: Rect) {
    let (x, top, w, h) = (area.x, area.top(), area.w, area.h);
    c.claim("record", area);
    c.rect_stroke(area, 0.5, grey(0.0));
    c.heading(x + 2.0, top - 3.8, sheet::RECORD);
    let (inner, end) = (x + 2.0, x + w - 2.0);
    let pitch = (h - RECORD_HEAD_H) / RECORD_ROWS as f64;
    // Each row's baseline sits a little above its foot.
    let row_y = |i: usize| top - RECORD_HEAD_H - pitch * (i as f64 + 1.0) + 1.4;
    field(c, inner, end, row_y(0), variables::LOT_NUMBER, false);
    let box_h = (pitch - 0.8).min(4.6);
    counts_row(c, f, inner, end, row_y(1), box_h);
    decision_row(c, inner, row_y(2));
    let split = inner + (end - inner) * 0.6;
    field(
        c,
        inner,
        split - 3.0,
        row_y(3),
        variables::INSPECTED_BY,
        false,
    );
    field(c, split, end, row_y(3), variables::INSPECTED_ON, false);
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
        let bx = label(c, x, sheet::DECIDED_AT_UNIT);
        c.rect_stroke(Rect::new(bx, bottom, 9.0, box_h), 0.5, grey(0.2));
        let bx = label(c, bx + 11.0, sheet::RUNNING_COUNT);
        c.rect_stroke(Rect::new(bx, bottom, 8.0, box_h), 0.5, grey(0.2));
        if bx + 8.0 > end {
            c.fault("lot record: the count fields leave no room".to_string());
        }
        return;
    }
    let stages = f.plan.stages().len();
    if stages == 1 {
        let bx = label(c, x, &sheet::found(f.common.per_unit));
        c.rect_stroke(Rect::new(bx, bottom, 12.0, box_h), 0.5, grey(0.2));
        if bx + 12.0 > end {
            c.fault("lot record: the count field leaves no room".to_string());
        }
        return;
    }
    let start = label(c, x, sheet::FOUND_AT_STAGE);
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
