//! The run of normal inspection between two renewals: from the start of
//! normal inspection, or from a lot not accepted, to the next lot not
//! accepted or the start of reduced inspection.
//!
//! With `Q` the transitions among the window's states on an accepted lot
//! (the substochastic matrix: a lot not accepted, probability `rho`, leaves
//! the run, and so does the lot that completes the limit-number rule), the
//! fundamental matrix `N = (I - Q)^-1` of Kemeny and Snell (*Finite Markov
//! Chains*, 1960, ch. III, absorbing chains) gives from the run's first
//! state `s0`:
//!
//! ```text
//! lots in the run          G   = e_s0' N 1
//! ended by reduced         phi = e_s0' N f      (f: one-lot chance to complete the rule)
//! ended by a lot rejected  u   = rho G          (= 1 - phi)
//! ```
//!
//! Up to [`EXACT_STATES`] states the system is solved by LU decomposition
//! (nalgebra): exact but for rounding. Larger windows sum `G = sum_k P(run
//! lasts beyond k lots)` lot by lot and stop once the rest is proven below
//! a relative `1e-13` of the sum: from any state the run outlasts the next
//! `m` lots only if all are accepted and their own window fails, so the
//! expected remainder of a run still going is at most
//! `t_max = min(1 / rho, m / (1 - beta))` with `beta` that chance. The
//! result is then a bracket, never presented as exact.

use nalgebra::{DMatrix, DVector};

use super::error::SwitchingError;
use super::window::{FIRE, WindowAutomaton};

/// The most window states solved by LU decomposition.
pub const EXACT_STATES: usize = 256;

/// The relative width at which the lot-by-lot sum stops.
const RELATIVE_TAIL: f64 = 1e-13;

/// The most lots the lot-by-lot sum may take.
const MAX_LOTS: u64 = 2_000_000;

/// The expected outcome of one run.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct RunSummary {
    /// Expected lots in the run, `G` (infinite when it never ends).
    pub lots: f64,
    /// Probability that it ends with a lot not accepted.
    pub by_rejection: f64,
    /// Probability that it ends with reduced inspection starting.
    pub by_window: f64,
}

/// A run's outcome: exact, or bracketed.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) enum RunOutcome {
    Exact(RunSummary),
    Bracketed {
        low: RunSummary,
        high: RunSummary,
        lots_summed: u64,
    },
}

/// The run when reduced inspection cannot be reached: it ends with the
/// first lot not accepted.
pub(crate) fn run_without_window(rho: f64) -> RunSummary {
    if rho > 0.0 {
        RunSummary {
            lots: 1.0 / rho,
            by_rejection: 1.0,
            by_window: 0.0,
        }
    } else {
        RunSummary {
            lots: f64::INFINITY,
            by_rejection: 0.0,
            by_window: 0.0,
        }
    }
}

/// The run with the limit-number window `w`, for lots accepted with count
/// `x` with probability `accepted[x]` and not accepted with probability
/// `rho`; `quality` names the quality in a refusal.
pub(crate) fn run_with_window(
    w: &WindowAutomaton,
    accepted: &[f64],
    rho: f64,
    quality: f64,
) -> Result<RunOutcome, SwitchingError> {
    if w.states() <= EXACT_STATES {
        Ok(RunOutcome::Exact(solve(w, accepted, rho)))
    } else {
        sum_by_lots(w, accepted, rho, quality)
    }
}

/// `G` and `phi` by LU decomposition of `I - Q`.
fn solve(w: &WindowAutomaton, accepted: &[f64], rho: f64) -> RunSummary {
    let n = w.states();
    let arity = w.arity();
    let next = w.transitions();
    let mut a = DMatrix::<f64>::identity(n, n);
    let mut fire = DVector::<f64>::zeros(n);
    for s in 0..n {
        for (x, &p) in accepted.iter().enumerate() {
            match next[s * arity + x] {
                FIRE => fire[s] += p,
                t => a[(s, t as usize)] -= p,
            }
        }
    }
    let lu = a.lu();
    let ones = DVector::<f64>::from_element(n, 1.0);
    let start = w.start();
    match (lu.solve(&ones), lu.solve(&fire)) {
        (Some(t), Some(f)) if t[start].is_finite() => RunSummary {
            lots: t[start],
            by_rejection: rho * t[start],
            by_window: f[start],
        },
        // A singular system: some accepted runs never end (no lot is ever
        // rejected and the window can fail forever).
        _ => RunSummary {
            lots: f64::INFINITY,
            by_rejection: 0.0,
            by_window: 0.0,
        },
    }
}

/// The chance that `m` accepted lots in a row hold at most `limit` in all.
fn window_passes(accepted: &[f64], m: u32, limit: u32) -> f64 {
    let width = limit as usize + 1;
    let mut h = vec![0.0; width];
    h[0] = 1.0;
    for _ in 0..m {
        let mut g = vec![0.0; width];
        for (s, &hs) in h.iter().enumerate() {
            if hs == 0.0 {
                continue;
            }
            for (x, &p) in accepted.iter().enumerate() {
                if s + x < width {
                    g[s + x] += hs * p;
                }
            }
        }
        h = g;
    }
    h.iter().sum()
}

