//! The Poisson model: the count of nonconformities in a sample of `n` units
//! when the process makes `p` nonconformities per unit (`lambda = n p`).
//! It is also the usual approximation to the binomial for small `p`.
//!
//! ```text
//! P(X = k) = exp(-lambda) lambda^k / k!,   k = 0, 1, ...
//! ```

use super::saddle::ln_poisson_pmf;
use super::tail::Terms;

/// `Poisson(lambda)` with `lambda > 0`.
#[derive(Clone, Copy, Debug)]
pub(crate) struct Poisson {
    lambda: f64,
}

impl Poisson {
    pub(crate) fn new(lambda: f64) -> Self {
        Poisson { lambda }
    }
}

impl Terms for Poisson {
    fn ln_pmf(&self, k: u64) -> f64 {
        ln_poisson_pmf(k, self.lambda)
    }

    fn ratio_up(&self, k: u64) -> f64 {
        self.lambda / (k + 1) as f64
    }

    fn ratio_down(&self, k: u64) -> f64 {
        k as f64 / self.lambda
    }

    fn support(&self) -> (u64, u64) {
        (0, u64::MAX)
    }

    fn mode(&self) -> u64 {
        self.lambda.floor() as u64
    }
}

/// Stages longer than this, at qualities up to [`SMOOTH_QUALITY`], are
/// summed by Euler-Maclaurin instead of term by term.
const DIRECT_TERMS: u64 = 100_000;

/// Largest quality at which the Euler-Maclaurin form is used: there the
/// first omitted correction is of order `p^7`, far below rounding.
const SMOOTH_QUALITY: f64 = 1e-3;

/// Expected number of units inspected in one stage of `m` units when
/// inspection stops as soon as the stage's count reaches `reject_left`
/// (counts are added after each whole unit, each unit `Poisson(p)`).
///
/// ```text
/// E = sum_{t = 0}^{m - 1} g(t),   g(t) = P(Poisson(t p) <= k - 1),   k = reject_left
/// ```
///
/// (the `t`-th unit is inspected when the first `t` have not yet reached the
/// rejection number). A unit may carry any number of nonconformities, so
/// acceptance is never certain before the last unit and only rejection is
/// curtailed.
///
/// Up to [`DIRECT_TERMS`] terms (or for `p` above [`SMOOTH_QUALITY`]) the sum
/// is taken term by term, stopping when a geometric bound on the rest is
/// below `1e-17` of it. Longer stages at small `p` use the Euler-Maclaurin
/// formula with three corrections; `g` is smooth on the scale of one unit,
/// its integral has a closed form and its derivatives are differences of
/// Poisson probabilities:
///
/// ```text
/// int_0^m g = (X P(Poisson(X) <= k - 1) + k P(Poisson(X) >= k + 1)) / p,   X = m p
/// g^(2i-1)(t) = -p^(2i-1) (d/dx)^(2i-2) P(Poisson(x) = k - 1) at x = t p
/// E = int_0^m g + (g(0) - g(m)) / 2 + sum_i B_2i / (2i)! (g^(2i-1)(m) - g^(2i-1)(0))
/// ```
///
/// (the integral is `E[min(G, X)] / p` for `G ~ Gamma(k)`; Abramowitz and
/// Stegun, *Handbook of Mathematical Functions*, 23.1.30 for the formula).
pub(crate) fn curtailed_stage_mean(m: u64, reject_left: u64, p: f64) -> f64 {
    let k = reject_left;
    if m > DIRECT_TERMS && p <= SMOOTH_QUALITY {
        return euler_maclaurin(m, k, p);
    }
    let mut sum = 0.0;
    for t in 0..m {
        let lambda = t as f64 * p;
        let term = if t == 0 {
            1.0
        } else {
            super::tail::tails(&Poisson::new(lambda), k - 1).cdf
        };
        sum += term;
        // Consecutive terms have the ratio
        // exp(-p) sum (lambda + p)^i / i! / sum lambda^i / i!
        // <= exp(-p (1 - (k - 1) / lambda)), at most exp(-p / 2) once
        // lambda >= 2k: the rest is below term / (1 - exp(-p / 2)).
        if lambda >= 2.0 * k as f64 && term / -(-0.5 * p).exp_m1() <= 1e-17 * sum {
            break;
        }
    }
    sum
}

/// The Euler-Maclaurin form of [`curtailed_stage_mean`].
fn euler_maclaurin(m: u64, k: u64, p: f64) -> f64 {
    let x = m as f64 * p;
    let at_end = Poisson::new(x);
    let w = super::window::window(&at_end, k.saturating_sub(5), k + 1);
    let integral = (x * w.cdf(k - 1) + k as f64 * w.sf(k)) / p;
    let g_end = w.cdf(k - 1);
    // (d/dx)^s P(Poisson(x) = j) = sum_i C(s, i) (-1)^(s - i) P(Poisson(x) = j - i).
    let derivative = |s: u64, pmf: &dyn Fn(u64) -> f64| -> f64 {
        (0..=s.min(k - 1))
            .map(|i| {
                let sign = if (s - i).is_multiple_of(2) { 1.0 } else { -1.0 };
                sign * choose(s, i) * pmf(k - 1 - i)
            })
            .sum()
    };
    let pmf_end = |j: u64| w.pmf(j);
    let pmf_start = |j: u64| if j == 0 { 1.0 } else { 0.0 };
    // B_2 / 2!, B_4 / 4!, B_6 / 6!.
    let weights = [1.0 / 12.0, -1.0 / 720.0, 1.0 / 30240.0];
    let corrections: f64 = weights
        .iter()
        .enumerate()
        .map(|(i, b)| {
            let order = 2 * i as u64 + 1;
            let scale = -p.powi(order as i32);
            let d_end = scale * derivative(order - 1, &pmf_end);
            let d_start = scale * derivative(order - 1, &pmf_start);
            b * (d_end - d_start)
        })
        .sum();
    integral + 0.5 * (1.0 - g_end) + corrections
}

fn choose(n: u64, k: u64) -> f64 {
    (0..k).fold(1.0, |acc, i| acc * (n - i) as f64 / (i + 1) as f64)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn euler_maclaurin_agrees_with_the_direct_sum() {
        // A stage just long enough for both forms to be cheap.
        for &(m, k, p) in &[
            (150_000u64, 3u64, 2e-5),
            (120_000, 1, 1e-5),
            (200_000, 12, 1e-4),
        ] {
            let mut direct = 0.0;
            for t in 0..m {
                direct += if t == 0 {
                    1.0
                } else {
                    super::super::tail::tails(&Poisson::new(t as f64 * p), k - 1).cdf
                };
            }
            let em = euler_maclaurin(m, k, p);
            assert!(
                (em - direct).abs() <= 1e-11 * direct,
                "{m} {k} {p}: {em} vs {direct}"
            );
        }
    }
}
