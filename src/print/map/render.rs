//! The trade-off map's entry: the checks of its grid, the page drawn by
//! [`crate::print::layouts::map`], and the PDF whose document ID comes
//! from a SHA-256 of the inputs, so that the same grid, title, command
//! and paper give the same bytes.

use sha2::{Digest, Sha256};

use super::panel::MapPanel;
use crate::design::TradeoffGrid;
use crate::input::InputError;
use crate::print::canvas::Canvas;
use crate::print::fonts::Fonts;
use crate::print::geometry::Region;
use crate::print::layouts::map::map_layout;
use crate::print::page::Paper;
use crate::print::pdf::{self, Document, PdfPage};
use crate::source::Error;
use crate::source::tool_version;

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
/// use lotsman::{Criterion, Model, ModelKind, Paper, RiskGrid, Scheme, TradeoffRequest};
/// use lotsman::{render_tradeoff_map, tradeoff};
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// let points = RiskGrid {
///     aql: vec![0.005, 0.01, 0.015], rql: vec![0.04, 0.06, 0.08], alpha: 0.05, beta: 0.10,
/// };
/// let request = TradeoffRequest::new(points, model, Scheme::Single, Criterion::AsnAql, None).unwrap();
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
    let panels = map_layout(&mut c, grid, (title, command, &hash), (pw, ph));
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
    let pdf = pdf::save(&doc, &fonts, (pw, ph), page.into_ops())?;
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
