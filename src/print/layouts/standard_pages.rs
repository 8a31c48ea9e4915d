//! The two pages of a standard-indexed plan whose sheet does not fit one
//! page (three classes, staged plans, Letter paper).
//!
//! Page 1 is the inspector's: the title block; the plan box with every
//! class's table plan at the severity in force; the procedure beside the
//! lot record and the approval; the footer. Page 2 is the engineer's: a
//! heading line naming the plan; the plan box at every severity; the
//! notes on how the plans were read; the true risks; the OC chart beside
//! the switching rules; the footer. Each footer carries the cautions, the
//! source's hash and the page's number.

use crate::print::blocks::class_record::{class_record, class_record_height};
use crate::print::blocks::procedure::{PROCEDURE_SIZES, steps_height};
use crate::print::blocks::signatures::approval_of;
use crate::print::blocks::standard_notes::{notes_block, notes_height};
use crate::print::blocks::standard_plans::standard_plan_box;
use crate::print::blocks::switching::{switching_block, switching_height};
use crate::print::blocks::true_risks::{true_risks_block, true_risks_height};
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey};
use crate::print::geometry::Rect;
use crate::print::layouts::shared::STAGED_FOOT_H;
use crate::print::layouts::standard::{
    APPROVAL_H, RIGHT_W, TEXT_SIZES, chart_block, footer, procedure_block, title,
};
use crate::print::page::{GAP, MIN_CHART_H};
use crate::print::standard_facts::StandardFacts;
use crate::print::text::Shrink;
use crate::print::wording::standard as words;
use crate::source::Error;

/// The pages of the sheet.
const PAGES: usize = 2;

/// The height of page 2's heading line, mm.
const LINE_H: f64 = 7.0;

/// Lays out page 1, what the inspector needs at the lot, in the
/// printable area `page`; a block that does not fit is a fault on the
/// canvas.
pub fn inspectors_page(c: &mut Canvas, f: &StandardFacts, page: Rect) {
    let (left, width) = (page.x, page.w);
    let d = &f.document;
    let mut top = page.top() - title(c, f, page) - GAP;
    top -= standard_plan_box(c, f, Rect::top_edge(left, top, width), &[f.severity]) + GAP;
    let foot_top = page.y + STAGED_FOOT_H;
    let proc_w = width - RIGHT_W - GAP;
    let steps = words::procedure(f);
    let record_h = class_record_height(c, f, RIGHT_W);
    let right_h = record_h + GAP + APPROVAL_H;
    let room = top - GAP - foot_top;
    let size = PROCEDURE_SIZES
        .into_iter()
        .chain(TEXT_SIZES)
        .find(|&s| steps_height(c, &steps, proc_w - 4.0, s) <= room)
        .unwrap_or(TEXT_SIZES[TEXT_SIZES.len() - 1]);
    let row_h = steps_height(c, &steps, proc_w - 4.0, size).max(right_h);
    if row_h > room + 1e-9 {
        c.fault(format!(
            "the procedure and the lot record need {row_h:.0} mm and page 1 leaves {room:.0} mm"
        ));
    }
    let row = Rect::from_top(left, top, width, row_h);
    let (procedure, right) = row.split_left(proc_w, GAP);
    procedure_block(c, f, &steps, procedure, size);
    class_record(
        c,
        f,
        Rect::from_top(right.x, right.top(), right.w, record_h),
    );
    approval_of(
        c,
        [&d.prepared_by, &d.approved_by],
        Rect::from_top(right.x, right.top() - record_h - GAP, right.w, APPROVAL_H),
    );
    footer(c, f, page, Some((1, PAGES)));
}

/// Lays out page 2, how the plans were read, what they risk and how
/// severity switches, in the printable area `page`; a block that does not
/// fit is a fault on the canvas.
///
/// # Errors
/// [`Error`] when a plan does not fit its class's model or a curve point
/// is out of range.
pub fn engineers_page(c: &mut Canvas, f: &StandardFacts, page: Rect) -> Result<(), Error> {
    let (left, width) = (page.x, page.w);
    let mut top = page.top();
    heading_line(c, f, Rect::from_top(left, top, width, LINE_H));
    top -= LINE_H + GAP;
    top -= standard_plan_box(c, f, Rect::top_edge(left, top, width), &f.severities()) + GAP;
    let foot_top = page.y + STAGED_FOOT_H;
    let risks_h = true_risks_height(c, f, width);
    let switch_w = RIGHT_W;
    // The row of the chart and the switching rules: what the notes and the
    // risks leave at the largest size at which the rules fit beside a
    // chart of at least its least height.
    let fits = |size: f64| {
        let notes = notes_height(c, f, width, size);
        let notes_room = if notes > 0.0 { notes + GAP } else { 0.0 };
        let row = top - notes_room - risks_h - GAP - GAP - foot_top;
        let need = MIN_CHART_H.max(switching_height(c, f, switch_w, size));
        (notes, row >= need - 1e-9)
    };
    let size = TEXT_SIZES
        .into_iter()
        .find(|&s| fits(s).1)
        .unwrap_or(TEXT_SIZES[TEXT_SIZES.len() - 1]);
    let (notes, _) = fits(size);
    if notes > 0.0 {
        notes_block(c, f, Rect::from_top(left, top, width, notes), size);
        top -= notes + GAP;
    }
    true_risks_block(c, f, Rect::from_top(left, top, width, risks_h));
    top -= risks_h + GAP;
    let row = Rect::new(left, foot_top + GAP, width, top - foot_top - GAP);
    let switch_h = switching_height(c, f, switch_w, size);
    let need = MIN_CHART_H.max(switch_h);
    if row.h < need - 1e-9 {
        c.fault(format!(
            "the chart and the switching rules beside it need {need:.0} mm and page 2 leaves {:.0} mm",
            row.h
        ));
    }
    let (switching, chart) = row.split_right(switch_w, GAP + 1.0);
    chart_block(c, f, chart)?;
    switching_block(
        c,
        f,
        Rect::from_top(switching.x, switching.top(), switching.w, switch_h),
        size,
    );
    footer(c, f, page, Some((2, PAGES)));
    Ok(())
}

/// Page 2's heading line in `area`: the plan's title on the left, what
/// the page holds on the right, a rule under both.
fn heading_line(c: &mut Canvas, f: &StandardFacts, area: Rect) {
    c.claim("page heading", area);
    let what = words::ENGINEERS_PAGE;
    let what_w = c.width(what, Face::Bold, 7.0);
    c.heading(area.right() - what_w, area.top() - 4.5, what);
    c.paragraph(
        "page heading",
        Rect::from_top(area.x, area.top(), area.w - what_w - 4.0, area.h - 1.5),
        &f.document.title,
        Face::Bold,
        Shrink::new(10.0, 7.0),
    );
    c.line(
        &[(area.x, area.y + 0.5), (area.right(), area.y + 0.5)],
        0.6,
        grey(0.0),
        None,
    );
}
