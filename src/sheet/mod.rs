//! The printable plan sheet: one A4 or Letter page that an inspector follows
//! at the receiving bench and an auditor files.
//!
//! Layout (this file), drawing primitives ([`canvas`]) and charts
//! ([`chart`]) are kept apart from the numbers, which come from the library
//! (`evaluate`, `aoql`, `quality_at_pa`). The fonts are DejaVu Sans and
//! DejaVu Sans Bold (libre; licence in `src/sheet/fonts/`), embedded so that
//! alpha, beta, <= and subscripts print as themselves.
//!
//! Determinism: the date comes from the source, never the clock; fonts are
//! registered under fixed resource names; the document `/ID` is set from the
//! SHA-256 of the source text. The same source and tool version therefore
//! give the same bytes in any process.

mod canvas;
mod chart;
mod text;

use sha2::{Digest, Sha256};

use crate::design::DesignRequest;
use crate::error::{Error, InputError};
use crate::model::{Model, ModelKind};
use crate::plan::{Evaluation, StagedPlan, aoql, evaluate, measures, quality_at_pa};
use crate::report::{format_quality, format_significant, words};
use crate::source::{PlanSource, RecordedPlan, tool_version};
use canvas::{BOLD_ID, Canvas, Face, REGULAR_ID, Region, grey, rgb};
use chart::{Chart, Mark, nice_ceiling};

const REGULAR_TTF: &[u8] = include_bytes!("fonts/DejaVuSans.ttf");
const BOLD_TTF: &[u8] = include_bytes!("fonts/DejaVuSans-Bold.ttf");

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

/// What every block of the sheet prints from, gathered once.
struct Facts<'a> {
    source: &'a PlanSource,
    recorded: &'a RecordedPlan,
    request: DesignRequest,
    model: Model,
    plan: StagedPlan,
    per_unit: bool,
    hash: String,
    file_name: &'a str,
}

impl Facts<'_> {
    /// A quality as the sheet prints it (percent, or per unit for Poisson).
    fn q(&self, v: f64) -> String {
        format_quality(v, self.per_unit)
    }

    /// Pa at the producer's point, as the source records it.
    fn pa_at_p1(&self) -> f64 {
        1.0 - self.recorded.producer_risk
    }
}

/// A field of the source, or a dash.
fn given(v: &Option<String>) -> String {
    v.clone().unwrap_or_else(|| text::NOT_GIVEN.to_string())
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
}

/// The quality axis and the curve points of a plan: 241 even steps up to
/// where Pa has fallen to 0.02 (or 1.2 p2 if that is further).
fn curve_points(f: &Facts) -> (f64, Vec<CurvePoint>) {
    let consumer = f.request.risks.consumer();
    let x_max = nice_ceiling(quality_at_pa(&f.plan, &f.model, 0.02).max(consumer.quality * 1.2));
    let points = (0..=240)
        .map(|i| x_max * i as f64 / 240.0)
        .map(|v| v.max(x_max * 1e-6))
        // One evaluation per point serves every curve.
        .map(|p| {
            let m = measures(&f.plan, &f.model, p);
            CurvePoint {
                p,
                pa: m.pa,
                aoq: m.aoq,
            }
        })
        .collect();
    (x_max, points)
}

/// Renders the sheet of `source` (parsed from `text`, which is hashed);
/// `file_name` is printed in the provenance line.
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
    let request = source.request()?;
    let model = request.model;
    let plan = source.recorded_plan(&model)?;
    let recorded = source
        .plan
        .as_ref()
        .ok_or_else(|| InputError::Inconsistent("no plan".into()))?;
    let facts = Facts {
        source,
        recorded,
        per_unit: model.kind() == ModelKind::Poisson,
        request,
        model,
        plan,
        hash: source_hash(text),
        file_name,
    };
    let regular = printpdf::ParsedFont::from_bytes(REGULAR_TTF, 0, &mut Vec::new());
    let bold = printpdf::ParsedFont::from_bytes(BOLD_TTF, 0, &mut Vec::new());
    let (Some(regular), Some(bold)) = (regular, bold) else {
        return Err(
            InputError::Inconsistent("the embedded sheet fonts do not parse".into()).into(),
        );
    };
    let (pw, ph) = paper.size();
    let mut c = Canvas::new(&regular, &bold);
    let margin = 14.0;
    let frame = Frame {
        left: margin,
        right: pw - margin,
        width: pw - 2.0 * margin,
        margin,
    };
    match facts.plan.as_single() {
        Some((n, ac)) => single_layout(&mut c, &facts, frame, ph - margin, n, ac)?,
        None => {
            return Err(InputError::Inconsistent(
                "the sheet prints single plans; this source records a staged plan".to_string(),
            )
            .into());
        }
    }
    let Canvas {
        ops,
        regions,
        mut overflows,
        ..
    } = c;
    overflows.extend(placement_faults(&regions, pw, ph));
    if !overflows.is_empty() {
        return Err(InputError::Inconsistent(format!(
            "the sheet cannot be laid out: {}; shorten the text in the source",
            overflows.join("; ")
        ))
        .into());
    }
    let pdf = save(&facts, &regular, &bold, pw, ph, ops)?;
    Ok(Sheet {
        pdf,
        source_sha256: facts.hash,
        regions,
    })
}

