//! Exact operating characteristic of a staged plan by dynamic programming
//! over the cumulative count.

mod item;

use crate::model::{Model, OneUnit, Window};
use crate::plan::{Stage, StagedPlan};

/// How lots of one quality end, stage by stage.
#[derive(Clone, Debug, PartialEq)]
pub struct StageOutcomes {
    /// `accept[j]`: probability that the lot is accepted at stage `j`.
    pub accept: Vec<f64>,
    /// `reject[j]`: probability that the lot is rejected at stage `j`.
    pub reject: Vec<f64>,
    /// Expected number of units inspected under full curtailment (stop as
    /// soon as the decision is certain); `None` where it was not asked for
    /// or cannot be computed (a hypergeometric state the earlier draws
    /// cannot produce).
    pub curtailed_units: Option<f64>,
}

impl StageOutcomes {
    /// Probability of acceptance `Pa`, the OC at this quality.
    pub fn pa(&self) -> f64 {
        crate::model::at_most_one(self.accept.iter().sum::<f64>())
    }

    /// Probability that the lot is decided at stage `j`: the distribution of
    /// the number of units inspected without curtailment (`n_j` units with
    /// probability `accept[j] + reject[j]`).
    pub fn decided(&self) -> Vec<f64> {
        self.accept
            .iter()
            .zip(&self.reject)
            .map(|(a, r)| a + r)
            .collect()
    }
}

/// The probabilities of acceptance and rejection at each stage of `plan`
/// for lots of quality `p`.
///
/// ```text
/// w_1(0) = 1
/// accept_j = sum_d w_j(d) P(X_j <= a_j - d)
/// reject_j = sum_d w_j(d) P(X_j >= r_j - d)
/// w_{j+1}(d') = sum_d w_j(d) P(X_j = d' - d),   a_j < d' < r_j
/// ```
///
/// where `X_j` is the count in stage `j`'s `n_j - n_{j-1}` new units (for the
/// hypergeometric model drawn from what is left of the lot after the earlier
/// stages took their units and `d` nonconforming ones). Both decisions come
/// from the tails of the stage count, never as `1 -` something, so a small
/// producer's risk keeps its relative accuracy.
///
/// Source: the convolution recursion for multi-stage OC, e.g. Schilling and
/// Neubauer, *Acceptance Sampling in Quality Control* (2nd ed., 2009),
/// ch. 8 (from memory).
pub fn stage_outcomes(plan: &StagedPlan, model: &Model, p: f64) -> StageOutcomes {
    outcomes(plan, model, p, false)
}

/// [`stage_outcomes`] together with the expected number of units inspected
/// under full curtailment.
pub fn curtailed_outcomes(plan: &StagedPlan, model: &Model, p: f64) -> StageOutcomes {
    outcomes(plan, model, p, true)
}

fn outcomes(plan: &StagedPlan, model: &Model, p: f64, curtail: bool) -> StageOutcomes {
    let [outcomes] = lane_outcomes(plan, model, [p], curtail);
    outcomes
}

/// The stage outcomes of `plan` at `L` qualities, walked side by side
/// ([`Walk`] with lanes); each lane's numbers are those of its own walk.
pub(crate) fn lane_outcomes<const L: usize>(
    plan: &StagedPlan,
    model: &Model,
    ps: [f64; L],
    curtail: bool,
) -> [StageOutcomes; L] {
    let stages = plan.stages();
    let mut walk = Walk::lanes(model, ps, curtail);
    let mut accept: [Vec<f64>; L] = std::array::from_fn(|_| Vec::with_capacity(stages.len()));
    let mut reject: [Vec<f64>; L] = std::array::from_fn(|_| Vec::with_capacity(stages.len()));
    for stage in stages {
        let steps = walk.steps(stage);
        for (lane, step) in steps.iter().enumerate() {
            accept[lane].push(step.accept);
            reject[lane].push(step.reject);
        }
    }
    let mut accept = accept.into_iter();
    let mut reject = reject.into_iter();
    std::array::from_fn(|lane| StageOutcomes {
        accept: accept.next().unwrap_or_default(),
        reject: reject.next().unwrap_or_default(),
        curtailed_units: walk.curtailed_units_of(lane),
    })
}

