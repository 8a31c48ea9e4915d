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

/// [`acceptance_number_for_ratio`] for a sample drawn from a finite lot of
/// `lot` units, where `ratio` and the normal quantiles are as there and
/// `p2` is the consumer's quality.
///
/// Drawn without replacement, the count's variance is that of the
/// binomial times the finite-population correction
/// `f = (N - n) / (N - 1) ~ 1 - n / N` (common practice), so the count
/// behaves as a Poisson count whose quantiles lie `sqrt(f)` times as many
/// standard deviations from its mean: the operating ratio is Cameron's
/// with `z sqrt(f)` in place of each `z`. The sample, and with it `f`,
/// depends on `c`: `n = lambda_beta(c) / -ln(1 - p2)`. The `f` that agrees
/// with the `n` it leads to is found by bisection on `[0, 1]` (`f - (1 -
/// n(f) / N)` rises with `f`: a larger `f` asks for a larger `c` and `n`);
/// iterating `f` directly swings between a whole-lot and a no-lot answer at
/// close points. At AQL 1.2% against RQL 1.25% in a lot of 10^6 this gives
/// `c = 3602` for the exact 3594, where the lot-free ratio gives 5085.
/// A guess only: `None` when even `c_max` is not enough.
pub(crate) fn acceptance_number_in_lot(
    ratio: f64,
    (z_alpha, z_beta): (f64, f64),
    p2: f64,
    lot: u64,
    c_max: u64,
) -> Option<u64> {
    let per_unit = -(-p2).ln_1p();
    let at = |f: f64| {
        let s = f.sqrt();
        let c = acceptance_number_for_ratio(ratio, z_alpha * s, z_beta * s, c_max)?;
        let n = poisson_mean_at(c, z_beta * s) / per_unit;
        Some((c, n))
    };
    let (mut lo, mut hi) = (0.0f64, 1.0f64);
    // 40 halvings leave f within 1e-12, far below what moves c by one.
    for _ in 0..40 {
        let mid = 0.5 * (lo + hi);
        // Beyond c_max at this f: the sample is then larger still, so f is
        // too large.
        let rises = at(mid).is_none_or(|(_, n)| mid > 1.0 - (n / lot as f64).min(1.0));
        if rises {
            hi = mid;
        } else {
            lo = mid;
        }
    }
    at(hi).map(|(c, _)| c)
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
