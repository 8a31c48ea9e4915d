//! What to design: a validated request, independent of where it came from
//! (command-line flags or a plan source), and the plan a designer returns
//! with its achieved risks. The designers and the dispatcher
//! ([`solve`](super::solve)) build on these.

use std::fmt;
use std::ops::RangeInclusive;

use serde::{Deserialize, Serialize};

use super::limits::MAX_DESIGN_STAGES;
use crate::input::InputError;
use crate::model::{Model, ModelKind, RiskPair};
use crate::plan::{Specification, StagedPlan, stage_outcomes};

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
    /// A plan read from the tables of a sampling standard by its AQL index
    /// (MIL-STD-105E), kept in a plan source with `scheme: standard`; its
    /// table plans are single, double or multiple.
    Standard,
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
            Scheme::Standard => "standard",
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
        if scheme == Scheme::Standard {
            return Err(InputError::Inconsistent(
                "a standard-indexed plan is read from the standard's tables by its AQL, inspection level and lot size (lotsman standard), not designed from two risk points".to_string(),
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
}

/// How many acceptance numbers past the chosen one the alternatives list.
const ALTERNATIVES_PAST_OPTIMUM: u64 = 3;

/// How many acceptance numbers below the chosen one the window of nearby
/// plans lists: with the chosen one and the three past it, the twelve rows
/// of the report's table.
const WINDOW_BELOW_OPTIMUM: u64 = 8;

/// Which nearby plans (alternatives) a single design lists.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub enum Nearby {
    /// The acceptance numbers from eight below the chosen one (or 0) to
    /// three past it: twelve pairs of searches whatever the plan.
    #[default]
    Window,
    /// Every acceptance number from 0 to three past the chosen one: a pair
    /// of searches for each, thousands at close points in a large lot.
    All,
}

impl Nearby {
    /// The acceptance numbers listed around the chosen `c`.
    pub(crate) fn range(self, c: u64) -> RangeInclusive<u64> {
        let first = match self {
            Nearby::Window => c.saturating_sub(WINDOW_BELOW_OPTIMUM),
            Nearby::All => 0,
        };
        first..=c + ALTERNATIVES_PAST_OPTIMUM
    }
}
