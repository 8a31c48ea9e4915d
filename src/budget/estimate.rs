//! The estimates: for each job, the operations it repeats, times the
//! seconds one of them takes on the calibration machine.
//!
//! Every constant below was fitted with `cargo bench --bench
//! calibrate_budget` (AMD EPYC, 2 cores shared with other work, x86-64
//! Linux, release build, 3 December 2026), which prints each case's
//! estimate beside its measured time; the comment on each constant names
//! the cases it comes from. The fits aim at a factor
//! of two either way: the budget stops runaway work, it does not promise a
//! duration.

use super::{MEMORY_BUDGET, TIME_BUDGET, Work};
use crate::design::{
    Criterion, DesignRequest, MAX_DOUBLE_SINGLE_C, Scheme, acceptance_number_for_ratio,
    poisson_mean_at, sample_for_mean, z_upper,
};
use crate::model::RiskPair;
use crate::model::{Model, ModelKind};
use crate::plan::{LimitKind, MAX_ACCEPTANCE_NUMBER, Specification, StagedPlan};

/// Seconds per cell of the OC recursion (one open state carried into one
/// next state): 3 ns, from the item-by-item walks of the calibration.
const CELL: f64 = 3.0e-9;

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
pub(super) const ROW_OUTPUT: f64 = 4.0e-6;

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
pub(super) fn tail_terms(c: u64) -> f64 {
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
pub(super) fn walk_parts(plan: &StagedPlan, model: &Model) -> (f64, f64) {
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
/// quality (two with the per-stage distribution `decided_at`), the curve
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
            seconds: 2.0 * outcomes + curtailed + ROW_OUTPUT + stages * NUMBER_OUTPUT,
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

/// The single plan `(n, c)` of the closed-form approximation the single
/// designer starts from (Cameron's operating ratio), or `None` beyond the
/// largest acceptance number (which the designer refuses at once).
pub(crate) fn approximate_single(model: &Model, risks: &RiskPair) -> Option<(f64, u64)> {
    let (producer, consumer) = (risks.producer(), risks.consumer());
    Approximation::new(producer.risk, consumer.risk).single(
        model,
        producer.quality,
        consumer.quality,
    )
}

/// The normal quantiles of the two risks, computed once for the many
/// cells of a grid.
#[derive(Clone, Copy)]
pub(crate) struct Approximation {
    z_alpha: f64,
    z_beta: f64,
}

impl Approximation {
    pub(crate) fn new(alpha: f64, beta: f64) -> Self {
        Approximation {
            z_alpha: z_upper(alpha),
            z_beta: z_upper(beta),
        }
    }

    /// See [`approximate_single`].
    pub(crate) fn single(&self, model: &Model, p1: f64, p2: f64) -> Option<(f64, u64)> {
        let ratio = match model.kind() {
            ModelKind::Poisson => p2 / p1,
            _ => (-p2).ln_1p() / (-p1).ln_1p(),
        };
        let c =
            acceptance_number_for_ratio(ratio, self.z_alpha, self.z_beta, MAX_ACCEPTANCE_NUMBER)?;
        let n = sample_for_mean(
            poisson_mean_at(c, self.z_beta),
            p2,
            model.kind(),
            model.lot_size(),
        );
        Some((n.max(1.0), c))
    }
}

/// The share of the lot a sample of `n` takes (0 without a lot).
fn lot_share(model: &Model, n: f64) -> f64 {
    match (model.kind(), model.lot_size()) {
        (ModelKind::Hypergeometric, Some(lot)) => (n / lot as f64).min(1.0),
        _ => 0.0,
    }
}

/// Seconds of the single designer itself, from its plan's size: a few
/// dozen tail sums, each a few standard deviations long; the
/// hypergeometric tail grows with the share of the lot the sample takes
/// (cases: 1% against 1.01% to 1.5% under each model, lots of 10^8 and
/// 10^10).
fn single_seconds(model: &Model, n: f64, c: u64) -> f64 {
    let c = c as f64;
    match model.kind() {
        ModelKind::Hypergeometric => 1.0e-5 + 1.2e-8 * c * c * lot_share(model, n),
        _ => 5.0e-6,
    }
}

/// Seconds of one cell of a single-plan grid, where each design starts
/// from its neighbour's answer: a few microseconds (a 200 x 200 binomial
/// grid and a 100 x 100 grid in a lot of 10^5), and the hypergeometric
/// tails as in a design of its own.
pub(super) fn single_cell_seconds(model: &Model, n: f64, c: u64) -> f64 {
    match model.kind() {
        ModelKind::Hypergeometric => single_seconds(model, n, c) - 5.0e-6,
        _ => 3.0e-6,
    }
}

/// Seconds of the single plan's alternatives (for each acceptance number
/// up to the chosen one plus three, the two sample-size searches), which
/// grow with `c^1.75` (same cases).
fn alternatives_seconds(model: &Model, n: f64, c: u64) -> f64 {
    let size = (c as f64 + 1.0).powf(1.75);
    match model.kind() {
        ModelKind::Binomial => 3.6e-8 * size,
        ModelKind::Poisson => 8.0e-9 * size,
        ModelKind::Hypergeometric => 6.8e-8 * size * (1.0 + 16.0 * lot_share(model, n)),
    }
}

/// The work of the single design for `risks`, with its alternatives (the
/// nearby acceptance numbers `design` lists) when `alternatives` is set,
/// from the approximate plan.
pub fn single_work(model: &Model, risks: &RiskPair, alternatives: bool) -> Work {
    let Some((n, c)) = approximate_single(model, risks) else {
        return Work::default();
    };
    let mut seconds = single_seconds(model, n, c);
    if alternatives {
        seconds += alternatives_seconds(model, n, c);
    }
    Work::time(seconds)
}

/// The work of designing `request`'s plan, estimated from the approximate
/// single plan (so it costs microseconds): the single design, and the
/// scheme's search around it; `alternatives` adds the single plan's
/// alternatives, which [`solve`](crate::solve) lists and
/// [`verify`](crate::verify) does not need. A double request beyond
/// [`MAX_DOUBLE_SINGLE_C`] is refused at once by its designer and costs
/// nothing.
pub fn design_work(request: &DesignRequest, alternatives: bool) -> Work {
    let (model, options) = (&request.model, &request.options);
    let Some((n, c)) = approximate_single(model, &request.risks) else {
        return Work::default();
    };
    let single = Work::time(single_seconds(model, n, c));
    let scheme = match request.scheme {
        Scheme::Single if alternatives => Work::time(alternatives_seconds(model, n, c)),
        Scheme::Double if c <= MAX_DOUBLE_SINGLE_C => {
            double_work(model, n, c, options.criterion, options.second_ratio)
        }
        Scheme::Multiple => multiple_work(model, n, options.stages),
        Scheme::Sequential => sequential_work(model, n, c),
        _ => Work::default(),
    };
    single.and(scheme)
}

/// The work of the double search around the single plan `(n, c)`: its
/// size `n (c + 3)^3` (the first samples up to `n`, the number sets
/// `(c1, r1, c2)` up to `c + 3`) times the processor seconds of one step
/// (see `double_cpu_seconds`), shared over the threads that sweep the
/// number sets of each `c2` in parallel (with a tenth lost to their
/// joins: 0.34 s elapsed for 0.60 s of processor time at 0.5% against
/// 1.2%, binomial, on two threads).
pub fn double_work(
    model: &Model,
    n: f64,
    c: u64,
    criterion: Criterion,
    second_ratio: Option<f64>,
) -> Work {
    let threads = rayon::current_num_threads().max(1) as f64;
    Work::time(1.1 * double_cpu_seconds(model, n, c, criterion, second_ratio) / threads)
}

/// The processor seconds of the double search around `(n, c)`: one step
/// costs about four times as much under the hypergeometric model, and for
/// `asn-max` under it, a ternary search over the lot's counts in every step
/// (cases: 1% against 3%, 0.5% against 1.2%, 0.2% against 0.4%, each
/// criterion, binomial, Poisson and lots of 2 10^4 and 10^6; the binomial
/// step is taken at the high end of its range, 1.6e-7 s, where the cells of
/// a trade-off grid, small plans at higher qualities, put it). A fixed
/// second-sample ratio spares the walk over second samples: about 0.6 of
/// the work (same cases, ratios 1 and 2).
pub(super) fn double_cpu_seconds(
    model: &Model,
    n: f64,
    c: u64,
    criterion: Criterion,
    second_ratio: Option<f64>,
) -> f64 {
    let step = match (model.lot_size(), model.kind(), criterion) {
        (Some(lot), ModelKind::Hypergeometric, Criterion::AsnMax) => {
            6.0e-7 + 3.0e-8 * (lot as f64).log2()
        }
        (_, ModelKind::Hypergeometric, _) => 6.0e-7,
        (_, _, Criterion::AsnMax) => 1.7e-7,
        _ => 1.6e-7,
    };
    let share = if second_ratio.is_some() { 0.6 } else { 1.0 };
    share * step * n * (c as f64 + 3.0).powi(3)
}

/// The work of the truncation search of a sequential plan around the
/// single plan `(n, c)`: item steps up to a few times `n`, each over the
/// counts between the lines, about `sqrt(c + 1)` of them on average, for
/// up to eleven nominal scales; with the curve searches of the ASN
/// summary (cases: 1% against 2% and 1.3%, 0.5% against 0.8%, 0.1%
/// against 0.14%, binomial, Poisson and lots of 3 10^4 and 10^6).
pub fn sequential_work(model: &Model, n: f64, c: u64) -> Work {
    let step = match model.kind() {
        ModelKind::Binomial => 1.2e-5,
        ModelKind::Poisson => 1.5e-5,
        ModelKind::Hypergeometric => 9.0e-5,
    };
    Work::time(step * n * (c as f64 + 1.0).sqrt())
}

/// The work of the multiple search of `k` stages around the single plan's
/// sample `n`: its stage size runs up towards `n`, and each size tries the
/// family's intercepts and acceptance numbers on `k`-stage walks (cases:
/// 1% against 3% and 2%, 0.5% against 1%, 0.2% against 0.4%, k = 3 and
/// 7, binomial and a lot of 10^6).
pub fn multiple_work(model: &Model, n: f64, k: u32) -> Work {
    let k = f64::from(k);
    let per_unit = match model.kind() {
        ModelKind::Hypergeometric => 5.5e-4 * k,
        _ => 3.6e-4 + 2.5e-5 * k,
    };
    Work::time(per_unit * n)
}

/// The work of a variables design for `spec` and `risks`: a search over
/// `n` of the constant's interval, from the large-sample approximation
/// `n ~ (1 + k^2 / 2) ((z_alpha + z_beta) / (z_p1 - z_p2))^2`. Two limits
/// with sigma unknown need a two-dimensional search of the noncentral t at
/// each `n`: 0.15 s at n = 43, 1.5 s at 410, 3.7 s at 3224 and 3.9 s at
/// 6819; the other configurations take milliseconds (1.3 ms at n = 42,
/// 4.1 ms at 332 with one limit, sigma unknown). The sample is at most
/// `10^4`, so no variables design passes the budget; the estimate serves
/// the totals of `verify` and `sheet`.
pub fn variables_design_work(spec: &Specification, risks: &RiskPair) -> Work {
    let upper = |p: f64| z_upper(p);
    let (z1, z2) = (
        upper(risks.producer().quality),
        upper(risks.consumer().quality),
    );
    let (za, zb) = (upper(risks.producer().risk), upper(risks.consumer().risk));
    let k = (z1 * zb + z2 * za) / (za + zb);
    let ratio = (za + zb) / (z1 - z2);
    let n = ((1.0 + 0.5 * k * k) * ratio * ratio).clamp(2.0, 1.0e4);
    Work::time(match (spec.limit(), spec.sigma()) {
        (LimitKind::Both, None) => (3.5e-3 * n).min(1.2 + 0.35 * n.powf(0.25)),
        (_, None) => 1.0e-3 + 1.0e-5 * n,
        _ => 1.0e-4,
    })
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
