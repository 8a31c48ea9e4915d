//! Numerical building blocks shared by the variables models and designers:
//! adaptive quadrature and bracketed root finding.

mod quadrature;
mod root;

pub(crate) use quadrature::integrate;
pub(crate) use root::{brent, expand_bracket};
