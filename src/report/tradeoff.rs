//! The report of a trade-off grid: what `tradeoff` prints, a matrix of
//! plans (and costs) by AQL and RQL.

use std::io::{self, Write};

use comfy_table::{CellAlignment, ContentArrangement, Table as Grid};
use serde::Serialize;

use super::format::{Report, cell, csv_writer, num, opt, quality_column};
use super::table_kit::RULED;
use super::words;

use crate::design::{Scheme, TradeoffGrid};
use crate::model::ModelKind;
use crate::numeric::{Short, format_quality, format_quality_cell};
use crate::plain::escape_controls;
use crate::plan::Stage;
use crate::source::tool_version;

/// The cost of inspection a grid was priced with.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct CostReport {
    /// Cost of inspecting one unit.
    pub per_unit: f64,
    /// The process average at which ATI is taken.
    pub process_average: f64,
}

/// One cell of the grid.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct TradeoffCellReport {
    /// The producer's quality (AQL) of the cell.
    pub aql: f64,
    /// The consumer's quality (RQL) of the cell.
    pub rql: f64,
    /// Sample size of a single plan; largest sample `n1 + n2` of a double
    /// plan; `null` without a plan.
    pub n: Option<u64>,
    /// Acceptance number of a single plan; final acceptance number of a
    /// double plan; `null` without a plan.
    pub c: Option<u64>,
    /// Double plans: the two stages on cumulative counts.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub stages: Option<Vec<Stage>>,
    /// Average sample number at the AQL (`n` for a single plan).
    pub asn_at_aql: Option<f64>,
    /// Achieved producer's risk at the AQL.
    pub producer_risk: Option<f64>,
    /// Achieved consumer's risk at the RQL.
    pub consumer_risk: Option<f64>,
    /// With a cost: probability of acceptance at the process average.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub pa_at_process: Option<Option<f64>>,
    /// With a cost: average total inspection per lot at the process average.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub ati: Option<Option<f64>>,
    /// With a cost: cost per unit times `ati`.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub cost: Option<Option<f64>>,
    /// Whether the cell's answer is 100% inspection: its points need a
    /// sample larger than the lot. `n` and `asn_at_aql` are then the lot
    /// size (every unit is inspected), `ati` too and `cost` the cost of
    /// inspecting the whole lot; `reason` says why.
    pub full_inspection: bool,
    /// Why the cell has no plan; `null` when it has one.
    pub reason: Option<String>,
}

/// What `tradeoff` reports.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct TradeoffReport {
    /// Title given on the command line, `null` when none.
    pub title: Option<String>,
    /// `single` or `double`.
    pub scheme: &'static str,
    /// Model name.
    pub model: ModelKind,
    /// The unit of the AQL and RQL values: `fraction` or `per_unit`
    /// ([`ModelKind::quality_unit`]).
    pub quality_unit: &'static str,
    /// Lot size, `null` when absent.
    pub lot_size: Option<u64>,
    /// The producer's risk of every cell.
    pub alpha: f64,
    /// The consumer's risk of every cell.
    pub beta: f64,
    /// Double plans: what the designer minimised.
    pub criterion: Option<&'static str>,
    /// The AQL values (rows).
    pub aql: Vec<f64>,
    /// The RQL values (columns).
    pub rql: Vec<f64>,
    /// The cost of inspection, `null` when not given.
    pub cost: Option<CostReport>,
    /// One per cell, row by row (AQL outer, RQL inner).
    pub cells: Vec<TradeoffCellReport>,
    /// Tool and version.
    pub solved_by: String,
}

