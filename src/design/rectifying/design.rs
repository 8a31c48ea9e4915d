//! What a minimum-inspection design answers: the chosen plan with its
//! measures under rectifying inspection, and the single plans it was
//! chosen from.

use serde::Serialize;

use super::request::{Protection, RectifyingRequest};
use crate::plan::{Aoql, StagedPlan, acceptance_probability, aoql, measures, quality_at_pa};

/// For one acceptance number, the only single plan that can be best.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct RectifyingRow {
    /// Acceptance number.
    pub c: u64,
    /// `n_min(c)`: the smallest sample that gives the protection with this
    /// `c`, `None` when no sample within the lot does.
    pub n_min: Option<u64>,
    /// `ATI(p̄)` of `(n_min, c)`.
    pub ati: Option<f64>,
}

/// A sampling plan with what it does under rectifying inspection.
#[derive(Clone, Debug, PartialEq)]
pub struct RectifyingPlan {
    /// The plan.
    pub plan: StagedPlan,
    /// `Pa(p̄)`.
    pub pa: f64,
    /// `ATI(p̄)`, units inspected per lot on average.
    pub ati: f64,
    /// `ASN(p̄)`, units sampled per lot on average (before screening).
    pub asn: f64,
    /// The AOQL and the quality where the AOQ reaches it.
    pub aoql: Aoql,
    /// The LTPD: the quality at which `Pa` falls to the request's
    /// [`ltpd_risk`](RectifyingRequest::ltpd_risk) (for a finite lot the
    /// smallest lot quality `D / N` at or below it).
    pub ltpd: f64,
    /// For an LTPD protection, `Pa` at the agreed LTPD (the consumer's risk
    /// achieved).
    pub pa_at_ltpd: Option<f64>,
}

impl RectifyingPlan {
    /// `plan` with its measures for `request`, from the exact recursion.
    pub(crate) fn new(plan: StagedPlan, request: &RectifyingRequest) -> Self {
        let model = request.model();
        let at = measures(&plan, model, request.process_average());
        RectifyingPlan {
            pa: at.pa,
            // The request always has a lot size, so the ATI is always there.
            ati: at.ati.unwrap_or(f64::NAN),
            asn: at.asn,
            aoql: aoql(&plan, model),
            ltpd: quality_at_pa(&plan, model, request.ltpd_risk()),
            pa_at_ltpd: match request.protection() {
                Protection::Ltpd(point) => {
                    Some(acceptance_probability(&plan, model, point.quality))
                }
                Protection::Aoql(_) => None,
            },
            plan,
        }
    }
}

/// A minimum-inspection design.
#[derive(Clone, Debug, PartialEq)]
pub struct RectifyingDesign {
    /// The request it answers.
    pub request: RectifyingRequest,
    /// The plan of the requested scheme with the smallest `ATI(p̄)`; `None`
    /// when 100% inspection is the best or the only answer.
    pub plan: Option<RectifyingPlan>,
    /// Double requests: the best single plan, for comparison (`None` when
    /// 100% inspection beats every single plan).
    pub single: Option<RectifyingPlan>,
    /// The single search, one row per acceptance number from 0 to the one
    /// at which the scan stopped.
    pub rows: Vec<RectifyingRow>,
}
