//! The trade-off map: one landscape page that shows a solved
//! [`TradeoffGrid`] as a heat map, for a buyer and a supplier who negotiate
//! their risk points in front of a projector or on paper.
//!
//! The page is landscape (A4 or Letter turned), because a projector is
//! wider than tall and the cost view sits beside the sample-size view. It
//! holds:
//!
//! * a title block: the title, the scheme, model, lot size, both risks, the
//!   two axes' ranges and counts, the cost inputs when given, and how to
//!   read the map;
//! * one panel per quantity: the sample size `n` (single plans) or the ASN
//!   at the AQL (double plans), and, when the grid carries a cost, the
//!   expected inspection cost per lot beside it. The RQL runs to the right,
//!   the AQL upwards; each cell is coloured on a log scale along a ramp
//!   whose lightness falls steadily ([`ramp`]); contour lines at 1-2-5
//!   levels are traced by marching squares on the logarithm of the value
//!   ([`contour`]) and labelled on the line where a label has room; a
//!   colour bar carries the same levels;
//! * a key for the lines and for each reason a cell has no plan (grey
//!   where the AQL is not below the RQL, hatched where the points are too
//!   close for the designer's limits or no plan meets them);
//! * a footer: the map is a negotiation aid, not a plan; the cautions; and
//!   the provenance (tool version, the inputs' hash and the command that
//!   regenerates the map, when the caller gives it).
//!
//! Layout ([`panel`] and this file) and wording ([`text`]) are kept apart
//! from the numbers ([`field`], [`contour`], [`ramp`]). The same grid,
//! title, command and paper give the same bytes: the document ID comes
//! from a SHA-256 of those inputs.

mod contour;
pub(crate) mod field;
mod panel;
mod ramp;

use sha2::{Digest, Sha256};

use super::Paper;
use super::canvas::Canvas;
use super::draw::{Face, grey};
use super::fonts::Fonts;
use super::geometry::{Rect, Region};
use super::pdf::{Document, PdfPage};
use super::text::Shrink;
use super::wording::map as text;
use crate::design::{Scheme, TradeoffGrid};
use crate::error::{Error, InputError};
use crate::model::ModelKind;
use crate::report::words;
use crate::source::tool_version;
pub use field::MapQuantity;
use field::{Field, Gap};
use panel::Panel;

/// A rendered trade-off map.
#[derive(Clone, Debug)]
pub struct TradeoffMap {
    /// The PDF.
    pub pdf: Vec<u8>,
    /// SHA-256 of the inputs (grid, title, command, paper, tool version),
    /// hex: the document ID is made from it.
    pub inputs_sha256: String,
    /// The blocks of the layout, for the overlap check.
    pub regions: Vec<Region>,
    /// The panels, in the order they are drawn (left to right).
    pub panels: Vec<MapPanel>,
}

/// What one panel of a map shows and where it put its contours.
#[derive(Clone, Debug)]
pub struct MapPanel {
    /// The quantity the colours and the contours are of.
    pub quantity: MapQuantity,
    /// The plotting area on the page, mm from the bottom-left corner.
    pub plot: Region,
    /// The smallest and largest value over the cells with a plan.
    pub range: Option<(f64, f64)>,
    /// The contour levels, lowest first.
    pub contours: Vec<MapContour>,
}

/// One contour level of a panel.
#[derive(Clone, Debug)]
pub struct MapContour {
    /// The value the line joins.
    pub level: f64,
    /// The label printed on the line.
    pub label: String,
    /// The line's paths as `(RQL, AQL)` points: a path crosses between two
    /// neighbouring cells where the level lies between their values, at
    /// the point interpolated on the log scale between the cells' centres,
    /// and runs on from the outer cells' centres to the plot's edges.
    pub paths: Vec<Vec<(f64, f64)>>,
    /// Where the level's labels are (none when no place had room).
    pub labels: Vec<ContourLabel>,
}

/// A contour label: its centre on the line, and its box on the page.
#[derive(Clone, Debug)]
pub struct ContourLabel {
    /// The label's centre as `(RQL, AQL)`.
    pub at: (f64, f64),
    /// The white box that carries it, mm from the page's bottom-left corner.
    pub page: Region,
}

/// Page margin, mm.
const MARGIN: f64 = 10.0;

/// Heights of the footer and of one line of the key, mm.
const FOOT_H: f64 = 17.0;
const KEY_PITCH: f64 = 5.0;

