//! The double-sampling designer: the plan `(n1, c1, r1, n2, c2)` that meets
//! both risk points exactly and minimises a chosen average sample number.
//!
//! # The plan
//!
//! Draw `n1` units. Accept when the count `d1 <= c1`, reject when
//! `d1 >= r1`; otherwise draw `n2` more and accept when the cumulative count
//! is at most `c2`, reject when it is more. The search covers `c1 < c2`,
//! `c1 + 2 <= r1 <= c2 + 1` and every `n1`, `n2` (or `n2 = round(R n1)` for
//! a fixed second-sample ratio `R`).
//!
//! # Method
//!
//! For fixed acceptance and rejection numbers the acceptance event shrinks
//! when either sample grows (a lot accepted with `n1 + 1` or `n2 + 1` units
//! is accepted with `n1`, `n2` on the same units), so `Pa` falls in `n1`
//! and in `n2`. Hence:
//!
//! * `Pa(p2) <= beta` holds from some `n2_min(n1)` on, and `n2_min` does not
//!   grow with `n1`: one walk down over `n2` serves the whole sweep of `n1`
//!   (two pointers), with a doubling-and-bisection search only for the
//!   first `n1`;
//! * the ASN `n1 + n2 P(c1 < d1 < r1)` grows with `n2`, and the producer's
//!   point holds up to some `n2_max`, so at each `n1` only `n2_min` can be
//!   best;
//! * `Pa >= P(d1 <= c1)` bounds `n1` below by the single plan `(n1, c1)`
//!   at the consumer's point, and `Pa <= P(d1 < r1)` bounds it above by the
//!   single plan `(n1, r1 - 1)` at the producer's point;
//! * every criterion is at least `n1`, so the sweep stops once `n1` reaches
//!   the best value found, or before any is found, the single plan's `n`: a
//!   double plan that inspects more on average than the single plan is not
//!   worth its second sample.
//!
//! The final acceptance number `c2` runs up from 1 and stops three values
//! after the last one that improved the best plan, and not before the
//! single plan's acceptance number plus three. That stopping rule is the
//! search's one limit: tests/reference checks it against an exhaustive
//! search over a box twice as wide. The search grows with the cube of the
//! acceptance numbers, so it serves points whose single plan has
//! `c <= 25` ([`MAX_DOUBLE_SINGLE_C`]; about 3 s there on two cores).
//!
//! # Tie rule
//!
//! Criterion values within `1e-12` (relative) are ties, broken by the
//! smaller largest sample `n1 + n2`, then by
//! `max(alpha_achieved / alpha, beta_achieved / beta)`, then by the smaller
//! `(c2, c1, r1, n1)`.

use rayon::prelude::*;

use super::request::{Criterion, Design};
use super::single::Solver;
use crate::error::DesignError;
use crate::model::{Model, ModelKind};
use crate::plan::{Stage, StagedPlan, whole_argmax};
use crate::risk::RiskPair;

/// How many final acceptance numbers past the last improving one the
/// search tries.
const C2_PATIENCE: u64 = 3;

/// The largest single-plan acceptance number for which the double designer
/// searches: the search grows with the cube of the acceptance numbers, and
/// at 25 it takes about 3 s on two cores.
pub const MAX_DOUBLE_SINGLE_C: u64 = 25;

/// Criterion values this close (relative) are ties.
const TIE: f64 = 1e-12;

/// The first stage of a double plan at one quality.
struct FirstStage {
    /// `P(d1 <= c1)`.
    accept: f64,
    /// `P(d1 >= r1)`.
    reject: f64,
    /// `P(d1 = d)` for `d = c1 + 1 .. r1 - 1`.
    open: Vec<f64>,
}

impl FirstStage {
    fn new(model: &Model, n1: u64, c1: u64, r1: u64, p: f64) -> Self {
        let w = model.window(n1, c1 + 1, r1 - 1, p, 0, 0);
        FirstStage {
            accept: w.cdf(c1),
            reject: w.sf(r1 - 1),
            open: (c1 + 1..r1).map(|d| w.pmf(d)).collect(),
        }
    }

