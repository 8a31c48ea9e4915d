//! Verifying one plan source from its file, as a batch needs it: every
//! outcome, including an unreadable file, is an entry and never an error.

use std::path::Path;

use crate::input::InputError;
use crate::report::{VerifyEntry, VerifyStatus};
use crate::source::{PlanSource, Verdict, verify};

/// Reads, re-solves and compares the source at `path` (see
/// [`verify`](crate::verify)). A file that cannot be read, parsed or
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
            entry(VerifyStatus::Invalid, Vec::new(), Some(e.to_string()))
        }
        Err(e) => entry(VerifyStatus::Invalid, Vec::new(), Some(e.to_string())),
    }
}

/// Whether the plan a source records, if any, is a valid plan for the
/// source's model or specification.
fn recorded_plan_is_valid(source: &PlanSource) -> Result<(), InputError> {
    if source.plan.is_none() {
        return Ok(());
    }
    if source.is_variables() {
        let request = source.variables_request()?;
        source.recorded_variables_plan(&request)?;
    } else {
        source.recorded_plan(&source.staged_model()?)?;
    }
    Ok(())
}
