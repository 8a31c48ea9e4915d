//! Approximate answers that start the exact searches.
//!
//! With `lambda_q(c)` the Poisson mean at which `P(X <= c) = q`, the Poisson
//! relation to the chi-square distribution gives
//! `lambda_q(c) = chi2_{2c+2}(1 - q) / 2`, and the Wilson–Hilferty cube-root
//! approximation gives the chi-square quantile in closed form:
//!
//! ```text
//! chi2_k(u) ~ k (1 - 2/(9k) + z_u sqrt(2/(9k)))^3
//! ```
//!
//! (E. B. Wilson and M. M. Hilferty, "The distribution of chi-square",
//! PNAS 17, 1931). These are guesses only: every answer is then found
//! exactly on the model's own probabilities, and a poor guess costs a few
//! more evaluations, never a wrong plan.

use crate::model::{ModelKind, normal};

/// `z` with `P(Z > z) = risk` for a standard normal `Z`: the quantile of
/// `1 - risk`, found from the upper tail itself. Taking `1 - risk` first
/// would round a risk below about `1e-16` to a quantile of 1 (an infinite
/// `z`, and a guess that calls every pair of points too close); the tail
/// keeps it finite down to the smallest risks a double holds (the
/// quantile of `5e-324` is about 38.5).
pub(crate) fn z_upper(risk: f64) -> f64 {
    normal::upper_quantile(risk)
}

/// `lambda` with `P(Poisson(lambda) <= c) = q`, approximately; `z_upper` is
/// the normal quantile of `1 - q`.
pub(crate) fn poisson_mean_at(c: u64, z_upper: f64) -> f64 {
    let k = 2.0 * (c as f64 + 1.0);
    let h = 2.0 / (9.0 * k);
    let root = (1.0 - h + z_upper * h.sqrt()).max(0.05);
    0.5 * k * root * root * root
}

/// Approximate sample size at which the expected count is `lambda` at
/// quality `p`. For the binomial the divisor `-ln(1 - p)` instead of `p`
/// makes `c = 0` exact (`(1 - p)^n = e^(-lambda)`); for a finite lot the
/// finite-population correction `n / (1 + (n - 1) / N)` is applied
/// (common practice).
pub(crate) fn sample_for_mean(lambda: f64, p: f64, kind: ModelKind, lot: Option<u64>) -> f64 {
    match kind {
        ModelKind::Poisson => lambda / p,
        ModelKind::Binomial => lambda / -(-p).ln_1p(),
        ModelKind::Hypergeometric => {
            let n = lambda / -(-p).ln_1p();
            let big_n = lot.unwrap_or(u64::MAX) as f64;
            n / (1.0 + (n - 1.0) / big_n)
        }
    }
}

/// Smallest `c` whose Poisson operating ratio `lambda_beta(c) / lambda_{1-alpha}(c)`
/// is at most `ratio` (Cameron's unity-value ratio, which falls as `c`
/// rises), or `None` when even `c_max` is not enough.
pub(crate) fn acceptance_number_for_ratio(
    ratio: f64,
    z_alpha: f64,
    z_beta: f64,
    c_max: u64,
) -> Option<u64> {
    let operating_ratio = |c: u64| poisson_mean_at(c, z_beta) / poisson_mean_at(c, -z_alpha);
    if operating_ratio(c_max) > ratio {
        return None;
    }
    let (mut lo, mut hi) = (0u64, c_max);
    if operating_ratio(0) <= ratio {
        return Some(0);
    }
    while hi - lo > 1 {
        let mid = lo + (hi - lo) / 2;
        if operating_ratio(mid) <= ratio {
            hi = mid;
        } else {
            lo = mid;
        }
    }
    Some(hi)
}

/// Dodge and Romig's AOQL factor `y_c = max_x x P(Poisson(x) <= c)`, the
/// `y` of `AOQL ≈ y / n (1 - n / N)`, approximately: the largest
/// `q lambda_q(c)` over `q = 0.05, 0.10, ..., 0.95`.
pub(crate) fn aoql_factor(c: u64) -> f64 {
    (1..20)
        .map(|i| {
            let q = f64::from(i) / 20.0;
            q * poisson_mean_at(c, z_upper(q))
        })
        .fold(0.0, f64::max)
}
