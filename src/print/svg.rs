//! The SVG backend: each drawing operation as an SVG element of a
//! standalone document, for the charts a web page inlines and for a sheet
//! seen in a browser.
//!
//! The document's user units are millimetres (its `viewBox` is the page in
//! mm, its width and height say so), with y turned downwards as SVG has
//! it. Text is `<text>` in the embedded faces' family, which the layout
//! measured; a viewer without DejaVu Sans substitutes a sans-serif face of
//! about the same widths. Lines are `<polyline>`, filled shapes `<path>`
//! or `<rect>`, clipping a `<clipPath>`. Coordinates are written to
//! 0.001 mm, finer than any screen or printer.

use std::fmt::Write;

use super::draw::{Colour, Draw, Face, Font, Stroke};
use super::fonts::FAMILY;
use super::geometry::{Corners, MM_PER_PT, Point, Rect};

/// A page being drawn as SVG elements.
pub struct SvgPage {
    /// Width and height, mm.
    size: (f64, f64),
    /// The elements drawn so far.
    body: String,
    /// Clip paths opened so far, for their ids.
    clips: usize,
}

impl SvgPage {
    /// An empty page `size` (mm) wide and tall.
    pub fn new(size: (f64, f64)) -> Self {
        SvgPage {
            size,
            body: String::new(),
            clips: 0,
        }
    }

    /// The standalone document of the page, titled `title`.
    pub fn finish(self, title: &str) -> String {
        let (w, h) = self.size;
        let (w, h) = (number(w), number(h));
        format!(
            "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n\
             <svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" \
             width=\"{w}mm\" height=\"{h}mm\" viewBox=\"0 0 {w} {h}\" \
             font-family=\"{FAMILY}, Verdana, sans-serif\">\n\
             <title>{}</title>\n\
             <rect x=\"0\" y=\"0\" width=\"{w}\" height=\"{h}\" fill=\"#ffffff\"/>\n\
             {}</svg>\n",
            escape(title),
            self.body
        )
    }

    /// An empty page of the same size to follow this one in a document
    /// of several ([`SvgPage::finish_pages`]): its clip paths are
    /// numbered on from this page's, so that no two share an id.
    pub fn next_page(&self) -> Self {
        SvgPage {
            size: self.size,
            body: String::new(),
            clips: self.clips,
        }
    }

    /// The standalone document of `pages` (of one size), titled `title`:
    /// the pages one below the other, a grey gap between them.
    pub fn finish_pages(pages: Vec<SvgPage>, title: &str) -> String {
        let Some((w, h)) = pages.first().map(|p| p.size) else {
            return String::new();
        };
        let total = h * pages.len() as f64 + PAGE_GAP * (pages.len() - 1) as f64;
        let (ws, ts) = (number(w), number(total));
        let mut out = format!(
            "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n\
             <svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" \
             width=\"{ws}mm\" height=\"{ts}mm\" viewBox=\"0 0 {ws} {ts}\" \
             font-family=\"{FAMILY}, Verdana, sans-serif\">\n\
             <title>{}</title>\n\
             <rect x=\"0\" y=\"0\" width=\"{ws}\" height=\"{ts}\" fill=\"#bfbfbf\"/>\n",
            escape(title)
        );
        for (k, page) in pages.iter().enumerate() {
            let top = number((h + PAGE_GAP) * k as f64);
            let _ = write!(
                out,
                "<g transform=\"translate(0 {top})\">\n\
                 <rect x=\"0\" y=\"0\" width=\"{ws}\" height=\"{}\" fill=\"#ffffff\"/>\n\
                 {}</g>\n",
                number(h),
                page.body
            );
        }
        out.push_str("</svg>\n");
        out
    }

    /// Page y (mm up from the bottom) as SVG y (down from the top).
    fn y(&self, y: f64) -> f64 {
        self.size.1 - y
    }

    /// `x,y x,y ...` of page points.
    fn points(&self, points: &[Point]) -> String {
        let mut out = String::new();
        for (k, &(x, y)) in points.iter().enumerate() {
            if k > 0 {
                out.push(' ');
            }
            let _ = write!(out, "{},{}", number(x), number(self.y(y)));
        }
        out
    }

