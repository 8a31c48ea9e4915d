//! The report of `lotsman verify`: for each source, whether its recorded
//! plan is the plan a re-solve gives, and how the batch adds up.

use std::io::{self, Write};

use comfy_table::CellAlignment;
use serde::Serialize;

use super::batch::{BatchSummary, Outcome};
use super::format::{Report, csv_writer};
use super::table_kit::grid;
use crate::plain::escape_controls;
use crate::source::Difference;

/// How one source fared under `verify`.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum VerifyStatus {
    /// Recorded plan equals the re-solved one.
    Match,
    /// They differ.
    Mismatch,
    /// The source could not be read, parsed or solved.
    Invalid,
}

impl VerifyStatus {
    /// The status as printed and in JSON.
    pub fn name(self) -> &'static str {
        match self {
            VerifyStatus::Match => "match",
            VerifyStatus::Mismatch => "mismatch",
            VerifyStatus::Invalid => "invalid",
        }
    }
}

/// One source's verification.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct VerifyEntry {
    /// The source's path as given.
    pub path: String,
    /// Outcome.
    pub status: VerifyStatus,
    /// The differing fields, for a mismatch.
    pub differences: Vec<Difference>,
    /// The error, for an invalid source.
    pub message: Option<String>,
}

/// What `verify` reports.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct VerificationReport {
    /// One entry per source, in the order given.
    pub results: Vec<VerifyEntry>,
    /// Whether a table lists every source, or only the failures (JSON and
    /// CSV always give every source).
    #[serde(skip)]
    pub every_source: bool,
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

impl From<VerifyStatus> for Outcome {
    fn from(status: VerifyStatus) -> Self {
        match status {
            VerifyStatus::Match => Outcome::Ok,
            VerifyStatus::Mismatch => Outcome::Mismatch,
            VerifyStatus::Invalid => Outcome::Invalid,
        }
    }
}

impl Report for VerificationReport {
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        let r = self;
        let summary = r.summary();
        if !r.every_source {
            return write!(out, "{summary}");
        }
        let mut g = grid(&["Source", "Result", "Details"]);
        if let Some(col) = g.column_mut(2) {
            col.set_cell_alignment(CellAlignment::Left);
        }
        for e in &r.results {
            let details = if let Some(m) = &e.message {
                m.clone()
            } else {
                e.differences
                    .iter()
                    .map(|d| {
                        format!(
                            "{}: recorded {}, re-solved {}",
                            d.field, d.recorded, d.resolved
                        )
                    })
                    .collect::<Vec<_>>()
                    .join("; ")
            };
            g.add_row(vec![
                escape_controls(&e.path).into_owned(),
                e.status.name().to_string(),
                escape_controls(&details).into_owned(),
            ]);
        }
        writeln!(out, "{g}")?;
        writeln!(out, "{}", summary.counts())
    }

    /// One row per differing field; one row for a source that matches or
    /// is invalid, with its message.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let report = self;
        let mut w = csv_writer(out);
        w.write_record(["path", "status", "field", "recorded", "resolved", "message"])?;
        for e in &report.results {
            let status = e.status.name();
            if e.differences.is_empty() {
                let message = e.message.as_deref().unwrap_or("");
                w.write_record([e.path.as_str(), status, "", "", "", message])?;
            }
            for d in &e.differences {
                w.write_record([
                    e.path.as_str(),
                    status,
                    &d.field,
                    &d.recorded,
                    &d.resolved,
                    "",
                ])?;
            }
        }
        w.flush()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

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
}
