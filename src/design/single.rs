//! The single-sampling designer: the smallest `(n, c)` that honours both
//! risk points exactly under the chosen model.
//!
//! # Method
//!
//! For a fixed acceptance number `c`, `Pa(n)` falls as `n` grows, so the
//! consumer's point holds from `n_min(c)` on and the producer's point up to
//! `n_max(c)`; `c` is feasible when `n_min(c) <= n_max(c)`. Both bounds grow
//! with `c`, so the smallest sample over all feasible `c` is `n_min` of the
//! smallest feasible `c`.
//!
//! 1. A guess `c0` comes from Cameron's Poisson operating ratio with the
//!    Wilson–Hilferty approximation ([`bracket`](super::bracket)), with the
//!    finite-population correction for a finite lot.
//! 2. Find the largest `c` that is certainly infeasible together with every
//!    smaller one: `n_min(c) - n_max(c) >= 2` means even the real-valued
//!    relaxation of `n` has no solution at `c`, and the relaxation's
//!    operating ratio rises monotonically as `c` falls (Cameron 1952 for the
//!    Poisson case; checked for all three models against the exhaustive
//!    search of tests/reference/make_reference.py, and against a walk over
//!    every `c` in tests/it/single_search.rs). The test is a threshold in
//!    `c`, so it is searched from `c0` by galloping, then interpolating and
//!    bisecting ([`search`](super::search)): a few dozen pairs of searches
//!    where a walk one `c` at a time took thousands at close points in a
//!    large lot.
//! 3. Going up from the `c` above it, the first feasible `c` gives the
//!    answer.
//!
//! Each `n_min` and `n_max` is an exact threshold search on the model's
//! tails ([`search`](super::search)), started from the approximation, so a
//! typical design costs a few dozen tail evaluations, none of them a scan
//! over `n`.
//!
//! # Tie rule
//!
//! When several acceptance numbers fit at the smallest `n`, the plan takes
//! the one that uses the smaller share of its allowance on the worse side,
//! `min_c max(alpha_achieved / alpha, beta_achieved / beta)`, and the
//! smallest `c` among exact ties: neither party is favoured, and the margin
//! left is as even as the whole numbers allow.

use std::collections::HashMap;
use std::ops::RangeInclusive;

use serde::Serialize;

use super::bracket::{
    acceptance_number_for_ratio, acceptance_number_in_lot, poisson_mean_at, sample_for_mean,
    z_upper,
};
use super::request::Design;
use super::search::first_true;
use super::work::single_work;
use crate::design::DesignError;
use crate::model::RiskPair;
use crate::model::{Model, ModelKind, nonconforming_in_lot};
use crate::plan::{MAX_ACCEPTANCE_NUMBER, MAX_SAMPLE_SIZE, StagedPlan};

/// The most acceptance numbers a design lists as fitting at its `n`.
const MAX_FITTING_LISTED: usize = 1000;

/// A solved single plan.
#[derive(Clone, Debug, PartialEq)]
pub struct SingleDesign {
    /// The plan, one stage.
    pub plan: StagedPlan,
    /// Sample size.
    pub n: u64,
    /// Acceptance number.
    pub c: u64,
    /// Achieved producer's risk `1 - Pa(p1)`.
    pub producer_risk: f64,
    /// Achieved consumer's risk `Pa(p2)`.
    pub consumer_risk: f64,
    /// Every acceptance number that also meets both points at `n` (the
    /// chosen one included), for the record of the tie rule; the list ends
    /// where no later one could win it (a producer's risk of exactly 0) and
    /// holds at most 1,000.
    pub fitting_c: Vec<u64>,
}

/// For one acceptance number, the sample sizes that meet each point.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Alternative {
    /// Acceptance number.
    pub c: u64,
    /// Smallest `n` meeting the consumer's point, if any within the caps.
    pub n_min: Option<u64>,
    /// Largest `n` meeting the producer's point, if any.
    pub n_max: Option<u64>,
}

