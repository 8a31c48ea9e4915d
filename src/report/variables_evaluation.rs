//! The report of a variables plan's evaluation (`lotsman evaluate` of a
//! variables source): Pa (one-sided and centred for two limits), AOQ and
//! ATI at each quality, the AOQL and the indifference quality.

use std::io::{self, Write};

use serde::Serialize;

use super::format::{Report, csv_writer, num, opt};
use super::parts::VariablesReport;
use super::table_kit::{accepted_line, grid, specification_line};
use crate::numeric::format_quality;
use crate::plan::{Aoql, VariablesEvaluation, VariablesPlan, VariablesPoint};

/// What `evaluate` reports for a variables plan.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct VariablesEvaluationReport {
    /// The plan and its specification.
    pub variables: VariablesReport,
    /// The plan for the terminal table.
    #[serde(skip)]
    pub plan: VariablesPlan,
    /// Lot size, `null` when absent.
    pub lot_size: Option<u64>,
    /// The measures at each quality.
    pub points: Vec<VariablesPoint>,
    /// The AOQL and where it occurs.
    pub aoql: Aoql,
    /// The quality where `Pa = 0.5`.
    pub indifference_quality: f64,
    /// The discrepancy of a recorded plan that the audit does not confirm
    /// and that is evaluated as recorded at the user's request
    /// (`--accept-recorded`); absent otherwise.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub accepted_recorded: Option<String>,
}

impl From<&VariablesEvaluation> for VariablesEvaluationReport {
    fn from(e: &VariablesEvaluation) -> Self {
        VariablesEvaluationReport {
            variables: VariablesReport::new(&e.plan, None),
            plan: e.plan.clone(),
            lot_size: e.lot_size,
            points: e.points.clone(),
            aoql: e.aoql,
            indifference_quality: e.indifference_quality,
            accepted_recorded: None,
        }
    }
}

impl Report for VariablesEvaluationReport {
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        let r = self;
        accepted_line(out, r.accepted_recorded.as_deref())?;
        let lot = r
            .lot_size
            .map_or("no lot size".to_string(), |n| format!("lot of {n} units"));
        writeln!(out, "Plan {}; {lot}", r.plan)?;
        writeln!(out, "{}", specification_line(&r.variables))?;
        let centred = r.points.iter().any(|p| p.pa_centred.is_some());
        let mut header = vec!["Quality", "Pa"];
        if centred {
            header[1] = "Pa one-sided";
            header.push("Pa centred");
        }
        header.extend(["AOQ", "ATI"]);
        let mut g = grid(&header);
        for p in &r.points {
            let mut row = vec![format_quality(p.quality, false), format!("{:.4}", p.pa)];
            if centred {
                row.push(p.pa_centred.map_or("-".to_string(), |v| format!("{v:.4}")));
            }
            row.push(format_quality(p.aoq, false));
            row.push(p.ati.map_or("-".to_string(), |v| format!("{v:.1}")));
            g.add_row(row);
        }
        writeln!(out, "{g}")?;
        writeln!(
            out,
            "AOQL {} at quality {}; indifference quality (Pa = 0.5) {}; every lot inspects n = {} (ASN)",
            format_quality(r.aoql.value, false),
            format_quality(r.aoql.quality, false),
            format_quality(r.indifference_quality, false),
            r.variables.n
        )?;
        if r.lot_size.is_none() {
            writeln!(
                out,
                "AOQ without a lot size is Pa x p; give lot_size for ATI and the (N - n)/N factor."
            )?;
        }
        Ok(())
    }

    /// One row per quality.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let mut w = csv_writer(out);
        w.write_record(["quality", "pa", "pa_centred", "aoq", "ati"])?;
        for p in &self.points {
            w.write_record([
                num(p.quality),
                num(p.pa),
                opt(p.pa_centred),
                num(p.aoq),
                opt(p.ati),
            ])?;
        }
        w.flush()
    }
}
