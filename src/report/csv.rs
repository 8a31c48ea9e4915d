//! CSV reports: one header row, then one row per item (alternative,
//! quality or source). Numbers are written in full precision; empty cells
//! stand for values that do not apply.

use std::io::{self, Write};

use super::{
    DesignReport, EvaluationBatchReport, EvaluationReport, RectifyingReport, ReportFormat,
    SourceEvaluation, TradeoffReport, VariablesDesignReport, VariablesEvaluationReport,
    VerificationReport,
};

use crate::model::ModelKind;
use crate::numeric::Short;

/// Comma-separated values, for spreadsheets.
#[derive(Clone, Copy, Debug, Default)]
pub struct Csv;

fn cell<T: ToString>(v: Option<T>) -> String {
    v.map_or(String::new(), |x| x.to_string())
}

/// A number in full precision, in scientific form when tiny or huge
/// ([`Short`]): `1e-310`, not three hundred zeros.
fn num(x: f64) -> String {
    Short(x).to_string()
}

/// An optional number as [`num`] writes it; empty when absent.
fn opt(v: Option<f64>) -> String {
    v.map_or(String::new(), num)
}

/// The head of a column of qualities named `name`: the name alone for a
/// fraction nonconforming, with `_per_unit` for nonconformities per unit.
fn quality_column(name: &str, model: ModelKind) -> String {
    match model {
        ModelKind::Poisson => format!("{name}_per_unit"),
        _ => name.to_string(),
    }
}

/// Quotes a text cell when it holds a comma, a quote or a line break.
fn text(s: &str) -> String {
    if s.contains([',', '"', '\n', '\r']) {
        format!("\"{}\"", s.replace('"', "\"\""))
    } else {
        s.to_string()
    }
}

impl ReportFormat for Csv {
    fn design(&self, out: &mut dyn Write, report: &DesignReport) -> io::Result<()> {
        writeln!(out, "c,n_min,n_max,feasible,reason")?;
        for a in &report.alternatives {
            writeln!(
                out,
                "{},{},{},{},{}",
                a.c,
                cell(a.n_min),
                cell(a.n_max),
                a.feasible,
                text(a.reason.as_deref().unwrap_or(""))
            )?;
        }
        Ok(())
    }

    fn evaluation(&self, out: &mut dyn Write, report: &EvaluationReport) -> io::Result<()> {
        // Under the hypergeometric model each row carries the lot's D and
        // the lot quality D/N its measures are at.
        let lot = report.model == ModelKind::Hypergeometric;
        writeln!(
            out,
            "{}{},pa,{},ati,asn,asn_curtailed",
            quality_column("quality", report.model),
            if lot {
                ",lot_nonconforming,lot_quality"
            } else {
                ""
            },
            quality_column("aoq", report.model)
        )?;
        for p in &report.points {
            let lot_cells = if lot {
                format!(",{},{}", cell(p.lot_nonconforming), opt(p.lot_quality))
            } else {
                String::new()
            };
            writeln!(
                out,
                "{}{lot_cells},{},{},{},{},{}",
                num(p.quality),
                num(p.pa),
                num(p.aoq),
                opt(p.ati),
                num(p.asn),
                opt(p.asn_curtailed)
            )?;
        }
        Ok(())
    }

    fn verification(&self, out: &mut dyn Write, report: &VerificationReport) -> io::Result<()> {
        writeln!(out, "path,status,field,recorded,resolved,message")?;
        for e in &report.results {
            let status = e.status.name();
            if e.differences.is_empty() {
                writeln!(
                    out,
                    "{},{},,,,{}",
                    text(&e.path),
                    status,
                    text(e.message.as_deref().unwrap_or(""))
                )?;
            }
            for d in &e.differences {
                writeln!(
                    out,
                    "{},{},{},{},{},",
                    text(&e.path),
                    status,
                    text(&d.field),
                    text(&d.recorded),
                    text(&d.resolved)
                )?;
            }
        }
        Ok(())
    }

