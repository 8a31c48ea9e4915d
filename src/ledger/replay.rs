//! The audit replay of a ledger (`lotsman verify LOG.csv`): every row is
//! checked against the rows before it and against the plan it names.
//!
//! - **The chain.** `seq` runs 1, 2, 3, ...; each `prev_hash` is the hash
//!   of the row before (the first, [`GENESIS`]); each `hash` is what the
//!   row's fields give ([`chain_hash`](super::chain_hash)). An edited
//!   field breaks its row's hash; a deleted or moved row breaks `seq` and
//!   `prev_hash`.
//! - **The plan.** The row's `plan_sha256` is the SHA-256 of one of the
//!   plan sources given (a known revision).
//! - **The severity.** For a standard-indexed source, the row's severity
//!   is the one the switching rules of MIL-STD-105E required after the
//!   rows before it (4.6 to 4.8, one state per ledger: see
//!   [`KnownPlan`]); a resubmitted lot neither moves the state nor is
//!   counted (4.7). After discontinuation (4.8), the row that records the
//!   supplier's corrective action resumes inspection on tightened. For other plans the severity and code letter are
//!   empty.
//! - **The decision.** It follows from the row's counts by the plan at
//!   the row's severity, and so do the units inspected and the code
//!   letter; for a variables plan, from the row's `mean` and `sd` of its
//!   `inspected` readings.
//! - **The lots.** A lot appears once, unless later rows mark it
//!   resubmitted; a resubmitted lot was recorded before.
//!
//! A torn last line is a finding too. Each finding names the row (its
//! `seq` and line) and the column.

use std::collections::HashMap;

use serde::Serialize;

use crate::plan::Decision;
use crate::standard::{LotResult, Severity, SwitchingRules, SwitchingState};

use super::hash::GENESIS;
use super::plan::KnownPlan;
use super::read::{Ledger, LedgerLine};
use super::row::{LedgerRow, decision_name};

/// One break the replay found.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct Finding {
    /// The line, counted from 1 (the header is line 1).
    pub line: u64,
    /// The row's `seq` as written (none for a torn line).
    pub seq: Option<u64>,
    /// The column that breaks.
    pub field: &'static str,
    /// What is wrong, in words.
    pub message: String,
}

/// What the replay found, and where it leaves the switching rules.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Replay {
    /// The rows read.
    pub rows: usize,
    /// Every break, in file order.
    pub findings: Vec<Finding>,
    /// The switching state after the last row, when a standard-indexed
    /// source is known.
    pub state: Option<SwitchingState>,
    /// Whether the rows were checked against plan sources (otherwise the
    /// chain and the lots only).
    pub plans_checked: bool,
}

impl Replay {
    /// The severity the next lot is inspected at (`None` when no
    /// standard-indexed source is known, or inspection is discontinued).
    pub fn next_severity(&self) -> Option<Severity> {
        self.state.as_ref().and_then(SwitchingState::severity)
    }
}

/// The first break of the hash chain, as `(line, seq, column)`.
pub fn chain_break(ledger: &Ledger) -> Option<(u64, u64, &'static str)> {
    let mut prev = GENESIS;
    for (i, LedgerLine { line, row, sealed }) in ledger.rows.iter().enumerate() {
        if let Some(field) = link_break(row, *sealed, i as u64 + 1, prev) {
            return Some((*line, row.seq, field));
        }
        prev = &row.hash;
    }
    None
}

/// The column where `row`, expected as number `seq` after a row whose
/// hash is `prev`, breaks the chain; `sealed` tells whether its hash is
/// the one its cells give.
fn link_break(row: &LedgerRow, sealed: bool, seq: u64, prev: &str) -> Option<&'static str> {
    if row.seq != seq {
        Some("seq")
    } else if row.prev_hash != prev {
        Some("prev_hash")
    } else if !sealed {
        Some("hash")
    } else {
        None
    }
}

