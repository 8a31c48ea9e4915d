//! The report of an evaluation (`lotsman evaluate`): the OC, AOQ, ATI and
//! ASN of an attributes plan at each quality asked for, its AOQL and its
//! indifference quality.

use std::io::{self, Write};

use serde::Serialize;

use super::format::{Report, cell, csv_writer, num, opt, quality_column};
use super::parts::SequentialReport;
use super::table_kit::{accepted_line, grid, quality_head};
use crate::model::{ModelKind, nonconforming_in_lot};
use crate::numeric::{format_quality, format_quality_cell};
use crate::plan::{Aoql, Evaluation, Measures, Stage};

/// Heads of the lot columns of an evaluation under the hypergeometric
/// model.
const LOT_D: &str = "D in the lot";
const LOT_QUALITY: &str = "Lot quality D/N";

/// What `evaluate` reports.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct EvaluationReport {
    /// Model name.
    pub model: ModelKind,
    /// The unit of the qualities, AOQ and AOQL: `fraction` or `per_unit`
    /// ([`ModelKind::quality_unit`]).
    pub quality_unit: &'static str,
    /// Lot size, `null` when absent.
    pub lot_size: Option<u64>,
    /// The plan's stages.
    pub stages: Vec<Stage>,
    /// Sequential plans: the lines and the inspector's table.
    pub sequential: Option<SequentialReport>,
    /// The measures at each quality.
    pub points: Vec<Measures>,
    /// `decided_at[i][j]`: probability that a lot of quality `points[i]` is
    /// decided at stage `j` (the distribution of units inspected); only
    /// when asked for (`evaluate --decided-at`), and then in JSON only.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub decided_at: Option<Vec<Vec<f64>>>,
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

impl From<&Evaluation> for EvaluationReport {
    fn from(e: &Evaluation) -> Self {
        EvaluationReport {
            model: e.model.kind(),
            quality_unit: e.model.kind().quality_unit(),
            lot_size: e.model.lot_size(),
            stages: e.plan.stages().to_vec(),
            sequential: e
                .plan
                .sequential_lines()
                .map(|l| SequentialReport::new(l, None)),
            points: e.points.clone(),
            decided_at: e.decided.clone(),
            aoql: e.aoql,
            indifference_quality: e.indifference_quality,
            accepted_recorded: None,
        }
    }
}

impl Report for EvaluationReport {
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        let r = self;
        let per_unit = r.model == ModelKind::Poisson;
        accepted_line(out, r.accepted_recorded.as_deref())?;
        let lot = r
            .lot_size
            .map_or("no lot size".to_string(), |n| format!("lot of {n} units"));
        match &r.sequential {
            Some(seq) => writeln!(
                out,
                "Plan item by item: accept d <= {:.5} n - {:.5}, reject d >= {:.5} n + {:.5}, at item {} accept d <= {}; {} model, {lot}",
                seq.slope,
                seq.h_accept,
                seq.slope,
                seq.h_reject,
                seq.truncation,
                seq.final_acceptance,
                r.model
            )?,
            None => {
                let plan: Vec<String> = r.stages.iter().map(Stage::to_string).collect();
                writeln!(
                    out,
                    "Plan {} (N:AC:RE), {} model, {lot}",
                    plan.join(" "),
                    r.model
                )?
            }
        }
        let (quality, aoq) = (
            quality_head("Quality", per_unit),
            quality_head("AOQ", per_unit),
        );
        // A finite lot holds a whole number D of nonconforming units: each
        // row says which, and the lot quality D/N its measures are at.
        let lot = r.points.iter().any(|p| p.lot_nonconforming.is_some());
        let mut header = vec![quality.as_str()];
        if lot {
            header.extend([LOT_D, LOT_QUALITY]);
        }
        header.extend(["Pa", &aoq, "ATI", "ASN", "ASN curtailed"]);
        let mut g = grid(&header);
        for p in &r.points {
            let mut row = vec![format_quality_cell(p.quality, per_unit)];
            if lot {
                row.push(
                    p.lot_nonconforming
                        .map_or("-".to_string(), |d| d.to_string()),
                );
                row.push(
                    p.lot_quality
                        .map_or("-".to_string(), |q| format_quality_cell(q, per_unit)),
                );
            }
            row.extend([
                format!("{:.4}", p.pa),
                format_quality_cell(p.aoq, per_unit),
                p.ati.map_or("-".to_string(), |v| format!("{v:.1}")),
                format!("{:.1}", p.asn),
                p.asn_curtailed
                    .map_or("-".to_string(), |v| format!("{v:.1}")),
            ]);
            g.add_row(row);
        }
        writeln!(out, "{g}")?;
        // Both are lot qualities D/N under the hypergeometric model.
        let with_d = |q: f64| match r.lot_size {
            Some(n) if lot => format!(
                "{} (D = {})",
                format_quality(q, per_unit),
                nonconforming_in_lot(q, n)
            ),
            _ => format_quality(q, per_unit),
        };
        writeln!(
            out,
            "AOQL {} at {}quality {}; indifference quality (Pa = 0.5) {}",
            format_quality(r.aoql.value, per_unit),
            if lot { "lot " } else { "" },
            with_d(r.aoql.quality),
            with_d(r.indifference_quality)
        )?;
        if lot {
            writeln!(
                out,
                "A lot of N units holds D = round(p N) nonconforming units: every measure of a row is at its lot quality D/N."
            )?;
        }
        if r.lot_size.is_none() {
            writeln!(
                out,
                "AOQ without a lot size is Pa x p; give --lot-size for ATI and the (N - n)/N factor."
            )?;
        }
        Ok(())
    }

    /// One row per quality; under the hypergeometric model with the lot's
    /// `D` and `D/N`.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let report = self;
        // Under the hypergeometric model each row carries the lot's D and
        // the lot quality D/N its measures are at.
        let lot = report.model == ModelKind::Hypergeometric;
        let mut w = csv_writer(out);
        let mut header = vec![quality_column("quality", report.model)];
        if lot {
            header.extend(["lot_nonconforming".to_string(), "lot_quality".to_string()]);
        }
        header.push("pa".to_string());
        header.push(quality_column("aoq", report.model));
        header.extend(["ati", "asn", "asn_curtailed"].map(String::from));
        w.write_record(&header)?;
        for p in &report.points {
            let mut row = vec![num(p.quality)];
            if lot {
                row.extend([cell(p.lot_nonconforming), opt(p.lot_quality)]);
            }
            row.extend([
                num(p.pa),
                num(p.aoq),
                opt(p.ati),
                num(p.asn),
                opt(p.asn_curtailed),
            ]);
            w.write_record(&row)?;
        }
        w.flush()
    }
}