    /// `P(c1 < d1 < r1)`: the chance of a second sample.
    fn second_sample(&self) -> f64 {
        self.open.iter().sum()
    }
}

/// One candidate plan and what it scored.
#[derive(Clone, Copy, Debug, PartialEq)]
struct Candidate {
    n1: u64,
    c1: u64,
    r1: u64,
    n2: u64,
    c2: u64,
    value: f64,
    producer_risk: f64,
    consumer_risk: f64,
    margin: f64,
}

impl Candidate {
    /// Whether `self` beats `other` under the tie rule.
    fn beats(&self, other: &Candidate) -> bool {
        let scale = self.value.abs().max(other.value.abs());
        if (self.value - other.value).abs() > TIE * scale {
            return self.value < other.value;
        }
        let numbers = |c: &Candidate| (c.c2, c.c1, c.r1, c.n1);
        (self.n1 + self.n2)
            .cmp(&(other.n1 + other.n2))
            .then(self.margin.total_cmp(&other.margin))
            .then(numbers(self).cmp(&numbers(other)))
            .is_lt()
    }
}

struct DoubleSearch<'a> {
    model: &'a Model,
    single: Solver<'a>,
    p1: f64,
    alpha: f64,
    p2: f64,
    beta: f64,
    criterion: Criterion,
    second_ratio: Option<f64>,
    single_n: u64,
}

