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

/// How one plan's curves are drawn on the charts of a comparison: colour,
/// width (points) and dash (points on and off, solid when `None`).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct CurveStyle {
    /// The line's colour.
    pub colour: Colour,
    /// The line's width, points.
    pub width: f64,
    /// The dash, points.
    pub dash: Option<f32>,
}

/// The lines of the plans of a comparison, in the order given. Each
/// differs from the others in its dash or its width as well as in its
/// hue, and the hues differ in lightness, so that the curves stay apart
/// on a page printed in grey: solid and thick, long dashes, dots, short
/// dashes, solid and thin, very long dashes.
pub const COMPARED: [CurveStyle; 6] = [
    CurveStyle {
        colour: PLAN,
        width: 1.5,
        dash: None,
    },
    CurveStyle {
        colour: rgb(0.85, 0.37, 0.0),
        width: 1.4,
        dash: Some(4.0),
    },
    CurveStyle {
        colour: rgb(0.0, 0.45, 0.2),
        width: 1.8,
        dash: Some(0.9),
    },
    CurveStyle {
        colour: rgb(0.55, 0.15, 0.6),
        width: 1.1,
        dash: Some(2.0),
    },
    CurveStyle {
        colour: rgb(0.0, 0.0, 0.0),
        width: 0.6,
        dash: None,
    },
    CurveStyle {
        colour: rgb(0.6, 0.45, 0.1),
        width: 1.0,
        dash: Some(7.0),
    },
];
