//! The PDF backend: each drawing operation as printpdf operators, every
//! one inside its own saved graphics state, and the document of one page
//! or more with the embedded fonts and the metadata that make a sheet
//! reproducible.
//!
//! Determinism: fonts are registered under fixed resource names, the
//! dates stay at printpdf's fixed default, and the document `/ID` is set
//! from a hash of the inputs, so the same inputs give the same bytes in
//! any process.

use printpdf::{
    Color, FontId, Line, LineDashPattern, LineJoinStyle, LinePoint, Mm, Op, PaintMode,
    PdfFontHandle, Point as PdfPoint, Polygon, PolygonRing, Pt, Rgb, TextItem, WindingOrder,
};

use super::draw::{Colour, Draw, Face, Font, Stroke};
use super::font_programs::deflate_font_programs;
use super::fonts::Fonts;
use super::geometry::{Corners, MM_PER_PT, Point};
use crate::source::Error;
use crate::source::tool_version;

/// The resource names of the two faces.
const REGULAR_ID: &str = "SheetSans";
const BOLD_ID: &str = "SheetSansBold";

/// A page being drawn as PDF operators.
#[derive(Default)]
pub struct PdfPage {
    ops: Vec<Op>,
}

impl PdfPage {
    /// An empty page.
    pub fn new() -> Self {
        PdfPage::default()
    }

    /// The operators drawn.
    pub fn into_ops(self) -> Vec<Op> {
        self.ops
    }
}

fn pt(v: f64) -> Pt {
    Pt::from(Mm(v as f32))
}

fn point((x, y): Point) -> LinePoint {
    LinePoint {
        p: PdfPoint { x: pt(x), y: pt(y) },
        bezier: false,
    }
}

/// A point with its coordinates rounded to 0.01 pt (0.0035 mm): finer
/// than any printer, and a third of the digits of a full `f32`, which
/// keeps a map of thousands of cells small.
fn compact_point((x, y): Point) -> LinePoint {
    let round = |v: f64| Pt(((v / MM_PER_PT) * 100.0).round() as f32 / 100.0);
    LinePoint {
        p: PdfPoint {
            x: round(x),
            y: round(y),
        },
        bezier: false,
    }
}

fn colour(c: Colour) -> Color {
    Color::Rgb(Rgb {
        r: c.r,
        g: c.g,
        b: c.b,
        icc_profile: None,
    })
}

/// The boxes as the rings of one polygon.
fn box_rings(boxes: &[Corners], mode: PaintMode) -> Polygon {
    Polygon {
        rings: boxes
            .iter()
            .map(|&(x0, y0, x1, y1)| PolygonRing {
                points: vec![
                    compact_point((x0, y0)),
                    compact_point((x1, y0)),
                    compact_point((x1, y1)),
                    compact_point((x0, y1)),
                ],
            })
            .collect(),
        mode,
        winding_order: WindingOrder::NonZero,
    }
}

impl Draw for PdfPage {
    fn text(&mut self, at: Point, text: &str, font: Font, c: Colour) {
        let id = match font.face {
            Face::Regular => REGULAR_ID,
            Face::Bold => BOLD_ID,
        };
        self.ops.push(Op::SaveGraphicsState);
        self.ops.push(Op::SetFillColor { col: colour(c) });
        self.ops.push(Op::StartTextSection);
        self.ops.push(Op::SetFont {
            font: PdfFontHandle::External(FontId(id.to_string())),
            size: Pt(font.size as f32),
        });
        self.ops.push(Op::SetTextCursor {
            pos: PdfPoint {
                x: pt(at.0),
                y: pt(at.1),
            },
        });
        self.ops.push(Op::ShowText {
            items: vec![TextItem::Text(text.to_string())],
        });
        self.ops.push(Op::EndTextSection);
        self.ops.push(Op::RestoreGraphicsState);
    }

    fn line(&mut self, points: &[Point], stroke: Stroke) {
        self.ops.push(Op::SaveGraphicsState);
        self.ops.push(Op::SetOutlineColor {
            col: colour(stroke.colour),
        });
        self.ops.push(Op::SetOutlineThickness {
            pt: Pt(stroke.width as f32),
        });
        if let Some(d) = stroke.dash {
            self.ops.push(Op::SetLineDashPattern {
                dash: LineDashPattern::new(0.0, &[d, d]),
            });
        }
        self.ops.push(Op::DrawLine {
            line: Line {
                points: points.iter().map(|&p| point(p)).collect(),
                is_closed: false,
            },
        });
        self.ops.push(Op::RestoreGraphicsState);
    }

    fn fill(&mut self, points: &[Point], c: Colour) {
        self.ops.push(Op::SaveGraphicsState);
        self.ops.push(Op::SetFillColor { col: colour(c) });
        self.ops.push(Op::DrawPolygon {
            polygon: Polygon {
                rings: vec![PolygonRing {
                    points: points.iter().map(|&p| point(p)).collect(),
                }],
                mode: PaintMode::Fill,
                winding_order: WindingOrder::NonZero,
            },
        });
        self.ops.push(Op::RestoreGraphicsState);
    }

    fn fill_boxes(&mut self, boxes: &[Corners], c: Colour) {
        self.ops.push(Op::SaveGraphicsState);
        self.ops.push(Op::SetFillColor { col: colour(c) });
        self.ops.push(Op::DrawPolygon {
            polygon: box_rings(boxes, PaintMode::Fill),
        });
        self.ops.push(Op::RestoreGraphicsState);
    }

