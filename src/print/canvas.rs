//! A page being drawn: text in the embedded DejaVu fonts with measured
//! widths, lines, boxes and markers, in millimetres from the bottom-left
//! corner. Layout code asks the canvas how wide a text is and records every
//! box it fills, so a test can prove that nothing overlaps or overflows.

use printpdf::{
    Color, FontId, Line, LineDashPattern, LineJoinStyle, LinePoint, Mm, Op, PaintMode, ParsedFont,
    PdfFontHandle, Point, Polygon, PolygonRing, Pt, Rgb, TextItem, WindingOrder,
};

/// The two faces of the sheet.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Face {
    Regular,
    Bold,
}

/// A filled rectangle of the layout, for the overlap check.
#[derive(Clone, Debug, PartialEq)]
pub struct Region {
    pub name: String,
    pub x: f64,
    pub y: f64,
    pub w: f64,
    pub h: f64,
}

impl Region {
    pub fn overlaps(&self, other: &Region) -> bool {
        const EPS: f64 = 1e-6;
        self.x + EPS < other.x + other.w
            && other.x + EPS < self.x + self.w
            && self.y + EPS < other.y + other.h
            && other.y + EPS < self.y + self.h
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

pub struct Canvas<'f> {
    pub ops: Vec<Op>,
    pub regions: Vec<Region>,
    /// Text that did not fit its box even at the smallest size (must stay empty).
    pub overflows: Vec<String>,
    /// Blocks, tables, charts or labels that do not fit the page, whatever
    /// the source's text (must stay empty).
    pub faults: Vec<String>,
    regular: &'f ParsedFont,
    bold: &'f ParsedFont,
}

/// Millimetres per point (1 pt = 1/72 inch): the page is laid out in mm,
/// type is sized in points.
pub const MM_PER_PT: f64 = 25.4 / 72.0;

pub const REGULAR_ID: &str = "SheetSans";
pub const BOLD_ID: &str = "SheetSansBold";

fn pt(v: f64) -> Pt {
    Pt::from(Mm(v as f32))
}

fn point(x: f64, y: f64) -> LinePoint {
    LinePoint {
        p: Point { x: pt(x), y: pt(y) },
        bezier: false,
    }
}

pub fn grey(level: f32) -> Color {
    Color::Rgb(Rgb {
        r: level,
        g: level,
        b: level,
        icc_profile: None,
    })
}

pub fn rgb(r: f32, g: f32, b: f32) -> Color {
    Color::Rgb(Rgb {
        r,
        g,
        b,
        icc_profile: None,
    })
}

/// A drawn page and what went wrong in the drawing, from [`Canvas::finish`].
pub struct Page {
    /// The drawing operations.
    pub ops: Vec<Op>,
    /// The blocks claimed.
    pub regions: Vec<Region>,
    /// Texts that did not fit.
    pub overflows: Vec<String>,
    /// Characters the font cannot draw, and blocks that leave the page or
    /// overlap another block.
    pub faults: Vec<String>,
}

impl<'f> Canvas<'f> {
    /// Ends the drawing of a `pw` x `ph` page: its operations and blocks,
    /// with every block that leaves the page or overlaps another added to
    /// the faults.
    pub fn finish(self, pw: f64, ph: f64) -> Page {
        let mut faults = self.faults;
        let regions = self.regions;
        for (i, a) in regions.iter().enumerate() {
            if a.x < 0.0 || a.y < 0.0 || a.x + a.w > pw || a.y + a.h > ph {
                faults.push(format!("the {} leaves the page", a.name));
            }
            for b in &regions[i + 1..] {
                if a.overlaps(b) {
                    faults.push(format!("the {} overlaps the {}", a.name, b.name));
                }
            }
        }
        Page {
            ops: self.ops,
            regions,
            overflows: self.overflows,
            faults,
        }
    }

    pub fn new(regular: &'f ParsedFont, bold: &'f ParsedFont) -> Self {
        Canvas {
            ops: Vec::new(),
            regions: Vec::new(),
            overflows: Vec::new(),
            faults: Vec::new(),
            regular,
            bold,
        }
    }

    /// Width of `text` in mm at `size` points.
    pub fn width(&self, text: &str, face: Face, size: f64) -> f64 {
        let font = match face {
            Face::Regular => self.regular,
            Face::Bold => self.bold,
        };
        let units: f64 = text
            .chars()
            .map(|ch| {
                font.lookup_glyph_index(ch as u32)
                    .and_then(|g| font.get_glyph_width(g))
                    .unwrap_or(font.units_per_em / 2) as f64
            })
            .sum();
        units / font.units_per_em as f64 * size * MM_PER_PT
    }