impl TradeoffReport {
    /// The report of `grid`, under `title`.
    pub fn new(title: Option<&str>, grid: &TradeoffGrid) -> Self {
        let r = &grid.request;
        let double = r.scheme() == Scheme::Double;
        let priced = r.cost().is_some();
        let cells = grid
            .cells
            .iter()
            .map(|cell| {
                let plan = cell.outcome.as_ref().ok();
                let costed = |f: fn(&crate::design::CellCost) -> f64| {
                    priced.then(|| plan.and_then(|p| p.cost.as_ref()).map(f))
                };
                let whole = cell.full_inspection();
                let lot = whole.map(|n| n as f64);
                TradeoffCellReport {
                    aql: cell.aql,
                    rql: cell.rql,
                    n: plan.map(|p| p.n()).or(whole),
                    c: plan.map(|p| p.c()),
                    stages: plan.filter(|_| double).map(|p| p.plan.stages().to_vec()),
                    asn_at_aql: plan.map(|p| p.asn_at_aql).or(lot),
                    producer_risk: plan.map(|p| p.producer_risk),
                    consumer_risk: plan.map(|p| p.consumer_risk),
                    pa_at_process: costed(|c| c.pa),
                    ati: costed(|c| c.ati).map(|v| v.or(lot)),
                    cost: costed(|c| c.cost).map(|v| v.or(grid.full_inspection_cost(cell))),
                    full_inspection: whole.is_some(),
                    reason: cell.outcome.as_ref().err().map(|e| e.to_string()),
                }
            })
            .collect();
        TradeoffReport {
            title: title.map(str::to_string),
            scheme: r.scheme().name(),
            model: r.model().kind(),
            quality_unit: r.model().kind().quality_unit(),
            lot_size: r.model().lot_size(),
            alpha: r.alpha(),
            beta: r.beta(),
            criterion: double.then(|| r.criterion().name()),
            aql: r.aql().to_vec(),
            rql: r.rql().to_vec(),
            cost: r.cost().map(|k| CostReport {
                per_unit: k.per_unit(),
                process_average: k.process_average(),
            }),
            cells,
            solved_by: tool_version(),
        }
    }

    /// The cell at row `i` (AQL) and column `j` (RQL).
    pub fn cell(&self, i: usize, j: usize) -> &TradeoffCellReport {
        &self.cells[i * self.rql.len() + j]
    }
}

