//! The variables designer: the smallest sample `n`, and the interval of
//! the acceptance constant (`k` for one limit, `M` for two) at that `n`,
//! that honour both risk points under the normal model.
//!
//! # Method
//!
//! For each `n` the producer's point bounds the constant on one side and
//! the consumer's on the other; `n` is feasible when the bounds cross in
//! the right order. Feasibility holds from some `n` on (checked against an
//! exhaustive upward scan, tests/reference/make_variables_reference.py), so
//! the smallest feasible `n` is found by the threshold search of
//! [`search`](super::search), started from the closed-form or large-sample
//! guess.
//!
//! - Sigma known, one limit: `Pa(p) = Phi(sqrt(n)(z_p - k))` gives the
//!   closed form `k in [z_p2 + z_beta / sqrt(n), z_p1 - z_alpha / sqrt(n)]`,
//!   non-empty from `n >= ((z_alpha + z_beta) / (z_p1 - z_p2))^2` on.
//! - Sigma unknown, one limit: `k sqrt(n)` between the noncentral t
//!   quantiles `t_{1-beta}(n - 1, z_p2 sqrt n)` and
//!   `t_alpha(n - 1, z_p1 sqrt n)`. By the Neyman–Pearson lemma no test can
//!   beat the sigma-known one at the same `n`, so the sigma-known `n` is a
//!   lower bound. Beside the exact answer the report gives the usual
//!   large-sample approximation
//!   `n ~ (1 + k^2/2) ((z_alpha + z_beta) / (z_p1 - z_p2))^2`,
//!   `k = (z_p1 z_beta + z_p2 z_alpha) / (z_alpha + z_beta)` (W. A.
//!   Wallis's approximation, as given in textbooks on acceptance sampling,
//!   e.g. Montgomery, from memory).
//! - Two limits: `M` between the smallest value with `Pa(p1) >= 1 - alpha`
//!   and the largest with `Pa(p2) <= beta`, each a root of the exact (sigma
//!   known) or numerical (sigma unknown: at the worst split of the lot's
//!   fraction between the tails, see [`VariablesPlan::worst_split`]) OC
//!   in `M`, which rises with `M`.
//!
//! # Choice of the constant
//!
//! The interval's middle: `k = (k_lo + k_hi) / 2`, and for `M` the middle
//! on the normal-quantile scale, `M = Phi(-(z_{M_lo} + z_{M_hi}) / 2)`, the
//! scale on which `k` lives. With sigma known this leaves the producer and
//! the consumer the same margin, in standard-normal units, between their
//! agreed risk and the achieved one; a constant at either end would spend
//! one party's whole allowance. The value is then rounded to the fewest
//! decimals (from 3 for `k`, 4 significant digits for `M`) that stay
//! strictly inside the interval, so that the printed constant is the one
//! the plan uses.

use std::cell::{Cell, RefCell};

use super::search::first_true;
use crate::design::DesignError;
use crate::model::RiskPair;
use crate::model::{NoncentralT, normal};
use crate::numeric::{Short, brent};
use crate::plan::{
    LimitKind, MAX_VARIABLES_SAMPLE, Specification, VariablesPlan, Worst, WorstSplit,
    fraction_beyond_unknown,
};

/// A designed variables plan with the risks it achieves.
#[derive(Clone, Debug, PartialEq)]
pub struct VariablesDesign {
    /// The plan.
    pub plan: VariablesPlan,
    /// Achieved producer's risk `1 - Pa(p1)` (two limits, sigma unknown:
    /// the largest over the splits of `p1` between the tails).
    pub producer_risk: f64,
    /// Achieved consumer's risk `Pa(p2)` (likewise the largest).
    pub consumer_risk: f64,
    /// Two limits, sigma unknown: the worst splits, at `p1` (the
    /// producer's) and at `p2` (the consumer's).
    pub worst_splits: Option<(WorstSplit, WorstSplit)>,
    /// Every constant in `[lo, hi]` meets both points at this `n`.
    pub range: (f64, f64),
    /// The sample size the same points need with sigma known (one limit).
    pub known_sigma_n: u64,
    /// Sigma unknown, one limit: the large-sample approximation of `n`.
    pub approximate_n: Option<f64>,
}

