//! Whether a PDF is the sheet that this tool prints from a source, for
//! `verify FILE.yaml --sheet FILE.pdf`.
//!
//! A sheet's metadata can be written by anyone, so the source hash in its
//! subject proves nothing by itself: a hand-made PDF can carry it, and so
//! can another plan's sheet with its subject swapped. Sheets are
//! byte-reproducible (the document ID comes from the source's hash), so the
//! check prints the sheet again from the source, with the options the
//! sheet was printed with, and compares the bytes. The options come from
//! the PDF itself: the paper from its page size, the source's file name
//! (printed in the footer) from [`SOURCE_NAME_KEY`], and `--accept-recorded`
//! from the audit (a plan the audit does not confirm can only have been
//! printed with it, and one it confirms prints the same either way). A
//! forged option only chooses another genuine print, which then differs.
//!
//! A sheet printed by another tool version may differ in its bytes alone;
//! the check says so, and names the version the sheet says it came from
//! (its creator).

use std::path::Path;

use super::geometry::MM_PER_PT;
use super::metadata::{HASH_PREFIX, SOURCE_NAME_KEY, source_hash};
use super::page::Paper;
use super::pdf::text_string;
use super::sheet::audited_sheet;
use crate::source::{Audited, SourceError, SourceText, tool_version};

/// The largest sheet read by [`check_sheet`] (16 MiB; a sheet is about
/// 100 kB), refused by size first.
pub const MAX_SHEET_BYTES: u64 = 16 << 20;

/// How a PDF compares with the sheet its source prints.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum SheetVerdict {
    /// Byte for byte the sheet this tool prints from the source.
    Genuine,
    /// Not the sheet this tool prints from the source: why, in one line
    /// that names the tool version the sheet says it came from; and, when
    /// the sheet carries another source's hash, `(recorded, actual)`.
    Foreign {
        /// Why, in one line.
        reason: String,
        /// The hash the sheet carries and the source's, when they differ.
        hashes: Option<(String, String)>,
    },
    /// The sheet cannot be read or is no lotsman sheet, or the source
    /// cannot be read or printed: the message, naming the file.
    Unreadable(String),
}

/// Checks the PDF at `pdf` against the sheet this tool prints from the
/// source at `source` (see the module docs).
///
/// ```
/// use lotsman::{SheetOptions, Overwrite, Paper, SheetVerdict, check_sheet, write_sheet};
/// let dir = tempfile::tempdir().unwrap();
/// let pdf = dir.path().join("seal.pdf");
/// let source = std::path::Path::new("plans/tpw-seal-visual.yaml");
/// let options = SheetOptions {
///     paper: Paper::Letter,
///     accept_recorded: false,
///     overwrite: Overwrite::Refuse,
/// };
/// write_sheet(source, &pdf, &options).unwrap();
/// assert_eq!(check_sheet(source, &pdf), SheetVerdict::Genuine);
/// let other = std::path::Path::new("plans/tpw-cover-fit.yaml");
/// assert!(matches!(check_sheet(other, &pdf), SheetVerdict::Foreign { .. }));
/// ```
pub fn check_sheet(source: &Path, pdf: &Path) -> SheetVerdict {
    check_against(pdf, || SourceText::read(source))
}

/// [`check_sheet`] against a source already read, so that the source is
/// not read again.
///
/// ```
/// use lotsman::{SheetVerdict, SourceText, check_sheet_text};
/// let source = SourceText::read(std::path::Path::new("plans/tpw-seal-visual.yaml")).unwrap();
/// let verdict = check_sheet_text(&source, std::path::Path::new("no-such.pdf"));
/// assert!(matches!(verdict, SheetVerdict::Unreadable(_)));
/// ```
pub fn check_sheet_text(source: &SourceText, pdf: &Path) -> SheetVerdict {
    check_against(pdf, || Ok(source.clone()))
}

