//! What the plan on a page was agreed on, with what the printed plan
//! achieves there, computed from the plan: the risk table and the OC
//! chart's marks print these, so they always belong to the plan on the
//! page.

use super::chart::marks::Mark;
use super::wording::sheet::quality;
use crate::design::{Protection, RectifyingPlan, RectifyingRequest};
use crate::model::Model;
use crate::model::RiskPair;
use crate::plan::{StagedPlan, acceptance_probability};
use crate::source::attributes_risks;

/// What a plan was agreed on.
pub enum Agreement {
    /// Two risk points, and the producer's and consumer's risks the plan
    /// achieves at them.
    Points {
        /// The agreed points.
        risks: RiskPair,
        /// `(alpha, beta)` the plan achieves at them.
        achieved: (f64, f64),
    },
    /// A minimum-inspection plan's process average and protection, and
    /// what the plan does under rectifying inspection.
    Rectifying {
        /// The process average and the protection.
        request: RectifyingRequest,
        /// What the plan does under rectifying inspection.
        figures: Box<RectifyingPlan>,
    },
}

impl Agreement {
    /// The two risk points `risks`, with what `plan` achieves at them
    /// under `model`.
    pub fn points(plan: &StagedPlan, model: &Model, risks: RiskPair) -> Self {
        let achieved = attributes_risks(plan, model, &risks);
        Agreement::Points { risks, achieved }
    }

    /// The two qualities the curves and tables are drawn around: the
    /// producer's and consumer's, or the process average and the LTPD
    /// (for an AOQL protection, the plan's own, where `Pa` falls to 0.10).
    pub fn qualities(&self) -> (f64, f64) {
        match self {
            Agreement::Points { risks, .. } => (risks.producer().quality, risks.consumer().quality),
            Agreement::Rectifying { request, figures } => (
                request.process_average(),
                match request.protection() {
                    Protection::Ltpd(point) => point.quality,
                    Protection::Aoql(_) => figures.ltpd,
                },
            ),
        }
    }

    /// The two points as marks on an OC chart, at the Pa the printed plan
    /// achieves there: the risk points, or the process average and the
    /// LTPD (for an AOQL protection, the plan's own LTPD). Qualities per
    /// unit when `per_unit`.
    pub fn marks(&self, per_unit: bool) -> [Mark; 2] {
        let q = |v: f64| quality(v, per_unit);
        match self {
            Agreement::Points { risks, achieved } => {
                let (producer, consumer) = (risks.producer(), risks.consumer());
                let pa1 = 1.0 - achieved.0;
                let beta = achieved.1;
                [
                    point_mark("p₁", producer.quality, pa1, &q),
                    point_mark("p₂", consumer.quality, beta, &q),
                ]
            }
            Agreement::Rectifying { request, figures } => {
                let (average, ltpd) = self.qualities();
                let pa_ltpd = acceptance_probability(&figures.plan, request.model(), ltpd);
                [
                    point_mark("p̄", average, figures.pa, &q),
                    point_mark("LTPD", ltpd, pa_ltpd, &q),
                ]
            }
        }
    }
}

/// The mark of an agreed point `name` at `quality`, where the plan accepts
/// with probability `pa`: one line, or two stacked when room is short.
fn point_mark(name: &str, quality: f64, pa: f64, q: &dyn Fn(f64) -> String) -> Mark {
    Mark {
        x: quality,
        y: pa,
        label: format!("{name} = {}, Pa = {pa:.3}", q(quality)),
        stacked: Some([format!("{name} = {}", q(quality)), format!("Pa = {pa:.3}")]),
    }
}
