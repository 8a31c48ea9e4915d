//! The report of a design (`lotsman design`): the plan, its procedure, the
//! risks it achieves, the nearby plans or the ASN against the single plan,
//! and how the sample size answers a move of each input.

use std::io::{self, Write};

use serde::Serialize;

use super::format::{Report, cell, csv_writer};
use super::parts::{PointReport, SequentialReport, SinglePlanReport, achieved_points};
use super::table_kit::{
    grid, optional, plan_headline, write_item_table, write_risk_points, write_stage_table,
};
use super::words;
use crate::design::{Alternative, AsnSummary, Input, Moved, Scheme, Sensitivity, Solution};
use crate::model::ModelKind;
use crate::numeric::format_quality;
use crate::plain::escape_controls;
use crate::plan::{Stage, StagedPlan};
use crate::source::tool_version;

/// One row of the alternatives.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct AlternativeReport {
    /// Acceptance number.
    pub c: u64,
    /// Smallest `n` meeting the consumer's point.
    pub n_min: Option<u64>,
    /// Largest `n` meeting the producer's point.
    pub n_max: Option<u64>,
    /// Whether some `n` meets both.
    pub feasible: bool,
    /// Why not, when not.
    pub reason: Option<String>,
}

impl From<&Alternative> for AlternativeReport {
    fn from(a: &Alternative) -> Self {
        AlternativeReport {
            c: a.c,
            n_min: a.n_min,
            n_max: a.n_max,
            feasible: a.feasible(),
            reason: a.reason(),
        }
    }
}

/// What `design` reports.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct DesignReport {
    /// Plan title.
    pub title: String,
    /// Scheme name.
    pub scheme: &'static str,
    /// Model name.
    pub model: ModelKind,
    /// The unit of the qualities: `fraction` or `per_unit`
    /// ([`ModelKind::quality_unit`]).
    pub quality_unit: &'static str,
    /// Lot size, `null` when absent.
    pub lot_size: Option<u64>,
    /// The plan (for the formats; JSON carries its stages).
    #[serde(skip)]
    pub plan: StagedPlan,
    /// The plan's stages.
    pub stages: Vec<Stage>,
    /// The producer's point and achieved risk.
    pub producer: PointReport,
    /// The consumer's point and achieved risk.
    pub consumer: PointReport,
    /// Double and multiple plans: what the designer minimised.
    pub criterion: Option<&'static str>,
    /// Staged plans: ASN at the points and at its largest, against the
    /// single plan.
    pub asn: Option<AsnSummary>,
    /// Sequential plans: the lines, the truncation, the inspector's table
    /// and Wald's approximations.
    pub sequential: Option<SequentialReport>,
    /// The single plan for the same points, for comparison.
    pub single_plan: SinglePlanReport,
    /// All acceptance numbers that meet both points at the chosen `n`
    /// (single plans; empty otherwise).
    pub fitting_acceptance_numbers: Vec<u64>,
    /// Nearby plans, from eight below the chosen acceptance number (or
    /// `c = 0` with `--nearby all`) to three past it.
    pub alternatives: Vec<AlternativeReport>,
    /// Remarks a reader should see (100% inspection, ties).
    pub notes: Vec<String>,
    /// How the single plan's sample size answers a move of each input
    /// (empty until [`DesignReport::with_sensitivity`]).
    pub sensitivity: Vec<Sensitivity>,
    /// Tool and version.
    pub solved_by: String,
}

/// One row of the nearby plans as the report prints it.
#[derive(Clone, Debug, PartialEq)]
pub struct NearbyRow {
    /// Whether it is the chosen plan's acceptance number.
    pub chosen: bool,
    /// `c`, the smallest `n` meeting the RQL, the largest meeting the AQL,
    /// and the range of `n` meeting both (or `no`).
    pub cells: [String; 4],
}

impl DesignReport {
    /// The nearby plans as the report's table prints them: how many
    /// smaller acceptance numbers are left out (they meet no `n`), and
    /// the rows shown, every one the report holds (`c = 0` or the first
    /// of the window, [`Nearby`](crate::Nearby), to a little past the
    /// chosen plan).
    pub fn nearby_rows(&self) -> (usize, Vec<NearbyRow>) {
        let chosen = self.stages.first().and_then(|s| s.accept).unwrap_or(0) as usize;
        let first = self.alternatives.first().map_or(0, |a| a.c as usize);
        let rows = self
            .alternatives
            .iter()
            .map(|a| NearbyRow {
                chosen: a.c as usize == chosen,
                cells: [
                    a.c.to_string(),
                    optional(a.n_min, ""),
                    optional(a.n_max, ""),
                    if a.feasible {
                        format!("n = {} to {}", a.n_min.unwrap_or(0), a.n_max.unwrap_or(0))
                    } else {
                        "no".to_string()
                    },
                ],
            })
            .collect();
        (first, rows)
    }

