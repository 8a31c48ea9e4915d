//! The page of a comparison (`lotsman compare --output`): a title and the
//! risk points, the OC, AOQ and ASN charts of every plan side by side,
//! the table of their true risks under them, and the caution; A4
//! landscape, as a PDF or an SVG drawn by the same code.

use super::landscape::{HistoryFormat, PAGE, landscape_page};
use crate::numeric::format_quality_cell;
use crate::plan::Comparison;
use crate::print::canvas::Canvas;
use crate::print::chart::compare::{CompareCurves, Measure, compare_chart, fitted};
use crate::print::draw::{Face, grey};
use crate::print::geometry::Rect;
use crate::print::palette::COMPARED;
use crate::print::wording::compare as words;
use crate::print::wording::sheet::quality;
use crate::report::CompareReport;
use crate::source::Error;

/// The margin, mm.
const MARGIN: f64 = 12.0;

/// The table's type size (points), row pitch and note pitch (mm).
const SIZE: f64 = 6.5;
const ROW: f64 = 3.9;
const NOTE: f64 = 3.0;

/// The widest the plan column may be, mm.
const PLAN_COLUMN: f64 = 80.0;

/// The length of a plan's line sample in the table, mm.
const SAMPLE: f64 = 7.0;

/// The page of `comparison`, whose report is `report`, titled `title`, in
/// `format`.
///
/// # Errors
/// [`InputError`](crate::InputError) when a plan's curves pass the work budget or the page
/// does not lay out; [`Error::Numerical`] for a point of a curve out of
/// its range; an output error when the PDF cannot be written.
pub fn render_comparison(
    comparison: &Comparison,
    report: &CompareReport,
    title: &str,
    format: HistoryFormat,
) -> Result<Vec<u8>, Error> {
    let curves = CompareCurves::new(comparison)?;
    landscape_page(
        format,
        title,
        ("the comparison page", "lotsman comparison of plans"),
        report,
        |c| lay(c, comparison, &curves, report, title),
    )
}

fn lay(
    c: &mut Canvas,
    comparison: &Comparison,
    curves: &CompareCurves,
    report: &CompareReport,
    title: &str,
) {
    let (pw, ph) = PAGE;
    let width = pw - 2.0 * MARGIN;
    c.text(
        MARGIN,
        ph - MARGIN - 4.0,
        title,
        Face::Bold,
        12.0,
        grey(0.0),
    );
    let notes = notes(c, report, width);
    let table_h = 7.0 + ROW * (report.plans.len() + 1) as f64 + NOTE * notes.len() as f64;
    let table = Rect::new(MARGIN, MARGIN + 2.0, width, table_h);
    let top = ph - MARGIN - 8.0;
    let charts_bottom = table.top() + 5.0;
    let gap = 6.0;
    let chart_w = (width - 2.0 * gap) / 3.0;
    for (i, measure) in [Measure::Oc, Measure::Aoq, Measure::Asn]
        .into_iter()
        .enumerate()
    {
        let x = MARGIN + i as f64 * (chart_w + gap);
        let area = Rect::new(x, charts_bottom, chart_w, top - charts_bottom);
        compare_chart(c, comparison, curves, measure, area);
    }
    true_risks(c, report, table, &notes);
    c.text(
        MARGIN,
        MARGIN - 4.0,
        words::CAUTION,
        Face::Regular,
        6.5,
        grey(0.3),
    );
}

/// The notes under the table, each wrapped to `width`: the points, a
/// staged plan's n, each plan's own note.
fn notes(c: &Canvas, report: &CompareReport, width: f64) -> Vec<String> {
    let per_unit = report.quality_unit == "per_unit";
    let mut texts = vec![words::points(
        &quality(report.aql, per_unit),
        report.alpha,
        &quality(report.rql, per_unit),
        report.beta,
        &report.points_from,
    )];
    match report.shared_model() {
        Some(line) => texts.push(format!("{line}.")),
        None => texts.extend(report.plans.iter().map(|p| match p.lot_size {
            Some(lot) => format!("{}: {} model, lots of {lot} units.", p.label, p.model),
            None => format!("{}: {} model, no lot size.", p.label, p.model),
        })),
    }
    if report.plans.iter().any(|p| p.n.is_none()) {
        texts.push(words::STAGED_N.to_string());
    }
    for p in &report.plans {
        if let Some(note) = &p.note {
            texts.push(format!("{}: {note}", p.label));
        }
    }
    texts
        .iter()
        .flat_map(|t| c.wrap(t, Face::Regular, SIZE, width))
        .collect()
}

