//! A validated design request and its solution, independent of where the
//! request came from (command-line flags or a plan source).

use std::fmt;

use serde::{Deserialize, Serialize};

use super::double::design_double;
use super::multiple::design_multiple;
use super::sequential::{WaldApproximation, design_sequential};
use super::single::{Alternative, SingleDesign, design_single, single_alternatives};
use super::variables::{VariablesDesign, design_variables};
use crate::budget::single_work;
use crate::design::DesignError;
use crate::input::InputError;
use crate::model::RiskPair;
use crate::model::{Model, ModelKind};
use crate::plan::{Specification, StagedPlan, measures, stage_outcomes};

/// The sampling scheme of a plan.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum Scheme {
    /// One sample, one decision.
    Single,
    /// A first sample that accepts, rejects or calls for a second one.
    Double,
    /// Up to seven equal samples, each on the cumulative count.
    Multiple,
    /// Item by item, Wald's sequential probability ratio test, truncated.
    Sequential,
    /// Measurements of a normal characteristic against its limits
    /// ([`VariablesRequest`]).
    Variables,
    /// A minimum-inspection plan for rectifying inspection, single or
    /// double, from a process average and a protection
    /// ([`RectifyingRequest`](super::RectifyingRequest)).
    Rectifying,
}

impl Scheme {
    /// The name used on the command line, in YAML and in JSON.
    pub fn name(self) -> &'static str {
        match self {
            Scheme::Single => "single",
            Scheme::Double => "double",
            Scheme::Multiple => "multiple",
            Scheme::Sequential => "sequential",
            Scheme::Variables => "variables",
            Scheme::Rectifying => "rectifying",
        }
    }
}

impl fmt::Display for Scheme {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

/// What a double or multiple designer minimises.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Criterion {
    /// The average sample number at the AQL (the producer's quality): what
    /// inspection costs while the supplier delivers what was agreed.
    #[default]
    AsnAql,
    /// The average sample number at the RQL.
    AsnRql,
    /// The largest average sample number over all qualities.
    AsnMax,
}

impl Criterion {
    /// The name used on the command line, in YAML and in JSON.
    pub fn name(self) -> &'static str {
        match self {
            Criterion::AsnAql => "asn-aql",
            Criterion::AsnRql => "asn-rql",
            Criterion::AsnMax => "asn-max",
        }
    }
}

/// The most stages the multiple designer builds.
pub const MAX_DESIGN_STAGES: u32 = 7;

/// The settings of the staged schemes.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SchemeOptions {
    /// What the double and multiple designers minimise.
    pub criterion: Criterion,
    /// Double plans: fix the second sample at this multiple of the first
    /// (`n2 = max(1, round(ratio n1))`); `None` searches it freely.
    pub second_ratio: Option<f64>,
    /// Multiple plans: the number of equal stages (2 to 7).
    pub stages: u32,
}

impl Default for SchemeOptions {
    fn default() -> Self {
        SchemeOptions {
            criterion: Criterion::AsnAql,
            second_ratio: None,
            stages: MAX_DESIGN_STAGES,
        }
    }
}

impl SchemeOptions {
    /// Checks the options against the scheme they go with.
    ///
    /// # Errors
    /// [`InputError`] for a second-sample ratio outside `0.05..=20` or on a
    /// scheme other than double, a stage count outside `2..=7`, a
    /// criterion other than `asn-aql` and `asn-rql` for a multiple plan, or
    /// the variables scheme (its settings are a [`VariablesRequest`]).
    pub fn check(&self, scheme: Scheme) -> Result<(), InputError> {
        if scheme == Scheme::Variables {
            return Err(InputError::Inconsistent(
                "a variables plan is designed from its specification (sigma and limits), not from attribute settings".to_string(),
            ));
        }
        if scheme == Scheme::Rectifying {
            return Err(InputError::Inconsistent(
                "a minimum-inspection plan is designed from a process average and a protection (lotsman rectify), not from two risk points".to_string(),
            ));
        }
        if let Some(r) = self.second_ratio {
            if scheme != Scheme::Double {
                return Err(InputError::Inconsistent(format!(
                    "a second-sample ratio applies to double plans only, not to a {scheme} plan"
                )));
            }
            if !(0.05..=20.0).contains(&r) {
                return Err(InputError::out_of_range(
                    "second-sample ratio",
                    r,
                    "0.05 to 20 (n2 / n1)",
                ));
            }
        }
        if !(2..=MAX_DESIGN_STAGES).contains(&self.stages) {
            return Err(InputError::out_of_range(
                "number of stages",
                self.stages,
                "2 to 7",
            ));
        }
        if scheme == Scheme::Multiple && self.criterion == Criterion::AsnMax {
            return Err(InputError::Inconsistent(
                "the multiple designer minimises asn-aql or asn-rql; asn-max is for double plans"
                    .to_string(),
            ));
        }
        Ok(())
    }
}

