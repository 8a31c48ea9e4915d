//! # lotsman
//!
//! Acceptance-sampling plans from two risk points: the producer's point (an
//! acceptable quality level `p1` that must be accepted with probability at
//! least `1 - alpha`) and the consumer's point (a rejectable quality level
//! `p2` that may be accepted with probability at most `beta`).
//!
//! The crate designs the smallest plan that honours both, exactly under the
//! binomial, hypergeometric or Poisson model; evaluates any staged attribute
//! plan (OC, AOQ, ATI, ASN, AOQL, indifference quality); and keeps plans as
//! versioned YAML sources that can be re-solved and verified.
//!
//! ```
//! use lotsman::{design_single, measures, Model, ModelKind, RiskPair, RiskPoint};
//! let model = Model::new(ModelKind::Hypergeometric, Some(2000)).unwrap();
//! let risks = RiskPair::new(
//!     RiskPoint { quality: 0.01, risk: 0.05 },
//!     RiskPoint { quality: 0.05, risk: 0.10 },
//!     &model,
//! ).unwrap();
//! let d = design_single(&model, &risks).unwrap();
//! let at_aql = measures(&d.plan, &model, 0.01);
//! assert!(at_aql.pa >= 0.95);
//! ```
//!
//! For rectifying inspection, [`design_rectifying`] finds the plan with the
//! least average total inspection at the process average that holds an LTPD
//! or an AOQL (Dodge and Romig's minimum-inspection plans).
//!
//! Sampling never guarantees the quality of a lot; critical and safety
//! characteristics need the inspection that the applicable contract,
//! regulation or licensed practice requires.

#![forbid(unsafe_code)]
#![warn(missing_docs)]
// No panic on anything a user can feed in: outside the unit tests, errors
// are values, never unwrap, expect or panic.
#![cfg_attr(
    not(test),
    deny(
        clippy::unwrap_used,
        clippy::expect_used,
        clippy::panic,
        clippy::todo,
        clippy::unimplemented
    )
)]

mod atomic;
mod batch;
mod budget;
mod demo;
mod design;
mod error;
mod folder;
mod leftovers;
mod model;
mod numeric;
mod plain;
mod plan;
mod print;
mod quantity;
mod read;
mod report;
mod risk;
mod source;
mod templates;

pub use atomic::{Overwrite, write_atomic, write_set};
pub use batch::{
    SourceFile, evaluate_source, expand_paths, run_in_parallel, sheet_target, sheet_targets,
    verify_file,
};
pub use budget::{
    Limit, MEMORY_BUDGET, OverBudget, SourceJob, TIME_BUDGET, Work, check_batch, check_source,
    design_work, double_work, evaluation_work, minimum_work, multiple_work, sequential_work,
    single_work, source_work, tradeoff_work, variables_design_work, variables_evaluation_work,
    walk_seconds,
};
pub use demo::{DEMO_PLANS, DEMO_READINGS, DemoRow, run_demo};
pub use design::{
    AOQL_PLAN_LTPD_RISK, Alternative, AsnSummary, CellCost, CellPlan, Criterion, Design,
    DesignRequest, Input, InspectionCost, MAX_ACCEPTANCE_NUMBER, MAX_AOQL_ACCEPTANCE_NUMBER,
    MAX_DESIGN_STAGES, MAX_DOUBLE_SINGLE_C, MAX_GRID_CELLS, MAX_SAMPLE_SIZE, Moved, Protection,
    RectifyingDesign, RectifyingPlan, RectifyingRequest, RectifyingRow, Scheme, SchemeOptions,
    Sensitivity, SingleDesign, Solution, Steps, TradeoffCell, TradeoffGrid, TradeoffRequest,
    VariablesDesign, VariablesRequest, VariablesSolution, WaldApproximation, design_double,
    design_for, design_multiple, design_rectifying, design_sequential, design_single,
    design_variables, sensitivity, single_alternatives, solve, solve_variables, tradeoff,
    wald_lines,
};
pub use error::{BatchError, DesignError, Error, InputError, SourceError};
pub use folder::normalise_folder;
pub use model::{
    MAX_LOT_SIZE, MAX_RATE, Model, ModelKind, NoncentralT, Tails, nonconforming_in_lot,
};
pub use numeric::{NEAR_LIMIT, NumericalError, Quantity, Short, check, near_limit};
pub use plain::{escape_controls, io_message, io_reason, is_unsafe_char, shell_path, shell_word};
pub use plan::{
    AndersonDarling, Aoql, Decision, Evaluation, ItemRun, Judgement, LimitKind, MAX_ITEMS,
    MAX_OPEN_COUNTS, MAX_STAGES, MAX_VARIABLES_SAMPLE, MeasurementJudgement, Measures,
    NORMALITY_LEVEL, SIGMA_LEVEL, SequentialLines, SideStatistic, SigmaKind, Specification, Stage,
    StageOutcomes, StagedPlan, VariablesEvaluation, VariablesPlan, VariablesPoint,
    acceptance_probability, anderson_darling, aoql, average_outgoing_quality, curtailed_outcomes,
    curve_maximum, default_qualities, evaluate, evaluate_variables, evaluate_with_decided,
    fraction_beyond_known, fraction_beyond_unknown, indifference_quality, judge, judge_cumulative,
    judge_measurements, largest_asn, mean_and_sd, measures, parse_measurements, quality_at_pa,
    stage_outcomes, statistic_for_fraction, variables_point, variables_qualities,
};
pub use print::{
    ChartKind, ContourLabel, HASH_PREFIX, MAX_SHEET_BYTES, MapContour, MapPanel, MapQuantity,
    Paper, SOURCE_NAME_KEY, Sheet, SheetNotes, SheetOptions, SheetVerdict, TradeoffMap, chart_svg,
    check_sheet, render_sheet, render_sheet_noting, render_sheet_svg, render_tradeoff_map,
    sheet_source_hash, source_hash, write_sheet,
};
pub use quantity::{
    BARE_FRACTION_NOTE_ABOVE, MAX_RANGE_POINTS, QualityRange, bare_fraction_note, parse_count,
    parse_fraction, parse_fraction_list, parse_number, parse_stage,
};
pub use read::read_limited;
pub use report::{
    AlternativeReport, BatchSummary, CostReport, Csv, DesignReport, EvaluationBatchReport,
    EvaluationEntry, EvaluationReport, Failure, Json, Outcome, PointReport, ProtectionReport,
    RectifyingPlanReport, RectifyingReport, ReportFormat, SourceEvaluation, Table,
    TradeoffCellReport, TradeoffReport, VariablesDesignReport, VariablesEvaluationReport,
    VariablesReport, VerificationReport, VerifyEntry, VerifyStatus, format_quality,
    format_quality_cell, format_significant, variables_rule, words,
};
pub use risk::{RiskPair, RiskPoint};
pub use source::{
    Audit, Audited, Description, Difference, Discrepancy, MAX_BRACKET_DEPTH, MAX_SOURCE_BYTES,
    PlanSource, PointSource, RISK_TOLERANCE, RecordedPlan, RecordedVariables, SCHEMA_VERSION,
    UnmetPoint, VariablesSource, Verdict, audit, tool_version, verify,
};
pub use templates::{Placeholder, TEMPLATES, placeholders, template, template_kinds};
