//! How the sources of a batch run ended, and the summary that counts them
//! and gives one line per failure: printed after a batch's table, or on
//! stderr beside JSON and CSV.

use std::fmt;

use serde::Serialize;

use crate::plain::escape_controls;

/// How one source of a batch ended, from best to worst; the worst of a run
/// sets the exit status (0, 1, 2).
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Outcome {
    /// Done: verified equal, written, or evaluated.
    Ok,
    /// Verified, and the recorded plan differs from the re-solved one.
    Mismatch,
    /// The source could not be read, parsed, solved or written.
    Invalid,
}

impl Outcome {
    /// The outcome as printed and in JSON.
    pub fn name(self) -> &'static str {
        match self {
            Outcome::Ok => "ok",
            Outcome::Mismatch => "mismatch",
            Outcome::Invalid => "invalid",
        }
    }
}

/// One source of a batch that did not end well.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Failure {
    /// The source's path as given or found.
    pub path: String,
    /// [`Outcome::Mismatch`] or [`Outcome::Invalid`].
    pub outcome: Outcome,
    /// Why, in one line: the first differing field with both values, or
    /// the error.
    pub reason: String,
}

/// What a batch run adds up to: how many sources ended each way, and the
/// failures in input order.
///
/// Printed, it is one line per failure, `mismatch  PATH: REASON` or
/// `invalid   PATH: REASON`, then the counts, `6 match, 1 mismatch,
/// 0 invalid` (a command that cannot mismatch leaves that count out:
/// `6 written, 1 invalid`).
///
/// ```
/// use lotsman::{BatchSummary, Outcome};
/// let mut s = BatchSummary::new("written", false);
/// s.push("a.yaml", Outcome::Ok, "");
/// s.push("b.yaml", Outcome::Invalid, "b.yaml: the file is empty");
/// assert_eq!(s.worst(), Outcome::Invalid);
/// assert_eq!(s.to_string(), "invalid   b.yaml: the file is empty\n1 written, 1 invalid\n");
/// ```
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct BatchSummary {
    /// What an [`Outcome::Ok`] is called in the counts: `match`,
    /// `written`, `evaluated`.
    pub ok_word: &'static str,
    /// Whether the counts show mismatches (only `verify` has them).
    pub counts_mismatch: bool,
    /// Sources that ended well.
    pub ok: usize,
    /// Sources that failed, in input order.
    pub failures: Vec<Failure>,
}

impl BatchSummary {
    /// An empty summary of a command whose successes are called `ok_word`.
    pub fn new(ok_word: &'static str, counts_mismatch: bool) -> Self {
        BatchSummary {
            ok_word,
            counts_mismatch,
            ok: 0,
            failures: Vec::new(),
        }
    }

    /// Counts one source. For a failure, `reason` is kept on one line, and
    /// a leading `PATH: ` or `PATH ` (the library's errors start with the
    /// path: `x.yaml: line 3: ...`, `x.yaml does not exist`) is dropped
    /// because the failure line names the path already.
    pub fn push(&mut self, path: &str, outcome: Outcome, reason: &str) {
        if outcome == Outcome::Ok {
            self.ok += 1;
            return;
        }
        let reason = reason
            .strip_prefix(path)
            .and_then(|r| r.strip_prefix(": ").or_else(|| r.strip_prefix(' ')))
            .unwrap_or(reason);
        self.failures.push(Failure {
            path: path.to_string(),
            outcome,
            reason: reason.split_whitespace().collect::<Vec<_>>().join(" "),
        });
    }

    /// How many sources ended with `outcome`.
    pub fn count(&self, outcome: Outcome) -> usize {
        match outcome {
            Outcome::Ok => self.ok,
            _ => self
                .failures
                .iter()
                .filter(|f| f.outcome == outcome)
                .count(),
        }
    }

    /// The worst outcome: invalid over mismatch over ok (ok for no sources).
    pub fn worst(&self) -> Outcome {
        self.failures
            .iter()
            .map(|f| f.outcome)
            .max()
            .unwrap_or(Outcome::Ok)
    }

    /// The counts line, without the failures: `6 match, 1 mismatch,
    /// 0 invalid`.
    pub fn counts(&self) -> String {
        let mut parts = vec![format!("{} {}", self.ok, self.ok_word)];
        if self.counts_mismatch {
            parts.push(format!("{} mismatch", self.count(Outcome::Mismatch)));
        }
        parts.push(format!("{} invalid", self.count(Outcome::Invalid)));
        parts.join(", ")
    }
}

impl fmt::Display for BatchSummary {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        // Paths and reasons quote file names and values: their control
        // characters are shown escaped, never sent to the terminal raw.
        for failure in &self.failures {
            writeln!(
                f,
                "{:<9} {}: {}",
                failure.outcome.name(),
                escape_controls(&failure.path),
                escape_controls(&failure.reason)
            )?;
        }
        writeln!(f, "{}", self.counts())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_worst_outcome_decides() {
        let mut s = BatchSummary::new("match", true);
        assert_eq!(s.worst(), Outcome::Ok);
        s.push("a", Outcome::Mismatch, "x");
        assert_eq!(s.worst(), Outcome::Mismatch);
        s.push("b", Outcome::Ok, "");
        assert_eq!(s.worst(), Outcome::Mismatch);
        s.push("c", Outcome::Invalid, "y");
        assert_eq!(s.worst(), Outcome::Invalid);
        assert_eq!(s.counts(), "1 match, 1 mismatch, 1 invalid");
    }
}
