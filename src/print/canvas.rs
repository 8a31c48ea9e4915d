//! A page or chart being laid out: the drawing goes to a backend
//! ([`Draw`]), the text is measured with the embedded fonts, and every
//! block claimed, every text that does not fit and every layout fault is
//! recorded, so that a page is refused rather than printed with
//! overflowing, overlapping or missing text ([`Canvas::finish`]).
//!
//! Typesetting (wrapping, fitting, paragraphs, table cells, formulas) is
//! in `print/text.rs`.

use super::draw::{Colour, Draw, Face, Font, Stroke, grey};
use super::fonts::Fonts;
use super::geometry::{Corners, Point, Rect, Region};

/// A page being drawn.
pub struct Canvas<'a> {
    draw: &'a mut dyn Draw,
    fonts: &'a Fonts,
    regions: Vec<Region>,
    /// Text that did not fit its box even at the smallest size.
    overflows: Vec<String>,
    /// Blocks, tables, charts or labels that do not fit the page,
    /// whatever the source's text.
    faults: Vec<String>,
}

/// What the drawing of a page left to check, from [`Canvas::finish`].
pub struct Laid {
    /// The blocks claimed.
    pub regions: Vec<Region>,
    /// Texts that did not fit.
    pub overflows: Vec<String>,
    /// Characters the font cannot draw, and blocks that leave the page or
    /// overlap another block.
    pub faults: Vec<String>,
}

impl Laid {
    /// Whether nothing overflowed and nothing is out of place.
    pub fn is_clean(&self) -> bool {
        self.overflows.is_empty() && self.faults.is_empty()
    }
}

impl<'a> Canvas<'a> {
    /// A canvas that draws on `draw` and measures with `fonts`.
    pub fn new(draw: &'a mut dyn Draw, fonts: &'a Fonts) -> Self {
        Canvas {
            draw,
            fonts,
            regions: Vec::new(),
            overflows: Vec::new(),
            faults: Vec::new(),
        }
    }

    /// Ends the drawing of a `pw` x `ph` page: the blocks claimed and what
    /// went wrong, with every block that leaves the page or overlaps
    /// another added to the faults. The sheet and the map share this
    /// check.
    pub fn finish(self, pw: f64, ph: f64) -> Laid {
        let mut faults = self.faults;
        let regions = self.regions;
        for (i, a) in regions.iter().enumerate() {
            if !a.on_page(pw, ph) {
                faults.push(format!("the {} leaves the page", a.name));
            }
            for b in &regions[i + 1..] {
                if a.overlaps(b) {
                    faults.push(format!("the {} overlaps the {}", a.name, b.name));
                }
            }
        }
        Laid {
            regions,
            overflows: self.overflows,
            faults,
        }
    }

    /// Records a text that does not fit its box.
    pub fn overflow(&mut self, what: String) {
        self.overflows.push(what);
    }

    /// Records a block, table, chart or label that does not fit.
    pub fn fault(&mut self, what: String) {
        self.faults.push(what);
    }

    /// Whether a fault has been recorded.
    pub fn has_faults(&self) -> bool {
        !self.faults.is_empty()
    }

    /// How many overflows and faults have been recorded so far.
    pub fn problems(&self) -> usize {
        self.overflows.len() + self.faults.len()
    }

    /// Width of `text` in mm at `size` points.
    pub fn width(&self, text: &str, face: Face, size: f64) -> f64 {
        self.fonts.width(text, face, size)
    }

    /// Writes one line of text with its baseline at `(x, y)`; a character
    /// the font has no glyph for is an overflow.
    pub fn text(&mut self, x: f64, y: f64, text: &str, face: Face, size: f64, colour: Colour) {
        for ch in text.chars().filter(|&ch| !self.fonts.has_glyph(face, ch)) {
            self.overflows.push(format!(
                "the character '{ch}' (U+{:04X}) has no glyph in the sheet font",
                ch as u32
            ));
        }
        self.draw.text((x, y), text, Font { face, size }, colour);
    }

    /// Text right-aligned at `x_right`.
    pub fn text_right(
        &mut self,
        x_right: f64,
        y: f64,
        text: &str,
        face: Face,
        size: f64,
        colour: Colour,
    ) {
        let w = self.width(text, face, size);
        self.text(x_right - w, y, text, face, size, colour);
    }

    /// A line through `pts`, `thickness` points wide, dashed `dash` points
    /// on and off when given.
    pub fn line(&mut self, pts: &[Point], thickness: f64, colour: Colour, dash: Option<f32>) {
        self.draw.line(
            pts,
            Stroke {
                width: thickness,
                colour,
                dash,
            },
        );
    }

    /// The outline of `r`.
    pub fn rect_stroke(&mut self, r: Rect, thickness: f64, colour: Colour) {
        self.draw.rect_stroke(
            r,
            Stroke {
                width: thickness,
                colour,
                dash: None,
            },
        );
    }

    /// `r` filled.
    pub fn rect_fill(&mut self, r: Rect, colour: Colour) {
        self.draw.rect_fill(r, colour);
    }

    /// A filled diamond marker centred at `(x, y)`.
    pub fn marker(&mut self, x: f64, y: f64, r: f64, colour: Colour) {
        self.draw.marker((x, y), r, colour);
    }

    /// A filled polygon through `pts`.
    pub fn fill(&mut self, pts: &[Point], colour: Colour) {
        self.draw.fill(pts, colour);
    }

    /// Many boxes filled in one colour as one shape: a heat map's cells.
    pub fn fill_rects(&mut self, boxes: &[Corners], colour: Colour) {
        self.draw.fill_boxes(boxes, colour);
    }

    /// Draws `draw` clipped to the union of `boxes`.
    pub fn clipped(&mut self, boxes: &[Corners], draw: impl FnOnce(&mut Self)) {
        self.draw.begin_clip(boxes);
        draw(self);
        self.draw.end_clip();
    }

    /// Many open polylines in one colour and thickness: contour lines and
    /// hatching.
    pub fn polylines(&mut self, paths: &[Vec<Point>], thickness: f64, colour: Colour) {
        self.draw.polylines(paths, thickness, colour);
    }

    /// A section heading: small bold capitals in grey.
    pub fn heading(&mut self, x: f64, y: f64, text: &str) {
        self.text(x, y, text, Face::Bold, 7.0, grey(0.3));
    }

    /// Records that the block `name` occupies `r`.
    pub fn claim(&mut self, name: &str, r: Rect) {
        self.regions.push(Region::new(name, r));
    }
}
