//! The estimates of designs: for each designer, the operations its search
//! repeats, times the seconds one of them takes on the calibration machine
//! (see [`budget`](crate::budget) for the units).
//!
//! Every constant below was fitted with `cargo bench --bench
//! calibrate_budget` (AMD EPYC, 2 cores shared with other work, x86-64
//! Linux, release build, refitted on 4 December 2026 after the searches of
//! issue 19), which prints each case's estimate beside its measured
//! processor time; the comment on each constant names the cases it comes
//! from, and `work_calibration.rs` holds the estimates of the cases as
//! fitted. The fits aim at a factor of two either way: the budget stops
//! runaway work, it does not promise a duration.

use super::bracket::{
    acceptance_number_for_ratio, aoql_factor, poisson_mean_at, sample_for_mean, z_upper,
};
use super::limits::{MAX_AOQL_ACCEPTANCE_NUMBER, MAX_DOUBLE_SINGLE_C};
use super::rectifying::request::{Protection, RectifyingRequest};
use super::request::{Criterion, DesignRequest, Nearby, Scheme};
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

/// Seconds of the single designer itself, from its acceptance number: the
/// search over `c` gallops and bisects, each step a tail sum a few
/// standard deviations (`sqrt(c)`) long, so a hypergeometric design takes
/// about a millisecond at `c` near 10^5 (cases: 1% against 1.01% in lots
/// of 10^8 and 10^10, 1.5 and 1.3 ms; 1.2% against 1.25% in a lot of 10^6,
/// 0.3 ms). The binomial and Poisson designs take microseconds.
fn single_seconds(model: &Model, c: u64) -> f64 {
    let c = c as f64;
    match model.kind() {
        ModelKind::Hypergeometric => 2.0e-5 + 5.0e-6 * c.sqrt(),
        _ => 5.0e-6,
    }
}

/// Processor seconds of one cell of a single-plan grid, where each design
/// starts from its neighbour's answer: 1.3 us (a 200 x 200 binomial grid)
/// and 5.5 us in a lot of 10^5 (a 100 x 100 grid), growing with the
/// tails' length `sqrt(c)` as in a design of its own.
pub(crate) fn single_cell_seconds(model: &Model, c: u64) -> f64 {
    match model.kind() {
        ModelKind::Hypergeometric => 3.0e-6 + 5.0e-7 * (c as f64).sqrt(),
        _ => 1.5e-6,
    }
}

/// Seconds of every one of the single plan's alternatives (for each
/// acceptance number up to the chosen one plus three, the two sample-size
/// searches), which grow with `c^1.75`; unchanged by issue 19, and still
/// within the aim (5.9 ms at 1% against 1.1%, binomial; 1.5 ms at 1%
/// against 1.2% and 89 ms at 1% against 1.05%, lots of 10^6 and 10^8).
fn alternatives_seconds(model: &Model, n: f64, c: u64) -> f64 {
    let size = (c as f64 + 1.0).powf(1.75);
    match model.kind() {
        ModelKind::Binomial => 3.6e-8 * size,
        ModelKind::Poisson => 8.0e-9 * size,
        ModelKind::Hypergeometric => 6.8e-8 * size * (1.0 + 16.0 * lot_share(model, n)),
    }
}

/// Seconds of the window of nearby plans a design lists by default
/// (twelve acceptance numbers around the chosen one, each with its two
/// sample-size searches of tails `sqrt(c)` long): 1.2 ms binomial and
/// 0.2 ms Poisson at 1% against 1.02%, 3 ms in a lot of 10^8 and 1.3 ms at
/// 1.2% against 1.25% in a lot of 10^6, the design included.
fn window_seconds(model: &Model, c: u64) -> f64 {
    let per_root = match model.kind() {
        ModelKind::Binomial => 8.5e-6,
        ModelKind::Poisson => 1.5e-6,
        ModelKind::Hypergeometric => 1.5e-5,
    };
    per_root * (c as f64).sqrt()
}

