//! The sheet of a standard-indexed plan: one A4 or Letter page laid out
//! by [`super::layouts::standard`] from [`StandardFacts`], or two by
//! [`super::layouts::standard_pages`] when one cannot hold it, drawn as a PDF
//! ([`render_standard_sheet`]) or as SVG ([`render_standard_sheet_svg`]).
//!
//! Determinism as for the plan sheet: the date comes from the facts,
//! fonts have fixed resource names, and the document ID, the subject and
//! the source name come from the source's hash and file name, so the same
//! facts and tool version give the same bytes.

use super::canvas::{Canvas, Laid};
use super::draw::Draw;
use super::fonts::Fonts;
use super::geometry::Region;
use super::layouts::standard::standard_layout;
use super::layouts::standard_pages::{engineers_page, inspectors_page};
use super::metadata::{HASH_PREFIX, SOURCE_NAME_KEY};
use super::page::{Paper, printable};
use super::pdf::{self, Document, PdfPage};
use super::rendered::{Sheet, refusal};
use super::standard_facts::StandardFacts;
use super::svg::SvgPage;
use crate::input::InputError;
use crate::source::Error;

/// The page margin, mm, as the plan sheet's.
const MARGIN: f64 = 14.0;

/// Renders the sheet of a standard-indexed plan: the code letter and how
/// it was found, each class's table plans at normal, tightened and
/// reduced inspection with the severity in force marked, the inspector's
/// procedure, the switching rules, the OC curves of the first class
/// sampled (and the switching scheme's when the facts carry it), the
/// true risks with the two-point design beside them, the notes on how the
/// plans were read (arrows, cells from memory), the lot record, the
/// approval, the cautions and the provenance.
///
/// # Errors
/// [`Error`] when the facts do not hang together
/// ([`StandardFacts::check`]) or the source hash is not a SHA-256 in hex;
/// when a plan does not fit its class's model or a curve point is out of
/// range; when a text does not fit its box even at the smallest size,
/// holds a character the sheet font cannot draw, or two blocks would
/// overlap (a sheet is never printed with overflowing, overlapping or
/// missing text).
///
/// # Example
/// ```
/// use lotsman::{ClassRule, InspectionLevel, Model, ModelKind, Paper, Scheme, Severity,
///     SheetDocument, StandardFacts, StandardIndex, StandardRequest, Tables, assess,
///     parse_classes, render_standard_sheet};
/// let index = StandardIndex {
///     lot_size: 1500, level: InspectionLevel::II,
///     classes: parse_classes(&["major=1.0", "minor=4.0"]).unwrap(),
///     severity: Severity::Normal, scheme: Scheme::Single, reduced: true, rule: ClassRule::OwnPlans,
/// };
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// let request = StandardRequest::new(index, model).unwrap();
/// let tables = Tables::builtin().unwrap();
/// let assessment = assess(&request, tables, None, None).unwrap();
/// let document = SheetDocument {
///     title: "Cover plates, visual".into(),
///     file_name: "cover.yaml".into(),
///     source_sha256: "0".repeat(64),
///     regenerate: "lotsman sheet cover.yaml --force".into(),
///     ..SheetDocument::default()
/// };
/// let facts = StandardFacts::from_assessment(document, &assessment, tables).unwrap();
/// let sheet = render_standard_sheet(&facts, Paper::A4).unwrap();
/// assert!(sheet.pdf.starts_with(b"%PDF"));
/// ```
pub fn render_standard_sheet(facts: &StandardFacts, paper: Paper) -> Result<Sheet, Error> {
    let fonts = Fonts::embedded()?;
    let (pages, regions) = lay_out(facts, &fonts, paper, PdfPage::new, |_| PdfPage::new())?;
    let d = &facts.document;
    let subject = format!("{HASH_PREFIX}{}", d.source_sha256);
    let doc = Document {
        title: &d.title,
        subject: &subject,
        hash: &d.source_sha256,
        extra: &[(SOURCE_NAME_KEY, &d.file_name)],
    };
    let ops = pages.into_iter().map(PdfPage::into_ops).collect();
    let pdf = pdf::save_pages(&doc, &fonts, paper.size(), ops)?;
    Ok(Sheet {
        pdf,
        source_sha256: d.source_sha256.clone(),
        regions,
    })
}

/// [`render_standard_sheet`] as a standalone SVG document: the same
/// pages, laid out by the same code and refused for the same reasons, a
/// second page under the first.
///
/// # Errors
/// As [`render_standard_sheet`].
pub fn render_standard_sheet_svg(facts: &StandardFacts, paper: Paper) -> Result<String, Error> {
    let fonts = Fonts::embedded()?;
    let (pages, _) = lay_out(
        facts,
        &fonts,
        paper,
        || SvgPage::new(paper.size()),
        SvgPage::next_page,
    )?;
    Ok(SvgPage::finish_pages(pages, &facts.document.title))
}

/// The pages of `facts` on `paper`, each drawn on a backend from `new`
/// (the second from `next` of the first), with their blocks: one page
/// when the sheet fits it, else two; refused when two are not clean.
/// Page 2's blocks are named "page 2: ..." and stand one page height
/// lower than page 1's, as if the pages lay one under the other, so that
/// an overlap check over them all stays sound.
fn lay_out<D: Draw>(
    facts: &StandardFacts,
    fonts: &Fonts,
    paper: Paper,
    new: impl Fn() -> D,
    next: impl Fn(&D) -> D,
) -> Result<(Vec<D>, Vec<Region>), Error> {
    facts.check()?;
    let hash = &facts.document.source_sha256;
    if hash.len() != 64 || !hash.chars().all(|ch| ch.is_ascii_hexdigit()) {
        return Err(InputError::Inconsistent(format!(
            "the source hash '{hash}' is not a SHA-256 in hex (64 digits)"
        ))
        .into());
    }
    let (pw, ph) = paper.size();
    let area = printable((pw, ph), MARGIN);
    let mut one = new();
    let mut c = Canvas::new(&mut one, fonts);
    standard_layout(&mut c, facts, area)?;
    let laid = c.finish(pw, ph);
    if laid.is_clean() {
        return Ok((vec![one], laid.regions));
    }
    let mut first = new();
    let mut c = Canvas::new(&mut first, fonts);
    inspectors_page(&mut c, facts, area);
    let one = c.finish(pw, ph);
    let mut second = next(&first);
    let mut c = Canvas::new(&mut second, fonts);
    engineers_page(&mut c, facts, area)?;
    let two = c.finish(pw, ph);
    let page_2 = |what: Vec<String>| what.into_iter().map(|w| format!("page 2: {w}"));
    let laid = Laid {
        overflows: one
            .overflows
            .into_iter()
            .chain(page_2(two.overflows))
            .collect(),
        faults: one.faults.into_iter().chain(page_2(two.faults)).collect(),
        regions: one
            .regions
            .into_iter()
            .chain(two.regions.into_iter().map(|r| Region {
                name: format!("page 2: {}", r.name),
                y: r.y - ph,
                ..r
            }))
            .collect(),
    };
    if !laid.is_clean() {
        return Err(refusal(&laid, paper));
    }
    Ok((vec![first, second], laid.regions))
}