/// The check of [`check_sheet`]: the PDF is read and looked at first, and
/// the source, from `read`, only when the PDF is a lotsman sheet.
fn check_against(
    pdf: &Path,
    read: impl FnOnce() -> Result<SourceText, SourceError>,
) -> SheetVerdict {
    let unreadable = |why: String| SheetVerdict::Unreadable(format!("{}: {why}", pdf.display()));
    let bytes = match crate::fs::read_limited(pdf, MAX_SHEET_BYTES, "a plan sheet") {
        Ok(b) => b,
        Err(e) => return SheetVerdict::Unreadable(crate::plain::io_message(pdf, &e)),
    };
    let info = match SheetInfo::read(&bytes) {
        Ok(info) => info,
        Err(why) => return unreadable(why),
    };
    let Some(recorded) = info.hash.clone() else {
        return unreadable("not a lotsman sheet (no source hash)".into());
    };
    let read = match read() {
        Ok(read) => read,
        Err(e) => return SheetVerdict::Unreadable(e.to_string()),
    };
    let actual = source_hash(&read.text);
    let foreign = |what: String, hashes| SheetVerdict::Foreign {
        reason: format!(
            "{}: the sheet does not come from this source (or this tool version): {what}; {}",
            pdf.display(),
            info.made_by()
        ),
        hashes,
    };
    if recorded != actual {
        return foreign(
            format!("the source SHA-256 it carries, {recorded}, is not this source's, {actual}"),
            Some((recorded, actual)),
        );
    }
    let Some(paper) = info.paper else {
        return foreign("its page is neither A4 nor Letter".into(), None);
    };
    let name = info.source_name.clone().unwrap_or_else(|| {
        read.path
            .file_name()
            .map_or_else(String::new, |n| n.to_string_lossy().to_string())
    });
    // A plan the audit does not confirm can only have been printed with
    // --accept-recorded; one it confirms prints the same either way.
    let reprinted =
        Audited::from_text(read, true, |_| Ok(())).and_then(|a| audited_sheet(&a, &name, paper));
    match reprinted {
        Ok(sheet) if sheet.pdf == bytes => SheetVerdict::Genuine,
        Ok(_) => foreign(
            format!(
                "it carries this source's SHA-256, but it differs from the sheet this source prints on {}, byte for byte",
                paper.name()
            ),
            None,
        ),
        Err(e) => SheetVerdict::Unreadable(format!(
            "{}: the sheet cannot be checked, for the source cannot be printed: {e}",
            pdf.display()
        )),
    }
}

/// What a PDF's metadata and page say about the sheet it claims to be.
struct SheetInfo {
    /// The source hash of the subject.
    hash: Option<String>,
    /// The creator: the tool and version.
    creator: Option<String>,
    /// The source's file name.
    source_name: Option<String>,
    /// The paper of the (first) page, when it is A4 or Letter.
    paper: Option<Paper>,
}

impl SheetInfo {
    /// Reads the document information and the first page's size.
    ///
    /// # Errors
    /// The reason, when the bytes are no readable PDF.
    fn read(pdf: &[u8]) -> Result<Self, String> {
        let not_pdf = |_: lopdf::Error| "not a PDF that can be read".to_string();
        let doc = lopdf::Document::load_mem(pdf).map_err(not_pdf)?;
        let info = doc
            .trailer
            .get(b"Info")
            .and_then(|o| o.as_reference())
            .and_then(|r| doc.get_dictionary(r))
            .map_err(not_pdf)?;
        let text = |key: &[u8]| match info.get(key) {
            Ok(lopdf::Object::String(bytes, _)) => Some(text_string(bytes)),
            _ => None,
        };
        let hash = text(b"Subject").and_then(|s| s.strip_prefix(HASH_PREFIX).map(str::to_string));
        Ok(SheetInfo {
            hash,
            creator: text(b"Creator").filter(|c| !c.is_empty()),
            source_name: text(SOURCE_NAME_KEY.as_bytes()),
            paper: first_page_paper(&doc),
        })
    }

    /// `the sheet says it was made by lotsman 0.1.0; this is lotsman
    /// 0.2.0`, or that it names no version.
    fn made_by(&self) -> String {
        let this = tool_version();
        match &self.creator {
            Some(c) if *c == this => format!("the sheet says it was made by {c}, as this tool is"),
            Some(c) => format!(
                "the sheet says it was made by {}; this is {this}",
                printable(c)
            ),
            None => format!("the sheet names no tool version; this is {this}"),
        }
    }
}

/// The paper of the first page by its media box: A4 or Letter to half a
/// point, else `None`.
fn first_page_paper(doc: &lopdf::Document) -> Option<Paper> {
    let page = *doc.get_pages().values().next()?;
    let media = doc.get_dictionary(page).ok()?.get(b"MediaBox").ok()?;
    let number = |o: &lopdf::Object| {
        o.as_float()
            .map(f64::from)
            .or_else(|_| o.as_i64().map(|v| v as f64))
            .ok()
    };
    let corners: Vec<f64> = media
        .as_array()
        .ok()?
        .iter()
        .map(number)
        .collect::<Option<_>>()?;
    let [x0, y0, x1, y1] = corners.as_slice() else {
        return None;
    };
    let (w, h) = ((x1 - x0) * MM_PER_PT, (y1 - y0) * MM_PER_PT);
    [Paper::A4, Paper::Letter].into_iter().find(|p| {
        let (pw, ph) = p.size();
        // Half a point, in millimetres.
        (w - pw).abs() < 0.18 && (h - ph).abs() < 0.18
    })
}

/// A text from a file, with control characters shown as `?` so that none
/// reaches the terminal raw, and cut at 80 characters.
fn printable(text: &str) -> String {
    text.chars()
        .take(80)
        .map(|ch| if ch.is_control() { '?' } else { ch })
        .collect()
}
