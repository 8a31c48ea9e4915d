//! Exact confidence intervals for a process average: the Clopper–Pearson
//! interval of a fraction nonconforming (binomial) and the exact Poisson
//! interval of nonconformities per unit, from the counts a ledger sums.
//!
//! ```text
//! Clopper–Pearson, x found in n inspected, level 1 - a:
//!   lower p_L: P(X >= x | n, p_L) = a/2   (p_L = 0 when x = 0)
//!   upper p_U: P(X <= x | n, p_U) = a/2   (p_U = 1 when x = n)
//! Exact Poisson, x nonconformities in u units:
//!   lower l_L: P(X >= x | l_L) = a/2      (l_L = 0 when x = 0)
//!   upper l_U: P(X <= x | l_U) = a/2
//!   rates l_L / u and l_U / u
//! ```
//!
//! (C. J. Clopper and E. S. Pearson, "The use of confidence or fiducial
//! limits illustrated in the case of the binomial", Biometrika 26(4),
//! 1934; the Poisson limits by the same tail inversion, Garwood,
//! Biometrika 28, 1936.) They equal the beta and gamma quantiles
//! `Beta(x, n - x + 1).ppf(a/2)`, `Beta(x + 1, n - x).ppf(1 - a/2)`,
//! `chi2(2x).ppf(a/2) / 2` and `chi2(2x + 2).ppf(1 - a/2) / 2`.
//!
//! Why not statrs' beta and gamma quantiles: they rest on its regularized
//! incomplete functions, which lose accuracy at large counts (see the
//! [model](super) docs: about `3e-8` at `n = 10^7`, and a ledger sums
//! millions of units). Each limit here is the root, by Brent's method, of
//! this crate's own binomial or Poisson tail, which keeps about `1e-13`
//! relative; the small tail is summed directly, so a limit near 0 keeps its
//! relative accuracy. The reference suite checks both against scipy
//! (tests/reference/interval.rs).

use serde::Serialize;

use super::binomial::Binomial;
use super::poisson::Poisson;
use super::tail::{Tails, tails};
use crate::input::InputError;
use crate::numeric::brent;

/// A two-sided confidence interval around an estimate.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Interval {
    /// The point estimate: found / inspected, or found / units.
    pub estimate: f64,
    /// The lower limit.
    pub lower: f64,
    /// The upper limit.
    pub upper: f64,
    /// The confidence level, e.g. 0.95.
    pub level: f64,
}

/// The Clopper–Pearson interval of the fraction nonconforming from
/// `found` nonconforming units in `inspected`, at confidence `level`
/// (two-sided, `a/2` in each tail).
///
/// ```
/// let i = lotsman::clopper_pearson(0, 50, 0.95).unwrap();
/// assert_eq!(i.lower, 0.0);
/// // scipy.stats.beta.ppf(0.975, 1, 50) = 0.07112173...
/// assert!((i.upper - 0.071_121_7).abs() < 1e-6);
/// ```
///
/// # Errors
/// [`InputError`] when `level` is not strictly between 0 and 1, no unit
/// was inspected, or more were found than inspected.
pub fn clopper_pearson(found: u64, inspected: u64, level: f64) -> Result<Interval, InputError> {
    let half = half_alpha(level)?;
    if inspected == 0 {
        return Err(InputError::out_of_range(
            "units inspected",
            0,
            "at least 1: no unit inspected gives no process average",
        ));
    }
    if found > inspected {
        return Err(InputError::Inconsistent(format!(
            "{found} nonconforming units found in {inspected} inspected: the count found cannot exceed the units inspected"
        )));
    }
    let tails_at = |p: f64, c: u64| {
        if p <= 0.0 {
            Tails::ALL_BELOW
        } else if p >= 1.0 {
            Tails::ALL_ABOVE
        } else {
            tails(&Binomial::new(inspected, p), c)
        }
    };
    let lower = if found == 0 {
        0.0
    } else {
        root(|p| tails_at(p, found - 1).sf - half, 0.0, 1.0)
    };
    let upper = if found == inspected {
        1.0
    } else {
        root(|p| half - tails_at(p, found).cdf, 0.0, 1.0)
    };
    #[allow(clippy::cast_precision_loss)]
    let estimate = found as f64 / inspected as f64;
    Ok(Interval {
        estimate,
        lower,
        upper,
        level,
    })
}

/// The exact Poisson interval of nonconformities per unit from `found`
/// nonconformities in `units` units inspected, at confidence `level`.
///
/// ```
/// let i = lotsman::poisson_rate_interval(0, 100, 0.95).unwrap();
/// assert_eq!(i.lower, 0.0);
/// // scipy.stats.chi2.ppf(0.975, 2) / 2 / 100 = ln(40) / 100
/// assert!((i.upper - 40f64.ln() / 100.0).abs() < 1e-12);
/// ```
///
/// # Errors
/// [`InputError`] when `level` is not strictly between 0 and 1 or no unit
/// was inspected.
pub fn poisson_rate_interval(found: u64, units: u64, level: f64) -> Result<Interval, InputError> {
    let half = half_alpha(level)?;
    if units == 0 {
        return Err(InputError::out_of_range(
            "units inspected",
            0,
            "at least 1: no unit inspected gives no process average",
        ));
    }
    let tails_at = |l: f64, c: u64| {
        if l <= 0.0 {
            Tails::ALL_BELOW
        } else {
            tails(&Poisson::new(l), c)
        }
    };
    #[allow(clippy::cast_precision_loss)]
    let (x, u) = (found as f64, units as f64);
    let lower = if found == 0 {
        0.0
    } else {
        root(|l| tails_at(l, found - 1).sf - half, 0.0, x)
    };
    // P(X <= x | l) falls below a/2 within x + 1 + 40 sqrt(x + 1) + 800
    // for every a/2 above 1e-300 (the Chernoff bound of the Poisson tail);
    // the bracket is widened if it does not.
    let mut high = x + 1.0 + 40.0 * (x + 1.0).sqrt() + 800.0;
    while tails_at(high, found).cdf > half && high < f64::MAX / 4.0 {
        high *= 2.0;
    }
    let upper = root(|l| half - tails_at(l, found).cdf, x, high);
    Ok(Interval {
        estimate: x / u,
        lower: lower / u,
        upper: upper / u,
        level,
    })
}

/// `(1 - level) / 2`, for a level strictly between 0 and 1.
fn half_alpha(level: f64) -> Result<f64, InputError> {
    if level > 0.0 && level < 1.0 {
        Ok((1.0 - level) / 2.0)
    } else {
        Err(InputError::out_of_range(
            "confidence level",
            level,
            "strictly between 0 and 1, e.g. 0.95",
        ))
    }
}

/// The root of the increasing `f` in `[a, b]`, to the last bits of the
/// root (Brent's tolerance `2 eps |root|`, so small limits keep their
/// relative accuracy). `f` changes sign on the bracket by construction;
/// without one, the nearer end.
fn root(mut f: impl FnMut(f64) -> f64, a: f64, b: f64) -> f64 {
    let fa = f(a);
    brent(&mut f, a, b, 0.0).unwrap_or(if fa >= 0.0 { a } else { b })
}
