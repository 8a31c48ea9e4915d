//! The single designer's search over acceptance numbers (a finite-lot
//! guess, then a gallop and interpolation on the "certainly infeasible"
//! test) against two searches that assume nothing of it, on a grid of
//! points under the three models, small and large lots included:
//!
//! - a walk over every acceptance number from 0 (exact threshold searches
//!   on `n` for each, `single_alternatives`): `n_min(c)` never falls as `c`
//!   rises (a lot accepted with `c` is accepted with `c + 1`), so the first
//!   feasible `c` has the smallest sample;
//! - for lots of at most 120 units, every `(n, c)` with `c < n <= N`.
//!
//! Both then apply the tie rule as written in src/design/single.rs
//! (smallest `max(alpha achieved / alpha, beta achieved / beta)`, then the
//! smallest `c`), over every `c` that meets both points at that `n`.

use lotsman::{DesignError, Model, ModelKind, design_single, single_alternatives};

use crate::common::pair;

/// The plan `(n, c)` that the tie rule picks among `cs` at `n`.
fn tie_rule(model: &Model, n: u64, cs: &[u64], p: [f64; 4]) -> (u64, u64) {
    let [p1, alpha, p2, beta] = p;
    let score = |c: u64| {
        let producer = model.tails(n, c, p1, 0, 0).sf;
        let consumer = model.tails(n, c, p2, 0, 0).cdf;
        (producer / alpha).max(consumer / beta)
    };
    let best = cs
        .iter()
        .copied()
        .min_by(|&a, &b| score(a).total_cmp(&score(b)).then(a.cmp(&b)))
        .unwrap();
    (n, best)
}

/// The acceptance numbers from `c` up that meet both points at `n`.
fn fitting_from(model: &Model, n: u64, c: u64, p: [f64; 4]) -> Vec<u64> {
    let [p1, alpha, p2, beta] = p;
    (c..n.min(c + 1000))
        .take_while(|&c| model.tails(n, c, p2, 0, 0).cdf <= beta)
        .filter(|&c| model.tails(n, c, p1, 0, 0).sf <= alpha)
        .collect()
}

/// The walk over every acceptance number from 0: the first feasible one,
/// with its smallest sample, then the tie rule at that sample.
fn walk_every_c(model: &Model, p: [f64; 4]) -> Option<(u64, u64)> {
    let risks = pair(model, p[0], p[1], p[2], p[3]);
    let first = (0..=100_000u64)
        .map(|c| single_alternatives(model, &risks, c..=c)[0])
        .find(|a| a.feasible() || a.n_min.is_none())?;
    let n = first.n_min?;
    let cs = if model.kind() == ModelKind::Poisson {
        // A unit can hold several nonconformities: c is not held below n.
        let [p1, alpha, p2, beta] = p;
        (first.c..first.c + 1000)
            .take_while(|&c| model.tails(n, c, p2, 0, 0).cdf <= beta)
            .filter(|&c| model.tails(n, c, p1, 0, 0).sf <= alpha)
            .collect()
    } else {
        fitting_from(model, n, first.c, p)
    };
    Some(tie_rule(model, n, &cs, p))
}

/// Every `(n, c)` of a small lot: the smallest `n` at which some `c` meets
/// both points, then the tie rule.
fn every_plan_of_the_lot(model: &Model, lot: u64, p: [f64; 4]) -> Option<(u64, u64)> {
    (1..=lot).find_map(|n| {
        let cs = fitting_from(model, n, 0, p);
        (!cs.is_empty()).then(|| tie_rule(model, n, &cs, p))
    })
}

/// The grid's points `[p1, alpha, p2, beta]`.
fn grid() -> Vec<[f64; 4]> {
    let mut points = Vec::new();
    for p1 in [0.005, 0.01, 0.02, 0.05] {
        for ratio in [1.1, 1.25, 1.5, 2.0, 3.0, 6.0] {
            for (alpha, beta) in [(0.05, 0.10), (0.01, 0.05), (0.10, 0.20)] {
                points.push([p1, alpha, p1 * ratio, beta]);
            }
        }
    }
    points
}

/// Compares the designer with `reference` on every point of the grid
/// under `model`; returns how many plans were compared.
fn compare(model: &Model, reference: impl Fn([f64; 4]) -> Option<(u64, u64)>) -> usize {
    let mut compared = 0;
    for p in grid() {
        let risks = pair(model, p[0], p[1], p[2], p[3]);
        match design_single(model, &risks) {
            Ok(d) => {
                assert_eq!(
                    Some((d.n, d.c)),
                    reference(p),
                    "{} at {p:?}",
                    model.described()
                );
                compared += 1;
            }
            // The work budget's refusal and the caps say nothing of the
            // search; a lot that cannot tell the points apart has no plan.
            Err(DesignError::OverBudget { .. } | DesignError::BeyondCap { .. }) => {}
            Err(DesignError::NoPlan { .. }) => {
                assert_eq!(
                    model.nonconforming_in_lot(p[0]),
                    model.nonconforming_in_lot(p[2])
                );
            }
            Err(e) => panic!("{} at {p:?}: {e}", model.described()),
        }
    }
    compared
}

#[test]
fn small_lots_match_every_plan_of_the_lot() {
    let mut compared = 0;
    for lot in [20u64, 50, 80, 120] {
        let model = Model::new(ModelKind::Hypergeometric, Some(lot)).unwrap();
        compared += compare(&model, |p| every_plan_of_the_lot(&model, lot, p));
    }
    assert!(compared >= 100, "only {compared} plans compared");
}

#[test]
fn large_lots_match_the_walk_over_every_acceptance_number() {
    let mut compared = 0;
    for lot in [1_000u64, 20_000, 1_000_000] {
        let model = Model::new(ModelKind::Hypergeometric, Some(lot)).unwrap();
        compared += compare(&model, |p| walk_every_c(&model, p));
    }
    assert!(compared >= 150, "only {compared} plans compared");
}

#[test]
fn binomial_and_poisson_match_the_walk_over_every_acceptance_number() {
    for kind in [ModelKind::Binomial, ModelKind::Poisson] {
        let model = Model::new(kind, None).unwrap();
        let compared = compare(&model, |p| walk_every_c(&model, p));
        assert!(compared >= 60, "{kind}: only {compared} plans compared");
    }
}
