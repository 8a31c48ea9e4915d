//! The error of one path of a batch, reported in its place while the rest
//! of the batch goes on.

use std::path::PathBuf;

use thiserror::Error;

use crate::plain::{io_message, io_reason};

/// A path of a batch that yields no plan source to work on, or a sheet
/// that would replace another sheet of the same run. Each is reported
/// against its path; the rest of the batch goes on.
#[derive(Debug, Error)]
pub enum BatchError {
    /// The path does not exist or cannot be inspected.
    #[error(
        "{}; give a plan source (FILE.yaml) or a folder that holds some",
        io_message(path, source)
    )]
    Missing {
        /// The path as given.
        path: PathBuf,
        /// The cause.
        source: std::io::Error,
    },
    /// A folder, or a folder below it, cannot be listed.
    #[error("{path}: the folder cannot be listed: it {}", io_reason(source))]
    Unlistable {
        /// The folder.
        path: PathBuf,
        /// The cause.
        source: std::io::Error,
    },
    /// A folder holds no plan source.
    #[error(
        "{path}: the folder holds no plan sources; a folder is searched through its subfolders for files ending in .yaml or .yml, skipping names that start with '.'"
    )]
    EmptyFolder {
        /// The folder as given.
        path: PathBuf,
    },
    /// Two sources of one run would print to the same sheet.
    #[error(
        "{path}: its sheet {target} is already the sheet of {first} in this run; rename one of the two sources, or (for files of one name in different subfolders) give their common folder instead of the files, so that --output-dir keeps the subfolders apart"
    )]
    SheetCollision {
        /// The source whose sheet is refused.
        path: PathBuf,
        /// The PDF both would write.
        target: PathBuf,
        /// The earlier source that keeps the PDF.
        first: PathBuf,
    },
}

impl BatchError {
    /// The path the error is reported against.
    pub fn path(&self) -> &std::path::Path {
        match self {
            BatchError::Missing { path, .. }
            | BatchError::Unlistable { path, .. }
            | BatchError::EmptyFolder { path }
            | BatchError::SheetCollision { path, .. } => path,
        }
    }
}
