//! The parts several reports share: a risk point with the risk a plan
//! achieves there, the single plan beside a staged one, the sequential
//! lines, and a variables plan with its specification and rule.

use serde::Serialize;

use crate::design::WaldApproximation;
use crate::model::RiskPair;
use crate::numeric::{Short, format_quality, format_significant, near_limit};
use crate::plan::{ItemRun, LimitKind, SequentialLines, SigmaKind, VariablesPlan};

/// A risk point with the risk the plan achieves there.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct PointReport {
    /// The agreed quality.
    pub quality: f64,
    /// The agreed largest risk.
    pub risk: f64,
    /// The risk the plan really has at that quality.
    pub achieved_risk: f64,
    /// Whether the achieved risk lies within `1e-9` (relative) of the
    /// agreed one ([`NEAR_LIMIT`](crate::NEAR_LIMIT)): the plan meets the
    /// point by less than the computation can vouch for.
    pub near_limit: bool,
}

impl PointReport {
    /// The point `(quality, risk)` and the risk a plan achieves there.
    pub fn new(quality: f64, risk: f64, achieved_risk: f64) -> Self {
        PointReport {
            quality,
            risk,
            achieved_risk,
            near_limit: near_limit(achieved_risk, risk),
        }
    }
}

/// The producer's and consumer's points of `risks` with the risks a design
/// achieves there, `(producer's, consumer's)`; a note is added to `notes`
/// for each achieved risk that sits on its limit.
pub(crate) fn achieved_points(
    risks: &RiskPair,
    (producer_risk, consumer_risk): (f64, f64),
    notes: &mut Vec<String>,
) -> (PointReport, PointReport) {
    let (p, c) = (risks.producer(), risks.consumer());
    let producer = PointReport::new(p.quality, p.risk, producer_risk);
    let consumer = PointReport::new(c.quality, c.risk, consumer_risk);
    for (side, greek, point) in [
        ("producer's", "alpha", &producer),
        ("consumer's", "beta", &consumer),
    ] {
        if point.near_limit {
            notes.push(format!(
                "the achieved {side} risk {} lies within 1e-9 of {greek} = {}: the plan meets the point only at the limit of the computation's precision; a plan one step larger keeps a margin",
                Short(point.achieved_risk),
                Short(point.risk)
            ));
        }
    }
    (producer, consumer)
}

/// The single plan beside a staged one.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct SinglePlanReport {
    /// Sample size.
    pub n: u64,
    /// Acceptance number.
    pub c: u64,
}

/// The sequential part of a design report.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SequentialReport {
    /// Intercept of the acceptance line.
    pub h_accept: f64,
    /// Intercept of the rejection line.
    pub h_reject: f64,
    /// Slope of both lines.
    pub slope: f64,
    /// Last item.
    pub truncation: u64,
    /// Acceptance number at the last item.
    pub final_acceptance: u64,
    /// The inspector's table: runs of items with the same numbers.
    pub table: Vec<ItemRun>,
    /// Wald's approximations of the untruncated test.
    pub wald: Option<WaldApproximation>,
}

impl SequentialReport {
    /// The report of `lines`, with Wald's figures where known.
    pub fn new(lines: &SequentialLines, wald: Option<WaldApproximation>) -> Self {
        SequentialReport {
            h_accept: lines.h_accept,
            h_reject: lines.h_reject,
            slope: lines.slope,
            truncation: lines.truncation,
            final_acceptance: lines.final_acceptance,
            table: lines.runs(),
            wald,
        }
    }
}

/// The plan and its specification, as reports show them.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct VariablesReport {
    /// Sample size.
    pub n: u64,
    /// One limit: the acceptance constant `k`.
    pub k: Option<f64>,
    /// Two limits: the maximum allowable fraction nonconforming `M`.
    pub m: Option<f64>,
    /// One limit (design reports): every `k` in `[min, max]` meets both
    /// points at this `n`.
    pub k_range: Option<[f64; 2]>,
    /// Two limits (design reports): every `M` in `[min, max]` meets both
    /// points at this `n`.
    pub m_range: Option<[f64; 2]>,
    /// Known or unknown.
    pub sigma: SigmaKind,
    /// The known sigma.
    pub sigma_value: Option<f64>,
    /// Which limits.
    pub limit: LimitKind,
    /// Lower limit `L`.
    pub lower: Option<f64>,
    /// Upper limit `U`.
    pub upper: Option<f64>,
    /// Two limits, sigma unknown: the one-sided statistic equivalent to `M`.
    pub one_sided_k: Option<f64>,
}

impl VariablesReport {
    /// The report of `plan`, with the interval of its constant where known.
    pub fn new(plan: &VariablesPlan, range: Option<(f64, f64)>) -> Self {
        let spec = plan.spec();
        let two = spec.limit() == LimitKind::Both;
        let range = range.map(|(a, b)| [a, b]);
        VariablesReport {
            n: plan.n(),
            k: plan.k(),
            m: plan.m(),
            k_range: range.filter(|_| !two),
            m_range: range.filter(|_| two),
            sigma: spec.sigma_kind(),
            sigma_value: spec.sigma(),
            limit: spec.limit(),
            lower: spec.lower(),
            upper: spec.upper(),
            one_sided_k: plan.one_sided_k(),
        }
    }
}

/// The decision rule of `plan` in words, with its numbers: one line for
/// the statistic, one for the decision.
pub fn variables_rule(plan: &VariablesPlan) -> Vec<String> {
    let spec = plan.spec();
    let (scale, by) = match spec.sigma() {
        Some(s) => (format!("sigma = {s}"), "sigma"),
        None => (
            "s, the sample standard deviation (n - 1 divisor)".to_string(),
            "s",
        ),
    };
    let n = plan.n();
    let mut lines = vec![format!(
        "Measure n = {n} units drawn at random; compute the mean xbar and {scale}."
    )];
    let statistic = |name: &str, limit: Option<f64>| match (name, limit) {
        ("U", Some(u)) => Some(format!("Q_U = ({u} - xbar) / {by}")),
        ("L", Some(l)) => Some(format!("Q_L = (xbar - {l}) / {by}")),
        _ => None,
    };
    match (plan.k(), plan.m()) {
        (Some(k), _) => {
            let (q, name) = match spec.limit() {
                LimitKind::Lower => (statistic("L", spec.lower()), "Q_L"),
                _ => (statistic("U", spec.upper()), "Q_U"),
            };
            if let Some(q) = q {
                lines.push(format!(
                    "{q}; ACCEPT the lot when {name} >= k = {k}, otherwise REJECT."
                ));
            }
        }
        (_, Some(m)) => {
            let estimator = match spec.sigma() {
                Some(_) => format!("p_hat = 1 - Phi(Q sqrt({n}/{}))", n - 1),
                None => format!(
                    "p_hat = I_x({b}, {b}) with x = max(0, 1/2 - Q sqrt({n}) / {})",
                    2 * (n - 1),
                    b = format_significant(n as f64 / 2.0 - 1.0, 3)
                ),
            };
            lines.push(format!(
                "{}, {}; for each, {estimator}.",
                statistic("U", spec.upper()).unwrap_or_default(),
                statistic("L", spec.lower()).unwrap_or_default()
            ));
            lines.push(format!(
                "ACCEPT the lot when p_hat_L + p_hat_U <= M = {}, otherwise REJECT.",
                format_quality(m, false)
            ));
        }
        _ => {}
    }
    lines
}
