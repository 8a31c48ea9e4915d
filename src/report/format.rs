//! The three formats every report is written in, and the one trait a
//! report implements: its terminal table and its CSV rows. JSON is the
//! report's own `Serialize`, pretty-printed, so it needs no code of its
//! own.
//!
//! Producing the bytes is kept apart from where they go: a report writes
//! into any writer, and the caller chooses stdout or a file.

use std::io::{self, Write};

use serde::Serialize;

use crate::model::ModelKind;
use crate::numeric::Short;

/// An output format of the reports.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Format {
    /// Aligned text tables for a terminal, with the notes a reader needs.
    Table,
    /// Pretty-printed JSON, one object per report, keys in snake_case (the
    /// keys are the contract with scripts).
    Json,
    /// Comma-separated values for spreadsheets: one header row, then one
    /// row per item (alternative, quality, source or cell). Numbers are
    /// written in full precision; an empty cell is a value that does not
    /// apply.
    Csv,
}

/// What a command reports, writable in every [`Format`]: each report type
/// writes its own table and its own CSV; its JSON comes from `Serialize`.
pub trait Report: Serialize {
    /// Writes the report as aligned text tables for a terminal.
    ///
    /// # Errors
    /// The writer's error.
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()>;

    /// Writes the report as CSV (written with the csv crate: a cell holding
    /// a comma, a quote or a line break is quoted).
    ///
    /// # Errors
    /// The writer's error.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()>;
}

/// Writes `report` into `out` in `format`.
///
/// # Example
/// ```
/// use lotsman::{EvaluationReport, Format, Model, ModelKind, StagedPlan, evaluate, write_report};
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// let plan = StagedPlan::single(80, 2, &model).unwrap();
/// let report = EvaluationReport::from(&evaluate(&plan, &model, &[0.01]).unwrap());
/// let mut csv = Vec::new();
/// write_report(&report, Format::Csv, &mut csv).unwrap();
/// let text = String::from_utf8(csv).unwrap();
/// assert!(text.starts_with("quality,pa,aoq,ati,asn,asn_curtailed\n0.01,"));
/// ```
///
/// # Errors
/// The writer's error; a JSON value that cannot be serialised (a map with
/// keys that are not strings, which no report has).
pub fn write_report(report: &impl Report, format: Format, out: &mut dyn Write) -> io::Result<()> {
    match format {
        Format::Table => report.write_table(out),
        Format::Csv => report.write_csv(out),
        Format::Json => {
            serde_json::to_writer_pretty(&mut *out, report).map_err(io::Error::other)?;
            writeln!(out)
        }
    }
}

/// The CSV writer of every report: the csv crate's defaults (comma,
/// quotes only where needed, `\n` after each row).
pub(crate) fn csv_writer(out: &mut dyn Write) -> csv::Writer<&mut dyn Write> {
    csv::Writer::from_writer(out)
}

/// A CSV cell of an optional value; empty when absent.
pub(crate) fn cell<T: ToString>(v: Option<T>) -> String {
    v.map_or(String::new(), |x| x.to_string())
}

/// A number in full precision, in scientific form when tiny or huge
/// ([`Short`]): `1e-310`, not three hundred zeros.
pub(crate) fn num(x: f64) -> String {
    Short(x).to_string()
}

/// An optional number as [`num`] writes it; empty when absent.
pub(crate) fn opt(v: Option<f64>) -> String {
    v.map_or(String::new(), num)
}

/// The head of a CSV column of qualities named `name`: the name alone for
/// a fraction nonconforming, with `_per_unit` for nonconformities per unit.
pub(crate) fn quality_column(name: &str, model: ModelKind) -> String {
    match model {
        ModelKind::Poisson => format!("{name}_per_unit"),
        _ => name.to_string(),
    }
}
