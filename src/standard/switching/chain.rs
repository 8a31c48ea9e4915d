//! The scheme's long-run OC: the switching rules as a Markov chain, solved
//! through its renewals.
//!
//! The chain's states are the rules' counters ([`SwitchingState`](super::SwitchingState)
//! without the units): on normal inspection the lots since the last one not
//! accepted (while within reach) and the window automaton's state; on
//! tightened the lots accepted in a row; reduced; and, for the
//! discontinuation figure only, the lots not accepted on tightened. Given the
//! quality, lots are independent and each severity's plan decides them, so
//! the chain is finite and, for `0 < p < 1`, has one recurrent class.
//!
//! Every visit to the start of normal inspection is a renewal. One cycle
//! from there is a spell of normal inspection, then a spell of tightened
//! (until five accepted in a row) or of reduced (until a lot not accepted or
//! between Ac and Re), then normal again. By the renewal identity for
//! ergodic chains (the stationary chance of a state is its expected visits
//! per cycle over the expected cycle length; Kemeny and Snell, *Finite
//! Markov Chains*, 1960, ch. IV-V, from memory), the share of lots on each
//! severity is its expected lots per cycle over the cycle's, and since lots
//! are independent given the severity (Wald's identity), every per-lot
//! figure of the scheme is the share-weighted mean of the severities'.
//!
//! The normal spell is a chain of runs (see [`run`](super::run)): each run
//! of expected length `G` ends by a lot not accepted (chance `u = rho G`) or
//! by reduced inspection starting (chance `phi`). After a lot not accepted,
//! another within the next four lots (chance `1 - a^4`, `a = 1 - rho`: the
//! window cannot complete that early) switches to tightened. Eliminating the
//! two run starts (the structured elimination of the fundamental matrix):
//!
//! ```text
//! D   = phi + (1 - a^4)            leaving the run after a lot not accepted
//! e   = phi + u + (1 - a^4)        (= 2 - a^4)
//! w_N = G e                        lots on normal per cycle, times D
//! w_T = u (1 - a^4) E_T            E_T = (1 + a_T + .. + a_T^4) / a_T^5
//! w_R = e phi E_R                  E_R = 1 / (reject_R + between_R)
//! share_i = w_i / (w_N + w_T + w_R)
//! ```
//!
//! `E_T` is the expected lots until five in a row are accepted on
//! tightened. The expected lots from the start of normal inspection until
//! the switch to tightened is `(w_N + w_R) / (u (1 - a^4))`; with discontinuation
//! absorbing (105E 4.8), a tightened spell (an acyclic chain over the lots
//! accepted in a row and the lots not accepted) ends in discontinuation with
//! chance `delta` after `E_spell` lots on average, and the expected lots
//! until discontinuation is `(lots until tightened + E_spell) / delta`.
//! The stationary OC leaves discontinuation out, as issue 16 asks.

use serde::Serialize;

use super::error::SwitchingError;
use super::outcomes::LotOutcomes;
use super::rules::SwitchingRules;
use super::run::{RunOutcome, RunSummary, run_with_window, run_without_window};
use super::state::{ACCEPTED_TO_NORMAL, NOT_ACCEPTED_TO_STOP};
use super::window::WindowAutomaton;
use crate::budget::Work;
use crate::standard::Severity;

/// Seconds per state and count per lot summed (release build), for
/// [`SwitchingScheme::work`]: measured 4.2 ms per quality for letter K's
/// 18,449-state window (benches/standard.rs, two cores shared with other
/// builds), which this with [`ASSUMED_LOTS`] overestimates about twice.
const SECONDS_PER_STATE_STEP: f64 = 2e-9;

/// Lots summed per quality assumed by [`SwitchingScheme::work`]: the
/// Collatz-Wielandt bound of the `run` module ends the sum after a few
/// dozen lots past the window at most qualities.
const ASSUMED_LOTS: f64 = 60.0;

/// Seconds per multiply-add of an LU decomposition (release build):
/// measured 0.4 ms per quality for letter H's 166-state window
/// (benches/standard.rs), which `n^3 / 3` of these matches.
const SECONDS_PER_LU_FLOP: f64 = 3e-10;

