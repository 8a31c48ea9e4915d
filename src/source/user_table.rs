//! Reading a user's own copy of one of the standard's tables from a file:
//! within the source size limit, as UTF-8 text, checked by
//! [`load_user_table`].

use std::path::Path;

use super::error::{Error, SourceError};
use super::limits::MAX_SOURCE_BYTES;
use crate::fs::read_limited;
use crate::input::InputError;
use crate::standard::{Severity, UserTable, load_user_table};

/// The table in the CSV file at `path`; a table of plans stands for the
/// master table of `severity` (see [`load_user_table`]).
///
/// # Errors
/// [`SourceError::Io`] when the file cannot be read or is larger than a
/// table file may be; [`Error::Input`] when it is not UTF-8 text;
/// [`Error::Standard`] when it does not have a table's shape.
pub fn read_user_table(path: &Path, severity: Severity) -> Result<UserTable, Error> {
    let text = read_table_text(path)?;
    Ok(load_user_table(
        &path.display().to_string(),
        &text,
        severity,
    )?)
}

/// The text of the table file at `path`, before its shape is read (a plan
/// source checks its SHA-256 first).
///
/// # Errors
/// [`SourceError::Io`] naming the file when it cannot be read or is larger
/// than [`MAX_SOURCE_BYTES`]; [`Error::Input`] when it is not UTF-8 text.
pub(crate) fn read_table_text(path: &Path) -> Result<String, Error> {
    let bytes =
        read_limited(path, MAX_SOURCE_BYTES, "a table file").map_err(|e| SourceError::Io {
            path: path.to_path_buf(),
            source: e,
        })?;
    String::from_utf8(bytes).map_err(|_| {
        InputError::Inconsistent(format!(
            "{}: the table file is not UTF-8 text; save it as CSV in UTF-8",
            path.display()
        ))
        .into()
    })
}
