//! The sequential designer: Wald's sequential probability ratio test for a
//! proportion (binomial, and the hypergeometric lot read as one) or for a
//! Poisson rate, item by item, truncated where the exact plan still meets
//! both risk points.
//!
//! # The lines
//!
//! With `A = (1 - beta) / alpha` and `B = beta / (1 - alpha)`, the test
//! goes on while `ln B < ln L_n < ln A`, where `L_n` is the likelihood
//! ratio of `p2` against `p1` after `n` items. For `d` nonconforming in `n`
//! items that is the band between two parallel lines:
//!
//! ```text
//! proportion:  G = ln(p2 / p1) + ln((1 - p1) / (1 - p2)),  slope = ln((1 - p1) / (1 - p2)) / G
//! rate:        G = ln(p2 / p1),                            slope = (p2 - p1) / G
//! h_accept = ln((1 - alpha) / beta) / G,   h_reject = ln((1 - beta) / alpha) / G
//! ```
//!
//! Source: A. Wald, *Sequential Analysis* (1947), ch. 5; by the
//! Neyman-Pearson lemma the likelihood-ratio band is the test to build the
//! plan from.
//!
//! # The truncation
//!
//! Wald's test ends with probability one but has no largest sample, and an
//! inspector needs one. The designer closes the plan at the first item
//! `n_t` at which some final acceptance number `a_t` (accept `d <= a_t`,
//! reject above; `a_t` between the two lines' numbers at `n_t`) makes the
//! exact truncated plan meet both agreed risk points; among those `a_t` it
//! takes the one with the smaller `max(alpha_achieved / alpha,
//! beta_achieved / beta)`, then the smaller. The search starts at the
//! first item and ends at `4 n_s`, four times the single plan's sample
//! (truncating a sequential plan at three to four times the single sample
//! is common practice). A plan that inspects at most `n` items is a test on
//! `n` items, and by the Neyman-Pearson lemma no such test beats the
//! likelihood-ratio test on the count, randomised at its boundary; so the
//! truncation cannot fall much below `n_s`, and in every case of the
//! reference fixture it lies between 1.1 and 1.7 times `n_s`.
//!
//! Wald's bounds allow the untruncated test risks up to `alpha / (1 -
//! beta)` and `beta / (1 - alpha)`, so for close points no truncation of
//! the lines meets the agreed risks. The designer then builds the lines
//! from smaller nominal risks, `s alpha` and `s beta` for
//! `s = 0.95, 0.90, ..., 0.50`, and takes the first `s` that has a
//! truncation in the window; the report gives the nominal risks used.
//!
//! The exact risks come from the staged-plan recursion carried item by item
//! (one walk with a lane per risk point, each closing tried on it), so
//! every candidate costs one item step.

use serde::Serialize;

use super::request::Design;
use super::single::design_single;
use super::work::sequential_work;
use crate::design::DesignError;
use crate::model::RiskPair;
use crate::model::{Model, ModelKind};
use crate::plan::{MAX_ITEMS, SequentialLines, Stage, StagedPlan, Walk};

/// Wald's approximations to the average sample number of the untruncated
/// test, for comparison with the exact figures of the truncated plan.
///
/// ```text
/// ASN(p1) ~ ((1 - alpha) ln B + alpha ln A) / E_p1[z]
/// ASN(p2) ~ (beta ln B + (1 - beta) ln A) / E_p2[z]
/// largest ~ h_accept h_reject / (slope (1 - slope))   (rate: / slope), at p = slope
/// ```
///
/// where `z` is one item's log-likelihood ratio (Wald 1947, ch. 3 and 5).
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct WaldApproximation {
    /// The producer's risk the lines were built from.
    pub nominal_alpha: f64,
    /// The consumer's risk the lines were built from.
    pub nominal_beta: f64,
    /// Approximate ASN at the AQL.
    pub asn_aql: f64,
    /// Approximate ASN at the RQL.
    pub asn_rql: f64,
    /// Approximate largest ASN (at the quality equal to the slope).
    pub asn_max: f64,
}

