//! The report of `lotsman evaluate` on a standard-indexed source: the OC,
//! AOQ, ATI and ASN of each class's recorded plan at the severity in
//! force, each under its own model (a class whose AQL is above 10 counts
//! nonconformities, Poisson).
//!
//! JSON: `severity`, `code_letter`, `classes` (each with `class`, `aql`,
//! `plan_letter`, and `evaluation`, an evaluation report as `evaluate`
//! gives for one plan, or `inspect_all` with the reason when the plan's
//! sample reaches the lot), and `accepted_recorded` when the plans were
//! used as recorded although their audit does not confirm them.

use std::io::{self, Write};

use serde::Serialize;

use super::evaluation::EvaluationReport;
use super::format::Report;
use super::table_kit::accepted_line;
use crate::numeric::NumericalError;
use crate::plain::escape_controls;
use crate::standard::{Aql, CodeLetter, Severity};

/// The evaluation of every class's plan of a standard-indexed source.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct StandardEvaluationReport {
    /// The severity whose plans are evaluated (the one in force).
    pub severity: Severity,
    /// The lot's code letter.
    pub code_letter: CodeLetter,
    /// Each class, in order.
    pub classes: Vec<ClassEvaluationReport>,
    /// The discrepancy of recorded plans that the audit does not confirm
    /// and that are evaluated as recorded at the user's request
    /// (`--accept-recorded`); absent otherwise.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub accepted_recorded: Option<String>,
}

/// One class's plan and its evaluation.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct ClassEvaluationReport {
    /// The class's name; `null` for the one AQL of a source without
    /// classes.
    pub class: Option<String>,
    /// Its AQL.
    pub aql: Aql,
    /// The code letter of the row its plan stands on.
    pub plan_letter: CodeLetter,
    /// The evaluation; absent when every unit is inspected.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub evaluation: Option<EvaluationReport>,
    /// Why there is no sampling plan to evaluate: the plan's sample reaches
    /// the lot.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub inspect_all: Option<String>,
}

impl ClassEvaluationReport {
    /// The class for messages: its name, or `AQL 1.0`.
    pub fn label(&self) -> String {
        self.class
            .clone()
            .unwrap_or_else(|| format!("AQL {}", self.aql))
    }
}

impl StandardEvaluationReport {
    /// Checks every class's evaluation (see [`EvaluationReport::check`]).
    ///
    /// # Errors
    /// The first measure out of its range.
    pub fn check(&self) -> Result<(), NumericalError> {
        for c in &self.classes {
            if let Some(e) = &c.evaluation {
                e.check()?;
            }
        }
        Ok(())
    }
}

impl Report for StandardEvaluationReport {
    /// Each class under a heading, its plan's evaluation as `evaluate`
    /// prints one plan's.
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        accepted_line(out, self.accepted_recorded.as_deref())?;
        for (i, c) in self.classes.iter().enumerate() {
            if i > 0 {
                writeln!(out)?;
            }
            writeln!(
                out,
                "{}, AQL {}: {} inspection, code letter {}, plan letter {}",
                escape_controls(&c.label()),
                c.aql,
                self.severity,
                self.code_letter,
                c.plan_letter
            )?;
            match (&c.evaluation, &c.inspect_all) {
                (Some(e), _) => e.write_table(out)?,
                (None, reason) => writeln!(out, "{}", reason.as_deref().unwrap_or(""))?,
            }
        }
        Ok(())
    }

    /// One row per class and quality: the class and its AQL, then the
    /// columns of `evaluate`'s CSV for one plan under the binomial or
    /// Poisson model (`quality`, `pa`, `aoq`, `ati`, `asn`,
    /// `asn_curtailed`), with `lot_nonconforming` and `lot_quality` under
    /// the hypergeometric model, and `quality_unit`.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let mut w = super::format::csv_writer(out);
        w.write_record([
            "class",
            "aql",
            "severity",
            "plan_letter",
            "quality",
            "quality_unit",
            "lot_nonconforming",
            "lot_quality",
            "pa",
            "aoq",
            "ati",
            "asn",
            "asn_curtailed",
        ])?;
        for c in &self.classes {
            let Some(e) = &c.evaluation else { continue };
            for p in &e.points {
                w.write_record([
                    c.class.clone().unwrap_or_default(),
                    c.aql.to_string(),
                    self.severity.to_string(),
                    c.plan_letter.to_string(),
                    super::format::num(p.quality),
                    e.quality_unit.to_string(),
                    super::format::cell(p.lot_nonconforming),
                    super::format::opt(p.lot_quality),
                    super::format::num(p.pa),
                    super::format::num(p.aoq),
                    super::format::opt(p.ati),
                    super::format::num(p.asn),
                    super::format::opt(p.asn_curtailed),
                ])?;
            }
        }
        w.flush()
    }
}
