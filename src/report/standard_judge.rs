//! The report of `lotsman judge` on a standard-indexed source: the lot
//! decided per class of defects and overall, with each class's numbers as
//! the table prints them (105E, 4.10): accepted when every class accepts,
//! rejected as soon as one class rejects, otherwise inspection goes on for
//! the classes not yet decided.
//!
//! JSON: `decision` (`accept`, `reject`, `continue`), `severity`,
//! `code_letter`, `sample_size` (the units to draw), `classes` (each with
//! `class`, `aql`, `stage`, `n`, `accept`, `reject`, `found`, `decision`,
//! `next_units`, `reinstates_normal`), `notes`, and `accepted_recorded`
//! when the plans were used as recorded although their audit does not
//! confirm them.

use std::io::{self, Write};
use std::path::PathBuf;

use serde::Serialize;

use super::format::{Report, cell, csv_writer};
use super::table_kit::{accepted_line, grid};
use crate::plain::escape_controls;
use crate::plan::{Decision, Stage};
use crate::standard::{Aql, ClassDecision, ClassPlans, ClassVerdict, CodeLetter, Severity};

/// The decision on a lot inspected for one or more classes of defects by
/// the plans of a standard-indexed source.
#[derive(Clone, Debug, PartialEq)]
pub struct StandardJudgeReport {
    /// The decisions of every class and of the lot.
    pub verdict: ClassVerdict,
    /// The plans the lot was judged by.
    pub plans: ClassPlans,
    /// The severity of inspection they are for.
    pub severity: Severity,
    /// The plan source they were read from.
    pub source: PathBuf,
    /// The discrepancy of recorded plans that the audit does not confirm
    /// and that decided the lot at the user's request
    /// (`--accept-recorded`); `None` otherwise.
    pub accepted_recorded: Option<String>,
}

/// One class's row of the report.
#[derive(Clone, Debug, PartialEq, Serialize)]
struct ClassRow {
    /// The class's name; `null` for the one AQL of a source without
    /// classes.
    class: Option<String>,
    aql: Aql,
    /// The stage (from 1) at which the class was decided or stands.
    stage: usize,
    /// The units this class has counted in, cumulative.
    n: u64,
    /// The table's acceptance number at that stage (`null`: cannot accept).
    accept: Option<u64>,
    /// The table's rejection number at that stage.
    reject: u64,
    /// The cumulative count found.
    found: u64,
    decision: Decision,
    /// For a class that goes on: the units its next stage draws.
    next_units: Option<u64>,
    /// On reduced inspection: the count lies between Ac and Re, so the lot
    /// is accepted and the next lot returns to normal inspection.
    reinstates_normal: bool,
}

#[derive(Serialize)]
struct Json<'a> {
    decision: Decision,
    severity: Severity,
    code_letter: CodeLetter,
    sample_size: u64,
    classes: Vec<ClassRow>,
    notes: Vec<String>,
    #[serde(skip_serializing_if = "Option::is_none")]
    accepted_recorded: Option<&'a str>,
}

impl StandardJudgeReport {
    /// Each class's row: the table's numbers at the stage it reached.
    fn rows(&self) -> Vec<ClassRow> {
        self.verdict
            .classes
            .iter()
            .zip(&self.plans.classes)
            .map(|(d, p)| {
                let j = &d.judgement;
                let table: Option<Stage> = p
                    .answer
                    .plan()
                    .and_then(|plan| plan.table_numbers.get(j.stage.saturating_sub(1)))
                    .copied();
                ClassRow {
                    class: d.class.name.clone(),
                    aql: d.class.aql,
                    stage: j.stage,
                    n: j.inspected,
                    accept: table.map_or(j.accept, |s| s.accept),
                    reject: table.map_or(j.reject, |s| s.reject),
                    found: j.cumulative_count,
                    decision: j.decision,
                    next_units: j.next_units,
                    reinstates_normal: d.reinstates_normal,
                }
            })
            .collect()
    }

    /// What an inspector must know beside the decisions: the count in a
    /// reduced plan's gap, and how one draw serves classes whose plans
    /// take different samples.
    pub fn notes(&self) -> Vec<String> {
        let mut notes = Vec::new();
        for row in self.rows().iter().filter(|r| r.reinstates_normal) {
            notes.push(format!(
                "{}: the count {} lies between Ac {} and Re {} of the reduced plan: the lot is accepted, and the next lot returns to normal inspection (105E, 4.10.1.4)",
                label(row),
                row.found,
                row.accept.map_or("-".to_string(), |a| a.to_string()),
                row.reject
            ));
        }
        let sizes: Vec<u64> = self
            .plans
            .classes
            .iter()
            .map(|c| c.answer.table_plan().sample_size())
            .collect();
        if sizes.windows(2).any(|w| w[0] != w[1]) {
            let each: Vec<String> = self
                .plans
                .classes
                .iter()
                .zip(&sizes)
                .map(|(c, n)| format!("{} {n}", c.class.label()))
                .collect();
            // The smaller samples must be random samples too: the units
            // are drawn in nested stages, each class counting the first
            // units in draw order, never the lowest positions of a sorted
            // list (which would favour the front of the lot).
            let mut nested: Vec<u64> = sizes.clone();
            nested.sort_unstable();
            nested.dedup();
            let mut drawn = 0;
            let flags: Vec<String> = nested
                .iter()
                .map(|&n| {
                    let more = n - drawn;
                    drawn = n;
                    format!("--n {more}")
                })
                .collect();
            notes.push(format!(
                "the classes' plans take different samples ({}): one draw of {} units serves all, in nested stages (lotsman draw --lot ID --lot-size N {}), each class counting the units of the stages up to its own sample size, never the lowest positions of one sorted list",
                each.join(", "),
                self.plans.sample_size(),
                flags.join(" ")
            ));
        }
        notes
    }

