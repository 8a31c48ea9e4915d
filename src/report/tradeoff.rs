//! The report of a trade-off grid: what `tradeoff` prints.

use serde::Serialize;

use crate::design::{Scheme, TradeoffGrid};
use crate::model::ModelKind;
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