impl Alternative {
    /// Whether some `n` meets both points with this `c`.
    pub fn feasible(&self) -> bool {
        matches!((self.n_min, self.n_max), (Some(lo), Some(hi)) if lo <= hi)
    }

    /// Why no `n` meets both points with this `c`, in words.
    pub fn reason(&self) -> Option<String> {
        match (self.n_min, self.n_max) {
            _ if self.feasible() => None,
            (None, _) => Some("no sample within the limits meets the consumer's point".to_string()),
            (Some(_), None) => {
                Some("even the smallest sample breaks the producer's point".to_string())
            }
            (Some(lo), Some(hi)) => Some(format!(
                "the consumer's point needs n >= {lo}, the producer's allows n <= {hi}"
            )),
        }
    }
}

/// The exact searches of one design request, shared by the solver and the
/// list of alternatives, and the single-stage bounds of the staged designers.
pub(crate) struct Solver<'a> {
    model: &'a Model,
    p1: f64,
    alpha: f64,
    p2: f64,
    beta: f64,
    z_alpha: f64,
    z_beta: f64,
    pub(crate) limit: u64,
}

impl<'a> Solver<'a> {
    pub(crate) fn new(model: &'a Model, risks: &RiskPair) -> Self {
        let (producer, consumer) = (risks.producer(), risks.consumer());
        Solver {
            model,
            p1: producer.quality,
            alpha: producer.risk,
            p2: consumer.quality,
            beta: consumer.risk,
            z_alpha: z_upper(producer.risk),
            z_beta: z_upper(consumer.risk),
            limit: model.max_sample().min(MAX_SAMPLE_SIZE),
        }
    }

    fn consumer_risk(&self, n: u64, c: u64) -> f64 {
        self.model.tails(n, c, self.p2, 0, 0).cdf
    }

    fn producer_risk(&self, n: u64, c: u64) -> f64 {
        self.model.tails(n, c, self.p1, 0, 0).sf
    }

    /// `n_min(c)`: smallest `n` with `Pa(n, c, p2) <= beta`.
    pub(crate) fn n_min(&self, c: u64) -> Option<u64> {
        self.n_min_near(c, None)
    }

    /// `n_min(c)`, the search started at `guess` when one is known (a
    /// neighbouring design's answer) and at the approximation otherwise.
    fn n_min_near(&self, c: u64, guess: Option<u64>) -> Option<u64> {
        smallest_sample_with_pa_at_most(self.model, c, self.p2, self.beta, self.limit, guess)
    }

    /// `n_max(c)`: largest `n` with `1 - Pa(n, c, p1) <= alpha`.
    pub(crate) fn n_max(&self, c: u64) -> Option<u64> {
        let guess = sample_guess(
            self.model,
            poisson_mean_at(c, -self.z_alpha),
            self.p1,
            self.limit,
        );
        let ln_alpha = self.alpha.ln();
        let start = smallest_sample(self.model.kind(), c);
        match first_true(start, self.limit, guess, |n| {
            let risk = self.producer_risk(n, c);
            (
                risk > self.alpha,
                ln_alpha - risk.max(f64::MIN_POSITIVE).ln(),
            )
        }) {
            None => Some(self.limit),
            Some(n) if n > 1 => Some(n - 1),
            Some(_) => None,
        }
    }

    fn alternative(&self, c: u64) -> Alternative {
        Alternative {
            c,
            n_min: self.n_min(c),
            n_max: self.n_max(c),
        }
    }
}

/// What one design leaves for the next on a row of a trade-off grid, where
/// the producer's point stays and the consumer's point moves a little.
///
/// `n_max(c)` depends only on the model and the producer's point, so the
/// values found for one cell are exact for every cell of its row; they are
/// kept only while that point is the same ([`Memo::prepare`]). The last
/// `n_min(c)` and the chosen acceptance number are starting guesses for the
/// next searches: the searches are exact from any start, so a guess only
/// saves evaluations and never changes an answer.
#[derive(Clone, Debug, Default)]
pub(crate) struct Memo {
    producer: Option<(Model, u64, u64)>,
    n_max: HashMap<u64, Option<u64>>,
    n_min: HashMap<u64, (u64, f64)>,
    c: Option<u64>,
}

