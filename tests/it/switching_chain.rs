//! The long-run OC of MIL-STD-105E's switching scheme
//! (issue 16, items 4 and 5; issue 17's rule checks).
//!
//! Sources, named beside each check:
//! - the rules' text: MIL-STD-105E (1989) 4.6-4.8, 4.10.1.4, in our own
//!   words in the module doc of `src/standard/switching/mod.rs`;
//! - a closed form derived below (two alternating spells);
//! - a seeded simulation of the same step function (ChaCha8, rand_chacha);
//! - an independent dense solve of the full chain built by running the step
//!   function over every outcome (nalgebra LU).
//!
//! The plans are of the standard's shape: letter K (n = 125) at AQL 1.0,
//! normal Ac 3 Re 4, tightened Ac 2 Re 3, reduced n = 50 Ac 1 Re 4, limit
//! number 7 (Table VIII at 1,250 units) as transcribed for issue 16 (Table
//! II-C and VIII from memory); letter H (n = 50) at AQL 1.0, normal Ac 1
//! Re 2, tightened J (n = 80) Ac 1 Re 2, reduced n = 20 Ac 0 Re 2, limit
//! number 2 (Table VIII at 500 units), same transcription.

use std::collections::HashMap;

use lotsman::{
    LimitWindow, LotOutcomes, LotResult, Model, ModelKind, SchemeOc, Severity, SwitchingError,
    SwitchingRules, SwitchingScheme, SwitchingState, WindowAutomaton, WindowSolution,
};
use nalgebra::{DMatrix, DVector};
use rand::{RngExt, SeedableRng};
use rand_chacha::ChaCha8Rng;

fn k_rules() -> SwitchingRules {
    SwitchingRules::new(true, Some(LimitWindow::ten(7)))
}

// ---------------------------------------------------------------------
// Per-lot outcomes of single plans (binomial model, the crate's tails).

/// A single plan n, Ac, Re.
#[derive(Clone, Copy)]
struct Single {
    n: u64,
    ac: u64,
    re: u64,
}

const K_NORMAL: Single = Single {
    n: 125,
    ac: 3,
    re: 4,
};
const K_TIGHTENED: Single = Single {
    n: 125,
    ac: 2,
    re: 3,
};
const K_REDUCED: Single = Single {
    n: 50,
    ac: 1,
    re: 4,
};
const H_NORMAL: Single = Single {
    n: 50,
    ac: 1,
    re: 2,
};
const H_TIGHTENED: Single = Single {
    n: 80,
    ac: 1,
    re: 2,
};
const H_REDUCED: Single = Single {
    n: 20,
    ac: 0,
    re: 2,
};

fn model() -> Model {
    Model::new(ModelKind::Binomial, None).unwrap()
}

impl Single {
    /// P(X = x) for x = 0 ..= Re, the last entry P(X >= Re).
    fn law(&self, p: f64) -> Vec<f64> {
        let m = model();
        let mut law: Vec<f64> = (0..self.re).map(|x| m.pmf(self.n, x, p, 0, 0)).collect();
        law.push(m.tails(self.n, self.re - 1, p, 0, 0).sf);
        law
    }

    fn outcomes(&self, severity: Severity, p: f64) -> LotOutcomes {
        let t = model().tails(self.n, self.re - 1, p, 0, 0);
        let n = self.n as f64;
        let o = LotOutcomes::new(severity, t.cdf, t.sf, n, t.cdf * n).unwrap();
        match severity {
            Severity::Normal => {
                let law = self.law(p);
                let counts = law[..=self.ac as usize].to_vec();
                o.with_counts(counts).unwrap()
            }
            Severity::Tightened => o,
            Severity::Reduced => {
                let below = model().tails(self.n, self.ac, p, 0, 0).cdf;
                o.with_between((t.cdf - below).max(0.0)).unwrap()
            }
        }
    }
}

struct Scheme {
    rules: SwitchingRules,
    plans: [Single; 3],
}

fn k_scheme(reduced: bool) -> Scheme {
    Scheme {
        rules: if reduced {
            k_rules()
        } else {
            SwitchingRules::without_reduced()
        },
        plans: [K_NORMAL, K_TIGHTENED, K_REDUCED],
    }
}

fn h_scheme(reduced: bool) -> Scheme {
    Scheme {
        rules: if reduced {
            SwitchingRules::new(true, Some(LimitWindow::ten(2)))
        } else {
            SwitchingRules::without_reduced()
        },
        plans: [H_NORMAL, H_TIGHTENED, H_REDUCED],
    }
}