impl Report for TradeoffReport {
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        let r = self;
        let per_unit = r.model == ModelKind::Poisson;
        if let Some(title) = &r.title {
            writeln!(out, "{}", escape_controls(title))?;
        }
        let lot = r
            .lot_size
            .map_or("no lot size".to_string(), |n| format!("lot of {n} units"));
        writeln!(
            out,
            "{} plans, {} model, {lot}; alpha {} and beta {} in every cell",
            r.scheme,
            r.model,
            Short(r.alpha),
            Short(r.beta)
        )?;
        if per_unit {
            writeln!(
                out,
                "AQL and RQL in nonconformities per unit (per 100 units in brackets)"
            )?;
        }
        writeln!(out)?;
        let double = r.criterion.is_some();
        if double {
            writeln!(
                out,
                "ASN at the AQL (largest sample n1 + n2) of the double plan minimising {} for each AQL (row) and RQL (column)",
                r.criterion.unwrap_or_default()
            )?;
        } else {
            writeln!(
                out,
                "Sample size and acceptance number n/c of the smallest single plan for each AQL (row) and RQL (column)"
            )?;
        }
        write_matrix(out, r, per_unit, |c| match (c.n, c.c) {
            _ if c.full_inspection => "100%".to_string(),
            (Some(n), Some(_)) if double => {
                format!("{:.1} ({n})", c.asn_at_aql.unwrap_or(f64::NAN))
            }
            (Some(n), Some(acc)) => format!("{n}/{acc}"),
            _ => "-".to_string(),
        })?;
        if let Some(k) = &r.cost {
            writeln!(out)?;
            writeln!(
                out,
                "Expected inspection cost per lot at the process average {} ({} per unit inspected; ATI: sample, plus the whole lot when rejected)",
                format_quality(k.process_average, per_unit),
                k.per_unit
            )?;
            write_matrix(out, r, per_unit, |c| {
                c.cost
                    .flatten()
                    .map_or("-".to_string(), |v| format!("{v:.2}"))
            })?;
        }
        let whole = r.cells.iter().filter(|c| c.full_inspection).count();
        if let (true, Some(lot)) = (whole > 0, r.lot_size) {
            writeln!(
                out,
                "- 100% in {whole} of {} cells: their points need a sample larger than the lot of {lot} units, so every unit is inspected (ATI {lot}{})",
                r.cells.len(),
                r.cost.as_ref().map_or(String::new(), |k| format!(
                    ", cost {:.2} per lot",
                    k.per_unit * lot as f64
                ))
            )?;
        }
        let failed: Vec<&TradeoffCellReport> = r
            .cells
            .iter()
            .filter(|c| c.reason.is_some() && !c.full_inspection)
            .collect();
        if let Some(first) = failed.first() {
            writeln!(
                out,
                "- no plan in {} of {} cells (--format json gives each reason), e.g. at AQL {}, RQL {}: {}",
                failed.len(),
                r.cells.len(),
                format_quality(first.aql, per_unit),
                format_quality(first.rql, per_unit),
                first.reason.as_deref().unwrap_or_default()
            )?;
        }
        writeln!(
            out,
            "The grid is a negotiation aid: record the agreed plan with `lotsman design ... --output FILE.yaml`."
        )?;
        writeln!(out, "{}", words::CAUTION)
    }

    /// One row per cell, row by row.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let r = self;
        let mut w = csv_writer(out);
        let mut header = vec![
            quality_column("aql", r.model),
            quality_column("rql", r.model),
        ];
        header.extend(
            [
                "n",
                "c",
                "asn_at_aql",
                "producer_risk",
                "consumer_risk",
                "stages",
                "pa_at_process",
                "ati",
                "cost",
                "full_inspection",
                "reason",
            ]
            .map(String::from),
        );
        w.write_record(&header)?;
        for c in &r.cells {
            let stages = c.stages.as_ref().map(|s| {
                s.iter()
                    .map(ToString::to_string)
                    .collect::<Vec<_>>()
                    .join(" ")
            });
            w.write_record([
                num(c.aql),
                num(c.rql),
                cell(c.n),
                cell(c.c),
                opt(c.asn_at_aql),
                opt(c.producer_risk),
                opt(c.consumer_risk),
                cell(stages),
                opt(c.pa_at_process.flatten()),
                opt(c.ati.flatten()),
                opt(c.cost.flatten()),
                c.full_inspection.to_string(),
                c.reason.clone().unwrap_or_default(),
            ])?;
        }
        w.flush()
    }
}

/// How many RQL columns one block of a grid shows.
const GRID_COLUMNS: usize = 8;

/// The grid as blocks of at most [`GRID_COLUMNS`] RQL columns, one row per
/// AQL, each cell as `text` writes it.
fn write_matrix(
    out: &mut dyn Write,
    r: &TradeoffReport,
    per_unit: bool,
    text: impl Fn(&TradeoffCellReport) -> String,
) -> io::Result<()> {
    for first in (0..r.rql.len()).step_by(GRID_COLUMNS) {
        let last = (first + GRID_COLUMNS).min(r.rql.len());
        let mut header = vec!["AQL \\ RQL".to_string()];
        header.extend(
            r.rql[first..last]
                .iter()
                .map(|&q| format_quality_cell(q, per_unit)),
        );
        let mut g = Grid::new();
        g.load_style(RULED)
            .set_content_arrangement(ContentArrangement::Disabled);
        g.set_header(header);
        for i in 1..=last - first {
            if let Some(col) = g.column_mut(i) {
                col.set_cell_alignment(CellAlignment::Right);
            }
        }
        for (i, &aql) in r.aql.iter().enumerate() {
            let mut row = vec![format_quality_cell(aql, per_unit)];
            row.extend((first..last).map(|j| text(r.cell(i, j))));
            g.add_row(row);
        }
        writeln!(out, "{g}")?;
    }
    Ok(())
}
