//! The curve searches of a plan (the AOQL and the largest ASN by
//! golden-section search, the quality at a given `Pa` by bisection, the
//! search ceiling by doubling), which ask for several points at once.
//!
//! Each search is a chain of steps, each step's point depending on the
//! previous step's value. But the point of a step depends on that value
//! only through one branch (went up or down, reached or not), so the
//! points of the next few steps form a small binary tree that can be laid
//! out before any of them is known: one point for the next step, two for
//! the step after, four for the third. A search asks for the tree's points
//! in one batch (up to [`LOOKAHEAD`] of them, walked side by side in the
//! lanes of one walk), then replays its steps on the values, taking the
//! branch each value gives. The points and values are those of the plain
//! search, so the answer is the same to the bit; the points of the branches
//! not taken are the price of walking three steps at the cost of about one.

use crate::model::{Model, ModelKind, nonconforming_in_lot};
use crate::plan::StageOutcomes;
use crate::plan::StagedPlan;
use crate::plan::oc::outcomes_at;

/// How many points a search of a staged plan asks for at once: the lanes
/// of one walk ([`outcomes_at`](crate::plan::oc::outcomes_at)'s largest
/// group), three steps of a binary search (1 + 2 + 4 points).
pub(crate) const LOOKAHEAD: usize = 8;

/// One search, stepped on the values at the points it asks for.
pub(crate) trait Search: Clone {
    /// What a step needs at its point.
    type Value: Copy + Default;
    /// The point whose value the next step needs; `None` once the search
    /// has ended.
    fn point(&self) -> Option<f64>;
    /// Takes the `value` at [`Search::point`] and steps; `branch` forces
    /// the branch (laying out points before their values are known).
    /// Returns the branch taken.
    fn take(&mut self, value: Self::Value, branch: Option<bool>) -> bool;
}

/// The probability of acceptance of `plan` at each of `ps`, the walks of
/// several qualities side by side ([`outcomes_at`]).
pub(crate) fn acceptance_probabilities(plan: &StagedPlan, model: &Model, ps: &[f64]) -> Vec<f64> {
    // A single plan's OC is one tail, as in `acceptance_probability`.
    if let Some((n, c)) = plan.as_single() {
        return ps.iter().map(|&p| model.tails(n, c, p, 0, 0).cdf).collect();
    }
    outcomes_at(plan, model, ps)
        .iter()
        .map(StageOutcomes::pa)
        .collect()
}

/// Runs `search` to its end, asking `values` for up to `budget` points at
/// a time: the tree of the next steps' points, breadth first.
pub(crate) fn run<S: Search>(
    mut search: S,
    budget: usize,
    values: &impl Fn(&[f64]) -> Vec<S::Value>,
) -> S {
    // A node of the tree: its point, and its children's nodes per branch.
    struct Node<S> {
        state: S,
        point: f64,
        children: [Option<usize>; 2],
    }
    while let Some(point) = search.point() {
        let mut nodes = vec![Node {
            state: search.clone(),
            point,
            children: [None; 2],
        }];
        let mut i = 0;
        while i < nodes.len() && nodes.len() < budget {
            for branch in [false, true] {
                let mut child = nodes[i].state.clone();
                if child.take(S::Value::default(), Some(branch)) != branch {
                    continue;
                }
                if let Some(point) = child.point()
                    && nodes.len() < budget
                {
                    nodes[i].children[usize::from(branch)] = Some(nodes.len());
                    nodes.push(Node {
                        state: child,
                        point,
                        children: [None; 2],
                    });
                }
            }
            i += 1;
        }
        let points: Vec<f64> = nodes.iter().map(|n| n.point).collect();
        let got = values(&points);
        let mut at = Some(0);
        while let Some(i) = at {
            let branch = search.take(got[i], None);
            at = nodes[i].children[usize::from(branch)];
        }
    }
    search
}

/// Bisection on `[lo, hi]` to a relative width of `1e-13`: the branch is
/// whether the condition holds at the middle.
#[derive(Clone)]
struct Bisection {
    lo: f64,
    hi: f64,
}

impl Search for Bisection {
    type Value = bool;

    fn point(&self) -> Option<f64> {
        (self.hi - self.lo > 1e-13 * self.hi).then_some(0.5 * (self.lo + self.hi))
    }