/// Renders the trade-off map of `grid` on one landscape page of `paper`.
/// `title` heads the page; `command`, when given, is printed as the command
/// that regenerates the map (else the footer points to the request in the
/// title block).
///
/// The page shows the sample size (single scheme) or the ASN at the AQL
/// (double scheme) of every cell, and the expected inspection cost per lot
/// beside it when the grid carries a cost (see the module documentation).
/// Writing the bytes to a file is the caller's (see
/// [`write_atomic`](crate::write_atomic)).
///
/// # Errors
/// [`InputError`] when an axis has fewer than two values or is not
/// increasing, or when the page cannot be laid out: a title too long for
/// its box even at the smallest size, a character the embedded font cannot
/// draw, or blocks that would overlap. A map is never printed with cut-off
/// or overlapping text.
///
/// # Example
/// ```
/// use lotsman::{Criterion, Model, ModelKind, Paper, Scheme, TradeoffRequest};
/// use lotsman::{render_tradeoff_map, tradeoff};
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// let request = TradeoffRequest::new(
///     vec![0.005, 0.01, 0.015], vec![0.04, 0.06, 0.08], 0.05, 0.10,
///     model, Scheme::Single, Criterion::AsnAql, None,
/// ).unwrap();
/// let grid = tradeoff(&request, &|| {});
/// let map = render_tradeoff_map(&grid, "Seal rings", None, Paper::A4).unwrap();
/// assert!(map.pdf.starts_with(b"%PDF"));
/// assert_eq!(map.panels.len(), 1);
/// ```
pub fn render_tradeoff_map(
    grid: &TradeoffGrid,
    title: &str,
    command: Option<&str>,
    paper: Paper,
) -> Result<TradeoffMap, Error> {
    // The map colours what the report would print: the same guard first.
    crate::report::TradeoffReport::new(None, grid).check()?;
    let request = &grid.request;
    for (name, axis) in [("AQL", request.aql()), ("RQL", request.rql())] {
        if axis.len() < 2 {
            return Err(InputError::out_of_range(
                &format!("number of {name} values of a map"),
                axis.len(),
                "at least 2 (a table shows a single row or column)",
            )
            .into());
        }
        if axis
            .windows(2)
            .any(|w| w[0].partial_cmp(&w[1]) != Some(std::cmp::Ordering::Less))
        {
            return Err(InputError::Inconsistent(format!(
                "the {name} values of a map must increase"
            ))
            .into());
        }
    }
    let fonts = Fonts::embedded()?;
    // Landscape: the paper turned.
    let (ph, pw) = paper.size();
    let hash = inputs_hash(grid, title, command, paper);
    let mut page = PdfPage::new();
    let mut c = Canvas::new(&mut page, &fonts);
    let panels = layout(&mut c, grid, title, command, &hash, pw, ph);
    let laid = c.finish(pw, ph);
    if !laid.is_clean() {
        let all: Vec<String> = laid.overflows.into_iter().chain(laid.faults).collect();
        return Err(InputError::Inconsistent(format!(
            "the trade-off map cannot be laid out: {}",
            all.join("; ")
        ))
        .into());
    }
    let subject = format!("lotsman trade-off map, inputs SHA-256 {hash}");
    let doc = Document {
        title,
        subject: &subject,
        hash: &hash,
        extra: &[],
    };
    let pdf = super::pdf::save(&doc, &fonts, (pw, ph), page.into_ops())?;
    let regions = laid.regions;
    Ok(TradeoffMap {
        pdf,
        inputs_sha256: hash,
        regions,
        panels,
    })
}

/// The hex SHA-256 of what the map is drawn from: the tool version, the
/// title, the command, the paper, the request, and per cell the plan's
/// `n`, `c`, ASN at the AQL and cost (their bits) or the reason it has
/// none.
fn inputs_hash(grid: &TradeoffGrid, title: &str, command: Option<&str>, paper: Paper) -> String {
    let mut h = Sha256::new();
    for part in [
        tool_version().as_str(),
        title,
        command.unwrap_or(""),
        &format!("{paper:?}"),
        &format!("{:?}", grid.request),
    ] {
        h.update(part.as_bytes());
        h.update([0]);
    }
    for cell in &grid.cells {
        match &cell.outcome {
            Ok(p) => {
                h.update([1]);
                h.update(p.n().to_le_bytes());
                h.update(p.c().to_le_bytes());
                h.update(p.asn_at_aql.to_bits().to_le_bytes());
                if let Some(k) = p.cost {
                    h.update(k.cost.to_bits().to_le_bytes());
                }
            }
            Err(e) => {
                h.update([2]);
                h.update(e.to_string().as_bytes());
            }
        }
    }
    h.finalize().iter().map(|b| format!("{b:02x}")).collect()
}