impl DoubleSearch<'_> {
    /// Cumulative acceptance and rejection probabilities of the plan at
    /// quality `p`, given its first stage there.
    fn outcome(
        &self,
        first: &FirstStage,
        n1: u64,
        c1: u64,
        n2: u64,
        c2: u64,
        p: f64,
    ) -> (f64, f64) {
        let r1 = c1 + 1 + first.open.len() as u64;
        let (mut acc, mut rej) = (first.accept, first.reject);
        if self.model.forgets_the_past() {
            let w = self.model.window(n2, c2 + 2 - r1, c2 - c1 - 1, p, 0, 0);
            for (d, f) in (c1 + 1..r1).zip(&first.open) {
                acc += f * w.cdf(c2 - d);
                rej += f * w.sf(c2 - d);
            }
        } else {
            for (d, f) in (c1 + 1..r1).zip(&first.open) {
                let w = self.model.window(n2, c2 - d + 1, c2 - d, p, n1, d);
                acc += f * w.cdf(c2 - d);
                rej += f * w.sf(c2 - d);
            }
        }
        (acc, rej)
    }

    fn consumer_holds(&self, first: &FirstStage, n1: u64, c1: u64, n2: u64, c2: u64) -> bool {
        self.outcome(first, n1, c1, n2, c2, self.p2).0 <= self.beta
    }

    /// Largest chance of a second sample over all qualities.
    fn peak_second_sample(&self, n1: u64, c1: u64, r1: u64) -> f64 {
        let at = |p: f64| FirstStage::new(self.model, n1, c1, r1, p).second_sample();
        match (self.model.kind(), self.model.lot_size()) {
            (ModelKind::Hypergeometric, Some(lot)) => {
                // P(c1 < d1 < r1) rises and falls in D: ternary search on D.
                let at_d = |d: u64| at(d as f64 / lot as f64);
                at_d(whole_argmax(0, lot, at_d))
            }
            (ModelKind::Poisson, _) => {
                // d/dlambda P(c1 < X < r1) = f(c1) - f(r1 - 1) = 0 at
                // lambda^(r1 - 1 - c1) = (r1 - 1)! / c1!.
                let gap = (r1 - 1 - c1) as f64;
                let lambda = ((ln_factorial(r1 - 1) - ln_factorial(c1)) / gap).exp();
                at(lambda / n1 as f64)
            }
            _ => {
                if r1 > n1 {
                    // The first sample cannot reject: a second one becomes
                    // certain as p -> 1.
                    return 1.0;
                }
                // d/dp P(c1 < X < r1) = n1 [b(c1; n1 - 1) - b(r1 - 1; n1 - 1)]
                // = 0 at (p / q)^(r1 - 1 - c1) = C(n1 - 1, c1) / C(n1 - 1, r1 - 1).
                let gap = (r1 - 1 - c1) as f64;
                let ln_odds = (ln_choose(n1 - 1, c1) - ln_choose(n1 - 1, r1 - 1)) / gap;
                let p = 1.0 / (1.0 + (-ln_odds).exp());
                at(p)
            }
        }
    }

    fn value(&self, n1: u64, c1: u64, r1: u64, n2: u64, f1: &FirstStage, f2: &FirstStage) -> f64 {
        let share = match self.criterion {
            Criterion::AsnAql => f1.second_sample(),
            Criterion::AsnRql => f2.second_sample(),
            Criterion::AsnMax => self.peak_second_sample(n1, c1, r1),
        };
        n1 as f64 + n2 as f64 * share
    }

    /// Criterion values above this cannot win: the best so far, or before
    /// any, the single plan's sample size.
    fn bound(&self, best: &Option<Candidate>) -> f64 {
        best.map_or(self.single_n as f64, |b| b.value * (1.0 + TIE))
    }

    /// Smallest `n2 >= lo` in `lo..=hi` meeting the consumer's point.
    fn first_n2(
        &self,
        f2: &FirstStage,
        n1: u64,
        c1: u64,
        c2: u64,
        lo: u64,
        hi: u64,
    ) -> Option<u64> {
        let holds = |n2| self.consumer_holds(f2, n1, c1, n2, c2);
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
        while good - bad > 1 {
            let mid = bad + (good - bad) / 2;
            if mid >= lo && holds(mid) {
                good = mid;
            } else {
                bad = mid;
            }
        }
        Some(good)
    }

    /// Every `n1` for the numbers `(c1, r1, c2)`, improving on `best`.
    fn sweep(&self, c1: u64, r1: u64, c2: u64, best: &mut Option<Candidate>) {
        let unit = self.model.kind() != ModelKind::Poisson;
        let limit = self.single.limit;
        let Some(lo1) = self.single.n_min(c1) else {
            return;
        };
        let hi1 = match self.single.n_max(r1 - 1) {
            Some(n) => n.min(limit - 1),
            None => return,
        };
        let mut pointer: Option<u64> = None;
        for n1 in lo1.max(if unit { c1 + 1 } else { 1 })..=hi1 {
            if n1 as f64 >= self.bound(best) {
                break;
            }
            let f2 = FirstStage::new(self.model, n1, c1, r1, self.p2);
            let lo2 = if unit {
                (c2 + 1).saturating_sub(n1).max(1)
            } else {
                1
            };
            let hi2 = limit - n1;
            let n2 = match self.second_ratio {
                Some(ratio) => {
                    let n2 = ((ratio * n1 as f64).round() as u64).max(1);
                    if n2 < lo2 || n2 > hi2 || !self.consumer_holds(&f2, n1, c1, n2, c2) {
                        continue;
                    }
                    n2
                }
                None => match pointer {
                    Some(mut n2) => {
                        // n2_min(n1) <= n2_min(n1 - 1): walk down.
                        n2 = n2.clamp(lo2, hi2);
                        while n2 > lo2 && self.consumer_holds(&f2, n1, c1, n2 - 1, c2) {
                            n2 -= 1;
                        }
                        n2
                    }
                    None => match self.first_n2(&f2, n1, c1, c2, lo2, hi2) {
                        Some(n2) => n2,
                        None => continue,
                    },
                },
            };
            pointer = Some(n2);
            let f1 = FirstStage::new(self.model, n1, c1, r1, self.p1);
            // Every criterion is at least n1 + n2 * P(second sample at p1 or p2).
            let floor = n1 as f64 + n2 as f64 * f1.second_sample().min(f2.second_sample());
            if floor > self.bound(best) {
                continue;
            }
            let producer_risk = self.outcome(&f1, n1, c1, n2, c2, self.p1).1;
            if producer_risk > self.alpha {
                continue;
            }
            let consumer_risk = self.outcome(&f2, n1, c1, n2, c2, self.p2).0;
            let candidate = Candidate {
                n1,
                c1,
                r1,
                n2,
                c2,
                value: self.value(n1, c1, r1, n2, &f1, &f2),
                producer_risk,
                consumer_risk,
                margin: (producer_risk / self.alpha).max(consumer_risk / self.beta),
            };
            if best.is_none_or(|b| candidate.beats(&b)) {
                *best = Some(candidate);
            }
        }
    }
}

