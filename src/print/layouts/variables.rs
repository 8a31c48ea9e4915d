//! The page of a variables plan: the inspector measures `n` units and
//! decides by a statistic of their mean and spread, so the sheet carries
//! the numbers of the rule and the blanks to work it out in.
//!
//! Layout, from the top: the title block; the plan box (n, k or M, sigma,
//! the limits and the attributes plan for the same points, beside the
//! procedure); the risk table; then two columns: on the left the readings
//! table over the OC chart (under the notice of a plan printed as
//! recorded, if any), on the right the decision rule, the result lines and
//! the signatures; the footer. The title block, risk table, signatures,
//! footer and risk-point marks are the attribute sheets' own. How many
//! readings the sheet holds: see
//! [`MAX_SHEET_READINGS`](crate::print::facts::MAX_SHEET_READINGS).

use crate::numeric::NumericalError;
use crate::print::blocks::footer::footer;
use crate::print::blocks::notice::notice_block;
use crate::print::blocks::plan_box::variables_plan_box;
use crate::print::blocks::readings::readings_block;
use crate::print::blocks::results::results_block;
use crate::print::blocks::risks::risk_table;
use crate::print::blocks::rule::rule_block;
use crate::print::blocks::signatures::signatures;
use crate::print::blocks::title::title_block;
use crate::print::canvas::Canvas;
use crate::print::chart::variables_oc::{VariablesSubject, variables_oc_chart};
use crate::print::draw::Face;
use crate::print::facts::VariablesFacts;
use crate::print::geometry::{MM_PER_PT, Rect};
use crate::print::page::{GAP, MIN_CHART_H};
use crate::print::text::Shrink;
use crate::print::wording::variables;
use crate::report::words::CAUTION;

/// The most the OC chart takes of the height the readings leave.
const CHART_MAX_H: f64 = 100.0;

/// The most lines of the notice of a plan printed as recorded, in the
/// left column.
const NOTICE_LINES: usize = 7;

/// Width of the right column.
const RIGHT_W: f64 = 72.0;

/// Heights of the title block (a little lower than the staged sheets'),
/// the risk table and the signatures.
const TITLE_H: f64 = 30.0;
const RISK_H: f64 = 20.0;
const SIGNATURES_H: f64 = 40.0;

/// Lays out the variables page of `f` in the printable area `page`; a
/// block that does not fit is a fault on the canvas.
///
/// # Errors
/// [`NumericalError`] when a point of the OC curves is not a probability.
pub fn variables_layout(
    c: &mut Canvas,
    f: &VariablesFacts,
    page: Rect,
) -> Result<(), NumericalError> {
    let (left, width, margin) = (page.x, page.w, page.y);
    let mut top = page.top();
    let title_h = title_block(c, &f.common, Rect::from_top(left, top, width, TITLE_H));
    top -= title_h + GAP;
    let plan_h = variables_plan_box(c, f, Rect::top_edge(left, top, width));
    top -= plan_h + GAP;
    risk_table(c, &f.common, Rect::from_top(left, top, width, RISK_H));
    top -= RISK_H + GAP;

    let caution = format!(
        "{CAUTION} {}",
        variables::assumption(f.plan.spec().sigma_kind())
    );
    let foot_h = footer_height(c, &caution, width);
    let band_bottom = margin + foot_h + GAP;
    // The right column: rule, results, then the signatures at the bottom.
    let (right_column, left_column) = page.split_right(RIGHT_W, 4.0);
    let right_x = right_column.x;
    let rule_h = rule_block(c, &f.plan, Rect::top_edge(right_x, top, RIGHT_W));
    let results_top = top - rule_h - GAP;
    let results_h = results_block(c, &f.plan, Rect::top_edge(right_x, results_top, RIGHT_W));
    let room = results_top - results_h - GAP - band_bottom;
    let sig_h = room.min(SIGNATURES_H + 8.0);
    if room < SIGNATURES_H {
        c.fault(format!(
            "the decision rule and the results leave the signatures {room:.0} mm of the {SIGNATURES_H:.0} they need"
        ));
    }
    signatures(
        c,
        &f.common,
        Rect::from_top(right_x, band_bottom + sig_h, RIGHT_W, sig_h.max(0.0)),
    );

    // The left column: the notice of a plan printed as recorded, the
    // readings, the chart. The right column has no room to spare for the
    // notice (a two-limit rule fills it on Letter), the left one does when
    // the readings go on a log.
    let left_w = left_column.w;
    top -= notice_block(
        c,
        &f.common,
        Rect::top_edge(left, top, left_w),
        NOTICE_LINES,
    );
    let band_h = top - band_bottom;
    let readings_h = readings_block(c, f, Rect::from_top(left, top, left_w, band_h));
    let chart_h = (band_h - readings_h - GAP).min(CHART_MAX_H);
    if chart_h < MIN_CHART_H - 1e-9 {
        c.fault("the page is too short for its blocks".to_string());
    }
    let subject = VariablesSubject {
        plan: &f.plan,
        model: &f.model,
        attributes: f.attributes.as_ref(),
        agreement: &f.common.agreement,
        per_unit: f.common.per_unit,
    };
    let chart_y = top - readings_h - GAP - chart_h;
    variables_oc_chart(
        c,
        &subject,
        Rect::new(left, chart_y, left_w, chart_h.max(20.0)),
    )?;
    let judge = variables::judge_command(f.common.file_name);
    footer(
        c,
        &f.common,
        page.split_bottom(foot_h, 0.0).0,
        &caution,
        &judge,
    );
    Ok(())
}

/// The footer's height for `caution` (at 7 points across the page) and
/// the provenance line with the judge command (three lines at 6 points).
fn footer_height(c: &Canvas, caution: &str, width: f64) -> f64 {
    let caution_h = c
        .fit(
            caution,
            Face::Regular,
            width,
            f64::INFINITY,
            Shrink::fixed(7.0),
        )
        .height;
    1.5 + caution_h + 1.5 + 3.0 * 6.0 * MM_PER_PT * 1.25 + 0.5
}
