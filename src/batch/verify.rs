//! Verifying one plan source from its file, as a batch needs it: every
//! outcome, including an unreadable file, is an entry and never an error.

use std::path::Path;

use crate::report::{VerifyEntry, VerifyStatus};
use crate::source::{PlanSource, Verdict, verify};

/// Reads, re-solves and compares the source at `path` (see
/// [`verify`](crate::verify)). A file that cannot be read, parsed or
/// solved is an [`VerifyStatus::Invalid`] entry whose message names the
/// path and the cause.
///
/// ```
/// use lotsman::{VerifyStatus, verify_file};
/// let entry = verify_file(std::path::Path::new("plans/tpw-cover-fit.yaml"));
/// assert_eq!(entry.status, VerifyStatus::Match);
/// let entry = verify_file(std::path::Path::new("plans/no-such-plan.yaml"));
/// assert_eq!(entry.status, VerifyStatus::Invalid);
/// assert!(entry.message.unwrap().contains("no-such-plan.yaml"));
/// ```
pub fn verify_file(path: &Path) -> VerifyEntry {
    let entry = |status, differences, message| VerifyEntry {
        path: path.display().to_string(),
        status,
        differences,
        message,
    };
    let source = match PlanSource::load(path) {
        Ok(s) => s,
        Err(e) => return entry(VerifyStatus::Invalid, Vec::new(), Some(e.to_string())),
    };
    match verify(&source) {
        Ok(Verdict::Match) => entry(VerifyStatus::Match, Vec::new(), None),
        Ok(Verdict::Mismatch(diffs)) => entry(VerifyStatus::Mismatch, diffs, None),
        Err(e) => entry(VerifyStatus::Invalid, Vec::new(), Some(e.to_string())),
    }
}
