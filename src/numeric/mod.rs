//! Numerical building blocks shared by the variables models and designers:
//! adaptive quadrature, bracketed root finding, and the guards that check
//! computed probabilities before they are reported.

mod guard;
mod quadrature;
mod root;

pub use guard::{NEAR_LIMIT, NumericalError, check_amount, check_probability, near_limit};
pub(crate) use quadrature::integrate;
pub(crate) use root::{brent, expand_bracket};
