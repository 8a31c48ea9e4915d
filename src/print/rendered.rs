//! What a sheet's rendering gives back, and why a page is refused when
//! its layout does not come out clean: shared by every kind of sheet.

use super::canvas::Laid;
use super::geometry::Region;
use super::page::Paper;
use crate::input::InputError;
use crate::source::Error;

/// A rendered sheet.
#[derive(Clone, Debug)]
pub struct Sheet {
    /// The PDF.
    pub pdf: Vec<u8>,
    /// SHA-256 of the source text, hex, as printed on the sheet.
    pub source_sha256: String,
    /// The blocks of the layout, for the overlap check.
    pub regions: Vec<Region>,
}

/// The refusal of a sheet whose layout on `paper` left overflows or
/// faults: the texts to shorten, and the blocks that do not fit.
pub(crate) fn refusal(laid: &Laid, paper: Paper) -> Error {
    let mut parts = Vec::new();
    if !laid.overflows.is_empty() {
        parts.push(format!(
            "{}; shorten the text in the source",
            laid.overflows.join("; ")
        ));
    }
    if !laid.faults.is_empty() {
        let paper_hint = match paper {
            Paper::Letter => " (A4 is taller: try --paper a4)",
            Paper::A4 => "",
        };
        parts.push(format!(
            "{}; the plan is too long for one page{paper_hint}, and the terminal and JSON reports give its tables in full",
            laid.faults.join("; ")
        ));
    }
    InputError::Inconsistent(format!(
        "the sheet cannot be laid out: {}",
        parts.join("; ")
    ))
    .into()
}
