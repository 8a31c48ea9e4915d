//! The report of `lotsman verify LOG.csv`: the ledger's audit replay,
//! every break named by its line, `seq` and column.
//!
//! JSON keys (docs/json.md): `rows`, `findings` (each `line`, `seq`,
//! `field`, `message`), `state` (the switching state after the last row,
//! null without a standard-indexed source) and `plans_checked`. CSV: one
//! row per finding, `line,seq,field,message`.

use std::io::{self, Write};
use std::path::PathBuf;

use serde::{Serialize, Serializer};

use super::format::{Report, csv_writer};
use crate::ledger::Replay;

/// A ledger's replay, for printing.
#[derive(Clone, Debug)]
pub struct LedgerVerifyReport {
    /// The ledger's file.
    pub ledger: PathBuf,
    /// What the replay found.
    pub replay: Replay,
}

impl LedgerVerifyReport {
    /// Whether the ledger holds: no finding.
    pub fn holds(&self) -> bool {
        self.replay.findings.is_empty()
    }
}

impl Serialize for LedgerVerifyReport {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        self.replay.serialize(s)
    }
}

impl Report for LedgerVerifyReport {
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        let r = &self.replay;
        let lots = if r.rows == 1 { "lot" } else { "lots" };
        let outcome = match r.findings.len() {
            0 if r.plans_checked => {
                "the chain holds and every row agrees with its plan (revision, severity, decision)"
                    .to_string()
            }
            0 => "the chain holds".to_string(),
            1 => "1 finding".to_string(),
            n => format!("{n} findings"),
        };
        writeln!(
            out,
            "{}: {} {lots}, {outcome}",
            self.ledger.display(),
            r.rows
        )?;
        for f in &r.findings {
            let seq = f.seq.map_or(String::new(), |s| format!(" (seq {s})"));
            writeln!(out, "  line {}{seq}, {}: {}", f.line, f.field, f.message)?;
        }
        if !r.plans_checked {
            writeln!(
                out,
                "  the severities and decisions were not checked: give the plan sources with --plan"
            )?;
        } else if let Some(state) = &r.state {
            writeln!(out, "  the next lot: {} inspection", state.standing())?;
        }
        Ok(())
    }

    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let mut w = csv_writer(out);
        w.write_record(["line", "seq", "field", "message"])?;
        for f in &self.replay.findings {
            w.write_record([
                f.line.to_string(),
                f.seq.map_or(String::new(), |s| s.to_string()),
                f.field.to_string(),
                f.message.clone(),
            ])?;
        }
        w.flush()
    }
}
