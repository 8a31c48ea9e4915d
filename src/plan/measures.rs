//! What a plan does to lots of a given quality: OC, AOQ, ATI, ASN, and the
//! AOQL and indifference quality of the whole curve.

use serde::Serialize;

use crate::model::Model;
use crate::plan::oc::{lane_outcomes, outcomes_at};
use crate::plan::searches::{self, LOOKAHEAD};
use crate::plan::{StageOutcomes, StagedPlan, stage_outcomes};

/// The measures of a plan at one quality.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Measures {
    /// The quality `p` asked for.
    pub quality: f64,
    /// Hypergeometric model: the number of nonconforming units
    /// `D = round(p N)` that a lot of quality `p` holds; `None` otherwise.
    pub lot_nonconforming: Option<u64>,
    /// Hypergeometric model: the lot's own quality `D / N`, at which every
    /// measure below is computed; `None` otherwise (the measures are at
    /// `p`).
    pub lot_quality: Option<f64>,
    /// Probability of acceptance `Pa(p)`.
    pub pa: f64,
    /// Average outgoing quality under rectifying inspection (rejected lots
    /// screened 100%, nonconforming units found replaced).
    pub aoq: f64,
    /// Average total inspection per lot; needs the lot size.
    pub ati: Option<f64>,
    /// Average sample number without curtailment.
    pub asn: f64,
    /// Average sample number with full curtailment: units inspected one at
    /// a time, inspection stopping as soon as the decision is certain (for
    /// the Poisson model only rejection can be certain early).
    pub asn_curtailed: Option<f64>,
}

/// The measures of `plan` at quality `p`; under the hypergeometric model at
/// the lot's quality `D / N` ([`Model::lot_quality`]), which the result
/// carries beside `p`.
///
/// With `a_j` the probability of acceptance at stage `j` and `n_j` the
/// cumulative sample size, lot size `N`:
///
/// ```text
/// Pa  = sum_j a_j
/// AOQ = sum_j a_j p (N - n_j) / N        (without a lot size: Pa p)
/// ATI = sum_j a_j n_j + (1 - Pa) N
/// ASN = sum_j (a_j + r_j) n_j
/// ```
///
/// For a single plan these are the textbook `AOQ = Pa p (N - n) / N` and
/// `ATI = n + (1 - Pa)(N - n)` (Montgomery, *Introduction to Statistical
/// Quality Control*, the chapter on lot-by-lot acceptance sampling for
/// attributes, from memory).
pub fn measures(plan: &StagedPlan, model: &Model, asked: f64) -> Measures {
    measures_and_outcomes(plan, model, asked).0
}

/// [`measures`] and the stage outcomes of the walk they come from (at the
/// lot quality under the hypergeometric model, which has the same count
/// `D` as `asked`), for an evaluation that also reports when lots are
/// decided.
pub(crate) fn measures_and_outcomes(
    plan: &StagedPlan,
    model: &Model,
    asked: f64,
) -> (Measures, StageOutcomes) {
    let [point] = lane_measures(plan, model, [asked]);
    point
}

/// [`measures_and_outcomes`] at `L` qualities, walked side by side in the
/// lanes of one walk; each lane's numbers are those of its own walk.
pub(crate) fn lane_measures<const L: usize>(
    plan: &StagedPlan,
    model: &Model,
    asked: [f64; L],
) -> [(Measures, StageOutcomes); L] {
    let ps = asked.map(|q| model.lot_quality(q));
    let mut outcomes = lane_outcomes(plan, model, ps, true).into_iter();
    std::array::from_fn(|lane| {
        let outcomes = outcomes.next().unwrap_or_else(|| StageOutcomes {
            accept: Vec::new(),
            reject: Vec::new(),
            curtailed_units: None,
        });
        let point = measures_from(plan, model, asked[lane], ps[lane], &outcomes);
        (point, outcomes)
    })
}

/// The measures at the asked quality `asked` from the stage outcomes at its
/// lot quality `p`.
fn measures_from(
    plan: &StagedPlan,
    model: &Model,
    asked: f64,
    p: f64,
    outcomes: &StageOutcomes,
) -> Measures {
    let stages = plan.stages();
    let asn = stages
        .iter()
        .zip(outcomes.accept.iter().zip(&outcomes.reject))
        .map(|(s, (a, r))| (a + r) * s.n as f64)
        .sum();
    let ati = model.lot_size().map(|lot| {
        let inspected: f64 = stages
            .iter()
            .zip(&outcomes.accept)
            .map(|(s, a)| a * s.n as f64)
            .sum();
        inspected + (1.0 - outcomes.pa()) * lot as f64
    });
    let lot_nonconforming = model.nonconforming_in_lot(asked);
    Measures {
        quality: asked,
        lot_nonconforming,
        lot_quality: lot_nonconforming.map(|_| p),
        pa: outcomes.pa(),
        aoq: aoq_from(outcomes, plan, model, p),
        ati,
        asn,
        asn_curtailed: outcomes.curtailed_units,
    }
}

