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