/// Lays out the page on `c`; returns the panels.
fn layout(
    c: &mut Canvas,
    grid: &TradeoffGrid,
    title: &str,
    command: Option<&str>,
    hash: &str,
    pw: f64,
    ph: f64,
) -> Vec<MapPanel> {
    let request = &grid.request;
    let per_unit = request.model().kind() == ModelKind::Poisson;
    let (left, width) = (MARGIN, pw - 2.0 * MARGIN);
    let main = match request.scheme() {
        Scheme::Double => MapQuantity::AsnAtAql,
        _ => MapQuantity::SampleSize,
    };
    let mut quantities = vec![main];
    if request.cost().is_some() {
        quantities.push(MapQuantity::CostPerLot);
    }
    let fields: Vec<Field> = quantities.iter().map(|&q| Field::new(grid, q)).collect();
    let process = request.cost().map_or_else(String::new, |k| {
        text::quality(k.process_average(), per_unit)
    });

    let top = ph - MARGIN;
    let title_h = title_block(c, grid, title, left, top, width, per_unit);
    let foot_top = MARGIN + FOOT_H;
    footer(c, hash, command, left, width);
    let gaps = fields[0].gaps();
    let key_h = key(c, grid, &gaps, &process, left, foot_top + 2.0, width);

    let panels_top = top - title_h - 4.0;
    let panels_bottom = foot_top + 2.0 + key_h + 3.0;
    let gap = 10.0;
    let count = quantities.len() as f64;
    let panel_w = (width - gap * (count - 1.0)) / count;
    quantities
        .iter()
        .zip(&fields)
        .enumerate()
        .map(|(k, (&quantity, field))| {
            let x = left + k as f64 * (panel_w + gap);
            let name = match quantity {
                MapQuantity::CostPerLot => "cost panel",
                _ => "sample size panel",
            };
            panel::draw(
                c,
                name,
                Rect::new(x, panels_bottom, panel_w, panels_top - panels_bottom),
                &Panel {
                    quantity,
                    title: text::panel_title(quantity, &process),
                    field,
                    rql: request.rql(),
                    aql: request.aql(),
                    per_unit,
                },
            )
        })
        .collect()
}

/// The title block at `top`: the kicker across the page, the title and
/// how to read the map on the left, the request's fields on the right.
/// Returns its height.
fn title_block(
    c: &mut Canvas,
    grid: &TradeoffGrid,
    title: &str,
    left: f64,
    top: f64,
    width: f64,
    per_unit: bool,
) -> f64 {
    let r = &grid.request;
    let mut fields = vec![
        (text::SCHEME, text::scheme(r.scheme(), r.criterion())),
        (text::MODEL, text::model(r.model().kind())),
        (text::RISKS, text::risks(r.alpha(), r.beta())),
        (text::LOT_SIZE, text::lot_size(r.model().lot_size())),
        (text::AQL_ROWS, text::range(r.aql(), per_unit)),
        (text::RQL_COLUMNS, text::range(r.rql(), per_unit)),
    ];
    if let Some(k) = r.cost() {
        fields.push((text::COST_PER_UNIT, text::number(k.per_unit())));
        fields.push((
            text::PROCESS_QUALITY,
            text::quality(k.process_average(), per_unit),
        ));
    }
    let rows = fields.len().div_ceil(2);
    let row_h = 8.0;
    let block_h = 6.0 + rows as f64 * row_h + 1.0;
    c.claim(
        "title block",
        Rect::new(left, top - block_h, width, block_h),
    );
    c.text(left, top - 3.5, text::KICKER, Face::Bold, 7.5, grey(0.35));
    if c.width(text::KICKER, Face::Bold, 7.5) > width {
        c.fault("the kicker is wider than the page".into());
    }
    let fields_w = 150.0;
    let text_w = width - fields_w - 6.0;
    let title_used = c.paragraph(
        "title",
        Rect::from_top(left, top - 5.5, text_w, 9.0),
        title,
        Face::Bold,
        Shrink::new(17.0, 10.0),
    );
    c.paragraph(
        "how to read",
        Rect::from_top(
            left,
            top - 7.0 - title_used,
            text_w,
            block_h - 9.0 - title_used,
        ),
        text::how_to_read(r.scheme()),
        Face::Regular,
        Shrink::new(8.0, 6.5),
    );
    let fx = left + width - fields_w;
    let col_w = fields_w / 2.0;
    for (k, (label, value)) in fields.iter().enumerate() {
        let (col, row) = (k % 2, k / 2);
        let x = fx + col as f64 * col_w;
        let y = top - 6.0 - row as f64 * row_h;
        c.text(x, y - 2.4, label, Face::Bold, 6.5, grey(0.35));
        let fit = c.fit(
            value,
            Face::Regular,
            col_w - 3.0,
            4.0,
            Shrink::new(9.0, 6.5),
        );
        if !fit.fits {
            c.overflow(format!("{label}: '{value}'"));
        }
        c.text(x, y - 6.2, value, Face::Regular, fit.size, grey(0.0));
    }
    c.line(
        &[(left, top - block_h), (left + width, top - block_h)],
        0.9,
        grey(0.0),
        None,
    );
    block_h
}