/// What to design: a scheme with its options, a model and the two risk
/// points.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct DesignRequest {
    /// The scheme.
    pub scheme: Scheme,
    /// The settings of the staged schemes (ignored by single and
    /// sequential plans).
    pub options: SchemeOptions,
    /// The model, with the lot size where known.
    pub model: Model,
    /// The two risk points, validated for the model.
    pub risks: RiskPair,
}

/// A designed plan with the risks it achieves.
#[derive(Clone, Debug, PartialEq)]
pub struct Design {
    /// The plan.
    pub plan: StagedPlan,
    /// Achieved producer's risk `1 - Pa(p1)`.
    pub producer_risk: f64,
    /// Achieved consumer's risk `Pa(p2)`.
    pub consumer_risk: f64,
}

impl Design {
    /// `plan` with its achieved risks from the exact recursion
    /// ([`stage_outcomes`]): the producer's risk as the sum of the
    /// rejection probabilities at `p1`, the consumer's as the acceptance
    /// probability at `p2`. Every staged designer reports its choice this
    /// way, whatever shortcut its search took.
    pub fn exact(plan: StagedPlan, model: &Model, risks: &RiskPair) -> Self {
        let producer_risk = stage_outcomes(&plan, model, risks.producer().quality)
            .reject
            .iter()
            .sum();
        let consumer_risk = stage_outcomes(&plan, model, risks.consumer().quality)
            .accept
            .iter()
            .sum();
        Design {
            plan,
            producer_risk,
            consumer_risk,
        }
    }
}

/// How many acceptance numbers past the chosen one the alternatives list.
const ALTERNATIVES_PAST_OPTIMUM: u64 = 3;

/// The average sample numbers of a staged plan against the single plan
/// for the same points.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct AsnSummary {
    /// ASN at the AQL.
    pub at_aql: f64,
    /// ASN at the RQL.
    pub at_rql: f64,
    /// The largest ASN over all qualities.
    pub max: f64,
    /// The quality where it occurs.
    pub max_quality: f64,
    /// Largest number of units the plan can inspect.
    pub max_sample: u64,
    /// Sample size of the single plan for the same points.
    pub single_n: u64,
    /// `1 - at_aql / single_n`: the share of inspection saved at the AQL.
    pub saving_at_aql: f64,
}

/// A solved request.
#[derive(Clone, Debug, PartialEq)]
pub struct Solution {
    /// The request it answers.
    pub request: DesignRequest,
    /// The chosen plan.
    pub design: Design,
    /// The single plan for the same points (the chosen plan itself for the
    /// single scheme).
    pub single: SingleDesign,
    /// Single scheme: for `c = 0 ..= chosen c + 3`, the sample sizes meeting
    /// each point. Empty for the other schemes.
    pub alternatives: Vec<Alternative>,
    /// Staged schemes: the plan's ASN against the single plan.
    pub asn: Option<AsnSummary>,
    /// Sequential scheme: Wald's approximations beside the exact figures.
    pub wald: Option<WaldApproximation>,
}

/// The plan of the request's scheme, without the comparisons (what `verify`
/// needs).
///
/// # Errors
/// As the scheme's designer: [`design_single`], [`design_double`],
/// [`design_multiple`], [`design_sequential`]; [`DesignError::NoPlan`] for
/// the variables scheme, which [`solve_variables`] designs.
pub fn design_for(request: &DesignRequest) -> Result<Design, DesignError> {
    let (model, risks, o) = (&request.model, &request.risks, &request.options);
    Ok(match request.scheme {
        Scheme::Single => design_single(model, risks)?.into(),
        Scheme::Double => design_double(model, risks, o.criterion, o.second_ratio)?,
        Scheme::Multiple => design_multiple(model, risks, o.stages, o.criterion)?,
        Scheme::Sequential => design_sequential(model, risks)?.0,
        Scheme::Variables => {
            return Err(DesignError::NoPlan {
                reason: "an attributes request cannot describe a variables plan".to_string(),
                suggestion:
                    "build a VariablesRequest with its specification and call solve_variables"
                        .to_string(),
            });
        }
        Scheme::Rectifying => {
            return Err(DesignError::NoPlan {
                reason: "two risk points cannot describe a minimum-inspection plan".to_string(),
                suggestion:
                    "build a RectifyingRequest with its process average and protection and call design_rectifying"
                        .to_string(),
            });
        }
    })
}