/// The work of the single design for `risks`, with every alternative
/// ([`Nearby::All`]: each acceptance number up to the chosen one plus
/// three) when `alternatives` is set,
/// from the approximate plan.
pub fn single_work(model: &Model, risks: &RiskPair, alternatives: bool) -> Work {
    let Some((n, c)) = approximate_single(model, risks) else {
        return Work::default();
    };
    let mut seconds = single_seconds(model, c);
    if alternatives {
        seconds += alternatives_seconds(model, n, c);
    }
    Work::time(seconds)
}

/// The work of designing `request`'s plan, estimated from the approximate
/// single plan (so it costs microseconds): the single design, and the
/// scheme's search around it; `nearby` adds a single plan's alternatives,
/// which [`solve_listing`](crate::solve_listing) lists (the window of
/// [`Nearby::Window`] for [`solve`](crate::solve)) and
/// [`verify`](crate::verify) does not need (`None`). A double request
/// beyond [`MAX_DOUBLE_SINGLE_C`] is refused at once by its designer and
/// costs nothing.
pub fn design_work(request: &DesignRequest, nearby: Option<Nearby>) -> Work {
    let (model, options) = (&request.model, &request.options);
    let Some((n, c)) = approximate_single(model, &request.risks) else {
        return Work::default();
    };
    let single = Work::time(single_seconds(model, c));
    let scheme = match (request.scheme, nearby) {
        (Scheme::Single, Some(Nearby::All)) => Work::time(alternatives_seconds(model, n, c)),
        (Scheme::Single, Some(Nearby::Window)) => Work::time(window_seconds(model, c)),
        (Scheme::Double, _) if c <= MAX_DOUBLE_SINGLE_C => {
            double_work(model, n, c, options.criterion, options.second_ratio)
        }
        (Scheme::Multiple, _) => multiple_work(model, n, options.stages),
        (Scheme::Sequential, _) => sequential_work(model, n, c),
        _ => Work::default(),
    };
    single.and(scheme)
}

/// The work of the double search around the single plan `(n, c)`: the
/// processor seconds of its sweep (see `double_cpu_seconds`), shared over
/// the threads that sweep the number sets of each `c2` in parallel (with a
/// tenth lost to their joins).
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

/// The processor seconds of the double search around `(n, c)`: the first
/// samples up to `n` times the number sets `(c1, r1, c2)` up to `c + 3`.
/// Since the designers keep each count distribution once per search and
/// thread (issue 19), a binomial or Poisson set costs a pass over counts
/// kept, so the sweep grows as `n (c + 3)^2` (0.034 s at 0.5% against
/// 1.2%, n = 1381, c = 11, and 5.4 s at 1 against 6 parts per million,
/// n = 1113463, c = 3, both 1.3e-7 s a step; `asn-max` and `asn-rql` and
/// the Poisson model alike within the fit). The hypergeometric sets still
/// walk counts that depend on the lot, one more factor `c + 3` (0.42 s
/// at 0.5% against 1.2% in a lot of 10^6, 0.033 s at 1% against 3% in a
/// lot of 2 10^4), and `asn-max` a ternary search over the lot's counts in
/// every step (0.83 s at 0.5% against 1.2%, 23 s at 0.5% against 0.9%,
/// c = 25, lots of 10^6). A fixed second-sample ratio spares the walk over
/// second samples: about 0.6 of the work (ratios 1 and 2).
pub(crate) fn double_cpu_seconds(
    model: &Model,
    n: f64,
    c: u64,
    criterion: Criterion,
    second_ratio: Option<f64>,
) -> f64 {
    let size = n * (c as f64 + 3.0).powi(2);
    let steps = match (model.lot_size(), model.kind(), criterion) {
        (Some(lot), ModelKind::Hypergeometric, Criterion::AsnMax) => {
            (1.0e-7 + 8.0e-9 * (lot as f64).log2()) * size * (c as f64 + 3.0)
        }
        (_, ModelKind::Hypergeometric, _) => 1.0e-7 * size * (c as f64 + 3.0),
        _ => 1.4e-7 * size,
    };
    let share = if second_ratio.is_some() { 0.6 } else { 1.0 };
    share * steps
}