impl Scheme {
    fn chain(&self) -> SwitchingScheme {
        SwitchingScheme::new(self.rules, self.plans[0].ac).unwrap()
    }

    fn oc(&self, chain: &SwitchingScheme, p: f64, lot: Option<u64>) -> SchemeOc {
        let [n, t, r] = self.plans;
        chain
            .long_run(
                p,
                lot,
                &n.outcomes(Severity::Normal, p),
                &t.outcomes(Severity::Tightened, p),
                Some(&r.outcomes(Severity::Reduced, p)),
            )
            .unwrap()
    }
}

// ---------------------------------------------------------------------
// A closed form: two alternating spells.

/// Without reduced inspection the scheme alternates a spell of normal and
/// a spell of tightened inspection (a two-state alternating renewal), so
/// the share of lots on tightened is `E_T / (m_N + E_T)`. Derived here
/// independently of the library's algebra:
///
/// - `m_N`, the expected normal spell: the first lot not accepted comes
///   after `1 / rho` lots on average. From there the next four lots are
///   watched: a lot not accepted among them (chance `1 - a^4`) ends the
///   spell; otherwise, after four accepted lots, the old rejection no longer
///   counts and the spell starts afresh. The watched lots number
///   `E[min(G, 4)] = 1 + a + a^2 + a^3 = (1 - a^4) / rho` on average. So
///   `m_N = 1/rho + (1 - a^4)/rho + a^4 m_N`, that is
///   `m_N = (2 - a^4) / (rho (1 - a^4))`.
/// - `E_T`, the expected lots until five accepted in a row with chance
///   `b` each: `E_T = (1 - b^5) / ((1 - b) b^5)` (the waiting time for a
///   run of successes, e.g. Feller, *An Introduction to Probability Theory
///   and Its Applications*, vol. 1, ch. XIII, from memory).
#[test]
fn without_reduced_the_shares_match_two_alternating_spells() {
    let scheme = k_scheme(false);
    let chain = scheme.chain();
    for p in [0.002, 0.01, 0.02, 0.05] {
        let oc = scheme.oc(&chain, p, None);
        let a = K_NORMAL.outcomes(Severity::Normal, p).accept();
        let b = K_TIGHTENED.outcomes(Severity::Tightened, p).accept();
        let rho = 1.0 - a;
        let m_n = (2.0 - a.powi(4)) / (rho * (1.0 - a.powi(4)));
        let e_t = (1.0 - b.powi(5)) / ((1.0 - b) * b.powi(5));
        let tightened = e_t / (m_n + e_t);
        let f = oc.figures;
        assert!(
            (f.tightened_share - tightened).abs() <= 1e-9 * tightened,
            "p = {p}: {} against {tightened}",
            f.tightened_share
        );
        assert_eq!(f.reduced_share, 0.0);
        let pa = (1.0 - tightened) * a + tightened * b;
        assert!((f.pa - pa).abs() <= 1e-12, "p = {p}: {} against {pa}", f.pa);
        assert_eq!(oc.window, WindowSolution::NoWindow);
        // Until tightened: the normal spell itself.
        let until = f.lots_until_tightened.unwrap();
        assert!((until - m_n).abs() <= 1e-9 * m_n, "{until} against {m_n}");
    }
}

// ---------------------------------------------------------------------
// The full chain, built by running the step function over every outcome,
// solved densely (nalgebra LU): an independent check of the renewal
// algebra.

/// Every lot result a severity's plan can give, with its chance.
fn branches(scheme: &Scheme, state: &SwitchingState, p: f64) -> Vec<(LotResult, f64)> {
    let [n, t, r] = scheme.plans;
    match state.severity() {
        Some(Severity::Normal) => {
            let law = n.law(p);
            let mut out: Vec<_> = (0..=n.ac)
                .map(|x| (LotResult::accepted(x, n.n).unwrap(), law[x as usize]))
                .collect();
            out.push((LotResult::rejected(n.re, n.n).unwrap(), law[n.re as usize]));
            out
        }
        Some(Severity::Tightened) => {
            let o = t.outcomes(Severity::Tightened, p);
            vec![
                (LotResult::accepted(0, t.n).unwrap(), o.accept()),
                (LotResult::rejected(t.re, t.n).unwrap(), o.reject()),
            ]
        }
        Some(Severity::Reduced) => {
            let law = r.law(p);
            let within: f64 = law[..=r.ac as usize].iter().sum();
            let between: f64 = law[r.ac as usize + 1..r.re as usize].iter().sum();
            vec![
                (LotResult::accepted(0, r.n).unwrap(), within),
                (LotResult::accepted_between(r.ac + 1, r.n).unwrap(), between),
                (LotResult::rejected(r.re, r.n).unwrap(), law[r.re as usize]),
            ]
        }
        None => Vec::new(),
    }
}

