//! The page of a standard-indexed plan: title block; the plan box (the
//! code letter and every class's table plans at each severity, the one
//! in force shaded) with the notes on how the plans were read under it;
//! the inspector's procedure for the severity in force beside the
//! switching rules; the true-risk table with the two-point design beside
//! it; the OC chart beside the lot record and the approval; the footer
//! with the cautions and the provenance.
//!
//! The texts of the middle band (notes, procedure, switching rules) take
//! one size, the largest at which the chart keeps its least height and
//! the right column fits beside it.

use crate::print::blocks::class_record::{class_record, class_record_height};
use crate::print::blocks::footer::footer_lines;
use crate::print::blocks::procedure::{headed_steps, steps_height};
use crate::print::blocks::signatures::approval_of;
use crate::print::blocks::standard_notes::{notes_block, notes_height};
use crate::print::blocks::standard_plans::standard_plan_box;
use crate::print::blocks::switching::{switching_block, switching_height};
use crate::print::blocks::title::{Heading, heading_block};
use crate::print::blocks::true_risks::{true_risks_block, true_risks_height};
use crate::print::canvas::Canvas;
use crate::print::chart::standard_oc::standard_oc_chart;
use crate::print::draw::{Face, grey};
use crate::print::geometry::Rect;
use crate::print::layouts::shared::{STAGED_FOOT_H, STAGED_TITLE_H};
use crate::print::page::{GAP, MIN_CHART_H};
use crate::print::standard_facts::StandardFacts;
use crate::print::text::Shrink;
use crate::print::wording::standard as words;
use crate::source::{Error, tool_version};

/// The sizes the middle band's texts try, largest first.
pub(super) const TEXT_SIZES: [f64; 4] = [7.5, 7.0, 6.5, 6.0];

/// The share of the width the procedure takes beside the switching
/// rules, and the width of the column beside the chart, mm.
const PROCEDURE_SHARE: f64 = 0.5;
pub(super) const RIGHT_W: f64 = 88.0;

/// The approval block's height, mm.
pub(super) const APPROVAL_H: f64 = 17.0;

/// The heights of the sized blocks at one text size.
struct Sized {
    size: f64,
    band: f64,
    notes: f64,
}

/// Lays out the page of `f` in the printable area `page`; a block that
/// does not fit is a fault on the canvas.
///
/// # Errors
/// [`Error`] when a plan does not fit its class's model or a curve point
/// is out of range.
pub fn standard_layout(c: &mut Canvas, f: &StandardFacts, page: Rect) -> Result<(), Error> {
    let (left, width) = (page.x, page.w);
    let d = &f.document;
    let mut top = page.top() - title(c, f, page) - GAP;
    top -= standard_plan_box(c, f, Rect::top_edge(left, top, width), &f.severities()) + GAP;

    let proc_w = (width - GAP) * PROCEDURE_SHARE;
    let switch_w = width - GAP - proc_w;
    let steps = words::procedure(f);
    let risks_h = true_risks_height(c, f, width);
    let foot_top = page.y + STAGED_FOOT_H;
    let record_h = class_record_height(c, f, RIGHT_W);
    let sized = |size: f64| {
        let band =
            steps_height(c, &steps, proc_w - 4.0, size).max(switching_height(c, f, switch_w, size));
        let notes = notes_height(c, f, width, size);
        Sized { size, band, notes }
    };
    // The row of the chart: what the blocks above leave.
    let notes_room = |s: &Sized| if s.notes > 0.0 { s.notes + GAP } else { 0.0 };
    let row_h = |s: &Sized| top - notes_room(s) - s.band - GAP - risks_h - GAP - GAP - foot_top;
    let right_h = record_h + GAP + APPROVAL_H;
    let options: Vec<Sized> = TEXT_SIZES.iter().map(|&s| sized(s)).collect();
    let chosen = options
        .iter()
        .find(|s| row_h(s) >= MIN_CHART_H.max(right_h))
        .unwrap_or(&options[options.len() - 1]);

    if chosen.notes > 0.0 {
        notes_block(
            c,
            f,
            Rect::from_top(left, top, width, chosen.notes),
            chosen.size,
        );
        top -= chosen.notes + GAP;
    }
    let band = Rect::from_top(left, top, width, chosen.band);
    let (procedure, switching) = band.split_left(proc_w, GAP);
    procedure_block(c, f, &steps, procedure, chosen.size);
    switching_block(c, f, switching, chosen.size);
    top -= chosen.band + GAP;
    true_risks_block(c, f, Rect::from_top(left, top, width, risks_h));
    top -= risks_h + GAP;

    let row = Rect::new(left, foot_top + GAP, width, top - foot_top - GAP);
    let (right, chart) = row.split_right(RIGHT_W, GAP + 1.0);
    if row.h < MIN_CHART_H.max(right_h) - 1e-9 {
        c.fault(format!(
            "the chart and the column beside it need {:.0} mm and the page leaves {:.0} mm",
            MIN_CHART_H.max(right_h),
            row.h
        ));
    }
    chart_block(c, f, chart)?;
    class_record(
        c,
        f,
        Rect::from_top(right.x, right.top(), right.w, record_h),
    );
    approval_of(
        c,
        [&d.prepared_by, &d.approved_by],
        Rect::new(right.x, right.y, right.w, APPROVAL_H),
    );
    footer(c, f, page, None);
    Ok(())
}