/// The table of true risks in `area`: the heading, a row per plan with
/// the sample of its line, then the `notes`.
fn true_risks(c: &mut Canvas, report: &CompareReport, area: Rect, notes: &[String]) {
    c.claim("table of true risks", area);
    let per_unit = report.quality_unit == "per_unit";
    let mut y = area.top() - 3.0;
    c.heading(area.x, y, words::TABLE);
    y -= 1.0;
    let rows: Vec<Vec<String>> = report
        .plans
        .iter()
        .map(|p| {
            vec![
                p.n.map_or_else(|| format!("{:.1}", p.asn_at_aql), |n| n.to_string()),
                format!("{:.4}", p.pa_at_aql),
                format!("{:.4}", p.producer_risk),
                format!("{:.4}", p.consumer_risk),
                format_quality_cell(p.aoql, per_unit),
                format!("{:.1}", p.asn_at_aql),
                format!("{:.1}", p.asn_at_rql),
                if p.meets_alpha { "yes" } else { "no" }.to_string(),
                if p.meets_beta { "yes" } else { "no" }.to_string(),
            ]
        })
        .collect();
    let mut heads = words::HEADS.map(String::from);
    if per_unit {
        heads[4] = words::AOQL_PER_UNIT.to_string();
    }
    // Each column as wide as its widest cell or head, and a gap.
    let widths: Vec<f64> = (0..heads.len())
        .map(|j| {
            rows.iter()
                .map(|r| c.width(&r[j], Face::Regular, SIZE))
                .fold(c.width(&heads[j], Face::Bold, SIZE), f64::max)
                + 3.0
        })
        .collect();
    let numbers: f64 = widths.iter().sum();
    let plan_w = report
        .plans
        .iter()
        .map(|p| c.width(&p.label, Face::Regular, SIZE))
        .fold(0.0, f64::max)
        .min(PLAN_COLUMN)
        + SAMPLE
        + 4.0;
    if plan_w + numbers > area.w {
        c.fault("the table of true risks is wider than the page".to_string());
    }
    y -= ROW;
    c.text(area.x, y, "Plan", Face::Bold, SIZE, grey(0.0));
    let mut x = area.x + plan_w;
    for (head, w) in heads.iter().zip(&widths) {
        x += w;
        c.text_right(x, y, head, Face::Bold, SIZE, grey(0.0));
    }
    c.line(
        &[(area.x, y - 1.2), (area.x + plan_w + numbers, y - 1.2)],
        0.4,
        grey(0.5),
        None,
    );
    for ((p, row), style) in report.plans.iter().zip(&rows).zip(COMPARED) {
        y -= ROW;
        c.line(
            &[(area.x, y + 0.8), (area.x + SAMPLE, y + 0.8)],
            style.width,
            style.colour,
            style.dash,
        );
        let label = fitted(c, &p.label, plan_w - SAMPLE - 4.0);
        c.text(
            area.x + SAMPLE + 1.5,
            y,
            &label,
            Face::Regular,
            SIZE,
            grey(0.0),
        );
        let mut x = area.x + plan_w;
        for (cell, w) in row.iter().zip(&widths) {
            x += w;
            c.text_right(x, y, cell, Face::Regular, SIZE, grey(0.0));
        }
    }
    y -= NOTE + 0.6;
    for line in notes {
        c.text(area.x, y, line, Face::Regular, SIZE, grey(0.2));
        y -= NOTE;
    }
    if y < area.y - 1.0 {
        c.fault("the table of true risks runs below its box".to_string());
    }
}
