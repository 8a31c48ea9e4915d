//! Standard-indexed plans: the tables of the public-domain MIL-STD-105E
//! (*Sampling Procedures and Tables for Inspection by Attributes*, 10 May
//! 1989, Distribution Statement A) as data, the lookup from a contract's
//! "AQL 1.0, level II, normal inspection" to its plan, several defect
//! classes on one sample, and the risks a table plan really gives.
//!
//! - The tables ([`Tables`]): Table I (code letters), II-A to IV-C
//!   (single, double and multiple plans for normal, tightened and reduced
//!   inspection) and VIII (limit numbers), one file each in
//!   `data/standard/mil-std-105e/` with its source at its head, embedded.
//!   Cells no available source settles are `?` in the files and refused
//!   when a lookup reaches them; a user may give a table of their own in
//!   the same shape ([`load_user_table`]).
//! - The lookup ([`Tables::lookup`], [`Tables::plan_for_lot`]) resolves
//!   arrows, `*` and `++` in code, as 105E 4.9.3 and the tables' footnotes
//!   say, and applies the 100 percent rule.
//! - Several classes ([`Tables::classes_for_lot`], [`judge_classes`]):
//!   each class of defects has its own AQL and so its own acceptance and
//!   rejection numbers, read on the row of the lot's code letter. Where
//!   arrows send classes to rows of different sample sizes, each class
//!   keeps its own plan by default and one draw of the largest sample
//!   serves all ([`ClassRule`]; `classes.rs` argues the choice).
//! - Reduced inspection's gap: a reduced plan may leave counts between Ac
//!   and Re at its last stage; such a count accepts the lot and returns the
//!   next lot to normal inspection (105E, 4.10.1.4). The last stage of a
//!   [`StagedPlan`](crate::StagedPlan) decides every count, so a table
//!   plan carries both: the table's numbers
//!   ([`StandardPlan::table_numbers`]) and the plan that decides the lot,
//!   accepting up to `Re - 1` ([`StandardPlan::stages`]).
//! - Table VIII's limit numbers ([`Tables::limit_number`]), entered from
//!   memory and unverified, for the switching rules.
//! - True risks ([`true_risks`]): the exact OC of a table plan under the
//!   binomial, Poisson or hypergeometric model, its producer's risk at the
//!   AQL, the qualities at Pa 0.95, 0.50 and 0.10, and against a consumer's
//!   point, the risk there and the plan the two-point designer gives.
//!
//! The terms (code letter, inspection level, normal, tightened and reduced
//! inspection, limit number) are the standard's own; everything else here
//! is in our words. Later national and international editions are
//! copyrighted and not used.

mod answer;
mod aql;
mod assessment;
mod cell;
mod class_scheme;
mod classes;
mod code_letters;
mod csv_text;
mod error;
mod letter;
mod limit_numbers;
mod lookup;
mod provenance;
mod risks;
mod severity;
mod switching;
mod table;
mod tables;

pub use answer::{InspectAll, StandardAnswer, StandardPlan};
pub use aql::{AQL_VALUES, Aql};
pub use assessment::{
    ClassAssessment, SeverityPa, StandardAssessment, StandardIndex, StandardRequest, assess,
    plans_by_severity,
};
pub use cell::TableCell;
pub use class_scheme::ClassScheme;
pub(crate) use class_scheme::limit_window;
pub use classes::{
    ClassAql, ClassDecision, ClassPlan, ClassPlans, ClassRule, ClassVerdict, judge_classes,
    parse_classes,
};
pub use code_letters::{CodeLetterTable, LotRange};
pub use error::StandardError;
pub use letter::{CodeLetter, InspectionLevel};
pub use limit_numbers::{LimitNumber, LimitNumberTable};
pub use risks::{ConsumerPoint, ConsumerRisk, TrueRisks, TwoPointPlan, true_risks};
pub use severity::Severity;
pub use switching::{
    ACCEPTED_TO_NORMAL, Counter, EXACT_STATES, LimitWindow, LotOutcomes, LotResult,
    MAX_WINDOW_LOTS, MIN_WINDOW_LOTS, NOT_ACCEPTED_TO_STOP, REJECTION_SPAN, SchemeFigures,
    SchemeOc, SwitchingError, SwitchingRules, SwitchingScheme, SwitchingState, WINDOW_STATE_BUDGET,
    WindowAutomaton, WindowSolution, state_bound,
};
pub use table::{MasterTable, table_name};
pub use tables::{TableSlot, Tables, UserTable, load_user_table, text_sha256};
