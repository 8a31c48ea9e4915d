//! The multiple-sampling designer: `k` equal samples (2 to 7), each judged
//! on the cumulative count, that meet both risk points and minimise the
//! average sample number at the AQL (or at the RQL).
//!
//! # The family searched
//!
//! The acceptance and rejection numbers of stage `j` (after `j m` units)
//! lie on two lines of the sequential test's slope `s`
//! ([`wald_lines`](super::sequential::wald_lines)) with intercepts `u` and
//! `v`, kept inside the last stage's numbers and one count apart:
//!
//! ```text
//! a_j = min(floor(s j m - u), c - 1, j m - 1)   (none while negative)
//! r_j = max(min(ceil(s j m + v), c + 1), a_j + 2)   (1 while a_j is none)
//! last stage: accept d <= c, reject d > c
//! ```
//!
//! The search is exhaustive over the stage size `m` (from 1 until `m`
//! reaches the best ASN found, or the single plan's `n`), the intercepts on
//! the grid `0.5, 1.0, ..., 4.0` counts, and every final acceptance number
//! `c` that meets both points: the producer's point holds from a smallest
//! `c` on (found by bisection, since every number grows with `c`), the
//! consumer's up to a largest.
//!
//! # Limits
//!
//! The answer is the best plan of this family, not of every array of
//! acceptance and rejection numbers: `k` stages with free numbers have far
//! too many combinations to search exactly, and the parallel lines are the
//! shape that the likelihood-ratio test gives. Ties within `1e-12` go to
//! the smaller largest sample `k m`, then the smaller
//! `max(alpha_achieved / alpha, beta_achieved / beta)`, then the smaller
//! `(c, u, v)`.

use super::request::{Criterion, Design};
use super::sequential::wald_lines;
use super::single::design_single;
use super::work::multiple_work;
use crate::design::DesignError;
use crate::model::RiskPair;
use crate::model::{Model, ModelKind};
use crate::plan::{Stage, StagedPlan, Walk};

/// The intercept grid, in counts.
const INTERCEPTS: [f64; 8] = [0.5, 1.0, 1.5, 2.0, 2.5, 3.0, 3.5, 4.0];

/// Criterion values this close (relative) are ties.
const TIE: f64 = 1e-12;

/// The stages of the family for stage size `m`, final acceptance number
/// `c` and intercepts `u`, `v`.
fn family(k: u32, m: u64, c: u64, u: f64, v: f64, slope: f64, unit: bool) -> Vec<Stage> {
    let mut stages: Vec<Stage> = (1..k as u64)
        .map(|j| {
            let n = j * m;
            let x = slope * n as f64;
            let line = (x - u).floor();
            let mut accept = (line >= 0.0 && c >= 1).then(|| (line as u64).min(c - 1));
            if unit {
                accept = accept.map(|a| a.min(n - 1));
            }
            let reject = ((x + v).ceil().max(1.0) as u64)
                .min(c + 1)
                .max(accept.map_or(1, |a| a + 2));
            Stage { n, accept, reject }
        })
        .collect();
    stages.push(Stage {
        n: k as u64 * m,
        accept: Some(c),
        reject: c + 1,
    });
    stages
}

/// What a candidate's stages do at one quality: `(accepted, rejected,
/// asn)`.
fn run(stages: &[Stage], model: &Model, p: f64) -> (f64, f64, f64) {
    let mut walk = Walk::new(model, p, false);
    let (mut acc, mut rej, mut asn) = (0.0, 0.0, 0.0);
    for s in stages {
        let step = walk.step(s);
        acc += step.accept;
        rej += step.reject;
        asn += (step.accept + step.reject) * s.n as f64;
    }
    (acc, rej, asn)
}

#[derive(Clone, Debug)]
struct Candidate {
    stages: Vec<Stage>,
    value: f64,
    margin: f64,
    key: (u64, usize, usize),
}

impl Candidate {
    fn beats(&self, other: &Candidate) -> bool {
        let scale = self.value.abs().max(other.value.abs());
        if (self.value - other.value).abs() > TIE * scale {
            return self.value < other.value;
        }
        let size = |c: &Candidate| c.stages[c.stages.len() - 1].n;
        size(self)
            .cmp(&size(other))
            .then(self.margin.total_cmp(&other.margin))
            .then(self.key.cmp(&other.key))
            .is_lt()
    }
}

