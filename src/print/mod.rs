//! The printable plan sheet: one A4 or Letter page that an inspector follows
//! at the receiving bench and an auditor files.
//!
//! Layout (this file for attribute plans, [`variables`] for variables
//! plans), drawing primitives ([`canvas`]) and charts ([`chart`]) are kept
//! apart from the numbers, which come from the library (`evaluate`,
//! `aoql`, `quality_at_pa`, `VariablesPlan::pa`). The fonts are DejaVu Sans and
//! DejaVu Sans Bold (libre; licence in `src/print/fonts/`), embedded so that
//! alpha, beta, <= and subscripts print as themselves.
//!
//! The trade-off map ([`map`]) is drawn with the same canvas, fonts and
//! page checks.
//!
//! Determinism: the date comes from the source, never the clock; fonts are
//! registered under fixed resource names; the document `/ID` is set from the
//! SHA-256 of the source text. The same source and tool version therefore
//! give the same bytes in any process.

mod canvas;
mod chart;
mod check;
mod draw;
mod fonts;
mod geometry;
mod map;
mod names;
mod pdf;
mod record;
mod rectifying;
mod text;
mod variables;
mod wording;

use sha2::{Digest, Sha256};

use crate::atomic::{Overwrite, write_atomic};
use crate::design::{Protection, RectifyingPlan, RectifyingRequest, design_single};
use crate::error::{Error, InputError};
use crate::model::{Model, ModelKind};
use crate::numeric::Quantity::{Amount, Probability};
use crate::numeric::{NumericalError, Quantity, Short, check};
use crate::plan::{
    Evaluation, Measures, SequentialLines, StagedPlan, aoql, evaluate, largest_asn, measures,
    quality_at_pa,
};
use crate::report::{EvaluationReport, format_quality, format_short, format_significant, words};
use crate::risk::RiskPair;
use crate::source::{
    Audited, Discrepancy, PlanSource, RecordedPlan, attributes_risks, tool_version,
};
use crate::templates::{Placeholder, placeholders};
use canvas::Canvas;
use chart::{Axes, Chart, Mark, Plot, nice_ceiling, nice_step};
pub use check::{MAX_SHEET_BYTES, SOURCE_NAME_KEY, SheetVerdict, check_sheet};
use draw::{Colour, Face, Font, grey, rgb};
use fonts::Fonts;
use geometry::{MM_PER_PT, Rect, Region};
pub use map::{ContourLabel, MapContour, MapPanel, MapQuantity, TradeoffMap, render_tradeoff_map};
use pdf::{Document, PdfPage, text_string};
use text::Shrink;
use wording::sheet as sheet_words;

/// Paper sizes.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Paper {
    /// ISO A4, 210 x 297 mm.
    A4,
    /// US Letter, 215.9 x 279.4 mm.
    Letter,
}

impl Paper {
    fn size(self) -> (f64, f64) {
        match self {
            Paper::A4 => (210.0, 297.0),
            Paper::Letter => (215.9, 279.4),
        }
    }

    /// The paper's name, as messages give it.
    pub fn name(self) -> &'static str {
        match self {
            Paper::A4 => "A4",
            Paper::Letter => "Letter",
        }
    }
}

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

/// The hex SHA-256 of a source text.
pub fn source_hash(text: &str) -> String {
    Sha256::digest(text.as_bytes())
        .iter()
        .map(|b| format!("{b:02x}"))
        .collect()
}

/// The marker that carries the source hash in the PDF's metadata (the
/// document subject), for `verify --sheet`.
pub const HASH_PREFIX: &str = "lotsman-source-sha256:";

/// What the blocks every sheet shares (title block, risk table,
/// signatures, footer) print from, whatever the plan.
struct Common<'a> {
    source: &'a PlanSource,
    recorded: &'a RecordedPlan,
    /// What the plan was agreed on, with what the printed plan achieves.
    agreement: Agreement,
    /// The statement of a discrepancy the audit found, on a sheet printed
    /// as recorded at the user's request.
    notice: Option<String>,
    lot_size: Option<u64>,
    /// The title block's scheme field.
    scheme: String,
    per_unit: bool,
    hash: String,
    file_name: &'a str,
}

/// What the plan on a sheet was agreed on, with what the printed plan
/// achieves there, computed from the plan (the risk table and the OC
/// chart's marks print these, so they always belong to the plan on the
/// page).
enum Agreement {
    /// Two risk points, and the producer's and consumer's risks the plan
    /// achieves at them.
    Points {
        risks: RiskPair,
        achieved: (f64, f64),
    },
    /// A minimum-inspection plan's process average and protection, and
    /// what the plan does under rectifying inspection.
    Rectifying {
        request: RectifyingRequest,
        figures: Box<RectifyingPlan>,
    },
}

impl Agreement {
    /// The two qualities the curves and tables are drawn around: the
    /// producer's and consumer's, or the process average and the LTPD
    /// (for an AOQL protection, the plan's own, where `Pa` falls to 0.10).
    fn qualities(&self) -> (f64, f64) {
        match self {
            Agreement::Points { risks, .. } => (risks.producer().quality, risks.consumer().quality),
            Agreement::Rectifying { request, figures } => (
                request.process_average(),
                match request.protection() {
                    Protection::Ltpd(point) => point.quality,
                    Protection::Aoql(_) => figures.ltpd,
                },
            ),
        }
    }
}

impl<'a> Common<'a> {
    /// The shared facts of `source`, whose plan the caller has validated
    /// (so that a missing plan is reported in the plan's own words).
    fn new(
        source: &'a PlanSource,
        text: &str,
        file_name: &'a str,
        agreement: Agreement,
        model: &Model,
        scheme: String,
    ) -> Result<Self, InputError> {
        let recorded = source
            .plan
            .as_ref()
            .ok_or_else(|| InputError::Inconsistent("no plan".into()))?;
        Ok(Common {
            source,
            recorded,
            agreement,
            notice: None,
            lot_size: model.lot_size(),
            scheme,
            per_unit: model.kind() == ModelKind::Poisson,
            hash: source_hash(text),
            file_name,
        })
    }

    /// A quality as the sheet prints it: percent; for nonconformities per
    /// unit the number per unit, with the number per 100 units in brackets
    /// (`1.5 (150 per 100)`; heads and axes say "per unit").
    fn q(&self, v: f64) -> String {
        if self.per_unit {
            return format!(
                "{} ({} per 100)",
                format_short(v, 4),
                format_short(100.0 * v, 4)
            );
        }
        format_quality(v, false)
    }
}

/// What the blocks of an attributes sheet (a plan designed from two risk
/// points, or a minimum-inspection plan) print from, gathered once.
struct Facts<'a> {
    common: Common<'a>,
    model: Model,
    plan: StagedPlan,
}

impl Facts<'_> {
    /// The qualities of the measures table: eight levels bracketing the
    /// two qualities of the agreement.
    fn default_qualities(&self) -> Vec<f64> {
        match &self.common.agreement {
            Agreement::Points { risks, .. } => {
                crate::plan::default_qualities(&self.plan, &self.model, Some(risks))
            }
            Agreement::Rectifying { request, .. } => request.default_qualities(&self.plan),
        }
    }

    /// The inspector's procedure: a rejected lot is screened under
    /// rectifying inspection, and returned or screened as agreed otherwise.
    fn steps(&self) -> Vec<String> {
        match self.common.agreement {
            Agreement::Points { .. } => words::plan_procedure(&self.plan, self.common.per_unit),
            Agreement::Rectifying { .. } => {
                words::rectifying_procedure(&self.plan, self.common.per_unit)
            }
        }
    }

    /// Whether the plan is a minimum-inspection plan.
    fn rectifying(&self) -> bool {
        matches!(self.common.agreement, Agreement::Rectifying { .. })
    }
}

/// A field of the source, or a dash.
fn given(v: &Option<String>) -> String {
    v.clone()
        .unwrap_or_else(|| sheet_words::NOT_GIVEN.to_string())
}

/// The printable part of the page.
#[derive(Clone, Copy)]
struct Frame {
    left: f64,
    right: f64,
    width: f64,
    /// The page margin, which is also the bottom of the footer.
    margin: f64,
}

/// Height of the footer (cautions and provenance).
const FOOT_H: f64 = 25.0;

/// The chart height below which a sheet is not printed: the curves and
/// their labels would no longer read.
const MIN_CHART_H: f64 = 50.0;

/// One point of the curves against quality, from one evaluation.
#[derive(Clone, Copy)]
struct CurvePoint {
    p: f64,
    pa: f64,
    aoq: f64,
    asn: f64,
}

