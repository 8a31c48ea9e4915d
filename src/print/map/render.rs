//! The trade-off map's entries: the checks of its grid, the page drawn by
//! [`crate::print::layouts::map`], and the PDF whose document ID comes
//! from a SHA-256 of the inputs, so that the same grid, title, command
//! and paper give the same bytes; or the same page as an SVG, for a web
//! page.

use sha2::{Digest, Sha256};

use super::panel::MapPanel;
use crate::design::TradeoffGrid;
use crate::input::InputError;
use crate::print::canvas::Canvas;
use crate::print::draw::Draw;
use crate::print::fonts::Fonts;
use crate::print::geometry::Region;
use crate::print::layouts::map::map_layout;
use crate::print::page::Paper;
use crate::print::pdf::{self, Document, PdfPage};
use crate::print::svg::SvgPage;
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
    check_grid(grid)?;
    let fonts = Fonts::embedded()?;
    let hash = inputs_hash(grid, title, command, paper);
    let mut page = PdfPage::new();
    let (regions, panels) = lay(
        &mut page,
        &fonts,
        grid,
        (title, command, &hash),
        paper,
        None,
    )?;
    let subject = format!("lotsman trade-off map, inputs SHA-256 {hash}");
    let doc = Document {
        title,
        subject: &subject,
        hash: &hash,
        extra: &[],
    };
    let pdf = pdf::save(&doc, &fonts, landscape(paper), page.into_ops())?;
    Ok(TradeoffMap {
        pdf,
        inputs_sha256: hash,
        regions,
        panels,
    })
}

/// The same page as [`render_tradeoff_map`], drawn by the same layout as
/// a standalone SVG document, for a web page to show inline, with the
/// `agreed` risk points `(RQL, AQL)`, when given, ringed on every panel
/// and named in the key.
///
/// # Errors
/// As [`render_tradeoff_map`].
///
/// # Example
/// ```
/// use lotsman::{Criterion, Model, ModelKind, Paper, RiskGrid, Scheme, TradeoffRequest};
/// use lotsman::{render_tradeoff_map_svg, tradeoff};
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// let points = RiskGrid {
///     aql: vec![0.005, 0.01, 0.015], rql: vec![0.04, 0.06, 0.08], alpha: 0.05, beta: 0.10,
/// };
/// let request = TradeoffRequest::new(points, model, Scheme::Single, Criterion::AsnAql, None).unwrap();
/// let grid = tradeoff(&request, &|| {});
/// let svg = render_tradeoff_map_svg(&grid, "Seal rings", None, Paper::A4, Some((0.06, 0.01))).unwrap();
/// assert!(svg.contains("<svg") && svg.contains("The agreed risk points"));
/// ```
pub fn render_tradeoff_map_svg(
    grid: &TradeoffGrid,
    title: &str,
    command: Option<&str>,
    paper: Paper,
    agreed: Option<(f64, f64)>,
) -> Result<String, Error> {
    check_grid(grid)?;
    let fonts = Fonts::embedded()?;
    let hash = inputs_hash(grid, title, command, paper);
    let mut page = SvgPage::new(landscape(paper));
    lay(
        &mut page,
        &fonts,
        grid,
        (title, command, &hash),
        paper,
        agreed,
    )?;
    Ok(page.finish(title))
}

/// The paper turned: landscape.
fn landscape(paper: Paper) -> (f64, f64) {
    let (ph, pw) = paper.size();
    (pw, ph)
}

/// The checks of a grid before it is drawn: the report's guard, and two
/// increasing values at least on each axis.
fn check_grid(grid: &TradeoffGrid) -> Result<(), Error> {
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
    Ok(())
}

/// The map laid out on `page` (either backend) by [`map_layout`], checked
/// for overflows: the blocks and the panels.
fn lay(
    page: &mut dyn Draw,
    fonts: &Fonts,
    grid: &TradeoffGrid,
    words: (&str, Option<&str>, &str),
    paper: Paper,
    agreed: Option<(f64, f64)>,
) -> Result<(Vec<Region>, Vec<MapPanel>), Error> {
    let (pw, ph) = landscape(paper);
    let mut c = Canvas::new(page, fonts);
    let panels = map_layout(&mut c, grid, words, (pw, ph), agreed);
    let laid = c.finish(pw, ph);
    if !laid.is_clean() {
        let all: Vec<String> = laid.overflows.into_iter().chain(laid.faults).collect();
        return Err(InputError::Inconsistent(format!(
            "the trade-off map cannot be laid out: {}",
            all.join("; ")
        ))
        .into());
    }
    Ok((laid.regions, panels))
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
