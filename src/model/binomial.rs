//! The binomial model: the count of nonconforming units in a sample of `n`
//! drawn from a process (or an infinite lot) running at fraction
//! nonconforming `p`.
//!
//! ```text
//! P(X = k) = C(n, k) p^k (1 - p)^(n - k),   k = 0..n
//! ```

use super::saddle::ln_binomial_pmf;
use super::tail::Terms;

/// `Binomial(n, p)` with `0 < p < 1`.
#[derive(Clone, Copy, Debug)]
pub(crate) struct Binomial {
    n: u64,
    p: f64,
    q: f64,
    odds: f64,
}

impl Binomial {
    pub(crate) fn new(n: u64, p: f64) -> Self {
        let q = 1.0 - p;
        Binomial {
            n,
            p,
            q,
            odds: p / q,
        }
    }
}

impl Terms for Binomial {
    fn ln_pmf(&self, k: u64) -> f64 {
        ln_binomial_pmf(k, self.n, self.p, self.q)
    }

    fn ratio_up(&self, k: u64) -> f64 {
        (self.n - k) as f64 / (k + 1) as f64 * self.odds
    }

    fn ratio_down(&self, k: u64) -> f64 {
        k as f64 / (self.n - k + 1) as f64 / self.odds
    }

    fn support(&self) -> (u64, u64) {
        (0, self.n)
    }

    fn mode(&self) -> u64 {
        (((self.n as f64) + 1.0) * self.p)
            .floor()
            .min(self.n as f64) as u64
    }
}

/// Expected number of units inspected in one stage of `m` units under fully
/// curtailed inspection, for a lot that enters the stage needing
/// `reject_left` more nonconforming units to be rejected and allowing
/// `accept_left` more to be accepted at the stage's end (`None`: the stage
/// cannot accept). Inspection stops at the `reject_left`-th nonconforming
/// unit, or as soon as the conforming units reach `m - accept_left` (the
/// count can no longer pass the acceptance number), or after `m` units.
///
/// With `X_j ~ Bin(j, p)`, `k = reject_left`, `a = accept_left`:
///
/// ```text
/// E = k/p P(X_{m+1} >= k + 1) + (m - a)/q P(X_{m+1} <= a) + m P(a < X_m < k)
/// ```
///
/// (without acceptance the middle term is `m P(X_m < k)` and the second is
/// absent). Derivation: the stopping time of the rejection is negative
/// binomial, and `t C(t - 1, k - 1) = k C(t, k)` turns its truncated mean into
/// a binomial tail with one more unit; the same for the conforming units;
/// the two stops exclude each other because `a < k`, and a lot reaching
/// neither inspects all `m`. For a single plan this is the textbook fully
/// curtailed ASN, whose rejection half is the semi-curtailed formula (e.g.
/// Montgomery, *Introduction to Statistical Quality Control*, the section on
/// curtailed single sampling, from memory).
pub(crate) fn curtailed_stage_mean(
    m: u64,
    accept_left: Option<u64>,
    reject_left: u64,
    p: f64,
) -> f64 {
    let k = reject_left;
    if accept_left.is_some_and(|a| a >= m) {
        // Acceptance is certain before the first unit of the stage.
        return 0.0;
    }
    let q = 1.0 - p;
    let one_more = Binomial::new(m + 1, p);
    // sf / p before k: the tail is about C(m + 1, k + 1) p^(k + 1), so the
    // ratio stays finite, where 1 / p alone overflows for a subnormal p
    // (1e-310) and times a tail of 0 gives NaN.
    let reject_part = k as f64 * (super::tail::tails(&one_more, k).sf / p);
    let stage = Binomial::new(m, p);
    super::window::curtailed_units(&stage, m, accept_left, k, reject_part, |a| {
        (m - a) as f64 / q * super::tail::tails(&one_more, a).cdf
    })
}
