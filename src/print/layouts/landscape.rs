//! What the one-page A4 landscape reports share (the ledger's history
//! chart and the comparison of plans): the page drawn as a PDF or an SVG
//! by the same layout, checked for overflows, and the PDF's metadata
//! naming the SHA-256 of the data it shows.

use serde::Serialize;

use crate::input::InputError;
use crate::print::canvas::Canvas;
use crate::print::draw::Draw;
use crate::print::fonts::Fonts;
use crate::print::pdf::{Document, PdfPage, save};
use crate::print::svg::SvgPage;
use crate::source::Error;
use crate::standard::text_sha256;

/// The format of a page drawn as a PDF or an SVG: the history chart
/// (`lotsman history --output`) and the comparison page (`lotsman compare
/// --output`).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum HistoryFormat {
    /// A PDF page with the fonts embedded.
    Pdf,
    /// A standalone SVG document.
    Svg,
}

/// The page, mm: A4 turned.
pub const PAGE: (f64, f64) = (297.0, 210.0);

/// The page that `lay` draws, titled `title`, in `format`; `what` names it
/// in a refusal ("the history chart") and `subject` in the PDF's subject,
/// beside the SHA-256 of `data` as JSON.
///
/// # Errors
/// [`InputError`] when the page does not lay out; an output error when
/// the PDF cannot be written.
pub fn landscape_page(
    format: HistoryFormat,
    title: &str,
    (what, subject): (&str, &str),
    data: &impl Serialize,
    lay: impl FnOnce(&mut Canvas),
) -> Result<Vec<u8>, Error> {
    let fonts = Fonts::embedded()?;
    let (pw, ph) = PAGE;
    let mut pdf = PdfPage::new();
    let mut svg = SvgPage::new(PAGE);
    let page: &mut dyn Draw = match format {
        HistoryFormat::Pdf => &mut pdf,
        HistoryFormat::Svg => &mut svg,
    };
    let mut c = Canvas::new(page, &fonts);
    lay(&mut c);
    let laid = c.finish(pw, ph);
    if !laid.is_clean() {
        let all: Vec<String> = laid.overflows.into_iter().chain(laid.faults).collect();
        return Err(InputError::Inconsistent(format!(
            "{what} cannot be laid out: {}",
            all.join("; ")
        ))
        .into());
    }
    match format {
        HistoryFormat::Svg => Ok(svg.finish(title).into_bytes()),
        HistoryFormat::Pdf => {
            let json = serde_json::to_string(data).unwrap_or_default();
            let hash = text_sha256(&json);
            let subject = format!("{subject}, data SHA-256 {hash}");
            let doc = Document {
                title,
                subject: &subject,
                hash: &hash,
                extra: &[],
            };
            save(&doc, &fonts, PAGE, pdf.into_ops())
        }
    }
}
