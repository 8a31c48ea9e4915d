//! What a plan does to lots of a given quality: OC, AOQ, ATI, ASN, and the
//! AOQL and indifference quality of the whole curve.

use serde::Serialize;

use crate::model::{Model, ModelKind, nonconforming_in_lot};
use crate::plan::oc::lane_outcomes;
use crate::plan::{StageOutcomes, StagedPlan, stage_outcomes};

/// The measures of a plan at one quality.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Measures {
    /// The quality `p` asked for.
    pub quality: f64,
    /// Hypergeometric model: the number of nonconforming units
    /// `D = round(p N)` that a lot of quality `p` holds; `None` otherwise.
    pub lot_nonconforming: Option<u64>,
    /// Hypergeometric model: the lot's own quality `D / N`, at which every
    /// measure below is computed; `None` otherwise (the measures are at
    /// `p`).
    pub lot_quality: Option<f64>,
    /// Probability of acceptance `Pa(p)`.
    pub pa: f64,
    /// Average outgoing quality under rectifying inspection (rejected lots
    /// screened 100%, nonconforming units found replaced).
    pub aoq: f64,
    /// Average total inspection per lot; needs the lot size.
    pub ati: Option<f64>,
    /// Average sample number without curtailment.
    pub asn: f64,
    /// Average sample number with full curtailment: units inspected one at
    /// a time, inspection stopping as soon as the decision is certain (for
    /// the Poisson model only rejection can be certain early).
    pub asn_curtailed: Option<f64>,
}

/// The measures of `plan` at quality `p`; under the hypergeometric model at
/// the lot's quality `D / N` ([`Model::lot_quality`]), which the result
/// carries beside `p`.
///
/// With `a_j` the probability of acceptance at stage `j` and `n_j` the
/// cumulative sample size, lot size `N`:
///
/// ```text
/// Pa  = sum_j a_j
/// AOQ = sum_j a_j p (N - n_j) / N        (without a lot size: Pa p)
/// ATI = sum_j a_j n_j + (1 - Pa) N
/// ASN = sum_j (a_j + r_j) n_j
/// ```
///
/// For a single plan these are the textbook `AOQ = Pa p (N - n) / N` and
/// `ATI = n + (1 - Pa)(N - n)` (Montgomery, *Introduction to Statistical
/// Quality Control*, the chapter on lot-by-lot acceptance sampling for
/// attributes, from memory).
pub fn measures(plan: &StagedPlan, model: &Model, asked: f64) -> Measures {
    measures_and_outcomes(plan, model, asked).0
}

/// [`measures`] and the stage outcomes of the walk they come from (at the
/// lot quality under the hypergeometric model, which has the same count
/// `D` as `asked`), for an evaluation that also reports when lots are
/// decided.
pub(crate) fn measures_and_outcomes(
    plan: &StagedPlan,
    model: &Model,
    asked: f64,
) -> (Measures, StageOutcomes) {
    let [point] = lane_measures(plan, model, [asked]);
    point
}

/// [`measures_and_outcomes`] at `L` qualities, walked side by side in the
/// lanes of one walk; each lane's numbers are those of its own walk.
pub(crate) fn lane_measures<const L: usize>(
    plan: &StagedPlan,
    model: &Model,
    asked: [f64; L],
) -> [(Measures, StageOutcomes); L] {
    let ps = asked.map(|q| model.lot_quality(q));
    let mut outcomes = lane_outcomes(plan, model, ps, true).into_iter();
    std::array::from_fn(|lane| {
        let outcomes = outcomes.next().unwrap_or_else(|| StageOutcomes {
            accept: Vec::new(),
            reject: Vec::new(),
            curtailed_units: None,
        });
        let point = measures_from(plan, model, asked[lane], ps[lane], &outcomes);
        (point, outcomes)
    })
}

