//! Numerical building blocks shared by the variables models and designers:
//! adaptive quadrature, bracketed root finding, the guards that check
//! computed probabilities before they are reported, and the rounding of
//! computed values to the decimals they stand for.

mod decimal;
mod format;
mod guard;
mod parse;
mod quadrature;
mod root;

pub(crate) use decimal::round_significant;
pub use format::{Short, format_quality, format_quality_cell, format_short, format_significant};
pub use guard::{NEAR_LIMIT, NumericalError, Quantity, check, near_limit};
pub use parse::{
    BARE_FRACTION_NOTE_ABOVE, MAX_RANGE_POINTS, QualityRange, bare_fraction_note, parse_count,
    parse_fraction, parse_fraction_list, parse_number,
};
pub(crate) use quadrature::integrate;
pub(crate) use root::{brent, expand_bracket};
