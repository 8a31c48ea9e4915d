//! The printable plan sheet: one A4 or Letter page that an inspector
//! follows at the receiving bench and an auditor files.
//!
//! The numbers come from the library (`evaluate`, `aoql`,
//! `quality_at_pa`, `VariablesPlan::pa`); the page is laid out by
//! [`super::layouts`] from the blocks of [`super::blocks`] and the charts
//! of [`super::chart`], and drawn through a backend: PDF for
//! [`render_sheet`], SVG for [`render_sheet_svg`].
//!
//! Determinism: the date comes from the source, never the clock; fonts
//! are registered under fixed resource names; the document `/ID` is set
//! from the SHA-256 of the source text. The same source and tool version
//! therefore give the same bytes in any process.

use super::agreement::Agreement;
use super::blocks::notice::NOTICE_FIELDS;
use super::canvas::{Canvas, Laid};
use super::draw::Draw;
use super::facts::{Common, Facts, VariablesFacts};
use super::fonts::Fonts;
use super::layouts::single::single_layout;
use super::layouts::staged::staged_layout;
use super::layouts::variables::variables_layout;
use super::metadata::{HASH_PREFIX, SOURCE_NAME_KEY};
use super::names::{notice_of, printed_name};
use super::page::{Paper, printable};
use super::pdf::{self, Document, PdfPage};
use super::rendered::{Sheet, refusal};
use super::standard_sheet::{render_standard_sheet, render_standard_sheet_svg};
use super::standard_source::{not_as_recorded, standard_source_facts};
use super::svg::SvgPage;
use crate::design::RectifyingPlan;
use crate::fs::{Overwrite, write_atomic};
use crate::source::Error;
use crate::source::{Audited, Discrepancy, PlanSource, SourceText};
use crate::source::{Placeholder, placeholders};

/// The page margin of a sheet, mm.
const MARGIN: f64 = 14.0;

/// Renders the sheet of `source` (parsed from `text`, which is hashed);
/// `file_name` is printed in the provenance line, as one shell word in
/// which a character the sheet font lacks stands as the wildcard `?`.
///
/// This prints the plan the source records as it is, and the risks that
/// plan achieves (computed from it). It does not re-solve the source:
/// [`write_sheet`], which the `sheet` command uses, audits the source first
/// and refuses a plan that the audit does not confirm, or prints it with
/// [`render_sheet_noting`].
///
/// # Errors
/// [`Error`] when the source records no plan or the plan is invalid, or
/// when a text does not fit its box even at the smallest size, holds a
/// character the sheet font cannot draw, or two blocks would overlap (a
/// sheet is never printed with overflowing, overlapping or missing text).
///
/// # Example
/// ```
/// use std::path::Path;
/// use lotsman::{DEMO_PLANS, Paper, PlanSource, render_sheet};
/// let (name, text) = DEMO_PLANS[0];
/// let source = PlanSource::from_yaml(text, Path::new(name)).unwrap();
/// let sheet = render_sheet(text, &source, name, Paper::A4).unwrap();
/// assert!(sheet.pdf.starts_with(b"%PDF"));
/// ```
pub fn render_sheet(
    text: &str,
    source: &PlanSource,
    file_name: &str,
    paper: Paper,
) -> Result<Sheet, Error> {
    render(text, source, file_name, paper, None)
}

/// [`render_sheet`] for a recorded plan that the [`audit`](crate::audit) did not confirm,
/// printed at the user's request: a boxed notice above the plan states the
/// `discrepancy` and that the plan is printed as recorded, and the
/// provenance line's command carries `--accept-recorded`.
///
/// # Errors
/// As [`render_sheet`]; the notice, too, must fit its box.
pub fn render_sheet_noting(
    text: &str,
    source: &PlanSource,
    file_name: &str,
    paper: Paper,
    discrepancy: &Discrepancy,
) -> Result<Sheet, Error> {
    render(text, source, file_name, paper, Some(discrepancy))
}

