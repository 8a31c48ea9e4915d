//! What a trade-off grid is asked for, validated, and the work of solving
//! it, which the request is held to when it is made.

use crate::budget::{TIME_BUDGET, Work};
use crate::design::limits::{MAX_DOUBLE_SINGLE_C, MAX_GRID_CELLS};
use crate::design::request::{Criterion, Scheme, SchemeOptions};
use crate::design::work::{Approximation, double_cpu_seconds, single_cell_seconds};
use crate::input::InputError;
use crate::model::{Model, check_quality, check_risks};
use crate::plan::{StagedPlan, measures};

/// The expected inspection at the process average.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct CellCost {
    /// `Pa(p̄)`.
    pub pa: f64,
    /// `ATI(p̄)`, units per lot.
    pub ati: f64,
    /// Cost per unit times `ATI(p̄)`.
    pub cost: f64,
}

/// The cost of inspection, for the cost view of a grid.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct InspectionCost {
    per_unit: f64,
    process_average: f64,
}

impl InspectionCost {
    /// The cost of inspecting one unit `per_unit` (in the user's
    /// currency) and the process average at which it is taken, checked
    /// for `model`: the one check of a cost, for a grid's cost view and
    /// for the cost of one plan alike.
    ///
    /// # Errors
    /// [`InputError::OutOfRange`] when the cost is not a positive number
    /// or the process average is not a quality of `model`.
    ///
    /// # Example
    /// ```
    /// use lotsman::{InspectionCost, Model, ModelKind, design_single, RiskPair, RiskPoint};
    /// let model = Model::new(ModelKind::Hypergeometric, Some(2000)).unwrap();
    /// let risks = RiskPair::new(
    ///     RiskPoint { quality: 0.01, risk: 0.05 },
    ///     RiskPoint { quality: 0.06, risk: 0.10 },
    ///     &model,
    /// ).unwrap();
    /// let plan = design_single(&model, &risks).unwrap().plan;
    /// let cost = InspectionCost::new(2.0, 0.01, &model).unwrap();
    /// let at = cost.at(&plan, &model).unwrap();
    /// assert!((at.cost - 2.0 * at.ati).abs() < 1e-9);
    /// assert!(InspectionCost::new(-2.0, 0.01, &model).is_err());
    /// ```
    pub fn new(per_unit: f64, process_average: f64, model: &Model) -> Result<Self, InputError> {
        if !(per_unit.is_finite() && per_unit > 0.0) {
            return Err(InputError::out_of_range(
                "cost per unit inspected",
                per_unit,
                "a positive number",
            ));
        }
        check_quality(model, "process average", process_average)?;
        Ok(InspectionCost {
            per_unit,
            process_average,
        })
    }

    /// The expected inspection of `plan` under `model` at the process
    /// average: `Pa`, `ATI` (rejected lots screened 100%) and the cost
    /// per unit times `ATI` ([`measures`]); `None` without a lot size,
    /// which the ATI counts.
    pub fn at(&self, plan: &StagedPlan, model: &Model) -> Option<CellCost> {
        let m = measures(plan, model, self.process_average);
        m.ati.map(|ati| CellCost {
            pa: m.pa,
            ati,
            cost: self.per_unit * ati,
        })
    }

    /// The cost of inspecting one unit, in the user's currency.
    pub fn per_unit(&self) -> f64 {
        self.per_unit
    }

    /// The process average `p̄` at which the cost is taken.
    pub fn process_average(&self) -> f64 {
        self.process_average
    }
}

/// The risk points of a trade-off grid: a producer's quality (AQL) per row,
/// a consumer's quality (RQL) per column, and one pair of risks for every
/// cell.
#[derive(Clone, Debug, PartialEq)]
pub struct RiskGrid {
    /// The producer's qualities, one per row.
    pub aql: Vec<f64>,
    /// The consumer's qualities, one per column.
    pub rql: Vec<f64>,
    /// The producer's risk alpha, the same in every cell.
    pub alpha: f64,
    /// The consumer's risk beta, the same in every cell.
    pub beta: f64,
}

/// What to solve: the grid of qualities, the two risks, the model, the
/// scheme and optionally the cost of inspection. It exists only when valid.
#[derive(Clone, Debug, PartialEq)]
pub struct TradeoffRequest {
    aql: Vec<f64>,
    rql: Vec<f64>,
    alpha: f64,
    beta: f64,
    model: Model,
    scheme: Scheme,
    criterion: Criterion,
    cost: Option<InspectionCost>,
}

