//! The evaluation of a variables plan over a set of qualities: OC, AOQ and
//! ATI per quality, and the curve's AOQL and indifference quality.
//!
//! A variables plan inspects `n` units whatever the lot, so `ASN = n`, and
//! under rectifying inspection (rejected lots screened, nonconforming units
//! replaced), lot size `N`:
//!
//! ```text
//! AOQ = Pa p (N - n) / N        (without a lot size: Pa p)
//! ATI = n + (1 - Pa) (N - n)
//! ```
//!
//! For two limits with sigma unknown, `Pa` here is the one-sided
//! configuration (the one the OC convention of one-limit plans shares);
//! the centred configuration is reported beside it.

use serde::Serialize;

use super::evaluation::bracketing_qualities;
use super::measures::Aoql;
use super::searches::{bisect_quality, smooth_maximum};
use super::variables::VariablesPlan;
use super::work::{evaluation_advice_for, most_variables_qualities, variables_evaluation_work};
use crate::input::InputError;
use crate::model::RiskPair;

/// The measures of a variables plan at one quality.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct VariablesPoint {
    /// The quality `p` (fraction beyond the limits).
    pub quality: f64,
    /// `Pa(p)`.
    pub pa: f64,
    /// Two limits, sigma unknown: `Pa(p)` with the mean centred.
    pub pa_centred: Option<f64>,
    /// Average outgoing quality under rectifying inspection.
    pub aoq: f64,
    /// Average total inspection per lot; needs the lot size.
    pub ati: Option<f64>,
}

/// A variables plan evaluated at a list of qualities.
#[derive(Clone, Debug, PartialEq)]
pub struct VariablesEvaluation {
    /// The plan.
    pub plan: VariablesPlan,
    /// The lot size, where known.
    pub lot_size: Option<u64>,
    /// The measures at each quality, in the order asked.
    pub points: Vec<VariablesPoint>,
    /// The AOQL and where it occurs.
    pub aoql: Aoql,
    /// The quality at which `Pa = 0.5`.
    pub indifference_quality: f64,
}

/// The measures of `plan` at `p`.
pub fn variables_point(plan: &VariablesPlan, lot_size: Option<u64>, p: f64) -> VariablesPoint {
    let pa = plan.pa(p);
    let n = plan.n() as f64;
    let (aoq, ati) = match lot_size {
        Some(lot) => {
            let big_n = lot as f64;
            (
                pa * p * (big_n - n).max(0.0) / big_n,
                Some(n + (1.0 - pa) * (big_n - n).max(0.0)),
            )
        }
        None => (pa * p, None),
    };
    VariablesPoint {
        quality: p,
        pa,
        pa_centred: plan.pa_centred(p),
        aoq,
        ati,
    }
}

/// Evaluates `plan` at `qualities`.
///
/// # Errors
/// [`InputError::OutOfRange`] for a quality outside
/// `(lowest_quality, 1)`, the fractions a process can have under the
/// specification; [`InputError::OverBudget`] when the evaluation's
/// estimated work passes the budget.
pub fn evaluate_variables(
    plan: &VariablesPlan,
    lot_size: Option<u64>,
    qualities: &[f64],
) -> Result<VariablesEvaluation, InputError> {
    let lowest = plan.spec().lowest_quality();
    for &q in qualities {
        if !(q > lowest && q < 1.0) {
            let range = if lowest > 0.0 {
                format!("between {lowest:.6} (a centred process with this sigma) and 1 (exclusive)")
            } else {
                "between 0 and 1 (exclusive)".to_string()
            };
            return Err(InputError::out_of_range("quality", q, &range));
        }
    }
    variables_evaluation_work(plan.spec(), qualities.len()).check(
        &format!(
            "evaluating the variables plan {plan} at {} qualities",
            qualities.len()
        ),
        &evaluation_advice_for(most_variables_qualities(plan.spec()), false),
    )?;
    let ceiling = quality_ceiling(plan);
    let aoq = |p: f64| variables_point(plan, lot_size, p).aoq;
    // Each point costs its own integrals: the searches ask for one at a
    // time.
    let aoqs = |ps: &[f64]| ps.iter().map(|&p| aoq(p)).collect();
    let quality = smooth_maximum(&aoqs, lowest, ceiling, 1);
    let reached = |ps: &[f64]| ps.iter().map(|&p| plan.pa(p) <= 0.5).collect();
    let indifference = bisect_quality(&reached, lowest, ceiling, 1);
    Ok(VariablesEvaluation {
        plan: plan.clone(),
        lot_size,
        points: qualities
            .iter()
            .map(|&q| variables_point(plan, lot_size, q))
            .collect(),
        aoql: Aoql {
            value: aoq(quality),
            quality,
        },
        indifference_quality: indifference,
    })
}

/// The quality above which `Pa < 1e-12` (doubling from `1e-4`, at most
/// 0.999).
fn quality_ceiling(plan: &VariablesPlan) -> f64 {
    let mut p = (plan.spec().lowest_quality() * 2.0).max(1e-4);
    while plan.pa(p) > 1e-12 && p < 0.999 {
        p = (2.0 * p).min(0.999);
    }
    p
}

/// Qualities for an OC table of a variables plan: the eight that bracket
/// the risk points, kept above the specification's lowest quality and
/// below 1.
pub fn variables_qualities(plan: &VariablesPlan, risks: &RiskPair) -> Vec<f64> {
    let lowest = plan.spec().lowest_quality();
    bracketing_qualities(risks)
        .into_iter()
        .filter(|&q| q > lowest && q < 1.0)
        .collect()
}