/// The quality axis and the curve points of a plan: 241 even steps up to
/// where Pa has fallen to 0.02 (or 1.2 p2 if that is further).
fn curve_points(f: &Facts) -> Result<(f64, Vec<CurvePoint>), NumericalError> {
    let upper = f.common.agreement.qualities().1;
    let x_max = nice_ceiling(quality_at_pa(&f.plan, &f.model, 0.02).max(upper * 1.2));
    let points = (0..=240)
        .map(|i| x_max * i as f64 / 240.0)
        .map(|v| v.max(x_max * 1e-6))
        // One evaluation per point serves every curve; a point out of its
        // range stops the sheet rather than bend a curve.
        .map(|p| {
            let m = measures(&f.plan, &f.model, p);
            let (p_short, quality) = (Short(p), Quantity::quality(f.model.kind()));
            check(
                Probability,
                format_args!("Pa at quality {p_short} on the OC curve"),
                m.pa,
            )?;
            check(
                quality,
                format_args!("AOQ at quality {p_short} on the AOQ curve"),
                m.aoq,
            )?;
            check(
                Amount,
                format_args!("ASN at quality {p_short} on the ASN curve"),
                m.asn,
            )?;
            Ok(CurvePoint {
                p,
                pa: m.pa,
                aoq: m.aoq,
                asn: m.asn,
            })
        })
        .collect::<Result<_, NumericalError>>()?;
    Ok((x_max, points))
}

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

/// The sheet of `source`, with the notice of an unconfirmed plan's
/// `discrepancy` if any.
fn render(
    text: &str,
    source: &PlanSource,
    file_name: &str,
    paper: Paper,
    discrepancy: Option<&Discrepancy>,
) -> Result<Sheet, Error> {
    let fonts = Fonts::embedded()?;
    let shown = names::printed_name(file_name, &fonts);
    let file_name = shown.as_str();
    let notice = discrepancy.map(|d| names::notice_of(d, file_name, NOTICE_FIELDS));
    let (pw, ph) = paper.size();
    let mut page = PdfPage::new();
    let mut c = Canvas::new(&mut page, &fonts);
    let margin = 14.0;
    let frame = Frame {
        left: margin,
        right: pw - margin,
        width: pw - 2.0 * margin,
        margin,
    };
    let attributes;
    let mut measured;
    let common = if source.is_variables() {
        measured = variables::Facts::gather(source, text, file_name)?;
        measured.common.notice = notice;
        variables::layout(&mut c, &measured, frame, ph - margin)?;
        if measured.common.notice.is_some() && c.has_faults() && !measured.on_log() {
            // The notice can leave the readings table no room: the
            // readings then go on a separate log, as a large sample's do.
            measured.displaced = true;
            drop(c);
            page = PdfPage::new();
            c = Canvas::new(&mut page, &fonts);
            variables::layout(&mut c, &measured, frame, ph - margin)?;
        }
        &measured.common
    } else {
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
            let achieved = attributes_risks(&plan, &model, &request.risks);
            let risks = request.risks;
            let scheme = format!("{}, {}", source.scheme.name(), model.kind().name());
            (model, plan, Agreement::Points { risks, achieved }, scheme)
        };
        let mut common = Common::new(source, text, file_name, agreement, &model, scheme)?;
        common.notice = notice;
        attributes = Facts {
            common,
            model,
            plan,
        };
        let f = &attributes;
        match f.plan.as_single() {
            Some((n, ac)) => single_layout(&mut c, f, frame, ph - margin, n, ac)?,
            None => staged_layout(&mut c, f, frame, ph - margin)?,
        }
        &attributes.common
    };
    let laid = c.finish(pw, ph);
    if !laid.is_clean() {
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
        return Err(InputError::Inconsistent(format!(
            "the sheet cannot be laid out: {}",
            parts.join("; ")
        ))
        .into());
    }
    let subject = format!("{HASH_PREFIX}{}", common.hash);
    let doc = Document {
        title: &common.source.title,
        subject: &subject,
        hash: &common.hash,
        extra: &[(SOURCE_NAME_KEY, common.file_name)],
    };
    let pdf = pdf::save(&doc, &fonts, (pw, ph), page.into_ops())?;
    Ok(Sheet {
        pdf,
        source_sha256: common.hash.clone(),
        regions: laid.regions,
    })
}

/// The single plan's page: title block, plan box, risk table, OC and AOQ
/// charts side by side, measures table beside the signatures, footer.
fn single_layout(
    c: &mut Canvas,
    f: &Facts,
    frame: Frame,
    mut top: f64,
    n: u64,
    ac: u64,
) -> Result<(), Error> {
    let Frame {
        left,
        right,
        width,
        margin,
    } = frame;
    // A notice takes its room from the title block and the footer, which
    // then have the staged sheets' heights.
    let (title_h, foot_h) = match f.common.notice {
        Some(_) => (STAGED_TITLE_H, STAGED_FOOT_H),
        None => (40.0, FOOT_H),
    };
    let title_h = title_block(c, &f.common, left, top, width, title_h);
    top -= title_h + 4.0;
    top -= notice_block(c, &f.common, left, top, width, NOTICE_LINES);
    // The box is 42 mm, or as tall as the procedure beside the sample
    // needs at 8 points (a rectifying procedure has a longer last step).
    let plan_h = procedure_height(c, f, width - SINGLE_PLAN_COL - 8.0, 8.0).max(42.0);
    single_plan_box(c, f, left, top, width, plan_h, n, ac);
    top -= plan_h + 4.0;
    let risk_h = 20.0;
    risk_table(c, &f.common, left, top, width, risk_h);
    top -= risk_h + 3.0;

    // Charts take the height that the table and footer leave.
    let qualities = f.default_qualities();
    let evaluation = evaluate(&f.plan, &f.model, &qualities)?;
    EvaluationReport::from(&evaluation).check()?;
    let table_h = measures_height(&evaluation, 4.2);
    let foot_top = margin + foot_h;
    let chart_h = (top - 4.0 - table_h - 3.0 - foot_top).min(85.0);
    let chart_w = (width - 6.0) / 2.0;
    let (x_max, points) = curve_points(f)?;
    let chart_top = top - chart_h;
    oc_chart(c, f, &points, x_max, left, chart_top, chart_w, chart_h);
    aoq_chart(
        c,
        f,
        &points,
        x_max,
        left + chart_w + 6.0,
        chart_top,
        chart_w,
        chart_h,
    );
    top = chart_top - 4.0;

    let table_w = 112.0;
    measures_table(c, f, &evaluation, left, top, table_w, table_h);
    let sig_x = left + table_w + 4.0;
    record::record_column(c, f, sig_x, top, right - sig_x, table_h);
    footer(c, &f.common, frame, foot_h, words::CAUTION, "");
    if chart_h < MIN_CHART_H || top - table_h < foot_top + 2.0 {
        c.fault("the page is too short for its blocks".to_string());
    }
    Ok(())
}

/// The sizes the characteristic is printed at, from the largest: it wraps
/// onto as many lines as the block's room holds at each, and shrinks only
/// when they do not fit. Below 7 points it would no longer read on a
/// photocopy at the bench, so at 7 points the block grows instead, up to
/// [`CHARACTERISTIC_LINES`] lines; a longer text is refused.
const CHARACTERISTIC_SIZES: [f64; 3] = [8.0, 7.5, 7.0];
const CHARACTERISTIC_LINES: usize = 5;

/// The title block: title, item and characteristic on the left; plan ID,
/// revision, date, lot size and scheme on the right. The block is
/// `min_h` mm tall, or taller when a long characteristic needs the room;
/// returns its height.
fn title_block(c: &mut Canvas, f: &Common, left: f64, top: f64, width: f64, min_h: f64) -> f64 {
    let source = f.source;
    let right = left + width;
    let black = || grey(0.0);
    let meta_w = 52.0;
    let title_w = width - meta_w - 6.0;
    let field_w = title_w - 23.0;
    // Measured first, for the characteristic's size and the block's
    // height: the title and item above it, and the room they leave.
    let title_h = c
        .fit(
            &source.title,
            Face::Bold,
            title_w,
            13.0,
            Shrink::new(14.0, 8.0),
        )
        .height;
    let item = given(&source.item);
    let item_h = c
        .fit(&item, Face::Regular, field_w, 9.0, Shrink::new(8.0, 5.5))
        .height
        .max(3.5);
    let above = 8.5 + title_h + item_h + 1.5;
    let room = min_h - above - 2.0;
    let characteristic = given(&source.characteristic);
    let height_at = |c: &Canvas, size: f64| {
        let lines = c.wrap(&characteristic, Face::Regular, size, field_w).len();
        size * MM_PER_PT * 1.25 * lines.min(CHARACTERISTIC_LINES) as f64
    };
    let size = CHARACTERISTIC_SIZES
        .into_iter()
        .find(|&s| height_at(c, s) <= room + 1e-6)
        .unwrap_or(CHARACTERISTIC_SIZES[CHARACTERISTIC_SIZES.len() - 1]);
    let characteristic_h = height_at(c, size);
    let block_h = min_h.max(above + characteristic_h.max(3.5) + 2.0);
    c.claim(
        "title block",
        Rect::new(left, top - block_h, width, block_h),
    );
    c.rect_stroke(Rect::new(left, top - block_h, width, block_h), 0.8, black());
    c.text(
        left + 3.0,
        top - 4.5,
        sheet_words::KICKER,
        Face::Bold,
        6.5,
        grey(0.35),
    );
    let title_used = c.paragraph(
        "title",
        Rect::from_top(left + 3.0, top - 6.5, title_w, 13.0),
        &source.title,
        Face::Bold,
        Shrink::new(14.0, 8.0),
    );
    let fields = [
        (sheet_words::ITEM, item, 9.0, 8.0, 5.5),
        // Room for the lines at the size chosen; more lines than that are
        // the paragraph's overflow, and a refusal.
        (
            sheet_words::CHARACTERISTIC,
            characteristic,
            characteristic_h + 1e-6,
            size,
            size,
        ),
    ];
    let mut fy = top - 8.5 - title_used;
    for (label, value, room, size, min_size) in fields {
        c.text(left + 3.0, fy - 2.5, label, Face::Bold, 6.5, grey(0.35));
        let used = c.paragraph(
            label,
            Rect::from_top(left + 26.0, fy, field_w, room),
            &value,
            Face::Regular,
            Shrink::new(size, min_size),
        );
        fy -= used.max(3.5) + 1.5;
    }
    let meta_x = right - meta_w;
    c.line(
        &[(meta_x - 3.0, top), (meta_x - 3.0, top - block_h)],
        0.5,
        black(),
        None,
    );
    let lot = f
        .lot_size
        .map_or(sheet_words::NO_LOT_SIZE.to_string(), |n| {
            format!("{n} units")
        });
    let meta = [
        (sheet_words::PLAN_ID, given(&source.id)),
        (sheet_words::REVISION, given(&source.revision)),
        (sheet_words::DATE, given(&source.date)),
        (sheet_words::LOT_SIZE, lot),
        (sheet_words::SCHEME, f.scheme.clone()),
    ];
    // Five rows spread over the block's height.
    let pitch = (block_h - 5.0) / 5.0;
    for (i, (label, value)) in meta.iter().enumerate() {
        let y = top - 6.0 - pitch * i as f64;
        c.text(meta_x, y, label, Face::Bold, 6.5, grey(0.35));
        c.paragraph(
            label,
            Rect::from_top(meta_x + 17.0, y + 2.6, meta_w - 17.0, 4.0),
            value,
            Face::Regular,
            Shrink::new(8.0, 5.5),
        );
    }
    block_h
}