fn ln_factorial(k: u64) -> f64 {
    statrs::function::gamma::ln_gamma(k as f64 + 1.0)
}

fn ln_choose(n: u64, k: u64) -> f64 {
    ln_factorial(n) - ln_factorial(k) - ln_factorial(n - k)
}

/// Designs the double plan that meets both risk points and minimises
/// `criterion` (see the module documentation for the search).
///
/// # Errors
/// As [`design_single`](super::single::design_single) for points that have
/// no single plan; [`DesignError::NoPlan`] when no double plan meets both
/// points with a criterion below the single plan's sample size;
/// [`DesignError::BeyondCap`] when the single plan's acceptance number
/// passes [`MAX_DOUBLE_SINGLE_C`].
///
/// # Example
/// ```
/// use lotsman::{design_double, Criterion, Model, ModelKind, RiskPair, RiskPoint};
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// let risks = RiskPair::new(
///     RiskPoint { quality: 0.01, risk: 0.05 },
///     RiskPoint { quality: 0.06, risk: 0.10 },
///     &model,
/// ).unwrap();
/// let d = design_double(&model, &risks, Criterion::AsnAql, None).unwrap();
/// assert!(d.producer_risk <= 0.05 && d.consumer_risk <= 0.10);
/// assert_eq!(d.plan.stages().len(), 2);
/// ```
pub fn design_double(
    model: &Model,
    risks: &RiskPair,
    criterion: Criterion,
    second_ratio: Option<f64>,
) -> Result<Design, DesignError> {
    let single = super::single::design_single(model, risks)?;
    if single.c > MAX_DOUBLE_SINGLE_C {
        return Err(DesignError::BeyondCap {
            what: format!(
                "a double plan around the single plan's acceptance number {}",
                single.c
            ),
            cap: format!("{MAX_DOUBLE_SINGLE_C} (use the single or the sequential plan)"),
        });
    }
    let (producer, consumer) = (risks.producer(), risks.consumer());
    let search = DoubleSearch {
        model,
        single: Solver::new(model, risks),
        p1: producer.quality,
        alpha: producer.risk,
        p2: consumer.quality,
        beta: consumer.risk,
        criterion,
        second_ratio,
        single_n: single.n,
    };
    let mut best: Option<Candidate> = None;
    let mut last_improved = single.c;
    let mut c2 = 1;
    while c2 <= last_improved + C2_PATIENCE {
        // The numbers (c1, r1) of one c2 are swept in parallel, each from
        // the best plan of the smaller c2; the merge keeps the tie rule's
        // winner, so the answer does not depend on the order.
        let before = best;
        let pairs: Vec<(u64, u64)> = (0..c2)
            .flat_map(|c1| (c1 + 2..=c2 + 1).map(move |r1| (c1, r1)))
            .collect();
        let found: Vec<Option<Candidate>> = pairs
            .par_iter()
            .map(|&(c1, r1)| {
                let mut local = before;
                search.sweep(c1, r1, c2, &mut local);
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
    let b = best.ok_or_else(|| DesignError::NoPlan {
        reason: format!(
            "no double plan meets both points with a {} below the single plan's n = {}",
            criterion.name(),
            single.n
        ),
        suggestion: "use the single plan".to_string(),
    })?;
    let stages = vec![
        Stage {
            n: b.n1,
            accept: Some(b.c1),
            reject: b.r1,
        },
        Stage {
            n: b.n1 + b.n2,
            accept: Some(b.c2),
            reject: b.c2 + 1,
        },
    ];
    let plan = StagedPlan::new(stages, model).map_err(|e| DesignError::NoPlan {
        reason: e.to_string(),
        suggestion: "report this as a bug".to_string(),
    })?;
    Ok(Design::exact(plan, model, risks))
}
