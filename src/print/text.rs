//! Typesetting on a [`Canvas`]: lines broken at spaces to a width,
//! paragraphs that shrink until they fit their box, table cells that
//! report a text wider than their column, and formulas with subscripts.
//! All measured with the embedded fonts' metrics, so every backend sets
//! the same lines.

use super::canvas::Canvas;
use super::draw::{Colour, Face, Font, grey};
use super::geometry::{MM_PER_PT, Point, Rect};

/// The sizes a text may take, points: from `size` down to `min` in half
/// points, the first at which it fits.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Shrink {
    /// The size tried first.
    pub size: f64,
    /// The smallest size.
    pub min: f64,
}

impl Shrink {
    /// From `size` down to `min`.
    pub const fn new(size: f64, min: f64) -> Self {
        Shrink { size, min }
    }

    /// Only `size`.
    pub const fn fixed(size: f64) -> Self {
        Shrink { size, min: size }
    }
}

/// How a paragraph wraps at the size where it fits (see [`Canvas::fit`]).
pub struct Fit {
    /// The font size, points.
    pub size: f64,
    /// Baseline to baseline, mm.
    pub lead: f64,
    /// Height of all lines, mm.
    pub height: f64,
    /// Whether the lines fit the box at this size.
    pub fits: bool,
    /// The lines.
    pub lines: Vec<String>,
}

impl Canvas<'_> {
    /// Breaks `text` into lines no wider than `w` mm at `size`.
    pub fn wrap(&self, text: &str, face: Face, size: f64, w: f64) -> Vec<String> {
        let mut lines = Vec::new();
        let mut line = String::new();
        for word in text.split_whitespace() {
            let candidate = if line.is_empty() {
                word.to_string()
            } else {
                format!("{line} {word}")
            };
            if self.width(&candidate, face, size) <= w || line.is_empty() {
                line = candidate;
            } else {
                lines.push(std::mem::take(&mut line));
                line = word.to_string();
            }
        }
        if !line.is_empty() {
            lines.push(line);
        }
        lines
    }

    /// How `text` wraps into a box `w` mm wide and `h` mm tall: the size
    /// of `sizes` at which it first fits, or the smallest when it never
    /// does.
    pub fn fit(&self, text: &str, face: Face, w: f64, h: f64, sizes: Shrink) -> Fit {
        let mut s = sizes.size;
        loop {
            let lines = self.wrap(text, face, s, w);
            let lead = s * MM_PER_PT * 1.25;
            let need = lead * lines.len() as f64;
            let widest = lines
                .iter()
                .map(|l| self.width(l, face, s))
                .fold(0.0, f64::max);
            if (need <= h && widest <= w + 1e-6) || s <= sizes.min {
                return Fit {
                    size: s,
                    lead,
                    height: need,
                    fits: need <= h + 1e-6 && widest <= w + 1e-6,
                    lines,
                };
            }
            s -= 0.5;
        }
    }

    /// Writes `text` wrapped into the box `area` from its top edge,
    /// shrinking through `sizes` until it fits; records an overflow named
    /// `name` when it never does. Returns the height used.
    pub fn paragraph(
        &mut self,
        name: &str,
        area: Rect,
        text: &str,
        face: Face,
        sizes: Shrink,
    ) -> f64 {
        let top = area.top();
        let fit = self.fit(text, face, area.w, area.h, sizes);
        if !fit.fits {
            self.overflow(format!("{name}: '{text}'"));
        }
        for (i, l) in fit.lines.iter().enumerate() {
            let y = top - fit.size * MM_PER_PT - fit.lead * i as f64;
            self.text(area.x, y, l, face, fit.size, grey(0.0));
        }
        fit.height
    }

    /// Writes one table cell with its baseline starting at `at`,
    /// recording an overflow named `name` when it is wider than the `w`
    /// mm of its column.
    pub fn cell(&mut self, name: &str, at: Point, w: f64, text: &str, font: Font, colour: Colour) {
        if self.width(text, font.face, font.size) > w + 1e-6 {
            self.overflow(format!("{name}: '{text}'"));
        }
        self.text(at.0, at.1, text, font.face, font.size, colour);
    }

    /// [`Canvas::cell`] right-aligned: `at` is where the text ends.
    pub fn cell_right(
        &mut self,
        name: &str,
        at: Point,
        w: f64,
        text: &str,
        font: Font,
        colour: Colour,
    ) {
        if self.width(text, font.face, font.size) > w + 1e-6 {
            self.overflow(format!("{name}: '{text}'"));
        }
        self.text_right(at.0, at.1, text, font.face, font.size, colour);
    }

    /// Width of a formula written with [`Canvas::formula`].
    pub fn formula_width(&self, text: &str, face: Face, size: f64) -> f64 {
        formula_runs(text)
            .iter()
            .map(|(run, sub)| self.width(run, face, if *sub { sub_size(size) } else { size }))
            .sum()
    }

    /// Writes one line of a formula with its baseline at `(x, y)`: an
    /// underscore makes the letters and digits after it a subscript
    /// (`Q_U`, `p̂_L`, `I_x`), lowered and smaller, since the font's
    /// subscript characters stop at digits and a few small letters.
    pub fn formula(&mut self, x: f64, y: f64, text: &str, face: Face, size: f64, colour: Colour) {
        let mut at = x;
        for (run, sub) in formula_runs(text) {
            let (s, dy) = if sub {
                (sub_size(size), -0.22 * size * MM_PER_PT)
            } else {
                (size, 0.0)
            };
            self.text(at, y + dy, &run, face, s, colour);
            at += self.width(&run, face, s);
        }
    }
}

/// The size of a formula's subscripts.
fn sub_size(size: f64) -> f64 {
    size * 0.72
}

/// A formula's runs of plain text and of subscript (`true`): each `_`
/// starts a subscript that runs over the ASCII letters and digits after it.
fn formula_runs(text: &str) -> Vec<(String, bool)> {
    let mut runs: Vec<(String, bool)> = Vec::new();
    let mut sub = false;
    for ch in text.chars() {
        if ch == '_' {
            sub = true;
            runs.push((String::new(), true));
            continue;
        }
        if sub && !ch.is_ascii_alphanumeric() {
            sub = false;
        }
        match runs.last_mut() {
            Some((run, s)) if *s == sub => run.push(ch),
            _ => runs.push((ch.to_string(), sub)),
        }
    }
    runs.retain(|(run, _)| !run.is_empty());
    runs
}

#[cfg(test)]
mod tests {
    use super::formula_runs;

    #[test]
    fn an_underscore_starts_a_subscript_of_letters_and_digits() {
        let runs = formula_runs("p̂_U = I_x(20.5, 20.5), Q_L ≥ 1");
        let want = [
            ("p̂", false),
            ("U", true),
            (" = I", false),
            ("x", true),
            ("(20.5, 20.5), Q", false),
            ("L", true),
            (" ≥ 1", false),
        ];
        let got: Vec<(&str, bool)> = runs.iter().map(|(r, s)| (r.as_str(), *s)).collect();
        assert_eq!(got, want);
    }
}