/// The work of the truncation search of a sequential plan around the
/// single plan `(n, c)`: item steps up to a few times `n`, each over the
/// counts between the lines, for up to eleven nominal scales, with the
/// curve searches of the ASN summary. Since the item steps take the unit's
/// two terms (issue 19) the search grows as `n (c + 1)^0.9` (binomial:
/// 0.17 s at 1% against 1.3%, n = 10725, c = 124, and 9.4 s at 1% against
/// 1.1%, n = 88840, c = 937; lots of 3 10^4 and 10^6: 0.043 s at 0.5%
/// against 0.8% and 1.0 s at 0.1% against 0.14%; Poisson, whose terms
/// cost more: 3.6 s at 0.1% against 0.14%).
pub fn sequential_work(model: &Model, n: f64, c: u64) -> Work {
    let step = match model.kind() {
        ModelKind::Binomial => 2.1e-7,
        ModelKind::Poisson => 1.1e-6,
        ModelKind::Hypergeometric => 3.5e-7,
    };
    Work::time(step * n * (c as f64 + 1.0).powf(0.9))
}

/// The work of the multiple search of `k` stages around the single plan's
/// sample `n`: its stage size runs up towards `n`, and each size tries the
/// family's intercepts and acceptance numbers on `k`-stage walks (cases:
/// 0.79 s at 0.5% against 1%, k = 7, binomial; in a lot of 10^6, 1.3 s at
/// 1% against 2%, k = 3, and 13 s at 0.2% against 0.4%, k = 7).
pub fn multiple_work(model: &Model, n: f64, k: u32) -> Work {
    let k = f64::from(k);
    let per_unit = match model.kind() {
        ModelKind::Hypergeometric => 3.3e-4 * k,
        _ => 2.2e-4 + 1.5e-5 * k,
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
/// largest acceptance number (8.7 s), and a lot of 10^8 at 0.95% (0.23 s).
/// The longest scan, to that number, is estimated at 9.6 s: within the
/// budget, which no LTPD scan passes since the searches over `n` were made
/// faster (issue 19).
const LTPD_SCAN_TERM: f64 = 7.5e-8;

/// The same for an AOQL, whose every step of the threshold search scans
/// the AOQ curve (about 130 walks): the scan of a lot of 10^12 at 0.95%
/// against an AOQL of 1% to its limit of 2000 takes 2 s, a lot of 10^9 at
/// 0.8% 35 ms.
const AOQL_SCAN_TERM: f64 = 7.0e-6;

/// Seconds an AOQL scan takes whatever its length: its first threshold
/// searches, each scanning the AOQ curve from afar (1.5 ms for a lot of
/// 10^6 at 0.2% against 0.4%, which stops at a few acceptance numbers).
const AOQL_SCAN_START: f64 = 1.0e-3;

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
    let (last, per_term, start) = match request.protection() {
        Protection::Ltpd(_) => (MAX_ACCEPTANCE_NUMBER, LTPD_SCAN_TERM, 0.0),
        Protection::Aoql(_) => (MAX_AOQL_ACCEPTANCE_NUMBER, AOQL_SCAN_TERM, AOQL_SCAN_START),
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
    Work::time(start + scale * per_term * terms)
}

/// The work of the minimum-inspection double search around the single
/// plans up to `reach` units with acceptance numbers from `start`: the
/// double sweep's size, as for [`double_work`]; a fifth of it for an LTPD,
/// whose sweep the best single plan's ATI cuts short (7 ms in a lot of
/// 5000 at 0.25% against 1%, 31 ms in a lot of 10^5 at 0.2%), and ten
/// times it for an AOQL, whose every test scans the AOQ curve (0.49 s in a
/// lot of 10^5 at 0.2% against 0.5%).
pub fn rectifying_double_work(request: &RectifyingRequest, reach: f64, start: u64) -> Work {
    let search = double_work(request.model(), reach, start, Criterion::AsnAql, None);
    match request.protection() {
        Protection::Ltpd(_) => Work::time(0.2 * search.seconds),
        Protection::Aoql(_) => Work::time(10.0 * search.seconds),
    }
}