/// The four normal quantiles of a risk pair.
#[derive(Clone, Copy)]
struct Quantiles {
    p1: f64,
    p2: f64,
    alpha: f64,
    beta: f64,
}

impl Quantiles {
    fn of(risks: &RiskPair) -> Self {
        Quantiles {
            p1: normal::upper_quantile(risks.producer().quality),
            p2: normal::upper_quantile(risks.consumer().quality),
            alpha: normal::upper_quantile(risks.producer().risk),
            beta: normal::upper_quantile(risks.consumer().risk),
        }
    }

    /// `((z_alpha + z_beta) / (z_p1 - z_p2))^2`: the real-valued sigma-known
    /// sample size.
    fn known_n(&self) -> f64 {
        let r = (self.alpha + self.beta) / (self.p1 - self.p2);
        r * r
    }
}

/// The smallest risk a two-limit, sigma-unknown plan is designed for: its
/// OC at a split is integrated to about `1e-10` (relative), so a
/// producer's risk found as `1 - Pa` is good to about `1e-10` absolute, one
/// percent of this floor.
const SPLIT_RISK_FLOOR: f64 = 1e-8;

/// Two limits, sigma unknown: the starting `n` over the large-sample
/// approximation's.
const TWO_LIMIT_GUESS: f64 = 1.06;

/// The interval `(lo, hi)` of the constant at `n`; empty when `lo > hi`
/// (kept, crossed, where its ends are known, as a score for the search
/// over `n`) or `None`.
type Interval = Option<(f64, f64)>;

/// Designs the smallest variables plan for `spec` that meets `risks`
/// (qualities are fractions beyond the limits).
///
/// # Errors
/// [`DesignError::NoPlan`] when two limits are so close for the known sigma
/// that a centred process already exceeds the AQL (or the RQL), or when a
/// two-limit plan with sigma unknown is asked for a risk below `1e-8`
/// (its OC at a split, a quadrature, cannot vouch for less);
/// [`DesignError::BeyondCap`] when `n` would exceed 10^4.
pub fn design_variables(
    spec: &Specification,
    risks: &RiskPair,
) -> Result<VariablesDesign, DesignError> {
    if spec.limit() == LimitKind::Both && spec.sigma().is_none() {
        let below: Vec<String> = [
            ("alpha", risks.producer().risk),
            ("beta", risks.consumer().risk),
        ]
        .iter()
        .filter(|(_, r)| *r < SPLIT_RISK_FLOOR)
        .map(|(name, r)| format!("{name} = {}", Short(*r)))
        .collect();
        if !below.is_empty() {
            return Err(DesignError::NoPlan {
                reason: format!(
                    "with two limits and sigma unknown the plan is held to the worst split of the nonconforming between the limits, whose OC is a quadrature good to about 1e-10, and {} {} below the {SPLIT_RISK_FLOOR:e} it can vouch for",
                    below.join(" and "),
                    if below.len() == 1 { "is" } else { "are" }
                ),
                suggestion: "agree risks of at least 1e-8, or design the plan with sigma known or for one limit, or an attributes plan".to_string(),
            });
        }
    }
    let z = Quantiles::of(risks);
    let lowest = spec.lowest_quality();
    for (name, q) in [
        ("AQL", risks.producer().quality),
        ("RQL", risks.consumer().quality),
    ] {
        if lowest >= q {
            return Err(DesignError::NoPlan {
                reason: format!(
                    "the limits are too close for sigma: even with its mean centred the process has {} beyond them (2 Phi(-(U - L) / (2 sigma))), not below the {name} {}",
                    crate::numeric::format_quality(lowest, false),
                    crate::numeric::format_quality(q, false)
                ),
                suggestion:
                    "reduce the process spread, widen the limits, or agree the risk points again"
                        .to_string(),
            });
        }
    }
    let known_sigma_n = (z.known_n().ceil() as u64).max(1);
    let least = spec.smallest_sample();
    // The worst shares found at one n start the next n's searches, and the
    // interval of the n the search ends on is kept for the plan.
    let hints = [Cell::new(None), Cell::new(None)];
    let found: RefCell<Vec<(u64, Interval)>> = RefCell::new(Vec::new());
    let interval = |n: u64| -> Interval {
        if let Some(&(_, i)) = found.borrow().iter().find(|(m, _)| *m == n) {
            return i;
        }
        let i = constant_interval(spec, risks, &z, n, &hints);
        found.borrow_mut().push((n, i));
        i
    };
    let score = |i: &Interval| match i {
        Some((lo, hi)) => lo - hi,
        None => 1.0,
    };
    let meets = |i: &Interval| matches!(i, Some((lo, hi)) if lo <= hi);
    let guess = match (spec.limit(), spec.sigma()) {
        // The worst split needs 5 to 10 percent more than the one-limit
        // approximation (1.06 its median over the reference's 15 designs),
        // and each n costs a worst-split search: starting there ends most
        // searches after two or three n.
        (LimitKind::Both, None) => (TWO_LIMIT_GUESS * large_sample_n(&z)).ceil() as u64,
        (LimitKind::Both, _) | (_, None) => large_sample_n(&z).ceil() as u64,
        (_, Some(_)) => known_sigma_n,
    };
    let start = match spec.sigma() {
        // No test beats the sigma-known one at the same n.
        None if spec.limit() != LimitKind::Both => known_sigma_n.max(least),
        _ => least,
    };
    let mut n = first_true(start, MAX_VARIABLES_SAMPLE, guess, |n| {
        let i = interval(n);
        (meets(&i), score(&i))
    })
    .ok_or_else(beyond_cap)?;
    // The interval's ends are roots to about 1e-13; a plan whose rounded
    // constant does not meet both points exactly (an interval narrower than
    // that) moves on to the next n.
    loop {
        let range = interval(n);
        if let Some(range) = range.filter(|_| meets(&range))
            && let Some(design) = choose(spec, risks, n, range)
        {
            return Ok(VariablesDesign {
                known_sigma_n,
                approximate_n: (spec.limit() != LimitKind::Both && spec.sigma().is_none())
                    .then(|| large_sample_n(&z)),
                ..design
            });
        }
        n += 1;
        if n > MAX_VARIABLES_SAMPLE {
            return Err(beyond_cap());
        }
    }
}

