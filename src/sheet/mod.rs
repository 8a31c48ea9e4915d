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

use sha2::{Digest, Sha256};

use crate::error::{Error, InputError};
use crate::model::ModelKind;
use crate::plan::{aoql, evaluate, measures, quality_at_pa};
use crate::report::{format_quality, format_significant, words};
use crate::source::{PlanSource, tool_version};
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

/// Renders the sheet of `source` (parsed from `text`, which is hashed);
/// `file_name` is printed in the provenance line.
///
/// # Errors
/// [`Error`] when the source records no plan or the plan is invalid, or
/// when a text does not fit its box even at the smallest size or holds a
/// character the sheet font cannot draw (a sheet is never printed with
/// overflowing or missing text).
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
    let hash = source_hash(text);
    let mut warnings = Vec::new();
    let regular = printpdf::ParsedFont::from_bytes(REGULAR_TTF, 0, &mut Vec::new());
    let bold = printpdf::ParsedFont::from_bytes(BOLD_TTF, 0, &mut Vec::new());
    let (Some(regular), Some(bold)) = (regular, bold) else {
        return Err(
            InputError::Inconsistent("the embedded sheet fonts do not parse".into()).into(),
        );
    };
    let (pw, ph) = paper.size();
    let mut c = Canvas::new(&regular, &bold);
    let per_unit = model.kind() == ModelKind::Poisson;
    let q = |v: f64| format_quality(v, per_unit);
    let margin = 14.0;
    let (left, right) = (margin, pw - margin);
    let width = right - left;
    let black = || grey(0.0);
    let mut top = ph - margin;

    // Title block.
    let block_h = 40.0;
    c.claim("title block", left, top - block_h, width, block_h);
    c.rect_stroke(left, top - block_h, width, block_h, 0.8, black());
    let meta_w = 52.0;
    let title_w = width - meta_w - 6.0;
    c.text(
        left + 3.0,
        top - 4.5,
        "INCOMING INSPECTION PLAN",
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
    let opt = |v: &Option<String>| v.clone().unwrap_or_else(|| "—".to_string());
    let lot = model
        .lot_size()
        .map_or("not stated".to_string(), |n| format!("{n} units"));
    let fields = [
        ("Item", opt(&source.item)),
        ("Characteristic", opt(&source.characteristic)),
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
    let scheme_model = format!("{}, {}", source.scheme.name(), model.kind().name());
    let meta = [
        ("Plan ID", opt(&source.id)),
        ("Revision", opt(&source.revision)),
        ("Date", opt(&source.date)),
        ("Lot size", lot),
        ("Scheme", scheme_model),
    ];
    for (i, (label, value)) in meta.iter().enumerate() {
        let y = top - 6.0 - 7.0 * i as f64;
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
    top -= block_h + 4.0;

    // The plan itself.
    let plan_h = 42.0;
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
    let Some((n, ac)) = plan.as_single() else {
        return Err(InputError::Inconsistent(
            "the sheet prints single plans; this source records a staged plan".to_string(),
        )
        .into());
    };
    let col = 76.0;
    c.heading(left + 4.0, top - 7.0, "SAMPLE SIZE");
    c.text(
        left + 4.0,
        top - 19.0,
        &format!("n = {n}"),
        Face::Bold,
        24.0,
        black(),
    );
    let what = words::counted(per_unit);
    let decisions = [
        (
            format!("Accept if ≤ {ac} {what}"),
            top - 27.0,
            rgb(0.0, 0.4, 0.1),
        ),
        (
            format!("Reject if ≥ {} {what}", ac + 1),
            top - 32.5,
            rgb(0.6, 0.1, 0.05),
        ),
    ];
    for (line, y, color) in decisions {
        if c.width(&line, Face::Bold, 9.5) > col - 6.0 {
            c.overflows.push(format!("plan box: '{line}'"));
        }
        c.text(left + 4.0, y, &line, Face::Bold, 9.5, color);
    }
    c.heading(left + col + 4.0, top - 7.0, "INSPECTOR'S PROCEDURE");
    // One paragraph per step, each in what the earlier steps left.
    let mut step_top = top - 9.0;
    let box_bottom = top - plan_h + 2.0;
    for step in words::procedure(n, ac, per_unit) {
        let used = c.paragraph(
            "procedure",
            left + col + 4.0,
            step_top,
            width - col - 8.0,
            step_top - box_bottom,
            &step,
            Face::Regular,
            8.0,
            7.0,
        );
        step_top -= used + 0.8;
    }
    c.line(
        &[(left + col, top - 3.0), (left + col, top - plan_h + 3.0)],
        0.4,
        grey(0.6),
        None,
    );
    top -= plan_h + 4.0;

    // Risk points.
    let (producer, consumer) = (request.risks.producer(), request.risks.consumer());
    let risk_h = 20.0;
    c.claim("risks", left, top - risk_h, width, risk_h);
    c.heading(
        left,
        top - 3.5,
        "AGREED RISK POINTS AND WHAT THIS PLAN ACHIEVES",
    );
    let cols = [left, left + 52.0, left + 84.0, left + 128.0, right];
    let quality_head = if per_unit {
        "Quality (per unit)"
    } else {
        "Quality"
    };
    let heads = [
        "Risk point",
        quality_head,
        "Agreed",
        "Achieved by this plan",
    ];
    let row_y = |i: usize| top - 8.5 - 5.0 * i as f64;
    for (i, h) in heads.iter().enumerate() {
        c.text(cols[i] + 1.0, row_y(0), h, Face::Bold, 7.5, black());
    }
    c.line(
        &[(left, row_y(0) - 1.5), (right, row_y(0) - 1.5)],
        0.5,
        black(),
        None,
    );
    let rows = [
        (
            "Producer's point (AQL, p₁)",
            q(producer.quality),
            format!("α ≤ {}", producer.risk),
            format!(
                "α = {}  (Pa = {:.4})",
                format_significant(recorded.producer_risk, 3),
                1.0 - recorded.producer_risk
            ),
        ),
        (
            "Consumer's point (RQL, p₂)",
            q(consumer.quality),
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
            c.text(cols[j] + 1.0, y, cell, Face::Regular, 7.5, black());
        }
    }
    top -= risk_h + 3.0;

    // Charts take the height that the table and footer leave.
    let qualities = crate::plan::default_qualities(&plan, &model, Some(&request.risks));
    let evaluation = evaluate(&plan, &model, &qualities)?;
    let table_h = 8.0 + 4.2 * (evaluation.points.len() as f64 + 1.0);
    let foot_h = 25.0;
    let foot_top = margin + foot_h;
    let chart_h = (top - 4.0 - table_h - 3.0 - foot_top).min(85.0);
    let chart_w = (width - 6.0) / 2.0;
    let indifference = quality_at_pa(&plan, &model, 0.5);
    let x_max = nice_ceiling(quality_at_pa(&plan, &model, 0.02).max(consumer.quality * 1.2));
    let curve_q: Vec<f64> = (0..=240)
        .map(|i| x_max * i as f64 / 240.0)
        .map(|v| v.max(x_max * 1e-6))
        .collect();
    // One evaluation per point serves both curves.
    type Curve = Vec<(f64, f64)>;
    let (oc, aoq): (Curve, Curve) = curve_q
        .iter()
        .map(|&p| {
            let m = measures(&plan, &model, p);
            ((p, m.pa), (p, m.aoq))
        })
        .unzip();
    let limit = aoql(&plan, &model);
    let (scale, suffix) = if per_unit { (1.0, "") } else { (100.0, "%") };
    let axis = |v: f64, step: f64| chart::tick_label(v, step, scale, suffix);
    let prob = |v: f64, step: f64| chart::tick_label(v, step, 1.0, "");
    let pa1 = 1.0 - recorded.producer_risk;
    let oc_marks = [
        Mark {
            x: producer.quality,
            y: pa1,
            label: format!("p₁ = {}, Pa = {:.3}", q(producer.quality), pa1),
        },
        Mark {
            x: consumer.quality,
            y: recorded.consumer_risk,
            label: format!(
                "p₂ = {}, Pa = {:.3}",
                q(consumer.quality),
                recorded.consumer_risk
            ),
        },
    ];
    let x_label = if per_unit {
        "Lot quality (nonconformities per unit)"
    } else {
        "Lot quality (% nonconforming)"
    };
    let chart_top = top - chart_h;
    chart::draw(
        &mut c,
        "OC chart",
        left,
        chart_top,
        chart_w,
        chart_h,
        &Chart {
            title: "Operating characteristic (OC) curve",
            x_label,
            y_label: "Probability of acceptance Pa",
            x_max,
            y_max: 1.0,
            x_tick: &axis,
            y_tick: &prob,
            curve: &oc,
            marks: &oc_marks,
            guide: Some((indifference, format!("Pa = 0.5 at {}", q(indifference)))),
        },
    );
    let aoq_max = nice_ceiling(limit.value * 1.25);
    let aoq_marks = [Mark {
        x: limit.quality,
        y: limit.value,
        label: format!("AOQL = {}", q(limit.value)),
    }];
    chart::draw(
        &mut c,
        "AOQ chart",
        left + chart_w + 6.0,
        chart_top,
        chart_w,
        chart_h,
        &Chart {
            title: "Average outgoing quality (AOQ), rectifying inspection",
            x_label,
            y_label: "AOQ",
            x_max,
            y_max: aoq_max,
            x_tick: &axis,
            y_tick: &axis,
            curve: &aoq,
            marks: &aoq_marks,
            guide: None,
        },
    );
    top = chart_top - 4.0;

    // Table of measures and the signature block.
    let table_w = 112.0;
    c.claim("measures", left, top - table_h, table_w, table_h);
    c.heading(left, top - 3.5, "WHAT THE PLAN DOES AT OTHER QUALITIES");
    let tcols = [left + 24.0, left + 46.0, left + 72.0, left + 96.0];
    let heads = ["Quality", "Pa", "AOQ", "ATI", "ASN"];
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
        c.text(left + 1.0, y, &q(m.quality), Face::Regular, 7.0, black());
        let cells = [
            format!("{:.4}", m.pa),
            if per_unit {
                format!("{:.5}", m.aoq)
            } else {
                format!("{:.4}%", m.aoq * 100.0)
            },
            m.ati.map_or("—".to_string(), |v| format!("{v:.0}")),
            format!("{:.0}", m.asn),
        ];
        for (j, cell) in cells.iter().enumerate() {
            c.text_right(tcols[j], y, cell, Face::Regular, 7.0, black());
        }
    }
    let sig_x = left + table_w + 4.0;
    let sig_w = right - sig_x;
    c.claim("signatures", sig_x, top - table_h, sig_w, table_h);
    c.rect_stroke(sig_x, top - table_h, sig_w, table_h, 0.5, black());
    for (i, (label, name)) in [
        ("Prepared by", opt(&source.prepared_by)),
        ("Approved by", opt(&source.approved_by)),
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
            "Signature",
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
            "Date",
            Face::Regular,
            6.0,
            grey(0.4),
        );
    }

    // Footer: cautions and provenance.
    c.claim("footer", left, margin, width, foot_h);
    c.line(&[(left, foot_top), (right, foot_top)], 0.6, black(), None);
    let caution = words::CAUTION;
    let used = c.paragraph(
        "caution",
        left,
        foot_top - 1.5,
        width,
        10.0,
        caution,
        Face::Regular,
        7.0,
        5.5,
    );
    let provenance = format!(
        "Generated by {} from {file_name} (SHA-256 {hash}). Plan solved by {}. \
         Regenerate with: lotsman sheet {file_name}",
        tool_version(),
        recorded.solved_by
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
    if chart_h < 50.0 || top - table_h < foot_top + 2.0 {
        c.overflows
            .push("the page is too short for its blocks".to_string());
    }

    let Canvas {
        ops,
        regions,
        overflows,
        ..
    } = c;
    if !overflows.is_empty() {
        return Err(InputError::Inconsistent(format!(
            "the sheet cannot be laid out: {}; shorten the text in the source",
            overflows.join("; ")
        ))
        .into());
    }
    let mut doc = printpdf::PdfDocument::new(&source.title);
    doc.metadata.info.subject = format!("{HASH_PREFIX}{hash}");
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
    let id = lopdf::Object::String(hash.as_bytes()[..32].to_vec(), lopdf::StringFormat::Literal);
    lo.trailer
        .set("ID", lopdf::Object::Array(vec![id.clone(), id]));
    lo.compress();
    let mut pdf = Vec::new();
    lo.save_to(&mut pdf)
        .map_err(|e| Error::Output(std::io::Error::other(e.to_string())))?;
    Ok(Sheet {
        pdf,
        source_sha256: hash,
        regions,
    })
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
