//! The page of a single plan: title block, plan box (the sample size and
//! the two decisions beside the procedure), risk table, the OC and AOQ
//! charts side by side, the measures table beside the lot record and the
//! approval, footer.

use super::shared::{STAGED_FOOT_H, STAGED_TITLE_H, lower_band};
use crate::plan::evaluate;
use crate::print::blocks::measures::measures_height;
use crate::print::blocks::notice::{NOTICE_LINES, notice_block};
use crate::print::blocks::plan_box::{SINGLE_PLAN_COL, single_plan_box};
use crate::print::blocks::procedure::steps_height;
use crate::print::blocks::risks::risk_table;
use crate::print::blocks::title::title_block;
use crate::print::canvas::Canvas;
use crate::print::chart::aoq::aoq_chart;
use crate::print::chart::oc::oc_chart;
use crate::print::facts::Facts;
use crate::print::geometry::Rect;
use crate::report::EvaluationReport;
use crate::source::Error;

/// Height of the footer (cautions and provenance).
const FOOT_H: f64 = 25.0;

/// Lays out the page of the single plan `n`, `ac` of `f` in the printable
/// area `page`; a block that does not fit is a fault on the canvas.
///
/// # Errors
/// [`Error`] when the plan's measures or curves are out of range.
pub fn single_layout(c: &mut Canvas, f: &Facts, page: Rect, n: u64, ac: u64) -> Result<(), Error> {
    let (left, width, margin) = (page.x, page.w, page.y);
    let mut top = page.top();
    // A notice takes its room from the title block and the footer, which
    // then have the staged sheets' heights.
    let (title_h, foot_h) = match f.common.notice {
        Some(_) => (STAGED_TITLE_H, STAGED_FOOT_H),
        None => (40.0, FOOT_H),
    };
    let title_h = title_block(c, &f.common, Rect::from_top(left, top, width, title_h));
    top -= title_h + 4.0;
    top -= notice_block(c, &f.common, Rect::top_edge(left, top, width), NOTICE_LINES);
    // The box is 42 mm, or as tall as the procedure beside the sample
    // needs at 8 points (a rectifying procedure has a longer last step).
    let plan_h = steps_height(c, &f.steps(), width - SINGLE_PLAN_COL - 8.0, 8.0).max(42.0);
    single_plan_box(c, f, Rect::from_top(left, top, width, plan_h), (n, ac));
    top -= plan_h + 4.0;
    let risk_h = 20.0;
    risk_table(c, &f.common, Rect::from_top(left, top, width, risk_h));
    top -= risk_h + 3.0;

    // Charts take the height that the table and footer leave.
    let qualities = f.default_qualities();
    let evaluation = evaluate(&f.plan, &f.model, &qualities)?;
    EvaluationReport::from(&evaluation).check()?;
    let table_h = measures_height(&evaluation, 4.2);
    let foot_top = margin + foot_h;
    let chart_h = (top - 4.0 - table_h - 3.0 - foot_top).min(85.0);
    let chart_w = (width - 6.0) / 2.0;
    let subject = f.subject();
    let curves = subject.curves()?;
    let chart_top = top - chart_h;
    let (oc, aoq) = Rect::new(left, chart_top, width, chart_h).split_left(chart_w, 6.0);
    oc_chart(c, &subject, &curves, oc);
    aoq_chart(c, &subject, &curves, aoq);
    top = chart_top - 4.0;

    lower_band(c, f, &evaluation, page, (top, table_h), (chart_h, foot_h));
    Ok(())
}
