//! The risk table: what the plan was agreed on against what it achieves.
//! For a plan designed from two risk points, the producer's and the
//! consumer's point with the risk agreed and the risk the plan has there;
//! for a minimum-inspection plan, the process average with the ATI there
//! and the protection (an LTPD or an AOQL) with what the plan gives.

use crate::design::{Protection, RectifyingPlan, RectifyingRequest};
use crate::model::RiskPair;
use crate::numeric::Short;
use crate::numeric::format_significant;
use crate::print::agreement::Agreement;
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, Font, grey};
use crate::print::facts::Common;
use crate::print::geometry::Rect;
use crate::print::wording::sheet;

/// A risk table's text: the block's name, the heading, the name its cells
/// go by in messages, the column heads and the two rows.
struct Rows {
    region: &'static str,
    heading: String,
    cells: &'static str,
    heads: [&'static str; 4],
    rows: [[String; 4]; 2],
}

/// The rows of two risk points and the `(alpha, beta)` achieved there.
fn points(f: &Common, risks: &RiskPair, (alpha, beta): (f64, f64)) -> Rows {
    let (producer, consumer) = (risks.producer(), risks.consumer());
    Rows {
        region: "risks",
        heading: sheet::RISKS.to_string(),
        cells: "risk table",
        heads: sheet::risk_heads(f.per_unit),
        rows: [
            [
                sheet::PRODUCER_POINT.to_string(),
                f.q(producer.quality),
                format!("α ≤ {}", Short(producer.risk)),
                format!(
                    "α = {}  (Pa = {:.4})",
                    format_significant(alpha, 3),
                    1.0 - alpha
                ),
            ],
            [
                sheet::CONSUMER_POINT.to_string(),
                f.q(consumer.quality),
                format!("β ≤ {}", Short(consumer.risk)),
                format!("β = {}  (Pa = {:.4})", format_significant(beta, 3), beta),
            ],
        ],
    }
}

/// The rows of a minimum-inspection plan: the process average with the
/// ATI there, and the LTPD with the consumer's risk achieved, or the AOQL
/// with the plan's.
fn protection(f: &Common, request: &RectifyingRequest, figures: &RectifyingPlan) -> Rows {
    let lot = request.lot_size();
    let protection = match request.protection() {
        Protection::Ltpd(point) => [
            "LTPD (consumer's protection)".to_string(),
            f.q(point.quality),
            format!("β ≤ {}", point.risk),
            figures.pa_at_ltpd.map_or(String::new(), |pa| {
                format!("β = {}  (Pa = {pa:.4})", format_significant(pa, 3))
            }),
        ],
        Protection::Aoql(limit) => [
            "AOQL (consumer's protection)".to_string(),
            f.q(limit),
            format!("AOQ ≤ {}", f.q(limit)),
            format!(
                "AOQL = {} at {}",
                f.q(figures.aoql.value),
                f.q(figures.aoql.quality)
            ),
        ],
    };
    Rows {
        region: "protection",
        heading: format!(
            "AGREED PROTECTION AND WHAT THIS PLAN ACHIEVES UNDER RECTIFYING INSPECTION ({} MODEL)",
            request.model().kind().name().to_uppercase()
        ),
        cells: "protection table",
        heads: [
            "Point",
            sheet::quality_head(f.per_unit),
            "Agreed",
            "Achieved by this plan",
        ],
        rows: [
            [
                "Process average (p̄)".to_string(),
                f.q(request.process_average()),
                "least ATI".to_string(),
                format!(
                    "ATI = {:.1} of {lot}  (Pa = {:.4})",
                    figures.ati, figures.pa
                ),
            ],
            protection,
        ],
    }
}

/// The risk table in `area`: the agreement of `f` against what the plan
/// achieves, four columns, heads over a rule.
pub fn risk_table(c: &mut Canvas, f: &Common, area: Rect) {
    let Rows {
        region,
        heading,
        cells,
        heads,
        rows,
    } = match &f.agreement {
        Agreement::Points { risks, achieved } => points(f, risks, *achieved),
        Agreement::Rectifying { request, figures } => protection(f, request, figures),
    };
    let (left, top, width) = (area.x, area.top(), area.w);
    let right = left + width;
    let black = || grey(0.0);
    c.claim(region, area);
    c.heading(left, top - 3.5, &heading);
    let cols = [left, left + 52.0, left + 84.0, left + 128.0, right];
    let row_y = |i: usize| top - 8.5 - 5.0 * i as f64;
    let font = |face| Font { face, size: 7.5 };
    for (i, head) in heads.iter().enumerate() {
        let w = cols[i + 1] - cols[i] - 2.0;
        c.cell(
            cells,
            (cols[i] + 1.0, row_y(0)),
            w,
            head,
            font(Face::Bold),
            black(),
        );
    }
    c.line(
        &[(left, row_y(0) - 1.5), (right, row_y(0) - 1.5)],
        0.5,
        black(),
        None,
    );
    for (i, row) in rows.iter().enumerate() {
        for (j, cell) in row.iter().enumerate() {
            let w = cols[j + 1] - cols[j] - 2.0;
            c.cell(
                cells,
                (cols[j] + 1.0, row_y(i + 1)),
                w,
                cell,
                font(Face::Regular),
                black(),
            );
        }
    }
}
