//! A plan source's file read once: what a command reads before it
//! estimates its work and does it, so that the estimate and the work see
//! the same bytes and no file is read twice.

use std::path::{Path, PathBuf};

use super::error::SourceError;
use super::schema::PlanSource;

/// The text of a plan source's file, read once within
/// [`MAX_SOURCE_BYTES`](crate::MAX_SOURCE_BYTES), with the path it was read
/// from (which every message about it names).
///
/// ```
/// use lotsman::SourceText;
/// let read = SourceText::read(std::path::Path::new("plans/tpw-cover-fit.yaml")).unwrap();
/// assert!(read.text.contains("schema:"));
/// assert_eq!(read.parse().unwrap().title, "Receiving inspection of terminal covers, snap fit");
/// ```
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct SourceText {
    /// The file, as given.
    pub path: PathBuf,
    /// Its text.
    pub text: String,
}

impl SourceText {
    /// Reads the source file at `path` ([`PlanSource::read_text`]).
    ///
    /// # Errors
    /// [`SourceError::Io`] when the file cannot be read, is too large or
    /// is not UTF-8 text.
    pub fn read(path: &Path) -> Result<Self, SourceError> {
        Ok(SourceText {
            path: path.to_path_buf(),
            text: PlanSource::read_text(path)?,
        })
    }

    /// The source the text holds ([`PlanSource::from_yaml`]).
    ///
    /// # Errors
    /// As [`PlanSource::from_yaml`].
    pub fn parse(&self) -> Result<PlanSource, SourceError> {
        PlanSource::from_yaml(&self.text, &self.path)
    }
}