/// The most differing fields the notice lists (the rest are counted).
const NOTICE_FIELDS: usize = 2;

/// The most lines of a notice across the page.
const NOTICE_LINES: usize = 4;

/// The notice's type size.
const NOTICE_SIZE: f64 = 7.0;

/// The notice of a plan printed as recorded at the user's request: a red
/// box `width` mm wide at `top`, its heading in bold red and the statement
/// running on after it. Returns the height it takes with the gap below it
/// (nothing without a notice); a notice of more than `max_lines` lines is
/// an overflow.
fn notice_block(
    c: &mut Canvas,
    f: &Common,
    left: f64,
    top: f64,
    width: f64,
    max_lines: usize,
) -> f64 {
    let Some(notice) = &f.notice else {
        return 0.0;
    };
    let pad = 1.8;
    let text_w = width - 2.0 * pad;
    let head_w = c.width(sheet_words::NOTICE, Face::Bold, NOTICE_SIZE) + 1.2;
    // The first line: the heading, then the words that fit beside it.
    let words: Vec<&str> = notice.split_whitespace().collect();
    let mut first = String::new();
    let mut taken = 0;
    for word in &words {
        let candidate = if first.is_empty() {
            word.to_string()
        } else {
            format!("{first} {word}")
        };
        if c.width(&candidate, Face::Regular, NOTICE_SIZE) > text_w - head_w {
            break;
        }
        first = candidate;
        taken += 1;
    }
    let rest = words[taken..].join(" ");
    let lead = NOTICE_SIZE * MM_PER_PT * 1.25;
    // More lines than the box holds are the paragraph's overflow below.
    let lines = 1 + c.wrap(&rest, Face::Regular, NOTICE_SIZE, text_w).len();
    let h = 2.0 * pad + lead * lines.min(max_lines) as f64;
    c.claim("notice", Rect::new(left, top - h, width, h));
    c.rect_fill(Rect::new(left, top - h, width, h), rgb(0.99, 0.92, 0.90));
    c.rect_stroke(Rect::new(left, top - h, width, h), 1.4, reject_colour());
    let baseline = top - pad - NOTICE_SIZE * MM_PER_PT;
    c.text(
        left + pad,
        baseline,
        sheet_words::NOTICE,
        Face::Bold,
        NOTICE_SIZE,
        reject_colour(),
    );
    c.text(
        left + pad + head_w,
        baseline,
        &first,
        Face::Regular,
        NOTICE_SIZE,
        grey(0.0),
    );
    c.paragraph(
        "notice",
        Rect::from_top(
            left + pad,
            top - pad - lead,
            text_w,
            lead * max_lines.saturating_sub(1) as f64,
        ),
        &rest,
        Face::Regular,
        Shrink::fixed(NOTICE_SIZE),
    );
    h + GAP
}

/// The plan box's frame: a tinted box with a blue rule.
fn plan_frame(c: &mut Canvas, left: f64, top: f64, width: f64, plan_h: f64) {
    c.claim("plan", Rect::new(left, top - plan_h, width, plan_h));
    c.rect_fill(
        Rect::new(left, top - plan_h, width, plan_h),
        rgb(0.93, 0.95, 0.98),
    );
    c.rect_stroke(
        Rect::new(left, top - plan_h, width, plan_h),
        1.2,
        rgb(0.05, 0.25, 0.55),
    );
}

/// Green for accepting, red for rejecting.
fn accept_colour() -> Colour {
    rgb(0.0, 0.4, 0.1)
}

fn reject_colour() -> Colour {
    rgb(0.6, 0.1, 0.05)
}

/// The width of the single plan box's left column (sample size and
/// decisions).
const SINGLE_PLAN_COL: f64 = 76.0;

/// The single plan's box: the sample size and the two decisions on the
/// left, the procedure on the right.
#[allow(clippy::too_many_arguments)]
fn single_plan_box(
    c: &mut Canvas,
    f: &Facts,
    left: f64,
    top: f64,
    width: f64,
    plan_h: f64,
    n: u64,
    ac: u64,
) {
    plan_frame(c, left, top, width, plan_h);
    let col = SINGLE_PLAN_COL;
    c.heading(left + 4.0, top - 7.0, sheet_words::SAMPLE_SIZE);
    c.text(
        left + 4.0,
        top - 19.0,
        &format!("n = {n}"),
        Face::Bold,
        24.0,
        grey(0.0),
    );
    let what = words::counted(f.common.per_unit);
    let decisions = [
        (
            format!("Accept if ≤ {ac} {what}"),
            top - 27.0,
            accept_colour(),
        ),
        (
            format!("Reject if ≥ {} {what}", ac + 1),
            top - 32.5,
            reject_colour(),
        ),
    ];
    for (line, y, color) in decisions {
        if c.width(&line, Face::Bold, 9.5) > col - 6.0 {
            c.overflow(format!("plan box: '{line}'"));
        }
        c.text(left + 4.0, y, &line, Face::Bold, 9.5, color);
    }
    procedure(
        c,
        f,
        left + col + 4.0,
        top,
        width - col - 8.0,
        top - plan_h + 2.0,
        8.0,
    );
    c.line(
        &[(left + col, top - 3.0), (left + col, top - plan_h + 3.0)],
        0.4,
        grey(0.6),
        None,
    );
}

/// The inspector's procedure under its heading at `(x, top)`, one
/// paragraph per step, each in what the earlier steps left above `bottom`.
fn procedure(c: &mut Canvas, f: &Facts, x: f64, top: f64, w: f64, bottom: f64, size: f64) {
    steps_block(c, &f.steps(), x, top, w, bottom, size);
}

/// Numbered steps under the procedure heading at `(x, top)`, one paragraph
/// per step, each in what the earlier steps left above `bottom`.
fn steps_block(c: &mut Canvas, steps: &[String], x: f64, top: f64, w: f64, bottom: f64, size: f64) {
    c.heading(x, top - 7.0, sheet_words::PROCEDURE);
    let mut step_top = top - 9.0;
    for step in steps {
        let used = c.paragraph(
            "procedure",
            Rect::from_top(x, step_top, w, step_top - bottom),
            step,
            Face::Regular,
            Shrink::new(size, 7.0),
        );
        step_top -= used + 0.8;
    }
}

/// Height the procedure takes in a column `w` mm wide at `size`, heading
/// and bottom padding included (see [`procedure`]).
fn procedure_height(c: &Canvas, f: &Facts, w: f64, size: f64) -> f64 {
    steps_height(c, &f.steps(), w, size)
}

/// Height of [`steps_block`] in a column `w` mm wide at `size`.
fn steps_height(c: &Canvas, steps: &[String], w: f64, size: f64) -> f64 {
    let text: f64 = steps
        .iter()
        .map(|s| {
            c.fit(s, Face::Regular, w, f64::INFINITY, Shrink::fixed(size))
                .height
        })
        .sum();
    11.0 + text + 0.8 * (steps.len() as f64 - 1.0)
}

/// Sizes of the procedure text, largest first, that a staged plan box
/// tries.
const PROCEDURE_SIZES: [f64; 3] = [8.0, 7.5, 7.0];

/// Gap between the blocks of a staged sheet.
const GAP: f64 = 3.0;

