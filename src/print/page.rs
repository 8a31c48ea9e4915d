//! The paper a page is printed on, and the room its margins leave.

use super::geometry::Rect;

/// Paper sizes.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Paper {
    /// ISO A4, 210 x 297 mm.
    A4,
    /// US Letter, 215.9 x 279.4 mm.
    Letter,
}

impl Paper {
    /// Width and height, mm, upright.
    pub(crate) fn size(self) -> (f64, f64) {
        match self {
            Paper::A4 => (210.0, 297.0),
            Paper::Letter => (215.9, 279.4),
        }
    }

    /// The paper's name, as messages give it.
    pub fn name(self) -> &'static str {
        match self {
            Paper::A4 => "A4",
            Paper::Letter => "Letter",
        }
    }
}

/// The printable part of a `(pw, ph)` page inside a `margin` on every
/// side.
pub(crate) fn printable((pw, ph): (f64, f64), margin: f64) -> Rect {
    Rect::new(0.0, 0.0, pw, ph).inset(margin)
}

/// The gap between the blocks of a page, mm.
pub(crate) const GAP: f64 = 3.0;

/// The chart height below which a sheet is not printed: the curves and
/// their labels would no longer read.
pub(crate) const MIN_CHART_H: f64 = 50.0;