/// The chain from the start of normal inspection: states numbered in the
/// order found, transitions as (from, to, chance). `stop` states are kept
/// but not expanded; discontinuation resumes on tightened when `resume`.
fn full_chain(
    scheme: &Scheme,
    p: f64,
    stop: &dyn Fn(&SwitchingState) -> bool,
    resume: bool,
) -> (Vec<SwitchingState>, Vec<(usize, usize, f64)>) {
    let mut index: HashMap<SwitchingState, usize> = HashMap::new();
    let mut states = vec![SwitchingState::new()];
    index.insert(SwitchingState::new(), 0);
    let mut edges = Vec::new();
    let mut k = 0;
    while k < states.len() {
        let state = states[k].clone();
        if !stop(&state) {
            for (lot, chance) in branches(scheme, &state, p) {
                let mut next = scheme.rules.step(&state, &lot).unwrap();
                if resume && next.is_discontinued() {
                    next = next.resume().unwrap();
                }
                let to = *index.entry(next.clone()).or_insert_with(|| {
                    states.push(next);
                    states.len() - 1
                });
                edges.push((k, to, chance));
            }
        }
        k += 1;
    }
    (states, edges)
}

/// The stationary distribution by LU on `(P' - I)` with one equation
/// replaced by `sum = 1`.
fn stationary(n: usize, edges: &[(usize, usize, f64)]) -> DVector<f64> {
    let mut a = DMatrix::<f64>::zeros(n, n);
    for &(from, to, chance) in edges {
        a[(to, from)] += chance;
    }
    for i in 0..n {
        a[(i, i)] -= 1.0;
    }
    let mut b = DVector::<f64>::zeros(n);
    for j in 0..n {
        a[(n - 1, j)] = 1.0;
    }
    b[n - 1] = 1.0;
    a.lu().solve(&b).unwrap()
}

/// Expected steps from state 0 until a state outside `transient`.
fn steps_until(n: usize, edges: &[(usize, usize, f64)], transient: &[bool]) -> f64 {
    let mut a = DMatrix::<f64>::identity(n, n);
    for &(from, to, chance) in edges {
        if transient[from] && transient[to] {
            a[(from, to)] -= chance;
        }
    }
    let mut b = DVector::<f64>::zeros(n);
    for i in 0..n {
        if transient[i] {
            b[i] = 1.0;
        } else {
            a.row_mut(i).fill(0.0);
            a[(i, i)] = 1.0;
        }
    }
    a.lu().solve(&b).unwrap()[0]
}

