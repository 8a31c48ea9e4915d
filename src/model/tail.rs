//! Both tails of a discrete distribution from its terms, summed outward from
//! the cut in the direction in which the terms shrink.
//!
//! The tail on the far side of the mode is the small one, and it is summed
//! directly; the other is its complement. Each term is the previous one times
//! a ratio of consecutive probabilities, so the sum costs one log-probability
//! (the first term, from the saddle-point form) plus one multiply per term.
//! Beyond the mode the ratios fall monotonically, so after a term `t` with
//! ratio `r < 1` the rest of the tail is at most `t r / (1 - r)`: the loop
//! stops as soon as that bound is below the rounding of the running sum.
//! The number of terms is therefore at most the distance to the end of the
//! support and in practice a few standard deviations, never a function of the
//! sample size.

/// The two tails of a count distribution at a cut `c`.
///
/// `cdf = P(X <= c)` and `sf = P(X > c)`. The smaller of the two is summed
/// directly and carries full relative accuracy even when it is far below
/// `1e-16`; the larger is `1 -` the smaller.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Tails {
    /// `P(X <= c)`.
    pub cdf: f64,
    /// `P(X > c)`.
    pub sf: f64,
}

impl Tails {
    pub(crate) const ALL_BELOW: Tails = Tails { cdf: 1.0, sf: 0.0 };
    pub(crate) const ALL_ABOVE: Tails = Tails { cdf: 0.0, sf: 1.0 };
}

/// What the tail summation needs of a distribution on the whole numbers.
pub(crate) trait Terms {
    /// `ln P(X = k)`; negative infinity outside the support.
    fn ln_pmf(&self, k: u64) -> f64;
    /// `P(X = k + 1) / P(X = k)` for `k` and `k + 1` in the support.
    fn ratio_up(&self, k: u64) -> f64;
    /// `P(X = k - 1) / P(X = k)` for `k - 1` and `k` in the support.
    fn ratio_down(&self, k: u64) -> f64;
    /// Smallest and largest value of the support (`u64::MAX` when unbounded).
    fn support(&self) -> (u64, u64);
    /// A mode of the distribution.
    fn mode(&self) -> u64;
}

/// Relative size below which the rest of a tail no longer changes the sum.
const NEGLIGIBLE: f64 = 1e-17;

/// `P(X <= c)` and `P(X > c)` for the distribution `d`.
pub(crate) fn tails<T: Terms>(d: &T, c: u64) -> Tails {
    let (lo, hi) = d.support();
    if c < lo {
        return Tails::ALL_ABOVE;
    }
    if c >= hi {
        return Tails::ALL_BELOW;
    }
    if c < d.mode() {
        let cdf = at_most_one((d.ln_pmf(c) + sum_down(d, c, lo).ln()).exp());
        Tails { cdf, sf: 1.0 - cdf }
    } else {
        let sf = at_most_one((d.ln_pmf(c + 1) + sum_up(d, c + 1, hi).ln()).exp());
        Tails { cdf: 1.0 - sf, sf }
    }
}

/// `x`, or 1 where rounding put a probability above 1. A NaN stays a NaN
/// (`f64::min` would turn it into 1, a quiet wrong answer), so that the
/// reports' numerical guard sees and refuses it.
pub(crate) fn at_most_one(x: f64) -> f64 {
    if x > 1.0 { 1.0 } else { x }
}

/// `sum_{k = lo}^{start} P(X = k) / P(X = start)` for `start` below the mode.
fn sum_down<T: Terms>(d: &T, start: u64, lo: u64) -> f64 {
    sum_outward(((lo + 1)..=start).rev().map(|k| d.ratio_down(k)))
}

/// `sum_{k = start}^{hi} P(X = k) / P(X = start)` for `start` above the mode.
fn sum_up<T: Terms>(d: &T, start: u64, hi: u64) -> f64 {
    sum_outward((start..hi).map(|k| d.ratio_up(k)))
}

/// `1 + r1 + r1 r2 + ...` over the ratios of successive terms, which fall
/// monotonically; stops once the geometric bound on the rest is negligible.
fn sum_outward(ratios: impl Iterator<Item = f64>) -> f64 {
    let mut sum = 1.0;
    let mut term = 1.0;
    for r in ratios {
        term *= r;
        sum += term;
        if r == 0.0 || (r < 1.0 && term * r / (1.0 - r) <= sum * NEGLIGIBLE) {
            break;
        }
    }
    sum
}
