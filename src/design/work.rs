//! The estimates of designs: for each designer, the operations its search
//! repeats, times the seconds one of them takes on the calibration machine
//! (see [`budget`](crate::budget) for the units).
//!
//! Every constant below was fitted with `cargo bench --bench
//! calibrate_budget` (AMD EPYC, 2 cores shared with other work, x86-64
//! Linux, release build, 3 December 2026), which prints each case's
//! estimate beside its measured time; the comment on each constant names
//! the cases it comes from. The fits aim at a factor
//! of two either way: the budget stops runaway work, it does not promise a
//! duration.

use super::bracket::{
    acceptance_number_for_ratio, aoql_factor, poisson_mean_at, sample_for_mean, z_upper,
};
use super::limits::{MAX_AOQL_ACCEPTANCE_NUMBER, MAX_DOUBLE_SINGLE_C};
use super::rectifying::request::{Protection, RectifyingRequest};
use super::request::{Criterion, DesignRequest, Scheme};
use crate::budget::Work;
use crate::model::{Model, ModelKind, RiskPair, normal};
use crate::plan::{LimitKind, MAX_ACCEPTANCE_NUMBER, Specification, tail_terms};

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
pub(crate) fn single_cell_seconds(model: &Model, n: f64, c: u64) -> f64 {
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
pub(crate) fn double_cpu_seconds(
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
/// with sigma unknown search the worst split at each `n`, on one
/// half-width table per `M` tried, whose cost grows slowly with `n`: about
/// 7 ms at n = 43, 17 ms at 410, 19 ms at 1299, 25 ms at 3086 and 34 ms
/// at 3651 of CPU as whole processes, fitted by `2e-3 n^0.35` s (measured
/// over estimated 0.76 to 1.14); the other
/// configurations take milliseconds (1.3 ms at n = 42, 4.1 ms at 332 with
/// one limit, sigma unknown). The sample is at most
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
        (LimitKind::Both, None) => 2.0e-3 * n.powf(0.35),
        (_, None) => 1.0e-3 + 1.0e-5 * n,
        _ => 1.0e-4,
    })
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
pub fn rectifying_work(request: &RectifyingRequest) -> Work {
    let model = request.model();
    let lot = request.lot_size() as f64;
    let p = request.process_average();
    let (last, per_term) = match request.protection() {
        Protection::Ltpd(_) => (MAX_ACCEPTANCE_NUMBER, LTPD_SCAN_TERM),
        Protection::Aoql(_) => (MAX_AOQL_ACCEPTANCE_NUMBER, AOQL_SCAN_TERM),
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
        let pa = normal::cdf((c as f64 + 0.5 - mean) / mean.sqrt().max(1e-300));
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
pub(crate) fn rectifying_double_work(request: &RectifyingRequest, reach: f64, start: u64) -> Work {
    let search = double_work(request.model(), reach, start, Criterion::AsnAql, None);
    match request.protection() {
        Protection::Ltpd(_) => search,
        Protection::Aoql(_) => Work::time(10.0 * search.seconds),
    }
}