impl Memo {
    /// Drops what does not hold for `model` and `risks`.
    fn prepare(&mut self, model: &Model, risks: &RiskPair) {
        let p = risks.producer();
        let key = Some((*model, p.quality.to_bits(), p.risk.to_bits()));
        if self.producer != key {
            self.producer = key;
            self.n_max.clear();
        }
    }

    fn n_max(&mut self, s: &Solver, c: u64) -> Option<u64> {
        *self.n_max.entry(c).or_insert_with(|| s.n_max(c))
    }

    fn n_min(&mut self, s: &Solver, c: u64) -> Option<u64> {
        // The neighbour's n_min(c) at its quality q, rescaled to this
        // quality: the expected count n (-ln(1 - p)) (n p for Poisson) at
        // the threshold moves little from one cell to the next.
        let scale = |q: f64| match s.model.kind() {
            ModelKind::Poisson => q,
            _ => -(-q).ln_1p(),
        };
        let guess = self
            .n_min
            .get(&c)
            .map(|&(n, q)| (n as f64 * scale(q) / scale(s.p2)).round().max(1.0) as u64);
        let found = s.n_min_near(c, guess);
        match found {
            Some(n) => self.n_min.insert(c, (n, s.p2)),
            None => self.n_min.remove(&c),
        };
        found
    }

    /// The smallest `c` at which the design can begin its walk up: the
    /// `c` just above every acceptance number that is certainly
    /// infeasible together with every smaller one (see the module
    /// documentation), found from `start` by an exact threshold search
    /// ([`first_true`]) on that test, which holds up to some `c` and fails
    /// from there on. Its score for the interpolation is
    /// `n_min(c) - n_max(c) - 1.5`, which falls nearly linearly as `c`
    /// rises. `MAX_ACCEPTANCE_NUMBER + 1` when every `c` up to the cap is
    /// hopeless.
    fn above_the_hopeless(&mut self, s: &Solver, start: u64) -> u64 {
        let hopeful = |memo: &mut Memo, c: u64| match (memo.n_min(s, c), memo.n_max(s, c)) {
            (Some(lo), Some(hi)) => (lo < hi + 2, lo as f64 - hi as f64 - 1.5),
            (Some(_), None) => (false, f64::INFINITY),
            (None, _) => (true, f64::NEG_INFINITY),
        };
        first_true(0, MAX_ACCEPTANCE_NUMBER, start, |c| hopeful(self, c))
            .unwrap_or(MAX_ACCEPTANCE_NUMBER + 1)
    }
}

/// The smallest sample that can hold a count above `c`: `c + 1` units for
/// the unit-count models, one unit for the Poisson model (a unit can hold
/// several nonconformities).
pub(crate) fn smallest_sample(kind: ModelKind, c: u64) -> u64 {
    match kind {
        ModelKind::Poisson => 1,
        _ => c + 1,
    }
}

/// The sample at which the expected count is about `lambda` at quality
/// `p`, as a start for the threshold searches (within `1..=limit`).
fn sample_guess(model: &Model, lambda: f64, p: f64, limit: u64) -> u64 {
    let n = sample_for_mean(lambda, p, model.kind(), model.lot_size());
    if n.is_finite() {
        n.round().clamp(1.0, limit as f64) as u64
    } else {
        limit
    }
}

