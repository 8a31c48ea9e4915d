//! The double-sampling designer: the plan `(n1, c1, r1, n2, c2)` that meets
//! both risk points exactly and minimises a chosen average sample number.
//!
//! # The plan
//!
//! Draw `n1` units. Accept when the count `d1 <= c1`, reject when
//! `d1 >= r1`; otherwise draw `n2` more and accept when the cumulative count
//! is at most `c2`, reject when it is more. The search covers `c1 < c2`,
//! `c1 + 2 <= r1 <= c2 + 1` and every `n1`, `n2` (or `n2 = round(R n1)` for
//! a fixed second-sample ratio `R`); for the ASN at the AQL or the RQL also
//! first stages that cannot accept (`c1` none, printed `-`: reject at
//! `d1 >= r1` with `1 <= r1 <= c2 + 1`, otherwise go on). Those save 2 to
//! 10% of the ASN at the RQL: for 1.77% and 11.1%, `(18, -, 2, 38, 3)` has
//! ASN 32.8 there against 36.1 for the best plan with a `c1`.
//!
//! # Method
//!
//! For fixed acceptance and rejection numbers the acceptance event shrinks
//! when either sample grows (a lot accepted with `n1 + 1` or `n2 + 1` units
//! is accepted with `n1`, `n2` on the same units), so `Pa` falls in `n1`
//! and in `n2`. Hence:
//!
//! * `Pa(p2) <= beta` holds from some `n2_min(n1)` on, and `n2_min` does not
//!   grow with `n1`: one walk down over `n2` serves the whole sweep of `n1`
//!   (the sweep of [`double_sweep`](super::double_sweep), which the
//!   minimum-inspection designer shares);
//! * the ASN `n1 + n2 P(c1 < d1 < r1)` grows with `n2`, and the producer's
//!   point holds up to some `n2_max`, so at each `n1` only `n2_min` can be
//!   best;
//! * `Pa >= P(d1 <= c1)` bounds `n1` below by the single plan `(n1, c1)`
//!   at the consumer's point (without `c1`, by 1), and `Pa <= P(d1 < r1)`
//!   bounds it above by the single plan `(n1, r1 - 1)` at the producer's
//!   point;
//! * every criterion is at least `n1 + n2 s`, `s` the chance of a second
//!   sample at its quality, so a first sample whose smallest possible `n2`
//!   already scores too much is passed over;
//! * every criterion is at least `n1`, so the sweep stops once `n1` reaches
//!   the best value found, or before any is found, the single plan's `n`: a
//!   double plan that inspects more on average than the single plan is not
//!   worth its second sample.
//!
//! The final acceptance number `c2` runs up from 1 and stops three values
//! after the last one that improved the best plan, and not before the
//! single plan's acceptance number plus three. That stopping rule is the
//! search's one limit: tests/reference checks it against an exhaustive
//! search over a box twice as wide. The search serves points whose single
//! plan has `c <= 25` ([`MAX_DOUBLE_SINGLE_C`]). It grows with the cube of
//! the acceptance numbers and with the single plan's `n`: its work,
//! `n (c + 3)^3` steps ([`double_work`](crate::double_work)), is estimated
//! before it starts and held to the work budget.
//!
//! # Tie rule
//!
//! Criterion values within `1e-12` (relative) are ties, broken by the
//! smaller largest sample `n1 + n2`, then by
//! `max(alpha_achieved / alpha, beta_achieved / beta)`, then by the smaller
//! `(c2, c1, r1, n1)`, a first stage without `c1` before every `c1`.

use super::double_first::Counts;
use super::double_sweep::{Candidate, DoubleProblem, FirstStage, Numbers, search};
use super::limits::MAX_DOUBLE_SINGLE_C;
use super::request::{Criterion, Design};
use super::single::Solver;
use super::work::double_work;
use crate::design::DesignError;
use crate::model::RiskPair;
use crate::model::rows::Rows;
use crate::model::{Model, ModelKind};
use crate::plan::{Stage, StagedPlan, whole_argmax};

struct DoubleSearch<'a> {
    model: &'a Model,
    single: Solver<'a>,
    p1: f64,
    alpha: f64,
    p2: f64,
    beta: f64,
    criterion: Criterion,
    second_ratio: Option<f64>,
    single_n: u64,
    /// The counts at the two qualities, computed once for the search.
    rows: Rows,
}

