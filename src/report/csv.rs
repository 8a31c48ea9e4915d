//! CSV reports: one header row, then one row per item (alternative,
//! quality or source). Numbers are written in full precision; empty cells
//! stand for values that do not apply.

use std::io::{self, Write};

use super::{
    DesignReport, EvaluationBatchReport, EvaluationReport, RectifyingReport, ReportFormat,
    SourceEvaluation, TradeoffReport, VariablesDesignReport, VariablesEvaluationReport,
    VerificationReport,
};

/// Comma-separated values, for spreadsheets.
#[derive(Clone, Copy, Debug, Default)]
pub struct Csv;

fn cell<T: ToString>(v: Option<T>) -> String {
    v.map_or(String::new(), |x| x.to_string())
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
        writeln!(out, "quality,pa,aoq,ati,asn,asn_curtailed")?;
        for p in &report.points {
            writeln!(
                out,
                "{},{},{},{},{},{}",
                p.quality,
                p.pa,
                p.aoq,
                cell(p.ati),
                p.asn,
                cell(p.asn_curtailed)
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
    /// an invalid source has one row with its `message`.
    fn evaluations(&self, out: &mut dyn Write, report: &EvaluationBatchReport) -> io::Result<()> {
        writeln!(
            out,
            "source,status,quality,pa,pa_centred,aoq,ati,asn,asn_curtailed,message"
        )?;
        for e in &report.results {
            let lead = format!("{},{}", text(&e.path), e.status.name());
            match &e.evaluation {
                Some(SourceEvaluation::Attributes(r)) => {
                    for p in &r.points {
                        writeln!(
                            out,
                            "{lead},{},{},,{},{},{},{},",
                            p.quality,
                            p.pa,
                            p.aoq,
                            cell(p.ati),
                            p.asn,
                            cell(p.asn_curtailed)
                        )?;
                    }
                }
                Some(SourceEvaluation::Variables(r)) => {
                    for p in &r.points {
                        writeln!(
                            out,
                            "{lead},{},{},{},{},{},{},,",
                            p.quality,
                            p.pa,
                            cell(p.pa_centred),
                            p.aoq,
                            cell(p.ati),
                            r.variables.n
                        )?;
                    }
                }
                None => writeln!(
                    out,
                    "{lead},,,,,,,,{}",
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
            cell(v.k),
            cell(v.m),
            cell(range.map(|x| x[0])),
            cell(range.map(|x| x[1])),
            r.producer.achieved_risk,
            r.consumer.achieved_risk,
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
                p.quality,
                p.pa,
                cell(p.pa_centred),
                p.aoq,
                cell(p.ati)
            )?;
        }
        Ok(())
    }

    fn tradeoff(&self, out: &mut dyn Write, r: &TradeoffReport) -> io::Result<()> {
        writeln!(
            out,
            "aql,rql,n,c,asn_at_aql,producer_risk,consumer_risk,stages,pa_at_process,ati,cost,reason"
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
                "{},{},{},{},{},{},{},{},{},{},{},{}",
                c.aql,
                c.rql,
                cell(c.n),
                cell(c.c),
                cell(c.asn_at_aql),
                cell(c.producer_risk),
                cell(c.consumer_risk),
                cell(stages),
                cell(c.pa_at_process.flatten()),
                cell(c.ati.flatten()),
                cell(c.cost.flatten()),
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
