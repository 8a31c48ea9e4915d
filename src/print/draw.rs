//! The drawing backend: the few operations a page or a chart is made of,
//! apart from where they go. Layout (blocks, charts, the map's panels)
//! decides positions and sizes through a canvas (`print/canvas.rs`),
//! which measures text with the embedded fonts' metrics (the same for
//! every backend) and hands each operation to a [`Draw`]: the PDF backend
//! (`print/pdf.rs`) writes it as PDF operators, the SVG backend
//! (`print/svg.rs`) as SVG elements.
//!
//! Positions are millimetres from the bottom-left corner, y upwards; type
//! sizes and line widths are points.

use super::geometry::{Corners, Point, Rect};

/// An RGB colour, each channel in `[0, 1]`.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Colour {
    /// Red.
    pub r: f32,
    /// Green.
    pub g: f32,
    /// Blue.
    pub b: f32,
}

/// A grey: 0 is black, 1 white.
pub const fn grey(level: f32) -> Colour {
    Colour {
        r: level,
        g: level,
        b: level,
    }
}

/// A colour by its channels.
pub const fn rgb(r: f32, g: f32, b: f32) -> Colour {
    Colour { r, g, b }
}

/// The two faces of the sheet's type.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Face {
    /// DejaVu Sans.
    Regular,
    /// DejaVu Sans Bold.
    Bold,
}

/// A face at a size in points.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Font {
    /// The face.
    pub face: Face,
    /// The size, points.
    pub size: f64,
}

/// How a line is stroked: its width in points, colour, and dashes of
/// `dash` points on and off (solid when `None`).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Stroke {
    /// Width, points.
    pub width: f64,
    /// Colour.
    pub colour: Colour,
    /// Dash and gap length, points.
    pub dash: Option<f32>,
}

/// A drawing backend: the operations every page and chart is drawn with.
///
/// Operations are stateless: each carries its own colour and stroke, so
/// a backend can write them in the order they come.
pub trait Draw {
    /// One line of text with its baseline starting at `at`.
    fn text(&mut self, at: Point, text: &str, font: Font, colour: Colour);

    /// An open line through `points`.
    fn line(&mut self, points: &[Point], stroke: Stroke);

    /// A polygon through `points`, filled.
    fn fill(&mut self, points: &[Point], colour: Colour);

    /// Many boxes filled in one colour as one shape: a heat map's cells.
    /// Coordinates may be rounded to 0.01 pt, finer than any printer.
    fn fill_boxes(&mut self, boxes: &[Corners], colour: Colour);

    /// Many open lines in one colour and width, with round joins:
    /// contour lines, ticks and hatching. Paths of fewer than two points
    /// draw nothing; coordinates may be rounded to 0.01 pt.
    fn polylines(&mut self, paths: &[Vec<Point>], width: f64, colour: Colour);

    /// Starts clipping what follows to the union of `boxes`, until the
    /// matching [`Draw::end_clip`].
    fn begin_clip(&mut self, boxes: &[Corners]);

    /// Ends the clipping of the last [`Draw::begin_clip`].
    fn end_clip(&mut self);

    /// The outline of `r`, as a closed line from its bottom-left corner.
    fn rect_stroke(&mut self, r: Rect, stroke: Stroke) {
        let (x, y, w, h) = (r.x, r.y, r.w, r.h);
        self.line(
            &[(x, y), (x + w, y), (x + w, y + h), (x, y + h), (x, y)],
            stroke,
        );
    }

    /// `r` filled.
    fn rect_fill(&mut self, r: Rect, colour: Colour) {
        let (x, y, w, h) = (r.x, r.y, r.w, r.h);
        self.fill(&[(x, y), (x + w, y), (x + w, y + h), (x, y + h)], colour);
    }

    /// A filled diamond marker centred at `at`, `r` mm from its centre to
    /// each corner.
    fn marker(&mut self, at: Point, r: f64, colour: Colour) {
        let (x, y) = at;
        self.fill(&[(x, y - r), (x + r, y), (x, y + r), (x - r, y)], colour);
    }
}

/// A backend that records the calls it receives, for tests that check
/// what a block draws without writing a file.
#[cfg(test)]
#[derive(Debug, Default)]
pub struct Recorder {
    /// One entry per call, in order.
    pub calls: Vec<Call>,
}

/// One call a [`Recorder`] received.
#[cfg(test)]
#[derive(Clone, Debug, PartialEq)]
pub enum Call {
    /// [`Draw::text`].
    Text {
        at: Point,
        text: String,
        font: Font,
        colour: Colour,
    },
    /// [`Draw::line`].
    Line { points: Vec<Point>, stroke: Stroke },
    /// [`Draw::fill`].
    Fill { points: Vec<Point>, colour: Colour },
    /// [`Draw::fill_boxes`].
    FillBoxes { boxes: Vec<Corners>, colour: Colour },
    /// [`Draw::polylines`].
    Polylines {
        paths: Vec<Vec<Point>>,
        width: f64,
        colour: Colour,
    },
    /// [`Draw::begin_clip`].
    BeginClip(Vec<Corners>),
    /// [`Draw::end_clip`].
    EndClip,
}

#[cfg(test)]
impl Recorder {
    /// The texts drawn, in order.
    pub fn texts(&self) -> Vec<&str> {
        self.calls
            .iter()
            .filter_map(|c| match c {
                Call::Text { text, .. } => Some(text.as_str()),
                _ => None,
            })
            .collect()
    }
}

#[cfg(test)]
impl Draw for Recorder {
    fn text(&mut self, at: Point, text: &str, font: Font, colour: Colour) {
        self.calls.push(Call::Text {
            at,
            text: text.to_string(),
            font,
            colour,
        });
    }

    fn line(&mut self, points: &[Point], stroke: Stroke) {
        self.calls.push(Call::Line {
            points: points.to_vec(),
            stroke,
        });
    }

    fn fill(&mut self, points: &[Point], colour: Colour) {
        self.calls.push(Call::Fill {
            points: points.to_vec(),
            colour,
        });
    }

    fn fill_boxes(&mut self, boxes: &[Corners], colour: Colour) {
        self.calls.push(Call::FillBoxes {
            boxes: boxes.to_vec(),
            colour,
        });
    }

    fn polylines(&mut self, paths: &[Vec<Point>], width: f64, colour: Colour) {
        self.calls.push(Call::Polylines {
            paths: paths.to_vec(),
            width,
            colour,
        });
    }

    fn begin_clip(&mut self, boxes: &[Corners]) {
        self.calls.push(Call::BeginClip(boxes.to_vec()));
    }

    fn end_clip(&mut self) {
        self.calls.push(Call::EndClip);
    }
}