/// The staged sheets' title block and footer: a little lower than the
/// single sheet's, for the room the stage or item table needs.
const STAGED_TITLE_H: f64 = 34.0;
const STAGED_FOOT_H: f64 = 17.0;

/// The page of a double, multiple or item-by-item plan: title block; plan
/// box with the stage or item table beside the procedure; risk table; the
/// charts (OC and ASN, and first the decision chart for an item-by-item
/// plan); measures table beside the signatures; footer.
fn staged_layout(c: &mut Canvas, f: &Facts, frame: Frame, mut top: f64) -> Result<(), Error> {
    let Frame {
        left,
        right,
        width,
        margin,
    } = frame;
    let title_h = title_block(c, &f.common, left, top, width, STAGED_TITLE_H);
    top -= title_h + GAP;
    top -= notice_block(c, &f.common, left, top, width, NOTICE_LINES);
    let qualities = f.default_qualities();
    let evaluation = evaluate(&f.plan, &f.model, &qualities)?;
    EvaluationReport::from(&evaluation).check()?;
    let table_h = measures_height(&evaluation, 3.9);
    let foot_top = margin + STAGED_FOOT_H;
    let risk_h = 20.0;
    // The plan box may take what the other blocks leave at the smallest
    // chart height.
    let below_plan = GAP + risk_h + GAP + MIN_CHART_H + GAP + table_h + GAP;
    let plan_max = top - below_plan - foot_top;
    let faults = c.problems();
    let plan_h = match f.plan.sequential_lines() {
        Some(lines) => item_plan_box(c, f, lines, left, top, width, plan_max),
        None => stage_plan_box(c, f, left, top, width, plan_max),
    };
    if c.problems() > faults {
        // The rest would be laid out in what is not there; the plan box's
        // own message says why.
        return Ok(());
    }
    top -= plan_h + GAP;
    risk_table(c, &f.common, left, top, width, risk_h);
    top -= risk_h + GAP;

    let chart_h = (top - GAP - table_h - GAP - foot_top).min(85.0);
    let chart_top = top - chart_h;
    let (x_max, points) = curve_points(f)?;
    match f.plan.sequential_lines() {
        Some(lines) => {
            // Three in a row, the decision chart widest.
            let gap = 4.0;
            let small = (width - 2.0 * gap) * 0.3;
            let wide = width - 2.0 * gap - 2.0 * small;
            decision_chart(c, f, lines, left, chart_top, wide, chart_h);
            let x2 = left + wide + gap;
            oc_chart(c, f, &points, x_max, x2, chart_top, small, chart_h);
            asn_chart(
                c,
                f,
                &points,
                x_max,
                x2 + small + gap,
                chart_top,
                small,
                chart_h,
            );
        }
        None => {
            let chart_w = (width - 6.0) / 2.0;
            oc_chart(c, f, &points, x_max, left, chart_top, chart_w, chart_h);
            // Under rectifying inspection the AOQ is what the protection
            // bounds; otherwise the ASN is what a staged plan saves.
            let second = if f.rectifying() { aoq_chart } else { asn_chart };
            second(
                c,
                f,
                &points,
                x_max,
                left + chart_w + 6.0,
                chart_top,
                chart_w,
                chart_h,
            );
        }
    }
    top = chart_top - GAP;

    let table_w = 112.0;
    measures_table(c, f, &evaluation, left, top, table_w, table_h);
    let sig_x = left + table_w + 4.0;
    record::record_column(c, f, sig_x, top, right - sig_x, table_h);
    footer(c, &f.common, frame, STAGED_FOOT_H, words::CAUTION, "");
    if chart_h < MIN_CHART_H - 1e-9 || top - table_h < foot_top + 2.0 {
        c.fault("the page is too short for its blocks".to_string());
    }
    Ok(())
}

/// One cell of a plan table.
struct Cell {
    text: String,
    face: Face,
    color: Colour,
}

impl Cell {
    fn plain(text: String) -> Self {
        Cell {
            text,
            face: Face::Regular,
            color: grey(0.0),
        }
    }

    fn accept(number: Option<u64>) -> Self {
        Cell {
            text: number.map_or(sheet_words::CANNOT_ACCEPT.to_string(), |a| a.to_string()),
            face: Face::Bold,
            color: accept_colour(),
        }
    }

    fn reject(number: u64) -> Self {
        Cell {
            text: number.to_string(),
            face: Face::Bold,
            color: reject_colour(),
        }
    }
}

/// Size of the two-line heads of a plan table.
const HEAD_SIZE: f64 = 6.5;

/// The type of a plan table's rows: the size of the numbers and the row
/// pitch (mm).
#[derive(Clone, Copy)]
struct RowType {
    size: f64,
    pitch: f64,
}

/// Row types from the largest, which a short stage table takes when the
/// procedure beside it makes the box tall anyway, to the smallest.
const ROW_TYPES: [RowType; 3] = [
    RowType {
        size: 9.5,
        pitch: 5.4,
    },
    RowType {
        size: 8.5,
        pitch: 4.6,
    },
    RowType {
        size: 7.5,
        pitch: 3.9,
    },
];

/// The row types of item tables, which are long: the smallest stage
/// table type, then a tighter one for a table that would not fit.
const ITEM_ROWS: [RowType; 2] = [
    ROW_TYPES[2],
    RowType {
        size: 7.0,
        pitch: 3.5,
    },
];

/// Top of a plan table's first row below its top edge: two head lines and
/// the rule under them.
const TABLE_HEAD_H: f64 = 7.0;

/// Column widths of a plan table: the widest head line or cell, plus room.
fn column_widths<const K: usize>(
    c: &Canvas,
    heads: &[[&str; 2]; K],
    rows: &[[Cell; K]],
    size: f64,
) -> [f64; K] {
    let mut widths = [0.0; K];
    for (j, w) in widths.iter_mut().enumerate() {
        let head = heads[j]
            .iter()
            .map(|h| c.width(h, Face::Bold, HEAD_SIZE))
            .fold(0.0, f64::max);
        let cells = rows
            .iter()
            .map(|r| c.width(&r[j].text, r[j].face, size))
            .fold(0.0, f64::max);
        *w = head.max(cells) + 3.5;
    }
    widths
}

/// A plan table at `(x, top)`: two-line heads, a rule, then one row per
/// entry in the type `rows_in`, every other row tinted; each cell centred
/// in its column. Returns the height used.
#[allow(clippy::too_many_arguments)]
fn plan_table<const K: usize>(
    c: &mut Canvas,
    name: &str,
    x: f64,
    top: f64,
    heads: &[[&str; 2]; K],
    widths: &[f64; K],
    rows: &[[Cell; K]],
    rows_in: RowType,
) -> f64 {
    let RowType { size, pitch } = rows_in;
    let total: f64 = widths.iter().sum();
    let mut cx = x;
    for (head, w) in heads.iter().zip(widths) {
        for (k, line) in head.iter().enumerate() {
            let lw = c.width(line, Face::Bold, HEAD_SIZE);
            let y = top - 2.6 - 2.7 * k as f64;
            c.text(
                cx + (w - lw) / 2.0,
                y,
                line,
                Face::Bold,
                HEAD_SIZE,
                grey(0.25),
            );
        }
        cx += w;
    }
    let rule = top - TABLE_HEAD_H + 0.6;
    c.line(&[(x, rule), (x + total, rule)], 0.5, grey(0.2), None);
    let first = top - TABLE_HEAD_H;
    for (i, row) in rows.iter().enumerate() {
        let row_top = first - pitch * i as f64;
        if i % 2 == 1 {
            c.rect_fill(
                Rect::new(x, row_top - pitch, total, pitch),
                rgb(0.85, 0.89, 0.95),
            );
        }
        let y = row_top - pitch * 0.5 - size * MM_PER_PT * 0.36;
        let mut cx = x;
        for (cell, w) in row.iter().zip(widths) {
            let tw = c.width(&cell.text, cell.face, size);
            if tw > w - 1.0 {
                c.fault(format!("{name}: '{}' is wider than its column", cell.text));
            }
            c.text(
                cx + (w - tw) / 2.0,
                y,
                &cell.text,
                cell.face,
                size,
                cell.color,
            );
            cx += w;
        }
    }
    TABLE_HEAD_H + pitch * rows.len() as f64
}

/// Room above a plan table for the box's heading, and below it for the
/// note and the box's edge.
const TABLE_TOP: f64 = 9.5;
const TABLE_BOTTOM: f64 = 7.0;

/// A stage table's row type and column widths, the width of the box's left
/// column and of the procedure beside it.
type StageColumns = (RowType, [f64; 5], f64, f64);