/// Wald's lines for the two risk points: `(h_accept, h_reject, slope)`.
pub fn wald_lines(model: &Model, risks: &RiskPair) -> (f64, f64, f64) {
    let (pr, co) = (risks.producer(), risks.consumer());
    lines_for(model, pr.quality, pr.risk, co.quality, co.risk)
}

/// `ln(a / b)` for `a, b > 0`: the logarithm of the quotient where the
/// quotient is a finite double, else the difference of the logarithms (a
/// subnormal quality of `1e-310`, or a risk of `1e-310`, makes `1 / b`
/// overflow, and `ln(inf)` would turn the lines into NaN).
fn ln_ratio(a: f64, b: f64) -> f64 {
    let r = a / b;
    if r.is_finite() && r > 0.0 {
        r.ln()
    } else {
        a.ln() - b.ln()
    }
}

/// Wald's lines for `p1`, `p2` built from the nominal risks `alpha`, `beta`.
fn lines_for(model: &Model, p1: f64, alpha: f64, p2: f64, beta: f64) -> (f64, f64, f64) {
    let (g, slope) = match model.kind() {
        ModelKind::Poisson => {
            let g = ln_ratio(p2, p1);
            (g, (p2 - p1) / g)
        }
        _ => {
            let g1 = ln_ratio(p2, p1);
            let g2 = ((1.0 - p1) / (1.0 - p2)).ln();
            let g = g1 + g2;
            (g, g2 / g)
        }
    };
    (
        ln_ratio(1.0 - alpha, beta) / g,
        ln_ratio(1.0 - beta, alpha) / g,
        slope,
    )
}

fn wald_approximation(model: &Model, p1: f64, alpha: f64, p2: f64, beta: f64) -> WaldApproximation {
    let (h_accept, h_reject, slope) = lines_for(model, p1, alpha, p2, beta);
    let (ln_a, ln_b) = (ln_ratio(1.0 - beta, alpha), ln_ratio(beta, 1.0 - alpha));
    let drift = |p: f64| match model.kind() {
        ModelKind::Poisson => p * ln_ratio(p2, p1) - (p2 - p1),
        _ => p * ln_ratio(p2, p1) + (1.0 - p) * ((1.0 - p2) / (1.0 - p1)).ln(),
    };
    let asn_max = match model.kind() {
        ModelKind::Poisson => h_accept * h_reject / slope,
        _ => h_accept * h_reject / (slope * (1.0 - slope)),
    };
    WaldApproximation {
        nominal_alpha: alpha,
        nominal_beta: beta,
        asn_aql: ((1.0 - alpha) * ln_b + alpha * ln_a) / drift(p1),
        asn_rql: (beta * ln_b + (1.0 - beta) * ln_a) / drift(p2),
        asn_max,
    }
}

/// The scales tried on the nominal risks, in order (see the module
/// documentation).
const NOMINAL_SCALES: [f64; 11] = [1.0, 0.95, 0.9, 0.85, 0.8, 0.75, 0.7, 0.65, 0.6, 0.55, 0.5];

/// The truncation window, in multiples of the single plan's sample size.
const TRUNCATION_WINDOW: u64 = 4;