/// Blocks that leave the page or overlap another block.
fn placement_faults(regions: &[Region], pw: f64, ph: f64) -> Vec<String> {
    let mut faults = Vec::new();
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
    faults
}

/// The PDF of one page of `ops`, with the fonts, the source hash in the
/// subject and the document ID set from it.
fn save(
    f: &Facts,
    regular: &printpdf::ParsedFont,
    bold: &printpdf::ParsedFont,
    pw: f64,
    ph: f64,
    ops: Vec<printpdf::Op>,
) -> Result<Vec<u8>, Error> {
    let mut warnings = Vec::new();
    let mut doc = printpdf::PdfDocument::new(&f.source.title);
    doc.metadata.info.subject = format!("{HASH_PREFIX}{}", f.hash);
    doc.resources.fonts.map.insert(
        printpdf::FontId(REGULAR_ID.to_string()),
        printpdf::PdfFont::new(regular.clone()),
    );
    doc.resources.fonts.map.insert(
        printpdf::FontId(BOLD_ID.to_string()),
        printpdf::PdfFont::new(bold.clone()),
    );
    doc.with_pages(vec![printpdf::PdfPage::new(
        printpdf::Mm(pw as f32),
        printpdf::Mm(ph as f32),
        ops,
    )]);
    let mut lo = doc.to_lopdf_document(&printpdf::PdfSaveOptions::default(), &mut warnings);
    let id = lopdf::Object::String(
        f.hash.as_bytes()[..32].to_vec(),
        lopdf::StringFormat::Literal,
    );
    lo.trailer
        .set("ID", lopdf::Object::Array(vec![id.clone(), id]));
    lo.compress();
    let mut pdf = Vec::new();
    lo.save_to(&mut pdf)
        .map_err(|e| Error::Output(std::io::Error::other(e.to_string())))?;
    Ok(pdf)
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
    let title_h = 40.0;
    title_block(c, f, left, top, width, title_h);
    top -= title_h + 4.0;
    let plan_h = 42.0;
    single_plan_box(c, f, left, top, width, plan_h, n, ac);
    top -= plan_h + 4.0;
    let risk_h = 20.0;
    risk_table(c, f, left, top, width, risk_h);
    top -= risk_h + 3.0;

    // Charts take the height that the table and footer leave.
    let qualities = crate::plan::default_qualities(&f.plan, &f.model, Some(&f.request.risks));
    let evaluation = evaluate(&f.plan, &f.model, &qualities)?;
    let table_h = measures_height(&evaluation);
    let foot_top = margin + FOOT_H;
    let chart_h = (top - 4.0 - table_h - 3.0 - foot_top).min(85.0);
    let chart_w = (width - 6.0) / 2.0;
    let (x_max, points) = curve_points(f);
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
    signatures(c, f, sig_x, top, right - sig_x, table_h);
    footer(c, f, frame);
    if chart_h < MIN_CHART_H || top - table_h < foot_top + 2.0 {
        c.overflows
            .push("the page is too short for its blocks".to_string());
    }
    Ok(())
}