/// The switching scheme of one set of plans, ready to give its long-run OC
/// at any quality.
#[derive(Clone, Debug)]
pub struct SwitchingScheme {
    rules: SwitchingRules,
    window: Option<WindowAutomaton>,
    largest: u64,
}

/// The scheme's long-run figures at one quality.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct SchemeFigures {
    /// The long-run share of lots accepted: the scheme's OC.
    pub pa: f64,
    /// Share of lots inspected on normal inspection.
    pub normal_share: f64,
    /// Share of lots inspected on tightened inspection.
    pub tightened_share: f64,
    /// Share of lots inspected on reduced inspection.
    pub reduced_share: f64,
    /// Average sample number per lot.
    pub asn: f64,
    /// Average outgoing quality under rectification (lots not accepted
    /// screened, nonconforming units found replaced).
    pub aoq: f64,
    /// Average total inspection per lot under rectification; needs the lot
    /// size.
    pub ati: Option<f64>,
    /// Expected lots from the start of normal inspection until the switch
    /// to tightened; `None` when tightened is never reached.
    pub lots_until_tightened: Option<f64>,
    /// Expected lots from the start of normal inspection until inspection
    /// is discontinued (105E 4.8); `None` when it never is.
    pub lots_until_discontinuation: Option<f64>,
    /// Chance that a spell of tightened inspection ends in discontinuation
    /// rather than back on normal.
    pub discontinuation_per_spell: f64,
}

/// How the limit-number window entered the figures.
#[derive(Clone, Debug, PartialEq, Serialize)]
#[serde(rename_all = "snake_case", tag = "kind")]
pub enum WindowSolution {
    /// Reduced inspection cannot be reached: no window, figures exact.
    NoWindow,
    /// The window's chain was solved by LU decomposition: figures exact
    /// but for rounding.
    Exact {
        /// States of the window automaton.
        states: usize,
    },
    /// The window's chain was summed lot by lot with a proven bound on the
    /// rest: each figure lies between its values in `bounds[0]` and
    /// `bounds[1]` (a relative width near 1e-13), and the figures given are
    /// at the middle. Not exact.
    Bracketed {
        /// States of the window automaton.
        states: usize,
        /// Lots summed.
        lots_summed: u64,
        /// The figures at the two ends of the bracket.
        bounds: Box<[SchemeFigures; 2]>,
    },
}

/// The scheme's long-run OC at one quality.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SchemeOc {
    /// The quality.
    pub quality: f64,
    /// The figures.
    pub figures: SchemeFigures,
    /// How the limit-number window was solved: say so beside the figures
    /// when it is not exact.
    pub window: WindowSolution,
}

impl SwitchingScheme {
    /// The scheme under `rules` whose normal plan accepts a lot with at
    /// most `normal_acceptance` found (its last stage's Ac): the window
    /// automaton is built here, once.
    ///
    /// # Errors
    /// [`SwitchingError::WindowTooLarge`] when reduced inspection can be
    /// reached and its window is beyond the state budget.
    pub fn new(rules: SwitchingRules, normal_acceptance: u64) -> Result<Self, SwitchingError> {
        let window = match rules.reachable_window() {
            Some(w) => Some(WindowAutomaton::new(w, normal_acceptance)?),
            None => None,
        };
        Ok(SwitchingScheme {
            rules,
            window,
            largest: normal_acceptance,
        })
    }

    /// The rules.
    pub fn rules(&self) -> &SwitchingRules {
        &self.rules
    }

    /// The window automaton, when reduced inspection can be reached.
    pub fn window(&self) -> Option<&WindowAutomaton> {
        self.window.as_ref()
    }

    /// Whether the figures will be exact (no window, or a window small
    /// enough for LU decomposition) rather than bracketed.
    pub fn exact(&self) -> bool {
        self.window
            .as_ref()
            .is_none_or(|w| w.states() <= super::run::EXACT_STATES)
    }