fn beyond_cap() -> DesignError {
    DesignError::BeyondCap {
        what: "a sample".to_string(),
        cap: format!("{MAX_VARIABLES_SAMPLE} measurements"),
    }
}

/// `(1 + k^2/2) ((z_alpha + z_beta) / (z_p1 - z_p2))^2` with
/// `k = (z_p1 z_beta + z_p2 z_alpha) / (z_alpha + z_beta)`.
fn large_sample_n(z: &Quantiles) -> f64 {
    let k = (z.p1 * z.beta + z.p2 * z.alpha) / (z.alpha + z.beta);
    (1.0 + 0.5 * k * k) * z.known_n()
}

/// The interval of `k` (one limit) or `M` (two limits) meeting both
/// points at `n`.
/// `hints` carries the producer's and consumer's worst shares between
/// calls (two limits, sigma unknown).
fn constant_interval(
    spec: &Specification,
    risks: &RiskPair,
    z: &Quantiles,
    n: u64,
    hints: &[Cell<Option<SplitHint>>; 2],
) -> Interval {
    if n < spec.smallest_sample() {
        return None;
    }
    let (alpha, beta) = (risks.producer().risk, risks.consumer().risk);
    let root_n = (n as f64).sqrt();
    let ordered = |lo: f64, hi: f64| (lo <= hi).then_some((lo, hi));
    match (spec.limit(), spec.sigma()) {
        (LimitKind::Both, Some(_)) => {
            // Both conditions on the log scale of their own tails, so that a
            // risk of 1e-30 is met as such (1 - alpha would round to 1).
            let ln = |x: f64| x.max(f64::MIN_POSITIVE).ln();
            let plan = |m: f64| VariablesPlan::new(*spec, n, m).ok();
            let reject = |m: f64, p: f64| plan(m).map_or(1.0, |plan| plan.reject(p));
            let pa = |m: f64, p: f64| plan(m).map_or(0.0, |plan| plan.pa(p));
            let lo = fraction_where(|m| alpha.ln() - ln(reject(m, risks.producer().quality)))?;
            let hi = fraction_where(|m| ln(pa(m, risks.consumer().quality)) - beta.ln())?;
            ordered(lo, hi)
        }
        (LimitKind::Both, None) => {
            // The one-sided end: the k interval of the s method, turned
            // into M by the estimator (which falls as k rises).
            let (k_lo, k_hi) = unknown_k_interval(z, alpha, beta, n)?;
            let one_lo = fraction_beyond_unknown(k_hi, n);
            let one_hi = fraction_beyond_unknown(k_lo, n);
            if one_lo > one_hi {
                return Some((one_lo, one_hi));
            }
            let p1 = risks.producer().quality;
            let p2 = risks.consumer().quality;
            let lo = split_root(spec, n, p1, 1.0 - alpha, Worst::Lowest, one_lo, &hints[0])?;
            let hi = split_root(spec, n, p2, beta, Worst::Highest, one_hi, &hints[1])?;
            Some((lo.max(one_lo), hi.min(one_hi)))
        }
        (_, Some(_)) => ordered(z.p2 + z.beta / root_n, z.p1 - z.alpha / root_n),
        (_, None) => {
            let (lo, hi) = unknown_k_interval(z, alpha, beta, n)?;
            ordered(lo, hi)
        }
    }
}

