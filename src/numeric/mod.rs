//! Numerical building blocks shared by the variables models and designers:
//! adaptive quadrature, bracketed root finding, the guards that check
//! computed probabilities before they are reported, and the rounding of
//! computed values to the decimals they stand for.

mod decimal;
mod guard;
mod quadrature;
mod root;

pub(crate) use decimal::round_significant;
pub use guard::{NEAR_LIMIT, NumericalError, Quantity, Short, check, near_limit};
pub(crate) use quadrature::integrate;
pub(crate) use root::{brent, expand_bracket};
