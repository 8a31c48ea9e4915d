//! Standard-indexed plans as plan sources (`scheme: standard`): what a
//! contract names ("AQL 1.0, general inspection level II, normal
//! inspection", or one AQL per class of defects), the plans the
//! MIL-STD-105E tables give for it, recorded per class and severity, and
//! the checks of both.
//!
//! ```yaml
//! scheme: standard
//! standard:
//!   edition: MIL-STD-105E
//!   level: II
//!   classes:                  # or, for one AQL: aql: 1.0
//!   - name: major
//!     aql: '1.0'
//!   - name: minor
//!     aql: '4.0'
//!   severity: normal          # in force: normal, tightened or reduced
//!   form: single              # single, double or multiple
//!   # no_reduced: true        # the contract leaves reduced inspection out
//!   # class_rule: largest-sample
//!   # tables:                 # your own tables, beside the source
//!   # - file: tables/2a.csv
//!   #   sha256: 3f5c...
//!   #   severity: normal      # for a table of plans
//! model: binomial
//! lot_size: 1500
//! consumer:                   # optional: the table plans against an RQL
//!   quality: 0.05
//!   risk: 0.1
//! plan:                       # written by the tool
//!   code_letter: K
//!   classes:
//!   - name: major
//!     aql: '1.0'
//!     normal:
//!       plan_letter: K
//!       stages:
//!       - n: 125
//!         accept: 3
//!         reject: 4
//!     tightened: ...
//!     reduced: ...
//!   solved_by: lotsman 0.1.0
//! ```
//!
//! The recorded stages are the table's own numbers: on reduced inspection
//! a last stage may leave a gap between Ac and Re, and a final count in
//! the gap accepts the lot and returns the next one to normal inspection
//! (105E, 4.10.1.4). A plan whose sample reaches the lot records
//! `inspect_all: true` (the tables' 100 percent rule). `producer` is
//! absent: the AQL is the index, and the standard states no producer's
//! risk; `consumer` is the point the table plans are compared with.

mod judge;
mod plans;
mod record;
mod request;
mod schema;
mod tables;
mod verify;

pub use judge::{StandardJudgement, parse_class_counts};
pub use request::{MAX_CLASSES, STANDARD_ALPHA, StandardSourceRequest};
pub(crate) use schema::some_code_letter;
pub use schema::{
    ClassSource, Edition, RecordedClass, RecordedTablePlan, StandardSource, TableFileSource,
};
pub use tables::relative_table_path;
pub(crate) use verify::standard_differences;
