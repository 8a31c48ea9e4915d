//! Estimates of a normal lot's fraction nonconforming from a sample: the
//! minimum-variance unbiased estimators that two-limit variables plans
//! compare with the maximum allowable fraction `M`.
//!
//! With the quality statistic `Q = (U - xbar) / sigma` (or `/ s`) against an
//! upper limit, and `(xbar - L) / ...` against a lower one:
//!
//! ```text
//! sigma known:    p_hat = 1 - Phi(Q sqrt(n / (n - 1)))                     (n >= 2)
//! sigma unknown:  p_hat = I_x(n/2 - 1, n/2 - 1),
//!                 x = max(0, min(1, 1/2 - Q sqrt(n) / (2 (n - 1))))        (n >= 3)
//! ```
//!
//! `I_x` is the regularised incomplete beta function. The second is the
//! estimator of G. J. Lieberman and G. J. Resnikoff ("Sampling plans for
//! inspection by variables", *JASA* 50, 1955); both from memory. The
//! two-limit estimate is the sum of the two one-sided ones.

use statrs::function::beta::beta_reg;

use crate::model::normal;
use crate::numeric::brent;

/// The MVU estimate of the fraction beyond one limit, sigma known, from
/// `q = (U - xbar) / sigma` (or `(xbar - L) / sigma`), sample of `n >= 2`.
pub fn fraction_beyond_known(q: f64, n: u64) -> f64 {
    let n = n as f64;
    normal::sf(q * (n / (n - 1.0)).sqrt())
}

/// The MVU estimate of the fraction beyond one limit, sigma unknown, from
/// `q = (U - xbar) / s` (or `(xbar - L) / s`), sample of `n >= 3`.
pub fn fraction_beyond_unknown(q: f64, n: u64) -> f64 {
    let b = n as f64 / 2.0 - 1.0;
    beta_reg(b, b, beta_argument(q, n))
}

/// `x = max(0, min(1, 1/2 - q sqrt(n) / (2 (n - 1))))`.
fn beta_argument(q: f64, n: u64) -> f64 {
    let nf = n as f64;
    (0.5 - q * nf.sqrt() / (2.0 * (nf - 1.0))).clamp(0.0, 1.0)
}

/// The quality statistic at which the one-sided estimate equals `m`
/// (`0 < m < 1/2`): the `k` of the one-limit plan equivalent to a
/// maximum allowable fraction `m`, since the estimate falls as `Q` rises.
pub fn statistic_for_fraction(m: f64, n: u64, sigma_known: bool) -> f64 {
    let nf = n as f64;
    if sigma_known {
        return normal::upper_quantile(m) * ((nf - 1.0) / nf).sqrt();
    }
    // I_x(b, b) rises from 0 at x = 0 to 1/2 at x = 1/2.
    let b = nf / 2.0 - 1.0;
    let x = brent(|x| beta_reg(b, b, x) - m, 0.0, 0.5, 1e-16).unwrap_or(0.0);
    (1.0 - 2.0 * x) * (nf - 1.0) / nf.sqrt()
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    /// For n = 4 the beta parameters are (1, 1), so the sigma-unknown
    /// estimate is x itself; the statistic for a fraction inverts it.
    #[test]
    fn uniform_case_and_inverse() {
        let q = 0.9;
        let expect = 0.5 - q * 2.0 / 6.0;
        assert_relative_eq!(fraction_beyond_unknown(q, 4), expect, max_relative = 1e-14);
        for (n, known) in [(5, true), (5, false), (40, false), (400, true)] {
            let k = statistic_for_fraction(0.02, n, known);
            let back = if known {
                fraction_beyond_known(k, n)
            } else {
                fraction_beyond_unknown(k, n)
            };
            assert_relative_eq!(back, 0.02, max_relative = 1e-10);
        }
    }
}
