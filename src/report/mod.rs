//! Reports: what the commands print, in one of three formats behind one
//! trait that writes into any writer.
//!
//! The report structs here are the contract with scripts: their JSON keys
//! (snake_case) are documented in README.md. Each format lives in its own
//! file and turns a report into text; choosing the writer (stdout, a file)
//! is the caller's business.

mod batch;
mod checks;
mod csv;
mod json;
mod rectifying;
mod table;
mod tradeoff;
mod variables;
pub mod words;

use std::io::{self, Write};

use serde::Serialize;

pub use self::batch::{
    BatchSummary, EvaluationBatchReport, EvaluationEntry, Failure, Outcome, SourceEvaluation,
};
pub use self::csv::Csv;
pub use self::json::Json;
pub use self::rectifying::{ProtectionReport, RectifyingPlanReport, RectifyingReport};
pub use self::table::Table;
pub use self::tradeoff::{CostReport, TradeoffCellReport, TradeoffReport};
pub use self::variables::{
    VariablesDesignReport, VariablesEvaluationReport, VariablesReport, variables_rule,
};
use crate::design::{Alternative, AsnSummary, Scheme, Sensitivity, Solution, WaldApproximation};
use crate::model::ModelKind;
use crate::model::RiskPair;
use crate::numeric::Short;
use crate::plan::{Aoql, Evaluation, ItemRun, Measures, SequentialLines, Stage, StagedPlan};
use crate::source::{Difference, tool_version};

/// One output format.
pub trait ReportFormat {
    /// Writes a design report.
    fn design(&self, out: &mut dyn Write, report: &DesignReport) -> io::Result<()>;
    /// Writes an evaluation report.
    fn evaluation(&self, out: &mut dyn Write, report: &EvaluationReport) -> io::Result<()>;
    /// Writes the results of verifying one or more sources.
    fn verification(&self, out: &mut dyn Write, report: &VerificationReport) -> io::Result<()>;
    /// Writes the evaluations of several sources, each under its path,
    /// with the batch's summary where the format has room for it.
    fn evaluations(&self, out: &mut dyn Write, report: &EvaluationBatchReport) -> io::Result<()>;
    /// Writes a variables design report.
    fn variables_design(
        &self,
        out: &mut dyn Write,
        report: &VariablesDesignReport,
    ) -> io::Result<()>;
    /// Writes a variables evaluation report.
    fn variables_evaluation(
        &self,
        out: &mut dyn Write,
        report: &VariablesEvaluationReport,
    ) -> io::Result<()>;
    /// Writes a trade-off grid.
    fn tradeoff(&self, out: &mut dyn Write, report: &TradeoffReport) -> io::Result<()>;
    /// Writes a minimum-inspection design report (`rectify`).
    fn rectifying(&self, out: &mut dyn Write, report: &RectifyingReport) -> io::Result<()>;
}

/// A risk point with the risk the plan achieves there.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct PointReport {
    /// The agreed quality.
    pub quality: f64,
    /// The agreed largest risk.
    pub risk: f64,
    /// The risk the plan really has at that quality.
    pub achieved_risk: f64,
    /// Whether the achieved risk lies within `1e-9` (relative) of the
    /// agreed one ([`NEAR_LIMIT`](crate::NEAR_LIMIT)): the plan meets the
    /// point by less than the computation can vouch for.
    pub near_limit: bool,
}

impl PointReport {
    /// The point `(quality, risk)` and the risk a plan achieves there.
    pub fn new(quality: f64, risk: f64, achieved_risk: f64) -> Self {
        PointReport {
            quality,
            risk,
            achieved_risk,
            near_limit: crate::numeric::near_limit(achieved_risk, risk),
        }
    }
}

