//! Where a supplier stands after the ledger's lots (`lotsman status`):
//! the switching state the replay leaves (the same [`replay`] that
//! `judge --record` and `verify` use), the plan of the next lot, and the
//! process average over first samples with its exact interval.
//!
//! # The process average
//!
//! ```text
//! estimate = sum of counts in first samples / sum of first-sample units
//! ```
//!
//! over the lots of original inspection (resubmitted lots are left out:
//! they were sorted or reworked, so their counts say little of the
//! process), per class of defects. Only first samples count: a second
//! sample is drawn only when the first one's count was between the
//! numbers, so adding it would weigh the doubtful lots more. MIL-STD-105E
//! defines the process average over original inspection; taking first
//! samples alone for double and multiple plans is the practice of its
//! earlier editions (from memory). An item-by-item plan's whole sample is
//! its first.
//! The interval is the two-sided 95% Clopper–Pearson interval
//! ([`clopper_pearson`]), or the exact Poisson interval
//! ([`poisson_rate_interval`]) when the plan counts nonconformities.

use serde::Serialize;

use crate::model::{Interval, ModelKind, clopper_pearson, poisson_rate_interval};
use crate::standard::SwitchingState;

use super::error::LedgerError;
use super::plan::KnownPlan;
use super::read::Ledger;
use super::replay::replay;

/// The confidence level of the process average's interval.
pub const PROCESS_AVERAGE_LEVEL: f64 = 0.95;

/// The process average of one class of defects.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct ClassAverage {
    /// The class's name; `None` for a plan without named classes.
    pub class: Option<String>,
    /// The lots counted.
    pub lots: u64,
    /// The count found in their first samples.
    pub found: u64,
    /// The units of their first samples.
    pub inspected: u64,
    /// The estimate and its interval.
    pub interval: Interval,
    /// The AQL the plan assumes (a designed plan's producer's quality).
    pub aql: Option<f64>,
    /// The RQL (a designed plan's consumer's quality, a standard-indexed
    /// source's consumer point, or a minimum-inspection plan's LTPD).
    pub rql: Option<f64>,
    /// The process average a minimum-inspection plan was designed for.
    pub design_average: Option<f64>,
}

impl ClassAverage {
    /// Whether the whole interval lies above the AQL: the supplier's
    /// process average is worse than the plan assumes.
    pub fn above_aql(&self) -> bool {
        self.aql.is_some_and(|a| self.interval.lower > a)
    }

    /// Whether the whole interval lies above the process average a
    /// minimum-inspection plan was designed for: the plan no longer
    /// inspects the fewest units on average.
    pub fn above_design_average(&self) -> bool {
        self.design_average.is_some_and(|p| self.interval.lower > p)
    }

    /// Whether the interval's upper end reaches the RQL.
    pub fn reaches_rql(&self) -> bool {
        self.rql.is_some_and(|r| self.interval.upper >= r)
    }
}

/// One lot's first sample as the process average reads it.
#[derive(Clone, Debug, PartialEq)]
pub struct LotSample {
    /// The row's `seq`.
    pub seq: u64,
    /// `(count, units)` of the first sample per class, in the plan's
    /// order; `None` for a resubmitted lot or a row that does not show
    /// its first sample.
    pub first: Option<Vec<(u64, u64)>>,
}

/// Where a supplier stands after the ledger's lots.
#[derive(Clone, Debug)]
pub struct LedgerStatus {
    /// The rows read.
    pub rows: usize,
    /// The plan of the next lot: the revision the last lot was judged by
    /// (for an empty ledger, the last plan source given).
    pub plan: KnownPlan,
    /// The switching state for the next lot (standard-indexed sources).
    pub state: Option<SwitchingState>,
    /// The process average per class (empty before the first lot).
    pub averages: Vec<ClassAverage>,
    /// Resubmitted lots, left out of the process average.
    pub resubmitted: u64,
    /// Lots whose first sample the row does not show (one cumulative
    /// count past the first stage), left out of the process average.
    pub unread: u64,
}

impl LedgerStatus {
    /// Whether the counts are nonconformities (Poisson).
    pub fn nonconformities(&self) -> bool {
        self.plan.model_kind() == ModelKind::Poisson
    }
}

