//! The error of a design request that has no answer.

use thiserror::Error;

use crate::budget::OverBudget;
use crate::model::Model;

/// Why a design request has no answer.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum DesignError {
    /// No sample size and acceptance number meet both risk points.
    #[error("no plan meets both risk points: {reason}; {suggestion}")]
    NoPlan {
        /// Why, in terms of the inputs.
        reason: String,
        /// What the user can do.
        suggestion: String,
    },
    /// The points are so close that the plan would exceed the search caps.
    #[error(
        "the risk points are too close: a plan would need {what} beyond the designer's limit of {cap}; widen the points (raise the RQL or lower the AQL) or relax alpha or beta"
    )]
    BeyondCap {
        /// The quantity that would exceed its cap.
        what: String,
        /// The cap.
        cap: String,
    },
    /// The risk points need a sample larger than the lot: no sampling plan
    /// fits, and the answer is to inspect every unit.
    #[error(
        "no plan: the risk points need a sample of n = {needed} {unit} from a lot of {lot} units, and a sample cannot be larger than its lot; inspect all {lot} units (100%), or agree points further apart (raise the RQL, lower the AQL, or relax alpha or beta)"
    )]
    WholeLot {
        /// The sample the points need.
        needed: u64,
        /// The lot size.
        lot: u64,
        /// What the sample counts: `units`, or `measurements` for a
        /// variables plan.
        unit: &'static str,
    },
    /// A minimum-inspection request (rectifying inspection) with no answer
    /// of the scheme asked for within the designer's limits.
    #[error("no minimum-inspection plan: {reason}; {suggestion}")]
    NoRectifyingPlan {
        /// Why, in terms of the inputs.
        reason: String,
        /// What the user can do.
        suggestion: String,
    },
    /// A search whose work passes the budget
    /// ([`TIME_BUDGET`](crate::TIME_BUDGET)).
    #[error(transparent)]
    OverBudget(#[from] OverBudget),
}

/// The designers' check against the lot, beside the error it returns, so
/// that the model knows nothing of designs.
impl Model {
    /// The designers' check of their answer against the lot: `Ok` when a
    /// sample of `needed` units (or measurements) fits it, otherwise the
    /// refusal that states the answer, to inspect the whole lot, and why.
    ///
    /// # Errors
    /// [`DesignError::WholeLot`] when `needed` exceeds the lot size.
    pub fn fit_in_lot(&self, needed: u64, unit: &'static str) -> Result<(), DesignError> {
        match self.lot_size() {
            Some(lot) if needed > lot => Err(DesignError::WholeLot { needed, lot, unit }),
            _ => Ok(()),
        }
    }
}