/// The measures at the asked quality `asked` from the stage outcomes at its
/// lot quality `p`.
fn measures_from(
    plan: &StagedPlan,
    model: &Model,
    asked: f64,
    p: f64,
    outcomes: &StageOutcomes,
) -> Measures {
    let stages = plan.stages();
    let asn = stages
        .iter()
        .zip(outcomes.accept.iter().zip(&outcomes.reject))
        .map(|(s, (a, r))| (a + r) * s.n as f64)
        .sum();
    let ati = model.lot_size().map(|lot| {
        let inspected: f64 = stages
            .iter()
            .zip(&outcomes.accept)
            .map(|(s, a)| a * s.n as f64)
            .sum();
        inspected + (1.0 - outcomes.pa()) * lot as f64
    });
    let lot_nonconforming = model.nonconforming_in_lot(asked);
    Measures {
        quality: asked,
        lot_nonconforming,
        lot_quality: lot_nonconforming.map(|_| p),
        pa: outcomes.pa(),
        aoq: aoq_from(outcomes, plan, model, p),
        ati,
        asn,
        asn_curtailed: outcomes.curtailed_units,
    }
}

/// AOQ from the stage outcomes: `sum_j a_j p (N - n_j) / N`, or `Pa p`
/// without a lot size.
fn aoq_from(outcomes: &StageOutcomes, plan: &StagedPlan, model: &Model, p: f64) -> f64 {
    match model.lot_size() {
        Some(lot) => {
            let big_n = lot as f64;
            let outgoing: f64 = plan
                .stages()
                .iter()
                .zip(&outcomes.accept)
                .map(|(s, a)| a * (big_n - s.n as f64) / big_n)
                .sum();
            outgoing * p
        }
        None => outcomes.pa() * p,
    }
}

/// The AOQ of `plan` at quality `p` (at the lot quality `D / N` under the
/// hypergeometric model, as [`measures`]), without the other measures (the
/// AOQL search evaluates it a hundred times per curve).
pub fn average_outgoing_quality(plan: &StagedPlan, model: &Model, p: f64) -> f64 {
    let p = model.lot_quality(p);
    aoq_from(&stage_outcomes(plan, model, p), plan, model, p)
}

/// The probability of acceptance of `plan` at quality `p`.
pub fn acceptance_probability(plan: &StagedPlan, model: &Model, p: f64) -> f64 {
    // A single plan's OC is one tail; skip the stage bookkeeping, which the
    // curve searches would otherwise pay a thousand times per curve.
    if let Some((n, c)) = plan.as_single() {
        return model.tails(n, c, p, 0, 0).cdf;
    }
    stage_outcomes(plan, model, p).pa()
}

/// The average outgoing quality limit: the largest AOQ over all qualities.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Aoql {
    /// The AOQL.
    pub value: f64,
    /// The quality at which AOQ reaches it.
    pub quality: f64,
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
    let mut p = (last.reject as f64 / last.n as f64).min(0.5 * top);
    while acceptance_probability(plan, model, p) > 1e-12 && top - p > 1e-12 {
        p = (2.0 * p).min(0.5 * (p + top));
    }
    p
}

/// The AOQL of `plan` and the quality where it occurs.
///
/// See [`curve_maximum`] for the search.
pub fn aoql(plan: &StagedPlan, model: &Model) -> Aoql {
    let (quality, value) = curve_maximum(plan, model, |p| average_outgoing_quality(plan, model, p));
    Aoql { value, quality }
}