/// Sigma unknown, one limit: `[t_{1-beta}(n-1, z_p2 sqrt n), t_alpha(n-1,
/// z_p1 sqrt n)] / sqrt(n)`, whether or not it is empty (`None` for `n <
/// 2`).
fn unknown_k_interval(z: &Quantiles, alpha: f64, beta: f64, n: u64) -> Option<(f64, f64)> {
    if n < 2 {
        return None;
    }
    let root_n = (n as f64).sqrt();
    let hi = NoncentralT::new(n - 1, z.p1 * root_n).quantile(alpha) / root_n;
    // The upper quantile at beta itself: 1 - beta rounds to 1 below 1e-16.
    let lo = NoncentralT::new(n - 1, z.p2 * root_n).upper_quantile(beta) / root_n;
    Some((lo, hi))
}

/// Most rounds of [`split_root`]; it settles in two or three.
const SPLIT_ROUNDS: usize = 6;

/// What one `n`'s [`split_root`] leaves for the next: the worst share and
/// the slope of `Pa` in `ln M` at the root.
#[derive(Clone, Copy)]
struct SplitHint {
    share: f64,
    slope: f64,
}

/// Two limits, sigma unknown: the `M` at which `Pa(p)` at the worst split
/// inside `(0, 1/2]` equals `target`, starting from `guess` and, when
/// known, from the worst share and slope of a neighbouring `n` (updated).
///
/// The worst split moves little with `M` and `n`, so the root is taken
/// with the split held fixed, the worst split found again near it at that
/// root, and the two repeated until the split stays put. At the worst
/// split `Pa` is flat in the share, so a share off by `d` moves `Pa` by the
/// order of `d^2`: the root the rounds settle on is the root of the worst
/// `Pa`.
fn split_root(
    spec: &Specification,
    n: u64,
    p: f64,
    target: f64,
    worst: Worst,
    guess: f64,
    hint: &Cell<Option<SplitHint>>,
) -> Option<f64> {
    let plan = |m: f64| VariablesPlan::new(*spec, n, m).ok();
    let (mut share, mut slope) = match hint.get() {
        Some(h) => (h.share, Some(h.slope)),
        None => (plan(guess)?.worst_inside(p, worst)?.share, None),
    };
    let mut m = guess;
    for _ in 0..SPLIT_ROUNDS {
        // The plan of the last M tried, kept for the split search at the
        // root (its half-width table is the costly part).
        let last: RefCell<Option<VariablesPlan>> = RefCell::new(None);
        let g = |x: f64| {
            let at = plan(x.exp());
            let pa = at.as_ref().and_then(|plan| plan.pa_at_split(p, share));
            *last.borrow_mut() = at;
            pa.unwrap_or(0.0) - target
        };
        let (x, s) = match secant(g, m.ln(), slope) {
            Some(found) => found,
            None => {
                let x = brent(&g, M_FLOOR.ln(), M_CEILING.ln(), 1e-11)?;
                g(x);
                (x, f64::NAN)
            }
        };
        m = x.exp();
        slope = s.is_finite().then_some(s);
        let at = last
            .take()
            .filter(|plan| plan.m() == Some(m))
            .or_else(|| plan(m))?;
        let next = at.worst_near(p, worst, share)?.share;
        let moved = (next - share).abs();
        share = next;
        if moved < 1e-3 {
            break;
        }
    }
    hint.set(slope.map(|slope| SplitHint { share, slope }));
    Some(m)
}

