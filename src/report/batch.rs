//! The reports of batch runs: how each source ended, the evaluations of
//! many sources, and the summary that counts them and gives one line per
//! failure.

use std::fmt;

use serde::Serialize;

use super::{EvaluationReport, VariablesEvaluationReport, VerificationReport, VerifyStatus};
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

impl From<VerifyStatus> for Outcome {
    fn from(status: VerifyStatus) -> Self {
        match status {
            VerifyStatus::Match => Outcome::Ok,
            VerifyStatus::Mismatch => Outcome::Mismatch,
            VerifyStatus::Invalid => Outcome::Invalid,
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

impl VerificationReport {
    /// The summary of the verification: a mismatch is explained by its
    /// first differing field with the recorded and re-solved values (and
    /// how many more fields differ), an invalid source by its error.
    pub fn summary(&self) -> BatchSummary {
        let mut summary = BatchSummary::new("match", true);
        for e in &self.results {
            let reason = match (&e.message, e.differences.first()) {
                (Some(message), _) => message.clone(),
                (None, Some(d)) => {
                    let more = match e.differences.len() - 1 {
                        0 => String::new(),
                        1 => " (and 1 more difference)".to_string(),
                        n => format!(" (and {n} more differences)"),
                    };
                    format!("{d}{more}")
                }
                (None, None) => String::new(),
            };
            summary.push(&e.path, e.status.into(), &reason);
        }
        summary
    }
}

/// The evaluation of one source: of an attributes plan or of a variables
/// plan, each in the shape `evaluate FILE.yaml` gives it alone.
#[derive(Clone, Debug, PartialEq, Serialize)]
#[serde(untagged)]
pub enum SourceEvaluation {
    /// An attributes plan (single, double, multiple, sequential).
    Attributes(EvaluationReport),
    /// A variables plan.
    Variables(VariablesEvaluationReport),
}

impl SourceEvaluation {
    /// The discrepancy of a plan evaluated as recorded at the user's
    /// request, if any.
    pub fn accepted_recorded(&self) -> Option<&str> {
        match self {
            SourceEvaluation::Attributes(r) => r.accepted_recorded.as_deref(),
            SourceEvaluation::Variables(r) => r.accepted_recorded.as_deref(),
        }
    }
}

/// One source of `evaluate` over many: its evaluation, or why there is
/// none. In JSON exactly one of `evaluation` and `message` is present.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct EvaluationEntry {
    /// The source's path as given or found.
    pub path: String,
    /// [`Outcome::Ok`] or [`Outcome::Invalid`].
    pub status: Outcome,
    /// The evaluation, when there is one.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub evaluation: Option<SourceEvaluation>,
    /// The error, when there is no evaluation.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub message: Option<String>,
}

impl EvaluationEntry {
    /// The entry of the source at `path` from its evaluation or error.
    pub fn new(path: String, result: Result<SourceEvaluation, String>) -> Self {
        match result {
            Ok(evaluation) => EvaluationEntry {
                path,
                status: Outcome::Ok,
                evaluation: Some(evaluation),
                message: None,
            },
            Err(message) => EvaluationEntry {
                path,
                status: Outcome::Invalid,
                evaluation: None,
                message: Some(message),
            },
        }
    }
}

/// What `evaluate` reports for several sources or a folder.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct EvaluationBatchReport {
    /// One entry per source, in input order.
    pub results: Vec<EvaluationEntry>,
}

impl EvaluationBatchReport {
    /// The summary: evaluated and invalid sources.
    pub fn summary(&self) -> BatchSummary {
        let mut summary = BatchSummary::new("evaluated", false);
        for e in &self.results {
            summary.push(&e.path, e.status, e.message.as_deref().unwrap_or(""));
        }
        summary
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::report::VerifyEntry;
    use crate::source::Difference;

    fn entry(path: &str, status: VerifyStatus, diffs: usize, message: Option<&str>) -> VerifyEntry {
        VerifyEntry {
            path: path.to_string(),
            status,
            differences: (0..diffs)
                .map(|i| Difference {
                    field: format!("field{i}"),
                    recorded: format!("{i}"),
                    resolved: format!("{}", i + 1),
                })
                .collect(),
            message: message.map(str::to_string),
        }
    }

    #[test]
    fn a_mismatch_line_gives_the_first_field_and_counts_the_rest() {
        let report = VerificationReport {
            results: vec![
                entry("a.yaml", VerifyStatus::Match, 0, None),
                entry("b.yaml", VerifyStatus::Mismatch, 3, None),
                entry("c.yaml", VerifyStatus::Mismatch, 1, None),
                entry(
                    "d.yaml",
                    VerifyStatus::Invalid,
                    0,
                    Some("d.yaml: unknown field `lotsize`\n  at line 3"),
                ),
            ],
            every_source: false,
        };
        let s = report.summary();
        assert_eq!(
            s.to_string(),
            "mismatch  b.yaml: field0: recorded 0, re-solved 1 (and 2 more differences)\n\
             mismatch  c.yaml: field0: recorded 0, re-solved 1\n\
             invalid   d.yaml: unknown field `lotsize` at line 3\n\
             1 match, 2 mismatch, 1 invalid\n"
        );
        assert_eq!(s.worst(), Outcome::Invalid);
    }

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

    #[test]
    fn an_entry_has_an_evaluation_or_a_message_never_both() {
        let e = EvaluationEntry::new("x.yaml".into(), Err("x.yaml: gone".into()));
        let json = serde_json::to_value(&e).unwrap();
        assert_eq!(json["status"], "invalid");
        assert_eq!(json["message"], "x.yaml: gone");
        assert!(json.get("evaluation").is_none());
    }
}