/// The largest average sample number of `plan` over all qualities, and the
/// quality where it occurs (`(quality, asn)`), by [`curve_maximum`].
pub fn largest_asn(plan: &StagedPlan, model: &Model) -> (f64, f64) {
    let stages = plan.stages();
    curve_maximum(plan, model, |p| {
        let o = stage_outcomes(plan, model, p);
        stages
            .iter()
            .zip(o.decided())
            .map(|(s, share)| share * s.n as f64)
            .sum()
    })
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
///
/// Source: the golden-section search, e.g. Press et al., *Numerical
/// Recipes* (3rd ed.), section 10.2.
pub fn curve_maximum(plan: &StagedPlan, model: &Model, f: impl Fn(f64) -> f64) -> (f64, f64) {
    let ceiling = quality_ceiling(plan, model);
    const COARSE: usize = 64;
    if let (ModelKind::Hypergeometric, Some(lot)) = (model.kind(), model.lot_size()) {
        let d_top = nonconforming_in_lot(ceiling, lot).max(1);
        let at = |d: u64| f(d as f64 / lot as f64);
        let grid: Vec<u64> = (0..=COARSE as u64)
            .map(|i| d_top * i / COARSE as u64)
            .collect();
        let best = argmax(&grid, |&d| at(d));
        let (lo, hi) = (grid[best.saturating_sub(1)], grid[(best + 1).min(COARSE)]);
        let d = whole_argmax(lo, hi, at);
        let quality = d as f64 / lot as f64;
        return (quality, f(quality));
    }
    let quality = smooth_maximum(&f, 0.0, ceiling);
    (quality, f(quality))
}

/// The maximiser on `(lo, hi]` of a smooth curve that rises to one peak
/// and falls: a 64-point grid finds the peak's neighbourhood, golden
/// section the peak.
pub(crate) fn smooth_maximum(f: &impl Fn(f64) -> f64, lo: f64, hi: f64) -> f64 {
    const COARSE: usize = 64;
    let grid: Vec<f64> = (1..=COARSE)
        .map(|i| lo + (hi - lo) * i as f64 / COARSE as f64)
        .collect();
    let best = argmax(&grid, |&p| f(p));
    let a = if best == 0 { lo } else { grid[best - 1] };
    let b = grid[(best + 1).min(COARSE - 1)];
    golden_max(f, a, b)
}

/// The point in `[lo, hi]` where a condition that holds from some quality
/// on starts to hold, by bisection to a relative width of `1e-13`.
pub(crate) fn bisect_quality(reached: impl Fn(f64) -> bool, mut lo: f64, mut hi: f64) -> f64 {
    while hi - lo > 1e-13 * hi {
        let mid = 0.5 * (lo + hi);
        if reached(mid) {
            hi = mid;
        } else {
            lo = mid;
        }
    }
    0.5 * (lo + hi)
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
    candidates[argmax(&candidates, |&d| f(d))]
}

fn argmax<T>(xs: &[T], f: impl Fn(&T) -> f64) -> usize {
    let mut best = 0;
    let mut best_value = f64::NEG_INFINITY;
    for (i, x) in xs.iter().enumerate() {
        let v = f(x);
        if v > best_value {
            best = i;
            best_value = v;
        }
    }
    best
}

/// Maximiser of a unimodal `f` on `[lo, hi]` by golden-section search.
fn golden_max(f: &impl Fn(f64) -> f64, mut lo: f64, mut hi: f64) -> f64 {
    const INV_PHI: f64 = 0.618_033_988_749_894_8;
    let mut x1 = hi - INV_PHI * (hi - lo);
    let mut x2 = lo + INV_PHI * (hi - lo);
    let (mut f1, mut f2) = (f(x1), f(x2));
    while hi - lo > 1e-12 * hi {
        if f1 < f2 {
            lo = x1;
            x1 = x2;
            f1 = f2;
            x2 = lo + INV_PHI * (hi - lo);
            f2 = f(x2);
        } else {
            hi = x2;
            x2 = x1;
            f2 = f1;
            x1 = hi - INV_PHI * (hi - lo);
            f1 = f(x1);
        }
    }
    0.5 * (lo + hi)
}

/// The indifference quality: where `Pa = 0.5`.
///
/// See [`quality_at_pa`](crate::quality_at_pa), of which it is the case
/// `target = 0.5`.
pub fn indifference_quality(plan: &StagedPlan, model: &Model) -> f64 {
    quality_where(plan, model, |p| {
        acceptance_probability(plan, model, p) <= 0.5
    })
}

/// The smallest quality at which `reached(p)` holds, for a condition that
/// turns true once as `p` rises from 0 to the search ceiling: bisection on
/// `p` to a relative width of `1e-13`, or on `D` for the hypergeometric
/// model (the lot quality `D / N`).
pub(crate) fn quality_where(
    plan: &StagedPlan,
    model: &Model,
    reached: impl Fn(f64) -> bool,
) -> f64 {
    let ceiling = quality_ceiling(plan, model);
    if let (ModelKind::Hypergeometric, Some(lot)) = (model.kind(), model.lot_size()) {
        let (mut lo, mut hi) = (0u64, nonconforming_in_lot(ceiling, lot).max(1));
        while hi - lo > 1 {
            let mid = lo + (hi - lo) / 2;
            if reached(mid as f64 / lot as f64) {
                hi = mid;
            } else {
                lo = mid;
            }
        }
        return hi as f64 / lot as f64;
    }
    bisect_quality(reached, 0.0, ceiling)
}
