//! The trade-off grid: the plan for every pair of risk points on a grid of
//! AQL and RQL values, with the expected inspection cost per lot where a
//! cost is given.
//!
//! A buyer and a supplier rarely start with fixed risk points; they trade
//! the points against what inspection costs. The grid shows, for each
//! producer's quality (a row) and each consumer's quality (a column), the
//! plan that the designer would choose, so both sides see which concession
//! is expensive.
//!
//! # Method
//!
//! Every cell is solved exactly by the scheme's designer (single:
//! [`design_single`](super::single::design_single); double:
//! [`design_double`](super::double::design_double)); the grid changes how
//! much work that takes, never the answer.
//!
//! * Rows run in parallel (rayon), one row per task.
//! * Along a row the producer's point is fixed, so the largest sample
//!   `n_max(c)` that meets it is the same for every cell: it is found once
//!   per acceptance number and reused exactly.
//! * Along a row the consumer's quality moves a step at a time, so the
//!   smallest sample `n_min(c)` and the acceptance number move little: the
//!   neighbour's answers start the next cell's searches (warm-started
//!   brackets). The searches are exact from any start.
//!
//! # Cost
//!
//! With a cost per unit inspected `k` and a process average
//! `p̄`, the expected inspection cost per lot under rectifying inspection
//! (rejected lots screened 100%) is `k ATI(p̄)`, with
//! `ATI = Σ_j a_j n_j + (1 − Pa) N` (for a single plan
//! `n + (1 − Pa)(N − n)`), so a lot size is required.
//!
//! # Cells beyond the lot
//!
//! Whenever the lot size is known, a cell whose points need a sample
//! larger than the lot has no sampling plan: its answer is 100%
//! inspection ([`TradeoffCell::full_inspection`]). Its ATI is the whole lot
//! `N`, so its cost is `k N` ([`TradeoffGrid::full_inspection_cost`]), the
//! most any plan can cost, since `ATI <= N`.

use rayon::prelude::*;

mod request;

pub use self::request::{CellCost, InspectionCost, RiskGrid, TradeoffRequest, tradeoff_work};

use super::double::design_double;
use super::request::Scheme;
use super::single::{Memo, design_single_with};
use crate::design::DesignError;
use crate::model::{RiskPair, RiskPoint};
use crate::plan::{StagedPlan, measures};

/// The plan of one cell with what it achieves.
#[derive(Clone, Debug, PartialEq)]
pub struct CellPlan {
    /// The plan.
    pub plan: StagedPlan,
    /// Achieved producer's risk at the cell's AQL.
    pub producer_risk: f64,
    /// Achieved consumer's risk at the cell's RQL.
    pub consumer_risk: f64,
    /// The average sample number at the cell's AQL (`n` for a single plan).
    pub asn_at_aql: f64,
    /// The cost view, when a cost was given.
    pub cost: Option<CellCost>,
}

impl CellPlan {
    /// The largest sample the plan can take (`n` of a single plan).
    pub fn n(&self) -> u64 {
        self.plan.max_sample()
    }

    /// The last stage's acceptance number (`c` of a single plan).
    pub fn c(&self) -> u64 {
        let stages = self.plan.stages();
        stages[stages.len() - 1].accept.unwrap_or(0)
    }
}

/// One cell of the grid.
#[derive(Clone, Debug, PartialEq)]
pub struct TradeoffCell {
    /// The producer's quality.
    pub aql: f64,
    /// The consumer's quality.
    pub rql: f64,
    /// The plan, or why there is none.
    pub outcome: Result<CellPlan, DesignError>,
}

impl TradeoffCell {
    /// The lot size, when the cell's answer is 100% inspection: its points
    /// need a sample larger than the lot ([`DesignError::WholeLot`]).
    pub fn full_inspection(&self) -> Option<u64> {
        match self.outcome {
            Err(DesignError::WholeLot { lot, .. }) => Some(lot),
            _ => None,
        }
    }
}

/// A solved grid: the cells row by row (AQL outer, RQL inner).
#[derive(Clone, Debug, PartialEq)]
pub struct TradeoffGrid {
    /// The request it answers.
    pub request: TradeoffRequest,
    /// `aql.len() * rql.len()` cells, row-major.
    pub cells: Vec<TradeoffCell>,
}

impl TradeoffGrid {
    /// The cell at row `i` (AQL) and column `j` (RQL).
    pub fn cell(&self, i: usize, j: usize) -> &TradeoffCell {
        &self.cells[i * self.request.rql().len() + j]
    }

    /// The cost per lot of a cell whose answer is 100% inspection, when
    /// the grid is priced: every unit of the lot is inspected, so its ATI
    /// is `N` and its cost `k N`, the cap of the method's cost
    /// `k ATI <= k N`.
    pub fn full_inspection_cost(&self, cell: &TradeoffCell) -> Option<f64> {
        let lot = cell.full_inspection()?;
        self.request.cost().map(|k| k.per_unit() * lot as f64)
    }
}

