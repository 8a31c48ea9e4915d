//! Attribute plans and their exact measures.

mod evaluation;
mod judge;
mod measures;
mod oc;
mod staged;

pub use evaluation::{Evaluation, default_qualities, evaluate, quality_at_pa};
pub use judge::{Decision, Judgement, judge};
pub use measures::{
    Aoql, Measures, acceptance_probability, aoql, average_outgoing_quality, indifference_quality,
    measures,
};
pub use oc::{StageOutcomes, stage_outcomes};
pub use staged::{MAX_STAGES, Stage, StagedPlan};
