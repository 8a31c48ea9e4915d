//! Saddle-point expansions for the logarithm of binomial and Poisson
//! probabilities.
//!
//! The naive form `ln C(n, k) + k ln p + (n - k) ln q` subtracts log-gammas of
//! size `n ln n`: at `n = 10^7` that is about `1.5e8`, so one rounding error of
//! the subtraction already costs a relative error near `3e-8` in the
//! probability. Loader's rearrangement keeps every term small:
//!
//! ```text
//! ln b(k; n, p) = stirlerr(n) - stirlerr(k) - stirlerr(n - k)
//!                 - bd0(k, n p) - bd0(n - k, n q)
//!                 - 0.5 ln(2 pi k (n - k) / n)
//! ```
//!
//! where `stirlerr(m) = ln m! - ln(sqrt(2 pi m) (m/e)^m)` is the error of
//! Stirling's formula and `bd0(x, m) = x ln(x/m) + m - x >= 0` is the
//! deviance term, evaluated by a series when `x` is close to `m` (where the
//! direct form cancels).
//!
//! Source: C. Loader, "Fast and Accurate Computation of Binomial
//! Probabilities" (2000), sections 2 and 3.

use std::f64::consts::PI;

/// `ln(2 pi)`.
const LN_2PI: f64 = 1.837_877_066_409_345_5;

/// `stirlerr(m)` for a whole number `m >= 0`.
///
/// For `m <= 15` it is computed from the exact factorial (exact in `f64` up to
/// `22!`), where the subtraction loses no more than about `1e-15` absolute; the
/// asymptotic series of Loader (2000, eq. 3) takes over above, with as many
/// terms as the argument needs for full double precision.
pub(crate) fn stirlerr(m: u64) -> f64 {
    const S0: f64 = 1.0 / 12.0;
    const S1: f64 = 1.0 / 360.0;
    const S2: f64 = 1.0 / 1260.0;
    const S3: f64 = 1.0 / 1680.0;
    const S4: f64 = 1.0 / 1188.0;
    if m == 0 {
        // ln 0! = 0 and the Stirling term tends to 0 as m -> 0; the callers
        // never combine it with a zero argument elsewhere.
        return 0.0;
    }
    let x = m as f64;
    if m <= 15 {
        let factorial: f64 = (1..=m).map(|i| i as f64).product();
        return factorial.ln() - (x + 0.5) * x.ln() + x - 0.5 * LN_2PI;
    }
    let xx = x * x;
    if m > 500 {
        (S0 - S1 / xx) / x
    } else if m > 80 {
        (S0 - (S1 - S2 / xx) / xx) / x
    } else if m > 35 {
        (S0 - (S1 - (S2 - S3 / xx) / xx) / xx) / x
    } else {
        (S0 - (S1 - (S2 - (S3 - S4 / xx) / xx) / xx) / xx) / x
    }
}

/// The deviance term `bd0(x, m) = x ln(x / m) + m - x`, for `x >= 0`, `m > 0`.
///
/// When `|x - m| < 0.1 (x + m)` the direct form cancels badly, so it is
/// summed as the series `(x - m) v + 2 x sum_j v^(2j+1) / (2j + 1)` with
/// `v = (x - m) / (x + m)` (Loader 2000, section 3).
pub(crate) fn bd0(x: f64, m: f64) -> f64 {
    if (x - m).abs() < 0.1 * (x + m) {
        let v = (x - m) / (x + m);
        let v2 = v * v;
        let mut s = (x - m) * v;
        let mut ej = 2.0 * x * v;
        let mut j = 1.0;
        loop {
            ej *= v2;
            let next = s + ej / (2.0 * j + 1.0);
            if next == s {
                return next;
            }
            s = next;
            j += 1.0;
        }
    }
    if x == 0.0 {
        return m;
    }
    // x / m overflows for a subnormal m (a quality of 1e-310): then the
    // logarithm is taken as a difference, which is exact enough there
    // (ln(x / m) is above 700 and the rounding of each term is relative).
    let ratio = x / m;
    let log_ratio = if ratio.is_finite() {
        ratio.ln()
    } else {
        x.ln() - m.ln()
    };
    x * log_ratio + m - x
}