    fn polylines(&mut self, paths: &[Vec<Point>], width: f64, c: Colour) {
        self.ops.push(Op::SaveGraphicsState);
        self.ops.push(Op::SetOutlineColor { col: colour(c) });
        self.ops.push(Op::SetOutlineThickness {
            pt: Pt(width as f32),
        });
        self.ops.push(Op::SetLineJoinStyle {
            join: LineJoinStyle::Round,
        });
        for path in paths.iter().filter(|p| p.len() >= 2) {
            self.ops.push(Op::DrawLine {
                line: Line {
                    points: path.iter().map(|&p| compact_point(p)).collect(),
                    is_closed: false,
                },
            });
        }
        self.ops.push(Op::RestoreGraphicsState);
    }

    fn begin_clip(&mut self, boxes: &[Corners]) {
        self.ops.push(Op::SaveGraphicsState);
        self.ops.push(Op::DrawPolygon {
            polygon: box_rings(boxes, PaintMode::Clip),
        });
    }

    fn end_clip(&mut self) {
        self.ops.push(Op::RestoreGraphicsState);
    }
}

/// What a document says of itself: its title; in the metadata `subject`,
/// this tool's version as the creator, and the `extra` entries; the
/// document ID made from the hex `hash`.
pub struct Document<'a> {
    /// The title.
    pub title: &'a str,
    /// The subject.
    pub subject: &'a str,
    /// A hex hash of the inputs (at least 32 digits).
    pub hash: &'a str,
    /// More entries of the document information.
    pub extra: &'a [(&'a str, &'a str)],
}

/// The PDF of one `size` (mm) page of `ops`, with the fonts embedded.
///
/// # Errors
/// [`Error::Output`] when the document cannot be written.
pub fn save(
    doc: &Document,
    fonts: &Fonts,
    size: (f64, f64),
    ops: Vec<Op>,
) -> Result<Vec<u8>, Error> {
    save_pages(doc, fonts, size, vec![ops])
}

/// The PDF of `size` (mm) pages, one per list of `ops` in order, with the
/// fonts embedded; one page gives the bytes of [`save`].
///
/// # Errors
/// [`Error::Output`] when the document cannot be written.
pub fn save_pages(
    doc: &Document,
    fonts: &Fonts,
    size: (f64, f64),
    pages: Vec<Vec<Op>>,
) -> Result<Vec<u8>, Error> {
    let (pw, ph) = size;
    let mut warnings = Vec::new();
    let mut pdf = printpdf::PdfDocument::new(doc.title);
    pdf.metadata.info.subject = doc.subject.to_string();
    pdf.metadata.info.creator = tool_version();
    for (id, face) in [(REGULAR_ID, Face::Regular), (BOLD_ID, Face::Bold)] {
        pdf.resources.fonts.map.insert(
            FontId(id.to_string()),
            printpdf::PdfFont::new(fonts.face(face).clone()),
        );
    }
    pdf.with_pages(
        pages
            .into_iter()
            .map(|ops| printpdf::PdfPage::new(Mm(pw as f32), Mm(ph as f32), ops))
            .collect(),
    );
    let mut lo = pdf.to_lopdf_document(&printpdf::PdfSaveOptions::default(), &mut warnings);
    let id = lopdf::Object::String(
        doc.hash.as_bytes()[..32].to_vec(),
        lopdf::StringFormat::Literal,
    );
    lo.trailer
        .set("ID", lopdf::Object::Array(vec![id.clone(), id]));
    if !doc.extra.is_empty() {
        let info = lo
            .trailer
            .get(b"Info")
            .and_then(|o| o.as_reference())
            .and_then(|r| lo.get_dictionary_mut(r))
            .map_err(|e| Error::Output(std::io::Error::other(e.to_string())))?;
        for (key, value) in doc.extra {
            info.set(*key, text_object(value));
        }
    }
    // The font programs are deflated once per process; the rest here.
    deflate_font_programs(&mut lo);
    lo.compress();
    let mut bytes = Vec::new();
    lo.save_to(&mut bytes)
        .map_err(|e| Error::Output(std::io::Error::other(e.to_string())))?;
    Ok(bytes)
}

/// A text as a PDF text string: UTF-16BE after a byte-order mark, the form
/// the document information's other texts take.
pub fn text_object(text: &str) -> lopdf::Object {
    let bytes = [0xFE, 0xFF]
        .into_iter()
        .chain(text.encode_utf16().flat_map(u16::to_be_bytes))
        .collect();
    lopdf::Object::String(bytes, lopdf::StringFormat::Hexadecimal)
}

/// A PDF text string: UTF-16BE after a byte-order mark, else PDFDocEncoding
/// (ASCII for the hex digits this tool writes).
pub fn text_string(bytes: &[u8]) -> String {
    match bytes.strip_prefix(&[0xFE, 0xFF]) {
        Some(utf16) => {
            let units: Vec<u16> = utf16
                .chunks_exact(2)
                .map(|p| u16::from_be_bytes([p[0], p[1]]))
                .collect();
            String::from_utf16_lossy(&units)
        }
        None => String::from_utf8_lossy(bytes).to_string(),
    }
}