/// Designs the truncated sequential plan for the two risk points (see the
/// module documentation), with Wald's approximations beside it.
///
/// # Errors
/// As [`design_single`] for points without a single plan;
/// [`DesignError::BeyondCap`] when the truncation would pass [`MAX_ITEMS`]
/// items; [`DesignError::OverBudget`] when the truncation search's
/// estimated work ([`sequential_work`](crate::sequential_work)) passes the
/// budget;
/// [`DesignError::NoPlan`] when the lines close before the exact plan meets
/// both points.
///
/// # Example
/// ```
/// use lotsman::{design_sequential, Model, ModelKind, RiskPair, RiskPoint};
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// let risks = RiskPair::new(
///     RiskPoint { quality: 0.01, risk: 0.05 },
///     RiskPoint { quality: 0.06, risk: 0.10 },
///     &model,
/// ).unwrap();
/// let (d, wald) = design_sequential(&model, &risks).unwrap();
/// assert!(d.producer_risk <= 0.05 && d.consumer_risk <= 0.10);
/// assert_eq!(d.plan.sequential_lines().unwrap().truncation, 140); // single plan: n = 110
/// assert!(wald.asn_aql < 110.0);
/// ```
pub fn design_sequential(
    model: &Model,
    risks: &RiskPair,
) -> Result<(Design, WaldApproximation), DesignError> {
    let single = design_single(model, risks)?;
    let (pr, co) = (risks.producer(), risks.consumer());
    let limit = MAX_ITEMS.min(model.max_sample());
    if single.n > limit {
        return Err(DesignError::BeyondCap {
            what: "a truncation".to_string(),
            cap: format!("{limit} items"),
        });
    }
    sequential_work(model, single.n as f64, single.c).check(
        &format!(
            "the sequential plan's truncation search around the single plan n = {}, c = {} ({})",
            single.n,
            single.c,
            model.described()
        ),
        "use the single plan, or points further apart",
    )?;
    let last = (TRUNCATION_WINDOW * single.n).min(limit);
    for scale in NOMINAL_SCALES {
        let (alpha, beta) = (scale * pr.risk, scale * co.risk);
        let (h_accept, h_reject, slope) = lines_for(model, pr.quality, alpha, co.quality, beta);
        let lines = SequentialLines {
            h_accept,
            h_reject,
            slope,
            truncation: 1,
            final_acceptance: 0,
        };
        if let Some(plan) = truncate(model, risks, lines, last)? {
            let design = Design::exact(plan, model, risks);
            let wald = wald_approximation(model, pr.quality, alpha, co.quality, beta);
            return Ok((design, wald));
        }
    }
    Err(DesignError::NoPlan {
        reason: format!(
            "no truncation up to {last} items of Wald's lines, even from half the agreed risks, meets both points"
        ),
        suggestion: "use a single or double plan".to_string(),
    })
}

/// The first item up to `last` at which closing `lines` meets both risk
/// points, as the plan closed there; `None` when there is none.
fn truncate(
    model: &Model,
    risks: &RiskPair,
    lines: SequentialLines,
    last: u64,
) -> Result<Option<StagedPlan>, DesignError> {
    let (pr, co) = (risks.producer(), risks.consumer());
    let (alpha, beta) = (pr.risk, co.risk);
    // Lots at p1 (lane 0) and p2 (lane 1), walked side by side.
    let mut walk = Walk::lanes(model, [pr.quality, co.quality], false);
    let (mut rejected_p1, mut accepted_p2) = (0.0, 0.0);
    let unit = model.kind() != ModelKind::Poisson;
    for n in 1..=last {
        let accept = lines.acceptance_number(n);
        let reject = lines.rejection_number(n);
        // Risks already spent cannot be won back: no later closing helps.
        if rejected_p1 > alpha || accepted_p2 > beta {
            return Ok(None);
        }
        {
            let mut best: Option<(f64, u64)> = None;
            for a_t in accept.unwrap_or(0)..reject {
                if unit && a_t >= n {
                    break;
                }
                let close = Stage {
                    n,
                    accept: Some(a_t),
                    reject: a_t + 1,
                };
                let [at_p1, at_p2] = walk.closings(&close);
                let producer = rejected_p1 + at_p1.reject;
                let consumer = accepted_p2 + at_p2.accept;
                if producer <= alpha && consumer <= beta {
                    let margin = (producer / alpha).max(consumer / beta);
                    if best.is_none_or(|(m, _)| margin < m) {
                        best = Some((margin, a_t));
                    }
                }
            }
            if let Some((_, a_t)) = best {
                let closed = SequentialLines {
                    truncation: n,
                    final_acceptance: a_t,
                    ..lines
                };
                return StagedPlan::sequential(closed, model)
                    .map(Some)
                    .map_err(|e| DesignError::NoPlan {
                        reason: e.to_string(),
                        suggestion: "use a single or double plan".to_string(),
                    });
            }
        }
        if accept.map_or(0, |a| a + 1) + 1 > reject {
            // The lines leave no count open: the plan cannot go on.
            return Ok(None);
        }
        let stage = Stage { n, accept, reject };
        let [at_p1, at_p2] = walk.steps(&stage);
        rejected_p1 += at_p1.reject;
        accepted_p2 += at_p2.accept;
    }
    Ok(None)
}