impl DoubleSearch<'_> {
    /// Largest chance of a second sample over all qualities.
    fn peak_second_sample(&self, n1: u64, k: Numbers) -> f64 {
        let Some(c1) = k.c1 else {
            // P(d1 < r1) rises to 1 as the quality falls to 0.
            return 1.0;
        };
        let r1 = k.r1;
        let at = |p: f64| FirstStage::new(Counts::Once(self.model), n1, k, p).second_sample();
        match (self.model.kind(), self.model.lot_size()) {
            (ModelKind::Hypergeometric, Some(lot)) => {
                // P(c1 < d1 < r1) rises and falls in D: ternary search on D.
                let at_d = |d: u64| at(d as f64 / lot as f64);
                at_d(whole_argmax(0, lot, at_d))
            }
            (ModelKind::Poisson, _) => {
                // d/dlambda P(c1 < X < r1) = f(c1) - f(r1 - 1) = 0 at
                // lambda^(r1 - 1 - c1) = (r1 - 1)! / c1!.
                let gap = (r1 - 1 - c1) as f64;
                let lambda = ((ln_factorial(r1 - 1) - ln_factorial(c1)) / gap).exp();
                at(lambda / n1 as f64)
            }
            _ => {
                if r1 > n1 {
                    // The first sample cannot reject: a second one becomes
                    // certain as p -> 1.
                    return 1.0;
                }
                // d/dp P(c1 < X < r1) = n1 [b(c1; n1 - 1) - b(r1 - 1; n1 - 1)]
                // = 0 at (p / q)^(r1 - 1 - c1) = C(n1 - 1, c1) / C(n1 - 1, r1 - 1).
                let gap = (r1 - 1 - c1) as f64;
                let ln_odds = (ln_choose(n1 - 1, c1) - ln_choose(n1 - 1, r1 - 1)) / gap;
                let p = 1.0 / (1.0 + (-ln_odds).exp());
                at(p)
            }
        }
    }

    fn value(&self, n1: u64, k: Numbers, n2: u64, f1: &FirstStage, f2: &FirstStage) -> f64 {
        let share = match self.criterion {
            Criterion::AsnAql => f1.second_sample(),
            Criterion::AsnRql => f2.second_sample(),
            Criterion::AsnMax => self.peak_second_sample(n1, k),
        };
        n1 as f64 + n2 as f64 * share
    }
}

/// The two-point problem: meet the consumer's point (the requirement of
/// the sweep) and the producer's point (checked on each candidate), and
/// minimise the chosen average sample number.
impl DoubleProblem for DoubleSearch<'_> {
    /// The first stage at the consumer's quality.
    type First = FirstStage;
    type Memo = ();

    fn model(&self) -> &Model {
        self.model
    }

    fn limit(&self) -> u64 {
        self.single.limit
    }

    /// `Pa >= P(d1 <= c1)` bounds `n1` below by the single plan `(n1, c1)`
    /// at the consumer's point (no bound without `c1`), and
    /// `Pa <= P(d1 < r1)` bounds it above by the single plan `(n1, r1 - 1)`
    /// at the producer's point.
    fn first_sample_range(&self, k: Numbers) -> Option<(u64, u64)> {
        let lo = match k.c1 {
            Some(c1) => self.single.n_min(c1)?,
            None => 1,
        };
        Some((lo, self.single.n_max(k.r1 - 1)?))
    }

    /// Every `c1 < c2`, and for the ASN at the AQL or the RQL a first
    /// stage that cannot accept. Not for the largest ASN: such a stage
    /// sends every lot below the rejection number on to the second sample,
    /// so its ASN rises to `n1 + n2` as the quality falls to 0, the whole
    /// double sample that the criterion is chosen to avoid.
    fn first_acceptances(&self, c2: u64) -> Vec<Option<u64>> {
        let mut all: Vec<Option<u64>> = (0..c2).map(Some).collect();
        if self.criterion != Criterion::AsnMax {
            all.insert(0, None);
        }
        all
    }

    fn first(&self, n1: u64, k: Numbers) -> FirstStage {
        FirstStage::new(Counts::Stored(&self.rows), n1, k, self.p2)
    }

    /// Every criterion is at least `n1 + n2 s` with `s` the chance of a
    /// second sample at the criterion's quality (at the larger of the
    /// two points' for the largest ASN), and `n2 >= lo2`.
    fn beyond(&self, k: Numbers, n1: u64, lo2: u64, bound: f64) -> bool {
        let share = |p| FirstStage::new(Counts::Stored(&self.rows), n1, k, p).second_sample();
        let s = match self.criterion {
            Criterion::AsnAql => share(self.p1),
            Criterion::AsnRql => share(self.p2),
            Criterion::AsnMax => share(self.p1).max(share(self.p2)),
        };
        n1 as f64 + lo2 as f64 * s > bound
    }

    fn holds(&self, f2: &FirstStage, _: &mut (), _: Numbers, n1: u64, n2: u64) -> bool {
        f2.outcome(Counts::Stored(&self.rows), n1, n2, self.p2).0 <= self.beta
    }

    fn fixed_second(&self, n1: u64) -> Option<u64> {
        self.second_ratio
            .map(|ratio| ((ratio * n1 as f64).round() as u64).max(1))
    }

    fn score(
        &self,
        f2: &FirstStage,
        k: Numbers,
        n1: u64,
        n2: u64,
        bound: f64,
    ) -> Option<Candidate> {
        let stored = Counts::Stored(&self.rows);
        let f1 = FirstStage::new(stored, n1, k, self.p1);
        // Every criterion is at least n1 + n2 * P(second sample at p1 or p2).
        let floor = n1 as f64 + n2 as f64 * f1.second_sample().min(f2.second_sample());
        if floor > bound {
            return None;
        }
        let producer_risk = f1.outcome(stored, n1, n2, self.p1).1;
        if producer_risk > self.alpha {
            return None;
        }
        let consumer_risk = f2.outcome(stored, n1, n2, self.p2).0;
        Some(Candidate {
            n1,
            n2,
            numbers: k,
            value: self.value(n1, k, n2, &f1, f2),
            margin: (producer_risk / self.alpha).max(consumer_risk / self.beta),
        })
    }

    /// The single plan's sample size: a double plan that inspects more on
    /// average is not worth its second sample.
    fn initial_bound(&self) -> f64 {
        self.single_n as f64
    }
}

