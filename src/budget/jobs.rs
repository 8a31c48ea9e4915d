//! The work of whole commands, from the estimates of their parts: a
//! trade-off grid, a minimum-inspection design, one plan source under
//! `verify`, `evaluate` or `sheet`, and a batch of them; and the checks
//! that refuse a command before it starts.

use std::path::Path;

use super::estimate::{
    Approximation, ROW_OUTPUT, design_work, double_cpu_seconds, double_work, evaluation_advice,
    evaluation_advice_for, evaluation_work, most_variables_qualities, single_cell_seconds,
    tail_terms, variables_design_work, variables_evaluation_work, walk_parts,
};
use super::{OverBudget, TIME_BUDGET, Work};
use crate::design::{
    MAX_DOUBLE_SINGLE_C, Protection, RectifyingRequest, Scheme, TradeoffRequest, aoql_factor,
    poisson_mean_at, sample_for_mean, z_upper,
};
use crate::model::ModelKind;
use crate::source::PlanSource;

/// Bytes one cell of a grid holds: its plan and risks, and its text.
const CELL_BYTES: f64 = 800.0;

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
                _ => single_cell_seconds(model, n, c),
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
        seconds: (seconds / threads).max(heaviest_row) + cells * ROW_OUTPUT,
        bytes: cells * CELL_BYTES,
    }
}

/// Seconds per tail term of the minimum-inspection scan for an LTPD (each
/// acceptance number costs one threshold search of a few dozen tails):
/// the scan of a lot of 10^12 at 0.99% against 1%, which reaches the
/// largest acceptance number.
const LTPD_SCAN_TERM: f64 = 1.4e-7;

/// The same for an AOQL, whose every step of the threshold search scans
/// the AOQ curve (about 130 walks): the scan to 2000 takes about 10 s.
const AOQL_SCAN_TERM: f64 = 2.7e-5;

/// The work of a minimum-inspection design's scan over acceptance numbers
/// ([`design_rectifying`](crate::design_rectifying)), from where the
/// closed-form approximations say it stops: the scan runs up `c` while
/// the smallest sample giving the protection stays below the best ATI
/// found. The double search that follows is estimated from the scan's
/// answer before it starts.
pub fn minimum_work(request: &RectifyingRequest) -> Work {
    let model = request.model();
    let lot = request.lot_size() as f64;
    let p = request.process_average();
    let (last, per_term) = match request.protection() {
        Protection::Ltpd(_) => (crate::plan::MAX_ACCEPTANCE_NUMBER, LTPD_SCAN_TERM),
        Protection::Aoql(_) => (crate::design::MAX_AOQL_ACCEPTANCE_NUMBER, AOQL_SCAN_TERM),
    };
    let z_beta = match request.protection() {
        Protection::Ltpd(point) => z_upper(point.risk),
        Protection::Aoql(_) => 0.0,
    };
    let mut best_ati = lot;
    let mut terms = 0.0;
    for c in 0..=last {
        terms += tail_terms(c);
        let n = match request.protection() {
            Protection::Ltpd(point) => sample_for_mean(
                poisson_mean_at(c, z_beta),
                point.quality,
                model.kind(),
                Some(request.lot_size()),
            ),
            Protection::Aoql(limit) => {
                let y = aoql_factor(c);
                y / (limit + y / lot)
            }
        };
        if !n.is_finite() || n >= lot {
            break;
        }
        // Pa at the process average by the normal approximation to the
        // Poisson count; the ATI it gives only steers the estimate.
        let mean = n * p;
        let pa = crate::model::normal::cdf((c as f64 + 0.5 - mean) / mean.sqrt().max(1e-300));
        best_ati = best_ati.min(n + (1.0 - pa) * (lot - n));
        if n >= best_ati {
            break;
        }
    }
    let scale = if model.kind() == ModelKind::Hypergeometric {
        1.0
    } else {
        0.5
    };
    Work::time(scale * per_term * terms)
}

/// The work of the minimum-inspection double search around the single
/// plans up to `reach` units with acceptance numbers from `start`: the
/// double sweep's size, as for [`double_work`], and ten times that for an
/// AOQL, whose every test scans the AOQ curve.
pub(crate) fn minimum_double_work(request: &RectifyingRequest, reach: f64, start: u64) -> Work {
    let search = double_work(
        request.model(),
        reach,
        start,
        crate::design::Criterion::AsnAql,
        None,
    );
    match request.protection() {
        Protection::Ltpd(_) => search,
        Protection::Aoql(_) => Work::time(10.0 * search.seconds),
    }
}

/// What a command does with a plan source.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum SourceJob {
    /// Re-solve it and compare (`verify`).
    Verify,
    /// Audit it and print its sheet (`sheet`).
    Sheet,
    /// Audit it and decide a lot by its plan (`judge`).
    Judge,
    /// Evaluate its recorded plan at `points` qualities (`None`: the
    /// default ones), with the per-stage distribution when `decided_at`.
    Evaluate {
        /// The qualities asked for.
        points: Option<usize>,
        /// Whether the per-stage distribution is asked for.
        decided_at: bool,
    },
}

/// OC walks with the curtailed sample number a sheet takes: the 241
/// points of its curves and the OC table's qualities.
const SHEET_CURTAILED_WALKS: f64 = 250.0;

/// OC walks without it: the table's AOQL and indifference searches, the
/// sheet's own largest ASN and AOQL searches, the quality axis and the
/// audit's two risks.
const SHEET_WALKS: f64 = 600.0;

/// Seconds to lay out and write a sheet's PDF, whatever its plan: about
/// 8 ms (1001 sheets of the demo plans, audits included, took 11.7 s of
/// processor time).
const SHEET_LAYOUT: f64 = 0.01;