/// The producer's and consumer's points of `risks` with the risks a design
/// achieves there, `(producer's, consumer's)`; a note is added to `notes`
/// for each achieved risk that sits on its limit.
fn achieved_points(
    risks: &RiskPair,
    (producer_risk, consumer_risk): (f64, f64),
    notes: &mut Vec<String>,
) -> (PointReport, PointReport) {
    let (p, c) = (risks.producer(), risks.consumer());
    let producer = PointReport::new(p.quality, p.risk, producer_risk);
    let consumer = PointReport::new(c.quality, c.risk, consumer_risk);
    for (side, greek, point) in [
        ("producer's", "alpha", &producer),
        ("consumer's", "beta", &consumer),
    ] {
        if point.near_limit {
            notes.push(format!(
                "the achieved {side} risk {} lies within 1e-9 of {greek} = {}: the plan meets the point only at the limit of the computation's precision; a plan one step larger keeps a margin",
                Short(point.achieved_risk),
                Short(point.risk)
            ));
        }
    }
    (producer, consumer)
}

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

/// The single plan beside a staged one.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct SinglePlanReport {
    /// Sample size.
    pub n: u64,
    /// Acceptance number.
    pub c: u64,
}

/// The sequential part of a design report.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SequentialReport {
    /// Intercept of the acceptance line.
    pub h_accept: f64,
    /// Intercept of the rejection line.
    pub h_reject: f64,
    /// Slope of both lines.
    pub slope: f64,
    /// Last item.
    pub truncation: u64,
    /// Acceptance number at the last item.
    pub final_acceptance: u64,
    /// The inspector's table: runs of items with the same numbers.
    pub table: Vec<ItemRun>,
    /// Wald's approximations of the untruncated test.
    pub wald: Option<WaldApproximation>,
}

impl SequentialReport {
    /// The report of `lines`, with Wald's figures where known.
    pub fn new(lines: &SequentialLines, wald: Option<WaldApproximation>) -> Self {
        SequentialReport {
            h_accept: lines.h_accept,
            h_reject: lines.h_reject,
            slope: lines.slope,
            truncation: lines.truncation,
            final_acceptance: lines.final_acceptance,
            table: lines.runs(),
            wald,
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
    /// Nearby plans, `c = 0` to a little past the chosen one.
    pub alternatives: Vec<AlternativeReport>,
    /// Remarks a reader should see (100% inspection, ties).
    pub notes: Vec<String>,
    /// How the single plan's sample size answers a move of each input
    /// (empty until [`DesignReport::with_sensitivity`]).
    pub sensitivity: Vec<Sensitivity>,
    /// Tool and version.
    pub solved_by: String,
}

impl DesignReport {
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

/// How one source fared under `verify`.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum VerifyStatus {
    /// Recorded plan equals the re-solved one.
    Match,
    /// They differ.
    Mismatch,
    /// The source could not be read, parsed or solved.
    Invalid,
}

impl VerifyStatus {
    /// The status as printed and in JSON.
    pub fn name(self) -> &'static str {
        match self {
            VerifyStatus::Match => "match",
            VerifyStatus::Mismatch => "mismatch",
            VerifyStatus::Invalid => "invalid",
        }
    }
}

/// One source's verification.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct VerifyEntry {
    /// The source's path as given.
    pub path: String,
    /// Outcome.
    pub status: VerifyStatus,
    /// The differing fields, for a mismatch.
    pub differences: Vec<Difference>,
    /// The error, for an invalid source.
    pub message: Option<String>,
}

/// What `verify` reports.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct VerificationReport {
    /// One entry per source, in the order given.
    pub results: Vec<VerifyEntry>,
    /// Whether a table lists every source, or only the failures (JSON and
    /// CSV always give every source).
    #[serde(skip)]
    pub every_source: bool,
}

/// The head of a table column of qualities (or AOQs) named `name`: the
/// name alone for fractions, which print with their `%`; with both units
/// for nonconformities ([`format_quality_cell`]).
pub(crate) fn quality_head(name: &str, per_unit: bool) -> String {
    if per_unit {
        format!("{name} per unit (per 100 units)")
    } else {
        name.to_string()
    }
}