/// The double or multiple plan's box: the stage table on the left, the
/// procedure on the right; the procedure size by [`choose_box`], then the
/// largest row type that keeps that size and the box height. Returns the
/// box height.
fn stage_plan_box(
    c: &mut Canvas,
    f: &Facts,
    left: f64,
    top: f64,
    width: f64,
    plan_max: f64,
) -> f64 {
    let stages = f.plan.stages();
    let mut drawn = 0;
    let rows: Vec<[Cell; 5]> = stages
        .iter()
        .enumerate()
        .map(|(i, s)| {
            let row = [
                Cell::plain((i + 1).to_string()),
                Cell::plain((s.n - drawn).to_string()),
                Cell::plain(s.n.to_string()),
                Cell::accept(s.accept),
                Cell::reject(s.reject),
            ];
            drawn = s.n;
            row
        })
        .collect();
    let heads = &sheet_words::STAGE_HEADS;
    let form = match &f.common.agreement {
        Agreement::Rectifying { request, .. } => request.scheme(),
        Agreement::Points { .. } => f.common.source.scheme,
    };
    let heading = sheet_words::stages_heading(form.name(), stages.len(), f.plan.max_sample());
    // The box for each row type: (procedure size, height, (type, widths,
    // left column, procedure width)).
    let layout = |c: &mut Canvas, rows_in: RowType| {
        let widths = column_widths(c, heads, &rows, rows_in.size);
        let table_w: f64 = widths
            .iter()
            .sum::<f64>()
            .max(c.width(&heading, Face::Bold, 7.0));
        let col = table_w + 8.0;
        let proc_w = width - col - 8.0;
        let table_need =
            TABLE_TOP + TABLE_HEAD_H + rows_in.pitch * rows.len() as f64 + TABLE_BOTTOM;
        let options: Vec<(f64, f64, StageColumns)> = PROCEDURE_SIZES
            .iter()
            .map(|&size| {
                let h = procedure_height(c, f, proc_w, size).max(table_need);
                (size, h, (rows_in, widths, col, proc_w))
            })
            .collect();
        options
    };
    let smallest = layout(c, ROW_TYPES[ROW_TYPES.len() - 1]);
    let what = format!(
        "the stage table ({} stages) and the procedure",
        stages.len()
    );
    let Some(plain) = choose_box(c, &what, &smallest, plan_max) else {
        return 0.0;
    };
    // A larger type where it costs the procedure no size and the box no
    // height.
    let chosen = ROW_TYPES
        .iter()
        .find_map(|&t| {
            layout(c, t)
                .into_iter()
                .find(|o| o.0 == plain.0 && o.1 <= plain.1 + 1e-9)
        })
        .unwrap_or(plain);
    let (size, plan_h, (rows_in, widths, col, proc_w)) = chosen;
    plan_frame(c, left, top, width, plan_h);
    c.heading(left + 4.0, top - 7.0, &heading);
    let used = plan_table(
        c,
        "stage table",
        left + 4.0,
        top - TABLE_TOP,
        heads,
        &widths,
        &rows,
        rows_in,
    );
    let note = sheet_words::stage_note(stages.iter().any(|s| s.accept.is_none()));
    table_box_rest(
        c,
        f,
        TableBox {
            left,
            top,
            col,
            proc_w,
            plan_h,
            used,
            size,
        },
        "stage table note",
        note,
    )
}

/// Where a table plan box stands: its corner and column widths, its
/// height, the height its table used and the procedure's type size.
struct TableBox {
    left: f64,
    top: f64,
    col: f64,
    proc_w: f64,
    plan_h: f64,
    used: f64,
    size: f64,
}

/// The rest of a plan box with a table on the left: the note under the
/// table, the procedure on the right and the rule between them; returns the
/// box height.
fn table_box_rest(c: &mut Canvas, f: &Facts, b: TableBox, region: &str, note: &str) -> f64 {
    let TableBox {
        left,
        top,
        col,
        proc_w,
        plan_h,
        used,
        size,
    } = b;
    c.paragraph(
        region,
        Rect::from_top(
            left + 4.0,
            top - TABLE_TOP - used - 1.0,
            col - 6.0,
            plan_h - TABLE_TOP - used - 2.0,
        ),
        note,
        Face::Regular,
        Shrink::new(6.5, 5.5),
    );
    procedure(
        c,
        f,
        left + col + 4.0,
        top,
        proc_w,
        top - plan_h + 2.0,
        size,
    );
    c.line(
        &[(left + col, top - 3.0), (left + col, top - plan_h + 3.0)],
        0.4,
        grey(0.6),
        None,
    );
    plan_h
}

/// Extra chart height a plan box leaves when it can: below it, the
/// procedure goes down a size rather than squeeze the charts.
const CHART_COMFORT: f64 = 12.0;

/// Of the candidate boxes `(size, height, layout)`, the one that leaves
/// the charts [`CHART_COMFORT`] above their least height, else the one
/// that stays within `plan_max`; among those the largest procedure size,
/// then the lowest box. When none stays within `plan_max`, the lowest box
/// and an overflow.
fn choose_box<T: Copy>(
    c: &mut Canvas,
    what: &str,
    options: &[(f64, f64, T)],
    plan_max: f64,
) -> Option<(f64, f64, T)> {
    for budget in [plan_max - CHART_COMFORT, plan_max] {
        let best = options
            .iter()
            .filter(|o| o.1 <= budget)
            .max_by(|a, b| a.0.total_cmp(&b.0).then(b.1.total_cmp(&a.1)));
        if let Some(&o) = best {
            return Some(o);
        }
    }
    let lowest = options.iter().min_by(|a, b| a.1.total_cmp(&b.1)).copied();
    if let Some((_, h, _)) = lowest {
        c.fault(format!(
            "{what} need {h:.0} mm and the page leaves {plan_max:.0} mm"
        ));
    }
    lowest
}

/// The most columns an item table is split into. Three columns of about
/// 47 mm would leave the procedure beside them under its least width on
/// either paper, and a procedure below them would cost more height than
/// the third column saves, for any table the page can hold.
const MAX_ITEM_COLUMNS: usize = 2;

/// The narrowest the procedure may be beside an item table.
const MIN_PROCEDURE_W: f64 = 58.0;

/// The item-by-item plan's box: the item table (in one or two columns)
/// and the lines it comes from on the left, the procedure on the right;
/// the split and the procedure size by [`choose_box`]. When no split fits,
/// an overflow: the table is never cut short. Returns the box height.
#[allow(clippy::too_many_arguments)]
fn item_plan_box(
    c: &mut Canvas,
    f: &Facts,
    lines: &SequentialLines,
    left: f64,
    top: f64,
    width: f64,
    plan_max: f64,
) -> f64 {
    let runs = lines.runs();
    let rows: Vec<[Cell; 3]> = runs
        .iter()
        .map(|r| {
            [
                Cell::plain(sheet_words::units(r.first, r.last)),
                Cell::accept(r.accept),
                Cell::reject(r.reject),
            ]
        })
        .collect();
    let heads = &sheet_words::ITEM_HEADS;
    let heading = sheet_words::items_heading(lines.truncation);
    let gutter = 4.0;
    let note = sheet_words::item_note(lines.h_accept, lines.h_reject, lines.slope);
    // Every split that leaves the procedure its width, at every procedure
    // size; the tighter row type only when the first fits nowhere.
    let splits = |c: &mut Canvas, rows_in: RowType| {
        let widths = column_widths(c, heads, &rows, rows_in.size);
        let one: f64 = widths.iter().sum();
        let mut options = Vec::new();
        for k in 1..=MAX_ITEM_COLUMNS.min(runs.len()) {
            let per = runs.len().div_ceil(k);
            let table_w = (one * k as f64 + gutter * (k as f64 - 1.0)).max(c.width(
                &heading,
                Face::Bold,
                7.0,
            ));
            let col = table_w + 8.0;
            let proc_w = width - col - 8.0;
            if proc_w < MIN_PROCEDURE_W {
                continue;
            }
            let note_h = c
                .fit(
                    &note,
                    Face::Regular,
                    col - 6.0,
                    f64::INFINITY,
                    Shrink::fixed(6.5),
                )
                .height;
            let table_need =
                TABLE_TOP + TABLE_HEAD_H + rows_in.pitch * per as f64 + 2.0 + note_h + 2.0;
            for size in PROCEDURE_SIZES {
                let h = procedure_height(c, f, proc_w, size).max(table_need);
                options.push((size, h, (col, proc_w, per, rows_in, widths)));
            }
        }
        options
    };
    let mut options = splits(c, ITEM_ROWS[0]);
    if options.iter().all(|o| o.1 > plan_max) {
        options.extend(splits(c, ITEM_ROWS[1]));
    }
    let what = format!(
        "the item table ({} rows, in up to {MAX_ITEM_COLUMNS} columns) and the procedure",
        runs.len()
    );
    let Some((size, plan_h, (col, proc_w, per, rows_in, widths))) =
        choose_box(c, &what, &options, plan_max)
    else {
        c.fault(format!(
            "the item table ({} rows) leaves the procedure no room",
            runs.len()
        ));
        return 0.0;
    };
    let one: f64 = widths.iter().sum();
    plan_frame(c, left, top, width, plan_h);
    c.heading(left + 4.0, top - 7.0, &heading);
    let mut used: f64 = 0.0;
    for (j, chunk) in rows.chunks(per).enumerate() {
        let x = left + 4.0 + (one + gutter) * j as f64;
        used = used.max(plan_table(
            c,
            "item table",
            x,
            top - TABLE_TOP,
            heads,
            &widths,
            chunk,
            rows_in,
        ));
    }
    table_box_rest(
        c,
        f,
        TableBox {
            left,
            top,
            col,
            proc_w,
            plan_h,
            used,
            size,
        },
        "item table note",
        &note,
    )
}

