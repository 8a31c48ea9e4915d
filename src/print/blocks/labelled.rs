//! A paragraph led by a bold label on its first line: a switching rule
//! after its name, a note after its mark. The label takes the start of
//! the first line, the words that fit follow it, and the rest wraps the
//! full width below.

use crate::print::canvas::Canvas;
use crate::print::draw::{Colour, Face, grey};
use crate::print::geometry::MM_PER_PT;

/// A labelled paragraph: its label, its text and its type size.
#[derive(Clone, Copy)]
pub struct Labelled<'a> {
    /// The bold label.
    pub label: &'a str,
    /// The text after it.
    pub text: &'a str,
    /// The size, points.
    pub size: f64,
}

/// The gap after a label, mm.
const LABEL_GAP: f64 = 1.2;

impl Labelled<'_> {
    /// Baseline to baseline, mm.
    pub fn lead(&self) -> f64 {
        self.size * MM_PER_PT * 1.22
    }

    /// The words on the label's line, and the lines below it, in `w` mm.
    fn lines(&self, c: &Canvas, w: f64) -> (String, Vec<String>) {
        let label_w = c.width(self.label, Face::Bold, self.size) + LABEL_GAP;
        let words: Vec<&str> = self.text.split_whitespace().collect();
        let mut first = String::new();
        let mut taken = 0;
        for word in &words {
            let candidate = if first.is_empty() {
                word.to_string()
            } else {
                format!("{first} {word}")
            };
            if label_w + c.width(&candidate, Face::Regular, self.size) > w {
                break;
            }
            first = candidate;
            taken += 1;
        }
        let rest = c.wrap(&words[taken..].join(" "), Face::Regular, self.size, w);
        (first, rest)
    }

    /// Its height in a column `w` mm wide.
    pub fn height(&self, c: &Canvas, w: f64) -> f64 {
        let (_, rest) = self.lines(c, w);
        self.lead() * (1 + rest.len()) as f64
    }

    /// Draws it from the top-left corner `(x, top)` in a column `w` mm
    /// wide, the label in `colour`; a line wider than the column (a word
    /// longer than a line) is an overflow named `name`. Returns the
    /// height used.
    pub fn draw(
        &self,
        c: &mut Canvas,
        name: &str,
        (x, top): (f64, f64),
        w: f64,
        colour: Colour,
    ) -> f64 {
        let (first, rest) = self.lines(c, w);
        let lead = self.lead();
        let base = top - self.size * MM_PER_PT;
        c.text(x, base, self.label, Face::Bold, self.size, colour);
        let label_w = c.width(self.label, Face::Bold, self.size) + LABEL_GAP;
        c.text(
            x + label_w,
            base,
            &first,
            Face::Regular,
            self.size,
            grey(0.0),
        );
        for (i, line) in rest.iter().enumerate() {
            if c.width(line, Face::Regular, self.size) > w + 1e-6 {
                c.overflow(format!("{name}: '{line}'"));
            }
            let y = base - lead * (i + 1) as f64;
            c.text(x, y, line, Face::Regular, self.size, grey(0.0));
        }
        lead * (1 + rest.len()) as f64
    }
}
