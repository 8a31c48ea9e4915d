//! Attribute plans and their exact measures.

mod measures;
mod oc;
mod staged;

pub use measures::{Aoql, Measures, acceptance_probability, aoql, indifference_quality, measures};
pub use oc::{StageOutcomes, stage_outcomes};
pub use staged::{MAX_STAGES, Stage, StagedPlan};
