//! Reading a measurements file, the other input a variables plan decides a
//! lot from: within its size limit, as UTF-8 text, parsed by
//! [`parse_measurements`].

use std::path::Path;

use super::error::{Error, SourceError};
use crate::fs::read_limited;
use crate::input::InputError;
use crate::plan::parse_measurements;

/// The largest measurements file read (10 MiB), refused by size first.
pub const MAX_MEASUREMENTS_BYTES: u64 = 10 << 20;

/// The measurements in the CSV file at `path`: one value per row, or the
/// column named `column` of a file with a header row (see
/// [`parse_measurements`]).
///
/// ```
/// use lotsman::read_measurements;
/// let path = std::path::Path::new("plans/tpw-cover-thickness-readings.csv");
/// let values = read_measurements(path, Some("thickness_mm")).unwrap();
/// assert_eq!(values.len(), 42);
/// ```
///
/// # Errors
/// [`SourceError::Io`] naming the file when it cannot be read or is larger
/// than [`MAX_MEASUREMENTS_BYTES`]; [`Error::Input`] when it is not UTF-8
/// text, or as [`parse_measurements`].
pub fn read_measurements(path: &Path, column: Option<&str>) -> Result<Vec<f64>, Error> {
    let bytes = read_limited(path, MAX_MEASUREMENTS_BYTES, "a measurements file").map_err(|e| {
        SourceError::Io {
            path: path.to_path_buf(),
            source: e,
        }
    })?;
    let text = String::from_utf8(bytes).map_err(|_| {
        InputError::Inconsistent(format!(
            "{}: the measurements file is not UTF-8 text",
            path.display()
        ))
    })?;
    Ok(parse_measurements(&text, column)?)
}
