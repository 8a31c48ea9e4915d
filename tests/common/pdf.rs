//! Reading a PDF the way the tests need it, with lopdf alone: the page
//! sizes, and the text of the page as runs (one per `Tj`), in drawing
//! order or grouped into printed lines.
//!
//! The sheets and maps draw each piece of text in its own `BT ... ET`
//! block: a font (`Tf`), one move from the origin (`Td`) and one string
//! (`Tj`) of two-byte glyph codes (Identity-H) that the font's ToUnicode
//! map turns back into text. A run's width comes from the font's `/W`
//! array (glyph widths in thousandths of the font size). The reader
//! refuses (panics) on anything else it meets inside a text block, or on
//! a glyph without a Unicode value, so that a change in how pages are
//! written shows up here instead of as text quietly misread.

use std::collections::BTreeMap;

use lopdf::content::Operation;
use lopdf::{Dictionary, Document, Encoding, Object};

/// One string as drawn: its baseline's start and its font size in points,
/// its width in points, and its text.
#[derive(Clone, Debug)]
pub struct Run {
    pub x: f64,
    pub y: f64,
    pub size: f64,
    pub width: f64,
    pub text: String,
}

impl Run {
    fn end(&self) -> f64 {
        self.x + self.width
    }
}

/// Page sizes in points from the PDF's MediaBox.
pub fn page_sizes(pdf: &[u8]) -> Vec<(f64, f64)> {
    let doc = Document::load_mem(pdf).unwrap();
    doc.get_pages()
        .values()
        .map(|&id| {
            let page = doc.get_dictionary(id).unwrap();
            let mb = page.get(b"MediaBox").unwrap().as_array().unwrap();
            (
                number(&mb[2]) - number(&mb[0]),
                number(&mb[3]) - number(&mb[1]),
            )
        })
        .collect()
}

fn number(o: &Object) -> f64 {
    o.as_float()
        .map(f64::from)
        .or_else(|_| o.as_i64().map(|v| v as f64))
        .unwrap_or_else(|_| panic!("not a number: {o:?}"))
}

/// A font of the page: its ToUnicode encoding and its glyph widths.
struct Font<'a> {
    encoding: Encoding<'a>,
    widths: BTreeMap<u32, f64>,
    default_width: f64,
}

impl Font<'_> {
    /// The width in points of the two-byte glyph codes `codes` at `size`.
    fn width(&self, codes: &[u8], size: f64) -> f64 {
        assert!(codes.len().is_multiple_of(2), "odd glyph string {codes:?}");
        let units: f64 = codes
            .chunks(2)
            .map(|c| u32::from(c[0]) << 8 | u32::from(c[1]))
            .map(|g| *self.widths.get(&g).unwrap_or(&self.default_width))
            .sum();
        units / 1000.0 * size
    }
}

/// The glyph widths of a Type0 font's descendant: `/W` holds runs
/// `first [w1 w2 ...]` and ranges `first last w`.
fn widths(doc: &Document, font: &Dictionary) -> (BTreeMap<u32, f64>, f64) {
    let descendant = match font.get(b"DescendantFonts") {
        Ok(d) => d,
        Err(_) => return (BTreeMap::new(), 500.0),
    };
    let descendants = doc.dereference(descendant).unwrap().1.as_array().unwrap();
    let cid = doc
        .dereference(&descendants[0])
        .unwrap()
        .1
        .as_dict()
        .unwrap();
    let default = cid.get(b"DW").map(number).unwrap_or(1000.0);
    let mut map = BTreeMap::new();
    if let Ok(w) = cid.get(b"W") {
        let w = doc.dereference(w).unwrap().1.as_array().unwrap();
        let mut i = 0;
        while i < w.len() {
            let first = number(&w[i]) as u32;
            if let Ok(list) = w[i + 1].as_array() {
                for (k, v) in list.iter().enumerate() {
                    map.insert(first + k as u32, number(v));
                }
                i += 2;
            } else {
                let last = number(&w[i + 1]) as u32;
                for g in first..=last {
                    map.insert(g, number(&w[i + 2]));
                }
                i += 3;
            }
        }
    }
    (map, default)
}

