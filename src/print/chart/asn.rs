//! The ASN chart of an attributes plan: the average sample number
//! against lot quality, with the single plan's sample size for the same
//! points as a dashed reference, and the ASN at the producer's point and
//! the largest ASN marked.

use super::axes::{Axes, frame};
use super::guides::horizontal_guide;
use super::marks::{Keep, Mark, marks};
use super::plot::Plot;
use super::scale::{nice_ceiling, plain_tick, quality_tick};
use super::subject::{Curves, Subject};
use crate::design::design_single;
use crate::plan::{largest_asn, measures};
use crate::print::agreement::Agreement;
use crate::print::canvas::Canvas;
use crate::print::geometry::{Corners, Rect};
use crate::print::palette::PLAN;
use crate::print::wording::sheet;

/// The ASN curve of `s` in `area`.
pub fn asn_chart(c: &mut Canvas, s: &Subject, curves: &Curves, area: Rect) {
    let asn = curves.of(|pt| pt.asn);
    let p1 = s.agreement.qualities().0;
    let at_p1 = measures(s.plan, s.model, p1).asn;
    let (q_max, asn_max) = largest_asn(s.plan, s.model);
    let single_n = match s.agreement {
        Agreement::Points { risks, .. } => design_single(s.model, risks).ok().map(|d| d.n),
        Agreement::Rectifying { .. } => None,
    };
    let top_value = single_n.map_or(asn_max, |n| asn_max.max(n as f64));
    let y_max = nice_ceiling(top_value * 1.15);
    let x_max = curves.x_max;
    let axis = quality_tick(s.per_unit);
    let plot = Plot::new(area, x_max, y_max);
    frame(
        c,
        "ASN chart",
        &plot,
        &Axes {
            title: sheet::ASN_TITLE,
            x_label: sheet::quality_axis(s.per_unit),
            y_label: sheet::ASN_AXIS,
            x_max,
            y_max,
            x_tick: &axis,
            y_tick: &plain_tick,
            x_step: None,
            y_step: None,
        },
    );
    let avoid: Vec<Corners> = single_n
        .iter()
        .map(|&n| horizontal_guide(c, &plot, n as f64, &sheet::single_reference(n)))
        .collect();
    plot.curve(c, &asn, 1.3, PLAN, None);
    let marks_ = [
        Mark {
            x: p1,
            y: at_p1,
            label: sheet::asn_at_p1(at_p1).join(" "),
            stacked: Some(sheet::asn_at_p1(at_p1)),
        },
        Mark {
            x: q_max,
            y: asn_max,
            label: sheet::largest_asn(asn_max, &s.q(q_max)).join(" "),
            stacked: Some(sheet::largest_asn(asn_max, &s.q(q_max))),
        },
    ];
    let keep = Keep {
        guide_x: None,
        guide_y: single_n.map(|n| plot.sy(n as f64)),
        curves: &[&asn],
        labels: &avoid,
    };
    marks(c, &plot, &marks_, &keep);
}
