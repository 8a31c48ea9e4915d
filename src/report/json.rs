//! JSON reports: the report structs as they are, pretty-printed.

use std::io::{self, Write};

use serde::Serialize;

use super::{
    DesignReport, EvaluationBatchReport, EvaluationReport, RectifyingReport, ReportFormat,
    TradeoffReport, VariablesDesignReport, VariablesEvaluationReport, VerificationReport,
};

/// Pretty-printed JSON, one object per report, keys in snake_case.
#[derive(Clone, Copy, Debug, Default)]
pub struct Json;

fn write_json<T: Serialize>(out: &mut dyn Write, value: &T) -> io::Result<()> {
    serde_json::to_writer_pretty(&mut *out, value).map_err(io::Error::other)?;
    writeln!(out)
}

impl ReportFormat for Json {
    fn design(&self, out: &mut dyn Write, report: &DesignReport) -> io::Result<()> {
        write_json(out, report)
    }

    fn evaluation(&self, out: &mut dyn Write, report: &EvaluationReport) -> io::Result<()> {
        write_json(out, report)
    }

    fn verification(&self, out: &mut dyn Write, report: &VerificationReport) -> io::Result<()> {
        write_json(out, report)
    }

    fn evaluations(&self, out: &mut dyn Write, report: &EvaluationBatchReport) -> io::Result<()> {
        write_json(out, report)
    }

    fn variables_design(
        &self,
        out: &mut dyn Write,
        report: &VariablesDesignReport,
    ) -> io::Result<()> {
        write_json(out, report)
    }

    fn variables_evaluation(
        &self,
        out: &mut dyn Write,
        report: &VariablesEvaluationReport,
    ) -> io::Result<()> {
        write_json(out, report)
    }

    fn tradeoff(&self, out: &mut dyn Write, report: &TradeoffReport) -> io::Result<()> {
        write_json(out, report)
    }

    fn rectifying(&self, out: &mut dyn Write, report: &RectifyingReport) -> io::Result<()> {
        write_json(out, report)
    }
}