    /// The sensitivity as the report's table prints it: per input its
    /// name, agreed value, step, the value conceded to and its `n`, the
    /// value tightened to and its `n`; and, for each move with no plan,
    /// the input, the value and why.
    pub fn sensitivity_rows(&self) -> (Vec<[String; 7]>, Vec<String>) {
        let per_unit = self.model == ModelKind::Poisson;
        // The inputs and steps are decimals a person chose: print them as
        // written, with no padding digits.
        let decimal = |v: f64| format!("{}", format!("{v:.11e}").parse::<f64>().unwrap_or(v));
        let value = |input: Input, v: f64| match input {
            Input::Aql | Input::Rql if per_unit => {
                format!("{} ({})", decimal(v), decimal(100.0 * v))
            }
            Input::Aql | Input::Rql => format!("{}%", decimal(100.0 * v)),
            _ => decimal(v),
        };
        let n = |m: &Moved| match (m.n, m.change) {
            (Some(n), Some(d)) if d != 0 => format!("{n} ({d:+})"),
            (Some(n), _) => format!("{n} (same)"),
            _ => "no plan".to_string(),
        };
        let mut reasons = Vec::new();
        let rows = self
            .sensitivity
            .iter()
            .map(|s| {
                for m in [&s.conceded, &s.tightened] {
                    if let Some(why) = &m.reason {
                        reasons.push(format!(
                            "{} = {}: {why}",
                            s.input.label(),
                            value(s.input, m.value)
                        ));
                    }
                }
                [
                    s.input.label().to_string(),
                    value(s.input, s.value),
                    value(s.input, s.step),
                    value(s.input, s.conceded.value),
                    n(&s.conceded),
                    value(s.input, s.tightened.value),
                    n(&s.tightened),
                ]
            })
            .collect();
        (rows, reasons)
    }

    /// The report with the sensitivity of the sample size to each input.
    pub fn with_sensitivity(mut self, rows: Vec<Sensitivity>) -> Self {
        self.sensitivity = rows;
        self
    }

    /// The report of `solution`, under `title`.
    pub fn new(title: &str, solution: &Solution) -> Self {
        let r = &solution.request;
        let d = &solution.design;
        let single = &solution.single;
        let is_single = r.scheme == Scheme::Single;
        let mut notes = Vec::new();
        if r.model.lot_size() == Some(d.plan.max_sample()) {
            notes.push(
                "the largest sample is the whole lot: this can be 100% inspection".to_string(),
            );
        }
        if is_single && single.fitting_c.len() > 1 {
            notes.push(format!(
                "acceptance numbers {} all meet both points at n = {}; c = {} balances the two risks best (tie rule: smallest max(alpha achieved/alpha, beta achieved/beta))",
                single.fitting_c.iter().map(u64::to_string).collect::<Vec<_>>().join(", "),
                single.n,
                single.c
            ));
        }
        if let Some(a) = &solution.asn {
            notes.push(format!(
                "ASN {:.1} at the AQL against n = {} for the single plan: {:.0}% less inspection while quality is at the AQL",
                a.at_aql,
                a.single_n,
                100.0 * a.saving_at_aql
            ));
        }
        let (producer, consumer) =
            achieved_points(&r.risks, (d.producer_risk, d.consumer_risk), &mut notes);
        let criterion = matches!(r.scheme, Scheme::Double | Scheme::Multiple)
            .then(|| r.options.criterion.name());
        DesignReport {
            title: title.to_string(),
            scheme: r.scheme.name(),
            model: r.model.kind(),
            quality_unit: r.model.kind().quality_unit(),
            lot_size: r.model.lot_size(),
            plan: d.plan.clone(),
            stages: d.plan.stages().to_vec(),
            producer,
            consumer,
            criterion,
            asn: solution.asn,
            sequential: d
                .plan
                .sequential_lines()
                .map(|l| SequentialReport::new(l, solution.wald)),
            single_plan: SinglePlanReport {
                n: single.n,
                c: single.c,
            },
            fitting_acceptance_numbers: if is_single {
                single.fitting_c.clone()
            } else {
                Vec::new()
            },
            alternatives: solution
                .alternatives
                .iter()
                .map(AlternativeReport::from)
                .collect(),
            notes,
            sensitivity: Vec::new(),
            solved_by: tool_version(),
        }
    }
}