/// Designs the `k`-stage plan of the family above that meets both risk
/// points and minimises `criterion` (`asn-aql` or `asn-rql`).
///
/// # Errors
/// As [`design_single`] for points without a single plan;
/// [`DesignError::OverBudget`] when the search's estimated work
/// ([`multiple_work`](crate::multiple_work)) passes the budget;
/// [`DesignError::NoPlan`] when no plan of the
/// family meets both points with an ASN below the single plan's sample
/// size.
///
/// # Example
/// ```
/// use lotsman::{design_multiple, Criterion, Model, ModelKind, RiskPair, RiskPoint};
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// let risks = RiskPair::new(
///     RiskPoint { quality: 0.02, risk: 0.05 },
///     RiskPoint { quality: 0.10, risk: 0.10 },
///     &model,
/// ).unwrap();
/// let d = design_multiple(&model, &risks, 5, Criterion::AsnAql).unwrap();
/// assert_eq!(d.plan.stages().len(), 5);
/// assert!(d.producer_risk <= 0.05 && d.consumer_risk <= 0.10);
/// ```
pub fn design_multiple(
    model: &Model,
    risks: &RiskPair,
    k: u32,
    criterion: Criterion,
) -> Result<Design, DesignError> {
    let single = design_single(model, risks)?;
    multiple_work(model, single.n as f64, k).check(
        &format!(
            "the {k}-stage plan's search around the single plan's sample n = {} ({})",
            single.n,
            model.described()
        ),
        "use the single plan, or points further apart",
    )?;
    let (pr, co) = (risks.producer(), risks.consumer());
    let (p1, alpha, p2, beta) = (pr.quality, pr.risk, co.quality, co.risk);
    let slope = wald_lines(model, risks).2;
    let unit = model.kind() != ModelKind::Poisson;
    let c_top = 2 * single.c + 2;
    let mut best: Option<Candidate> = None;
    let bound = |best: &Option<Candidate>| {
        best.as_ref()
            .map_or(single.n as f64, |b| b.value * (1.0 + TIE))
    };
    let mut m = 1u64;
    while (m as f64) < bound(&best) && k as u64 * m <= model.max_sample() {
        for (iu, &u) in INTERCEPTS.iter().enumerate() {
            for (iv, &v) in INTERCEPTS.iter().enumerate() {
                let c_last = if unit {
                    c_top.min(k as u64 * m - 1)
                } else {
                    c_top
                };
                let stages = |c| family(k, m, c, u, v, slope, unit);
                let producer_ok = |c| run(&stages(c), model, p1).1 <= alpha;
                if !producer_ok(c_last) {
                    continue;
                }
                // Smallest c meeting the producer's point, by bisection.
                let (mut lo, mut hi) = (0, c_last);
                if producer_ok(lo) {
                    hi = lo;
                } else {
                    while hi - lo > 1 {
                        let mid = lo + (hi - lo) / 2;
                        if producer_ok(mid) {
                            hi = mid;
                        } else {
                            lo = mid;
                        }
                    }
                }
                for c in hi..=c_last {
                    let st = stages(c);
                    let (acc2, _, asn2) = run(&st, model, p2);
                    if acc2 > beta {
                        break;
                    }
                    let (_, rej1, asn1) = run(&st, model, p1);
                    let value = match criterion {
                        Criterion::AsnRql => asn2,
                        _ => asn1,
                    };
                    if value > bound(&best) {
                        continue;
                    }
                    let candidate = Candidate {
                        stages: st,
                        value,
                        margin: (rej1 / alpha).max(acc2 / beta),
                        key: (c, iu, iv),
                    };
                    if best.as_ref().is_none_or(|b| candidate.beats(b)) {
                        best = Some(candidate);
                    }
                }
            }
        }
        m += 1;
    }
    let b = best.ok_or_else(|| DesignError::NoPlan {
        reason: format!(
            "no {k}-stage plan of the searched family meets both points with an ASN below the single plan's n = {}",
            single.n
        ),
        suggestion: "use the single or the double plan".to_string(),
    })?;
    let plan = StagedPlan::new(b.stages, model).map_err(|e| DesignError::NoPlan {
        reason: e.to_string(),
        suggestion: "use the single or the double plan".to_string(),
    })?;
    Ok(Design::exact(plan, model, risks))
}