    /// One header for attributes and variables sources alike: a variables
    /// row leaves `asn_curtailed` empty and gives `asn = n` (every lot
    /// measures n units), an attributes row leaves `pa_centred` empty, and
    /// an invalid source has one row with its `message`. `quality_unit`
    /// says what the row's quality and AOQ are (`fraction` or `per_unit`);
    /// `lot_nonconforming` and `lot_quality` are the lot's D and D/N under
    /// the hypergeometric model, empty otherwise.
    fn evaluations(&self, out: &mut dyn Write, report: &EvaluationBatchReport) -> io::Result<()> {
        writeln!(
            out,
            "source,status,quality,quality_unit,lot_nonconforming,lot_quality,pa,pa_centred,aoq,ati,asn,asn_curtailed,message"
        )?;
        for e in &report.results {
            let lead = format!("{},{}", text(&e.path), e.status.name());
            match &e.evaluation {
                Some(SourceEvaluation::Attributes(r)) => {
                    for p in &r.points {
                        writeln!(
                            out,
                            "{lead},{},{},{},{},{},,{},{},{},{},",
                            num(p.quality),
                            r.model.quality_unit(),
                            cell(p.lot_nonconforming),
                            opt(p.lot_quality),
                            num(p.pa),
                            num(p.aoq),
                            opt(p.ati),
                            num(p.asn),
                            opt(p.asn_curtailed)
                        )?;
                    }
                }
                Some(SourceEvaluation::Variables(r)) => {
                    for p in &r.points {
                        writeln!(
                            out,
                            "{lead},{},fraction,,,{},{},{},{},{},,",
                            num(p.quality),
                            num(p.pa),
                            opt(p.pa_centred),
                            num(p.aoq),
                            opt(p.ati),
                            r.variables.n
                        )?;
                    }
                }
                None => writeln!(
                    out,
                    "{lead},,,,,,,,,,,{}",
                    text(e.message.as_deref().unwrap_or(""))
                )?,
            }
        }
        Ok(())
    }

    fn variables_design(&self, out: &mut dyn Write, r: &VariablesDesignReport) -> io::Result<()> {
        writeln!(
            out,
            "n,k,m,range_min,range_max,producer_risk,consumer_risk,attributes_n,attributes_c"
        )?;
        let v = &r.variables;
        let range = v.k_range.or(v.m_range);
        writeln!(
            out,
            "{},{},{},{},{},{},{},{},{}",
            v.n,
            opt(v.k),
            opt(v.m),
            opt(range.map(|x| x[0])),
            opt(range.map(|x| x[1])),
            num(r.producer.achieved_risk),
            num(r.consumer.achieved_risk),
            cell(r.attributes_plan.map(|a| a.n)),
            cell(r.attributes_plan.map(|a| a.c))
        )
    }

    fn variables_evaluation(
        &self,
        out: &mut dyn Write,
        r: &VariablesEvaluationReport,
    ) -> io::Result<()> {
        writeln!(out, "quality,pa,pa_centred,aoq,ati")?;
        for p in &r.points {
            writeln!(
                out,
                "{},{},{},{},{}",
                num(p.quality),
                num(p.pa),
                opt(p.pa_centred),
                num(p.aoq),
                opt(p.ati)
            )?;
        }
        Ok(())
    }

    fn tradeoff(&self, out: &mut dyn Write, r: &TradeoffReport) -> io::Result<()> {
        writeln!(
            out,
            "{},{},n,c,asn_at_aql,producer_risk,consumer_risk,stages,pa_at_process,ati,cost,full_inspection,reason",
            quality_column("aql", r.model),
            quality_column("rql", r.model)
        )?;
        for c in &r.cells {
            let stages = c.stages.as_ref().map(|s| {
                s.iter()
                    .map(ToString::to_string)
                    .collect::<Vec<_>>()
                    .join(" ")
            });
            writeln!(
                out,
                "{},{},{},{},{},{},{},{},{},{},{},{},{}",
                num(c.aql),
                num(c.rql),
                cell(c.n),
                cell(c.c),
                opt(c.asn_at_aql),
                opt(c.producer_risk),
                opt(c.consumer_risk),
                cell(stages),
                opt(c.pa_at_process.flatten()),
                opt(c.ati.flatten()),
                opt(c.cost.flatten()),
                c.full_inspection,
                text(c.reason.as_deref().unwrap_or(""))
            )?;
        }
        Ok(())
    }

    /// The single plans by acceptance number:
    /// `c, n_min, ati, best_single`.
    fn rectifying(&self, out: &mut dyn Write, report: &RectifyingReport) -> io::Result<()> {
        super::rectifying::write_csv(out, report)
    }
}
