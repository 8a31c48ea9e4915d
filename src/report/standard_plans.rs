//! The report of `lotsman design FILE` on a standard-indexed source: the
//! plans the tables give, as the source records them, for each class at
//! each severity, with the severity in force marked.
//!
//! JSON: `title`, `edition`, `level`, `lot_size`, `code_letter`, `form`,
//! `severity`, and `classes` as the source records them (`name`, `aql`,
//! and `normal`, `tightened`, `reduced`, each with `plan_letter`,
//! `stages` and `inspect_all` when set).

use std::io::{self, Write};

use serde::Serialize;

use super::format::{Report, cell, csv_writer};
use super::table_kit::grid;
use crate::design::Scheme;
use crate::input::InputError;
use crate::plain::escape_controls;
use crate::source::{PlanSource, RecordedClass};
use crate::standard::{CodeLetter, InspectionLevel, Severity};

/// The table plans a standard-indexed source records.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct StandardPlansReport {
    /// The source's title.
    pub title: String,
    /// The edition whose tables were read.
    pub edition: &'static str,
    /// The inspection level.
    pub level: InspectionLevel,
    /// The lot size.
    pub lot_size: u64,
    /// The lot's code letter (Table I).
    pub code_letter: CodeLetter,
    /// The form of the plans: single, double or multiple.
    pub form: Scheme,
    /// The severity in force.
    pub severity: Severity,
    /// Each class's plans, as recorded.
    pub classes: Vec<RecordedClass>,
}

impl StandardPlansReport {
    /// The report of the plans `source` records.
    ///
    /// # Errors
    /// As [`PlanSource::recorded_standard`].
    pub fn new(source: &PlanSource) -> Result<Self, InputError> {
        let (recorded, request) = source.recorded_standard()?;
        let edition = source
            .standard
            .as_ref()
            .map_or("MIL-STD-105E", |s| s.edition.name());
        Ok(StandardPlansReport {
            title: source.title.clone(),
            edition,
            level: request.request.level(),
            lot_size: request.request.lot_size(),
            code_letter: recorded.code_letter.unwrap_or_default(),
            form: request.request.scheme(),
            severity: request.request.severity(),
            classes: recorded.classes.clone(),
        })
    }

    /// Each plan as a row: class, AQL, severity, the plan's letter, and
    /// each stage's cumulative units, Ac and Re (one row per stage).
    fn rows(&self) -> Vec<[String; 8]> {
        let mut rows = Vec::new();
        for class in &self.classes {
            for severity in Severity::ALL {
                let Some(plan) = class.at(severity) else {
                    continue;
                };
                let marked = if severity == self.severity {
                    format!("{severity} (in force)")
                } else {
                    severity.to_string()
                };
                for (i, s) in plan.stages.iter().enumerate() {
                    let first = i == 0;
                    rows.push([
                        if first { class.label() } else { String::new() },
                        if first {
                            class.aql.to_string()
                        } else {
                            String::new()
                        },
                        if first { marked.clone() } else { String::new() },
                        if first {
                            plan.plan_letter.to_string()
                        } else {
                            String::new()
                        },
                        (i + 1).to_string(),
                        s.n.to_string(),
                        s.accept.map_or("-".to_string(), |a| a.to_string()),
                        s.reject.to_string(),
                    ]);
                }
                if plan.inspect_all {
                    rows.push([
                        String::new(),
                        String::new(),
                        String::new(),
                        String::new(),
                        String::new(),
                        "every unit".to_string(),
                        String::new(),
                        String::new(),
                    ]);
                }
            }
        }
        rows
    }
}

impl Report for StandardPlansReport {
    /// The letter and how it was found, then one row per stage of each
    /// class's plan at each severity, and what to do where a plan's sample
    /// reaches the lot.
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        writeln!(out, "{}", escape_controls(&self.title))?;
        writeln!(
            out,
            "{}, inspection level {}, lot of {} units: code letter {}; {} sampling; {} inspection in force",
            self.edition, self.level, self.lot_size, self.code_letter, self.form, self.severity
        )?;
        let mut g = grid(&[
            "Class",
            "AQL",
            "Severity",
            "Plan letter",
            "Stage",
            "Units in all",
            "Ac",
            "Re",
        ]);
        for row in self.rows() {
            g.add_row(row.map(|c| escape_controls(&c).into_owned()).to_vec());
        }
        writeln!(out, "{g}")?;
        if self.classes.iter().any(|c| {
            Severity::ALL
                .iter()
                .any(|&s| c.at(s).is_some_and(|p| p.inspect_all))
        }) {
            writeln!(
                out,
                "'every unit': the plan's sample reaches the lot, so every unit of the lot is inspected instead (the tables' 100 percent rule)."
            )?;
        }
        if self
            .classes
            .iter()
            .filter_map(|c| c.reduced.as_ref())
            .any(|p| {
                p.stages
                    .last()
                    .is_some_and(|s| s.accept.is_some_and(|a| a + 1 < s.reject))
            })
        {
            writeln!(
                out,
                "Reduced inspection: a final count above Ac and below Re accepts the lot, and the next lot returns to normal inspection (105E, 4.10.1.4)."
            )?;
        }
        Ok(())
    }

    /// One row per stage of each plan.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let mut w = csv_writer(out);
        w.write_record([
            "class",
            "aql",
            "severity",
            "in_force",
            "plan_letter",
            "stage",
            "n",
            "accept",
            "reject",
            "inspect_all",
        ])?;
        for class in &self.classes {
            for severity in Severity::ALL {
                let Some(plan) = class.at(severity) else {
                    continue;
                };
                for (i, s) in plan.stages.iter().enumerate() {
                    w.write_record([
                        class.name.clone().unwrap_or_default(),
                        class.aql.to_string(),
                        severity.to_string(),
                        (severity == self.severity).to_string(),
                        plan.plan_letter.to_string(),
                        (i + 1).to_string(),
                        s.n.to_string(),
                        cell(s.accept),
                        s.reject.to_string(),
                        plan.inspect_all.to_string(),
                    ])?;
                }
            }
        }
        w.flush()
    }
}