/// The smallest `n` in `smallest_sample(c)..=limit` with
/// `Pa(n, c, p) <= target`, or `None` when not even `limit` units do it.
///
/// `Pa` falls as `n` grows (a lot accepted on `n + 1` units is accepted on
/// the first `n` of them), so this is a threshold: an exact search
/// ([`first_true`]) started from the Poisson quantile's guess, scored by
/// `ln Pa - ln target`, or from `guess` when a neighbouring answer is
/// known (the search is exact from any start). The consumer's point of the
/// two-point designers and the LTPD of the minimum-inspection designer both
/// use it.
pub(crate) fn smallest_sample_with_pa_at_most(
    model: &Model,
    c: u64,
    p: f64,
    target: f64,
    limit: u64,
    guess: Option<u64>,
) -> Option<u64> {
    let guess =
        guess.unwrap_or_else(|| sample_guess(model, poisson_mean_at(c, z_upper(target)), p, limit));
    let ln_target = target.ln();
    first_true(smallest_sample(model.kind(), c), limit, guess, |n| {
        let pa = model.tails(n, c, p, 0, 0).cdf;
        (pa <= target, pa.max(f64::MIN_POSITIVE).ln() - ln_target)
    })
}

/// Designs the single plan with the smallest sample that meets both risk
/// points exactly under `model`.
///
/// # Errors
/// [`DesignError::NoPlan`] when a finite lot cannot tell the two qualities
/// apart (both round to the same number of nonconforming units);
/// [`DesignError::WholeLot`] when the binomial or Poisson plan needs a
/// larger sample than the lot holds (the answer is to inspect the whole
/// lot);
/// [`DesignError::BeyondCap`] when the plan would need more than
/// [`MAX_SAMPLE_SIZE`] units or an acceptance number above
/// [`MAX_ACCEPTANCE_NUMBER`].
///
/// # Example
/// ```
/// use lotsman::{design_single, Model, ModelKind, RiskPair, RiskPoint};
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// let risks = RiskPair::new(
///     RiskPoint { quality: 0.01, risk: 0.05 },
///     RiskPoint { quality: 0.06, risk: 0.10 },
///     &model,
/// ).unwrap();
/// let d = design_single(&model, &risks).unwrap();
/// assert!(d.producer_risk <= 0.05 && d.consumer_risk <= 0.10);
/// ```
pub fn design_single(model: &Model, risks: &RiskPair) -> Result<SingleDesign, DesignError> {
    design_single_with(model, risks, &mut Memo::default())
}