    fn take(&mut self, reached: bool, branch: Option<bool>) -> bool {
        let mid = 0.5 * (self.lo + self.hi);
        let reached = branch.unwrap_or(reached);
        if reached {
            self.hi = mid;
        } else {
            self.lo = mid;
        }
        reached
    }
}

/// Bisection on the whole numbers `D` of a lot of `lot` units, down to two
/// neighbours: the point is the lot quality `D / N` of the middle.
#[derive(Clone)]
struct WholeBisection {
    lo: u64,
    hi: u64,
    lot: u64,
}

impl Search for WholeBisection {
    type Value = bool;

    fn point(&self) -> Option<f64> {
        let mid = self.lo + (self.hi - self.lo) / 2;
        (self.hi - self.lo > 1).then(|| mid as f64 / self.lot as f64)
    }

    fn take(&mut self, reached: bool, branch: Option<bool>) -> bool {
        let mid = self.lo + (self.hi - self.lo) / 2;
        let reached = branch.unwrap_or(reached);
        if reached {
            self.hi = mid;
        } else {
            self.lo = mid;
        }
        reached
    }
}

/// Golden-section search for the maximiser of a unimodal `f` on
/// `[lo, hi]`, to a relative width of `1e-12`: the branch is whether the
/// peak lies above the lower inner point (`f1 < f2`). The point asked for
/// is the new inner point, `x2` when `above`, `x1` otherwise.
///
/// Source: the golden-section search, e.g. Press et al., *Numerical
/// Recipes* (3rd ed.), section 10.2.
#[derive(Clone)]
struct Golden {
    lo: f64,
    hi: f64,
    x1: f64,
    x2: f64,
    f1: f64,
    f2: f64,
    above: bool,
    ended: bool,
}

const INV_PHI: f64 = 0.618_033_988_749_894_8;

impl Golden {
    /// Narrows the bracket once (the branch forced or from `f1 < f2`), or
    /// ends the search once it is narrow enough.
    fn narrow(&mut self, branch: Option<bool>) -> bool {
        if self.hi - self.lo <= 1e-12 * self.hi {
            self.ended = true;
            return false;
        }
        self.above = branch.unwrap_or(self.f1 < self.f2);
        if self.above {
            self.lo = self.x1;
            self.x1 = self.x2;
            self.f1 = self.f2;
            self.x2 = self.lo + INV_PHI * (self.hi - self.lo);
        } else {
            self.hi = self.x2;
            self.x2 = self.x1;
            self.f2 = self.f1;
            self.x1 = self.hi - INV_PHI * (self.hi - self.lo);
        }
        self.above
    }
}

impl Search for Golden {
    type Value = f64;

    fn point(&self) -> Option<f64> {
        (!self.ended).then_some(if self.above { self.x2 } else { self.x1 })
    }

    fn take(&mut self, value: f64, branch: Option<bool>) -> bool {
        if self.above {
            self.f2 = value;
        } else {
            self.f1 = value;
        }
        self.narrow(branch)
    }
}

/// The search ceiling's doubling from `p` towards `top`: it goes on while
/// `Pa(p) > 1e-12` and `p` is more than `1e-12` below `top`.
#[derive(Clone)]
struct Doubling {
    p: f64,
    top: f64,
    ended: bool,
}

impl Search for Doubling {
    type Value = f64;

    fn point(&self) -> Option<f64> {
        (!self.ended).then_some(self.p)
    }

    fn take(&mut self, pa: f64, branch: Option<bool>) -> bool {
        let go = branch.unwrap_or(pa > 1e-12) && self.top - self.p > 1e-12;
        if go {
            self.p = (2.0 * self.p).min(0.5 * (self.p + self.top));
        } else {
            self.ended = true;
        }
        go
    }
}

/// Largest quality the curve searches need: where `Pa` has fallen below
/// `1e-12`, found by doubling from `r / n` (the quality at which the expected
/// count reaches the last rejection number), or halving the distance to a
/// fraction's end at 1. A plan on a few units still accepts lots above 50%
/// nonconforming, and its AOQ can peak there: the ceiling goes on up to
/// within `1e-12` of 1 rather than stop at one half.
fn quality_ceiling(plan: &StagedPlan, model: &Model) -> f64 {
    let last = plan.stages()[plan.stages().len() - 1];
    let top = match model.kind() {
        ModelKind::Poisson => f64::MAX,
        _ => 1.0,
    };
    let start = Doubling {
        p: (last.reject as f64 / last.n as f64).min(0.5 * top),
        top,
        ended: false,
    };
    let pas = |ps: &[f64]| acceptance_probabilities(plan, model, ps);
    run(start, LOOKAHEAD, &pas).p
}