    /// Writes one line of text with its baseline at `(x, y)`.
    pub fn text(&mut self, x: f64, y: f64, text: &str, face: Face, size: f64, color: Color) {
        let id = match face {
            Face::Regular => REGULAR_ID,
            Face::Bold => BOLD_ID,
        };
        let font = match face {
            Face::Regular => self.regular,
            Face::Bold => self.bold,
        };
        for ch in text
            .chars()
            .filter(|&ch| font.lookup_glyph_index(ch as u32).is_none())
        {
            self.overflows.push(format!(
                "the character '{ch}' (U+{:04X}) has no glyph in the sheet font",
                ch as u32
            ));
        }
        self.ops.push(Op::SaveGraphicsState);
        self.ops.push(Op::SetFillColor { col: color });
        self.ops.push(Op::StartTextSection);
        self.ops.push(Op::SetFont {
            font: PdfFontHandle::External(FontId(id.to_string())),
            size: Pt(size as f32),
        });
        self.ops.push(Op::SetTextCursor {
            pos: Point { x: pt(x), y: pt(y) },
        });
        self.ops.push(Op::ShowText {
            items: vec![TextItem::Text(text.to_string())],
        });
        self.ops.push(Op::EndTextSection);
        self.ops.push(Op::RestoreGraphicsState);
    }