impl Report for DesignReport {
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        let r = self;
        let per_unit = r.model == ModelKind::Poisson;
        writeln!(out, "{}", escape_controls(&r.title))?;
        let lot = r
            .lot_size
            .map_or("no lot size".to_string(), |n| format!("lot of {n} units"));
        writeln!(out, "{} plan, {} model, {lot}", r.scheme, r.model)?;
        writeln!(out)?;
        let plan = &r.plan;
        if let Some(seq) = &r.sequential {
            writeln!(
                out,
                "  PLAN  item by item: accept when d <= {:.5} n - {:.5}, reject when d >= {:.5} n + {:.5}; at item {} accept d <= {}",
                seq.slope,
                seq.h_accept,
                seq.slope,
                seq.h_reject,
                seq.truncation,
                seq.final_acceptance
            )?;
        } else {
            writeln!(out, "{}", plan_headline(plan))?;
        }
        for step in words::plan_procedure(plan, per_unit) {
            writeln!(out, "  {step}")?;
        }
        if let Some(seq) = &r.sequential {
            writeln!(out)?;
            write_item_table(out, seq)?;
        } else if plan.as_single().is_none() {
            writeln!(out)?;
            write_stage_table(out, &r.stages)?;
        }
        writeln!(out)?;
        write_risk_points(out, &r.producer, &r.consumer, per_unit)?;
        for note in &r.notes {
            writeln!(out, "Note: {note}")?;
        }
        if let Some(a) = &r.asn {
            writeln!(out)?;
            let mut g = grid(&["Average sample number", "Units"]);
            g.add_row(vec!["at the AQL".to_string(), format!("{:.1}", a.at_aql)]);
            g.add_row(vec!["at the RQL".to_string(), format!("{:.1}", a.at_rql)]);
            g.add_row(vec![
                format!("largest (at {})", format_quality(a.max_quality, per_unit)),
                format!("{:.1}", a.max),
            ]);
            g.add_row(vec!["largest sample".to_string(), a.max_sample.to_string()]);
            g.add_row(vec![
                format!(
                    "single plan n = {}, c = {}",
                    r.single_plan.n, r.single_plan.c
                ),
                r.single_plan.n.to_string(),
            ]);
            writeln!(out, "{g}")?;
            if let Some(w) = r.sequential.as_ref().and_then(|s| s.wald) {
                writeln!(
                    out,
                    "Wald's approximations (untruncated test): ASN {:.1} at the AQL, {:.1} at the RQL, {:.1} at most",
                    w.asn_aql, w.asn_rql, w.asn_max
                )?;
            }
            if let Some(c) = r.criterion {
                writeln!(out, "The designer minimised {c}.")?;
            }
            write_sensitivity(out, r, per_unit)?;
            return writeln!(out, "{}", words::CAUTION);
        }
        writeln!(out)?;
        writeln!(
            out,
            "Nearby plans (sample sizes meeting each point, by acceptance number)"
        )?;
        let (first, rows) = r.nearby_rows();
        let mut g = grid(&["c", "meets RQL from n", "meets AQL up to n", "both"]);
        for row in rows {
            let [c, from, to, both] = row.cells;
            let mark = if row.chosen { " *" } else { "" };
            g.add_row(vec![format!("{c}{mark}"), from, to, both]);
        }
        writeln!(out, "{g}")?;
        if first > 0 {
            writeln!(
                out,
                "({first} smaller acceptance numbers meet no n; --nearby all lists them)"
            )?;
        }
        writeln!(out, "* the chosen plan.")?;
        write_sensitivity(out, r, per_unit)?;
        writeln!(out, "{}", words::CAUTION)
    }

    /// The alternatives, one row per acceptance number.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let report = self;
        let mut w = csv_writer(out);
        w.write_record(["c", "n_min", "n_max", "feasible", "reason"])?;
        for a in &report.alternatives {
            w.write_record([
                a.c.to_string(),
                cell(a.n_min),
                cell(a.n_max),
                a.feasible.to_string(),
                a.reason.clone().unwrap_or_default(),
            ])?;
        }
        w.flush()
    }
}

/// What each concession saves and each tightening costs, one row per input.
fn write_sensitivity(out: &mut dyn Write, r: &DesignReport, per_unit: bool) -> io::Result<()> {
    if r.sensitivity.is_empty() {
        return Ok(());
    }
    writeln!(out)?;
    writeln!(
        out,
        "What one step of each input does to the single plan (n = {}, c = {}), the other three as agreed{}",
        r.single_plan.n,
        r.single_plan.c,
        if per_unit {
            " (AQL and RQL per unit, per 100 units in brackets)"
        } else {
            ""
        }
    )?;
    let mut g = grid(&[
        "Input",
        "Agreed",
        "Step",
        "Conceded to",
        "n",
        "Tightened to",
        "n",
    ]);
    let (rows, reasons) = r.sensitivity_rows();
    for row in rows {
        g.add_row(row.to_vec());
    }
    writeln!(out, "{g}")?;
    for why in reasons {
        writeln!(out, "  no plan at {why}")?;
    }
    writeln!(
        out,
        "A concession is a lower AQL or a larger alpha (producer), a higher RQL or a larger beta (consumer); --step-aql, --step-alpha, --step-rql, --step-beta set the steps."
    )
}