/// The ASN curve against quality, with the single plan's sample size as a
/// dashed reference and the ASN at the producer's point and the largest
/// ASN marked.
#[allow(clippy::too_many_arguments)]
fn asn_chart(
    c: &mut Canvas,
    f: &Facts,
    points: &[CurvePoint],
    x_max: f64,
    x: f64,
    y: f64,
    w: f64,
    h: f64,
) {
    let asn: Vec<(f64, f64)> = points.iter().map(|pt| (pt.p, pt.asn)).collect();
    let p1 = f.common.agreement.qualities().0;
    let at_p1 = measures(&f.plan, &f.model, p1).asn;
    let (q_max, asn_max) = largest_asn(&f.plan, &f.model);
    let single_n = match &f.common.agreement {
        Agreement::Points { risks, .. } => design_single(&f.model, risks).ok().map(|d| d.n),
        Agreement::Rectifying { .. } => None,
    };
    let top_value = single_n.map_or(asn_max, |n| asn_max.max(n as f64));
    let y_max = nice_ceiling(top_value * 1.15);
    let axis = quality_tick(f.common.per_unit);
    let count = |v: f64, step: f64| chart::tick_label(v, step, 1.0, "");
    let plot = Plot::new(x, y, w, h, x_max, y_max);
    chart::frame(
        c,
        "ASN chart",
        &plot,
        &Axes {
            title: sheet_words::ASN_TITLE,
            x_label: sheet_words::quality_axis(f.common.per_unit),
            y_label: sheet_words::ASN_AXIS,
            x_max,
            y_max,
            x_tick: &axis,
            y_tick: &count,
            x_step: None,
            y_step: None,
        },
    );
    let avoid: Vec<chart::LabelBox> = single_n
        .iter()
        .map(|&n| chart::horizontal_guide(c, &plot, n as f64, &sheet_words::single_reference(n)))
        .collect();
    chart::curve(c, &plot, &asn, 1.3, chart::curve_colour(), None);
    let marks = [
        Mark {
            x: p1,
            y: at_p1,
            label: sheet_words::asn_at_p1(at_p1).join(" "),
            stacked: Some(sheet_words::asn_at_p1(at_p1)),
        },
        Mark {
            x: q_max,
            y: asn_max,
            label: sheet_words::largest_asn(asn_max, &f.common.q(q_max)).join(" "),
            stacked: Some(sheet_words::largest_asn(asn_max, &f.common.q(q_max))),
        },
    ];
    let guide_y = single_n.map(|n| plot.sy(n as f64));
    chart::marks(c, &plot, &marks, None, guide_y, &[&asn], &avoid);
}

/// The decision chart of an item-by-item plan: units inspected across,
/// running count up; the accept, continue and reject zones shaded and
/// bounded by the stepped acceptance and rejection numbers; the two lines
/// dashed; the truncation marked.
///
/// A number applies after `n` units, so each run of units `first..=last`
/// is drawn from `first - 1` to `last`.
fn decision_chart(
    c: &mut Canvas,
    f: &Facts,
    lines: &SequentialLines,
    x: f64,
    y: f64,
    w: f64,
    h: f64,
) {
    let runs = lines.runs();
    let t = lines.truncation as f64;
    let top_reject = runs.iter().map(|r| r.reject).max().unwrap_or(1);
    let y_max = (top_reject + 1) as f64;
    let plot = Plot::new(x, y, w, h, t, y_max);
    // The stepped numbers as page polylines in data units.
    let mut reject_steps = Vec::new();
    let mut accept_steps = Vec::new();
    for r in &runs {
        let (a, b) = ((r.first - 1) as f64, r.last as f64);
        reject_steps.push((a, r.reject as f64));
        reject_steps.push((b, r.reject as f64));
        if let Some(acc) = r.accept {
            accept_steps.push((a, acc as f64));
            accept_steps.push((b, acc as f64));
        }
    }
    // Zones first, so that the gridlines stay visible over them.
    chart::zone(
        c,
        &plot,
        &[(0.0, 0.0), (t, 0.0), (t, y_max), (0.0, y_max)],
        rgb(1.0, 0.97, 0.86),
    );
    let mut reject_zone = reject_steps.clone();
    reject_zone.extend([(t, y_max), (0.0, y_max)]);
    chart::zone(c, &plot, &reject_zone, rgb(0.98, 0.86, 0.84));
    if let (Some(&(a0, _)), Some(&(b1, _))) = (accept_steps.first(), accept_steps.last()) {
        let mut accept_zone = vec![(a0, 0.0)];
        accept_zone.extend(accept_steps.iter().copied());
        accept_zone.push((b1, 0.0));
        chart::zone(c, &plot, &accept_zone, rgb(0.84, 0.94, 0.85));
    }
    let count = |v: f64, step: f64| chart::tick_label(v, step, 1.0, "");
    let y_label = sheet_words::decision_y(f.common.per_unit);
    chart::frame(
        c,
        "decision chart",
        &plot,
        &Axes {
            title: sheet_words::DECISION_TITLE,
            x_label: sheet_words::DECISION_X,
            y_label: &y_label,
            x_max: t,
            y_max,
            x_tick: &count,
            y_tick: &count,
            x_step: None,
            y_step: Some(if y_max <= 12.0 { 1.0 } else { nice_step(y_max) }),
        },
    );
    // The lines, where they lie inside the chart.
    let line_at = |n: f64, intercept: f64| lines.slope * n + intercept;
    let dash = Some(1.5);
    chart::curve(
        c,
        &plot,
        &[
            (0.0, line_at(0.0, lines.h_reject)),
            (t, line_at(t, lines.h_reject)),
        ],
        0.6,
        grey(0.25),
        dash,
    );
    let n0 = lines.h_accept / lines.slope;
    if n0 < t {
        chart::curve(
            c,
            &plot,
            &[(n0, 0.0), (t, line_at(t, -lines.h_accept))],
            0.6,
            grey(0.25),
            dash,
        );
    }
    chart::curve(c, &plot, &reject_steps, 1.2, reject_colour(), None);
    if !accept_steps.is_empty() {
        chart::curve(c, &plot, &accept_steps, 1.2, accept_colour(), None);
    }
    // The truncation: the last unit decides every count.
    let tx = plot.sx(t);
    let fa = plot.sy(lines.final_acceptance as f64);
    c.line(&[(tx, plot.bottom), (tx, fa)], 2.0, accept_colour(), None);
    c.line(
        &[
            (tx, plot.sy((lines.final_acceptance + 1) as f64)),
            (tx, plot.top),
        ],
        2.0,
        reject_colour(),
        None,
    );
    // Zone labels, each where it fits inside its zone. The numbers never
    // fall as n grows (before the truncation item), so over a span of
    // units the zone between them is narrowest at its ends: one test per
    // position. A label without room is left out; the colours say the same.
    let size = 6.5;
    let label_h = size * MM_PER_PT * 0.75;
    let pad = 0.8;
    let per_unit_mm = (plot.right - plot.left) / t;
    // The unit whose step the page x `px` lies on (units n - 1 to n).
    let unit_at = |px: f64| {
        (((px - plot.left) / per_unit_mm).floor() as u64 + 1)
            .min(lines.truncation - 1)
            .max(1)
    };
    let accept_at = |n: u64| lines.acceptance_number(n).map_or(0.0, |a| a as f64);
    let reject_at = |n: u64| lines.rejection_number(n) as f64;
    let last_open = (t - 1.0).max(0.0);
    let zone_label = |c: &mut Canvas, lx: f64, ly: f64, label: &str, color: Colour| {
        c.text(lx, ly, label, Face::Bold, size, color);
    };
    // Reject: top left, above the rejection numbers.
    let rw = c.width(sheet_words::REJECT_ZONE, Face::Bold, size);
    let (rx, ry) = (plot.left + 1.5, plot.top - 1.0 - label_h);
    if plot.sy(reject_at(unit_at(rx + rw))) + pad <= ry - 0.3 {
        zone_label(c, rx, ry, sheet_words::REJECT_ZONE, reject_colour());
    }
    // Accept: bottom right, below the acceptance numbers, clear of the
    // truncation item.
    let aw = c.width(sheet_words::ACCEPT_ZONE, Face::Bold, size);
    let (ax, ay) = (plot.sx(last_open) - 1.5 - aw, plot.bottom + 1.0);
    if ax > plot.left && plot.sy(accept_at(unit_at(ax))) >= ay + label_h + pad {
        zone_label(c, ax, ay, sheet_words::ACCEPT_ZONE, accept_colour());
    }
    // Go on: where the open counts leave the most room, away from the
    // other two labels.
    let cw = c.width(sheet_words::CONTINUE_ZONE, Face::Bold, size);
    let room = |lx: f64| {
        let (n0, n1) = (unit_at(lx), unit_at(lx + cw));
        (plot.sy(reject_at(n0)), plot.sy(accept_at(n1)))
    };
    let span = plot.sx(last_open) - plot.left - cw - 2.0;
    let best = (0..=40)
        .map(|i| plot.left + 1.0 + span * i as f64 / 40.0)
        // Left of the accept label, which sits at the bottom right.
        .filter(|&lx| lx + cw < ax - 1.0)
        .map(|lx| {
            let (top_y, bottom_y) = room(lx);
            (lx, top_y - bottom_y, 0.5 * (top_y + bottom_y))
        })
        .max_by(|p, q| p.1.total_cmp(&q.1));
    if let Some((lx, gap, mid_y)) = best
        && gap >= label_h + 2.0 * pad
    {
        zone_label(
            c,
            lx,
            mid_y - label_h / 2.0,
            sheet_words::CONTINUE_ZONE,
            rgb(0.45, 0.35, 0.05),
        );
    }
    // The truncation, on the title's line at the right, above its bar.
    let trunc = sheet_words::truncation(lines.truncation, lines.final_acceptance);
    let tw = c.width(&trunc, Face::Regular, size);
    c.text(
        tx - tw,
        y + h - 3.5,
        &trunc,
        Face::Regular,
        size,
        grey(0.15),
    );
    let title_w = c.width(sheet_words::DECISION_TITLE, Face::Bold, 8.0);
    if title_w + 2.0 + tw > tx - x {
        c.fault(format!("decision chart: '{trunc}' has no room"));
    }
}