impl TradeoffRequest {
    /// Validates a grid request.
    ///
    /// The grid's `aql` are the producer's qualities (rows), its `rql` the
    /// consumer's (columns); a cell whose AQL is not below its RQL is valid
    /// input and reports that it has no plan. `cost` is `(cost per unit
    /// inspected, process average)`.
    ///
    /// # Errors
    /// [`InputError`] for an empty axis, a quality the model cannot take,
    /// a risk outside `(0, 1)` or `alpha + beta >= 1`, more than
    /// [`MAX_GRID_CELLS`] cells, a grid whose estimated work
    /// ([`tradeoff_work`](crate::tradeoff_work)) passes the budget, a scheme other than single or double, a
    /// criterion the scheme does not take, a cost that is not a positive
    /// number, or a cost without a lot size.
    pub fn new(
        grid: RiskGrid,
        model: Model,
        scheme: Scheme,
        criterion: Criterion,
        cost: Option<(f64, f64)>,
    ) -> Result<Self, InputError> {
        let RiskGrid {
            aql,
            rql,
            alpha,
            beta,
        } = grid;
        for (name, axis) in [("AQL values", &aql), ("RQL values", &rql)] {
            if axis.is_empty() {
                return Err(InputError::out_of_range(
                    &format!("number of {name}"),
                    0,
                    "at least 1",
                ));
            }
        }
        for &q in &aql {
            check_quality(&model, "producer's quality (AQL)", q)?;
        }
        for &q in &rql {
            check_quality(&model, "consumer's quality (RQL)", q)?;
        }
        check_risks(alpha, beta)?;
        let cells = aql.len().saturating_mul(rql.len());
        if cells > MAX_GRID_CELLS {
            return Err(InputError::out_of_range(
                "number of grid cells",
                cells,
                &format!("at most {MAX_GRID_CELLS} (AQL count x RQL count)"),
            ));
        }
        if !matches!(scheme, Scheme::Single | Scheme::Double) {
            return Err(InputError::Inconsistent(format!(
                "a trade-off grid is drawn for single or double plans, not for {scheme} plans"
            )));
        }
        SchemeOptions {
            criterion,
            ..SchemeOptions::default()
        }
        .check(scheme)?;
        let cost = match cost {
            None => None,
            Some((per_unit, process_average)) => {
                let cost = InspectionCost::new(per_unit, process_average, &model)?;
                if model.lot_size().is_none() {
                    return Err(InputError::Inconsistent(
                        "the cost view needs a lot size: it counts the 100% inspection of rejected lots (ATI); give --lot-size N".to_string(),
                    ));
                }
                Some(cost)
            }
        };
        let request = TradeoffRequest {
            aql,
            rql,
            alpha,
            beta,
            model,
            scheme,
            criterion,
            cost,
        };
        let advice = match scheme {
            Scheme::Double => "give fewer or coarser AQL and RQL values, or use the single scheme",
            _ => "give fewer or coarser AQL and RQL values",
        };
        tradeoff_work(&request).check(
            &format!(
                "solving the {} x {} grid of {scheme} plans",
                request.aql.len(),
                request.rql.len()
            ),
            advice,
        )?;
        Ok(request)
    }

    /// The producer's qualities, one per row.
    pub fn aql(&self) -> &[f64] {
        &self.aql
    }

    /// The consumer's qualities, one per column.
    pub fn rql(&self) -> &[f64] {
        &self.rql
    }

    /// The producer's risk alpha, the same in every cell.
    pub fn alpha(&self) -> f64 {
        self.alpha
    }

    /// The consumer's risk beta, the same in every cell.
    pub fn beta(&self) -> f64 {
        self.beta
    }

    /// The model.
    pub fn model(&self) -> &Model {
        &self.model
    }

    /// The scheme: single or double.
    pub fn scheme(&self) -> Scheme {
        self.scheme
    }

    /// What the double designer minimises.
    pub fn criterion(&self) -> Criterion {
        self.criterion
    }

    /// The cost of inspection, when given.
    pub fn cost(&self) -> Option<&InspectionCost> {
        self.cost.as_ref()
    }

    /// The number of cells.
    pub fn cell_count(&self) -> usize {
        self.aql.len() * self.rql.len()
    }
}

/// Bytes one cell of a grid holds: its plan and risks, and its text.
const CELL_BYTES: f64 = 800.0;

/// Seconds to format one cell's row of the grid's table: 0.4 us (a
/// 200 x 200 binomial grid's table took 17 ms of processor time).
const CELL_OUTPUT: f64 = 4.0e-7;

/// The work of solving every cell of `request`'s grid, shared over the
/// threads that solve its rows (at least its heaviest row, which one
/// thread solves): each cell's design estimated from its
/// approximate single plan (a cell whose own design passes the budget is
/// refused at once in its place, and costs nothing), and the grid's rows.
pub fn tradeoff_work(request: &TradeoffRequest) -> Work {
    let model = request.model();
    let approximation = Approximation::new(request.alpha(), request.beta());
    let (mut seconds, mut heaviest_row) = (0.0, 0.0f64);
    for &p1 in request.aql() {
        let mut row = 0.0;
        for &p2 in request.rql() {
            if p1 >= p2 {
                continue;
            }
            let Some((n, c)) = approximation.single(model, p1, p2) else {
                continue;
            };
            let cell = match request.scheme() {
                Scheme::Double if c <= MAX_DOUBLE_SINGLE_C => {
                    double_cpu_seconds(model, n, c, request.criterion(), None)
                }
                Scheme::Double => 0.0,
                _ => single_cell_seconds(model, c),
            };
            // A cell whose own search passes the budget (shared over the
            // threads as a design of its own would be) is refused at once.
            let threads = rayon::current_num_threads().max(1) as f64;
            if cell / threads <= TIME_BUDGET {
                row += cell;
            }
        }
        seconds += row;
        heaviest_row = heaviest_row.max(row);
    }
    // A row is solved on one thread: the grid takes its share of the
    // threads, and never less than its heaviest row.
    let threads = rayon::current_num_threads().max(1) as f64;
    let cells = request.cell_count() as f64;
    Work {
        seconds: (seconds / threads).max(heaviest_row) + cells * CELL_OUTPUT,
        bytes: cells * CELL_BYTES,
    }
}
