//! The report of `lotsman evaluate` over several sources or a folder: each
//! source's evaluation under its path, or why there is none, and the
//! summary of the batch.

use std::io::{self, Write};

use serde::Serialize;

use super::batch::{BatchSummary, Outcome};
use super::evaluation::EvaluationReport;
use super::format::{Report, cell, csv_writer, num, opt};
use super::standard_evaluation::StandardEvaluationReport;
use super::variables_evaluation::VariablesEvaluationReport;
use crate::plain::escape_controls;
use crate::plan::Measures;

/// The evaluation of one source: of an attributes plan or of a variables
/// plan, each in the shape `evaluate FILE.yaml` gives it alone.
#[derive(Clone, Debug, PartialEq, Serialize)]
#[serde(untagged)]
pub enum SourceEvaluation {
    /// An attributes plan (single, double, multiple, sequential).
    Attributes(EvaluationReport),
    /// A variables plan.
    Variables(VariablesEvaluationReport),
    /// The plans of a standard-indexed source, one per class.
    Standard(StandardEvaluationReport),
}

impl SourceEvaluation {
    /// The discrepancy of a plan evaluated as recorded at the user's
    /// request, if any.
    pub fn accepted_recorded(&self) -> Option<&str> {
        match self {
            SourceEvaluation::Attributes(r) => r.accepted_recorded.as_deref(),
            SourceEvaluation::Variables(r) => r.accepted_recorded.as_deref(),
            SourceEvaluation::Standard(r) => r.accepted_recorded.as_deref(),
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

impl Report for EvaluationBatchReport {
    /// Each source's table under its path, then the summary.
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        let r = self;
        for e in &r.results {
            writeln!(out, "Source {}", escape_controls(&e.path))?;
            match (&e.evaluation, &e.message) {
                (Some(SourceEvaluation::Attributes(report)), _) => report.write_table(out)?,
                (Some(SourceEvaluation::Variables(report)), _) => report.write_table(out)?,
                (Some(SourceEvaluation::Standard(report)), _) => report.write_table(out)?,
                (None, message) => writeln!(
                    out,
                    "invalid: {}",
                    escape_controls(message.as_deref().unwrap_or(""))
                )?,
            }
            writeln!(out)?;
        }
        write!(out, "{}", r.summary())
    }

    /// One header for attributes and variables sources alike: a variables
    /// row leaves `asn_curtailed` empty and gives `asn = n` (every lot
    /// measures n units), an attributes row leaves `pa_centred` empty, and
    /// an invalid source has one row with its `message`. `quality_unit`
    /// says what the row's quality and AOQ are (`fraction` or `per_unit`);
    /// `lot_nonconforming` and `lot_quality` are the lot's D and D/N under
    /// the hypergeometric model, empty otherwise.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let report = self;
        let mut w = csv_writer(out);
        w.write_record([
            "source",
            "status",
            "quality",
            "quality_unit",
            "lot_nonconforming",
            "lot_quality",
            "pa",
            "pa_centred",
            "aoq",
            "ati",
            "asn",
            "asn_curtailed",
            "message",
        ])?;
        for e in &report.results {
            let (path, status) = (e.path.clone(), e.status.name().to_string());
            match &e.evaluation {
                Some(SourceEvaluation::Attributes(r)) => {
                    for p in &r.points {
                        w.write_record(attributes_row(&path, &status, r, p, String::new()))?;
                    }
                }
                Some(SourceEvaluation::Variables(r)) => {
                    for p in &r.points {
                        w.write_record([
                            path.clone(),
                            status.clone(),
                            num(p.quality),
                            "fraction".to_string(),
                            String::new(),
                            String::new(),
                            num(p.pa),
                            opt(p.pa_centred),
                            num(p.aoq),
                            opt(p.ati),
                            r.variables.n.to_string(),
                            String::new(),
                            String::new(),
                        ])?;
                    }
                }
                // One row per class and quality, the class named in the
                // message column (the batch's columns have no class).
                Some(SourceEvaluation::Standard(r)) => {
                    for c in &r.classes {
                        let Some(e) = &c.evaluation else { continue };
                        for p in &e.points {
                            let message = format!("class {}, {} inspection", c.label(), r.severity);
                            w.write_record(attributes_row(&path, &status, e, p, message))?;
                        }
                    }
                }
                None => {
                    let mut row = vec![path, status];
                    row.extend(std::iter::repeat_n(String::new(), 10));
                    row.push(e.message.clone().unwrap_or_default());
                    w.write_record(&row)?;
                }
            }
        }
        w.flush()
    }
}

/// The CSV row of one point of an attributes plan's evaluation, with the
/// batch's `message` column.
fn attributes_row(
    path: &str,
    status: &str,
    r: &EvaluationReport,
    p: &Measures,
    message: String,
) -> [String; 13] {
    [
        path.to_string(),
        status.to_string(),
        num(p.quality),
        r.model.quality_unit().to_string(),
        cell(p.lot_nonconforming),
        opt(p.lot_quality),
        num(p.pa),
        String::new(),
        num(p.aoq),
        opt(p.ati),
        num(p.asn),
        opt(p.asn_curtailed),
        message,
    ]
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn an_entry_has_an_evaluation_or_a_message_never_both() {
        let e = EvaluationEntry::new("x.yaml".into(), Err("x.yaml: gone".into()));
        let json = serde_json::to_value(&e).unwrap();
        assert_eq!(json["status"], "invalid");
        assert_eq!(json["message"], "x.yaml: gone");
        assert!(json.get("evaluation").is_none());
    }
}