/// The text runs of every page, in drawing order.
pub fn pdf_runs(pdf: &[u8]) -> Vec<Run> {
    let doc = Document::load_mem(pdf).unwrap();
    let mut runs = Vec::new();
    for (_, page) in doc.get_pages() {
        let fonts: BTreeMap<Vec<u8>, Font> = doc
            .get_page_fonts(page)
            .unwrap()
            .into_iter()
            .map(|(name, dict)| {
                let (widths, default_width) = widths(&doc, dict);
                let encoding = dict.get_font_encoding(&doc).unwrap();
                (
                    name,
                    Font {
                        encoding,
                        widths,
                        default_width,
                    },
                )
            })
            .collect();
        let content = doc.get_and_decode_page_content(page).unwrap();
        let mut font: Option<(&Font, f64)> = None;
        let mut at: Option<(f64, f64)> = None;
        for Operation { operator, operands } in &content.operations {
            match operator.as_str() {
                "BT" => at = Some((0.0, 0.0)),
                "ET" => at = None,
                "Tf" => {
                    let name = operands[0].as_name().unwrap();
                    let face = fonts
                        .get(name)
                        .unwrap_or_else(|| panic!("no font {name:?} on the page"));
                    font = Some((face, number(&operands[1])));
                }
                "Td" => {
                    let (x, y) = at.expect("Td outside a text block");
                    at = Some((x + number(&operands[0]), y + number(&operands[1])));
                }
                "Tj" => {
                    let (x, y) = at.expect("Tj outside a text block");
                    let (face, size) = font.expect("Tj before Tf");
                    let codes = operands[0].as_str().unwrap();
                    let text = Document::decode_text(&face.encoding, codes).unwrap();
                    assert!(
                        !text.contains('\u{FFFD}'),
                        "a glyph without a Unicode value in {text:?}"
                    );
                    let width = face.width(codes, size);
                    runs.push(Run {
                        x,
                        y,
                        size,
                        width,
                        text,
                    });
                    // Further strings in the block would start after this one.
                    at = Some((x + width, y));
                }
                "TJ" | "'" | "\"" | "Tm" | "T*" | "TD" | "Tz" | "Ts" | "cm" => {
                    panic!("the reader does not follow `{operator}`: teach it before relying on it")
                }
                _ => {}
            }
        }
    }
    runs
}

/// Whether `b`, drawn after `a`, carries on `a`'s line: a baseline within
/// a third of the larger size (a subscript is lowered by 0.22 of its
/// line's size) and a start at or after `a`'s end, within a few
/// characters' width. Gives `(carries on, with a space)`.
fn carries_on(a: &Run, b: &Run) -> (bool, bool) {
    let size = a.size.max(b.size);
    let same_line = (a.y - b.y).abs() <= size / 3.0;
    let gap = b.x - a.end();
    let touching = gap.abs() <= 0.05 * size;
    (
        same_line && gap >= -0.05 * size && gap <= 4.0 * size,
        !touching,
    )
}

/// The text of a PDF in drawing order: a string that carries on the line
/// of the one before is joined to it (touching it, as a subscript does,
/// without a space; after a gap with one); any other starts a new line.
/// A paragraph drawn line after line reads in order; fold the white space
/// to read it as written.
pub fn pdf_text(pdf: &[u8]) -> String {
    let mut text = String::new();
    let mut last: Option<Run> = None;
    for run in pdf_runs(pdf) {
        if let Some(prev) = &last {
            match carries_on(prev, &run) {
                (true, false) => {}
                (true, true) => text.push(' '),
                (false, _) => text.push('\n'),
            }
        }
        text.push_str(&run.text);
        last = Some(run);
    }
    text.push('\n');
    text
}

/// The printed lines of a PDF, top to bottom, each with its runs from left
/// to right and its white space folded to single spaces: a table row reads
/// as its cells in order. A run belongs to the line whose baseline lies
/// within a third of its size (so that a subscript stays on its line).
pub fn pdf_lines(pdf: &[u8]) -> Vec<String> {
    let mut runs = pdf_runs(pdf);
    runs.sort_by(|a, b| b.y.total_cmp(&a.y).then(a.x.total_cmp(&b.x)));
    let mut lines: Vec<(f64, Vec<Run>)> = Vec::new();
    for run in runs {
        match lines.last_mut() {
            Some((y, line)) if (*y - run.y).abs() <= run.size / 3.0 => line.push(run),
            _ => lines.push((run.y, vec![run])),
        }
    }
    lines
        .into_iter()
        .map(|(_, mut line)| {
            line.sort_by(|a, b| a.x.total_cmp(&b.x));
            let mut text = String::new();
            let mut prev: Option<&Run> = None;
            for run in &line {
                if let Some(p) = prev
                    && (run.x - p.end()).abs() > 0.05 * run.size
                {
                    text.push(' ');
                }
                text.push_str(&run.text);
                prev = Some(run);
            }
            text.split_whitespace().collect::<Vec<_>>().join(" ")
        })
        .collect()
}
