//! The errors of plan sources, and the one error type of the library's
//! source-level work ([`Error`]), which carries the error of any layer
//! below. Every message names the parameter, the value it was given and
//! the range it must lie in, so that one line on a terminal is enough to
//! fix the input.

use std::path::PathBuf;

use thiserror::Error;

use super::discrepancy::Discrepancy;
use crate::design::DesignError;
use crate::fs::FileError;
use crate::input::InputError;
use crate::numeric::NumericalError;
use crate::plain::{io_message, shell_path};

/// A plan source that cannot be read, parsed or written.
#[derive(Debug, Error)]
pub enum SourceError {
    /// The file system refused.
    #[error("{}", io_message(path, source))]
    Io {
        /// The file.
        path: PathBuf,
        /// The cause.
        source: std::io::Error,
    },
    /// The YAML does not parse, or does not fit the schema (the message
    /// says, in plain words, what the field must hold, and gives its line).
    #[error("{path}: {message}")]
    Parse {
        /// The file.
        path: PathBuf,
        /// What is wrong and where, in plain words.
        message: String,
    },
    /// The YAML parses but holds an invalid value.
    #[error("{}", invalid_message(path, source))]
    Invalid {
        /// The file.
        path: PathBuf,
        /// What is wrong.
        source: InputError,
    },
    /// The source's risk points have no plan.
    #[error("{path}: {source}")]
    Design {
        /// The file.
        path: PathBuf,
        /// Why.
        source: DesignError,
    },
    /// The recorded plan differs from a re-solve of its risk points, or no
    /// longer meets them, and using it as recorded (to print, evaluate or
    /// judge by) was not asked for.
    #[error(
        "{path}: {discrepancy}; re-solve it with: lotsman design {} --in-place, or use the plan as recorded with --accept-recorded, which states the discrepancy in the output",
        shell_path(path)
    )]
    Unconfirmed {
        /// The source.
        path: PathBuf,
        /// What the audit found.
        discrepancy: Discrepancy,
    },
    /// A file to be written exists already, and replacing it was not asked
    /// for.
    #[error("{path} already exists; give --force to replace it (nothing was written)")]
    Exists {
        /// The existing file.
        path: PathBuf,
    },
}

/// Any error of the library, for callers that only report it.
#[derive(Debug, Error)]
pub enum Error {
    /// See [`InputError`].
    #[error(transparent)]
    Input(#[from] InputError),
    /// See [`DesignError`].
    #[error(transparent)]
    Design(#[from] DesignError),
    /// See [`SourceError`].
    #[error(transparent)]
    Source(#[from] SourceError),
    /// A standard-indexed request without an answer; see
    /// [`StandardError`](crate::StandardError).
    #[error(transparent)]
    Standard(#[from] crate::standard::StandardError),
    /// A computed number out of its range; see
    /// [`NumericalError`](crate::NumericalError).
    #[error(transparent)]
    Numerical(#[from] NumericalError),
    /// A ledger of lots that cannot be read, extended or used.
    #[error(transparent)]
    Ledger(#[from] crate::ledger::LedgerError),
    /// Writing a report failed.
    #[error("{}", io_message(std::path::Path::new("the output"), .0).trim_start_matches("the output: "))]
    Output(#[from] std::io::Error),
}

impl From<FileError> for SourceError {
    /// A file that cannot be written is a source's I/O error or an
    /// existing file, in the same words.
    fn from(e: FileError) -> Self {
        match e {
            FileError::Io { path, source } => SourceError::Io { path, source },
            FileError::Exists { path } => SourceError::Exists { path },
        }
    }
}

impl From<FileError> for Error {
    fn from(e: FileError) -> Self {
        Error::Source(e.into())
    }
}

/// The refusal of a source that records no plan: it has not been solved.
pub(crate) fn not_solved() -> InputError {
    InputError::NotSolved {
        why: "not solved yet: the source records no plan".to_string(),
    }
}

/// The message of [`SourceError::Invalid`]: the path, then what is wrong;
/// the advice of [`InputError::NotSolved`] names the source itself.
fn invalid_message(path: &std::path::Path, source: &InputError) -> String {
    match source {
        InputError::NotSolved { why } => format!(
            "{}: {why}; solve it with: lotsman design {} --in-place",
            path.display(),
            shell_path(path)
        ),
        other => format!("{}: {other}", path.display()),
    }
}
