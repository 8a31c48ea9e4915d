//! The error of writing a file.

use std::path::PathBuf;

use thiserror::Error;

use crate::plain::io_message;

/// A file that cannot be written, or that exists when replacing it was not
/// asked for. A plan source's error ([`SourceError`](crate::SourceError))
/// carries it with the same words.
#[derive(Debug, Error)]
pub enum FileError {
    /// The file system refused.
    #[error("{}", io_message(path, source))]
    Io {
        /// The file.
        path: PathBuf,
        /// The cause.
        source: std::io::Error,
    },
    /// A file to be written exists already, and replacing it was not asked
    /// for.
    #[error("{path} already exists; give --force to replace it (nothing was written)")]
    Exists {
        /// The existing file.
        path: PathBuf,
    },
}
