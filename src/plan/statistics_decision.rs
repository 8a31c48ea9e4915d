//! A variables plan's decision from the sample's statistics alone: the
//! number of readings `n`, their mean `xbar` and standard deviation `s`
//! (`n - 1` divisor). Under the normal model these are sufficient: the
//! decision depends on the readings only through them, so a lot recorded
//! with its `n`, `xbar` and `s` can be decided again without its file.
//!
//! ```text
//! one limit (k method):   Q_U = (U - xbar) / sigma   or   Q_L = (xbar - L) / sigma
//!                         accept when Q >= k
//! two limits (M method):  accept when p_hat_L + p_hat_U <= M
//! ```
//!
//! `sigma` is the known sigma of the plan, or `s`; the estimates
//! `p_hat` are those of the `estimate` module. (The k and M methods as
//! the variables procedures of MIL-STD-414 state them; from memory.)

use serde::Serialize;

use super::estimate::{fraction_beyond_known, fraction_beyond_unknown};
use super::judge::Decision;
use super::specification::LimitKind;
use super::variables::VariablesPlan;

/// The statistics of one side of the specification.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct SideStatistic {
    /// The limit.
    pub limit: f64,
    /// `(U - xbar) / sigma` or `(xbar - L) / sigma` (`s` for sigma).
    pub q: f64,
    /// The estimated fraction beyond the limit (MVU), where defined.
    pub estimate: Option<f64>,
}

/// What the statistics decide under a variables plan.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct StatisticsDecision {
    /// The sigma the statistics divide by (the known one, or `s`).
    pub sigma_used: f64,
    /// Against the lower limit.
    pub lower: Option<SideStatistic>,
    /// Against the upper limit.
    pub upper: Option<SideStatistic>,
    /// The estimated fraction nonconforming beyond both limits.
    pub estimate: Option<f64>,
    /// Accept or reject.
    pub decision: Decision,
    /// The rule applied, with its numbers.
    pub rule: String,
}

/// Decides a lot of `plan` from `n` readings of mean `mean` and standard
/// deviation `s` (see the module doc). The caller has checked `n >= 2`,
/// `s > 0` and both finite.
pub fn decide_from_statistics(
    plan: &VariablesPlan,
    n: u64,
    mean: f64,
    s: f64,
) -> StatisticsDecision {
    let spec = plan.spec();
    let sigma_used = spec.sigma().unwrap_or(s);
    let side = |limit: Option<f64>, sign: f64| {
        limit.map(|l| {
            let q = sign * (l - mean) / sigma_used;
            let estimate = match spec.sigma() {
                Some(_) => Some(fraction_beyond_known(q, n)),
                None if n >= 3 => Some(fraction_beyond_unknown(q, n)),
                None => None,
            };
            SideStatistic {
                limit: l,
                q,
                estimate,
            }
        })
    };
    let lower = side(spec.lower(), -1.0);
    let upper = side(spec.upper(), 1.0);
    let estimate = match (lower.map(|l| l.estimate), upper.map(|u| u.estimate)) {
        (Some(Some(a)), Some(Some(b))) => Some(a + b),
        (Some(Some(a)), None) | (None, Some(Some(a))) => Some(a),
        _ => None,
    };
    let verdict = |accept: bool| {
        if accept {
            Decision::Accept
        } else {
            Decision::Reject
        }
    };
    let (decision, rule) = match (plan.k(), plan.m()) {
        (Some(k), _) => {
            let (name, q) = match spec.limit() {
                LimitKind::Lower => ("Q_L", lower.map_or(f64::NAN, |l| l.q)),
                _ => ("Q_U", upper.map_or(f64::NAN, |u| u.q)),
            };
            let accept = q >= k;
            (
                verdict(accept),
                format!(
                    "{name} = {q:.4} {} k = {k}",
                    if accept { ">=" } else { "<" }
                ),
            )
        }
        (_, m) => {
            let m = m.unwrap_or(0.0);
            let p = estimate.unwrap_or(1.0);
            let accept = p <= m;
            (
                verdict(accept),
                format!(
                    "p_hat_L + p_hat_U = {:.4}% {} M = {:.4}%",
                    100.0 * p,
                    if accept { "<=" } else { ">" },
                    100.0 * m
                ),
            )
        }
    };
    StatisticsDecision {
        sigma_used,
        lower,
        upper,
        estimate,
        decision,
        rule,
    }
}
