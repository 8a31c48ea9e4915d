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

/// Expected number of units inspected by the single plan `(n, c)` under
/// fully curtailed inspection: stop and reject at the `(c + 1)`-th
/// nonconforming unit, stop and accept at the `(n - c)`-th conforming one.
///
/// ```text
/// E = (c + 1)/p P(Bin(n + 1, p) >= c + 2) + (n - c)/q P(Bin(n + 1, p) <= c)
/// ```
///
/// Derivation: the stopping time of the rejection is negative binomial, and
/// `k C(k - 1, c) = (c + 1) C(k, c + 1)` turns its truncated mean into a
/// binomial tail with one more unit; the same for the conforming units. The
/// rejection half is the textbook semi-curtailed formula (e.g. Montgomery,
/// *Introduction to Statistical Quality Control*, the section on curtailed
/// single sampling, from memory).
pub(crate) fn curtailed_sample_mean(n: u64, c: u64, p: f64) -> f64 {
    let q = 1.0 - p;
    let d = Binomial::new(n + 1, p);
    let reject_part = (c + 1) as f64 / p * super::tail::tails(&d, c + 1).sf;
    let accept_part = (n - c) as f64 / q * super::tail::tails(&d, c).cdf;
    reject_part + accept_part
}
