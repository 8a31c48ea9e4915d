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

// The lints (no unsafe code, documented public items, no unwrap, expect
// or panic outside the unit tests) are set for every target in the
// `[lints]` table of Cargo.toml and in clippy.toml.

// The layers, lowest first: a module imports only from its own layer or a
// lower one (tests/layers.rs checks it).
//
// 0, the base: numbers, plain words, files, input errors, the budget's core.
mod budget;
mod fs;
mod input;
mod numeric;
mod plain;

// 1, likelihood models and risk points.
mod model;

// 2, plans and their measures; the draw of the units to inspect.
mod draw;
mod plan;

// 3, designers, and the standard's tables of plans.
mod design;
mod standard;

// 4, plan sources, and the ledger of lots judged by them.
mod ledger;
mod source;

// 5, reports.
mod report;

// 6, sheets, maps and charts, drawn through one backend trait.
mod print;

// 7, work over many sources, and the demo.
mod batch;
mod demo;
mod demo_ledger;

pub use batch::{
    BatchError, SourceFile, SourcePlan, check_sheet_entry, compared_source, evaluate_source,
    evaluate_text, expand_paths, run_in_parallel, sheet_target, sheet_targets, verify_file,
    verify_text, write_source_sheet,
};
pub use budget::{Limit, MEMORY_BUDGET, OverBudget, TIME_BUDGET, Work};
pub use demo::{DEMO_PLANS, DEMO_READINGS, run_demo};
pub use demo_ledger::{DEMO_LEDGER_FILES, DEMO_LOTS};
pub use design::{
    AOQL_PLAN_LTPD_RISK, Alternative, AsnSummary, CellCost, CellPlan, Criterion, Design,
    DesignError, DesignRequest, Input, InspectionCost, MAX_AOQL_ACCEPTANCE_NUMBER,
    MAX_DESIGN_STAGES, MAX_DOUBLE_SINGLE_C, MAX_GRID_CELLS, Moved, Nearby, Protection,
    RectifyingDesign, RectifyingPlan, RectifyingRequest, RectifyingRow, RiskGrid, Scheme,
    SchemeOptions, Sensitivity, SingleDesign, Solution, Steps, TradeoffCell, TradeoffGrid,
    TradeoffRequest, VariablesDesign, VariablesRequest, VariablesSolution, WaldApproximation,
    design_double, design_for, design_multiple, design_rectifying, design_sequential,
    design_single, design_variables, design_work, double_work, multiple_work,
    rectifying_double_work, rectifying_work, sensitivity, sequential_work, single_alternatives,
    single_work, solve, solve_listing, solve_variables, tradeoff, tradeoff_work,
    variables_design_work, wald_lines,
};
pub use draw::{
    CartonShare, DRAW_GENERATOR, Draw, DrawKind, DrawRequest, DrawnUnit, Generator, NestedPart,
    SeedSource, carton_shares, draw, draw_seed, draw_stages, draw_work, floyd_sample, nested_parts,
};
pub use fs::{
    FileError, Overwrite, normalise_folder, read_limited, refuse_overwriting_input, same_file,
    write_atomic, write_set,
};
pub use input::InputError;
pub use ledger::{
    COLUMNS, ClassAverage, Decided, Finding, GENESIS, History, HistoryLot, KnownPlan,
    LEDGER_FORMAT, Ledger, LedgerError, LedgerLine, LedgerRow, LedgerStatus, LotDate, LotEntry,
    LotSample, MAX_FOLDER_FILES, MAX_LEDGER_BYTES, Measured, PROCESS_AVERAGE_LEVEL, QualityTarget,
    Replay, SIGMAS, Tally, TornLine, append_lot, chain_break, chain_hash, control_limits,
    decision_name, ledger_header, ledger_history, ledger_plans, ledger_status, lot_samples,
    plans_beside, process_averages, replay, row_line,
};
pub use model::{
    Interval, MAX_LOT_SIZE, MAX_RATE, Model, ModelKind, NoncentralT, RiskPair, RiskPoint, Tails,
    check_quality, clopper_pearson, nonconforming_in_lot, poisson_rate_interval,
};
pub use numeric::{
    BARE_FRACTION_NOTE_ABOVE, MAX_RANGE_POINTS, NEAR_LIMIT, NumericalError, QualityRange, Quantity,
    Short, bare_fraction_note, check, format_quality, format_quality_cell, format_significant,
    near_limit, parse_count, parse_fraction, parse_fraction_list, parse_number,
};
pub use plain::{escape_controls, io_message, io_reason, is_unsafe_char, shell_path, shell_word};
pub use plan::{
    AndersonDarling, Aoql, ComparedPlan, ComparedRow, Comparison, Decision, Evaluation, ItemRun,
    Judgement, LimitKind, MAX_ACCEPTANCE_NUMBER, MAX_COMPARED, MAX_ITEMS, MAX_OPEN_COUNTS,
    MAX_SAMPLE_SIZE, MAX_STAGES, MAX_VARIABLES_SAMPLE, MIN_COMPARED, MeasurementJudgement,
    Measures, NORMALITY_LEVEL, SIGMA_LEVEL, SequentialLines, SideStatistic, SigmaKind,
    Specification, Stage, StageOutcomes, StagedPlan, StatisticsDecision, VariablesEvaluation,
    VariablesPlan, VariablesPoint, Worst, WorstSplit, acceptance_probability, anderson_darling,
    aoql, average_outgoing_quality, check_compared_count, compare, curtailed_outcomes,
    curve_maximum, decide_from_statistics, default_qualities, evaluate, evaluate_variables,
    evaluate_with_decided, evaluation_work, fraction_beyond_known, fraction_beyond_unknown,
    indifference_quality, judge, judge_cumulative, judge_measurements, largest_asn, mean_and_sd,
    measures, parse_measurements, parse_stage, quality_at_pa, stage_outcomes,
    statistic_for_fraction, variables_evaluation_work, variables_point, variables_qualities,
    walk_seconds,
};
pub use print::{
    ChartKind, ContourLabel, HASH_PREFIX, HistoryFormat, MAX_HISTORY_LOTS, MAX_SHEET_BYTES,
    MapContour, MapPanel, MapQuantity, Paper, ReducedLimit, RiskAt, SCHEME_POINTS, SOURCE_NAME_KEY,
    SchemeCurve, Sheet, SheetDocument, SheetNotes, SheetOptions, SheetVerdict, SourceOc,
    StandardClassFacts, StandardFacts, TradeoffMap, chart_svg, check_sheet, check_sheet_text,
    render_comparison, render_history, render_sheet, render_sheet_noting, render_sheet_svg,
    render_standard_sheet, render_standard_sheet_svg, render_tradeoff_map, render_tradeoff_map_svg,
    sheet_of_text, sheet_source_hash, source_hash, source_oc_svg, write_sheet, write_sheet_text,
};
pub use report::{
    AlternativeReport, BatchSummary, ClassEvaluationReport, ClassReport, CompareReport,
    ComparedPlanReport, ConsumerReport, CostReport, DemoReport, DemoRow, DesignReport, DrawReport,
    EDITION, EvaluationBatchReport, EvaluationEntry, EvaluationReport, Failure, Format,
    HistoryReport, JudgeReport, LedgerVerifyReport, MeasurementJudgeReport, NearbyRow,
    NextClassPlan, NextPlan, Outcome, PointReport, ProtectionReport, RectifyingPlanReport,
    RectifyingReport, Report, SeverityPlanReport, SourceEvaluation, StageJson,
    StandardEvaluationReport, StandardJudgeReport, StandardPlansReport, StandardPoint,
    StandardReport, StatusReport, TradeoffCellReport, TradeoffReport, TrueRisksReport,
    TwoPointReport, VariablesDesignReport, VariablesEvaluationReport, VariablesReport,
    VerificationReport, VerifyEntry, VerifyStatus, WorstSplitReport, variables_rule, words,
    write_report,
};
pub use source::{
    Audit, Audited, ClassSource, Description, Difference, Discrepancy, Edition, Error,
    MAX_BRACKET_DEPTH, MAX_CLASSES, MAX_MEASUREMENTS_BYTES, MAX_SOURCE_BYTES, Placeholder,
    PlanSource, PointSource, RISK_TOLERANCE, Readings, RecordedClass, RecordedPlan,
    RecordedTablePlan, RecordedVariables, SCHEMA_VERSION, STANDARD_ALPHA, SourceError, SourceJob,
    SourceText, StandardJudgement, StandardSource, StandardSourceRequest, TEMPLATES,
    TableFileSource, UnmetPoint, VariablesSource, Verdict, audit, check_batch, check_source,
    check_texts, parse_class_counts, placeholders, read_measurements, read_user_table,
    relative_table_path, source_work, template, template_kinds, tool_version, verify, verify_at,
};
pub use standard::{
    ACCEPTED_TO_NORMAL, Counter, EXACT_STATES, LimitWindow, LotOutcomes, LotResult,
    MAX_WINDOW_LOTS, MIN_WINDOW_LOTS, NOT_ACCEPTED_TO_STOP, REJECTION_SPAN, SchemeFigures,
    SchemeOc, SwitchingError, SwitchingRules, SwitchingScheme, SwitchingState, WINDOW_STATE_BUDGET,
    WindowAutomaton, WindowSolution, state_bound,
};
pub use standard::{
    AQL_VALUES, Aql, ClassAql, ClassAssessment, ClassDecision, ClassPlan, ClassPlans, ClassRule,
    ClassScheme, ClassVerdict, CodeLetter, CodeLetterTable, ConsumerPoint, ConsumerRisk,
    InspectAll, InspectionLevel, LimitNumber, LimitNumberTable, LotRange, MasterTable, Severity,
    SeverityPa, StandardAnswer, StandardAssessment, StandardError, StandardIndex, StandardPlan,
    StandardRequest, TableCell, TableSlot, Tables, TrueRisks, TwoPointPlan, UserTable, assess,
    judge_classes, load_user_table, parse_classes, plans_by_severity, table_name, text_sha256,
    true_risks,
};
