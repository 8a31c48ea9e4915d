//! The colours the sheet and its charts share: green for accepting, red
//! for rejecting, and the plan's blue (the plan box's rule and the curves
//! of the plan).

use super::draw::{Colour, rgb};

/// Accepting: decisions, acceptance numbers, the accept zone's bound.
pub const ACCEPT: Colour = rgb(0.0, 0.4, 0.1);

/// Rejecting: decisions, rejection numbers, the notice of a plan printed
/// as recorded.
pub const REJECT: Colour = rgb(0.6, 0.1, 0.05);

/// The plan's blue: the plan box's rule and every curve of the plan.
pub const PLAN: Colour = rgb(0.05, 0.25, 0.55);