    /// The estimated work of the long-run OC at `qualities` qualities.
    pub fn work(&self, qualities: usize) -> Work {
        let per_quality = match &self.window {
            None => 0.0,
            Some(w) if w.states() <= super::run::EXACT_STATES => {
                (w.states() as f64).powi(3) / 3.0 * SECONDS_PER_LU_FLOP
            }
            Some(w) => w.states() as f64 * w.arity() as f64 * ASSUMED_LOTS * SECONDS_PER_STATE_STEP,
        };
        Work::time(per_quality * qualities as f64)
    }

    /// The long-run OC at `quality` from each severity's per-lot outcomes
    /// there (`reduced` may be `None` when reduced inspection cannot be
    /// reached); `lot_size` for the ATI and the AOQ's uninspected units.
    ///
    /// # Errors
    /// [`SwitchingError::OutOfRange`] for a quality outside 0 to 1, a
    /// missing reduced plan or normal counts that do not match the normal
    /// acceptance number; [`SwitchingError::NotSettled`] when a bracketed
    /// window does not settle.
    pub fn long_run(
        &self,
        quality: f64,
        lot_size: Option<u64>,
        normal: &LotOutcomes,
        tightened: &LotOutcomes,
        reduced: Option<&LotOutcomes>,
    ) -> Result<SchemeOc, SwitchingError> {
        if !quality.is_finite() || !(0.0..=1.0).contains(&quality) {
            return Err(SwitchingError::OutOfRange {
                what: "the quality",
                value: quality.to_string(),
                range: "from 0 to 1".into(),
            });
        }
        let run = match &self.window {
            None => RunOutcome::Exact(run_without_window(normal.reject)),
            Some(w) => {
                let want = self.largest as usize + 1;
                if normal.accepted_counts.len() != want {
                    return Err(SwitchingError::OutOfRange {
                        what: "the number of count chances on accepted normal lots",
                        value: normal.accepted_counts.len().to_string(),
                        range: format!("{want}, one for each count 0 to {}", self.largest),
                    });
                }
                run_with_window(w, &normal.accepted_counts, normal.reject, quality)?
            }
        };
        let reduced = match (self.rules.reduced_reachable(), reduced) {
            (true, None) => {
                return Err(SwitchingError::OutOfRange {
                    what: "the reduced plan's outcomes",
                    value: "missing".into(),
                    range: "given whenever reduced inspection can be reached".into(),
                });
            }
            (true, Some(r)) => Some(r),
            (false, _) => None,
        };
        let at =
            |summary: &RunSummary| figures(quality, lot_size, summary, normal, tightened, reduced);
        Ok(match run {
            RunOutcome::Exact(summary) => SchemeOc {
                quality,
                figures: at(&summary),
                window: match &self.window {
                    None => WindowSolution::NoWindow,
                    Some(w) => WindowSolution::Exact { states: w.states() },
                },
            },
            RunOutcome::Bracketed {
                low,
                high,
                lots_summed,
            } => {
                let middle = RunSummary {
                    lots: (low.lots + high.lots) / 2.0,
                    by_rejection: (low.by_rejection + high.by_rejection) / 2.0,
                    by_window: (low.by_window + high.by_window) / 2.0,
                };
                SchemeOc {
                    quality,
                    figures: at(&middle),
                    window: WindowSolution::Bracketed {
                        states: self.window.as_ref().map_or(0, WindowAutomaton::states),
                        lots_summed,
                        bounds: Box::new([at(&low), at(&high)]),
                    },
                }
            }
        })
    }
}

/// Expected lots and the chance of discontinuation of one spell of
/// tightened inspection with discontinuation absorbing: forward over the
/// acyclic chain of (lots not accepted, lots accepted in a row).
fn tightened_spell(accept: f64, reject: f64) -> (f64, f64) {
    let rows = NOT_ACCEPTED_TO_STOP as usize;
    let cols = ACCEPTED_TO_NORMAL as usize;
    let mut v = vec![vec![0.0; cols]; rows];
    v[0][0] = 1.0;
    let (mut lots, mut stopped) = (0.0, 0.0);
    for d in 0..rows {
        for j in 0..cols {
            let here = v[d][j];
            lots += here;
            if j + 1 < cols {
                v[d][j + 1] += here * accept;
            }
            if d + 1 < rows {
                v[d + 1][0] += here * reject;
            } else {
                stopped += here * reject;
            }
        }
    }
    (lots, stopped)
}