/// The title block: title, item and characteristic on the left; plan ID,
/// revision, date, lot size and scheme on the right.
fn title_block(c: &mut Canvas, f: &Facts, left: f64, top: f64, width: f64, block_h: f64) {
    let source = f.source;
    let right = left + width;
    let black = || grey(0.0);
    c.claim("title block", left, top - block_h, width, block_h);
    c.rect_stroke(left, top - block_h, width, block_h, 0.8, black());
    let meta_w = 52.0;
    let title_w = width - meta_w - 6.0;
    c.text(
        left + 3.0,
        top - 4.5,
        text::KICKER,
        Face::Bold,
        6.5,
        grey(0.35),
    );
    let title_used = c.paragraph(
        "title",
        left + 3.0,
        top - 6.5,
        title_w,
        13.0,
        &source.title,
        Face::Bold,
        14.0,
        8.0,
    );
    let fields = [
        (text::ITEM, given(&source.item)),
        (text::CHARACTERISTIC, given(&source.characteristic)),
    ];
    let mut fy = top - 8.5 - title_used;
    for (label, value) in fields {
        c.text(left + 3.0, fy - 2.5, label, Face::Bold, 6.5, grey(0.35));
        let room = (fy - (top - block_h + 2.0)).min(9.0);
        let used = c.paragraph(
            label,
            left + 26.0,
            fy,
            title_w - 23.0,
            room,
            &value,
            Face::Regular,
            8.0,
            5.5,
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
        .model
        .lot_size()
        .map_or(text::NO_LOT_SIZE.to_string(), |n| format!("{n} units"));
    let scheme_model = format!("{}, {}", source.scheme.name(), f.model.kind().name());
    let meta = [
        (text::PLAN_ID, given(&source.id)),
        (text::REVISION, given(&source.revision)),
        (text::DATE, given(&source.date)),
        (text::LOT_SIZE, lot),
        (text::SCHEME, scheme_model),
    ];
    // Five rows spread over the block's height.
    let pitch = (block_h - 5.0) / 5.0;
    for (i, (label, value)) in meta.iter().enumerate() {
        let y = top - 6.0 - pitch * i as f64;
        c.text(meta_x, y, label, Face::Bold, 6.5, grey(0.35));
        c.paragraph(
            label,
            meta_x + 17.0,
            y + 2.6,
            meta_w - 17.0,
            4.0,
            value,
            Face::Regular,
            8.0,
            5.5,
        );
    }
}

/// The plan box's frame: a tinted box with a blue rule.
fn plan_frame(c: &mut Canvas, left: f64, top: f64, width: f64, plan_h: f64) {
    c.claim("plan", left, top - plan_h, width, plan_h);
    c.rect_fill(left, top - plan_h, width, plan_h, rgb(0.93, 0.95, 0.98));
    c.rect_stroke(
        left,
        top - plan_h,
        width,
        plan_h,
        1.2,
        rgb(0.05, 0.25, 0.55),
    );
}

/// Green for accepting, red for rejecting.
fn accept_colour() -> printpdf::Color {
    rgb(0.0, 0.4, 0.1)
}

fn reject_colour() -> printpdf::Color {
    rgb(0.6, 0.1, 0.05)
}

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
    let col = 76.0;
    c.heading(left + 4.0, top - 7.0, text::SAMPLE_SIZE);
    c.text(
        left + 4.0,
        top - 19.0,
        &format!("n = {n}"),
        Face::Bold,
        24.0,
        grey(0.0),
    );
    let what = words::counted(f.per_unit);
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
            c.overflows.push(format!("plan box: '{line}'"));
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
    c.heading(x, top - 7.0, text::PROCEDURE);
    let mut step_top = top - 9.0;
    for step in words::plan_procedure(&f.plan, f.per_unit) {
        let used = c.paragraph(
            "procedure",
            x,
            step_top,
            w,
            step_top - bottom,
            &step,
            Face::Regular,
            size,
            7.0,
        );
        step_top -= used + 0.8;
    }
}

/// The risk table: each agreed point against what the plan achieves.
fn risk_table(c: &mut Canvas, f: &Facts, left: f64, top: f64, width: f64, risk_h: f64) {
    let right = left + width;
    let black = || grey(0.0);
    let (producer, consumer) = (f.request.risks.producer(), f.request.risks.consumer());
    c.claim("risks", left, top - risk_h, width, risk_h);
    c.heading(left, top - 3.5, text::RISKS);
    let cols = [left, left + 52.0, left + 84.0, left + 128.0, right];
    let row_y = |i: usize| top - 8.5 - 5.0 * i as f64;
    for (i, h) in text::risk_heads(f.per_unit).iter().enumerate() {
        let w = cols[i + 1] - cols[i] - 2.0;
        c.cell(
            "risk table",
            cols[i] + 1.0,
            w,
            row_y(0),
            h,
            Face::Bold,
            7.5,
            black(),
        );
    }
    c.line(
        &[(left, row_y(0) - 1.5), (right, row_y(0) - 1.5)],
        0.5,
        black(),
        None,
    );
    let recorded = f.recorded;
    let rows = [
        (
            text::PRODUCER_POINT,
            f.q(producer.quality),
            format!("α ≤ {}", producer.risk),
            format!(
                "α = {}  (Pa = {:.4})",
                format_significant(recorded.producer_risk, 3),
                1.0 - recorded.producer_risk
            ),
        ),
        (
            text::CONSUMER_POINT,
            f.q(consumer.quality),
            format!("β ≤ {}", consumer.risk),
            format!(
                "β = {}  (Pa = {:.4})",
                format_significant(recorded.consumer_risk, 3),
                recorded.consumer_risk
            ),
        ),
    ];
    for (i, r) in rows.iter().enumerate() {
        let y = row_y(i + 1);
        for (j, cell) in [&r.0.to_string(), &r.1, &r.2, &r.3].iter().enumerate() {
            let w = cols[j + 1] - cols[j] - 2.0;
            c.cell(
                "risk table",
                cols[j] + 1.0,
                w,
                y,
                cell,
                Face::Regular,
                7.5,
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
    let (producer, consumer) = (f.request.risks.producer(), f.request.risks.consumer());
    let indifference = quality_at_pa(&f.plan, &f.model, 0.5);
    let oc: Vec<(f64, f64)> = points.iter().map(|pt| (pt.p, pt.pa)).collect();
    let axis = quality_tick(f.per_unit);
    let prob = |v: f64, step: f64| chart::tick_label(v, step, 1.0, "");
    let pa1 = f.pa_at_p1();
    let beta = f.recorded.consumer_risk;
    let marks = [
        Mark {
            x: producer.quality,
            y: pa1,
            label: format!("p₁ = {}, Pa = {:.3}", f.q(producer.quality), pa1),
        },
        Mark {
            x: consumer.quality,
            y: beta,
            label: format!("p₂ = {}, Pa = {:.3}", f.q(consumer.quality), beta),
        },
    ];
    chart::draw(
        c,
        "OC chart",
        x,
        y,
        w,
        h,
        &Chart {
            title: text::OC_TITLE,
            x_label: text::quality_axis(f.per_unit),
            y_label: text::OC_AXIS,
            x_max,
            y_max: 1.0,
            x_tick: &axis,
            y_tick: &prob,
            curve: &oc,
            marks: &marks,
            guide: Some((indifference, format!("Pa = 0.5 at {}", f.q(indifference)))),
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
    let axis = quality_tick(f.per_unit);
    let marks = [Mark {
        x: limit.quality,
        y: limit.value,
        label: format!("AOQL = {}", f.q(limit.value)),
    }];
    chart::draw(
        c,
        "AOQ chart",
        x,
        y,
        w,
        h,
        &Chart {
            title: text::AOQ_TITLE,
            x_label: text::quality_axis(f.per_unit),
            y_label: text::AOQ_AXIS,
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
fn measures_height(evaluation: &Evaluation) -> f64 {
    8.0 + 4.2 * (evaluation.points.len() as f64 + 1.0)
}

/// The measures table: Pa, AOQ, ATI and ASN at the default qualities.
fn measures_table(
    c: &mut Canvas,
    f: &Facts,
    evaluation: &Evaluation,
    left: f64,
    top: f64,
    table_w: f64,
    table_h: f64,
) {
    let black = || grey(0.0);
    c.claim("measures", left, top - table_h, table_w, table_h);
    c.heading(left, top - 3.5, text::MEASURES);
    let tcols = [left + 24.0, left + 46.0, left + 72.0, left + 96.0];
    let heads = text::MEASURE_HEADS;
    let ty = |i: usize| top - 8.0 - 4.2 * i as f64;
    c.text(left + 1.0, ty(0), heads[0], Face::Bold, 7.0, black());
    for (j, h) in heads[1..].iter().enumerate() {
        c.text_right(tcols[j], ty(0), h, Face::Bold, 7.0, black());
    }
    c.line(
        &[(left, ty(0) - 1.3), (left + table_w - 10.0, ty(0) - 1.3)],
        0.4,
        black(),
        None,
    );
    for (i, m) in evaluation.points.iter().enumerate() {
        let y = ty(i + 1);
        c.cell(
            "measures table",
            left + 1.0,
            22.0,
            y,
            &f.q(m.quality),
            Face::Regular,
            7.0,
            black(),
        );
        let cells = [
            format!("{:.4}", m.pa),
            if f.per_unit {
                format!("{:.5}", m.aoq)
            } else {
                format!("{:.4}%", m.aoq * 100.0)
            },
            m.ati
                .map_or(text::NOT_GIVEN.to_string(), |v| format!("{v:.0}")),
            format!("{:.0}", m.asn),
        ];
        for (j, cell) in cells.iter().enumerate() {
            c.cell_right(
                "measures table",
                tcols[j],
                20.0,
                y,
                cell,
                Face::Regular,
                7.0,
                black(),
            );
        }
    }
}

/// The signature block: who prepared and who approved the plan, with lines
/// for the signature and the date.
fn signatures(c: &mut Canvas, f: &Facts, sig_x: f64, top: f64, sig_w: f64, table_h: f64) {
    let black = || grey(0.0);
    c.claim("signatures", sig_x, top - table_h, sig_w, table_h);
    c.rect_stroke(sig_x, top - table_h, sig_w, table_h, 0.5, black());
    for (i, (label, name)) in [
        (text::PREPARED_BY, given(&f.source.prepared_by)),
        (text::APPROVED_BY, given(&f.source.approved_by)),
    ]
    .iter()
    .enumerate()
    {
        let y = top - 5.0 - (table_h / 2.0) * i as f64;
        c.text(sig_x + 2.0, y, label, Face::Bold, 7.0, grey(0.3));
        c.paragraph(
            label,
            sig_x + 2.0,
            y - 1.0,
            sig_w - 4.0,
            4.0,
            name,
            Face::Regular,
            7.5,
            5.5,
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
            text::SIGNATURE,
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
            text::SIGNED_ON,
            Face::Regular,
            6.0,
            grey(0.4),
        );
    }
}

/// The footer at the bottom margin: the cautions and the provenance line.
fn footer(c: &mut Canvas, f: &Facts, frame: Frame) {
    let Frame {
        left,
        right,
        width,
        margin,
    } = frame;
    let foot_top = margin + FOOT_H;
    c.claim("footer", left, margin, width, FOOT_H);
    c.line(&[(left, foot_top), (right, foot_top)], 0.6, grey(0.0), None);
    let used = c.paragraph(
        "caution",
        left,
        foot_top - 1.5,
        width,
        10.0,
        words::CAUTION,
        Face::Regular,
        7.0,
        5.5,
    );
    let provenance = format!(
        "Generated by {} from {name} (SHA-256 {hash}). Plan solved by {}. \
         Regenerate with: lotsman sheet {name}",
        tool_version(),
        f.recorded.solved_by,
        name = f.file_name,
        hash = f.hash,
    );
    c.paragraph(
        "provenance",
        left,
        foot_top - 3.0 - used,
        width,
        10.0,
        &provenance,
        Face::Regular,
        6.0,
        5.0,
    );
}

/// Reads the source at `source_path`, renders its sheet and writes it
/// atomically to `target`. The target is never the source itself.
///
/// # Errors
/// [`Error`] for an unreadable or invalid source, a sheet that cannot be
/// laid out, or a failed write (the target is then left as it was).
pub fn write_sheet(
    source_path: &std::path::Path,
    target: &std::path::Path,
    paper: Paper,
) -> Result<(), Error> {
    let io = |e| crate::error::SourceError::Io {
        path: source_path.to_path_buf(),
        source: e,
    };
    let text = std::fs::read_to_string(source_path).map_err(io)?;
    let source = PlanSource::from_yaml(&text, source_path)?;
    let name = source_path
        .file_name()
        .map_or_else(|| "source.yaml".into(), |n| n.to_string_lossy().to_string());
    let sheet = render_sheet(&text, &source, &name, paper)?;
    crate::atomic::write_atomic(target, &sheet.pdf).map_err(|e| crate::error::SourceError::Io {
        path: target.to_path_buf(),
        source: e,
    })?;
    Ok(())
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

/// A PDF text string: UTF-16BE after a byte-order mark, else PDFDocEncoding
/// (ASCII for the hex digits this module writes).
fn text_string(bytes: &[u8]) -> String {
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
