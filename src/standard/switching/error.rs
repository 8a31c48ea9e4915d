//! The errors of the switching rules and of the scheme's long-run OC.

use thiserror::Error;

use crate::budget::OverBudget;

/// Why a switching request has no answer.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum SwitchingError {
    /// A count or size outside its valid range.
    #[error("{what} is {value}; it must be {range}")]
    OutOfRange {
        /// The parameter, in words.
        what: &'static str,
        /// The value given.
        value: String,
        /// The valid range, in words.
        range: String,
    },
    /// Per-lot probabilities that do not form a distribution.
    #[error("the {severity} lot outcomes do not add up: {reason}")]
    NotADistribution {
        /// The severity whose outcomes are wrong.
        severity: &'static str,
        /// What is wrong, with the numbers.
        reason: String,
    },
    /// A lot given while inspection under the standard is stopped (105E
    /// 4.8).
    #[error(
        "inspection under the standard is discontinued (five lots not accepted on one spell of tightened inspection, MIL-STD-105E 4.8); record the supplier's corrective action first, then inspection resumes on tightened"
    )]
    Discontinued,
    /// A lot result that cannot happen at the severity in force.
    #[error("{0}")]
    Inconsistent(String),
    /// The exact window of the limit-number rule is beyond the budget.
    #[error(
        "the scheme's long-run OC with reduced inspection would need {states} states to follow the limit-number rule over the last {lots} lots (largest count on an accepted lot {largest_count}, limit number {limit}), beyond the budget of {budget} states; the OC of each severity alone is exact, and leaving reduced inspection out gives the scheme's OC exactly"
    )]
    WindowTooLarge {
        /// The number of states the window would need (an upper bound
        /// counted before the states are built).
        states: u64,
        /// The lots of the window.
        lots: u32,
        /// The largest count an accepted lot on normal can have.
        largest_count: u64,
        /// The limit number.
        limit: u32,
        /// The state budget.
        budget: u64,
    },
    /// A bounded sum that did not reach its bound within its step budget.
    #[error(
        "the expected run of normal inspection at quality {quality} did not settle within {steps} lots; the scheme's OC at this quality cannot be given"
    )]
    NotSettled {
        /// The quality asked for.
        quality: f64,
        /// The lots summed.
        steps: u64,
    },
    /// The work passes the budget.
    #[error(transparent)]
    OverBudget(#[from] OverBudget),
}
