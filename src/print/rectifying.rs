//! The blocks of a minimum-inspection plan's sheet (`scheme: rectifying`)
//! that differ from a plan designed from two risk points: the table of the
//! agreed protection against what the plan achieves, and the OC chart's
//! marks at the process average and the LTPD. The rest of the page is the
//! single or staged layout, with the rectifying procedure (a rejected lot
//! is screened) and, for a double plan, the AOQ chart beside the OC.

use super::Common;
use super::canvas::Canvas;
use super::chart::Mark;
use super::draw::{Face, Font, grey};
use super::geometry::Rect;
use crate::design::{Protection, RectifyingPlan, RectifyingRequest};
use crate::plan::acceptance_probability;
use crate::report::format_significant;

/// The protection table: the process average with the ATI there, and the
/// LTPD with the consumer's risk achieved, or the AOQL with the plan's.
#[allow(clippy::too_many_arguments)]
pub(super) fn protection_table(
    c: &mut Canvas,
    f: &Common,
    (request, figures): (&RectifyingRequest, &RectifyingPlan),
    left: f64,
    top: f64,
    width: f64,
    h: f64,
) {
    let right = left + width;
    let black = || grey(0.0);
    c.claim("protection", Rect::new(left, top - h, width, h));
    c.heading(
        left,
        top - 3.5,
        &format!(
            "AGREED PROTECTION AND WHAT THIS PLAN ACHIEVES UNDER RECTIFYING INSPECTION ({} MODEL)",
            request.model().kind().name().to_uppercase()
        ),
    );
    let cols = [left, left + 52.0, left + 84.0, left + 128.0, right];
    let row_y = |i: usize| top - 8.5 - 5.0 * i as f64;
    let heads = [
        "Point",
        super::sheet_words::quality_head(f.per_unit),
        "Agreed",
        "Achieved by this plan",
    ];
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
    let rows = [
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
    ];
    for (i, head) in heads.iter().enumerate() {
        let w = cols[i + 1] - cols[i] - 2.0;
        c.cell(
            "protection table",
            (cols[i] + 1.0, row_y(0)),
            w,
            head,
            Font {
                face: Face::Bold,
                size: 7.5,
            },
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
                "protection table",
                (cols[j] + 1.0, row_y(i + 1)),
                w,
                cell,
                Font {
                    face: Face::Regular,
                    size: 7.5,
                },
                black(),
            );
        }
    }
}

/// The OC chart's marks: the process average and the LTPD (for an AOQL
/// protection, the plan's own LTPD, where `Pa` falls to 0.10), each at the
/// `Pa` the printed plan has there.
pub(super) fn marks(
    f: &Common,
    request: &RectifyingRequest,
    figures: &RectifyingPlan,
) -> [Mark; 2] {
    let (average, ltpd) = f.agreement.qualities();
    let pa_ltpd = acceptance_probability(&figures.plan, request.model(), ltpd);
    let mark = |name: &str, x: f64, pa: f64| Mark {
        x,
        y: pa,
        label: format!("{name} = {}, Pa = {pa:.3}", f.q(x)),
        stacked: Some([format!("{name} = {}", f.q(x)), format!("Pa = {pa:.3}")]),
    };
    [mark("p̄", average, figures.pa), mark("LTPD", ltpd, pa_ltpd)]
}
