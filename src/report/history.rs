//! The report of `lotsman history LOG.csv`: each lot with its first
//! sample, its fraction, the control limits for its sample size and the
//! running process average.
//!
//! JSON keys (docs/json.md): `ledger`, `chart` (`p` or `u`), `class`,
//! `centre`, `aql`, and `lots`, each `{seq, date, lot, severity,
//! decision, resubmitted, n, found, fraction, upper_limit, lower_limit,
//! out_of_control, running}` (`running` is `{estimate, lower, upper,
//! level}` or null).

use std::io::{self, Write};
use std::path::PathBuf;

use serde::Serialize;

use super::format::{Report, csv_writer};
use crate::ledger::History;
use crate::numeric::format_significant;

/// The history of a ledger's lots.
#[derive(Clone, Debug, Serialize)]
pub struct HistoryReport {
    /// The ledger's file.
    pub ledger: PathBuf,
    /// The chart's numbers.
    #[serde(flatten)]
    pub history: History,
}

fn cell(x: Option<f64>) -> String {
    x.map_or(String::new(), |v| v.to_string())
}

impl Report for HistoryReport {
    /// One line per lot: the fraction (or rate) in percent (per unit) with
    /// its limits, and the running process average.
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        let h = &self.history;
        let per_unit = h.per_unit();
        let show = |x: Option<f64>| match x {
            None => "-".to_string(),
            Some(v) if per_unit => format_significant(v, 3),
            Some(v) => format!("{}%", format_significant(v * 100.0, 3)),
        };
        let class = h
            .class
            .as_ref()
            .map_or(String::new(), |c| format!(", class {c}"));
        let centre = match h.centre {
            Some(_) => format!("centre {} (three-sigma limits for each n)", show(h.centre)),
            None => "no first sample counted yet".to_string(),
        };
        let mut t = format!(
            "Ledger {}: {} lot{}, {}-chart of first samples{class}, {centre}\n",
            self.ledger.display(),
            h.lots.len(),
            if h.lots.len() == 1 { "" } else { "s" },
            h.chart,
        );
        let head = [
            "seq",
            "date",
            "lot",
            "severity",
            "n",
            "found",
            "found/n",
            "LCL",
            "UCL",
            "decision",
            "average",
            "95% interval",
        ];
        let rows: Vec<[String; 12]> = h
            .lots
            .iter()
            .map(|l| {
                let mark = if l.out_of_control { " *" } else { "" };
                [
                    l.seq.to_string(),
                    l.date.clone(),
                    l.lot.clone(),
                    l.severity.unwrap_or("").to_string(),
                    l.n.map_or("-".into(), |n| n.to_string()),
                    l.found.map_or("-".into(), |k| k.to_string()),
                    format!("{}{mark}", show(l.fraction)),
                    show(l.lower_limit),
                    show(l.upper_limit),
                    if l.resubmitted {
                        format!("{} (resubmitted)", l.decision)
                    } else {
                        l.decision.to_string()
                    },
                    show(l.running.map(|r| r.estimate)),
                    l.running.map_or("-".into(), |r| {
                        format!("{} to {}", show(Some(r.lower)), show(Some(r.upper)))
                    }),
                ]
            })
            .collect();
        let widths: Vec<usize> = (0..head.len())
            .map(|i| {
                rows.iter()
                    .map(|r| r[i].chars().count())
                    .chain([head[i].len()])
                    .max()
                    .unwrap_or(0)
            })
            .collect();
        let line = |cells: &[String]| {
            let parts: Vec<String> = cells
                .iter()
                .zip(&widths)
                .map(|(c, w)| format!("{c:<w$}"))
                .collect();
            format!("{}\n", parts.join("  ").trim_end())
        };
        t.push_str(&line(&head.map(String::from)));
        for r in &rows {
            t.push_str(&line(r));
        }
        if h.lots.iter().any(|l| l.n.is_none() && !l.resubmitted) {
            t.push_str("- a lot recorded with one cumulative count past the first stage (judge --inspected) shows no first sample: the chart leaves it out\n");
        }
        if h.lots.iter().any(|l| l.out_of_control) {
            t.push_str("* outside its three-sigma limits: look for a cause beyond chance\n");
        }
        out.write_all(t.as_bytes())
    }

    /// One row per lot, numbers in full precision.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let mut w = csv_writer(out);
        w.write_record([
            "seq",
            "date",
            "lot",
            "severity",
            "decision",
            "resubmitted",
            "n",
            "found",
            "fraction",
            "centre",
            "lower_limit",
            "upper_limit",
            "out_of_control",
            "average",
            "average_lower",
            "average_upper",
        ])?;
        for l in &self.history.lots {
            w.write_record([
                l.seq.to_string(),
                l.date.clone(),
                l.lot.clone(),
                l.severity.unwrap_or("").to_string(),
                l.decision.to_string(),
                if l.resubmitted { "yes" } else { "no" }.to_string(),
                l.n.map_or(String::new(), |n| n.to_string()),
                l.found.map_or(String::new(), |k| k.to_string()),
                cell(l.fraction),
                cell(l.n.and(self.history.centre)),
                cell(l.lower_limit),
                cell(l.upper_limit),
                if l.out_of_control { "yes" } else { "no" }.to_string(),
                cell(l.running.map(|r| r.estimate)),
                cell(l.running.map(|r| r.lower)),
                cell(l.running.map(|r| r.upper)),
            ])?;
        }
        w.flush()
    }
}