/// Independent check: with acceptance number 0 on normal inspection the
/// window's states are the run's length alone, so the full chain of the
/// step function stays small enough for a dense solve. Plan: n = 32 Ac 0
/// normal, n = 50 Ac 0 tightened, n = 13 Ac 0 Re 2 reduced, limit number 0
/// over 16 lots (Table VIII's note), at several qualities, with and
/// without reduced.
#[test]
fn the_renewal_algebra_matches_a_dense_solve_of_the_full_chain() {
    for reduced in [true, false] {
        let scheme = Scheme {
            rules: if reduced {
                SwitchingRules::new(true, Some(LimitWindow::new(16, 0).unwrap()))
            } else {
                SwitchingRules::without_reduced()
            },
            plans: [
                Single {
                    n: 32,
                    ac: 0,
                    re: 1,
                },
                Single {
                    n: 50,
                    ac: 0,
                    re: 1,
                },
                Single {
                    n: 13,
                    ac: 0,
                    re: 2,
                },
            ],
        };
        let chain = scheme.chain();
        for p in [0.001, 0.005, 0.02, 0.06] {
            let oc = scheme.oc(&chain, p, Some(1000)).figures;
            let (states, edges) = full_chain(&scheme, p, &|_| false, true);
            let pi = stationary(states.len(), &edges);
            let share = |s: Severity| -> f64 {
                states
                    .iter()
                    .zip(pi.iter())
                    .filter(|(st, _)| st.severity() == Some(s))
                    .map(|(_, x)| x)
                    .sum()
            };
            for s in [Severity::Normal, Severity::Tightened, Severity::Reduced] {
                let dense = share(s);
                assert!(
                    (oc.share(s) - dense).abs() <= 1e-9,
                    "reduced {reduced}, p = {p}, {s:?}: {} against {dense}",
                    oc.share(s)
                );
            }
            // Until tightened: tightened states absorb.
            let (states, edges) = full_chain(
                &scheme,
                p,
                &|s| s.severity() == Some(Severity::Tightened),
                false,
            );
            let transient: Vec<bool> = states
                .iter()
                .map(|s| s.severity() != Some(Severity::Tightened))
                .collect();
            let dense = steps_until(states.len(), &edges, &transient);
            let until = oc.lots_until_tightened.unwrap();
            assert!(
                (until - dense).abs() <= 1e-9 * dense,
                "reduced {reduced}, p = {p}: until tightened {until} against {dense}"
            );
            // Until discontinuation: discontinuation absorbs.
            let (states, edges) = full_chain(&scheme, p, &|s| s.is_discontinued(), false);
            let transient: Vec<bool> = states.iter().map(|s| !s.is_discontinued()).collect();
            let dense = steps_until(states.len(), &edges, &transient);
            let until = oc.lots_until_discontinuation.unwrap();
            assert!(
                (until - dense).abs() <= 1e-8 * dense,
                "reduced {reduced}, p = {p}: until discontinuation {until} against {dense}"
            );
        }
    }
}

// ---------------------------------------------------------------------
// The seeded simulation of the same step function against the chain.

/// Draw one lot's result from a plan's law with a uniform number.
fn draw(plan: Single, law: &[f64], severity: Severity, u: f64) -> LotResult {
    let mut x = 0;
    let mut acc_chance = law[0];
    while x + 1 < law.len() && u > acc_chance {
        x += 1;
        acc_chance += law[x];
    }
    let x = x as u64;
    if x >= plan.re {
        LotResult::rejected(x, plan.n).unwrap()
    } else if severity == Severity::Reduced && x > plan.ac {
        LotResult::accepted_between(x, plan.n).unwrap()
    } else {
        LotResult::accepted(x, plan.n).unwrap()
    }
}

/// Simulated long-run share of accepted lots and of lots per severity,
/// with standard errors by batch means (lots in a row are correlated, so
/// the lots are cut into `BATCHES` batches whose means are close to
/// independent; the standard error is the batches' standard deviation over
/// the square root of their number). Discontinuation is left out as in the
/// chain: it resumes on tightened at once.
fn simulate(scheme: &Scheme, p: f64, lots: usize, seed: u64) -> [(f64, f64); 4] {
    const BATCHES: usize = 50;
    let laws = scheme.plans.map(|plan| plan.law(p));
    let mut rng = ChaCha8Rng::seed_from_u64(seed);
    let mut state = SwitchingState::new();
    let per = lots / BATCHES;
    let mut means = vec![[0.0; 4]; BATCHES];
    for batch in means.iter_mut() {
        let mut tally = [0usize; 4];
        for _ in 0..per {
            let severity = state.severity().unwrap();
            let k = match severity {
                Severity::Normal => 0,
                Severity::Tightened => 1,
                Severity::Reduced => 2,
            };
            let lot = draw(scheme.plans[k], &laws[k], severity, rng.random::<f64>());
            tally[k] += 1;
            tally[3] += usize::from(lot.is_accepted());
            state = scheme.rules.step(&state, &lot).unwrap();
            if state.is_discontinued() {
                state = state.resume().unwrap();
            }
        }
        *batch = tally.map(|t| t as f64 / per as f64);
    }
    let mut out = [(0.0, 0.0); 4];
    for (j, o) in out.iter_mut().enumerate() {
        let m = means.iter().map(|b| b[j]).sum::<f64>() / BATCHES as f64;
        let var = means.iter().map(|b| (b[j] - m).powi(2)).sum::<f64>() / (BATCHES - 1) as f64;
        *o = (m, (var / BATCHES as f64).sqrt());
    }
    out
}

