//! The plotting area of a chart in its box, with the scale from data to
//! page, and the curves and zones drawn in data units.

use crate::print::canvas::Canvas;
use crate::print::draw::Colour;
use crate::print::geometry::{Point, Rect};

/// The plotting area of a chart in its box, with the scale from data to
/// page.
#[derive(Clone, Copy, Debug)]
pub struct Plot {
    /// The chart's whole box.
    pub area: Rect,
    /// Left edge of the plotting area inside it, mm.
    pub left: f64,
    /// Bottom edge of the plotting area, mm.
    pub bottom: f64,
    /// Right edge of the plotting area, mm.
    pub right: f64,
    /// Top edge of the plotting area, mm.
    pub top: f64,
    x_max: f64,
    y_max: f64,
}

impl Plot {
    /// The plot of data `0..=x_max` by `0..=y_max` in the box `area`,
    /// leaving room for the title, the tick labels and the axis labels.
    pub fn new(area: Rect, x_max: f64, y_max: f64) -> Self {
        let Rect { x, y, w, h } = area;
        Plot {
            area,
            left: x + 13.0,
            bottom: y + 11.0,
            right: x + w - 3.0,
            top: y + h - 12.0,
            x_max,
            y_max,
        }
    }

    /// Page x of data x.
    pub fn sx(&self, v: f64) -> f64 {
        self.left + v / self.x_max * (self.right - self.left)
    }

    /// Page y of data y.
    pub fn sy(&self, v: f64) -> f64 {
        self.bottom + v / self.y_max * (self.top - self.bottom)
    }

    /// The page point of a data point, held inside the plot vertically.
    pub fn at(&self, (a, b): Point) -> Point {
        (self.sx(a), self.sy(b.min(self.y_max)))
    }

    /// The page points of data points.
    pub fn page(&self, pts: &[Point]) -> Vec<Point> {
        pts.iter().map(|&p| self.at(p)).collect()
    }

    /// A line through data points.
    pub fn curve(
        &self,
        c: &mut Canvas,
        pts: &[Point],
        thickness: f64,
        colour: Colour,
        dash: Option<f32>,
    ) {
        c.line(&self.page(pts), thickness, colour, dash);
    }

    /// A filled area bounded by data points.
    pub fn zone(&self, c: &mut Canvas, pts: &[Point], colour: Colour) {
        c.fill(&self.page(pts), colour);
    }
}
