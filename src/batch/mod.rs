//! Batch work over many plan sources: `verify`, `sheet` and `evaluate` of
//! files and folders.
//!
//! A batch runs in three steps, one file each:
//!
//! 1. [`expand_paths`] turns the paths a user gave into the list of sources
//!    to work on: a folder becomes its `.yaml`/`.yml` files, found through
//!    its subfolders and sorted; a file is taken as it is; a path that
//!    yields nothing becomes an invalid entry, so it is reported in its
//!    place rather than stopping the run.
//! 2. [`run_in_parallel`] does the work of every entry over all cores,
//!    keeps the input order in its answer, and reports each finished entry
//!    to a callback. The callback is a plain function, so the library draws
//!    no progress bar itself and the caller decides whether and where one
//!    appears.
//! 3. The per-source work: [`verify_file`], [`evaluate_source`] and, for
//!    sheets, [`sheet_targets`], which places each PDF and refuses a second
//!    source that would overwrite the first one's sheet.
//!
//! Every entry ends as ok, mismatch or invalid, and
//! [`BatchSummary`](crate::BatchSummary) adds them up; the worst one decides
//! the exit status. One bad file never stops the others.

mod error;
mod evaluate;
mod paths;
mod run;
mod targets;
mod verify;

pub use error::BatchError;
pub use evaluate::evaluate_source;
pub use paths::{SourceFile, expand_paths};
pub use run::run_in_parallel;
pub use targets::{sheet_target, sheet_targets};
pub use verify::verify_file;