/// `G` and `phi` summed lot by lot, with a proven bound on the rest.
fn sum_by_lots(
    w: &WindowAutomaton,
    accepted: &[f64],
    rho: f64,
    quality: f64,
) -> Result<RunOutcome, SwitchingError> {
    let window = w.window();
    let m = window.lots();
    let all_accepted = (1.0 - rho).powi(m as i32);
    let passes = window_passes(accepted, m, window.limit());
    if rho <= 0.0 && passes <= 0.0 {
        return Ok(RunOutcome::Exact(run_without_window(0.0)));
    }
    // beta: the chance that m accepted lots in a row fail their own window.
    let beta = (all_accepted - passes).max(0.0);
    let by_window_bound = if beta < 1.0 {
        f64::from(m) / (1.0 - beta)
    } else {
        f64::INFINITY
    };
    let t_max = if rho > 0.0 {
        (1.0 / rho).min(by_window_bound)
    } else {
        by_window_bound
    };
    let n = w.states();
    let arity = w.arity();
    let next = w.transitions();
    let mut v = vec![0.0; n];
    let mut v_next = vec![0.0; n];
    v[w.start()] = 1.0;
    let (mut lots, mut by_window, mut by_rejection) = (0.0, 0.0, 0.0);
    let mut k = 0u64;
    loop {
        let mass: f64 = v.iter().sum();
        if mass == 0.0 || (k > 0 && mass * t_max <= RELATIVE_TAIL * lots) {
            let low = RunSummary {
                lots: lots + mass,
                by_rejection: by_rejection + rho * mass,
                by_window: by_window + mass * (1.0 - rho),
            };
            let high = RunSummary {
                lots: lots + mass * t_max,
                by_rejection: by_rejection + rho * mass * t_max,
                by_window: by_window + (mass * (1.0 - rho * t_max)).max(0.0),
            };
            return Ok(if mass == 0.0 {
                RunOutcome::Exact(low)
            } else {
                RunOutcome::Bracketed {
                    low,
                    high,
                    lots_summed: k,
                }
            });
        }
        if k >= MAX_LOTS {
            return Err(SwitchingError::NotSettled { quality, steps: k });
        }
        lots += mass;
        by_rejection += rho * mass;
        v_next.iter_mut().for_each(|x| *x = 0.0);
        for (s, &vs) in v.iter().enumerate() {
            if vs == 0.0 {
                continue;
            }
            let row = &next[s * arity..(s + 1) * arity];
            for (&t, &p) in row.iter().zip(accepted) {
                if t == FIRE {
                    by_window += vs * p;
                } else {
                    v_next[t as usize] += vs * p;
                }
            }
        }
        std::mem::swap(&mut v, &mut v_next);
        k += 1;
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::standard::switching::rules::LimitWindow;

    /// Binomial chances of counts 0..=c on an accepted lot of n units, and
    /// of a lot not accepted.
    fn lots(n: u64, c: u64, p: f64) -> (Vec<f64>, f64) {
        let m = crate::model::Model::new(crate::model::ModelKind::Binomial, None).unwrap();
        let counts: Vec<f64> = (0..=c).map(|x| m.pmf(n, x, p, 0, 0)).collect();
        (counts, m.tails(n, c, p, 0, 0).sf)
    }

    /// The lot-by-lot sum brackets the LU solution of the same automaton.
    #[test]
    fn the_bracket_holds_the_exact_run() {
        for (c, limit, n) in [(1, 2, 50), (2, 3, 80)] {
            let w = WindowAutomaton::new(LimitWindow::ten(limit), c).unwrap();
            for p in [0.001, 0.004, 0.01, 0.03] {
                let (counts, rho) = lots(n, c, p);
                let exact = solve(&w, &counts, rho);
                let RunOutcome::Bracketed { low, high, .. } =
                    sum_by_lots(&w, &counts, rho, p).unwrap()
                else {
                    panic!("p = {p}: settled to zero mass");
                };
                let slack = 1e-12 * exact.lots;
                assert!(
                    low.lots - slack <= exact.lots && exact.lots <= high.lots + slack,
                    "c = {c}, p = {p}: {} not in [{}, {}]",
                    exact.lots,
                    low.lots,
                    high.lots
                );
                assert!((high.lots - low.lots) <= 2e-13 * exact.lots);
                let fire = exact.by_window;
                assert!(low.by_window.min(high.by_window) - 1e-12 <= fire);
                assert!(fire <= low.by_window.max(high.by_window) + 1e-12);
            }
        }
    }

    /// The clamped and merged automaton gives the run of the raw chain that
    /// remembers the last nine counts as they are (c = 1: 2^9 windows),
    /// summed lot by lot far past any visible remainder.
    #[test]
    fn the_merged_automaton_runs_as_the_raw_window() {
        let (c, limit, n) = (1u64, 2u64, 50);
        let w = WindowAutomaton::new(LimitWindow::ten(limit as u32), c).unwrap();
        for p in [0.002, 0.01, 0.02] {
            let (counts, rho) = lots(n, c, p);
            let exact = solve(&w, &counts, rho);
            // Raw states: (run length up to 9, the last counts as bits).
            let mut v: HashMap<(u32, u32), f64> = HashMap::new();
            v.insert((0, 0), 1.0);
            let (mut g, mut fire) = (0.0, 0.0);
            for _ in 0..5000 {
                g += v.values().sum::<f64>();
                let mut next: HashMap<(u32, u32), f64> = HashMap::new();
                for (&(len, bits), &mass) in &v {
                    for (x, &px) in counts.iter().enumerate() {
                        let total = bits.count_ones() as u64 + x as u64;
                        if len == 9 && total <= limit {
                            fire += mass * px;
                            continue;
                        }
                        let bits = ((bits << 1) | x as u32) & 0x1ff;
                        *next.entry(((len + 1).min(9), bits)).or_insert(0.0) += mass * px;
                    }
                }
                v = next;
            }
            assert!(
                (g - exact.lots).abs() <= 1e-10 * g,
                "p = {p}: {g} against {}",
                exact.lots
            );
            assert!((fire - exact.by_window).abs() <= 1e-10, "p = {p}");
        }
    }

    use std::collections::HashMap;
}