/// The key above the footer, bottom at `bottom`: a sample of the contour
/// line, the double scheme's note, each reason for cells without a plan
/// that occurs, and the cost's definition, flowing over as many lines as
/// they need. Returns its height.
fn key(
    c: &mut Canvas,
    grid: &TradeoffGrid,
    gaps: &[Gap],
    process: &str,
    left: f64,
    bottom: f64,
    width: f64,
) -> f64 {
    enum Sample {
        Contour,
        Gap(Gap),
        None,
    }
    let mut entries: Vec<(Sample, String)> = vec![(Sample::Contour, text::CONTOUR_KEY.into())];
    if grid.request.scheme() == Scheme::Double {
        entries.push((Sample::None, text::ASN_KEY.into()));
    }
    entries.extend(
        gaps.iter()
            .map(|&g| (Sample::Gap(g), text::gap(g).to_string())),
    );
    if let Some(k) = grid.request.cost() {
        entries.push((Sample::None, text::cost_key(k.per_unit(), process)));
    }
    let size = 8.0;
    let sample_w = 8.0;
    // Lay the entries out in lines, then draw them top down.
    let mut lines: Vec<Vec<(f64, usize)>> = vec![Vec::new()];
    let mut x = 0.0;
    for (k, (sample, label)) in entries.iter().enumerate() {
        let w = match sample {
            Sample::None => 0.0,
            _ => sample_w + 1.5,
        } + c.width(label, Face::Regular, size);
        if x > 0.0 && x + w > width {
            lines.push(Vec::new());
            x = 0.0;
        }
        if w > width {
            c.overflow(format!("key: '{label}'"));
        }
        if let Some(line) = lines.last_mut() {
            line.push((x, k));
        }
        x += w + 6.0;
    }
    let h = KEY_PITCH * lines.len() as f64;
    c.claim("key", Rect::new(left, bottom, width, h));
    for (row, line) in lines.iter().enumerate() {
        let base = bottom + h - KEY_PITCH * (row as f64 + 1.0) + 1.2;
        for &(at, k) in line {
            let (sample, label) = &entries[k];
            let sx = left + at;
            let tx = match sample {
                Sample::Contour => {
                    panel::contour_swatch(c, sx, base + 1.0, sample_w);
                    sx + sample_w + 1.5
                }
                Sample::Gap(g) => {
                    panel::gap_swatch(c, *g, (sx, base - 0.6, sx + sample_w, base + 2.8));
                    sx + sample_w + 1.5
                }
                Sample::None => sx,
            };
            c.text(tx, base, label, Face::Regular, size, grey(0.05));
        }
    }
    h
}

/// The footer at the bottom margin: that the map is no plan, the
/// cautions, and the provenance.
fn footer(c: &mut Canvas, hash: &str, command: Option<&str>, left: f64, width: f64) {
    let top = MARGIN + FOOT_H;
    c.claim("footer", Rect::new(left, MARGIN, width, FOOT_H));
    c.line(&[(left, top), (left + width, top)], 0.6, grey(0.0), None);
    let cautions = format!("{} {}", text::NOT_A_PLAN, words::CAUTION);
    let used = c.paragraph(
        "cautions",
        Rect::from_top(left, top - 1.5, width, 9.0),
        &cautions,
        Face::Regular,
        Shrink::new(7.5, 6.0),
    );
    let provenance = text::provenance(&tool_version(), hash, command);
    c.paragraph(
        "provenance",
        Rect::from_top(left, top - 2.5 - used, width, FOOT_H - 3.0 - used),
        &provenance,
        Face::Regular,
        Shrink::new(6.5, 5.0),
    );
}