/// [`design_single`], reusing and updating what earlier designs on the same
/// row of a grid left in `memo`. The answer is the same as without it.
pub(crate) fn design_single_with(
    model: &Model,
    risks: &RiskPair,
    memo: &mut Memo,
) -> Result<SingleDesign, DesignError> {
    // The binomial and Poisson probabilities do not depend on the lot: the
    // search runs without it, so that a lot too small for the points is
    // refused with the sample they need (model.fit_in_lot below), not with
    // the lot as a designer's limit.
    let search_model = model.without_lot();
    let s = Solver::new(&search_model, risks);
    memo.prepare(&search_model, risks);
    if let (ModelKind::Hypergeometric, Some(lot)) = (model.kind(), model.lot_size()) {
        let d1 = nonconforming_in_lot(s.p1, lot);
        let d2 = nonconforming_in_lot(s.p2, lot);
        if d1 == d2 {
            return Err(DesignError::NoPlan {
                reason: format!(
                    "in a lot of {lot} units both qualities mean {d1} nonconforming unit{} (D = round(p N)), so no sample can tell them apart",
                    if d1 == 1 { "" } else { "s" }
                ),
                suggestion: "inspect 100% of the lot, or widen the pair of points so that they differ by at least one unit in this lot".to_string(),
            });
        }
    }
    if let (ModelKind::Hypergeometric, Some(lot)) = (model.kind(), model.lot_size()) {
        // A finite lot's tails grow with the share of the lot sampled: the
        // only single designs that can pass the work budget.
        single_work(model, risks, false).check(
            &format!("the single plan's search in a lot of {lot} (hypergeometric model)"),
            "give points further apart, or use the binomial model",
        )?;
    }
    let ratio = match model.kind() {
        ModelKind::Poisson => s.p2 / s.p1,
        _ => (-s.p2).ln_1p() / (-s.p1).ln_1p(),
    };
    let beyond = || DesignError::BeyondCap {
        what: "an acceptance number".to_string(),
        cap: MAX_ACCEPTANCE_NUMBER.to_string(),
    };
    // The approximation refuses points beyond the cap at once, whatever the
    // memo suggests; otherwise the neighbour's c is the closer start.
    let c0 = acceptance_number_for_ratio(ratio, s.z_alpha, s.z_beta, MAX_ACCEPTANCE_NUMBER)
        .ok_or_else(beyond)?;
    // A sample that takes a share of a finite lot needs a smaller c than
    // the lot-free ratio says (at close points a third less): the guess
    // with the finite-population correction starts nearer.
    let guess = match (model.kind(), model.lot_size()) {
        (ModelKind::Hypergeometric, Some(lot)) => acceptance_number_in_lot(
            ratio,
            (s.z_alpha, s.z_beta),
            s.p2,
            lot,
            MAX_ACCEPTANCE_NUMBER,
        )
        .unwrap_or(c0),
        _ => c0,
    };
    let mut c = memo.above_the_hopeless(&s, memo.c.unwrap_or(guess));
    let (n, c, producer_risk) = loop {
        if c > MAX_ACCEPTANCE_NUMBER {
            return Err(beyond());
        }
        match memo.n_min(&s, c) {
            Some(n) => {
                let risk = s.producer_risk(n, c);
                if risk <= s.alpha {
                    break (n, c, risk);
                }
                c += 1;
            }
            None => {
                return Err(DesignError::BeyondCap {
                    what: "a sample".to_string(),
                    cap: format!("{} units", s.limit),
                });
            }
        }
    };
    // Larger acceptance numbers only lower the producer's risk, so those that
    // fit at n are the run from c up while the consumer's point still holds.
    // Each fitting c is kept with its two risks: (c, producer's, consumer's).
    // The run ends early once the producer's risk is exactly 0: every later
    // c has producer's risk 0 and a consumer's risk no smaller, so none can
    // win the tie rule (this bounds the run where a Poisson RQL of millions
    // per unit lets every c fit at n = 1); and it lists at most
    // MAX_FITTING_LISTED acceptance numbers.
    let mut fitting = vec![(c, producer_risk, s.consumer_risk(n, c))];
    let mut next = c + 1;
    while (model.kind() == ModelKind::Poisson || next < n)
        && next <= MAX_ACCEPTANCE_NUMBER
        && fitting.len() < MAX_FITTING_LISTED
        && fitting[fitting.len() - 1].1 > 0.0
    {
        let consumer_risk = s.consumer_risk(n, next);
        if consumer_risk > s.beta {
            break;
        }
        fitting.push((next, s.producer_risk(n, next), consumer_risk));
        next += 1;
    }
    let score = |&(_, pr, cr): &(u64, f64, f64)| (pr / s.alpha).max(cr / s.beta);
    let (chosen, producer_risk, consumer_risk) = fitting
        .iter()
        .copied()
        .min_by(|a, b| score(a).total_cmp(&score(b)).then(a.0.cmp(&b.0)))
        .unwrap_or(fitting[0]);
    memo.c = Some(chosen);
    model.fit_in_lot(n, "units")?;
    let plan = StagedPlan::single_checked_by_designer(n, chosen);
    Ok(SingleDesign {
        plan,
        n,
        c: chosen,
        producer_risk,
        consumer_risk,
        fitting_c: fitting.iter().map(|f| f.0).collect(),
    })
}

/// For each acceptance number of `cs` (as `0..=c_last`), the range of
/// sample sizes that meets each risk point, for the haggling over nearby
/// plans.
pub fn single_alternatives(
    model: &Model,
    risks: &RiskPair,
    cs: RangeInclusive<u64>,
) -> Vec<Alternative> {
    let s = Solver::new(model, risks);
    cs.map(|c| s.alternative(c)).collect()
}

/// The single designer's answer as a staged design.
impl From<SingleDesign> for Design {
    fn from(d: SingleDesign) -> Self {
        Design {
            plan: d.plan,
            producer_risk: d.producer_risk,
            consumer_risk: d.consumer_risk,
        }
    }
}