/// The qualities an evaluation takes when none are asked for.
const DEFAULT_POINTS: usize = 10;

/// The work of `job` on `source`; a source whose request or recorded plan
/// is invalid is refused at once and costs nothing.
pub fn source_work(source: &PlanSource, job: SourceJob) -> Work {
    if source.is_variables() {
        let Ok(request) = source.variables_request() else {
            return Work::default();
        };
        let spec = request.spec();
        let design = variables_design_work(spec, request.risks());
        return match job {
            SourceJob::Verify | SourceJob::Judge => design,
            SourceJob::Sheet => design
                .and(variables_evaluation_work(spec, 241))
                .and(Work::time(SHEET_LAYOUT)),
            // The audit re-solves the source before the evaluation.
            SourceJob::Evaluate { points, .. } => design.and(variables_evaluation_work(
                spec,
                points.unwrap_or(DEFAULT_POINTS),
            )),
        };
    }
    let Ok(request) = source.request() else {
        return Work::default();
    };
    let recorded = || source.recorded_plan(&request.model).ok();
    match job {
        SourceJob::Verify | SourceJob::Judge => design_work(&request, false),
        SourceJob::Sheet => {
            let render = recorded().map_or(Work::default(), |plan| {
                let (outcomes, curtailed) = walk_parts(&plan, &request.model);
                Work::time(
                    (SHEET_WALKS + SHEET_CURTAILED_WALKS) * outcomes
                        + SHEET_CURTAILED_WALKS * curtailed
                        + SHEET_LAYOUT,
                )
            });
            design_work(&request, false).and(render)
        }
        // The audit re-solves the source before the evaluation.
        SourceJob::Evaluate { points, decided_at } => {
            design_work(&request, false).and(recorded().map_or(Work::default(), |plan| {
                evaluation_work(
                    &plan,
                    &request.model,
                    points.unwrap_or(DEFAULT_POINTS),
                    decided_at,
                )
            }))
        }
    }
}

/// What `job` does, in words, for a refusal.
fn doing(job: SourceJob) -> &'static str {
    match job {
        SourceJob::Verify => "verifying",
        SourceJob::Judge => "judging a lot by",
        SourceJob::Sheet => "printing the sheets of",
        SourceJob::Evaluate { .. } => "evaluating",
    }
}

/// Checks `job` on the one source at `path` against the budget.
///
/// # Errors
/// [`OverBudget`] naming the source, the estimate and what to do.
pub fn check_source(source: &PlanSource, path: &Path, job: SourceJob) -> Result<(), OverBudget> {
    let work = source_work(source, job);
    if work.fits() {
        return Ok(());
    }
    let advice = match job {
        SourceJob::Evaluate { points, decided_at } => {
            evaluate_advice(source, points.unwrap_or(DEFAULT_POINTS), decided_at)
        }
        _ => "re-design it with points further apart, or as a single plan".to_string(),
    };
    work.check(&format!("{} {}", doing(job), path.display()), &advice)
        .map(|_| ())
}

/// How to bring the evaluation of `source`'s plan at `points` qualities
/// within the budget.
fn evaluate_advice(source: &PlanSource, points: usize, decided_at: bool) -> String {
    if source.is_variables() {
        return match source.variables_request() {
            Ok(request) => evaluation_advice_for(most_variables_qualities(request.spec()), false),
            Err(_) => String::new(),
        };
    }
    match source
        .request()
        .ok()
        .and_then(|r| Some((source.recorded_plan(&r.model).ok()?, r.model)))
    {
        Some((plan, model)) => evaluation_advice(&plan, &model, points, decided_at),
        None => String::new(),
    }
}

/// Checks `job` on every source at `paths`, run in parallel, against the
/// budget: the sum of their estimates over the threads that share them
/// (and never less than the heaviest alone); every result is kept until
/// the report is printed, so their memories add. A file that cannot be
/// read or parsed is reported in its place by the batch, and costs
/// nothing here.
///
/// # Errors
/// [`OverBudget`] naming the count, the estimate, and the heaviest source.
pub fn check_batch<'a>(
    paths: impl IntoIterator<Item = &'a Path>,
    job: SourceJob,
) -> Result<(), OverBudget> {
    let paths: Vec<&Path> = paths.into_iter().collect();
    if let [path] = paths.as_slice() {
        return match PlanSource::load(path) {
            Ok(source) => check_source(&source, path, job),
            Err(_) => Ok(()),
        };
    }
    let mut total = Work::default();
    let mut heaviest: Option<(&Path, f64)> = None;
    let count = paths.len();
    for path in paths {
        let Ok(source) = PlanSource::load(path) else {
            continue;
        };
        let work = source_work(&source, job);
        total = total.and(work);
        if heaviest.is_none_or(|(_, s)| work.seconds > s) {
            heaviest = Some((path, work.seconds));
        }
    }
    let threads = rayon::current_num_threads().clamp(1, count.max(1)) as f64;
    let slowest = heaviest.map_or(0.0, |(_, s)| s);
    let work = Work {
        seconds: (total.seconds / threads).max(slowest),
        bytes: total.bytes,
    };
    let advice = match heaviest {
        Some((path, seconds)) if seconds > TIME_BUDGET => format!(
            "leave out {}, which alone would take about {}, or give fewer sources at a time",
            path.display(),
            super::duration(seconds)
        ),
        _ => "give fewer sources at a time".to_string(),
    };
    work.check(
        &format!(
            "{} {count} plan source{}",
            doing(job),
            if count == 1 { "" } else { "s" }
        ),
        &advice,
    )
    .map(|_| ())
}