/// Replays `ledger` against `plans` (see the module doc). With no plans,
/// the chain and the lots are checked; the switching state is followed
/// when a standard-indexed source is among `plans`, by the rules of each
/// row's own source, or for a row whose source is not given, of the last
/// standard-indexed source given.
///
/// ```
/// use lotsman::{Ledger, replay};
/// let ledger = Ledger::parse(std::path::Path::new("log.csv"), b"").unwrap();
/// let r = replay(&ledger, &[]);
/// assert!(r.findings.is_empty() && r.rows == 0);
/// ```
pub fn replay(ledger: &Ledger, plans: &[KnownPlan]) -> Replay {
    let by_hash: HashMap<&str, &KnownPlan> = plans.iter().map(|p| (p.sha256.as_str(), p)).collect();
    let fallback: Option<&SwitchingRules> = plans.iter().rev().find_map(KnownPlan::rules);
    let mut state = fallback.map(|_| SwitchingState::new());
    let mut findings = Vec::new();
    let mut lots: HashMap<&str, u64> = HashMap::new();
    let mut prev = GENESIS;
    for (i, LedgerLine { line, row, sealed }) in ledger.rows.iter().enumerate() {
        let mut find = |field: &'static str, message: String| {
            findings.push(Finding {
                line: *line,
                seq: Some(row.seq),
                field,
                message,
            });
        };
        let expected_seq = i as u64 + 1;
        match link_break(row, *sealed, expected_seq, prev) {
            Some("seq") => find(
                "seq",
                format!("the row is number {expected_seq} in the file but says seq {}: a row before it was deleted or moved", row.seq),
            ),
            Some("prev_hash") => find(
                "prev_hash",
                "does not match the hash of the row before it: a row was deleted, inserted or moved".into(),
            ),
            Some(_) => find(
                "hash",
                "does not match the row's fields: a field of this row was edited after it was recorded".into(),
            ),
            None => {}
        }
        prev = &row.hash;
        let e = &row.entry;
        match (lots.get(e.lot.as_str()), e.resubmitted) {
            (Some(first), false) => find(
                "lot",
                format!(
                    "the lot '{}' was recorded before (seq {first}) and this row is not marked resubmitted",
                    e.lot
                ),
            ),
            (None, true) => find(
                "resubmitted",
                format!(
                    "the lot '{}' is marked resubmitted but no earlier row records it",
                    e.lot
                ),
            ),
            (None, false) => {
                lots.insert(&e.lot, row.seq);
            }
            (Some(_), true) => {}
        }
        let known = by_hash.get(e.plan_sha256.as_str()).copied();
        if !plans.is_empty() && known.is_none() {
            find(
                "plan_sha256",
                "is not the SHA-256 of any plan source given with --plan: give the revision the lot was judged by".into(),
            );
        }
        let mut result = None;
        if let Some(plan) = known {
            let is_standard = plan.rules().is_some();
            if let Some(current) = &state
                && is_standard
                && e.corrective_action.is_some()
            {
                match current.resume() {
                    Ok(resumed) => state = Some(resumed),
                    Err(_) => find(
                        "corrective_action",
                        format!(
                            "is filled but inspection was on {} inspection, not discontinued: a corrective action resumes only a discontinued inspection (MIL-STD-105E 4.8)",
                            current.standing()
                        ),
                    ),
                }
            } else if e.corrective_action.is_some() && !is_standard {
                find(
                    "corrective_action",
                    "is filled but the plan is not standard-indexed: it has no switching rules to resume".into(),
                );
            }
            if is_standard {
                let required = state.as_ref().map(SwitchingState::severity);
                match required {
                    Some(None) => find(
                        "severity",
                        "inspection under the standard was discontinued before this lot (MIL-STD-105E 4.8) and the row records no corrective action: no lot is to be judged under the standard until the supplier's corrective action".into(),
                    ),
                    Some(Some(s)) if e.severity != Some(s) => find(
                        "severity",
                        format!(
                            "is {} but the switching rules required {} inspection after the rows before it (MIL-STD-105E 4.7)",
                            e.severity.map_or("empty", Severity::name),
                            s.name()
                        ),
                    ),
                    _ => {}
                }
                if e.severity.is_none() {
                    find(
                        "severity",
                        "is empty; a standard-indexed plan is applied at a severity".into(),
                    );
                }
            } else if e.severity.is_some() || e.code_letter.is_some() {
                find(
                    if e.severity.is_some() { "severity" } else { "code_letter" },
                    "is filled but the plan is not standard-indexed: it has no severity or code letter".into(),
                );
            }
            match plan.decide_row(e) {
                Err(message) => find(
                    "found",
                    format!("the lot cannot be decided again by the plan: {message}"),
                ),
                Ok(decided) => {
                    if decided.decision != e.decision {
                        find(
                            "decision",
                            format!(
                                "is {} but the {} give {} by the plan",
                                decision_name(e.decision),
                                if e.measured.is_some() {
                                    "readings' mean and sd"
                                } else {
                                    "counts"
                                },
                                decision_name(decided.decision)
                            ),
                        );
                    } else if decided.inspected != e.inspected {
                        find(
                            "inspected",
                            format!(
                                "is {} but the plan inspects {} for these counts",
                                e.inspected, decided.inspected
                            ),
                        );
                    } else if is_standard && decided.code_letter != e.code_letter {
                        find(
                            "code_letter",
                            format!(
                                "is {} but the plan's code letter is {}",
                                e.code_letter.as_deref().unwrap_or("empty"),
                                decided.code_letter.as_deref().unwrap_or("none")
                            ),
                        );
                    }
                    result = decided.lot;
                }
            }
        }
        if let (Some(current), true) = (&state, e.decision != Decision::Continue) {
            let rules = known.and_then(KnownPlan::rules).or(fallback);
            let lot = result.or_else(|| row_result(row));
            if let (Some(rules), Some(lot)) = (rules, lot) {
                let lot = if e.resubmitted {
                    lot.resubmitted()
                } else {
                    lot
                };
                // A step the rules refuse (after discontinuation) was
                // reported above; the state stays.
                if let Ok(next) = rules.step(current, &lot) {
                    state = Some(next);
                }
            }
        }
    }
    if let Some(torn) = &ledger.torn {
        findings.push(Finding {
            line: torn.line,
            seq: None,
            field: "format",
            message: format!(
                "the last line is torn ({}): it was cut short while it was written; move it out of the file and judge the lot again",
                torn.reason
            ),
        });
    }
    Replay {
        rows: ledger.rows.len(),
        findings,
        state,
        plans_checked: !plans.is_empty(),
    }
}

/// A row's lot as the rules read it when its plan is not given: its
/// decision, its total count and its most units.
fn row_result(row: &LedgerRow) -> Option<LotResult> {
    let count = row.entry.found.counts().concat().iter().sum();
    let units = row.entry.inspected.counts().concat().into_iter().max()?;
    match row.entry.decision {
        Decision::Accept => LotResult::accepted(count, units).ok(),
        Decision::Reject => LotResult::rejected(count, units).ok(),
        Decision::Continue => None,
    }
}
