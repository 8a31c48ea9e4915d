//! Verifying one plan source from its file, as a batch needs it: every
//! outcome, including an unreadable file, is an entry and never an error.

use std::path::Path;

use crate::input::InputError;
use crate::print::SheetVerdict;
use crate::report::{VerifyEntry, VerifyStatus};
use crate::source::{Difference, PlanSource, SourceText, Verdict, verify_at};

/// Reads, re-solves and compares the source at `path` (see
/// [`verify_at`](crate::verify_at)). A file that cannot be read, parsed or
/// solved, or that records a plan which is no valid plan (an acceptance
/// number above the sample, stages out of order), is an
/// [`VerifyStatus::Invalid`] entry whose message names the path and the
/// cause.
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
    match SourceText::read(path) {
        Ok(read) => verify_text(&read),
        Err(e) => invalid(path, e.to_string()),
    }
}

/// [`verify_file`] of a source already read, so that the file is not read
/// again.
pub fn verify_text(read: &SourceText) -> VerifyEntry {
    let path = read.path.as_path();
    let entry = |status, differences, message| VerifyEntry {
        path: path.display().to_string(),
        status,
        differences,
        message,
    };
    let source = match read.parse() {
        Ok(s) => s,
        Err(e) => return invalid(path, e.to_string()),
    };
    match verify_at(&source, path) {
        Ok(Verdict::Match) => entry(VerifyStatus::Match, Vec::new(), None),
        // A recorded plan that is no valid plan at all (c above n, stages
        // out of order) is invalid, not merely different; the differing
        // fields are still listed.
        Ok(Verdict::Mismatch(diffs)) => match recorded_plan_is_valid(&source) {
            Ok(()) => entry(VerifyStatus::Mismatch, diffs, None),
            Err(why) => entry(
                VerifyStatus::Invalid,
                diffs,
                Some(format!("the recorded plan is not a valid plan: {why}")),
            ),
        },
        // An input error is said of the file, so that the advice of one
        // not solved yet names it.
        Err(crate::Error::Input(e)) => {
            let e = crate::SourceError::Invalid {
                path: path.to_path_buf(),
                source: e,
            };
            invalid(path, e.to_string())
        }
        Err(e) => invalid(path, e.to_string()),
    }
}

/// The entry of a source that cannot be verified, and why.
fn invalid(path: &Path, message: String) -> VerifyEntry {
    VerifyEntry {
        path: path.display().to_string(),
        status: VerifyStatus::Invalid,
        differences: Vec::new(),
        message: Some(message),
    }
}

/// Adds to `entry`, the verification of a source, what the check of its
/// sheet at `pdf` found ([`check_sheet`](crate::check_sheet)): a forged or
/// foreign sheet makes a matching entry a mismatch, naming the differing
/// hashes when the sheet carries another source's; a sheet that cannot be
/// read or checked makes it invalid.
///
/// ```
/// use lotsman::{SheetVerdict, VerifyStatus, check_sheet_entry, verify_file};
/// let source = std::path::Path::new("plans/tpw-cover-fit.yaml");
/// let mut entry = verify_file(source);
/// let verdict = SheetVerdict::Foreign {
///     reason: "fit.pdf: another source's sheet".to_string(),
///     hashes: Some(("aa".to_string(), "bb".to_string())),
/// };
/// check_sheet_entry(&mut entry, std::path::Path::new("fit.pdf"), verdict);
/// assert_eq!(entry.status, VerifyStatus::Mismatch);
/// assert_eq!(entry.differences[0].field, "sheet fit.pdf source SHA-256");
/// assert_eq!(entry.message.as_deref(), Some("fit.pdf: another source's sheet"));
/// ```
pub fn check_sheet_entry(entry: &mut VerifyEntry, pdf: &Path, verdict: SheetVerdict) {
    match verdict {
        SheetVerdict::Genuine => {}
        SheetVerdict::Foreign { reason, hashes } => {
            if entry.status == VerifyStatus::Match {
                entry.status = VerifyStatus::Mismatch;
            }
            if let Some((recorded, resolved)) = hashes {
                entry.differences.push(Difference {
                    field: format!("sheet {} source SHA-256", pdf.display()),
                    recorded,
                    resolved,
                });
            }
            if entry.message.is_none() {
                entry.message = Some(reason);
            }
        }
        SheetVerdict::Unreadable(message) => {
            entry.status = VerifyStatus::Invalid;
            entry.message = Some(message);
        }
    }
}

/// Whether the plan a source records, if any, is a valid plan for the
/// source's model or specification.
fn recorded_plan_is_valid(source: &PlanSource) -> Result<(), InputError> {
    if source.plan.is_none() {
        return Ok(());
    }
    if source.is_standard() {
        source.recorded_standard()?;
    } else if source.is_variables() {
        let request = source.variables_request()?;
        source.recorded_variables_plan(&request)?;
    } else {
        source.recorded_plan(&source.staged_model()?)?;
    }
    Ok(())
}
