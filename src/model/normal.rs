//! The standard normal distribution: the model of a measured characteristic
//! in a variables plan, and the building block of the noncentral t.
//!
//! `Phi(x) = erfc(-x / sqrt 2) / 2`, with the `erfc` of the libm crate (a
//! port of musl's, after Sun's fdlibm: under one unit in the last place in
//! both tails). statrs 0.19's `erfc` is off by about `1e-10` relative
//! (`erfc(0.5)`), too coarse for a `1e-9` promise. Far in the lower tail `ln Phi(x)` comes from the asymptotic
//! series of Mills' ratio (Abramowitz and Stegun, *Handbook of Mathematical
//! Functions*, 26.2.12, from memory), because `Phi` itself underflows below
//! `x = -37.5`.

use libm::erfc;
use statrs::function::erf::erfc_inv;

/// `ln sqrt(2 pi)`.
const LN_SQRT_2PI: f64 = 0.918_938_533_204_672_8;

/// Below this, `ln Phi(x)` uses the asymptotic series: its first omitted
/// term, `10395 / x^12`, is under `2e-15` here, and `Phi(-37)` (about
/// `6e-300`) is still a normal binary64 number above it.
const SERIES_BELOW: f64 = -37.0;

/// `Phi(x)`, the lower tail.
pub fn cdf(x: f64) -> f64 {
    0.5 * erfc(-x / std::f64::consts::SQRT_2)
}

/// `1 - Phi(x) = Phi(-x)`, the upper tail, computed directly.
pub fn sf(x: f64) -> f64 {
    cdf(-x)
}

/// The density `phi(x) = exp(-x^2 / 2) / sqrt(2 pi)`.
pub fn density(x: f64) -> f64 {
    (-0.5 * x * x - LN_SQRT_2PI).exp()
}

/// `ln Phi(x)`, accurate where `Phi(x)` itself underflows.
///
/// For `x < -37`: `Phi(x) = phi(x)/|x| (1 - 1/x^2 + 3/x^4 - 15/x^6 + 105/x^8 - 945/x^10)`.
pub fn ln_cdf(x: f64) -> f64 {
    if x >= SERIES_BELOW {
        return cdf(x).ln();
    }
    let w = 1.0 / (x * x);
    let series = 1.0 - w * (1.0 - 3.0 * w * (1.0 - 5.0 * w * (1.0 - 7.0 * w * (1.0 - 9.0 * w))));
    -0.5 * x * x - LN_SQRT_2PI - (-x).ln() + series.ln()
}

/// The inverse Mills ratio `phi(x) / Phi(x)`: the derivative of
/// `ln Phi(x)`. For `x -> -inf` it tends to `-x`.
pub fn mills_inverse(x: f64) -> f64 {
    if x > SERIES_BELOW {
        density(x) / cdf(x)
    } else {
        (-0.5 * x * x - LN_SQRT_2PI - ln_cdf(x)).exp()
    }
}

/// The quantile `Phi^-1(u)` for `0 < u < 1`: statrs' `-sqrt 2 erfc^-1(2u)`
/// as a start, then one Newton step on the smaller tail of the accurate
/// `Phi`, which brings it to rounding whatever the start's error.
pub fn quantile(u: f64) -> f64 {
    let x = -std::f64::consts::SQRT_2 * erfc_inv(2.0 * u);
    if !x.is_finite() {
        return x;
    }
    // Newton on the lower tail for u <= 1/2, on the upper one above, so the
    // residual keeps its digits: d Phi / dx = phi.
    let residual = if u <= 0.5 {
        cdf(x) - u
    } else {
        (1.0 - u) - sf(x)
    };
    x - residual / density(x)
}

/// `z_p = Phi^-1(1 - p)`, the upper quantile: the distance, in standard
/// deviations, from the mean of a normal process to a limit beyond which
/// the fraction `p` lies. Computed as `-Phi^-1(p)` so that a small `p`
/// keeps its digits.
pub fn upper_quantile(p: f64) -> f64 {
    -quantile(p)
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    /// Values of Phi from Abramowitz and Stegun, Table 26.1 (from memory),
    /// and `Phi(-40)` from its series `phi(40)/40 (1 - 1/1600 + ...)`.
    #[test]
    fn tails_and_logs() {
        assert_relative_eq!(cdf(1.0), 0.841_344_746_068_542_9, max_relative = 1e-14);
        assert_relative_eq!(sf(3.0), 1.349_898_031_630_094_5e-3, max_relative = 1e-13);
        assert_relative_eq!(ln_cdf(-36.9), cdf(-36.9).ln(), max_relative = 1e-13);
        assert_relative_eq!(ln_cdf(-37.1), cdf(-37.1).ln(), max_relative = 1e-12);
        assert_relative_eq!(
            upper_quantile(0.05),
            1.644_853_626_951_472_2,
            max_relative = 1e-14
        );
        assert_relative_eq!(mills_inverse(-50.0), 50.0 + 1.0 / 50.0, max_relative = 1e-6);
    }
}