/// Solves every cell of the grid (see the module documentation);
/// `progress` is called once per finished cell, from any thread.
///
/// # Example
/// ```
/// use lotsman::{Criterion, Model, ModelKind, RiskGrid, Scheme, TradeoffRequest, tradeoff};
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// let grid = RiskGrid { aql: vec![0.005, 0.01], rql: vec![0.04, 0.06], alpha: 0.05, beta: 0.10 };
/// let request = TradeoffRequest::new(grid, model, Scheme::Single, Criterion::AsnAql, None).unwrap();
/// let grid = tradeoff(&request, &|| {});
/// let cell = grid.cell(1, 1).outcome.as_ref().unwrap();
/// assert_eq!((cell.n(), cell.c()), (110, 3)); // as `lotsman design --aql 1% --rql 6%`
/// ```
pub fn tradeoff(request: &TradeoffRequest, progress: &(dyn Fn() + Sync)) -> TradeoffGrid {
    let rows: Vec<Vec<TradeoffCell>> = request
        .aql()
        .par_iter()
        .map(|&aql| {
            let mut memo = Memo::default();
            request
                .rql()
                .iter()
                .map(|&rql| {
                    let outcome = solve_cell(request, aql, rql, &mut memo);
                    progress();
                    TradeoffCell { aql, rql, outcome }
                })
                .collect()
        })
        .collect();
    TradeoffGrid {
        request: request.clone(),
        cells: rows.into_iter().flatten().collect(),
    }
}

fn solve_cell(
    request: &TradeoffRequest,
    aql: f64,
    rql: f64,
    memo: &mut Memo,
) -> Result<CellPlan, DesignError> {
    let model = request.model();
    let risks = RiskPair::new(
        RiskPoint {
            quality: aql,
            risk: request.alpha(),
        },
        RiskPoint {
            quality: rql,
            risk: request.beta(),
        },
        model,
    )
    .map_err(|e| DesignError::NoPlan {
        reason: e.to_string(),
        suggestion: "choose an RQL above the AQL".to_string(),
    })?;
    let (plan, producer_risk, consumer_risk) = match request.scheme() {
        Scheme::Double => {
            let d = design_double(model, &risks, request.criterion(), None)?;
            (d.plan, d.producer_risk, d.consumer_risk)
        }
        _ => {
            let d = design_single_with(model, &risks, memo)?;
            (d.plan, d.producer_risk, d.consumer_risk)
        }
    };
    let asn_at_aql = match plan.as_single() {
        Some((n, _)) => n as f64,
        None => measures(&plan, model, aql).asn,
    };
    // The request holds a lot size whenever it holds a cost.
    let cost = request.cost().and_then(|k| k.at(&plan, model));
    Ok(CellPlan {
        plan,
        producer_risk,
        consumer_risk,
        asn_at_aql,
        cost,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::design::Criterion;
    use crate::model::{Model, ModelKind};

    fn grid(kind: ModelKind, lot: Option<u64>, aql: Vec<f64>, rql: Vec<f64>) -> TradeoffGrid {
        let model = Model::new(kind, lot).unwrap();
        let request = TradeoffRequest::new(
            RiskGrid {
                aql,
                rql,
                alpha: 0.05,
                beta: 0.10,
            },
            model,
            Scheme::Single,
            Criterion::AsnAql,
            None,
        )
        .unwrap();
        tradeoff(&request, &|| {})
    }

    #[test]
    fn warm_started_cells_equal_cold_designs() {
        let aql: Vec<f64> = (0..7).map(|i| 0.002 + 0.003 * i as f64).collect();
        let rql: Vec<f64> = (0..15).map(|j| 0.03 + 0.006 * j as f64).collect();
        for (kind, lot) in [
            (ModelKind::Binomial, None),
            (ModelKind::Poisson, None),
            (ModelKind::Hypergeometric, Some(1500)),
        ] {
            let g = grid(kind, lot, aql.clone(), rql.clone());
            let model = *g.request.model();
            for cell in &g.cells {
                let risks = RiskPair::new(
                    RiskPoint {
                        quality: cell.aql,
                        risk: 0.05,
                    },
                    RiskPoint {
                        quality: cell.rql,
                        risk: 0.10,
                    },
                    &model,
                )
                .unwrap();
                let cold = super::super::single::design_single(&model, &risks);
                match (&cell.outcome, cold) {
                    (Ok(warm), Ok(cold)) => {
                        assert_eq!(warm.plan, cold.plan, "{kind} {} {}", cell.aql, cell.rql)
                    }
                    (Err(a), Err(b)) => assert_eq!(a, &b),
                    (a, b) => panic!("{kind} {} {}: {a:?} against {b:?}", cell.aql, cell.rql),
                }
            }
        }
    }

    #[test]
    fn a_cell_whose_aql_is_not_below_its_rql_has_no_plan() {
        let g = grid(ModelKind::Binomial, None, vec![0.01, 0.05], vec![0.04]);
        assert!(g.cell(0, 0).outcome.is_ok());
        let err = g.cell(1, 0).outcome.as_ref().unwrap_err().to_string();
        assert!(err.contains("must be below"), "{err}");
    }

    #[test]
    fn the_cost_view_needs_a_lot_size() {
        let model = Model::new(ModelKind::Binomial, None).unwrap();
        let err = TradeoffRequest::new(
            RiskGrid {
                aql: vec![0.01],
                rql: vec![0.05],
                alpha: 0.05,
                beta: 0.10,
            },
            model,
            Scheme::Single,
            Criterion::AsnAql,
            Some((2.0, 0.01)),
        )
        .unwrap_err();
        assert!(err.to_string().contains("lot size"), "{err}");
    }
}
