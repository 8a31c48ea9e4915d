//! The search that every double-sampling designer shares: for each set of
//! numbers `(c1, r1, c2)`, a sweep over the first sample `n1` that keeps,
//! for each `n1`, only the smallest second sample `n2` meeting the
//! designer's requirement; and the outer loop over the final acceptance
//! number `c2`.
//!
//! # What a designer supplies
//!
//! A [`DoubleProblem`]: the requirement every plan must meet (the
//! consumer's point, an AOQL), the range of `n1` that single-plan bounds
//! leave, and the criterion to minimise. The sweep relies on two
//! properties, which each designer states and proves for its requirement
//! and criterion:
//!
//! * the requirement, once met at some `n2`, stays met for every larger
//!   `n2`, and the smallest such `n2` does not grow with `n1`;
//! * the criterion grows with `n2` at fixed `n1` and is at least `n1`.
//!
//! For the probability of acceptance both follow from one argument: a lot
//! accepted with `n1 + 1` or `n2 + 1` units is accepted with `n1`, `n2` on
//! the same units (inspect the units in one random order and compare the
//! plans on its prefixes).
//!
//! # The sweep
//!
//! The sweep runs down from the largest `n1` that could win (every
//! criterion is at least `n1`, so `n1` stays below the best value found).
//! Going down, the smallest `n2` of each `n1` is at least the one found for
//! a larger `n1`, so its search starts there and gallops up (one more unit,
//! then two, four, ...; then bisection): over the whole sweep that costs
//! little more than one test per `n1`. The same lower bound lets the
//! problem pass over an `n1` whose plans all score too much
//! ([`DoubleProblem::beyond`]) without testing any `n2`. The numbers
//! `(c1, r1)` of each `c2` are swept in parallel; `c2` runs up from 1 and
//! stops [`C2_PATIENCE`] values after the last one that improved the best
//! plan, and not before a starting value the designer gives. That stopping
//! rule is the search's one limit, and each designer's reference search
//! checks it over a wider box.

use std::ops::RangeInclusive;

use rayon::prelude::*;

pub(super) use super::double_first::{FirstStage, Numbers};
use crate::model::{Model, ModelKind};

/// How many final acceptance numbers past the last improving one the
/// search tries.
pub(super) const C2_PATIENCE: u64 = 3;

/// Criterion values this close (relative) are ties.
pub(super) const TIE: f64 = 1e-12;

/// One candidate plan and what it scored.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(super) struct Candidate {
    pub(super) n1: u64,
    pub(super) n2: u64,
    pub(super) numbers: Numbers,
    /// The criterion.
    pub(super) value: f64,
    /// The second tie-break: how much of its allowance the plan uses (0 when
    /// the designer breaks ties on the sizes and numbers alone).
    pub(super) margin: f64,
}

impl Candidate {
    /// Whether `self` beats `other`: the smaller criterion; within [`TIE`]
    /// the smaller largest sample `n1 + n2`, then the smaller margin, then
    /// the smaller `(c2, c1, r1, n1)`, a first stage that cannot accept
    /// (no `c1`) before every `c1`.
    pub(super) fn beats(&self, other: &Candidate) -> bool {
        let scale = self.value.abs().max(other.value.abs());
        if (self.value - other.value).abs() > TIE * scale {
            return self.value < other.value;
        }
        let numbers = |c: &Candidate| (c.numbers.c2, c.numbers.c1, c.numbers.r1, c.n1);
        (self.n1 + self.n2)
            .cmp(&(other.n1 + other.n2))
            .then(self.margin.total_cmp(&other.margin))
            .then(numbers(self).cmp(&numbers(other)))
            .is_lt()
    }
}

/// A double-plan design problem (see the module documentation for what
/// the sweep assumes of it).
pub(super) trait DoubleProblem: Sync {
    /// What the requirement's test reuses for every `n2` at one `n1` (the
    /// first stage at the requirement's quality).
    type First;
    /// What the requirement's test may carry from one test to the next
    /// within one sweep (a hint where the last test was decided).
    type Memo: Default;

    /// The model.
    fn model(&self) -> &Model;

    /// The largest sample `n1 + n2`.
    fn limit(&self) -> u64;

    /// The first samples worth trying for the numbers `k`, from
    /// single-plan bounds; `None` when there are none.
    fn first_sample_range(&self, k: Numbers) -> Option<(u64, u64)>;

    /// The per-`n1` data of the requirement's test.
    fn first(&self, n1: u64, k: Numbers) -> Self::First;

    /// Whether the plan `(n1, k, n2)` meets the requirement.
    fn holds(
        &self,
        first: &Self::First,
        memo: &mut Self::Memo,
        k: Numbers,
        n1: u64,
        n2: u64,
    ) -> bool;

    /// A fixed second sample for `n1`, when the designer fixes `n2 / n1`.
    fn fixed_second(&self, _n1: u64) -> Option<u64> {
        None
    }

    /// The first acceptance numbers searched with `c2`: every `c1` from 0
    /// to `c2 - 1`.
    fn first_acceptances(&self, c2: u64) -> Vec<Option<u64>> {
        (0..c2).map(Some).collect()
    }

    /// The first rejection numbers `r1` searched with `c1` and `c2`: every
    /// one from `c1 + 2` (one count open after the first sample; 1 for a
    /// first stage that cannot accept) to `c2 + 1`.
    fn first_rejections(&self, c1: Option<u64>, c2: u64) -> RangeInclusive<u64> {
        c1.map_or(1, |c| c + 2)..=c2 + 1
    }

    /// Whether every plan `(n1, k, n2)` with `n2 >= lo2` certainly scores
    /// above `bound`; such an `n1` is passed over without searching its
    /// `n2`.
    fn beyond(&self, _k: Numbers, _n1: u64, _lo2: u64, _bound: f64) -> bool {
        false
    }

