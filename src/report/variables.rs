//! The reports of variables plans: what `design` and `evaluate` print for
//! a plan judged on measurements.

use serde::Serialize;

use super::{PointReport, SinglePlanReport};
use crate::design::VariablesSolution;
use crate::model::ModelKind;
use crate::numeric::format_significant;
use crate::plan::{Aoql, LimitKind, SigmaKind, VariablesEvaluation, VariablesPlan, VariablesPoint};
use crate::source::tool_version;

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

/// What `design` reports for a variables plan.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct VariablesDesignReport {
    /// Plan title.
    pub title: String,
    /// Always `variables`.
    pub scheme: &'static str,
    /// The attributes model of the comparison plan.
    pub model: ModelKind,
    /// Lot size, `null` when absent.
    pub lot_size: Option<u64>,
    /// The plan for the terminal table.
    #[serde(skip)]
    pub plan: VariablesPlan,
    /// The plan and its specification.
    pub variables: VariablesReport,
    /// The producer's point and achieved risk.
    pub producer: PointReport,
    /// The consumer's point and achieved risk.
    pub consumer: PointReport,
    /// The sample size the same points need with sigma known.
    pub known_sigma_n: u64,
    /// Sigma unknown, one limit: the large-sample approximation of `n`.
    pub large_sample_n: Option<f64>,
    /// The attributes single plan for the same points, `null` when none
    /// fits within the caps.
    pub attributes_plan: Option<SinglePlanReport>,
    /// Units the variables plan saves against the attributes plan.
    pub sample_saved: Option<i64>,
    /// Why the constant is the one chosen, and other remarks.
    pub notes: Vec<String>,
    /// Tool and version.
    pub solved_by: String,
}

impl VariablesDesignReport {
    /// The report of `solution`, under `title`.
    pub fn new(title: &str, solution: &VariablesSolution) -> Self {
        let d = &solution.design;
        let risks = solution.request.risks();
        let model = solution.request.model();
        let two = d.plan.spec().limit() == LimitKind::Both;
        let (name, lo, hi) = if two {
            (
                "M",
                crate::numeric::format_quality(d.range.0, false),
                crate::numeric::format_quality(d.range.1, false),
            )
        } else {
            (
                "k",
                format_significant(d.range.0, 6),
                format_significant(d.range.1, 6),
            )
        };
        let mut notes = vec![format!(
            "every {name} from {lo} to {hi} meets both points at n = {}; the plan takes the middle {}, rounded, so that neither party's allowance is spent to its limit",
            d.plan.n(),
            if two {
                "on the normal-quantile scale"
            } else {
                "of the interval"
            }
        )];
        if let Some(a) = d.approximate_n {
            notes.push(format!(
                "the large-sample approximation n = (1 + k^2/2) ((z_alpha + z_beta)/(z_p1 - z_p2))^2 gives {a:.1}; the exact noncentral t answer is n = {}",
                d.plan.n()
            ));
        }
        if two && d.plan.spec().sigma().is_none() {
            notes.push(
                "with two limits and sigma estimated, Pa depends on how the nonconforming split between the tails; the plan meets both points with all beyond one limit and with the mean centred".to_string(),
            );
        }
        notes.push(
            "the rule rests on normally distributed measurements: judge each lot from its readings (judge with --measurements), which also tests them for normality".to_string(),
        );
        let (producer, consumer) =
            super::achieved_points(risks, (d.producer_risk, d.consumer_risk), &mut notes);
        let attributes = solution.attributes.as_ref().ok();
        if let Err(e) = &solution.attributes {
            notes.push(format!("no attributes single plan for comparison: {e}"));
        }
        VariablesDesignReport {
            title: title.to_string(),
            scheme: "variables",
            model: model.kind(),
            lot_size: model.lot_size(),
            plan: d.plan,
            variables: VariablesReport::new(&d.plan, Some(d.range)),
            producer,
            consumer,
            known_sigma_n: d.known_sigma_n,
            large_sample_n: d.approximate_n,
            attributes_plan: attributes.map(|a| SinglePlanReport { n: a.n, c: a.c }),
            sample_saved: attributes.map(|a| a.n as i64 - d.plan.n() as i64),
            notes,
            solved_by: tool_version(),
        }
    }
}

/// What `evaluate` reports for a variables plan.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct VariablesEvaluationReport {
    /// The plan and its specification.
    pub variables: VariablesReport,
    /// The plan for the terminal table.
    #[serde(skip)]
    pub plan: VariablesPlan,
    /// Lot size, `null` when absent.
    pub lot_size: Option<u64>,
    /// The measures at each quality.
    pub points: Vec<VariablesPoint>,
    /// The AOQL and where it occurs.
    pub aoql: Aoql,
    /// The quality where `Pa = 0.5`.
    pub indifference_quality: f64,
    /// The discrepancy of a recorded plan that the audit does not confirm
    /// and that is evaluated as recorded at the user's request
    /// (`--accept-recorded`); absent otherwise.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub accepted_recorded: Option<String>,
}

impl From<&VariablesEvaluation> for VariablesEvaluationReport {
    fn from(e: &VariablesEvaluation) -> Self {
        VariablesEvaluationReport {
            variables: VariablesReport::new(&e.plan, None),
            plan: e.plan,
            lot_size: e.lot_size,
            points: e.points.clone(),
            aoql: e.aoql,
            indifference_quality: e.indifference_quality,
            accepted_recorded: None,
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
                crate::numeric::format_quality(m, false)
            ));
        }
        _ => {}
    }
    lines
}
