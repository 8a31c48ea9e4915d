//! The dispatcher: a validated request to the designer of its scheme, and
//! the solution with the comparisons a report shows (the single plan for
//! the same points, the nearby alternatives, the ASN against the single
//! plan, Wald's approximations).

use serde::Serialize;

use super::double::design_double;
use super::multiple::design_multiple;
use super::request::{Design, DesignRequest, Nearby, Scheme, VariablesRequest};
use super::sequential::{WaldApproximation, design_sequential};
use super::single::{Alternative, SingleDesign, design_single, single_alternatives};
use super::variables::{VariablesDesign, design_variables};
use super::work::single_work;
use crate::design::DesignError;
use crate::model::{Model, RiskPair};
use crate::plan::{StagedPlan, largest_asn, measures};

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
    /// Single scheme: for the acceptance numbers of [`Nearby`] (up to the
    /// chosen `c` + 3), the sample sizes meeting each point. Empty for the
    /// other schemes.
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
        Scheme::Standard => {
            return Err(DesignError::NoPlan {
                reason: "two risk points cannot describe a plan read from the standard's tables"
                    .to_string(),
                suggestion: "look the plan up with Tables::plan_for_lot by its AQL, inspection level and lot size".to_string(),
            });
        }
    })
}

/// Solves a request: the plan of its scheme, the single plan for
/// comparison, and for the single scheme the window of nearby
/// alternatives ([`Nearby::Window`]; [`solve_listing`] lists them all).
///
/// # Errors
/// As [`design_for`].
///
/// # Example
/// A double plan for AQL 1% (alpha 0.05) and RQL 6% (beta 0.10), with the
/// single plan it is compared with:
/// ```
/// use lotsman::{DesignRequest, Model, ModelKind, RiskPair, RiskPoint, Scheme, SchemeOptions, solve};
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// let risks = RiskPair::new(
///     RiskPoint { quality: 0.01, risk: 0.05 },
///     RiskPoint { quality: 0.06, risk: 0.10 },
///     &model,
/// ).unwrap();
/// let request = DesignRequest { scheme: Scheme::Double, options: SchemeOptions::default(), model, risks };
/// let solution = solve(&request).unwrap();
/// assert_eq!(solution.design.plan.stages().len(), 2);
/// assert!(solution.design.producer_risk <= 0.05 && solution.design.consumer_risk <= 0.10);
/// ```
pub fn solve(request: &DesignRequest) -> Result<Solution, DesignError> {
    solve_listing(request, Nearby::Window)
}

/// [`solve`], listing the single plan's `nearby` alternatives.
///
/// # Errors
/// As [`design_for`]; [`DesignError::OverBudget`] when listing every
/// alternative ([`Nearby::All`]: one pair of searches per acceptance number
/// up to the plan's) would pass the work budget.
pub fn solve_listing(request: &DesignRequest, nearby: Nearby) -> Result<Solution, DesignError> {
    if request.scheme == Scheme::Single && nearby == Nearby::All {
        single_work(&request.model, &request.risks, true).check(
            &format!(
                "the single plan and its alternatives ({})",
                request.model.described()
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
        Scheme::Single => {
            single_alternatives(&request.model, &request.risks, nearby.range(single.c))
        }
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
    let (max_quality, max) = largest_asn(plan, model);
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

impl VariablesRequest {
    /// The variables plan of the request ([`design_variables`]), held to
    /// the lot: every designer's answer passes the lot check at its entry.
    ///
    /// # Errors
    /// As [`design_variables`]; [`DesignError::WholeLot`] when the plan
    /// measures more units than the lot holds.
    pub fn design(&self) -> Result<VariablesDesign, DesignError> {
        let design = design_variables(self.spec(), self.risks())?;
        self.model().fit_in_lot(design.plan.n(), "measurements")?;
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
        attributes: design_single(request.model(), request.risks()),
    })
}
