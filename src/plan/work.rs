//! The estimates of evaluations: the seconds of an OC walk, and the work
//! of evaluating a plan at many qualities (attributes and variables), as
//! the operations each repeats times the seconds one of them takes on the
//! calibration machine (see [`budget`](crate::budget) for the units).
//!
//! Every constant below was fitted with `cargo bench --bench
//! calibrate_budget` (AMD EPYC, 2 cores shared with other work, x86-64
//! Linux, release build, 3 December 2026), which prints each case's
//! estimate beside its measured time; the comment on each constant names
//! the cases it comes from. The fits aim at a factor
//! of two either way: the budget stops runaway work, it does not promise a
//! duration.

use crate::budget::{MEMORY_BUDGET, TIME_BUDGET, Work};
use crate::model::{Model, ModelKind};

use super::specification::{LimitKind, Specification};
use super::staged::StagedPlan;

/// Seconds per cell of the OC recursion (one open state carried into one
/// next state): 3 ns, from the item-by-item walks of the calibration.
const CELL: f64 = 3.0e-9;

/// Seconds per open state of a one-unit stage under the binomial and
/// hypergeometric models, which step by the unit's two terms without a
/// window (`oc/item.rs`), the curtailed units included: 5 ns, from the
/// item-by-item walk of 5,936 items at 0.1%/0.3% (about 150 us a walk of
/// 27,600 open states, release build, this machine, 3 December 2026).
const ITEM_CELL: f64 = 5.0e-9;

/// Seconds to start a count window (the log-probability of its first
/// term): 150 ns for the binomial and Poisson models (the single and
/// seven-stage walks), 270 ns for the hypergeometric model, whose saddle
/// point takes more log-gamma terms (the item-by-item walk in a lot of
/// 2 10^4).
const WINDOW_SETUP: f64 = 1.5e-7;
const HYPERGEOMETRIC_WINDOW_SETUP: f64 = 2.7e-7;

/// Seconds per term of a window or a tail sum (one multiply and add by a
/// ratio of consecutive probabilities).
const TERM: f64 = 5.0e-9;

/// Seconds to start the curtailed sample number of one open state: 30 ns
/// (binomial and Poisson, the item-by-item walks), 50 ns hypergeometric.
const CURTAIL_SETUP: f64 = 3.0e-8;
const HYPERGEOMETRIC_CURTAIL_SETUP: f64 = 5.0e-8;

/// Seconds per unit of a stage in the Poisson curtailed sample number,
/// which sums one Poisson tail per unit: 220 ns (a single plan of 2000
/// units).
const POISSON_CURTAIL_UNIT: f64 = 2.2e-7;

/// OC walks the curve searches of an evaluation take: the AOQL (64 grid
/// points, then about 60 golden-section or ternary steps, after the
/// doubling to the quality ceiling) and the indifference quality (about
/// 45 bisection steps).
const CURVE_WALKS: f64 = 200.0;

/// Seconds to format one row of a report: 3.5 us for a table row (CSV and
/// JSON take less), `evaluate` at 10^5 qualities.
pub(crate) const ROW_OUTPUT: f64 = 4.0e-6;

/// Bytes one evaluated quality holds at the peak: its measures in the
/// evaluation and the report, and its text; a table's cells take the most,
/// 2.1 kB a row (`evaluate` at 10^5 qualities: 210 MB as a table, 38 MB as
/// JSON).
const ROW_BYTES: f64 = 2200.0;

/// Seconds to format one number of the per-stage distribution.
const NUMBER_OUTPUT: f64 = 1.5e-7;

/// Bytes one number of the per-stage distribution holds: the value in the
/// evaluation and the report, and about 25 bytes of JSON text.
const NUMBER_BYTES: f64 = 41.0;

/// The terms of a tail sum at cut `c`: a few standard deviations of the
/// count, at most the distance to the end of the support.
pub(crate) fn tail_terms(c: u64) -> f64 {
    let c = c as f64;
    c.min(8.0 + 6.0 * c.sqrt())
}

