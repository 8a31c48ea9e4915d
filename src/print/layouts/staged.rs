//! The page of a double, multiple or item-by-item plan: title block; plan
//! box with the stage or item table beside the procedure; risk table; the
//! charts (OC and ASN, and first the decision chart for an item-by-item
//! plan; OC and AOQ for a minimum-inspection plan); measures table beside
//! the lot record and the approval; footer.

use super::shared::{STAGED_FOOT_H, STAGED_TITLE_H, lower_band};
use crate::plan::evaluate;
use crate::print::blocks::measures::measures_height;
use crate::print::blocks::notice::{NOTICE_LINES, notice_block};
use crate::print::blocks::risks::risk_table;
use crate::print::blocks::table_box::{item_plan_box, stage_plan_box};
use crate::print::blocks::title::title_block;
use crate::print::canvas::Canvas;
use crate::print::chart::aoq::aoq_chart;
use crate::print::chart::asn::asn_chart;
use crate::print::chart::decision::decision_chart;
use crate::print::chart::oc::oc_chart;
use crate::print::facts::Facts;
use crate::print::geometry::Rect;
use crate::print::page::{GAP, MIN_CHART_H};
use crate::report::EvaluationReport;
use crate::source::Error;

/// Lays out the page of the staged plan of `f` in the printable area
/// `page`; a block that does not fit is a fault on the canvas.
///
/// # Errors
/// [`Error`] when the plan's measures or curves are out of range.
pub fn staged_layout(c: &mut Canvas, f: &Facts, page: Rect) -> Result<(), Error> {
    let (left, width, margin) = (page.x, page.w, page.y);
    let mut top = page.top();
    let title_h = title_block(
        c,
        &f.common,
        Rect::from_top(left, top, width, STAGED_TITLE_H),
    );
    top -= title_h + GAP;
    top -= notice_block(c, &f.common, Rect::top_edge(left, top, width), NOTICE_LINES);
    let qualities = f.default_qualities();
    let evaluation = evaluate(&f.plan, &f.model, &qualities)?;
    EvaluationReport::from(&evaluation).check()?;
    let table_h = measures_height(&evaluation, 3.9);
    let foot_top = margin + STAGED_FOOT_H;
    let risk_h = 20.0;
    // The plan box may take what the other blocks leave at the smallest
    // chart height.
    let below_plan = GAP + risk_h + GAP + MIN_CHART_H + GAP + table_h + GAP;
    let plan_max = top - below_plan - foot_top;
    let faults = c.problems();
    let at = Rect::top_edge(left, top, width);
    let plan_h = match f.plan.sequential_lines() {
        Some(lines) => item_plan_box(c, f, lines, at, plan_max),
        None => stage_plan_box(c, f, at, plan_max),
    };
    if c.problems() > faults {
        // The rest would be laid out in what is not there; the plan box's
        // own message says why.
        return Ok(());
    }
    top -= plan_h + GAP;
    risk_table(c, &f.common, Rect::from_top(left, top, width, risk_h));
    top -= risk_h + GAP;

    let chart_h = (top - GAP - table_h - GAP - foot_top).min(85.0);
    let chart_top = top - chart_h;
    let subject = f.subject();
    let curves = subject.curves()?;
    let row = Rect::new(left, chart_top, width, chart_h);
    match f.plan.sequential_lines() {
        Some(lines) => {
            // Three in a row, the decision chart widest.
            let gap = 4.0;
            let small = (width - 2.0 * gap) * 0.3;
            let wide = width - 2.0 * gap - 2.0 * small;
            let (decision, rest) = row.split_left(wide, gap);
            let (oc, asn) = rest.split_left(small, gap);
            decision_chart(c, lines, f.common.per_unit, decision);
            oc_chart(c, &subject, &curves, oc);
            asn_chart(c, &subject, &curves, asn);
        }
        None => {
            let (oc, second_area) = row.split_left((width - 6.0) / 2.0, 6.0);
            oc_chart(c, &subject, &curves, oc);
            // Under rectifying inspection the AOQ is what the protection
            // bounds; otherwise the ASN is what a staged plan saves.
            let second = if f.rectifying() { aoq_chart } else { asn_chart };
            second(c, &subject, &curves, second_area);
        }
    }
    top = chart_top - GAP;
    lower_band(
        c,
        f,
        &evaluation,
        page,
        (top, table_h),
        (chart_h, STAGED_FOOT_H),
    );
    Ok(())
}
