//! Reports: what the commands print, in one of three formats ([`Format`]).
//!
//! One file per report type; each writes its own terminal table and its
//! own CSV ([`Report`]), and its JSON is the report as it is. A new report
//! is one new file. The report structs are the contract with scripts:
//! their JSON keys (snake_case) are documented in README.md. Choosing the
//! writer (stdout, a file) is the caller's business.

mod batch;
mod checks;
mod compare;
mod demo;
mod design;
mod draw;
mod evaluation;
mod evaluation_batch;
mod format;
mod history;
mod judge;
mod ledger_verify;
mod parts;
mod rectifying;
mod standard;
mod standard_evaluation;
mod standard_judge;
mod standard_plans;
mod status;
mod table_kit;
mod tradeoff;
mod variables_design;
mod variables_evaluation;
mod verification;
pub mod words;

pub use self::batch::{BatchSummary, Failure, Outcome};
pub use self::compare::{CompareReport, ComparedPlanReport};
pub use self::demo::{DemoReport, DemoRow};
pub use self::design::{AlternativeReport, DesignReport, NearbyRow};
pub use self::draw::DrawReport;
pub use self::evaluation::EvaluationReport;
pub use self::evaluation_batch::{EvaluationBatchReport, EvaluationEntry, SourceEvaluation};
pub use self::format::{Format, Report, write_report};
pub use self::history::HistoryReport;
pub use self::judge::{JudgeReport, MeasurementJudgeReport};
pub use self::ledger_verify::LedgerVerifyReport;
pub use self::parts::{PointReport, VariablesReport, variables_rule};
pub use self::rectifying::{ProtectionReport, RectifyingPlanReport, RectifyingReport};
pub use self::standard::{
    ClassReport, ConsumerReport, EDITION, SeverityPlanReport, StandardPoint, StandardReport,
    TrueRisksReport, TwoPointReport,
};
pub use self::standard_evaluation::{ClassEvaluationReport, StandardEvaluationReport};
pub use self::standard_judge::StandardJudgeReport;
pub use self::standard_plans::StandardPlansReport;
pub use self::status::{NextClassPlan, NextPlan, StageJson, StatusReport};
pub use self::tradeoff::{CostReport, TradeoffCellReport, TradeoffReport};
pub use self::variables_design::{VariablesDesignReport, WorstSplitReport};
pub use self::variables_evaluation::VariablesEvaluationReport;
pub use self::verification::{VerificationReport, VerifyEntry, VerifyStatus};