/// Estimated seconds of one exact OC walk of `plan` under `model` at one
/// quality, with the curtailed sample number (the walk `measures` makes,
/// once per quality of an evaluation).
pub fn walk_seconds(plan: &StagedPlan, model: &Model) -> f64 {
    let (outcomes, curtailed) = walk_parts(plan, model);
    outcomes + curtailed
}

/// The seconds of one walk without the curtailed sample number (the walk
/// of the curve searches and of the per-stage distribution), and what the
/// curtailed sample number adds.
///
/// A one-unit stage under the binomial and hypergeometric models costs
/// its open states ([`ITEM_CELL`]). Any other stage walks as follows.
/// The walk carries every open count from stage to stage: a stage costs
/// its open states times its next states (the cells), and its count
/// windows: one per stage for the binomial and Poisson models, whose
/// states share it (and reuse it while the stage's numbers repeat, as an
/// item-by-item plan's do), one per open state for the hypergeometric
/// model, each state having left a different lot. A window costs its
/// start, its width and two tail sums, none longer than the stage's new
/// units allow. The curtailed sample number adds, per open state, three
/// tail sums under the binomial and hypergeometric models (closed forms),
/// and under the Poisson model one tail per unit of the stage (up to
/// `10^5` units, or until the expected count passes twice the rejection
/// number; beyond, a closed form).
pub(crate) fn walk_parts(plan: &StagedPlan, model: &Model) -> (f64, f64) {
    let kind = model.kind();
    let shared = kind != ModelKind::Hypergeometric;
    let (window_setup, curtail_setup) = if shared {
        (WINDOW_SETUP, CURTAIL_SETUP)
    } else {
        (HYPERGEOMETRIC_WINDOW_SETUP, HYPERGEOMETRIC_CURTAIL_SETUP)
    };
    let mut open = 1.0f64;
    let mut drawn = 0;
    let mut previous = None;
    let (mut outcomes, mut curtailed) = (0.0, 0.0);
    for stage in plan.stages() {
        let m = stage.n.saturating_sub(drawn);
        drawn = stage.n;
        let lowest_open = stage.accept.map_or(0, |a| a + 1);
        let next = stage.reject.saturating_sub(lowest_open) as f64;
        if m == 1 && kind != ModelKind::Poisson {
            // The two-term step: no window, and curtailment is one addition.
            outcomes += ITEM_CELL * open.max(next);
            previous = None;
            open = next.max(1.0);
            continue;
        }
        let tail = tail_terms(stage.reject).min(m as f64 + 1.0);
        let width = (open + next).min(m as f64 + 1.0);
        let key = Some((m, stage.accept, stage.reject));
        let windows = match (shared, previous == key) {
            (true, true) => 0.0,
            (true, false) => 1.0,
            (false, _) => open,
        };
        previous = key;
        outcomes +=
            CELL * open * next.max(1.0) + windows * (window_setup + TERM * (width + 2.0 * tail));
        curtailed += open
            * match kind {
                ModelKind::Poisson if m <= 100_000 => {
                    let reach = 2000.0 * (stage.reject as f64 + 1.0);
                    let units = (m as f64).min(reach.max(100_000.0)) - 1.0;
                    curtail_setup + units * POISSON_CURTAIL_UNIT
                }
                _ => curtail_setup + 3.0 * TERM * tail,
            };
        open = next.max(1.0);
    }
    (outcomes, curtailed)
}

/// The work of evaluating `plan` at `points` qualities: one walk per
/// quality (which also gives the per-stage distribution `decided_at`), the curve
/// searches of the AOQL and indifference quality, and the report's rows.
///
/// ```
/// use lotsman::{Model, ModelKind, StagedPlan, evaluation_work};
/// let m = Model::new(ModelKind::Binomial, None).unwrap();
/// let plan = StagedPlan::single(125, 3, &m).unwrap();
/// assert!(evaluation_work(&plan, &m, 1000, false).fits());
/// ```
pub fn evaluation_work(plan: &StagedPlan, model: &Model, points: usize, decided_at: bool) -> Work {
    let (fixed, per_point) = evaluation_parts(plan, model, decided_at);
    let points = points as f64;
    Work {
        seconds: fixed.seconds + points * per_point.seconds,
        bytes: fixed.bytes + points * per_point.bytes,
    }
}