/// `x` times `y`, where a factor of 0 wins over an infinite one (a spell
/// never entered contributes nothing).
fn times(x: f64, y: f64) -> f64 {
    if x == 0.0 || y == 0.0 { 0.0 } else { x * y }
}

fn figures(
    quality: f64,
    lot_size: Option<u64>,
    run: &RunSummary,
    normal: &LotOutcomes,
    tightened: &LotOutcomes,
    reduced: Option<&LotOutcomes>,
) -> SchemeFigures {
    let a = normal.accept;
    // 1 - a^4 without cancellation: a lot not accepted within four lots.
    let second = normal.reject * (1.0 + a + a * a + a * a * a);
    let (g, u, phi) = (run.lots, run.by_rejection, run.by_window);
    let e = phi + u + second;
    let a_t = tightened.accept;
    let e_t = if a_t > 0.0 {
        (1.0 + a_t + a_t.powi(2) + a_t.powi(3) + a_t.powi(4)) / a_t.powi(5)
    } else {
        f64::INFINITY
    };
    let e_r = reduced.map_or(f64::INFINITY, |r| {
        let back = r.reject + r.between;
        if back > 0.0 {
            1.0 / back
        } else {
            f64::INFINITY
        }
    });
    let (w_n, w_t, w_r) = if g.is_infinite() {
        (1.0, 0.0, 0.0)
    } else {
        (g * e, times(u * second, e_t), times(e * phi, e_r))
    };
    // A severity that is never left takes every lot in the long run.
    let shares = if w_t.is_infinite() {
        [0.0, 1.0, 0.0]
    } else if w_r.is_infinite() {
        [0.0, 0.0, 1.0]
    } else {
        let total = w_n + w_t + w_r;
        [w_n / total, w_t / total, w_r / total]
    };
    let plans: [Option<&LotOutcomes>; 3] = [Some(normal), Some(tightened), reduced];
    let mean = |f: &dyn Fn(&LotOutcomes) -> f64| -> f64 {
        shares
            .iter()
            .zip(plans)
            .filter(|(s, _)| **s > 0.0)
            .map(|(s, o)| o.map_or(0.0, |o| s * f(o)))
            .sum()
    };
    let pa = mean(&|o| o.accept);
    let asn = mean(&|o| o.asn);
    let (aoq, ati) = match lot_size {
        Some(n) => {
            let n = n as f64;
            (
                mean(&|o| quality * (o.accept * n - o.accepted_units).max(0.0) / n),
                Some(mean(&|o| o.accepted_units + o.reject * n)),
            )
        }
        None => (pa * quality, None),
    };
    // (m_N + q_R E_R) / q_T, both scaled by D: the tightened spell's own
    // length does not enter.
    let to_tightened = u * second;
    let lots_until_tightened = if g.is_infinite() || to_tightened == 0.0 {
        None
    } else {
        Some((w_n + w_r) / to_tightened).filter(|x| x.is_finite())
    };
    let (spell, delta) = tightened_spell(tightened.accept, tightened.reject);
    let lots_until_discontinuation = lots_until_tightened
        .filter(|_| delta > 0.0)
        .map(|t| (t + spell) / delta);
    SchemeFigures {
        pa,
        normal_share: shares[0],
        tightened_share: shares[1],
        reduced_share: shares[2],
        asn,
        aoq,
        ati,
        lots_until_tightened,
        lots_until_discontinuation,
        discontinuation_per_spell: delta,
    }
}

impl SchemeFigures {
    /// The share of lots on `severity`.
    pub fn share(&self, severity: Severity) -> f64 {
        match severity {
            Severity::Normal => self.normal_share,
            Severity::Tightened => self.tightened_share,
            Severity::Reduced => self.reduced_share,
        }
    }
}
