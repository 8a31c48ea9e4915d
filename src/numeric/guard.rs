//! Guards on computed numbers: a probability must be finite and within
//! `[0, 1]`, a count of units finite and not negative. The reports check
//! every such number before anything is printed, so a numerical failure
//! (a NaN from an overflow, a tail summed past its range) stops the command
//! with a message instead of printing a wrong plan quietly.

use std::fmt::Display;

use thiserror::Error;

/// A computed number that its kind does not allow.
#[derive(Debug, Clone, PartialEq, Error)]
#[error(
    "numerical failure: {quantity} = {value} is not {expected}; the result is withheld rather than printed wrong (please report the input that led here)"
)]
pub struct NumericalError {
    /// What the number is, e.g. "Pa at quality 0.01".
    pub quantity: String,
    /// The value computed.
    pub value: f64,
    /// What it must be, in words.
    pub expected: &'static str,
}

/// Rounding allowed outside `[0, 1]`: a probability summed from terms or
/// found as `1 - x` can land a few units in the last place beyond its
/// range without being wrong.
const ROUNDING: f64 = 1e-12;

/// Checks that `p` is a probability (finite, within `[0, 1]` up to
/// rounding of `1e-12`).
///
/// `quantity` is only written out when the check fails: a report of a
/// 500 x 500 grid checks over a million numbers, and naming each one up
/// front would cost more than solving the grid. Pass `format_args!` for a
/// name built from values.
///
/// # Errors
/// [`NumericalError`] naming `quantity`.
pub fn check_probability(quantity: impl Display, p: f64) -> Result<(), NumericalError> {
    if p.is_finite() && (-ROUNDING..=1.0 + ROUNDING).contains(&p) {
        return Ok(());
    }
    Err(NumericalError {
        quantity: quantity.to_string(),
        value: p,
        expected: "a probability (finite, between 0 and 1)",
    })
}

/// Checks that `x` is finite and not negative (a number of units, a
/// quality, a cost); `quantity` is written out only on failure, as in
/// [`check_probability`].
///
/// # Errors
/// [`NumericalError`] naming `quantity`.
pub fn check_amount(quantity: impl Display, x: f64) -> Result<(), NumericalError> {
    if x.is_finite() && x >= -ROUNDING {
        return Ok(());
    }
    Err(NumericalError {
        quantity: quantity.to_string(),
        value: x,
        expected: "a finite number, not negative",
    })
}

/// Relative distance below which an achieved risk counts as on its limit:
/// the plan meets the point, but by less than the computation can vouch
/// for, and the report says so.
pub const NEAR_LIMIT: f64 = 1e-9;

/// Whether `achieved` lies within [`NEAR_LIMIT`] (relative) of `limit`.
pub fn near_limit(achieved: f64, limit: f64) -> bool {
    (achieved - limit).abs() <= NEAR_LIMIT * limit.abs()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn probabilities_outside_their_range_are_refused_with_their_name() {
        for p in [0.0, 1.0, 0.5, 1.0 + 1e-13, -1e-13] {
            assert!(check_probability("Pa", p).is_ok(), "{p}");
        }
        for p in [f64::NAN, f64::INFINITY, -0.01, 1.001] {
            let e = check_probability("Pa at quality 0.01", p).unwrap_err();
            assert!(e.to_string().contains("Pa at quality 0.01"), "{e}");
        }
        assert!(check_amount("ATI", f64::NAN).is_err());
        assert!(check_amount("ATI", 12.5).is_ok());
    }

    #[test]
    fn near_limit_is_relative() {
        assert!(near_limit(0.05, 0.05));
        assert!(near_limit(0.05 * (1.0 - 5e-10), 0.05));
        assert!(!near_limit(0.0499, 0.05));
    }
}
