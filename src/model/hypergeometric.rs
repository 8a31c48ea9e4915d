//! The hypergeometric model: the count of nonconforming units in a sample of
//! `n` drawn without replacement from a lot of `N` units of which `D` are
//! nonconforming.
//!
//! ```text
//! P(X = k) = C(D, k) C(N - D, n - k) / C(N, n),   max(0, n - N + D) <= k <= min(n, D)
//! ```
//!
//! The log-probability is the ratio of three binomial terms at `p = n / N`,
//! `b(k; D, p) b(n - k; N - D, p) / b(n; N, p)`, each in Loader's saddle-point
//! form, so that no log-gamma of size `N ln N` is ever subtracted.

use super::saddle::ln_binomial_pmf;
use super::tail::Terms;

/// `Hypergeometric(N, D, n)` with `D <= N` and `n <= N`.
#[derive(Clone, Copy, Debug)]
pub(crate) struct Hypergeometric {
    lot: u64,
    bad: u64,
    sample: u64,
}

impl Hypergeometric {
    pub(crate) fn new(lot: u64, bad: u64, sample: u64) -> Self {
        debug_assert!(bad <= lot && sample <= lot);
        Hypergeometric { lot, bad, sample }
    }
}

/// The number of nonconforming units in a lot of `lot` units at quality `p`:
/// `D = round(p N)`, halves rounded up, clamped to `0..=N`.
///
/// A lot holds a whole number of nonconforming units, so the quality of a
/// finite lot is always `D / N`. The product `p N` is formed in binary and
/// may land a hair off the decimal the user meant (`0.07 * 100` is
/// `7.000000000000001`, `0.29 * 50` is `14.499999999999998`), so a relative
/// allowance of `1e-9` is added before rounding: the first means 7, the
/// second 14.5, which rounds up to 15.
///
/// ```text
/// D = floor(p N + 0.5 + 1e-9 max(1, p N))
/// ```
pub fn nonconforming_in_lot(p: f64, lot: u64) -> u64 {
    let x = p * lot as f64;
    let d = (x + 0.5 + 1e-9 * x.max(1.0)).floor();
    (d.max(0.0) as u64).min(lot)
}

impl Terms for Hypergeometric {
    fn ln_pmf(&self, k: u64) -> f64 {
        let (lo, hi) = self.support();
        if k < lo || k > hi {
            return f64::NEG_INFINITY;
        }
        let total = self.lot as f64;
        let p = self.sample as f64 / total;
        let q = (self.lot - self.sample) as f64 / total;
        ln_binomial_pmf(k, self.bad, p, q)
            + ln_binomial_pmf(self.sample - k, self.lot - self.bad, p, q)
            - ln_binomial_pmf(self.sample, self.lot, p, q)
    }

    fn ratio_up(&self, k: u64) -> f64 {
        let num = (self.bad - k) as f64 * (self.sample - k) as f64;
        // Good units left out of the sample: N - D - (n - k), ordered so that
        // no intermediate goes below zero inside the support.
        let den = (k + 1) as f64 * (self.lot - self.bad + k + 1 - self.sample) as f64;
        num / den
    }

    fn ratio_down(&self, k: u64) -> f64 {
        let num = k as f64 * (self.lot - self.bad + k - self.sample) as f64;
        let den = (self.bad - k + 1) as f64 * (self.sample - k + 1) as f64;
        num / den
    }

    fn support(&self) -> (u64, u64) {
        let good = self.lot - self.bad;
        (self.sample.saturating_sub(good), self.sample.min(self.bad))
    }

    fn mode(&self) -> u64 {
        let m = (self.sample as f64 + 1.0) * (self.bad as f64 + 1.0) / (self.lot as f64 + 2.0);
        let (lo, hi) = self.support();
        (m.floor() as u64).clamp(lo, hi)
    }
}

/// Expected number of units inspected in one stage of `m` units drawn from
/// what is left of the lot, `lot` units holding `bad` nonconforming ones,
/// under fully curtailed inspection; `accept_left` and `reject_left` as for
/// the binomial (`binomial::curtailed_stage_mean`).
///
/// With `H(L, B, j)` the count in `j` units drawn from `L` holding `B`:
///
/// ```text
/// E = k (L + 1)/(B + 1) P(H(L + 1, B + 1, m + 1) >= k + 1)
///   + (m - a)(L + 1)/(L - B + 1) P(H(L + 1, B, m + 1) <= a)
///   + m P(a < H(L, B, m) < k)
/// ```
///
/// Derivation as for the binomial: the stopping position is negative
/// hypergeometric, and `t C(t - 1, k - 1) = k C(t, k)` turns its truncated
/// mean into a tail of a lot with one more unit of each kind.
pub(crate) fn curtailed_stage_mean(
    lot: u64,
    bad: u64,
    m: u64,
    accept_left: Option<u64>,
    reject_left: u64,
) -> f64 {
    let k = reject_left;
    if accept_left.is_some_and(|a| a >= m) {
        return 0.0;
    }
    let stage = Hypergeometric::new(lot, bad, m);
    let rejecting = Hypergeometric::new(lot + 1, bad + 1, m + 1);
    let reject_part =
        k as f64 * (lot + 1) as f64 / (bad + 1) as f64 * super::tail::tails(&rejecting, k).sf;
    super::window::curtailed_units(&stage, m, accept_left, k, reject_part, |a| {
        let accepting = Hypergeometric::new(lot + 1, bad, m + 1);
        (m - a) as f64 * (lot + 1) as f64 / (lot - bad + 1) as f64
            * super::tail::tails(&accepting, a).cdf
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn lot_count_rounds_half_up_and_absorbs_binary_noise() {
        assert_eq!(nonconforming_in_lot(0.07, 100), 7); // 7.000000000000001
        assert_eq!(nonconforming_in_lot(0.015, 100), 2); // 1.5 rounds up
        assert_eq!(nonconforming_in_lot(0.0149, 100), 1);
        assert_eq!(nonconforming_in_lot(0.0151, 100), 2);
        assert_eq!(nonconforming_in_lot(0.004, 100), 0);
        assert_eq!(nonconforming_in_lot(0.005, 100), 1);
        assert_eq!(nonconforming_in_lot(0.999_999, 100), 100);
        assert_eq!(nonconforming_in_lot(0.29, 50), 15); // 14.499999999999998 means 14.5
    }

    #[test]
    fn pmf_sums_to_one_over_the_support() {
        for &(lot, bad, sample) in &[
            (50u64, 5u64, 10u64),
            (1000, 40, 125),
            (20, 19, 7),
            (30, 3, 30),
        ] {
            let h = Hypergeometric::new(lot, bad, sample);
            let (lo, hi) = h.support();
            let s: f64 = (lo..=hi).map(|k| h.ln_pmf(k).exp()).sum();
            assert!((s - 1.0).abs() < 1e-13, "{lot} {bad} {sample}: {s}");
        }
    }
}
