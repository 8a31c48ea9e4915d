//! The error of a value that is not a valid input: the base of every
//! layer's validation. Every message names the parameter, the value it was
//! given and the range it must lie in, so that one line on a terminal is
//! enough to fix the input.

use thiserror::Error;

use crate::budget::OverBudget;

/// A value that is not a valid input.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum InputError {
    /// A number outside its valid range.
    #[error("{parameter} = {value} is out of range: it must be {range}")]
    OutOfRange {
        /// What the value is (for example "producer's quality (--aql)").
        parameter: String,
        /// The value as given.
        value: String,
        /// The valid range, in words.
        range: String,
    },
    /// Text that does not parse as the expected kind of value.
    #[error("{parameter} = '{value}' is not {expected}")]
    Unparsable {
        /// What the value is.
        parameter: String,
        /// The text as given.
        value: String,
        /// What was expected, in words.
        expected: String,
    },
    /// The hypergeometric model without a lot size.
    #[error(
        "the hypergeometric model needs a lot size: give --lot-size N (or lot_size in the plan source)"
    )]
    LotSizeMissing,
    /// Values that are each valid but do not fit together.
    #[error("{0}")]
    Inconsistent(String),
    /// A plan source without the solved plan the work needs, or with a
    /// plan of the wrong kind: solving it is the fix. Inside a
    /// [`SourceError::Invalid`](crate::SourceError::Invalid), `FILE.yaml`
    /// in the advice is the source's own name.
    #[error("{why}; solve it with: lotsman design FILE.yaml --in-place")]
    NotSolved {
        /// What the source lacks, e.g. `not solved yet: the source records
        /// no plan`.
        why: String,
    },
    /// A request whose work passes the budget
    /// ([`TIME_BUDGET`](crate::TIME_BUDGET),
    /// [`MEMORY_BUDGET`](crate::MEMORY_BUDGET)).
    #[error(transparent)]
    OverBudget(#[from] OverBudget),
}

impl InputError {
    /// Shorthand for [`InputError::OutOfRange`].
    pub fn out_of_range(parameter: &str, value: impl ToString, range: &str) -> Self {
        InputError::OutOfRange {
            parameter: parameter.to_string(),
            value: value.to_string(),
            range: range.to_string(),
        }
    }

    /// Shorthand for [`InputError::Unparsable`].
    pub fn unparsable(parameter: &str, value: &str, expected: &str) -> Self {
        InputError::Unparsable {
            parameter: parameter.to_string(),
            value: value.to_string(),
            expected: expected.to_string(),
        }
    }
}