    /// Text right-aligned at `x_right`.
    pub fn text_right(
        &mut self,
        x_right: f64,
        y: f64,
        text: &str,
        face: Face,
        size: f64,
        color: Color,
    ) {
        let w = self.width(text, face, size);
        self.text(x_right - w, y, text, face, size, color);
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
    pub fn formula(&mut self, x: f64, y: f64, text: &str, face: Face, size: f64, color: Color) {
        let mut at = x;
        for (run, sub) in formula_runs(text) {
            let (s, dy) = if sub {
                (sub_size(size), -0.22 * size * MM_PER_PT)
            } else {
                (size, 0.0)
            };
            self.text(at, y + dy, &run, face, s, color.clone());
            at += self.width(&run, face, s);
        }
    }

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
    /// from `size` down to `min_size` (in half points) at which it first
    /// fits, or `min_size` when it never does.
    #[allow(clippy::too_many_arguments)]
    pub fn fit(&self, text: &str, face: Face, w: f64, h: f64, size: f64, min_size: f64) -> Fit {
        let mut s = size;
        loop {
            let lines = self.wrap(text, face, s, w);
            let lead = s * MM_PER_PT * 1.25;
            let need = lead * lines.len() as f64;
            let widest = lines
                .iter()
                .map(|l| self.width(l, face, s))
                .fold(0.0, f64::max);
            if (need <= h && widest <= w + 1e-6) || s <= min_size {
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

    /// Writes `text` wrapped into the box `(x, top, w, h)`, shrinking from
    /// `size` down to `min_size` until it fits; records an overflow when it
    /// never does. Returns the height used.
    #[allow(clippy::too_many_arguments)]
    pub fn paragraph(
        &mut self,
        name: &str,
        x: f64,
        top: f64,
        w: f64,
        h: f64,
        text: &str,
        face: Face,
        size: f64,
        min_size: f64,
    ) -> f64 {
        let fit = self.fit(text, face, w, h, size, min_size);
        if !fit.fits {
            self.overflows.push(format!("{name}: '{text}'"));
        }
        for (i, l) in fit.lines.iter().enumerate() {
            let y = top - fit.size * MM_PER_PT - fit.lead * i as f64;
            self.text(x, y, l, face, fit.size, grey(0.0));
        }
        fit.height
    }

    /// Writes one table cell right-aligned at `x_right`, recording an
    /// overflow when it is wider than the `w` mm of its column.
    #[allow(clippy::too_many_arguments)]
    pub fn cell_right(
        &mut self,
        name: &str,
        x_right: f64,
        w: f64,
        y: f64,
        text: &str,
        face: Face,
        size: f64,
        color: Color,
    ) {
        if self.width(text, face, size) > w + 1e-6 {
            self.overflows.push(format!("{name}: '{text}'"));
        }
        self.text_right(x_right, y, text, face, size, color);
    }

    /// Writes one table cell left-aligned at `x`, recording an overflow
    /// when it is wider than the `w` mm of its column.
    #[allow(clippy::too_many_arguments)]
    pub fn cell(
        &mut self,
        name: &str,
        x: f64,
        w: f64,
        y: f64,
        text: &str,
        face: Face,
        size: f64,
        color: Color,
    ) {
        if self.width(text, face, size) > w + 1e-6 {
            self.overflows.push(format!("{name}: '{text}'"));
        }
        self.text(x, y, text, face, size, color);
    }

    pub fn line(&mut self, pts: &[(f64, f64)], thickness: f64, color: Color, dash: Option<f32>) {
        self.ops.push(Op::SaveGraphicsState);
        self.ops.push(Op::SetOutlineColor { col: color });
        self.ops.push(Op::SetOutlineThickness {
            pt: Pt(thickness as f32),
        });
        if let Some(d) = dash {
            self.ops.push(Op::SetLineDashPattern {
                dash: LineDashPattern::new(0.0, &[d, d]),
            });
        }
        self.ops.push(Op::DrawLine {
            line: Line {
                points: pts.iter().map(|&(x, y)| point(x, y)).collect(),
                is_closed: false,
            },
        });
        self.ops.push(Op::RestoreGraphicsState);
    }

    pub fn rect_stroke(&mut self, x: f64, y: f64, w: f64, h: f64, thickness: f64, color: Color) {
        self.line(
            &[(x, y), (x + w, y), (x + w, y + h), (x, y + h), (x, y)],
            thickness,
            color,
            None,
        );
    }

    pub fn rect_fill(&mut self, x: f64, y: f64, w: f64, h: f64, color: Color) {
        self.fill(&[(x, y), (x + w, y), (x + w, y + h), (x, y + h)], color);
    }

    /// A filled diamond marker centred at `(x, y)`.
    pub fn marker(&mut self, x: f64, y: f64, r: f64, color: Color) {
        self.fill(&[(x, y - r), (x + r, y), (x, y + r), (x - r, y)], color);
    }

    /// A filled polygon through `pts`.
    pub fn fill(&mut self, pts: &[(f64, f64)], color: Color) {
        self.ops.push(Op::SaveGraphicsState);
        self.ops.push(Op::SetFillColor { col: color });
        self.ops.push(Op::DrawPolygon {
            polygon: Polygon {
                rings: vec![PolygonRing {
                    points: pts.iter().map(|&(x, y)| point(x, y)).collect(),
                }],
                mode: PaintMode::Fill,
                winding_order: WindingOrder::NonZero,
            },
        });
        self.ops.push(Op::RestoreGraphicsState);
    }

    /// Many rectangles `(x0, y0, x1, y1)` filled in one colour as one path,
    /// with coordinates to 0.01 pt: a heat map's cells.
    pub fn fill_rects(&mut self, rects: &[(f64, f64, f64, f64)], color: Color) {
        self.ops.push(Op::SaveGraphicsState);
        self.ops.push(Op::SetFillColor { col: color });
        self.ops.push(Op::DrawPolygon {
            polygon: rect_rings(rects, PaintMode::Fill),
        });
        self.ops.push(Op::RestoreGraphicsState);
    }

    /// Draws `draw` clipped to the union of the rectangles `rects`.
    pub fn clipped(&mut self, rects: &[(f64, f64, f64, f64)], draw: impl FnOnce(&mut Self)) {
        self.ops.push(Op::SaveGraphicsState);
        self.ops.push(Op::DrawPolygon {
            polygon: rect_rings(rects, PaintMode::Clip),
        });
        draw(self);
        self.ops.push(Op::RestoreGraphicsState);
    }

    /// Many open polylines in one colour and thickness, with coordinates
    /// to 0.01 pt: contour lines and hatching.
    pub fn polylines(&mut self, paths: &[Vec<(f64, f64)>], thickness: f64, color: Color) {
        self.ops.push(Op::SaveGraphicsState);
        self.ops.push(Op::SetOutlineColor { col: color });
        self.ops.push(Op::SetOutlineThickness {
            pt: Pt(thickness as f32),
        });
        self.ops.push(Op::SetLineJoinStyle {
            join: LineJoinStyle::Round,
        });
        for path in paths.iter().filter(|p| p.len() >= 2) {
            self.ops.push(Op::DrawLine {
                line: Line {
                    points: path.iter().map(|&(x, y)| compact_point(x, y)).collect(),
                    is_closed: false,
                },
            });
        }
        self.ops.push(Op::RestoreGraphicsState);
    }

    /// A section heading: small bold capitals in grey.
    pub fn heading(&mut self, x: f64, y: f64, text: &str) {
        self.text(x, y, text, Face::Bold, 7.0, grey(0.3));
    }

    /// Records that the block `name` occupies `(x, y, w, h)`.
    pub fn claim(&mut self, name: &str, x: f64, y: f64, w: f64, h: f64) {
        self.regions.push(Region {
            name: name.to_string(),
            x,
            y,
            w,
            h,
        });
    }
}

/// A point with its coordinates rounded to 0.01 pt (0.0035 mm): finer
/// than any printer, and a third of the digits of a full `f32`, which
/// keeps a map of thousands of cells small.
fn compact_point(x: f64, y: f64) -> LinePoint {
    let round = |v: f64| Pt(((v / MM_PER_PT) * 100.0).round() as f32 / 100.0);
    LinePoint {
        p: Point {
            x: round(x),
            y: round(y),
        },
        bezier: false,
    }
}

/// The rectangles `(x0, y0, x1, y1)` as the rings of one polygon.
fn rect_rings(rects: &[(f64, f64, f64, f64)], mode: PaintMode) -> Polygon {
    Polygon {
        rings: rects
            .iter()
            .map(|&(x0, y0, x1, y1)| PolygonRing {
                points: vec![
                    compact_point(x0, y0),
                    compact_point(x1, y0),
                    compact_point(x1, y1),
                    compact_point(x0, y1),
                ],
            })
            .collect(),
        mode,
        winding_order: WindingOrder::NonZero,
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