/// The stage outcomes (without curtailment) of `plan` at each of `ps`:
/// groups of up to eight qualities walked side by side ([`lane_outcomes`];
/// a group of three fills a fourth lane with its last quality), the groups
/// on the machine's cores. A curve search that asks for several points at
/// once pays about one walk for a group.
pub(crate) fn outcomes_at(plan: &StagedPlan, model: &Model, ps: &[f64]) -> Vec<StageOutcomes> {
    use rayon::prelude::*;
    fn group<const L: usize>(plan: &StagedPlan, model: &Model, ps: &[f64]) -> Vec<StageOutcomes> {
        let mut lanes = [ps[ps.len() - 1]; L];
        lanes[..ps.len()].copy_from_slice(ps);
        let mut outcomes = lane_outcomes(plan, model, lanes, false).to_vec();
        outcomes.truncate(ps.len());
        outcomes
    }
    ps.par_chunks(8)
        .flat_map_iter(|g| match g.len() {
            1 => group::<1>(plan, model, g),
            2 => group::<2>(plan, model, g),
            3 | 4 => group::<4>(plan, model, g),
            _ => group::<8>(plan, model, g),
        })
        .collect()
}

/// What one stage did to the lots that reached it.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Step {
    /// Probability of acceptance at this stage.
    pub(crate) accept: f64,
    /// Probability of rejection at this stage.
    pub(crate) reject: f64,
}

/// The recursion of [`stage_outcomes`], one stage at a time, so that a
/// designer can try several ways of ending a plan from one shared prefix
/// (clone the walk, step the candidate last stage).
///
/// A walk carries `L` lanes: `L` qualities walked side by side over the
/// same stages, each open count holding one probability per lane. Each
/// lane does exactly the floating-point operations of a walk of its own,
/// in the same order, so its numbers are the same to the bit; what the
/// lanes share is the loop over stages and counts. The steps of an
/// item-by-item plan form one long chain (each item's counts need the
/// previous item's), and one chain keeps a core waiting on each result;
/// interleaved chains let it work on several at once.
#[derive(Clone, Debug)]
pub(crate) struct Walk<'a, const L: usize = 1> {
    model: &'a Model,
    p: [f64; L],
    /// The two-term count of one unit at each lane's `p` (binomial and
    /// hypergeometric models), which a one-unit stage steps by instead of a
    /// window.
    one_unit: Option<[OneUnit; L]>,
    /// Count of `open[0]`.
    lo: u64,
    /// `open[i][lane]`: probability that the lane's lot is still undecided
    /// with a cumulative count of `lo + i`.
    open: Vec<[f64; L]>,
    /// Where a step builds the next open states before it swaps them with
    /// `open`: a walk of thousands of stages allocates only while its width
    /// grows.
    next: Vec<[f64; L]>,
    drawn: u64,
    /// Whether the expected units under curtailment were asked for.
    curtail: bool,
    /// Expected units inspected so far under curtailment, per lane.
    units: [f64; L],
    /// Whether each lane's `units` is still known (a stage may not give it).
    units_known: [bool; L],
    /// Per lane, the last stage count window, reused while the model
    /// forgets the past and the stage size and run stay the same (stages
    /// of equal size).
    cache: [Option<(u64, u64, u64, Window)>; L],
}

impl<'a> Walk<'a> {
    /// A lot of quality `p` before its first unit.
    pub(crate) fn new(model: &'a Model, p: f64, curtail: bool) -> Self {
        Walk::lanes(model, [p], curtail)
    }

    /// Inspects `stage` (whose cumulative size exceeds what was drawn) on
    /// the lots still undecided: [`Walk::steps`] of a one-lane walk.
    pub(crate) fn step(&mut self, stage: &Stage) -> Step {
        let [step] = self.steps(stage);
        step
    }
}

impl<'a, const L: usize> Walk<'a, L> {
    /// Lots of the qualities `ps`, one per lane, before their first unit.
    pub(crate) fn lanes(model: &'a Model, ps: [f64; L], curtail: bool) -> Self {
        let units: [Option<OneUnit>; L] = ps.map(|p| model.one_unit(p));
        // The model decides whether a unit has two terms, so every lane
        // has them or none does.
        let one_unit = units
            .iter()
            .all(Option::is_some)
            .then(|| units.map(|u| u.unwrap_or(OneUnit::Binomial { stay: 1.0, up: 0.0 })));
        Walk {
            model,
            p: ps,
            one_unit,
            lo: 0,
            open: vec![[1.0; L]],
            next: Vec::new(),
            drawn: 0,
            curtail,
            units: [0.0; L],
            units_known: [true; L],
            cache: std::array::from_fn(|_| None),
        }
    }

    /// Expected units inspected under full curtailment by the stages
    /// stepped so far at lane `lane`; `None` when not asked for, or once a
    /// stage could not give it.
    pub(crate) fn curtailed_units_of(&self, lane: usize) -> Option<f64> {
        (self.curtail && self.units_known[lane]).then_some(self.units[lane])
    }

    /// What stepping a last `stage` (one that decides every count) would
    /// accept and reject in each lane, the walk left as it is: a designer
    /// tries several closings of one prefix. A one-unit stage of a
    /// two-term model costs one pass over the open counts; any other is
    /// stepped on a copy.
    pub(crate) fn closings(&self, stage: &Stage) -> [Step; L] {
        self.item_closing(stage)
            .unwrap_or_else(|| self.clone().steps(stage))
    }

