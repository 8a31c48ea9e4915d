//! A validated design request and its solution, independent of where the
//! request came from (command-line flags or a plan source).

use serde::{Deserialize, Serialize};

use super::single::{Alternative, SingleDesign, design_single, single_alternatives};
use crate::error::DesignError;
use crate::model::Model;
use crate::risk::RiskPair;

/// The sampling scheme of a plan.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum Scheme {
    /// One sample, one decision.
    Single,
}

impl Scheme {
    /// The name used on the command line, in YAML and in JSON.
    pub fn name(self) -> &'static str {
        match self {
            Scheme::Single => "single",
        }
    }
}

/// What to design: a scheme, a model and the two risk points.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct DesignRequest {
    /// The scheme.
    pub scheme: Scheme,
    /// The model, with the lot size where known.
    pub model: Model,
    /// The two risk points, validated for the model.
    pub risks: RiskPair,
}

/// How many acceptance numbers past the chosen one the alternatives list.
const ALTERNATIVES_PAST_OPTIMUM: u64 = 3;

/// A solved request: the plan and the nearby alternatives.
#[derive(Clone, Debug, PartialEq)]
pub struct Solution {
    /// The request it answers.
    pub request: DesignRequest,
    /// The chosen plan.
    pub design: SingleDesign,
    /// For `c = 0 ..= chosen c + 3`, the sample sizes meeting each point.
    pub alternatives: Vec<Alternative>,
}

/// The smallest plan of the request's scheme, without the alternatives (what
/// `verify` needs).
///
/// # Errors
/// As [`design_single`].
pub fn design_for(request: &DesignRequest) -> Result<SingleDesign, DesignError> {
    match request.scheme {
        Scheme::Single => design_single(&request.model, &request.risks),
    }
}

/// Solves a request: the smallest plan of its scheme and the alternatives.
///
/// # Errors
/// As [`design_single`].
pub fn solve(request: &DesignRequest) -> Result<Solution, DesignError> {
    let design = design_for(request)?;
    let alternatives = match request.scheme {
        Scheme::Single => single_alternatives(
            &request.model,
            &request.risks,
            design.c + ALTERNATIVES_PAST_OPTIMUM,
        ),
    };
    Ok(Solution {
        request: *request,
        design,
        alternatives,
    })
}
