//! The switching state and its one pure step per lot.

use serde::Serialize;

use super::error::SwitchingError;
use super::lot::LotResult;
use super::rules::{MIN_WINDOW_LOTS, SwitchingRules};
use crate::standard::Severity;

/// Consecutive lots within which a second lot not accepted on normal
/// inspection switches to tightened (105E 4.7.1).
pub const REJECTION_SPAN: u8 = 5;

/// Consecutive lots accepted on tightened inspection that restore normal
/// inspection (105E 4.7.2).
pub const ACCEPTED_TO_NORMAL: u8 = 5;

/// Lots not accepted on one spell of tightened inspection that discontinue
/// inspection under the standard (105E 4.8).
pub const NOT_ACCEPTED_TO_STOP: u8 = 5;

/// What the rules remember on normal inspection.
#[derive(Clone, Debug, Default, PartialEq, Eq, Hash, Serialize)]
pub(crate) struct NormalRecord {
    /// Lots inspected on normal inspection in this spell, up to
    /// [`REJECTION_SPAN`] (no rule looks further back for rejections).
    pub(crate) lots: u8,
    /// Lots inspected since the last lot not accepted on normal inspection,
    /// while a next one would still fall within [`REJECTION_SPAN`]
    /// consecutive lots with it.
    pub(crate) since_rejection: Option<u8>,
    /// The accepted lots since normal inspection started or since the last
    /// lot not accepted, most recent last, as (count, units); at most the
    /// limit-number window's lots are kept.
    pub(crate) run: Vec<(u64, u64)>,
}

#[derive(Clone, Debug, PartialEq, Eq, Hash, Serialize)]
#[serde(rename_all = "lowercase", tag = "severity")]
pub(crate) enum Phase {
    Normal(NormalRecord),
    Tightened {
        /// Consecutive lots accepted on this spell of tightened inspection.
        accepted_in_row: u8,
        /// Lots not accepted on this spell of tightened inspection.
        not_accepted: u8,
    },
    Reduced,
    Discontinued,
}

/// Where a supplier stands under the switching rules: the severity in force
/// (or inspection discontinued) and the counters behind each rule.
///
/// A state changes only through [`SwitchingRules::step`] (one lot), and the
/// user's actions that no count decides: [`SwitchingState::resume`] after
/// corrective action (105E 4.8) and [`SwitchingState::reinstate_normal`]
/// when production turns irregular on reduced inspection (105E 4.7.4 c, d).
#[derive(Clone, Debug, PartialEq, Eq, Hash, Serialize)]
pub struct SwitchingState {
    pub(crate) phase: Phase,
}

impl Default for SwitchingState {
    fn default() -> Self {
        Self::new()
    }
}

impl SwitchingState {
    /// The start of a contract: normal inspection (105E 4.6).
    pub fn new() -> Self {
        Self::on_normal()
    }

    fn on_normal() -> Self {
        SwitchingState {
            phase: Phase::Normal(NormalRecord::default()),
        }
    }

    fn on_tightened() -> Self {
        SwitchingState {
            phase: Phase::Tightened {
                accepted_in_row: 0,
                not_accepted: 0,
            },
        }
    }

    /// The severity for the next lot; `None` while inspection is
    /// discontinued.
    pub fn severity(&self) -> Option<Severity> {
        match self.phase {
            Phase::Normal(_) => Some(Severity::Normal),
            Phase::Tightened { .. } => Some(Severity::Tightened),
            Phase::Reduced => Some(Severity::Reduced),
            Phase::Discontinued => None,
        }
    }

    /// Whether inspection under the standard is discontinued (105E 4.8).
    pub fn is_discontinued(&self) -> bool {
        self.phase == Phase::Discontinued
    }

    /// The standing in one word: `normal`, `tightened`, `reduced` or
    /// `discontinued`.
    pub fn standing(&self) -> &'static str {
        self.severity().map_or("discontinued", Severity::name)
    }

    /// Inspection resumes on tightened inspection after the supplier's
    /// corrective action (105E 4.8).
    ///
    /// # Errors
    /// [`SwitchingError::Inconsistent`] when inspection is not
    /// discontinued.
    pub fn resume(&self) -> Result<Self, SwitchingError> {
        match self.phase {
            Phase::Discontinued => Ok(Self::on_tightened()),
            _ => Err(SwitchingError::Inconsistent(format!(
                "inspection is not discontinued (it is on {} inspection); only a discontinued inspection resumes after corrective action",
                self.standing()
            ))),
        }
    }

    /// Normal inspection from the next lot, on reduced inspection, when
    /// production becomes irregular or delayed, or other conditions warrant
    /// it (105E 4.7.4 c, d): events no count shows, which the user records.
    ///
    /// # Errors
    /// [`SwitchingError::Inconsistent`] when not on reduced inspection.
    pub fn reinstate_normal(&self) -> Result<Self, SwitchingError> {
        match self.phase {
            Phase::Reduced => Ok(Self::on_normal()),
            _ => Err(SwitchingError::Inconsistent(format!(
                "normal inspection is reinstated by the user only from reduced inspection; the supplier is on {} inspection",
                self.standing()
            ))),
        }
    }
}