fn ln_factorial(k: u64) -> f64 {
    statrs::function::gamma::ln_gamma(k as f64 + 1.0)
}

fn ln_choose(n: u64, k: u64) -> f64 {
    ln_factorial(n) - ln_factorial(k) - ln_factorial(n - k)
}

/// Designs the double plan that meets both risk points and minimises
/// `criterion` (see the module documentation for the search).
///
/// # Errors
/// As [`design_single`](super::single::design_single) for points that have
/// no single plan; [`DesignError::NoPlan`] when no double plan meets both
/// points with a criterion below the single plan's sample size;
/// [`DesignError::BeyondCap`] when the single plan's acceptance number
/// passes [`MAX_DOUBLE_SINGLE_C`]; [`DesignError::OverBudget`] when the
/// search's estimated work ([`double_work`](crate::double_work)) passes
/// the budget.
///
/// # Example
/// ```
/// use lotsman::{design_double, Criterion, Model, ModelKind, RiskPair, RiskPoint};
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// let risks = RiskPair::new(
///     RiskPoint { quality: 0.01, risk: 0.05 },
///     RiskPoint { quality: 0.06, risk: 0.10 },
///     &model,
/// ).unwrap();
/// let d = design_double(&model, &risks, Criterion::AsnAql, None).unwrap();
/// assert!(d.producer_risk <= 0.05 && d.consumer_risk <= 0.10);
/// assert_eq!(d.plan.stages().len(), 2);
/// ```
pub fn design_double(
    model: &Model,
    risks: &RiskPair,
    criterion: Criterion,
    second_ratio: Option<f64>,
) -> Result<Design, DesignError> {
    let single = super::single::design_single(model, risks)?;
    if single.c > MAX_DOUBLE_SINGLE_C {
        return Err(DesignError::BeyondCap {
            what: format!(
                "a double plan around the single plan's acceptance number {}",
                single.c
            ),
            cap: format!("{MAX_DOUBLE_SINGLE_C} (use the single or the sequential plan)"),
        });
    }
    double_work(model, single.n as f64, single.c, criterion, second_ratio).check(
        &format!(
            "the double plan's search around the single plan n = {}, c = {} ({}, {})",
            single.n,
            single.c,
            model.described(),
            criterion.name()
        ),
        "use the single plan, or points further apart",
    )?;
    let (producer, consumer) = (risks.producer(), risks.consumer());
    let problem = DoubleSearch {
        model,
        single: Solver::new(model, risks),
        p1: producer.quality,
        alpha: producer.risk,
        p2: consumer.quality,
        beta: consumer.risk,
        criterion,
        second_ratio,
        single_n: single.n,
        rows: Rows::new(model),
    };
    let best = search(&problem, single.c);
    let b = best.ok_or_else(|| DesignError::NoPlan {
        reason: format!(
            "no double plan meets both points with a {} below the single plan's n = {}",
            criterion.name(),
            single.n
        ),
        suggestion: "use the single plan".to_string(),
    })?;
    let stages = vec![
        Stage {
            n: b.n1,
            accept: b.numbers.c1,
            reject: b.numbers.r1,
        },
        Stage {
            n: b.n1 + b.n2,
            accept: Some(b.numbers.c2),
            reject: b.numbers.c2 + 1,
        },
    ];
    let plan = StagedPlan::new(stages, model).map_err(|e| DesignError::NoPlan {
        reason: e.to_string(),
        suggestion: "report this as a bug".to_string(),
    })?;
    Ok(Design::exact(plan, model, risks))
}