    /// Inspects `stage` (whose cumulative size exceeds what was drawn) on
    /// the lots still undecided, in every lane.
    ///
    /// A one-unit stage under the binomial and hypergeometric models (every
    /// stage of an item-by-item plan) moves each open count up by one or
    /// leaves it ([`Walk::item_step`]); any other stage convolves the open
    /// counts with the stage count's window ([`Walk::stage_step`]).
    pub(crate) fn steps(&mut self, stage: &Stage) -> [Step; L] {
        let m = stage.n - self.drawn;
        let lowest_open = stage.accept.map_or(0, |a| a + 1);
        let width = stage.reject.saturating_sub(lowest_open) as usize;
        // A stage that leaves no count open keeps one empty state, so that
        // a later step (a designer's candidate) still finds a walk.
        let mut next = std::mem::take(&mut self.next);
        let step = match (m, self.one_unit) {
            (1, Some(one)) => self.item_step(stage, one, lowest_open, &mut next),
            _ => {
                next.clear();
                next.resize(width.max(1), [0.0; L]);
                std::array::from_fn(|lane| self.stage_step(stage, m, lowest_open, &mut next, lane))
            }
        };
        self.next = std::mem::replace(&mut self.open, next);
        self.lo = lowest_open;
        self.drawn = stage.n;
        step
    }

    /// A stage of `m` units on the open counts of one lane: each count `d`
    /// moves to `d + x` with the stage count's `P(X = x)`.
    ///
    /// The count window of the stage spans every count a state can need:
    /// from the acceptance cut of the highest open state to the rejection
    /// cut of the lowest. For the binomial and Poisson models it is the same
    /// for every state and is computed once per stage (and reused across
    /// stages of the same size); the hypergeometric model needs one per
    /// state, since each state left a different lot behind. A state adds to
    /// the next counts only over its window's run of terms (the rest are
    /// zero), so a stage costs its open states times the shorter of the run
    /// and the next states.
    fn stage_step(
        &mut self,
        stage: &Stage,
        m: u64,
        lowest_open: u64,
        next: &mut [[f64; L]],
        lane: usize,
    ) -> Step {
        let model = self.model;
        let p = self.p[lane];
        let r = stage.reject;
        let d_lo = self.lo;
        let d_hi = self.lo + self.open.len() as u64 - 1;
        let (mut acc, mut rej) = (0.0, 0.0);
        let win_lo = lowest_open.saturating_sub(d_hi);
        let cache = &mut self.cache[lane];
        let shared = if model.forgets_the_past() && r > d_lo {
            let win_hi = r - 1 - d_lo;
            match cache {
                Some((cm, cl, ch, _)) if (*cm, *cl, *ch) == (m, win_lo, win_hi) => {}
                _ => {
                    let w = model.window(m, win_lo, win_hi, p, 0, 0);
                    *cache = Some((m, win_lo, win_hi, w));
                }
            }
            cache.as_ref().map(|c| &c.3)
        } else {
            None
        };
        let (mut units, mut known) = (self.units[lane], self.units_known[lane]);
        for (i, open) in self.open.iter().enumerate() {
            let w = open[lane];
            let d = d_lo + i as u64;
            if w == 0.0 {
                continue;
            }
            if d >= r {
                // Already at the rejection number: rejected before the
                // stage's first unit.
                rej += w;
                continue;
            }
            let own;
            let win = match shared {
                Some(win) => win,
                None => {
                    own = model.window(
                        m,
                        lowest_open.saturating_sub(d),
                        r - 1 - d,
                        p,
                        self.drawn,
                        d,
                    );
                    &own
                }
            };
            rej += w * win.sf(r - 1 - d);
            let accept_left = stage.accept.and_then(|a| a.checked_sub(d));
            if let Some(a) = accept_left {
                acc += w * win.cdf(a);
            }
            // w'(d2) += w P(X = d2 - d) over the run's counts that stay
            // open; the terms left out are zero, so the sums are the same
            // to the bit as over every open count.
            let (run_lo, run) = win.run();
            let first = lowest_open.max(d + run_lo);
            let end = r.min(d + run_lo + run.len() as u64);
            for d2 in first..end {
                next[(d2 - lowest_open) as usize][lane] += w * run[(d2 - d - run_lo) as usize];
            }
            if self.curtail && known {
                match model.curtailed_stage_units(m, accept_left, r - d, p, self.drawn, d) {
                    Some(stage_units) => units += w * stage_units,
                    None => known = false,
                }
            }
        }
        self.units[lane] = units;
        self.units_known[lane] = known;
        Step {
            accept: acc,
            reject: rej,
        }
    }
}
