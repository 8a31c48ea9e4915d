//! Plan sources: the versioned YAML from which a plan is re-solved and
//! re-printed. Loading, validation into a design request, recording a
//! solution, saving, and verification.

mod audit;
mod describe;
mod discrepancy;
mod error;
mod keys;
mod limits;
mod load;
mod measurements;
mod record;
mod rectifying;
mod schema;
mod standard;
mod templates;
mod text;
mod user_table;
mod verify;
mod work;
mod yaml_words;

pub use audit::{Audit, Audited, audit};
pub(crate) use audit::{attributes_risks, variables_risks};
pub use describe::Description;
pub use discrepancy::{Difference, Discrepancy, UnmetPoint};
pub use error::{Error, SourceError};
pub use limits::MAX_SOURCE_BYTES;
pub use load::MAX_BRACKET_DEPTH;
pub use measurements::{MAX_MEASUREMENTS_BYTES, Readings, read_measurements};
pub use record::tool_version;
pub use schema::{
    PlanSource, PointSource, RecordedPlan, RecordedVariables, SCHEMA_VERSION, VariablesSource,
};
pub use standard::{
    ClassSource, Edition, MAX_CLASSES, RecordedClass, RecordedTablePlan, STANDARD_ALPHA,
    StandardJudgement, StandardSource, StandardSourceRequest, TableFileSource, parse_class_counts,
    relative_table_path,
};
pub use templates::{Placeholder, TEMPLATES, placeholders, template, template_kinds};
pub use text::SourceText;
pub use user_table::read_user_table;
pub use verify::{RISK_TOLERANCE, Verdict, verify, verify_at};
pub use work::{SourceJob, check_batch, check_source, check_texts, source_work};