/// What a sheet's page is drawn from: the facts of an attributes plan or
/// of a variables plan.
pub(crate) enum SheetFacts<'a> {
    /// A plan designed from two risk points, or a minimum-inspection plan.
    Attributes(Facts<'a>),
    /// A variables plan.
    Variables(VariablesFacts<'a>),
}

impl<'a> SheetFacts<'a> {
    /// The facts of `source` (parsed from `text`), printed from the file
    /// `file_name` (as the sheet prints it), with the `notice` of an
    /// unconfirmed plan if any.
    ///
    /// # Errors
    /// [`Error`] when the source records no plan or the plan is invalid.
    pub(crate) fn gather(
        source: &'a PlanSource,
        text: &str,
        file_name: &'a str,
        notice: Option<String>,
    ) -> Result<Self, Error> {
        if source.is_variables() {
            let mut facts = VariablesFacts::gather(source, text, file_name)?;
            facts.common.notice = notice;
            return Ok(SheetFacts::Variables(facts));
        }
        let (model, plan, agreement, scheme) = if source.is_rectifying() {
            let request = source.rectifying_request()?;
            let model = *request.model();
            let plan = source.recorded_plan(&model)?;
            let figures = Box::new(RectifyingPlan::new(plan.clone(), &request));
            let scheme = format!("{}, {}", source.scheme.name(), request.scheme().name());
            (
                model,
                plan,
                Agreement::Rectifying { request, figures },
                scheme,
            )
        } else {
            let request = source.request()?;
            let model = request.model;
            let plan = source.recorded_plan(&model)?;
            let scheme = format!("{}, {}", source.scheme.name(), model.kind().name());
            let agreement = Agreement::points(&plan, &model, request.risks);
            (model, plan, agreement, scheme)
        };
        let mut common = Common::new(source, text, file_name, agreement, &model, scheme)?;
        common.notice = notice;
        Ok(SheetFacts::Attributes(Facts {
            common,
            model,
            plan,
        }))
    }

    /// What every sheet shares.
    pub(crate) fn common(&self) -> &Common<'a> {
        match self {
            SheetFacts::Attributes(f) => &f.common,
            SheetFacts::Variables(f) => &f.common,
        }
    }

    /// Lays out the page on `paper` with the backends `new` makes: the
    /// backend drawn on and what the layout left to check.
    ///
    /// # Errors
    /// [`Error`] when the plan's measures or curves are out of range.
    pub(crate) fn lay_out<D: Draw>(
        &mut self,
        fonts: &Fonts,
        paper: Paper,
        new: impl Fn() -> D,
    ) -> Result<(D, Laid), Error> {
        let (pw, ph) = paper.size();
        let page = printable((pw, ph), MARGIN);
        let mut backend = new();
        let mut c = Canvas::new(&mut backend, fonts);
        match self {
            SheetFacts::Variables(f) => {
                variables_layout(&mut c, f, page)?;
                if f.common.notice.is_some() && c.has_faults() && !f.on_log() {
                    // The notice can leave the readings table no room:
                    // the readings then go on a separate log, as a large
                    // sample's do.
                    f.displaced = true;
                    drop(c);
                    backend = new();
                    c = Canvas::new(&mut backend, fonts);
                    variables_layout(&mut c, f, page)?;
                }
            }
            SheetFacts::Attributes(f) => match f.plan.as_single() {
                Some((n, ac)) => single_layout(&mut c, f, page, n, ac)?,
                None => staged_layout(&mut c, f, page)?,
            },
        }
        let laid = c.finish(pw, ph);
        Ok((backend, laid))
    }
}

/// [`render_sheet`] as a standalone SVG document instead of a PDF: the
/// same page, laid out by the same code and refused for the same reasons,
/// with its text as SVG text in the sheet's face, for a browser to show.
///
/// # Errors
/// As [`render_sheet`].
///
/// # Example
/// ```
/// use lotsman::{Paper, PlanSource, render_sheet_svg};
/// let path = std::path::Path::new("plans/tpw-seal-visual.yaml");
/// let text = std::fs::read_to_string(path).unwrap();
/// let source = PlanSource::from_yaml(&text, path).unwrap();
/// let svg = render_sheet_svg(&text, &source, "tpw-seal-visual.yaml", Paper::A4).unwrap();
/// assert!(svg.contains("viewBox=\"0 0 210 297\""));
/// ```
pub fn render_sheet_svg(
    text: &str,
    source: &PlanSource,
    file_name: &str,
    paper: Paper,
) -> Result<String, Error> {
    if source.is_standard() {
        let facts = standard_source_facts(source, text, file_name)?;
        return render_standard_sheet_svg(&facts, paper);
    }
    let fonts = Fonts::embedded()?;
    let shown = printed_name(file_name, &fonts);
    let mut facts = SheetFacts::gather(source, text, &shown, None)?;
    let (page, laid) = facts.lay_out(&fonts, paper, || SvgPage::new(paper.size()))?;
    if !laid.is_clean() {
        return Err(refusal(&laid, paper));
    }
    Ok(page.finish(&facts.common().source.title))
}

/// The sheet of `source`, with the notice of an unconfirmed plan's
/// `discrepancy` if any.
fn render(
    text: &str,
    source: &PlanSource,
    file_name: &str,
    paper: Paper,
    discrepancy: Option<&Discrepancy>,
) -> Result<Sheet, Error> {
    if source.is_standard() {
        if discrepancy.is_some() {
            return Err(not_as_recorded(source));
        }
        let facts = standard_source_facts(source, text, file_name)?;
        return render_standard_sheet(&facts, paper);
    }
    let fonts = Fonts::embedded()?;
    let shown = printed_name(file_name, &fonts);
    let notice = discrepancy.map(|d| notice_of(d, &shown, NOTICE_FIELDS));
    let mut facts = SheetFacts::gather(source, text, &shown, notice)?;
    let (page, laid) = facts.lay_out(&fonts, paper, PdfPage::new)?;
    if !laid.is_clean() {
        return Err(refusal(&laid, paper));
    }
    let common = facts.common();
    let subject = format!("{HASH_PREFIX}{}", common.hash);
    let doc = Document {
        title: &common.source.title,
        subject: &subject,
        hash: &common.hash,
        extra: &[(SOURCE_NAME_KEY, common.file_name)],
    };
    let pdf = pdf::save(&doc, &fonts, paper.size(), page.into_ops())?;
    Ok(Sheet {
        pdf,
        source_sha256: common.hash.clone(),
        regions: laid.regions,
    })
}

