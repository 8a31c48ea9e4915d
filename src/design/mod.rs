//! Designers: from two risk points to the smallest plan that honours both.

mod bracket;
mod double;
mod double_sweep;
mod error;
mod multiple;
mod rectifying;
mod request;
mod search;
mod sensitivity;
mod sequential;
mod single;
mod tradeoff;
mod variables;

pub(crate) use bracket::{
    acceptance_number_for_ratio, aoql_factor, poisson_mean_at, sample_for_mean, z_upper,
};
pub use double::{MAX_DOUBLE_SINGLE_C, design_double};
pub use error::DesignError;
pub use multiple::design_multiple;
pub use rectifying::{
    AOQL_PLAN_LTPD_RISK, MAX_AOQL_ACCEPTANCE_NUMBER, Protection, RectifyingDesign, RectifyingPlan,
    RectifyingRequest, RectifyingRow, design_rectifying,
};
pub use request::{
    AsnSummary, Criterion, Design, DesignRequest, MAX_DESIGN_STAGES, Scheme, SchemeOptions,
    Solution, VariablesRequest, VariablesSolution, design_for, solve, solve_variables,
};
pub use sensitivity::{Input, Moved, Sensitivity, Steps, sensitivity};
pub use sequential::{WaldApproximation, design_sequential, wald_lines};
pub use single::{Alternative, SingleDesign, design_single, single_alternatives};
pub use tradeoff::{
    CellCost, CellPlan, InspectionCost, MAX_GRID_CELLS, TradeoffCell, TradeoffGrid,
    TradeoffRequest, tradeoff,
};
pub use variables::{VariablesDesign, design_variables};