/// The root of `g`, rising in `x = ln M`, by secant steps from `x0` (the
/// first with `slope` when known, else from a step of 0.01): `Pa` is
/// smooth in `ln M` and the start is close, so it settles in four or five
/// evaluations where a bracketing search takes eight. Ends when a step is
/// below 1e-11 (the quadrature's 1e-10 in `Pa` moves the root by more, and
/// the range is printed to four digits); returns the root and the last
/// slope, or `None` when a slope is not positive or it does not settle.
fn secant(g: impl Fn(f64) -> f64, x0: f64, slope: Option<f64>) -> Option<(f64, f64)> {
    let (mut x, mut gx) = (x0, g(x0));
    let mut slope = match slope {
        Some(s) => s,
        None => {
            let x1 = x0 + if gx < 0.0 { 0.01 } else { -0.01 };
            let g1 = g(x1);
            let s = (g1 - gx) / (x1 - x0);
            x = x1;
            gx = g1;
            s
        }
    };
    for _ in 0..12 {
        if slope.is_nan() || slope <= 0.0 || slope.is_infinite() {
            return None;
        }
        let step = (-gx / slope).clamp(-0.5, 0.5);
        let next = (x + step).clamp(M_FLOOR.ln(), M_CEILING.ln());
        let g_next = g(next);
        if next != x {
            let s = (g_next - gx) / (next - x);
            if s > 0.0 && s.is_finite() {
                slope = s;
            }
        }
        x = next;
        gx = g_next;
        if step.abs() <= 1e-11 {
            return Some((x, slope));
        }
    }
    None
}

/// The smallest and largest allowed fractions `M`.
const M_FLOOR: f64 = 1e-12;
const M_CEILING: f64 = 0.5 - 1e-12;

/// The `M` in `(0, 1/2)` where `g`, rising with `M`, changes sign, found
/// on `ln M` to 1e-13; `None` when `g` has one sign over the whole range.
fn fraction_where(g: impl Fn(f64) -> f64) -> Option<f64> {
    brent(|x| g(x.exp()), M_FLOOR.ln(), M_CEILING.ln(), 1e-13).map(f64::exp)
}

/// The plan at `n` with the constant in the middle of `range`, rounded,
/// if it meets both points.
fn choose(
    spec: &Specification,
    risks: &RiskPair,
    n: u64,
    range: (f64, f64),
) -> Option<VariablesDesign> {
    let two = spec.limit() == LimitKind::Both;
    let constant = if two {
        let middle =
            normal::sf(0.5 * (normal::upper_quantile(range.0) + normal::upper_quantile(range.1)));
        round_inside(middle, range, |x, d| {
            let scale = 10f64.powi(d - 1 - x.log10().floor() as i32);
            (x * scale).round() / scale
        })
    } else {
        round_inside(0.5 * (range.0 + range.1), range, |x, d| {
            let scale = 10f64.powi(d - 1);
            (x * scale).round() / scale
        })
    };
    let plan = VariablesPlan::new(*spec, n, constant).ok()?;
    let ((producer_risk, consumer_risk), worst_splits) =
        plan.achieved_risks_and_splits(risks.producer().quality, risks.consumer().quality);
    let design = VariablesDesign {
        plan,
        producer_risk,
        consumer_risk,
        worst_splits,
        range,
        known_sigma_n: 0,
        approximate_n: None,
    };
    (design.producer_risk <= risks.producer().risk && design.consumer_risk <= risks.consumer().risk)
        .then_some(design)
}

/// `x` rounded by `round(x, digits)` with the fewest digits from 4 up to
/// 12 that keep it strictly inside `range`; `x` itself when none does.
fn round_inside(x: f64, range: (f64, f64), round: impl Fn(f64, i32) -> f64) -> f64 {
    (4..=12)
        .map(|d| round(x, d))
        .find(|&r| r > range.0 && r < range.1)
        .unwrap_or(x)
}