/// How [`write_sheet`] treats an existing file at its target and a
/// recorded plan that the audit does not confirm.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct SheetOptions {
    /// Paper size.
    pub paper: Paper,
    /// Print a recorded plan that the [`audit`](crate::audit) does not confirm, with the
    /// discrepancy stated on the page ([`render_sheet_noting`]), instead of
    /// refusing it (`--accept-recorded`).
    pub accept_recorded: bool,
    /// Whether a file already at the target may be replaced (`--force`).
    pub overwrite: Overwrite,
}

/// What [`write_sheet`] found besides the sheet it wrote, for the caller
/// to report.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct SheetNotes {
    /// The discrepancy that a sheet printed with
    /// [`SheetOptions::accept_recorded`] states.
    pub accepted: Option<Discrepancy>,
    /// The fields of the source that still hold a template's placeholder
    /// text, printed on the sheet as they are.
    pub placeholders: Vec<Placeholder>,
}

/// Reads the source at `source_path`, audits its recorded plan (see
/// [`audit`](crate::audit)), renders its sheet and writes it atomically to `target`.
/// Returns the discrepancy that a sheet printed with
/// [`SheetOptions::accept_recorded`] states and the fields that still hold
/// a template's placeholder ([`placeholders`]), for the caller to report.
///
/// # Errors
/// [`Error`] for an unreadable or invalid source, or one whose audit and
/// sheet would pass the work budget ([`source_work`](crate::source_work));
/// [`SourceError::Unconfirmed`](crate::SourceError::Unconfirmed), naming the
/// first differing field with both values, when the audit finds a
/// discrepancy and `accept_recorded` is off; a sheet that cannot be laid
/// out; [`SourceError::Exists`](crate::SourceError::Exists) when the target
/// exists and `overwrite` refuses; a failed write. In every case the target
/// is left as it was.
pub fn write_sheet(
    source_path: &std::path::Path,
    target: &std::path::Path,
    options: &SheetOptions,
) -> Result<SheetNotes, Error> {
    write_sheet_text(&SourceText::read(source_path)?, target, options)
}

/// [`write_sheet`] of a source already read, so that the file is not
/// read again.
///
/// # Errors
/// As [`write_sheet`], but for reading the source.
pub fn write_sheet_text(
    source: &SourceText,
    target: &std::path::Path,
    options: &SheetOptions,
) -> Result<SheetNotes, Error> {
    let (sheet, notes) = sheet_of_text(source, options.paper, options.accept_recorded)?;
    write_atomic(target, &sheet.pdf, options.overwrite)?;
    Ok(notes)
}

/// The sheet [`write_sheet_text`] writes, not written: the source read
/// as `source` audited, and its sheet rendered on `paper` (with the
/// discrepancy stated when `accept_recorded` prints an unconfirmed plan),
/// with what it states or still holds. The same source gives the same
/// bytes as the file the `sheet` command writes.
///
/// # Errors
/// As [`write_sheet_text`], but for writing.
///
/// # Example
/// ```
/// use lotsman::{Paper, SourceText, sheet_of_text};
/// let read = SourceText::read(std::path::Path::new("plans/tpw-seal-visual.yaml")).unwrap();
/// let (sheet, notes) = sheet_of_text(&read, Paper::A4, false).unwrap();
/// assert!(sheet.pdf.starts_with(b"%PDF"));
/// assert!(notes.accepted.is_none());
/// ```
pub fn sheet_of_text(
    source: &SourceText,
    paper: Paper,
    accept_recorded: bool,
) -> Result<(Sheet, SheetNotes), Error> {
    let name = source
        .path
        .file_name()
        .map_or_else(|| "source.yaml".into(), |n| n.to_string_lossy().to_string());
    let audited = Audited::from_text(source.clone(), accept_recorded, |parsed| {
        crate::source::check_source(parsed, &source.path, crate::source::SourceJob::Sheet)
            .map_err(|e| crate::input::InputError::from(e).into())
    })?;
    let sheet = audited_sheet(&audited, &name, paper)?;
    let notes = SheetNotes {
        placeholders: placeholders(&audited.source),
        accepted: audited.accepted,
    };
    Ok((sheet, notes))
}

/// The sheet of an audited source, printed from the file `name`: with the
/// notice of its discrepancy when it is used as recorded.
pub(crate) fn audited_sheet(audited: &Audited, name: &str, paper: Paper) -> Result<Sheet, Error> {
    match &audited.accepted {
        None => render_sheet(&audited.text, &audited.source, name, paper),
        Some(d) => render_sheet_noting(&audited.text, &audited.source, name, paper, d),
    }
}
