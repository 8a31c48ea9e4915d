//! A run of consecutive probabilities of one count distribution, with the
//! masses on either side of it, from which every tail inside the run follows
//! by addition.
//!
//! The staged-plan recursion asks, at each stage, for `P(X <= k)`,
//! `P(X > k)` and `P(X = k)` at a few neighbouring `k`. Two tail sums (one
//! below the run, one above it) and one saddle-point log-probability fix
//! them all: the terms inside the run come from the ratios of consecutive
//! probabilities, walking outward from the term nearest the mode so that no
//! term underflows before a larger one, and every tail is a sum of positive
//! terms. Neither `P(X <= k)` nor `P(X > k)` is ever formed as `1 -` the
//! other, so a small producer's risk keeps its relative accuracy.

use super::tail::{Terms, at_most_one, tails};

/// `P(X = k)` for `k` in `lo..=hi`, with `below = P(X < lo)` and
/// `above = P(X > hi)`; terms outside the distribution's support are left
/// out of the run (the run is clamped to the support).
///
/// The terms and both tails lie in one buffer (one allocation, and one
/// run of memory for the designers that read many windows).
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Window {
    lo: u64,
    /// Terms in the run.
    len: usize,
    /// `P(X = lo + i)` for `i = 0..len`, then `P(X <= lo + i - 1)` for
    /// `i = 0..=len`, then `P(X > lo + i - 1)` for `i = 0..=len`.
    terms: Vec<f64>,
}

impl Window {
    /// A point mass at zero (a count that cannot grow).
    pub(crate) fn at_zero() -> Self {
        Self::from_terms(0, vec![1.0], 0.0, 0.0)
    }

    /// Every count above any cut: a Poisson mean that overflows to
    /// infinity (a rate near the largest double times the units).
    pub(crate) fn beyond_every_count() -> Self {
        Self::from_terms(0, Vec::new(), 0.0, 1.0)
    }

    fn from_terms(lo: u64, mut terms: Vec<f64>, below: f64, above: f64) -> Self {
        let len = terms.len();
        terms.reserve(2 * len + 2);
        let mut acc = below;
        terms.push(acc);
        for i in 0..len {
            acc += terms[i];
            terms.push(at_most_one(acc));
        }
        let sf = terms.len();
        terms.resize(sf + len + 1, 0.0);
        let mut acc = above;
        terms[sf + len] = acc;
        for i in (0..len).rev() {
            acc += terms[i];
            terms[sf + i] = at_most_one(acc);
        }
        Window { lo, len, terms }
    }

    /// Index into the cuts for the cut `k`, clamped to the run.
    fn cut(&self, k: u64) -> usize {
        // k < lo - 1 is never asked except where the run was clamped to the
        // support, and there the clamped value is the right one.
        (k + 1).saturating_sub(self.lo).min(self.len as u64) as usize
    }

    /// `P(X <= k)`.
    pub(crate) fn cdf(&self, k: u64) -> f64 {
        self.terms[self.len + self.cut(k)]
    }

    /// `P(X > k)`.
    pub(crate) fn sf(&self, k: u64) -> f64 {
        self.terms[2 * self.len + 1 + self.cut(k)]
    }

    /// The run of terms: its first count and `P(X = k)` for the counts
    /// from there on (every count outside it has `P(X = k) = 0` as far as
    /// [`Window::pmf`] tells).
    pub(crate) fn run(&self) -> (u64, &[f64]) {
        (self.lo, &self.terms[..self.len])
    }

    /// `P(X = k)`.
    pub(crate) fn pmf(&self, k: u64) -> f64 {
        k.checked_sub(self.lo)
            .filter(|&i| i < self.len as u64)
            .map_or(0.0, |i| self.terms[i as usize])
    }
}

/// The window `lo..=hi` of `d` (clamped to its support); `lo = hi + 1`
/// gives the bare cut at `hi`.
pub(crate) fn window<T: Terms>(d: &T, lo: u64, hi: u64) -> Window {
    let (s_lo, s_hi) = d.support();
    let (a, b) = (lo.max(s_lo), hi.min(s_hi));
    if a > b {
        // No term of the support in the run: it is empty (`lo = hi + 1`, a
        // bare cut at `hi`) or lies wholly on one side of the support.
        let (below, above) = if lo > s_hi {
            (1.0, 0.0)
        } else if hi < s_lo {
            (0.0, 1.0)
        } else {
            let t = tails(d, hi);
            (t.cdf, t.sf)
        };
        return Window::from_terms(lo, Vec::new(), below, above);
    }
    let below = if a > s_lo { tails(d, a - 1).cdf } else { 0.0 };
    let above = if b < s_hi { tails(d, b).sf } else { 0.0 };
    let len = (b - a + 1) as usize;
    let mut pmf = vec![0.0; len];
    let k0 = d.mode().clamp(a, b);
    let i0 = (k0 - a) as usize;
    pmf[i0] = d.ln_pmf(k0).exp();
    for k in k0..b {
        let i = (k - a) as usize;
        pmf[i + 1] = pmf[i] * d.ratio_up(k);
    }
    for k in ((a + 1)..=k0).rev() {
        let i = (k - a) as usize;
        pmf[i - 1] = pmf[i] * d.ratio_down(k);
    }
    Window::from_terms(a, pmf, below, above)
}

/// The expected units of a curtailed stage from its two stopping parts:
/// `reject_part + accept_part(a) + m P(a < X < k)` with the acceptance
/// number left `a`, or `reject_part + m P(X < k)` for a stage that cannot
/// accept, where `X` is the stage count (`stage`). The parts are the
/// truncated means of the two stopping times (see the binomial and
/// hypergeometric `curtailed_stage_mean`).
pub(crate) fn curtailed_units<T: Terms>(
    stage: &T,
    m: u64,
    accept_left: Option<u64>,
    k: u64,
    reject_part: f64,
    accept_part: impl FnOnce(u64) -> f64,
) -> f64 {
    match accept_left {
        Some(a) => {
            let between = if k > a + 1 {
                let w = window(stage, a + 1, k - 1);
                (a + 1..k).map(|x| w.pmf(x)).sum::<f64>()
            } else {
                0.0
            };
            reject_part + accept_part(a) + m as f64 * between
        }
        None => reject_part + m as f64 * tails(stage, k - 1).cdf,
    }
}

#[cfg(test)]
mod tests {
    use super::super::binomial::Binomial;
    use super::super::poisson::Poisson;
    use super::*;

    #[test]
    fn window_tails_agree_with_direct_tails() {
        let d = Binomial::new(200, 0.03);
        let w = window(&d, 2, 11);
        for k in 1..=11 {
            let t = tails(&d, k);
            assert!((w.cdf(k) - t.cdf).abs() <= 1e-14 * t.cdf, "cdf {k}");
            assert!((w.sf(k) - t.sf).abs() <= 1e-14 * t.sf, "sf {k}");
        }
        let p = Poisson::new(0.4);
        let w = window(&p, 0, 3);
        let total: f64 = (0..=3).map(|k| w.pmf(k)).sum::<f64>() + w.sf(3);
        assert!((total - 1.0).abs() < 1e-15);
    }

    #[test]
    fn a_run_beyond_the_support_is_all_on_one_side() {
        let d = Binomial::new(1, 0.2);
        let w = window(&d, 3, 6);
        assert_eq!((w.cdf(4), w.sf(4), w.pmf(3)), (1.0, 0.0, 0.0));
        let w = window(&d, 0, 6);
        assert!((w.pmf(1) - 0.2).abs() < 1e-16 && w.sf(1) == 0.0 && w.cdf(6) == 1.0);
    }
}