    /// Path data: each ring of points as `M x y L x y ...`, closed with
    /// `Z` when `closed`.
    fn path_data<'p>(&self, rings: impl IntoIterator<Item = &'p [Point]>, closed: bool) -> String {
        let mut out = String::new();
        for ring in rings {
            for (k, &(x, y)) in ring.iter().enumerate() {
                let op = if k == 0 { 'M' } else { 'L' };
                let _ = write!(out, "{op}{} {}", number(x), number(self.y(y)));
            }
            if closed && !ring.is_empty() {
                out.push('Z');
            }
        }
        out
    }

    /// Path data of boxes `(x0, y0, x1, y1)`.
    fn boxes_data(&self, boxes: &[Corners]) -> String {
        let rings: Vec<[Point; 4]> = boxes
            .iter()
            .map(|&(x0, y0, x1, y1)| [(x0, y0), (x1, y0), (x1, y1), (x0, y1)])
            .collect();
        self.path_data(rings.iter().map(|r| r.as_slice()), true)
    }
}

/// The gap between the pages of a document of several, mm.
const PAGE_GAP: f64 = 8.0;

/// A length or coordinate to 0.001 mm, without trailing zeros.
fn number(v: f64) -> String {
    let s = format!("{v:.3}");
    let s = s.trim_end_matches('0').trim_end_matches('.');
    match s {
        "-0" | "" => "0".to_string(),
        _ => s.to_string(),
    }
}

/// A colour as `#rrggbb`.
fn colour(c: Colour) -> String {
    let channel = |v: f32| (v.clamp(0.0, 1.0) * 255.0).round() as u8;
    format!(
        "#{:02x}{:02x}{:02x}",
        channel(c.r),
        channel(c.g),
        channel(c.b)
    )
}

/// A stroke's attributes; widths and dashes from points to mm.
fn stroke(s: &Stroke) -> String {
    let mut out = format!(
        "fill=\"none\" stroke=\"{}\" stroke-width=\"{}\"",
        colour(s.colour),
        number(s.width * MM_PER_PT)
    );
    if let Some(d) = s.dash {
        let d = number(f64::from(d) * MM_PER_PT);
        let _ = write!(out, " stroke-dasharray=\"{d} {d}\"");
    }
    out
}

/// `text` with the spaces a viewer would collapse (leading, trailing, or
/// beside another space) as no-break spaces, which have the same width:
/// a run of a formula after its subscript starts with a space, and the
/// layout measured every space.
fn keep_spaces(text: &str) -> String {
    let chars: Vec<char> = text.chars().collect();
    let space = |k: Option<&char>| k.is_none_or(|&ch| ch == ' ');
    chars
        .iter()
        .enumerate()
        .map(|(k, &ch)| {
            let before = k.checked_sub(1).and_then(|j| chars.get(j));
            if ch == ' ' && (space(before) || space(chars.get(k + 1))) {
                '\u{a0}'
            } else {
                ch
            }
        })
        .collect()
}

/// Text escaped for XML character data and attribute values.
fn escape(text: &str) -> String {
    let mut out = String::with_capacity(text.len());
    for ch in text.chars() {
        match ch {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&apos;"),
            // XML 1.0 has no place for other control characters.
            ch if ch.is_control() && !matches!(ch, '\t' | '\n' | '\r') => out.push('?'),
            ch => out.push(ch),
        }
    }
    out
}

impl Draw for SvgPage {
    fn text(&mut self, at: Point, text: &str, font: Font, c: Colour) {
        let weight = match font.face {
            Face::Regular => "",
            Face::Bold => " font-weight=\"bold\"",
        };
        let _ = writeln!(
            self.body,
            "<text x=\"{}\" y=\"{}\" font-size=\"{}\"{weight} fill=\"{}\">{}</text>",
            number(at.0),
            number(self.y(at.1)),
            number(font.size * MM_PER_PT),
            colour(c),
            escape(&keep_spaces(text))
        );
    }

    fn line(&mut self, points: &[Point], s: Stroke) {
        let _ = writeln!(
            self.body,
            "<polyline points=\"{}\" {}/>",
            self.points(points),
            stroke(&s)
        );
    }