    /// The verdict in words.
    fn verdict_line(&self) -> String {
        let names = |decision: Decision| {
            self.verdict
                .classes
                .iter()
                .filter(|c| c.judgement.decision == decision)
                .map(|c: &ClassDecision| c.class.label())
                .collect::<Vec<_>>()
                .join(", ")
        };
        match self.verdict.decision {
            Decision::Accept if self.verdict.classes.len() == 1 => "ACCEPT the lot".to_string(),
            Decision::Accept => "ACCEPT the lot: every class accepts".to_string(),
            Decision::Reject if self.verdict.classes.len() == 1 => "REJECT the lot".to_string(),
            Decision::Reject => format!("REJECT the lot: {} rejects", names(Decision::Reject)),
            Decision::Continue => format!(
                "GO ON to the next stage for {}: no class rejects, and the lot is decided when every class is",
                names(Decision::Continue)
            ),
        }
    }
}

/// A row's class for messages.
fn label(row: &ClassRow) -> String {
    row.class
        .clone()
        .unwrap_or_else(|| format!("AQL {}", row.aql))
}

/// The decision as JSON and CSV name it.
fn decision_name(d: Decision) -> &'static str {
    match d {
        Decision::Accept => "accept",
        Decision::Reject => "reject",
        Decision::Continue => "continue",
    }
}

impl Serialize for StandardJudgeReport {
    fn serialize<S: serde::Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        Json {
            decision: self.verdict.decision,
            severity: self.severity,
            code_letter: self.plans.code_letter,
            sample_size: self.plans.sample_size(),
            classes: self.rows(),
            notes: self.notes(),
            accepted_recorded: self.accepted_recorded.as_deref(),
        }
        .serialize(s)
    }
}

impl Report for StandardJudgeReport {
    /// The verdict, one row per class with the table's numbers at the
    /// stage it reached and its count, the severity and letter, and the
    /// notes.
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        accepted_line(out, self.accepted_recorded.as_deref())?;
        writeln!(out, "{}", self.verdict_line())?;
        let mut g = grid(&[
            "Class", "AQL", "Stage", "Units", "Ac", "Re", "Found", "Decision",
        ]);
        for row in self.rows() {
            let decision = match (row.decision, row.next_units) {
                (Decision::Continue, Some(n)) => format!("go on: {n} more units"),
                (Decision::Continue, None) => "go on".to_string(),
                (d, _) => decision_name(d).to_string(),
            };
            g.add_row(vec![
                escape_controls(&label(&row)).into_owned(),
                row.aql.to_string(),
                row.stage.to_string(),
                row.n.to_string(),
                row.accept.map_or("-".to_string(), |a| a.to_string()),
                row.reject.to_string(),
                row.found.to_string(),
                decision,
            ]);
        }
        writeln!(out, "{g}")?;
        writeln!(
            out,
            "{} inspection, code letter {}, plans from {}",
            capitalised(self.severity.name()),
            self.plans.code_letter,
            escape_controls(&self.source.to_string_lossy())
        )?;
        for note in self.notes() {
            writeln!(out, "NOTE: {}", escape_controls(&note))?;
        }
        Ok(())
    }

    /// One row per class, with the lot's decision on each.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let mut w = csv_writer(out);
        w.write_record([
            "class",
            "aql",
            "stage",
            "n",
            "accept",
            "reject",
            "found",
            "decision",
            "next_units",
            "reinstates_normal",
            "lot_decision",
            "severity",
            "accepted_recorded",
        ])?;
        for row in self.rows() {
            w.write_record([
                row.class.clone().unwrap_or_default(),
                row.aql.to_string(),
                row.stage.to_string(),
                row.n.to_string(),
                cell(row.accept),
                row.reject.to_string(),
                row.found.to_string(),
                decision_name(row.decision).to_string(),
                cell(row.next_units),
                row.reinstates_normal.to_string(),
                decision_name(self.verdict.decision).to_string(),
                self.severity.name().to_string(),
                self.accepted_recorded.clone().unwrap_or_default(),
            ])?;
        }
        w.flush()
    }
}

/// `normal` as `Normal`.
fn capitalised(word: &str) -> String {
    let mut chars = word.chars();
    chars.next().map_or(String::new(), |c| {
        c.to_uppercase().chain(chars).collect::<String>()
    })
}
