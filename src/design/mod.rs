//! Designers: from two risk points to the smallest plan that honours both.

mod bracket;
mod double;
mod double_sweep;
mod minimum;
mod minimum_double;
mod multiple;
mod request;
mod search;
mod sequential;
mod single;
mod variables;

pub use double::{MAX_DOUBLE_SINGLE_C, design_double};
pub use minimum::{
    AOQL_PLAN_LTPD_RISK, Protection, RectifyingDesign, RectifyingPlan, RectifyingRequest,
    RectifyingRow, design_rectifying,
};
pub use multiple::design_multiple;
pub use request::{
    AsnSummary, Criterion, Design, DesignRequest, MAX_DESIGN_STAGES, Scheme, SchemeOptions,
    Solution, VariablesRequest, VariablesSolution, design_for, solve, solve_variables,
};
pub use sequential::{WaldApproximation, design_sequential, wald_lines};
pub use single::{
    Alternative, MAX_ACCEPTANCE_NUMBER, MAX_SAMPLE_SIZE, SingleDesign, design_single,
    single_alternatives,
};
pub use variables::{VariablesDesign, design_variables};
