//! Reading a measurements file, the other input a variables plan decides a
//! lot from: within its size limit, as UTF-8 text, parsed by
//! [`parse_measurements`].

use std::path::Path;

use sha2::{Digest, Sha256};

use super::error::{Error, SourceError};
use crate::fs::read_limited;
use crate::input::InputError;
use crate::plan::parse_measurements;

/// The largest measurements file read (10 MiB), refused by size first.
pub const MAX_MEASUREMENTS_BYTES: u64 = 10 << 20;

/// The readings of one lot's sample, and the file they were read from.
#[derive(Clone, Debug, PartialEq)]
pub struct Readings {
    /// The measurements, in file order.
    pub values: Vec<f64>,
    /// The SHA-256 of the file's bytes, as the ledger records it.
    pub sha256: String,
}

/// The measurements in the CSV file at `path`: one value per row, or the
/// column named `column` of a file with a header row (see
/// [`parse_measurements`]), with the file's SHA-256.
///
/// ```
/// use lotsman::read_measurements;
/// let path = std::path::Path::new("plans/tpw-cover-thickness-readings.csv");
/// let readings = read_measurements(path, Some("thickness_mm")).unwrap();
/// assert_eq!(readings.values.len(), 42);
/// assert_eq!(readings.sha256.len(), 64);
/// ```
///
/// # Errors
/// [`SourceError::Io`] naming the file when it cannot be read or is larger
/// than [`MAX_MEASUREMENTS_BYTES`]; [`Error::Input`] when it is not UTF-8
/// text, or as [`parse_measurements`].
pub fn read_measurements(path: &Path, column: Option<&str>) -> Result<Readings, Error> {
    let bytes = read_limited(path, MAX_MEASUREMENTS_BYTES, "a measurements file").map_err(|e| {
        SourceError::Io {
            path: path.to_path_buf(),
            source: e,
        }
    })?;
    // The hash is of the bytes the values are read from: one read.
    let sha256 = Sha256::digest(&bytes)
        .iter()
        .map(|b| format!("{b:02x}"))
        .collect();
    let text = String::from_utf8(bytes).map_err(|_| {
        InputError::Inconsistent(format!(
            "{}: the measurements file is not UTF-8 text",
            path.display()
        ))
    })?;
    Ok(Readings {
        values: parse_measurements(&text, column)?,
        sha256,
    })
}