/// The maximum over all qualities of a curve `f(p)` of `plan` that rises to
/// one peak and falls (AOQ, ASN): `(quality, value)`.
///
/// For the binomial and Poisson models the curve is smooth in `p`: a
/// coarse pass of 64 points up to where `Pa < 1e-12` brackets the maximum,
/// then golden-section search narrows the bracket to a relative width of
/// `1e-12` (about 60 evaluations). For the hypergeometric model a lot's
/// quality can only be `D / N`: after the same coarse bracket, a ternary
/// search over the whole numbers `D` narrows it to three candidates, and
/// the best of them is taken.
pub fn curve_maximum(plan: &StagedPlan, model: &Model, f: impl Fn(f64) -> f64) -> (f64, f64) {
    let one_at_a_time = |ps: &[f64]| ps.iter().map(|&p| f(p)).collect();
    curve_maximum_of(plan, model, &one_at_a_time, 1)
}

/// [`curve_maximum`] of a curve `f` evaluated at several qualities at once,
/// the golden-section search asking for up to `budget` points at a time.
pub(crate) fn curve_maximum_of(
    plan: &StagedPlan,
    model: &Model,
    f: &impl Fn(&[f64]) -> Vec<f64>,
    budget: usize,
) -> (f64, f64) {
    let ceiling = quality_ceiling(plan, model);
    const COARSE: usize = 64;
    let at = |p: f64| f(&[p])[0];
    if let (ModelKind::Hypergeometric, Some(lot)) = (model.kind(), model.lot_size()) {
        let d_top = nonconforming_in_lot(ceiling, lot).max(1);
        let grid: Vec<u64> = (0..=COARSE as u64)
            .map(|i| d_top * i / COARSE as u64)
            .collect();
        let qualities: Vec<f64> = grid.iter().map(|&d| d as f64 / lot as f64).collect();
        let best = argmax(&f(&qualities));
        let (lo, hi) = (grid[best.saturating_sub(1)], grid[(best + 1).min(COARSE)]);
        let d = whole_argmax(lo, hi, |d| at(d as f64 / lot as f64));
        let quality = d as f64 / lot as f64;
        return (quality, at(quality));
    }
    let quality = smooth_maximum(f, 0.0, ceiling, budget);
    (quality, at(quality))
}

/// The maximiser on `(lo, hi]` of a smooth curve that rises to one peak
/// and falls: a 64-point grid finds the peak's neighbourhood, golden
/// section the peak, asking `f` for up to `budget` points at a time.
pub(crate) fn smooth_maximum(
    f: &impl Fn(&[f64]) -> Vec<f64>,
    lo: f64,
    hi: f64,
    budget: usize,
) -> f64 {
    const COARSE: usize = 64;
    let grid: Vec<f64> = (1..=COARSE)
        .map(|i| lo + (hi - lo) * i as f64 / COARSE as f64)
        .collect();
    let best = argmax(&f(&grid));
    let a = if best == 0 { lo } else { grid[best - 1] };
    let b = grid[(best + 1).min(COARSE - 1)];
    let x1 = b - INV_PHI * (b - a);
    let x2 = a + INV_PHI * (b - a);
    let ends = f(&[x1, x2]);
    let mut golden = Golden {
        lo: a,
        hi: b,
        x1,
        x2,
        f1: ends[0],
        f2: ends[1],
        above: false,
        ended: false,
    };
    golden.narrow(None);
    let golden = run(golden, budget, f);
    0.5 * (golden.lo + golden.hi)
}

/// The point in `[lo, hi]` where a condition that holds from some quality
/// on starts to hold, by bisection to a relative width of `1e-13`, asking
/// `reached` for up to `budget` points at a time.
pub(crate) fn bisect_quality(
    reached: &impl Fn(&[f64]) -> Vec<bool>,
    lo: f64,
    hi: f64,
    budget: usize,
) -> f64 {
    let end = run(Bisection { lo, hi }, budget, reached);
    0.5 * (end.lo + end.hi)
}

