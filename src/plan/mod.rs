//! Attribute plans and variables plans, with their exact measures.

mod comparison;
mod estimate;
mod evaluation;
mod judge;
mod limits;
mod measurements;
mod measures;
mod oc;
mod searches;
mod sequential;
mod specification;
mod split_oc;
mod stage;
mod staged;
mod statistics_decision;
mod variables;
mod variables_evaluation;
mod work;

pub use comparison::{
    ComparedPlan, ComparedRow, Comparison, MAX_COMPARED, MIN_COMPARED, check_compared_count,
    compare,
};
pub use estimate::{fraction_beyond_known, fraction_beyond_unknown, statistic_for_fraction};
pub use evaluation::{Evaluation, default_qualities, evaluate, evaluate_with_decided};
pub use judge::{Decision, Judgement, judge, judge_cumulative};
pub use limits::{
    MAX_ACCEPTANCE_NUMBER, MAX_ITEMS, MAX_OPEN_COUNTS, MAX_SAMPLE_SIZE, MAX_STAGES,
    MAX_VARIABLES_SAMPLE,
};
pub use measurements::{
    AndersonDarling, MeasurementJudgement, NORMALITY_LEVEL, SIGMA_LEVEL, anderson_darling,
    judge_measurements, mean_and_sd, parse_measurements,
};
pub use measures::{
    Aoql, Measures, acceptance_probability, aoql, average_outgoing_quality, indifference_quality,
    largest_asn, measures, quality_at_pa,
};
pub(crate) use oc::Walk;
pub use oc::{StageOutcomes, curtailed_outcomes, stage_outcomes};
pub use searches::curve_maximum;
pub(crate) use searches::whole_argmax;
pub use sequential::{ItemRun, SequentialLines};
pub use specification::{LimitKind, SigmaKind, Specification};
pub use split_oc::{Worst, WorstSplit};
pub use stage::{Stage, parse_stage};
pub use staged::StagedPlan;
pub use statistics_decision::{SideStatistic, StatisticsDecision, decide_from_statistics};
pub use variables::VariablesPlan;
pub use variables_evaluation::{
    VariablesEvaluation, VariablesPoint, evaluate_variables, variables_point, variables_qualities,
};
pub(crate) use work::{
    evaluation_advice, evaluation_advice_for, most_variables_qualities, tail_terms, walk_parts,
};
pub use work::{evaluation_work, variables_evaluation_work, walk_seconds};