/// AOQ from the stage outcomes: `sum_j a_j p (N - n_j) / N`, or `Pa p`
/// without a lot size.
fn aoq_from(outcomes: &StageOutcomes, plan: &StagedPlan, model: &Model, p: f64) -> f64 {
    match model.lot_size() {
        Some(lot) => {
            let big_n = lot as f64;
            let outgoing: f64 = plan
                .stages()
                .iter()
                .zip(&outcomes.accept)
                .map(|(s, a)| a * (big_n - s.n as f64) / big_n)
                .sum();
            outgoing * p
        }
        None => outcomes.pa() * p,
    }
}

/// The AOQ of `plan` at quality `p` (at the lot quality `D / N` under the
/// hypergeometric model, as [`measures`]), without the other measures (the
/// AOQL search evaluates it a hundred times per curve).
pub fn average_outgoing_quality(plan: &StagedPlan, model: &Model, p: f64) -> f64 {
    let p = model.lot_quality(p);
    aoq_from(&stage_outcomes(plan, model, p), plan, model, p)
}

/// The probability of acceptance of `plan` at quality `p`.
pub fn acceptance_probability(plan: &StagedPlan, model: &Model, p: f64) -> f64 {
    // A single plan's OC is one tail; skip the stage bookkeeping, which the
    // curve searches would otherwise pay a thousand times per curve.
    if let Some((n, c)) = plan.as_single() {
        return model.tails(n, c, p, 0, 0).cdf;
    }
    stage_outcomes(plan, model, p).pa()
}

/// The average outgoing quality limit: the largest AOQ over all qualities.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Aoql {
    /// The AOQL.
    pub value: f64,
    /// The quality at which AOQ reaches it.
    pub quality: f64,
}

/// The AOQL of `plan` and the quality where it occurs.
///
/// See [`curve_maximum`](crate::curve_maximum) for the search.
pub fn aoql(plan: &StagedPlan, model: &Model) -> Aoql {
    let aoqs = |asked: &[f64]| {
        let ps: Vec<f64> = asked.iter().map(|&q| model.lot_quality(q)).collect();
        outcomes_at(plan, model, &ps)
            .iter()
            .zip(&ps)
            .map(|(o, &p)| aoq_from(o, plan, model, p))
            .collect()
    };
    let (quality, value) = searches::curve_maximum_of(plan, model, &aoqs, LOOKAHEAD);
    Aoql { value, quality }
}

/// The largest average sample number of `plan` over all qualities, and the
/// quality where it occurs (`(quality, asn)`), by [`curve_maximum`](crate::curve_maximum).
pub fn largest_asn(plan: &StagedPlan, model: &Model) -> (f64, f64) {
    let stages = plan.stages();
    let asns = |ps: &[f64]| {
        outcomes_at(plan, model, ps)
            .iter()
            .map(|o| {
                stages
                    .iter()
                    .zip(o.decided())
                    .map(|(s, share)| share * s.n as f64)
                    .sum()
            })
            .collect()
    };
    searches::curve_maximum_of(plan, model, &asns, LOOKAHEAD)
}

/// The indifference quality: where `Pa = 0.5`.
///
/// See [`quality_at_pa`](crate::quality_at_pa), of which it is the case
/// `target = 0.5`.
pub fn indifference_quality(plan: &StagedPlan, model: &Model) -> f64 {
    quality_at_pa(plan, model, 0.5)
}

/// The quality at which the OC falls to `target` (`0 < target < 1`).
///
/// `Pa` falls as `p` rises, so bisection on `p` finds it to a relative
/// width of `1e-13`; for the hypergeometric model it is the smallest lot
/// quality `D / N` with `Pa <= target`. The bisection walks the qualities
/// of its next three steps side by side.
pub fn quality_at_pa(plan: &StagedPlan, model: &Model, target: f64) -> f64 {
    let reached = |ps: &[f64]| {
        searches::acceptance_probabilities(plan, model, ps)
            .into_iter()
            .map(|pa| pa <= target)
            .collect()
    };
    searches::quality_where(plan, model, &reached)
}