/// The work of an evaluation that does not depend on the number of
/// qualities (the curve searches), and the work per quality.
fn evaluation_parts(plan: &StagedPlan, model: &Model, decided_at: bool) -> (Work, Work) {
    let (outcomes, curtailed) = walk_parts(plan, model);
    let stages = plan.stages().len() as f64;
    let per_point = if decided_at {
        Work {
            seconds: outcomes + curtailed + ROW_OUTPUT + stages * NUMBER_OUTPUT,
            bytes: ROW_BYTES + stages * NUMBER_BYTES,
        }
    } else {
        Work {
            seconds: outcomes + curtailed + ROW_OUTPUT,
            bytes: ROW_BYTES,
        }
    };
    (Work::time(CURVE_WALKS * outcomes), per_point)
}

/// The most qualities at which `plan` can be evaluated within the budget
/// (0 when its curve searches alone pass it).
fn most_qualities(plan: &StagedPlan, model: &Model, decided_at: bool) -> usize {
    let (fixed, per_point) = evaluation_parts(plan, model, decided_at);
    let by_time = (TIME_BUDGET - fixed.seconds) / per_point.seconds;
    let by_memory = (MEMORY_BUDGET - fixed.bytes) / per_point.bytes;
    by_time.min(by_memory).floor().max(0.0) as usize
}

/// How to bring an evaluation of `plan` at `points` qualities within the
/// budget: fewer qualities, or without the per-stage distribution.
pub(crate) fn evaluation_advice(
    plan: &StagedPlan,
    model: &Model,
    points: usize,
    decided_at: bool,
) -> String {
    if decided_at && evaluation_work(plan, model, points, false).fits() {
        return "leave out --decided-at (the per-stage distribution), or ask for fewer qualities"
            .to_string();
    }
    evaluation_advice_for(most_qualities(plan, model, decided_at), decided_at)
}

/// The advice for an evaluation that fits at most `most` qualities.
pub(crate) fn evaluation_advice_for(most: usize, decided_at: bool) -> String {
    match (most, decided_at) {
        (0, true) => "leave out --decided-at (the per-stage distribution)".to_string(),
        (0, false) => "this plan's curve searches alone (AOQL, indifference quality) pass the budget; evaluate a plan with fewer stages or a smaller sample".to_string(),
        (k, _) => format!("ask for at most {k} qualities (--at, --range)"),
    }
}

/// The work of evaluating a variables plan for `spec` at `points`
/// qualities, with its AOQL and indifference searches: one acceptance
/// probability per quality, a two-dimensional integral for two limits with
/// sigma unknown (up to 0.9 ms), the noncentral t for one limit with sigma
/// unknown, closed forms with sigma known.
pub fn variables_evaluation_work(spec: &Specification, points: usize) -> Work {
    let per_point = variables_point_seconds(spec);
    let points = points as f64;
    Work {
        seconds: (CURVE_WALKS + points) * per_point + points * ROW_OUTPUT,
        bytes: points * ROW_BYTES,
    }
}

/// Seconds of one acceptance probability of a variables plan for `spec`.
fn variables_point_seconds(spec: &Specification) -> f64 {
    match (spec.limit(), spec.sigma()) {
        (LimitKind::Both, None) => 9.0e-4,
        (_, None) => 3.0e-5,
        _ => 2.0e-6,
    }
}

/// The most qualities at which a variables plan for `spec` can be
/// evaluated within the budget.
pub(crate) fn most_variables_qualities(spec: &Specification) -> usize {
    let per_point = variables_point_seconds(spec);
    let by_time = (TIME_BUDGET - CURVE_WALKS * per_point) / (per_point + ROW_OUTPUT);
    by_time.min(MEMORY_BUDGET / ROW_BYTES).floor().max(0.0) as usize
}