/// The smallest quality at which `reached(p)` holds, for a condition that
/// turns true once as `p` rises from 0 to the search ceiling: bisection on
/// `p` to a relative width of `1e-13`, or on `D` for the hypergeometric
/// model (the lot quality `D / N`), [`LOOKAHEAD`] points at a time.
pub(crate) fn quality_where(
    plan: &StagedPlan,
    model: &Model,
    reached: &impl Fn(&[f64]) -> Vec<bool>,
) -> f64 {
    let ceiling = quality_ceiling(plan, model);
    if let (ModelKind::Hypergeometric, Some(lot)) = (model.kind(), model.lot_size()) {
        let start = WholeBisection {
            lo: 0,
            hi: nonconforming_in_lot(ceiling, lot).max(1),
            lot,
        };
        let end = run(start, LOOKAHEAD, reached);
        return end.hi as f64 / lot as f64;
    }
    bisect_quality(reached, 0.0, ceiling, LOOKAHEAD)
}

/// The maximiser over the whole numbers `lo..=hi` of `f`, which rises to
/// one peak and falls: ternary search down to three candidates, then the
/// best of them.
pub(crate) fn whole_argmax(mut lo: u64, mut hi: u64, f: impl Fn(u64) -> f64) -> u64 {
    while hi - lo > 2 {
        let m1 = lo + (hi - lo) / 3;
        let m2 = hi - (hi - lo) / 3;
        if f(m1) < f(m2) {
            lo = m1;
        } else {
            hi = m2;
        }
    }
    let candidates: Vec<u64> = (lo..=hi).collect();
    let values: Vec<f64> = candidates.iter().map(|&d| f(d)).collect();
    candidates[argmax(&values)]
}

/// The index of the first largest of `values`.
fn argmax(values: &[f64]) -> usize {
    let mut best = 0;
    let mut best_value = f64::NEG_INFINITY;
    for (i, &v) in values.iter().enumerate() {
        if v > best_value {
            best = i;
            best_value = v;
        }
    }
    best
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A curve with one peak, evaluated point by point; `asked` counts the
    /// batches.
    fn curve(ps: &[f64], asked: &std::cell::Cell<usize>) -> Vec<f64> {
        asked.set(asked.get() + 1);
        ps.iter().map(|&p| p * (-40.0 * p).exp()).collect()
    }

    #[test]
    fn a_search_that_looks_ahead_gives_the_plain_answer_in_fewer_batches() {
        let (plain, ahead) = (std::cell::Cell::new(0), std::cell::Cell::new(0));
        let one = smooth_maximum(&|ps: &[f64]| curve(ps, &plain), 0.0, 1.0, 1);
        let many = smooth_maximum(&|ps: &[f64]| curve(ps, &ahead), 0.0, 1.0, LOOKAHEAD);
        assert_eq!(one.to_bits(), many.to_bits(), "{one} against {many}");
        // A maximum is found to about the square root of the rounding
        // (the curve is flat to second order there).
        assert!(
            (one - 0.025).abs() < 1e-7,
            "the peak of p e^(-40p) is 1/40: {one}"
        );
        assert!(
            2 * ahead.get() < plain.get(),
            "{} against {} batches",
            ahead.get(),
            plain.get()
        );

        let below = |ps: &[f64]| ps.iter().map(|&p| p >= 0.3).collect();
        let (one, many) = (
            bisect_quality(&below, 0.0, 1.0, 1),
            bisect_quality(&below, 0.0, 1.0, LOOKAHEAD),
        );
        assert_eq!(one.to_bits(), many.to_bits(), "{one} against {many}");
        assert!((one - 0.3).abs() < 1e-12);

        let start = WholeBisection {
            lo: 0,
            hi: 1000,
            lot: 1000,
        };
        let at_least = |ps: &[f64]| ps.iter().map(|&p| p >= 0.417).collect();
        let (one, many) = (
            run(start.clone(), 1, &at_least).hi,
            run(start, LOOKAHEAD, &at_least).hi,
        );
        assert_eq!((one, many), (417, 417));
    }

    #[test]
    fn the_doubling_stops_at_the_first_point_past_the_level() {
        let start = Doubling {
            p: 1e-3,
            top: 1.0,
            ended: false,
        };
        // Falls below 1e-12 from p = 0.2 on: the doubling from 1e-3 stops
        // at 0.256, the first of 1e-3 2^k past it.
        let pa = |ps: &[f64]| {
            ps.iter()
                .map(|&p| if p < 0.2 { 1.0 } else { 0.0 })
                .collect()
        };
        let (one, many) = (run(start.clone(), 1, &pa).p, run(start, LOOKAHEAD, &pa).p);
        assert_eq!((one, many), (0.256, 0.256));
    }
}