/// Solves a request: the plan of its scheme, the single plan for
/// comparison, and for the single scheme the nearby alternatives.
///
/// # Errors
/// As [`design_for`]; [`DesignError::OverBudget`] when listing the single
/// plan's alternatives (one pair of searches per acceptance number up to
/// the plan's) would pass the work budget.
pub fn solve(request: &DesignRequest) -> Result<Solution, DesignError> {
    if request.scheme == Scheme::Single {
        single_work(&request.model, &request.risks, true).check(
            &format!(
                "the single plan and its alternatives ({} model{})",
                request.model.kind(),
                request
                    .model
                    .lot_size()
                    .map_or(String::new(), |lot| format!(", lot of {lot}"))
            ),
            "give points further apart (raise the RQL or lower the AQL), or relax alpha or beta",
        )?;
    }
    let single = design_single(&request.model, &request.risks)?;
    let (design, wald) = match request.scheme {
        Scheme::Single => (single.clone().into(), None),
        Scheme::Sequential => {
            let (d, w) = design_sequential(&request.model, &request.risks)?;
            (d, Some(w))
        }
        _ => (design_for(request)?, None),
    };
    let alternatives = match request.scheme {
        Scheme::Single => single_alternatives(
            &request.model,
            &request.risks,
            single.c + ALTERNATIVES_PAST_OPTIMUM,
        ),
        _ => Vec::new(),
    };
    let asn = (request.scheme != Scheme::Single)
        .then(|| asn_summary(&design.plan, &request.model, &request.risks, single.n));
    Ok(Solution {
        request: *request,
        design,
        single,
        alternatives,
        asn,
        wald,
    })
}

fn asn_summary(plan: &StagedPlan, model: &Model, risks: &RiskPair, single_n: u64) -> AsnSummary {
    let at = |p: f64| measures(plan, model, p).asn;
    let at_aql = at(risks.producer().quality);
    let (max_quality, max) = crate::plan::largest_asn(plan, model);
    AsnSummary {
        at_aql,
        at_rql: at(risks.consumer().quality),
        max,
        max_quality,
        max_sample: plan.max_sample(),
        single_n,
        saving_at_aql: 1.0 - at_aql / single_n as f64,
    }
}

impl From<SingleDesign> for Design {
    fn from(d: SingleDesign) -> Self {
        Design {
            plan: d.plan,
            producer_risk: d.producer_risk,
            consumer_risk: d.consumer_risk,
        }
    }
}

/// What to design for a variables plan: the characteristic's
/// specification, the two risk points (fractions beyond the limits), and
/// the attributes model (with the lot size where known) for the comparison
/// plan, AOQ and ATI.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct VariablesRequest {
    spec: Specification,
    risks: RiskPair,
    model: Model,
}

impl VariablesRequest {
    /// Validates the request.
    ///
    /// # Errors
    /// [`InputError::Inconsistent`] for the Poisson model: a variables plan
    /// estimates a fraction nonconforming, not nonconformities per unit.
    pub fn new(spec: Specification, risks: RiskPair, model: Model) -> Result<Self, InputError> {
        if model.kind() == ModelKind::Poisson {
            return Err(InputError::Inconsistent(
                "a variables plan estimates a fraction nonconforming; compare it with the binomial or hypergeometric model, not poisson".to_string(),
            ));
        }
        Ok(VariablesRequest { spec, risks, model })
    }

    /// The specification.
    pub fn spec(&self) -> &Specification {
        &self.spec
    }

    /// The risk points.
    pub fn risks(&self) -> &RiskPair {
        &self.risks
    }

    /// The attributes model of the comparison plan, with the lot size.
    pub fn model(&self) -> &Model {
        &self.model
    }

    /// The variables plan of the request ([`design_variables`]), held to
    /// the lot: every designer's answer passes the lot check at its entry.
    ///
    /// # Errors
    /// As [`design_variables`]; [`DesignError::WholeLot`] when the plan
    /// measures more units than the lot holds.
    pub fn design(&self) -> Result<VariablesDesign, DesignError> {
        let design = design_variables(&self.spec, &self.risks)?;
        self.model.fit_in_lot(design.plan.n(), "measurements")?;
        Ok(design)
    }
}

/// A solved variables request, with the attributes single plan for the
/// same points.
#[derive(Clone, Debug, PartialEq)]
pub struct VariablesSolution {
    /// The request it answers.
    pub request: VariablesRequest,
    /// The variables plan.
    pub design: VariablesDesign,
    /// The attributes single plan for the same points, or why there is
    /// none within the caps.
    pub attributes: Result<SingleDesign, DesignError>,
}

/// Solves a variables request and designs the attributes plan beside it.
///
/// # Errors
/// As [`design_variables`]; [`DesignError::WholeLot`] when the plan
/// measures more units than the lot holds.
pub fn solve_variables(request: &VariablesRequest) -> Result<VariablesSolution, DesignError> {
    let design = request.design()?;
    Ok(VariablesSolution {
        request: *request,
        design,
        attributes: design_single(&request.model, &request.risks),
    })
}
