//! Designers: from two risk points to the smallest plan that honours both.

mod bracket;
mod request;
mod search;
mod single;

pub use request::{DesignRequest, Scheme, Solution, design_for, solve};
pub use single::{
    Alternative, MAX_ACCEPTANCE_NUMBER, MAX_SAMPLE_SIZE, SingleDesign, design_single,
    single_alternatives,
};