/// Simulation against the chain: the scheme's Pa and the share of lots on
/// each severity agree within four standard errors of the simulated means
/// (batch means, see `simulate`; never below the standard error of
/// `LOTS` independent lots, for shares too rare to show in a batch), at
/// qualities around the AQL, with and without reduced inspection. Letter H at AQL 1.0 (window solved exactly)
/// and letter K at AQL 1.0 (window bracketed to 1e-13).
#[test]
fn the_chain_agrees_with_a_seeded_simulation_of_the_rules() {
    const LOTS: usize = 400_000;
    let cases: [(Scheme, &[f64]); 4] = [
        (h_scheme(true), &[0.003, 0.01, 0.03]),
        (h_scheme(false), &[0.01, 0.03]),
        (k_scheme(true), &[0.006, 0.01]),
        (k_scheme(false), &[0.02]),
    ];
    for (i, (scheme, qualities)) in cases.iter().enumerate() {
        let chain = scheme.chain();
        for (j, &p) in qualities.iter().enumerate() {
            let f = scheme.oc(&chain, p, None).figures;
            let sim = simulate(scheme, p, LOTS, 1600 + 10 * i as u64 + j as u64);
            let chain_values = [f.normal_share, f.tightened_share, f.reduced_share, f.pa];
            for (k, (&(mean, se), &exact)) in sim.iter().zip(&chain_values).enumerate() {
                // An event too rare to be seen in any batch has no batch
                // spread: its error is at least that of independent lots.
                let floor = (exact * (1.0 - exact) / LOTS as f64).sqrt();
                assert!(
                    (mean - exact).abs() <= 4.0 * se.max(floor) + 1e-12,
                    "case {i}, p = {p}, figure {k}: simulated {mean} +- {se}, chain {exact}"
                );
            }
        }
    }
}

// ---------------------------------------------------------------------
// Edge qualities.

/// p = 0: every lot is accepted with count 0, so reduced starts after ten
/// lots and never ends (share 1); without reduced every lot is on normal.
/// p = 1: every lot is rejected: tightened after two lots, never left.
#[test]
fn the_edge_qualities_settle_on_one_severity() {
    for (scheme, p, expect) in [
        (k_scheme(true), 0.0, Severity::Reduced),
        (k_scheme(false), 0.0, Severity::Normal),
        (k_scheme(true), 1.0, Severity::Tightened),
        (k_scheme(false), 1.0, Severity::Tightened),
        (h_scheme(true), 0.0, Severity::Reduced),
        (h_scheme(true), 1.0, Severity::Tightened),
    ] {
        let oc = scheme.oc(&scheme.chain(), p, Some(1500));
        assert_eq!(oc.figures.share(expect), 1.0, "p = {p}: {oc:?}");
        assert_eq!(oc.figures.pa, if p == 0.0 { 1.0 } else { 0.0 });
        assert_eq!(oc.figures.aoq, 0.0);
    }
    let at_one = k_scheme(true).oc(&k_scheme(true).chain(), 1.0, Some(1500));
    assert_eq!(at_one.figures.lots_until_tightened, Some(2.0));
    assert_eq!(at_one.figures.ati, Some(1500.0));
    // Five lots not accepted on tightened: discontinued after 2 + 5 lots.
    assert_eq!(at_one.figures.lots_until_discontinuation, Some(7.0));
    let at_zero = k_scheme(true).oc(&k_scheme(true).chain(), 0.0, Some(1500));
    assert_eq!(at_zero.figures.lots_until_tightened, None);
    assert_eq!(at_zero.figures.asn, 50.0);
}

// ---------------------------------------------------------------------
// The window automaton.

/// The smallest exact window states, measured for the (acceptance number,
/// limit number) pairs of Table II-A with Table VIII at ten lots: the
/// figures reported in the module doc of `window.rs`.
#[test]
fn window_state_counts() {
    for (c, limit, states) in [
        (0, 0, 10),
        (1, 1, 55),
        (1, 2, 166),
        (2, 3, 661),
        (2, 4, 1_618),
        (3, 7, 18_449),
        (2, 20, 10),
    ] {
        let w = WindowAutomaton::new(LimitWindow::ten(limit), c).unwrap();
        assert_eq!(w.states(), states, "c = {c}, L = {limit}");
    }
    // c = 5, L = 14 (e.g. Table II-A letter L at AQL 1.0) is refused.
    let e = WindowAutomaton::new(LimitWindow::ten(14), 5).unwrap_err();
    assert!(matches!(e, SwitchingError::WindowTooLarge { .. }), "{e}");
    assert!(
        e.to_string().contains("leaving reduced inspection out"),
        "{e}"
    );
}
