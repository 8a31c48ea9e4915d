//! Batch work over many plan sources: `verify`, `sheet` and `evaluate` of
//! files and folders.
//!
//! A batch runs in four steps:
//!
//! 1. [`expand_paths`] turns the paths a user gave into the list of sources
//!    to work on: a folder becomes its `.yaml`/`.yml` files, found through
//!    its subfolders and sorted; a file is taken as it is; a path that
//!    yields nothing becomes an invalid entry, so it is reported in its
//!    place rather than stopping the run.
//! 2. Each source is read once ([`SourceText::read`](crate::SourceText::read)),
//!    and the work of them all is checked against the budget
//!    ([`check_texts`](crate::check_texts)) before any of it starts.
//! 3. [`run_in_parallel`] does the work of every entry over all cores,
//!    keeps the input order in its answer, and reports each finished entry
//!    to a callback. The callback is a plain function, so the library draws
//!    no progress bar itself and the caller decides whether and where one
//!    appears.
//! 4. The per-source work, on the text read in step 2: [`verify_text`]
//!    (with [`check_sheet_entry`] for a sheet named beside its source),
//!    [`evaluate_text`] and, for sheets, [`write_source_sheet`] at the place
//!    [`sheet_targets`] gives each PDF, refusing a second source that would
//!    overwrite the first one's sheet. [`verify_file`] and
//!    [`evaluate_source`] do the same for one file by its path.
//!
//! Every entry ends as ok, mismatch or invalid, and
//! [`BatchSummary`](crate::BatchSummary) adds them up; the worst one decides
//! the exit status. One bad file never stops the others.

mod compare;
mod error;
mod evaluate;
mod paths;
mod run;
mod sheet;
mod targets;
mod verify;

pub use compare::{SourcePlan, compared_source};
pub use error::BatchError;
pub(crate) use evaluate::evaluate_standard;
pub use evaluate::{evaluate_source, evaluate_text};
pub use paths::{SourceFile, expand_paths};
pub use run::run_in_parallel;
pub use sheet::write_source_sheet;
pub use targets::{sheet_target, sheet_targets};
pub use verify::{check_sheet_entry, verify_file, verify_text};
