//! The errors of the ledger: a file that cannot be read or written, a row
//! that is misread (refused, never decided on), a torn last line, and a
//! lot that the ledger may not take.

use std::path::PathBuf;

use thiserror::Error;

use crate::plain::io_message;

/// Why a ledger could not be read, extended or used.
#[derive(Debug, Error)]
pub enum LedgerError {
    /// The file could not be opened, read, locked, written or synced.
    #[error("{}", io_message(path, source))]
    Io {
        /// The ledger.
        path: PathBuf,
        /// What the system said.
        source: std::io::Error,
    },
    /// The first line is not the ledger's header.
    #[error(
        "{path}, line 1: this is not a lotsman ledger (its first line must be the header '{expected}'); name a ledger written by judge --record, or a new file"
    )]
    Header {
        /// The file.
        path: PathBuf,
        /// The header a ledger starts with.
        expected: String,
    },
    /// A field of a row is misread.
    #[error("{path}, line {line}, column {column}: {message}")]
    Field {
        /// The ledger.
        path: PathBuf,
        /// The line, counted from 1 (the header is line 1).
        line: u64,
        /// The column's name.
        column: &'static str,
        /// What is wrong and what the column takes.
        message: String,
    },
    /// A row has too few or too many fields, away from the end of the file.
    #[error(
        "{path}, line {line}: the row has {found} fields and a ledger row has {expected}; the file was edited by hand: run lotsman verify on it"
    )]
    Row {
        /// The ledger.
        path: PathBuf,
        /// The line, counted from 1.
        line: u64,
        /// Fields found.
        found: usize,
        /// Fields a row has.
        expected: usize,
    },
    /// The last line was cut short (a crash while it was written).
    #[error(
        "{path}, line {line}: the last line is torn (cut short while it was written, {reason}); nothing was appended. Repair: run lotsman verify on the ledger to confirm the rows before it, then move the torn line out of the file (into a note kept beside it) and judge the lot again"
    )]
    Torn {
        /// The ledger.
        path: PathBuf,
        /// The torn line, counted from 1.
        line: u64,
        /// Why it is torn.
        reason: String,
    },
    /// The rows do not chain (an edit, a deleted or moved row).
    #[error(
        "{path}, line {line} (lot seq {seq}): the {field} does not follow from the rows before it; nothing was appended. Run lotsman verify on the ledger to see every break"
    )]
    Broken {
        /// The ledger.
        path: PathBuf,
        /// The first row that breaks the chain.
        line: u64,
        /// Its seq.
        seq: u64,
        /// The column that breaks.
        field: &'static str,
    },
    /// The lot cannot be recorded as given.
    #[error("{path}: {message}")]
    Refused {
        /// The ledger.
        path: PathBuf,
        /// Why, and what to do.
        message: String,
    },
}