/// The title block at the top of `page`; returns its height.
pub(super) fn title(c: &mut Canvas, f: &StandardFacts, page: Rect) -> f64 {
    let d = &f.document;
    let lot = format!("{} units", f.lot_size);
    let scheme = format!("{}, MIL-STD-105E", f.scheme.name());
    let heading = Heading {
        title: &d.title,
        item: &d.item,
        characteristic: &d.characteristic,
        id: &d.id,
        revision: &d.revision,
        date: &d.date,
        lot,
        scheme: &scheme,
    };
    heading_block(
        c,
        &heading,
        Rect::from_top(page.x, page.top(), page.w, STAGED_TITLE_H),
    )
}

/// The inspector's procedure for the severity in force, `steps`, framed
/// in `area` at `size`; its heading on the line of the switching rules'
/// heading beside it.
pub(super) fn procedure_block(
    c: &mut Canvas,
    f: &StandardFacts,
    steps: &[String],
    area: Rect,
    size: f64,
) {
    c.claim("procedure", area);
    c.rect_stroke(area, 0.5, grey(0.0));
    // `headed_steps` sets its heading 7 mm below the top it is given (the
    // plan box's procedure column), the switching rules theirs 4 mm below
    // their frame's: given a top 3 mm higher, the two headings align.
    headed_steps(
        c,
        &words::procedure_heading(f.severity),
        steps,
        Rect::new(area.x + 2.0, area.y, area.w - 4.0, area.h + HEADING_RAISE),
        size,
    );
}

/// How much higher than its frame the procedure's text starts, mm.
const HEADING_RAISE: f64 = 3.0;

/// The OC chart of the first class sampled in `chart`, or the note that
/// no class is sampled.
///
/// # Errors
/// [`Error`] when a plan does not fit its class's model or a curve point
/// is out of range.
pub(super) fn chart_block(c: &mut Canvas, f: &StandardFacts, chart: Rect) -> Result<(), Error> {
    match f.chart_class() {
        Some(k) => standard_oc_chart(c, f, k, chart)?,
        None => {
            c.claim("OC chart", chart);
            c.rect_stroke(chart, 0.5, grey(0.6));
            c.paragraph(
                "OC chart",
                Rect::from_top(chart.x + 3.0, chart.top() - 3.0, chart.w - 6.0, 20.0),
                words::NO_CURVE,
                Face::Regular,
                Shrink::fixed(8.0),
            );
        }
    }
    Ok(())
}

/// The footer at the bottom of `page`: the cautions and the provenance,
/// led by the page's number `(k, of)` on a sheet of several pages.
pub(super) fn footer(
    c: &mut Canvas,
    f: &StandardFacts,
    page: Rect,
    number: Option<(usize, usize)>,
) {
    let d = &f.document;
    let provenance = words::provenance(
        &tool_version(),
        &d.file_name,
        &d.source_sha256,
        &d.regenerate,
    );
    let provenance = match number {
        Some((k, of)) => format!("{} {provenance}", words::page_of(k, of)),
        None => provenance,
    };
    let (foot, _) = page.split_bottom(STAGED_FOOT_H, 0.0);
    footer_lines(c, foot, &words::caution(), &provenance);
}
