//! Designers: from two risk points to the smallest plan that honours both.
//!
//! The request types ([`request`](self::request)) and the designers' own
//! limits come first; each scheme's designer is one file; the dispatcher
//! ([`solve`]) picks the designer of a request's scheme. The trade-off
//! grid and the minimum-inspection plans of rectifying inspection have a
//! folder each.

mod bracket;
mod dispatch;
mod double;
mod double_first;
mod double_sweep;
mod error;
mod limits;
mod multiple;
mod rectifying;
mod request;
mod search;
mod sensitivity;
mod sequential;
mod single;
mod tradeoff;
mod variables;
mod work;
#[cfg(test)]
mod work_calibration;

pub use dispatch::{
    AsnSummary, Solution, VariablesSolution, design_for, solve, solve_listing, solve_variables,
};
pub use double::design_double;
pub use error::DesignError;
pub use limits::{
    MAX_AOQL_ACCEPTANCE_NUMBER, MAX_DESIGN_STAGES, MAX_DOUBLE_SINGLE_C, MAX_GRID_CELLS,
};
pub use multiple::design_multiple;
pub use rectifying::{
    AOQL_PLAN_LTPD_RISK, Protection, RectifyingDesign, RectifyingPlan, RectifyingRequest,
    RectifyingRow, design_rectifying,
};
pub use request::{
    Criterion, Design, DesignRequest, Nearby, Scheme, SchemeOptions, VariablesRequest,
};
pub use sensitivity::{Input, Moved, Sensitivity, Steps, sensitivity};
pub use sequential::{WaldApproximation, design_sequential, wald_lines};
pub use single::{Alternative, SingleDesign, design_single, single_alternatives};
pub use tradeoff::{
    CellCost, CellPlan, InspectionCost, RiskGrid, TradeoffCell, TradeoffGrid, TradeoffRequest,
    tradeoff, tradeoff_work,
};
pub use variables::{VariablesDesign, design_variables};
pub use work::{
    design_work, double_work, multiple_work, rectifying_double_work, rectifying_work,
    sequential_work, single_work, variables_design_work,
};
