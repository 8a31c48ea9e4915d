//! The size limits of a plan: what a plan may hold, checked when a plan is
//! built ([`StagedPlan::new`](super::StagedPlan::new),
//! [`VariablesPlan::new`](super::VariablesPlan::new)) and respected by the
//! designers, so that every plan the crate handles can be evaluated
//! exactly within the work budget.

/// The largest sample size of a plan, and so the largest the designers
/// propose (`10^9`); whenever a lot size is known, under every model, the
/// lot caps it too (a design that needs more is refused with
/// [`DesignError::WholeLot`](crate::DesignError::WholeLot)).
pub const MAX_SAMPLE_SIZE: u64 = 1_000_000_000;

/// The largest acceptance number of a plan, and so the largest the
/// designers propose (`10^5`).
pub const MAX_ACCEPTANCE_NUMBER: u64 = 100_000;

/// The most stages a plan given as a list of stages may have.
pub const MAX_STAGES: usize = 10;

/// The most items an item-by-item (sequential) plan may inspect before its
/// truncation: `10^5`, where the exact OC of one quality still costs well
/// under a millisecond.
pub const MAX_ITEMS: u64 = 100_000;

/// The most counts a stage may leave undecided (`reject - accept - 1`).
/// The exact recursion carries every open count into the next stage, so a
/// stage's work is the product of the open counts before and after it:
/// `500` keeps a ten-stage plan to about `2 10^6` steps a quality. The
/// designers' plans leave far fewer open (a sequential plan within its
/// designer's limits, at most about 200).
pub const MAX_OPEN_COUNTS: u64 = 500;

/// The largest sample of a variables plan (`10^4`): the noncentral t is
/// certified to that size.
pub const MAX_VARIABLES_SAMPLE: u64 = 10_000;