/// The risk table: each agreed point against what the plan achieves.
fn risk_table(c: &mut Canvas, f: &Common, left: f64, top: f64, width: f64, risk_h: f64) {
    let (risks, achieved) = match &f.agreement {
        Agreement::Points { risks, achieved } => (risks, achieved),
        Agreement::Rectifying { request, figures } => {
            let agreed = (request, figures.as_ref());
            return rectifying::protection_table(c, f, agreed, left, top, width, risk_h);
        }
    };
    let right = left + width;
    let black = || grey(0.0);
    let (producer, consumer) = (risks.producer(), risks.consumer());
    c.claim("risks", Rect::new(left, top - risk_h, width, risk_h));
    c.heading(left, top - 3.5, sheet_words::RISKS);
    let cols = [left, left + 52.0, left + 84.0, left + 128.0, right];
    let row_y = |i: usize| top - 8.5 - 5.0 * i as f64;
    for (i, h) in sheet_words::risk_heads(f.per_unit).iter().enumerate() {
        let w = cols[i + 1] - cols[i] - 2.0;
        c.cell(
            "risk table",
            (cols[i] + 1.0, row_y(0)),
            w,
            h,
            Font {
                face: Face::Bold,
                size: 7.5,
            },
            black(),
        );
    }
    c.line(
        &[(left, row_y(0) - 1.5), (right, row_y(0) - 1.5)],
        0.5,
        black(),
        None,
    );
    let (alpha, beta) = *achieved;
    let rows = [
        (
            sheet_words::PRODUCER_POINT,
            f.q(producer.quality),
            format!("α ≤ {}", Short(producer.risk)),
            format!(
                "α = {}  (Pa = {:.4})",
                format_significant(alpha, 3),
                1.0 - alpha
            ),
        ),
        (
            sheet_words::CONSUMER_POINT,
            f.q(consumer.quality),
            format!("β ≤ {}", Short(consumer.risk)),
            format!("β = {}  (Pa = {:.4})", format_significant(beta, 3), beta),
        ),
    ];
    for (i, r) in rows.iter().enumerate() {
        let y = row_y(i + 1);
        for (j, cell) in [&r.0.to_string(), &r.1, &r.2, &r.3].iter().enumerate() {
            let w = cols[j + 1] - cols[j] - 2.0;
            c.cell(
                "risk table",
                (cols[j] + 1.0, y),
                w,
                cell,
                Font {
                    face: Face::Regular,
                    size: 7.5,
                },
                black(),
            );
        }
    }
}

/// Quality tick labels: percent, or plain numbers per unit.
fn quality_tick(per_unit: bool) -> impl Fn(f64, f64) -> String {
    let (scale, suffix) = if per_unit { (1.0, "") } else { (100.0, "%") };
    move |v: f64, step: f64| chart::tick_label(v, step, scale, suffix)
}

/// The two risk points as marks on an OC chart, at the Pa the printed
/// plan achieves there.
fn risk_marks(f: &Common) -> [Mark; 2] {
    let (risks, achieved) = match &f.agreement {
        Agreement::Points { risks, achieved } => (risks, achieved),
        Agreement::Rectifying { request, figures } => {
            return rectifying::marks(f, request, figures);
        }
    };
    let (producer, consumer) = (risks.producer(), risks.consumer());
    let pa1 = 1.0 - achieved.0;
    let beta = achieved.1;
    [
        Mark {
            x: producer.quality,
            y: pa1,
            label: format!("p₁ = {}, Pa = {:.3}", f.q(producer.quality), pa1),
            stacked: Some([
                format!("p₁ = {}", f.q(producer.quality)),
                format!("Pa = {pa1:.3}"),
            ]),
        },
        Mark {
            x: consumer.quality,
            y: beta,
            label: format!("p₂ = {}, Pa = {:.3}", f.q(consumer.quality), beta),
            stacked: Some([
                format!("p₂ = {}", f.q(consumer.quality)),
                format!("Pa = {beta:.3}"),
            ]),
        },
    ]
}

/// The OC curve with both risk points marked and the indifference quality.
#[allow(clippy::too_many_arguments)]
fn oc_chart(
    c: &mut Canvas,
    f: &Facts,
    points: &[CurvePoint],
    x_max: f64,
    x: f64,
    y: f64,
    w: f64,
    h: f64,
) {
    let indifference = quality_at_pa(&f.plan, &f.model, 0.5);
    let oc: Vec<(f64, f64)> = points.iter().map(|pt| (pt.p, pt.pa)).collect();
    let axis = quality_tick(f.common.per_unit);
    let prob = |v: f64, step: f64| chart::tick_label(v, step, 1.0, "");
    let marks = risk_marks(&f.common);
    chart::draw(
        c,
        "OC chart",
        x,
        y,
        w,
        h,
        &Chart {
            title: sheet_words::oc_title(c, w),
            x_label: sheet_words::quality_axis(f.common.per_unit),
            y_label: sheet_words::OC_AXIS,
            x_max,
            y_max: 1.0,
            x_tick: &axis,
            y_tick: &prob,
            curve: &oc,
            marks: &marks,
            guide: Some((
                indifference,
                format!("Pa = 0.5 at {}", f.common.q(indifference)),
            )),
        },
    );
}

/// The AOQ curve with the AOQL marked.
#[allow(clippy::too_many_arguments)]
fn aoq_chart(
    c: &mut Canvas,
    f: &Facts,
    points: &[CurvePoint],
    x_max: f64,
    x: f64,
    y: f64,
    w: f64,
    h: f64,
) {
    let limit = aoql(&f.plan, &f.model);
    let aoq: Vec<(f64, f64)> = points.iter().map(|pt| (pt.p, pt.aoq)).collect();
    let axis = quality_tick(f.common.per_unit);
    let marks = [Mark {
        x: limit.quality,
        y: limit.value,
        label: format!("AOQL = {}", f.common.q(limit.value)),
        stacked: None,
    }];
    chart::draw(
        c,
        "AOQ chart",
        x,
        y,
        w,
        h,
        &Chart {
            title: sheet_words::AOQ_TITLE,
            x_label: sheet_words::quality_axis(f.common.per_unit),
            y_label: sheet_words::AOQ_AXIS,
            x_max,
            y_max: nice_ceiling(limit.value * 1.25),
            x_tick: &axis,
            y_tick: &axis,
            curve: &aoq,
            marks: &marks,
            guide: None,
        },
    );
}

/// Height of the measures table of `evaluation`.
fn measures_height(evaluation: &Evaluation, pitch: f64) -> f64 {
    8.0 + pitch * (evaluation.points.len() as f64 + 1.0)
}

/// One column of the measures table: its head and its cells.
struct MeasureColumn {
    head: &'static str,
    cells: Vec<String>,
}