/// `ln P(X = k)` for `X ~ Binomial(n, p)`, with `q = 1 - p` passed separately
/// so that callers holding an exact complement (such as `(N - n) / N`) keep it.
///
/// Returns negative infinity outside the support.
pub(crate) fn ln_binomial_pmf(k: u64, n: u64, p: f64, q: f64) -> f64 {
    if k > n {
        return f64::NEG_INFINITY;
    }
    if p == 0.0 {
        return if k == 0 { 0.0 } else { f64::NEG_INFINITY };
    }
    if q == 0.0 {
        return if k == n { 0.0 } else { f64::NEG_INFINITY };
    }
    let nf = n as f64;
    if k == 0 {
        // n ln q, with ln q taken from p when q is the rounded one.
        return nf * if p < 0.5 { (-p).ln_1p() } else { q.ln() };
    }
    if k == n {
        return nf * if q < 0.5 { (-q).ln_1p() } else { p.ln() };
    }
    let kf = k as f64;
    let rest = nf - kf;
    let lc = stirlerr(n) - stirlerr(k) - stirlerr(n - k) - bd0(kf, nf * p) - bd0(rest, nf * q);
    let lf = LN_2PI + kf.ln() + (-kf / nf).ln_1p();
    lc - 0.5 * lf
}

/// `ln P(X = k)` for `X ~ Poisson(lambda)`, `lambda > 0`.
pub(crate) fn ln_poisson_pmf(k: u64, lambda: f64) -> f64 {
    if k == 0 {
        return -lambda;
    }
    let kf = k as f64;
    -stirlerr(k) - bd0(kf, lambda) - 0.5 * (2.0 * PI * kf).ln()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn stirlerr_matches_its_definition_where_both_are_accurate() {
        // ln m! from the exact factorial; the series must agree at m = 16..20
        // (exact factorials up to 20! fit in f64 with rounding below 1e-16).
        for m in 16u64..=20 {
            let x = m as f64;
            let factorial: f64 = (1..=m).map(|i| i as f64).product();
            let direct = factorial.ln() - (x + 0.5) * x.ln() + x - 0.5 * LN_2PI;
            assert!((stirlerr(m) - direct).abs() < 2e-14, "m = {m}");
        }
    }

    #[test]
    fn bd0_is_continuous_across_the_switch_to_the_series() {
        // The switch is at |x - m| = 0.1 (x + m), i.e. x = m * 11/9; just
        // below it the series is used, just above the direct form.
        let m: f64 = 1000.0;
        let edge = m * 11.0 / 9.0;
        let below = bd0(edge * (1.0 - 1e-10), m);
        let above = bd0(edge * (1.0 + 1e-10), m);
        assert!((below - above).abs() / above < 1e-8, "{below} vs {above}");
        // x ln(x/m) + m - x at x = 1.2 m, by the direct form in f64, where it
        // loses only a digit to cancellation.
        let x = 1.2 * m;
        assert!((bd0(x, m) - (x * (x / m).ln() + m - x)).abs() < 1e-11 * m);
    }

    /// Issue 14, item 4: at a subnormal quality the mean n p is subnormal
    /// too, and x / (n p) overflows; P(X = 1) for n = 4, p = 1e-310 is
    /// 4 p (1 - p)^3 = 4e-310 (hand computation), not 0.
    #[test]
    fn a_subnormal_quality_keeps_its_probabilities() {
        let p = 1e-310;
        let pmf = ln_binomial_pmf(1, 4, p, 1.0 - p).exp();
        assert!((pmf - 4e-310).abs() <= 1e-323, "{pmf:e}");
        let poisson = ln_poisson_pmf(1, 4.0 * p).exp();
        assert!((poisson - 4e-310).abs() <= 1e-323, "{poisson:e}");
    }

    #[test]
    fn binomial_pmf_sums_to_one() {
        for &(n, p) in &[(10u64, 0.3), (200, 0.01), (1000, 0.5), (57, 0.97)] {
            let s: f64 = (0..=n)
                .map(|k| ln_binomial_pmf(k, n, p, 1.0 - p).exp())
                .sum();
            assert!((s - 1.0).abs() < 1e-13, "n = {n}, p = {p}: {s}");
        }
    }

    #[test]
    fn poisson_pmf_sums_to_one() {
        for &lambda in &[0.01, 1.0, 17.5, 400.0] {
            let s: f64 = (0..5000).map(|k| ln_poisson_pmf(k, lambda).exp()).sum();
            assert!((s - 1.0).abs() < 1e-13, "lambda = {lambda}: {s}");
        }
    }
}