    /// The plan `(n1, k, n2)`, which meets the requirement, scored; `None`
    /// when it fails another requirement or its criterion exceeds `bound`.
    fn score(
        &self,
        first: &Self::First,
        k: Numbers,
        n1: u64,
        n2: u64,
        bound: f64,
    ) -> Option<Candidate>;

    /// Criterion values above this cannot win before any plan is found.
    fn initial_bound(&self) -> f64;
}

/// Criterion values above this cannot win: the best so far (with the tie
/// band), or before any, the problem's initial bound.
fn bound<P: DoubleProblem>(problem: &P, best: &Option<Candidate>) -> f64 {
    best.map_or(problem.initial_bound(), |b| b.value * (1.0 + TIE))
}

/// The smallest `n2` in `lo..=hi` for which `holds` is true, by doubling
/// up from `lo` and bisection; `None` when it is false at `hi`.
fn first_from_below(lo: u64, hi: u64, mut holds: impl FnMut(u64) -> bool) -> Option<u64> {
    if lo > hi {
        return None;
    }
    let (mut bad, mut good) = (lo - 1, lo);
    let mut step = 1;
    while !holds(good) {
        if good == hi {
            return None;
        }
        bad = good;
        good = good.saturating_add(step).min(hi);
        step = step.saturating_mul(2);
    }
    Some(bisect(bad, good, holds))
}

/// The first true point in `(bad, good]`, false at `bad`, true at `good`.
fn bisect(mut bad: u64, mut good: u64, mut holds: impl FnMut(u64) -> bool) -> u64 {
    while good - bad > 1 {
        let mid = bad + (good - bad) / 2;
        if holds(mid) {
            good = mid;
        } else {
            bad = mid;
        }
    }
    good
}

/// Every `n1` for the numbers `k`, improving on `best`, from the largest
/// `n1` that could win down to the smallest.
///
/// Going down, the smallest `n2` of each `n1` is at least the one found
/// for a larger `n1` (the pointer), so the search of `n2` starts there, and
/// the problem's [`beyond`](DoubleProblem::beyond) test at the pointer can
/// pass over the `n1` before any `n2` is tested.
fn sweep<P: DoubleProblem>(problem: &P, k: Numbers, best: &mut Option<Candidate>) {
    let unit = problem.model().kind() != ModelKind::Poisson;
    let limit = problem.limit();
    let Some((lo1, hi1)) = problem.first_sample_range(k) else {
        return;
    };
    let lo1 = lo1.max(if unit { k.lowest_open() } else { 1 }).max(1);
    // Every criterion is at least n1.
    let below_bound = (bound(problem, best).ceil() as u64).saturating_sub(1);
    let hi1 = hi1.min(limit - 1).min(below_bound);
    let mut memo = P::Memo::default();
    // The smallest n2 found at the last n1 searched: a lower bound on the
    // smallest n2 of every smaller n1.
    let mut pointer: Option<u64> = None;
    for n1 in (lo1..=hi1).rev() {
        let bound = bound(problem, best);
        if n1 as f64 >= bound {
            continue;
        }
        let lo2 = if unit {
            (k.c2 + 1).saturating_sub(n1).max(1)
        } else {
            1
        };
        let hi2 = limit - n1;
        let from = pointer.map_or(lo2, |p| p.max(lo2));
        if from > hi2 || problem.beyond(k, n1, from, bound) {
            continue;
        }
        let first = problem.first(n1, k);
        let mut holds = |n2| problem.holds(&first, &mut memo, k, n1, n2);
        let n2 = match problem.fixed_second(n1) {
            Some(n2) => {
                if n2 < lo2 || n2 > hi2 || !holds(n2) {
                    continue;
                }
                n2
            }
            None => match first_from_below(from, hi2, &mut holds) {
                Some(n2) => {
                    pointer = Some(n2);
                    n2
                }
                None => continue,
            },
        };
        if let Some(candidate) = problem.score(&first, k, n1, n2, bound)
            && best.is_none_or(|b| candidate.beats(&b))
        {
            *best = Some(candidate);
        }
    }
}

/// The best plan of `problem`: `c2` runs up from 1 and stops
/// [`C2_PATIENCE`] values after the last one that improved the best plan,
/// and not before `start + C2_PATIENCE`. The numbers `(c1, r1)` of one
/// `c2` (the problem's [`first_acceptances`](DoubleProblem::first_acceptances)
/// and [`first_rejections`](DoubleProblem::first_rejections)) are swept in
/// parallel,
/// each from the best plan of the smaller `c2`; the merge keeps the tie
/// rule's winner, so the answer does not depend on the order.
pub(super) fn search<P: DoubleProblem>(problem: &P, start: u64) -> Option<Candidate> {
    let mut best: Option<Candidate> = None;
    let mut last_improved = start;
    let mut c2 = 1;
    while c2 <= last_improved + C2_PATIENCE {
        let before = best;
        let sets: Vec<Numbers> = problem
            .first_acceptances(c2)
            .into_iter()
            .flat_map(|c1| {
                problem
                    .first_rejections(c1, c2)
                    .map(move |r1| Numbers { c1, r1, c2 })
            })
            .collect();
        let found: Vec<Option<Candidate>> = sets
            .par_iter()
            .map(|&k| {
                let mut local = before;
                sweep(problem, k, &mut local);
                local
            })
            .collect();
        for candidate in found.into_iter().flatten() {
            if best.is_none_or(|b| candidate.beats(&b)) {
                best = Some(candidate);
            }
        }
        if best != before {
            last_improved = last_improved.max(c2);
        }
        c2 += 1;
    }
    best
}