/// The columns of the measures table of `evaluation`: the quality asked
/// (for nonconformities per unit, per unit and per 100 units); under the
/// hypergeometric model the lot's `D` and `D / N`, at which every measure
/// is computed; then Pa, AOQ (per unit and per 100 units for
/// nonconformities), ATI and ASN.
fn measure_columns(f: &Facts, evaluation: &Evaluation) -> Vec<MeasureColumn> {
    let per_unit = f.common.per_unit;
    let points = &evaluation.points;
    let column = |head: &'static str, cell: &dyn Fn(&Measures) -> String| MeasureColumn {
        head,
        cells: points.iter().map(cell).collect(),
    };
    let short = |v: f64| format_short(v, 4);
    let percent = |v: f64| format!("{:.4}%", v * 100.0);
    let mut columns = Vec::new();
    if per_unit {
        columns.push(column(sheet_words::PER_UNIT, &|m| short(m.quality)));
        columns.push(column(sheet_words::PER_100_UNITS, &|m| {
            short(100.0 * m.quality)
        }));
    } else {
        columns.push(column(sheet_words::MEASURE_HEADS[0], &|m| {
            f.common.q(m.quality)
        }));
    }
    if points.iter().any(|m| m.lot_nonconforming.is_some()) {
        columns.push(column(sheet_words::LOT_D, &|m| {
            m.lot_nonconforming
                .map_or(sheet_words::NOT_GIVEN.to_string(), |d| d.to_string())
        }));
        columns.push(column(sheet_words::LOT_QUALITY, &|m| {
            m.lot_quality
                .map_or(sheet_words::NOT_GIVEN.to_string(), |q| f.common.q(q))
        }));
    }
    columns.push(column(sheet_words::MEASURE_HEADS[1], &|m| {
        format!("{:.4}", m.pa)
    }));
    if per_unit {
        columns.push(column(sheet_words::AOQ_PER_UNIT, &|m| short(m.aoq)));
        columns.push(column(sheet_words::AOQ_PER_100_UNITS, &|m| {
            short(100.0 * m.aoq)
        }));
    } else {
        columns.push(column(sheet_words::MEASURE_HEADS[2], &|m| percent(m.aoq)));
    }
    columns.push(column(sheet_words::MEASURE_HEADS[3], &|m| {
        m.ati
            .map_or(sheet_words::NOT_GIVEN.to_string(), |v| format!("{v:.0}"))
    }));
    let single = f.plan.as_single().is_some();
    columns.push(column(sheet_words::MEASURE_HEADS[4], &|m| {
        if single {
            format!("{:.0}", m.asn)
        } else {
            format!("{:.1}", m.asn)
        }
    }));
    columns
}

/// The measures table: Pa, AOQ, ATI and ASN at the default qualities, in
/// the columns of [`measure_columns`]. The first column is left-aligned,
/// the others right-aligned; each is as wide as its widest text, and the
/// room left over is shared between the gaps.
fn measures_table(
    c: &mut Canvas,
    f: &Facts,
    evaluation: &Evaluation,
    left: f64,
    top: f64,
    table_w: f64,
    table_h: f64,
) {
    const SIZE: f64 = 7.0;
    let black = || grey(0.0);
    c.claim("measures", Rect::new(left, top - table_h, table_w, table_h));
    c.heading(left, top - 3.5, sheet_words::MEASURES);
    let columns = measure_columns(f, evaluation);
    let widths: Vec<f64> = columns
        .iter()
        .map(|col| {
            col.cells
                .iter()
                .map(|t| c.width(t, Face::Regular, SIZE))
                .fold(c.width(col.head, Face::Bold, SIZE), f64::max)
        })
        .collect();
    // The rule ends 10 mm short of the table's width, as the rows do.
    let inner = table_w - 11.0;
    let gap = ((inner - widths.iter().sum::<f64>()) / (columns.len() - 1) as f64).min(8.0);
    let pitch = (table_h - 8.0) / (evaluation.points.len() as f64 + 1.0);
    let ty = |i: usize| top - 8.0 - pitch * i as f64;
    let mut x = left + 1.0;
    for (k, (col, &w)) in columns.iter().zip(&widths).enumerate() {
        if k == 0 {
            c.cell(
                "measures table",
                (x, ty(0)),
                w,
                col.head,
                Font {
                    face: Face::Bold,
                    size: SIZE,
                },
                black(),
            );
        } else {
            c.cell_right(
                "measures table",
                (x + w, ty(0)),
                w,
                col.head,
                Font {
                    face: Face::Bold,
                    size: SIZE,
                },
                black(),
            );
        }
        for (i, cell) in col.cells.iter().enumerate() {
            if k == 0 {
                c.cell(
                    "measures table",
                    (x, ty(i + 1)),
                    w,
                    cell,
                    Font {
                        face: Face::Regular,
                        size: SIZE,
                    },
                    black(),
                );
            } else {
                c.cell_right(
                    "measures table",
                    (x + w, ty(i + 1)),
                    w,
                    cell,
                    Font {
                        face: Face::Regular,
                        size: SIZE,
                    },
                    black(),
                );
            }
        }
        x += w + gap;
    }
    if x - gap > left + 1.0 + inner + 1e-6 {
        c.fault("measures table: its columns are wider than the table".to_string());
    }
    c.line(
        &[(left, ty(0) - 1.3), (left + table_w - 10.0, ty(0) - 1.3)],
        0.4,
        black(),
        None,
    );
}

/// The signature block: who prepared and who approved the plan, with lines
/// for the signature and the date.
fn signatures(c: &mut Canvas, f: &Common, sig_x: f64, top: f64, sig_w: f64, table_h: f64) {
    let black = || grey(0.0);
    c.claim(
        "signatures",
        Rect::new(sig_x, top - table_h, sig_w, table_h),
    );
    c.rect_stroke(
        Rect::new(sig_x, top - table_h, sig_w, table_h),
        0.5,
        black(),
    );
    for (i, (label, name)) in [
        (sheet_words::PREPARED_BY, given(&f.source.prepared_by)),
        (sheet_words::APPROVED_BY, given(&f.source.approved_by)),
    ]
    .iter()
    .enumerate()
    {
        let y = top - 5.0 - (table_h / 2.0) * i as f64;
        c.text(sig_x + 2.0, y, label, Face::Bold, 7.0, grey(0.3));
        c.paragraph(
            label,
            Rect::from_top(sig_x + 2.0, y - 1.0, sig_w - 4.0, 4.0),
            name,
            Face::Regular,
            Shrink::new(7.5, 5.5),
        );
        c.line(
            &[(sig_x + 2.0, y - 12.0), (sig_x + sig_w - 26.0, y - 12.0)],
            0.4,
            black(),
            None,
        );
        c.text(
            sig_x + 2.0,
            y - 14.5,
            sheet_words::SIGNATURE,
            Face::Regular,
            6.0,
            grey(0.4),
        );
        c.line(
            &[
                (sig_x + sig_w - 23.0, y - 12.0),
                (sig_x + sig_w - 2.0, y - 12.0),
            ],
            0.4,
            black(),
            None,
        );
        c.text(
            sig_x + sig_w - 23.0,
            y - 14.5,
            sheet_words::SIGNED_ON,
            Face::Regular,
            6.0,
            grey(0.4),
        );
    }
}

/// The footer at the bottom margin: the `caution` and the provenance line,
/// which `more` continues.
fn footer(c: &mut Canvas, f: &Common, frame: Frame, foot_h: f64, caution: &str, more: &str) {
    let Frame {
        left,
        right,
        width,
        margin,
    } = frame;
    let foot_top = margin + foot_h;
    c.claim("footer", Rect::new(left, margin, width, foot_h));
    c.line(&[(left, foot_top), (right, foot_top)], 0.6, grey(0.0), None);
    let used = c.paragraph(
        "caution",
        Rect::from_top(left, foot_top - 1.5, width, 10.0),
        caution,
        Face::Regular,
        Shrink::new(7.0, 5.5),
    );
    let provenance = format!(
        "Generated by {} from {name} (SHA-256 {hash}). Plan solved by {}. \
         Regenerate with: lotsman sheet {name} --force{accept}{more}",
        tool_version(),
        f.recorded.solved_by,
        name = f.file_name,
        hash = f.hash,
        accept = if f.notice.is_some() {
            " --accept-recorded"
        } else {
            ""
        },
    );
    c.paragraph(
        "provenance",
        Rect::from_top(left, foot_top - 3.0 - used, width, 10.0),
        &provenance,
        Face::Regular,
        Shrink::new(6.0, 5.0),
    );
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
    let audited = Audited::load_checked(source_path, options.accept_recorded, |source| {
        crate::budget::check_source(source, source_path, crate::budget::SourceJob::Sheet)
            .map_err(|e| crate::error::InputError::from(e).into())
    })?;
    let name = source_path
        .file_name()
        .map_or_else(|| "source.yaml".into(), |n| n.to_string_lossy().to_string());
    let sheet = audited_sheet(&audited, &name, options.paper)?;
    write_atomic(target, &sheet.pdf, options.overwrite)?;
    Ok(SheetNotes {
        placeholders: placeholders(&audited.source),
        accepted: audited.accepted,
    })
}

/// The sheet of an audited source, printed from the file `name`: with the
/// notice of its discrepancy when it is used as recorded.
pub(crate) fn audited_sheet(audited: &Audited, name: &str, paper: Paper) -> Result<Sheet, Error> {
    match &audited.accepted {
        None => render_sheet(&audited.text, &audited.source, name, paper),
        Some(d) => render_sheet_noting(&audited.text, &audited.source, name, paper, d),
    }
}

/// The source hash recorded in a sheet's metadata, if any.
///
/// # Errors
/// The parse error when `pdf` is not a readable PDF.
pub fn sheet_source_hash(pdf: &[u8]) -> Result<Option<String>, String> {
    let doc = lopdf::Document::load_mem(pdf).map_err(|e| e.to_string())?;
    let info = doc
        .trailer
        .get(b"Info")
        .and_then(|o| o.as_reference())
        .map_err(|e| e.to_string())?;
    let dict = doc.get_dictionary(info).map_err(|e| e.to_string())?;
    let subject = match dict.get(b"Subject") {
        Ok(lopdf::Object::String(bytes, _)) => text_string(bytes),
        _ => return Ok(None),
    };
    Ok(subject.strip_prefix(HASH_PREFIX).map(str::to_string))
}