/// Each row's first sample by its own plan (see [`LotSample`]).
pub fn lot_samples(ledger: &Ledger, plans: &[KnownPlan]) -> Vec<LotSample> {
    ledger
        .rows
        .iter()
        .map(|line| {
            let e = &line.row.entry;
            let first = if e.resubmitted {
                None
            } else {
                plans
                    .iter()
                    .find(|p| p.sha256 == e.plan_sha256)
                    .and_then(|p| p.first_samples(e.severity, &e.found, &e.inspected))
            };
            LotSample {
                seq: line.row.seq,
                first,
            }
        })
        .collect()
}

/// The process average over `samples` for `plan`'s classes, at
/// [`PROCESS_AVERAGE_LEVEL`]; empty when no unit was counted.
///
/// # Errors
/// [`LedgerError::Refused`] for counts an interval cannot take (more
/// nonconforming units than units), which a verified ledger never holds.
pub fn process_averages(
    ledger: &Ledger,
    plan: &KnownPlan,
    samples: &[LotSample],
) -> Result<Vec<ClassAverage>, LedgerError> {
    let mut out = Vec::new();
    for (i, target) in plan.targets.iter().enumerate() {
        let (mut lots, mut found, mut inspected) = (0, 0u64, 0u64);
        for first in samples.iter().filter_map(|s| s.first.as_ref()) {
            if let Some(&(k, n)) = first.get(i) {
                lots += 1;
                found = found.saturating_add(k);
                inspected = inspected.saturating_add(n);
            }
        }
        if inspected == 0 {
            continue;
        }
        let interval = if plan.model_kind() == ModelKind::Poisson {
            poisson_rate_interval(found, inspected, PROCESS_AVERAGE_LEVEL)
        } else {
            clopper_pearson(found, inspected, PROCESS_AVERAGE_LEVEL)
        }
        .map_err(|e| LedgerError::Refused {
            path: ledger.path.clone(),
            message: format!("the process average cannot be estimated: {e}"),
        })?;
        out.push(ClassAverage {
            class: target.class.clone(),
            lots,
            found,
            inspected,
            interval,
            aql: target.aql,
            rql: target.rql,
            design_average: target.design_average,
        });
    }
    Ok(out)
}

/// Where the supplier of `ledger` stands, its rows judged by `plans`.
///
/// # Errors
/// [`LedgerError::Refused`] without a plan source, or when the ledger
/// does not verify (its first finding named: a status built on a broken
/// record would mislead).
pub fn ledger_status(ledger: &Ledger, plans: &[KnownPlan]) -> Result<LedgerStatus, LedgerError> {
    let refuse = |message: String| LedgerError::Refused {
        path: ledger.path.clone(),
        message,
    };
    if plans.is_empty() {
        return Err(refuse(
            "the status needs the plan sources the lots were judged by: give each revision with --plan PLAN.yaml".into(),
        ));
    }
    let replayed = replay(ledger, plans);
    if let Some(f) = replayed.findings.first() {
        return Err(refuse(format!(
            "the ledger does not verify ({} finding{}; the first: line {}, {}: {}); lotsman verify {}{} lists them all",
            replayed.findings.len(),
            if replayed.findings.len() == 1 {
                ""
            } else {
                "s"
            },
            f.line,
            f.field,
            f.message,
            crate::plain::shell_path(&ledger.path),
            plans
                .iter()
                .map(|p| format!(" --plan {}", crate::plain::shell_path(&p.path)))
                .collect::<String>()
        )));
    }
    let plan = ledger
        .rows
        .last()
        .and_then(|l| plans.iter().find(|p| p.sha256 == l.row.entry.plan_sha256))
        .or(plans.last())
        .cloned()
        .ok_or_else(|| refuse("no plan source was given".into()))?;
    let samples = lot_samples(ledger, plans);
    let resubmitted = ledger
        .rows
        .iter()
        .filter(|l| l.row.entry.resubmitted)
        .count() as u64;
    let unread = samples.iter().filter(|s| s.first.is_none()).count() as u64 - resubmitted;
    let averages = process_averages(ledger, &plan, &samples)?;
    Ok(LedgerStatus {
        rows: ledger.rows.len(),
        state: if plan.rules().is_some() {
            replayed.state
        } else {
            None
        },
        plan,
        averages,
        resubmitted,
        unread,
    })
}
