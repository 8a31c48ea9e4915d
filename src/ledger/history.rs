//! Each lot of a ledger on a control chart (`lotsman history`): the
//! fraction nonconforming of its first sample against Shewhart's p-chart,
//! or the nonconformities per unit against the u-chart, with limits that
//! vary with the lot's sample size, and the running process average.
//!
//! ```text
//! p-chart: centre p̄ = Σ found / Σ n over the first samples,
//!          limits p̄ ± 3 sqrt(p̄ (1 - p̄) / n), the lower clipped at 0
//! u-chart: centre ū = Σ found / Σ n,
//!          limits ū ± 3 sqrt(ū / n), the lower clipped at 0
//! ```
//!
//! (W. A. Shewhart's charts for attributes, as in D. C. Montgomery,
//! Introduction to Statistical Quality Control, chapter 7, control charts
//! for attributes with variable sample size; from memory.) The centre is
//! the process average of every lot charted, the first class of the plan.

use serde::Serialize;

use crate::model::{Interval, ModelKind, clopper_pearson, poisson_rate_interval};
use crate::plan::Decision;
use crate::standard::Severity;

use super::error::LedgerError;
use super::plan::KnownPlan;
use super::read::Ledger;
use super::row::decision_name;
use super::status::{PROCESS_AVERAGE_LEVEL, ledger_status, lot_samples};

/// Three-sigma limits: a lot outside them signals a cause beyond chance.
pub const SIGMAS: f64 = 3.0;

/// One lot on the chart.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct HistoryLot {
    /// The row's `seq`.
    pub seq: u64,
    /// The date judged.
    pub date: String,
    /// The lot's identifier.
    pub lot: String,
    /// The severity it was judged at (standard-indexed sources).
    pub severity: Option<&'static str>,
    /// `accept` or `reject`.
    pub decision: &'static str,
    /// A resubmitted lot (not charted).
    pub resubmitted: bool,
    /// The first sample's units (none for a lot not charted).
    pub n: Option<u64>,
    /// The count found in it.
    pub found: Option<u64>,
    /// found / n.
    pub fraction: Option<f64>,
    /// The upper control limit for this n.
    pub upper_limit: Option<f64>,
    /// The lower control limit for this n, at least 0.
    pub lower_limit: Option<f64>,
    /// Whether the lot's fraction is outside its limits.
    pub out_of_control: bool,
    /// The process average of the lots up to this one, with its 95%
    /// interval.
    pub running: Option<Interval>,
}

/// The chart of a ledger's lots.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct History {
    /// `p` (fraction nonconforming) or `u` (nonconformities per unit).
    pub chart: &'static str,
    /// The class charted (none for a plan without named classes).
    pub class: Option<String>,
    /// The centre line: the process average over every lot charted.
    pub centre: Option<f64>,
    /// The AQL line (a designed plan's producer's quality).
    pub aql: Option<f64>,
    /// The lots, in ledger order.
    pub lots: Vec<HistoryLot>,
}

impl HistoryLot {
    /// Whether the lot was rejected.
    pub fn rejected(&self) -> bool {
        self.decision == decision_name(Decision::Reject)
    }
}

impl History {
    /// Whether it is a u-chart (nonconformities per unit).
    pub fn per_unit(&self) -> bool {
        self.chart == "u"
    }
}

/// The control limits `(lower, upper)` around `centre` for a sample of
/// `n`: the p-chart's, or the u-chart's with `per_unit`.
///
/// ```
/// use lotsman::control_limits;
/// // p̄ = 0.01, n = 125: 3 sqrt(0.01 · 0.99 / 125) = 0.026698...
/// let (lo, hi) = control_limits(0.01, 125, false);
/// assert_eq!(lo, 0.0);
/// assert!((hi - 0.036698).abs() < 1e-6);
/// ```
pub fn control_limits(centre: f64, n: u64, per_unit: bool) -> (f64, f64) {
    let n = n as f64;
    let variance = if per_unit {
        centre / n
    } else {
        centre * (1.0 - centre) / n
    };
    let half = SIGMAS * variance.sqrt();
    ((centre - half).max(0.0), centre + half)
}

/// The history of `ledger`, its rows judged by `plans`, for the class
/// named `class` of the plan of the last lot (`None`: its first class).
///
/// # Errors
/// As [`ledger_status`]: without a plan source, or over a ledger that does
/// not verify; [`LedgerError::Refused`] for a class the plan does not
/// have, naming those it has.
pub fn ledger_history(
    ledger: &Ledger,
    plans: &[KnownPlan],
    class: Option<&str>,
) -> Result<History, LedgerError> {
    let status = ledger_status(ledger, plans)?;
    let per_unit = status.plan.model_kind() == ModelKind::Poisson;
    let targets = &status.plan.targets;
    let index = match class {
        None => 0,
        Some(name) => targets
            .iter()
            .position(|t| t.class.as_deref() == Some(name))
            .ok_or_else(|| LedgerError::Refused {
                path: ledger.path.clone(),
                message: format!(
                    "--class {name}: the plan has no such class; its classes are {}",
                    targets
                        .iter()
                        .filter_map(|t| t.class.as_deref())
                        .collect::<Vec<_>>()
                        .join(", ")
                ),
            })?,
    };
    let target = targets.get(index);
    let samples = lot_samples(ledger, plans);
    let firsts: Vec<Option<(u64, u64)>> = samples
        .iter()
        .map(|s| s.first.as_ref().and_then(|f| f.get(index).copied()))
        .collect();
    let (all_k, all_n) = firsts
        .iter()
        .flatten()
        .fold((0u64, 0u64), |(k, n), (a, b)| (k + a, n + b));
    let centre = (all_n > 0).then(|| all_k as f64 / all_n as f64);
    let (mut run_k, mut run_n) = (0u64, 0u64);
    let mut lots = Vec::with_capacity(ledger.rows.len());
    for (line, first) in ledger.rows.iter().zip(&firsts) {
        let e = &line.row.entry;
        let mut lot = HistoryLot {
            seq: line.row.seq,
            date: e.date.to_string(),
            lot: e.lot.clone(),
            severity: e.severity.map(Severity::name),
            decision: decision_name(e.decision),
            resubmitted: e.resubmitted,
            n: None,
            found: None,
            fraction: None,
            upper_limit: None,
            lower_limit: None,
            out_of_control: false,
            running: None,
        };
        if let (Some((k, n)), Some(centre)) = (*first, centre) {
            run_k += k;
            run_n += n;
            let fraction = k as f64 / n as f64;
            let (lo, hi) = control_limits(centre, n, per_unit);
            lot.n = Some(n);
            lot.found = Some(k);
            lot.fraction = Some(fraction);
            lot.lower_limit = Some(lo);
            lot.upper_limit = Some(hi);
            lot.out_of_control = fraction > hi || fraction < lo;
        }
        if run_n > 0 {
            lot.running = if per_unit {
                poisson_rate_interval(run_k, run_n, PROCESS_AVERAGE_LEVEL)
            } else {
                clopper_pearson(run_k, run_n, PROCESS_AVERAGE_LEVEL)
            }
            .ok();
        }
        lots.push(lot);
    }
    Ok(History {
        chart: if per_unit { "u" } else { "p" },
        class: target.and_then(|t| t.class.clone()),
        centre,
        aql: target.and_then(|t| t.aql),
        lots,
    })
}