    fn fill(&mut self, points: &[Point], c: Colour) {
        let _ = writeln!(
            self.body,
            "<path d=\"{}\" fill=\"{}\"/>",
            self.path_data([points], true),
            colour(c)
        );
    }

    fn fill_boxes(&mut self, boxes: &[Corners], c: Colour) {
        let _ = writeln!(
            self.body,
            "<path d=\"{}\" fill=\"{}\"/>",
            self.boxes_data(boxes),
            colour(c)
        );
    }

    fn polylines(&mut self, paths: &[Vec<Point>], width: f64, c: Colour) {
        let drawn = paths.iter().filter(|p| p.len() >= 2).map(|p| p.as_slice());
        let data = self.path_data(drawn, false);
        if data.is_empty() {
            return;
        }
        let _ = writeln!(
            self.body,
            "<path d=\"{data}\" fill=\"none\" stroke=\"{}\" stroke-width=\"{}\" stroke-linejoin=\"round\"/>",
            colour(c),
            number(width * MM_PER_PT)
        );
    }

    fn begin_clip(&mut self, boxes: &[Corners]) {
        self.clips += 1;
        let id = self.clips;
        let _ = writeln!(
            self.body,
            "<clipPath id=\"clip{id}\"><path d=\"{}\"/></clipPath>\n<g clip-path=\"url(#clip{id})\">",
            self.boxes_data(boxes)
        );
    }

    fn end_clip(&mut self) {
        self.body.push_str("</g>\n");
    }

    fn rect_stroke(&mut self, r: Rect, s: Stroke) {
        let _ = writeln!(
            self.body,
            "<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" {}/>",
            number(r.x),
            number(self.y(r.top())),
            number(r.w),
            number(r.h),
            stroke(&s)
        );
    }

    fn rect_fill(&mut self, r: Rect, c: Colour) {
        let _ = writeln!(
            self.body,
            "<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"{}\"/>",
            number(r.x),
            number(self.y(r.top())),
            number(r.w),
            number(r.h),
            colour(c)
        );
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::print::draw::{grey, rgb};

    #[test]
    fn numbers_are_short_and_colours_hex() {
        assert_eq!(number(12.0), "12");
        assert_eq!(number(0.12345), "0.123");
        assert_eq!(number(-0.0001), "0");
        assert_eq!(colour(rgb(0.05, 0.25, 0.55)), "#0d408c");
        assert_eq!(colour(grey(1.0)), "#ffffff");
    }

    #[test]
    fn text_is_escaped_and_y_turned_down() {
        let mut page = SvgPage::new((100.0, 50.0));
        page.text(
            (10.0, 40.0),
            "a < b & \"c\"",
            Font {
                face: Face::Bold,
                size: 7.2,
            },
            grey(0.0),
        );
        assert_eq!(
            page.body,
            "<text x=\"10\" y=\"10\" font-size=\"2.54\" font-weight=\"bold\" fill=\"#000000\">a &lt; b &amp; &quot;c&quot;</text>\n"
        );
    }

    #[test]
    fn spaces_a_viewer_would_collapse_are_kept() {
        assert_eq!(keep_spaces(" = a  b "), "\u{a0}= a\u{a0}\u{a0}b\u{a0}");
        assert_eq!(keep_spaces("a b"), "a b");
        assert_eq!(keep_spaces(" "), "\u{a0}");
    }

    #[test]
    fn clipping_wraps_what_it_clips_in_a_group() {
        let mut page = SvgPage::new((100.0, 50.0));
        page.begin_clip(&[(0.0, 0.0, 10.0, 10.0)]);
        page.fill(&[(1.0, 1.0), (2.0, 1.0), (2.0, 2.0)], grey(0.5));
        page.end_clip();
        let doc = page.finish("t");
        assert!(
            doc.contains("<clipPath id=\"clip1\"><path d=\"M0 50L10 50L10 40L0 40Z\"/></clipPath>")
        );
        assert!(doc.contains(
            "<g clip-path=\"url(#clip1)\">\n<path d=\"M1 49L2 49L2 48Z\" fill=\"#808080\"/>\n</g>"
        ));
    }
}
