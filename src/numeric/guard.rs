//! Guards on computed numbers, by the kind of quantity each one is: a
//! probability and a fraction nonconforming must be finite and within
//! `[0, 1]`; a rate of nonconformities per unit and an amount (units, a
//! cost) finite and not negative, a rate possibly above 1. The reports check
//! every such number before anything is printed, so a numerical failure (a
//! NaN from an overflow, a tail summed past its range) stops the command
//! with a message instead of printing a wrong plan quietly.
//!
//! The kind is a value ([`Quantity`]) that goes with the number, and a
//! quality's kind comes from the model ([`Quantity::quality`]): a caller
//! cannot hold an AOQ of 1.4 nonconformities per unit to a probability's
//! range by choosing the wrong function.

use std::fmt::Display;

use thiserror::Error;

use super::format::Short;

/// What a computed number is, and so which values it may take.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Quantity {
    /// A probability: finite, within `[0, 1]`.
    Probability,
    /// A fraction nonconforming (a quality, AOQ or AOQL under the binomial
    /// or hypergeometric model): finite, within `[0, 1]`.
    Fraction,
    /// Nonconformities per unit (a quality, AOQ or AOQL under the Poisson
    /// model): finite and not negative; it may exceed 1.
    Rate,
    /// A number of units or a cost: finite and not negative.
    Amount,
}

impl Quantity {
    /// Whether `x` is a value of this kind, up to a rounding of `1e-12`.
    pub fn allows(self, x: f64) -> bool {
        x.is_finite()
            && x >= -ROUNDING
            && match self {
                Quantity::Probability | Quantity::Fraction => x <= 1.0 + ROUNDING,
                Quantity::Rate | Quantity::Amount => true,
            }
    }

    /// What a value of this kind must be, in words.
    pub fn expected(self) -> &'static str {
        match self {
            Quantity::Probability => "a probability (finite, between 0 and 1)",
            Quantity::Fraction => "a fraction nonconforming (finite, between 0 and 1)",
            Quantity::Rate => "a rate of nonconformities per unit (finite, not negative)",
            Quantity::Amount => "a finite number, not negative",
        }
    }
}

/// A computed number that its kind does not allow.
#[derive(Debug, Clone, PartialEq, Error)]
#[error(
    "numerical failure: {quantity} = {} is not {expected}; the result is withheld rather than printed wrong (please report the input that led here)",
    Short(*.value)
)]
pub struct NumericalError {
    /// What the number is, e.g. "Pa at quality 0.01".
    pub quantity: String,
    /// The value computed.
    pub value: f64,
    /// What it must be, in words.
    pub expected: &'static str,
}

/// Rounding allowed outside the range: a probability summed from terms or
/// found as `1 - x` can land a few units in the last place beyond its
/// range without being wrong.
const ROUNDING: f64 = 1e-12;

/// Checks that `x` is a value of `kind` (up to rounding of `1e-12`).
///
/// `quantity` is only written out when the check fails: a report of a
/// 500 x 500 grid checks over a million numbers, and naming each one up
/// front would cost more than solving the grid. Pass `format_args!` for a
/// name built from values.
///
/// # Errors
/// [`NumericalError`] naming `quantity` and what its kind allows.
///
/// # Example
/// ```
/// use lotsman::{Quantity, check};
/// // 1.44 nonconformities per unit is a rate, not a probability.
/// assert!(check(Quantity::Rate, "AOQ", 1.44).is_ok());
/// assert!(check(Quantity::Fraction, "AOQ", 1.44).is_err());
/// ```
pub fn check(kind: Quantity, quantity: impl Display, x: f64) -> Result<(), NumericalError> {
    if kind.allows(x) {
        return Ok(());
    }
    Err(NumericalError {
        quantity: quantity.to_string(),
        value: x,
        expected: kind.expected(),
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
    use crate::model::ModelKind;

    #[test]
    fn probabilities_outside_their_range_are_refused_with_their_name() {
        for p in [0.0, 1.0, 0.5, 1.0 + 1e-13, -1e-13] {
            assert!(check(Quantity::Probability, "Pa", p).is_ok(), "{p}");
        }
        for p in [f64::NAN, f64::INFINITY, -0.01, 1.001] {
            let e = check(Quantity::Probability, "Pa at quality 0.01", p).unwrap_err();
            assert!(e.to_string().contains("Pa at quality 0.01"), "{e}");
        }
        assert!(check(Quantity::Amount, "ATI", f64::NAN).is_err());
        assert!(check(Quantity::Amount, "ATI", 12.5).is_ok());
    }

    /// Issue 14, item 1: an AOQ of 1.44 nonconformities per unit is a rate;
    /// a fraction of 1.44 is a numerical failure.
    #[test]
    fn each_kind_keeps_its_own_range() {
        assert!(check(Quantity::Rate, "AOQ", 1.44).is_ok());
        assert!(check(Quantity::Rate, "AOQ", -0.5).is_err());
        assert!(check(Quantity::Rate, "AOQ", f64::INFINITY).is_err());
        let e = check(Quantity::Fraction, "AOQ", 1.44).unwrap_err();
        assert!(
            e.to_string().contains("is not a fraction nonconforming"),
            "{e}"
        );
        assert_eq!(Quantity::quality(ModelKind::Poisson), Quantity::Rate);
        assert_eq!(Quantity::quality(ModelKind::Binomial), Quantity::Fraction);
        assert_eq!(
            Quantity::quality(ModelKind::Hypergeometric),
            Quantity::Fraction
        );
    }

    #[test]
    fn near_limit_is_relative() {
        assert!(near_limit(0.05, 0.05));
        assert!(near_limit(0.05 * (1.0 - 5e-10), 0.05));
        assert!(!near_limit(0.0499, 0.05));
    }
}
