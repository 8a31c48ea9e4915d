//! The report of `lotsman demo`: for each plan of the invented scenario,
//! its plan, risks and AOQL, whether a fresh solve confirms it, the demo
//! lot judged where the demo has readings, and the files written.

use std::io::{self, Write};
use std::path::PathBuf;

use serde::Serialize;

use super::format::{Report, csv_writer, num, opt};
use super::words;
use crate::model::ModelKind;
use crate::numeric::format_quality;

/// What the demo did with one plan.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct DemoRow {
    /// The source's file name.
    pub file: String,
    /// The source's title.
    pub title: String,
    /// The model name.
    pub model: ModelKind,
    /// The recorded plan, as text.
    pub plan: String,
    /// Achieved producer's and consumer's risks (the consumer's only
    /// where an RQL is agreed: a standard-indexed plan may have none).
    pub risks: (f64, Option<f64>),
    /// The AOQL, with its quality.
    pub aoql: (f64, f64),
    /// Whether the recorded plan equals a fresh solve.
    pub verified: bool,
    /// The files written.
    pub written: Vec<PathBuf>,
    /// Variables plans: the decision on the demo lot's readings, with
    /// its rule and any warnings.
    pub judged: Option<String>,
}

/// What the demo did, one row per plan.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct DemoReport {
    /// The plans, in the demo's order.
    pub rows: Vec<DemoRow>,
}

impl DemoReport {
    /// Whether every recorded plan matches a fresh solve (the demo's exit
    /// status says so).
    pub fn verified(&self) -> bool {
        self.rows.iter().all(|r| r.verified)
    }
}

impl Report for DemoReport {
    /// The scenario, one paragraph per plan, and the caution.
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        let mut text = String::new();
        text.push_str(
            "lotsman demo: Tarnwick Pump Works, receiving inspection (an invented scenario)\n\n",
        );
        for r in &self.rows {
            let per_unit = r.model == ModelKind::Poisson;
            text.push_str(&format!(
                "{}\n  {}  [{} model]\n  plan {}; achieved alpha {:.4}, {}; AOQL {} at quality {}\n  verify: {}\n{}  wrote {}\n\n",
                r.title,
                r.file,
                r.model,
                r.plan,
                r.risks.0,
                r.risks
                    .1
                    .map_or("no RQL agreed".to_string(), |b| format!("beta {b:.4}")),
                format_quality(r.aoql.0, per_unit),
                format_quality(r.aoql.1, per_unit),
                if r.verified { "the recorded plan matches a fresh solve" } else { "MISMATCH" },
                r.judged.as_ref().map_or(String::new(), |j| format!("  judged the demo lot's readings: {j}\n")),
                r.written.iter().map(|p| p.display().to_string()).collect::<Vec<_>>().join(", "),
            ));
        }
        text.push_str(words::CAUTION);
        text.push('\n');
        out.write_all(text.as_bytes())
    }

    /// One row per plan; the files written joined by `; `.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let mut w = csv_writer(out);
        w.write_record([
            "file",
            "title",
            "model",
            "plan",
            "producer_risk",
            "consumer_risk",
            "aoql",
            "aoql_quality",
            "verified",
            "judged",
            "written",
        ])?;
        for r in &self.rows {
            w.write_record([
                r.file.clone(),
                r.title.clone(),
                r.model.to_string(),
                r.plan.clone(),
                num(r.risks.0),
                opt(r.risks.1),
                num(r.aoql.0),
                num(r.aoql.1),
                r.verified.to_string(),
                r.judged.clone().unwrap_or_default(),
                r.written
                    .iter()
                    .map(|p| p.display().to_string())
                    .collect::<Vec<_>>()
                    .join("; "),
            ])?;
        }
        w.flush()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_title_with_a_comma_is_quoted_in_the_csv() {
        let report = DemoReport {
            rows: vec![DemoRow {
                file: "seal.yaml".into(),
                title: "Seals, visual".into(),
                model: ModelKind::Binomial,
                plan: "n = 80, c = 2".into(),
                risks: (0.04, Some(0.09)),
                aoql: (0.012, 0.02),
                verified: true,
                written: vec![
                    PathBuf::from("out/seal.yaml"),
                    PathBuf::from("out/seal.pdf"),
                ],
                judged: None,
            }],
        };
        assert!(report.verified());
        let mut text = Vec::new();
        report.write_csv(&mut text).unwrap();
        assert_eq!(
            String::from_utf8(text).unwrap().lines().nth(1),
            Some(
                "seal.yaml,\"Seals, visual\",binomial,\"n = 80, c = 2\",0.04,0.09,0.012,0.02,true,,out/seal.yaml; out/seal.pdf"
            )
        );
    }
}