impl SwitchingRules {
    /// The state after one lot: the rules of 105E 4.7 and 4.8 applied to
    /// `lot`, inspected at the severity `state` gives. Resubmitted lots
    /// change nothing (105E 4.7: original inspection only).
    ///
    /// ```
    /// use lotsman::{LimitWindow, LotResult, Severity, SwitchingRules, SwitchingState};
    /// let rules = SwitchingRules::new(true, Some(LimitWindow::ten(7)));
    /// let r = LotResult::rejected(4, 125).unwrap();
    /// let a = LotResult::accepted(1, 125).unwrap();
    /// let mut s = SwitchingState::new();
    /// for lot in [r, a, a, a] {
    ///     s = rules.step(&s, &lot).unwrap();
    /// }
    /// assert_eq!(s.severity(), Some(Severity::Normal));
    /// // Two lots not accepted within five consecutive lots (105E 4.7.1).
    /// s = rules.step(&s, &r).unwrap();
    /// assert_eq!(s.severity(), Some(Severity::Tightened));
    /// ```
    ///
    /// # Errors
    /// [`SwitchingError::Discontinued`] while inspection is discontinued;
    /// [`SwitchingError::Inconsistent`] for a count between Ac and Re away
    /// from reduced inspection.
    pub fn step(
        &self,
        state: &SwitchingState,
        lot: &LotResult,
    ) -> Result<SwitchingState, SwitchingError> {
        if lot.is_between() && !matches!(state.phase, Phase::Reduced) {
            return Err(SwitchingError::Inconsistent(format!(
                "a lot accepted with its count between the acceptance and rejection numbers occurs only on reduced inspection (MIL-STD-105E 4.10.1.4); the lot was on {} inspection",
                state.standing()
            )));
        }
        if lot.is_resubmitted() {
            return match state.phase {
                Phase::Discontinued => Err(SwitchingError::Discontinued),
                _ => Ok(state.clone()),
            };
        }
        Ok(match &state.phase {
            Phase::Normal(record) => self.step_normal(record, lot),
            &Phase::Tightened {
                accepted_in_row,
                not_accepted,
            } => {
                if lot.is_accepted() {
                    if accepted_in_row + 1 >= ACCEPTED_TO_NORMAL {
                        SwitchingState::on_normal()
                    } else {
                        SwitchingState {
                            phase: Phase::Tightened {
                                accepted_in_row: accepted_in_row + 1,
                                not_accepted,
                            },
                        }
                    }
                } else if not_accepted + 1 >= NOT_ACCEPTED_TO_STOP {
                    SwitchingState {
                        phase: Phase::Discontinued,
                    }
                } else {
                    SwitchingState {
                        phase: Phase::Tightened {
                            accepted_in_row: 0,
                            not_accepted: not_accepted + 1,
                        },
                    }
                }
            }
            Phase::Reduced => {
                if lot.is_accepted() && !lot.is_between() {
                    state.clone()
                } else {
                    SwitchingState::on_normal()
                }
            }
            Phase::Discontinued => return Err(SwitchingError::Discontinued),
        })
    }

    fn step_normal(&self, record: &NormalRecord, lot: &LotResult) -> SwitchingState {
        let lots = (record.lots + 1).min(REJECTION_SPAN);
        if !lot.is_accepted() {
            // A second lot not accepted within five consecutive lots.
            if record.since_rejection.is_some() {
                return SwitchingState::on_tightened();
            }
            return SwitchingState {
                phase: Phase::Normal(NormalRecord {
                    lots,
                    since_rejection: Some(0),
                    run: Vec::new(),
                }),
            };
        }
        // The rejection drops out of reach once a next one would make six
        // consecutive lots with it.
        let since_rejection = record
            .since_rejection
            .map(|k| k + 1)
            .filter(|&k| k + 1 < REJECTION_SPAN);
        let keep = self
            .window()
            .map_or(MIN_WINDOW_LOTS, |w| w.lots())
            .try_into()
            .unwrap_or(usize::MAX);
        let mut run = record.run.clone();
        run.push((lot.count(), lot.units()));
        if run.len() > keep {
            run.drain(..run.len() - keep);
        }
        if let Some(window) = self.reachable_window() {
            let lots_needed = window.lots() as usize;
            if run.len() >= lots_needed {
                let total: u64 = run[run.len() - lots_needed..].iter().map(|r| r.0).sum();
                if total <= u64::from(window.limit()) {
                    return SwitchingState {
                        phase: Phase::Reduced,
                    };
                }
            }
        }
        SwitchingState {
            phase: Phase::Normal(NormalRecord {
                lots,
                since_rejection,
                run,
            }),
        }
    }
}
