//! The walk's step over a one-unit stage (every stage of an item-by-item
//! plan) under the binomial and hypergeometric models: each open count
//! stays or rises by one.
//!
//! With `w(d)` the probability that the lot is undecided with count `d`
//! before the unit, `q_d = P(X = 0)` and `p_d = P(X = 1)` for the unit
//! ([`OneUnit`]), and the stage's numbers `a` (accept) and `r` (reject):
//!
//! ```text
//! accept = sum_{d < a} w(d) + w(a) q_a
//! reject = sum_{d >= r} w(d) + w(r - 1) p_{r-1}
//! w'(e)  = w(e - 1) p_{e-1} + w(e) q_e,      a < e < r
//! ```
//!
//! which is the convolution recursion of [`stage_outcomes`](super::stage_outcomes)
//! with a count window of two terms. It costs two multiplications per open
//! count, where a general window costs a saddle-point logarithm, two tail
//! sums and a product per pair of counts; the two terms are exact to one
//! rounding (`p`, `1 - p`, or one division for the hypergeometric model),
//! where a window's come from an exponential and a ratio (a few roundings).
//!
//! Under full curtailment a lot inspects the stage's unit unless it is
//! accepted whatever the unit holds (`d < a`): a state adds `w(d)` units or
//! none. The closed forms of the stage mean (`Model::curtailed_stage_units`)
//! give the same, `p + q` or 0, with the rounding of a few tails.

use super::{Step, Walk};
use crate::model::OneUnit;
use crate::plan::Stage;

/// The two terms of one unit in each lane for one count: `(q_d, p_d)`,
/// and whether the earlier draws can produce the state at all (a
/// hypergeometric state that they cannot carries no probability; as under
/// a window, its count stays, `(1, 0)`, and its curtailed units become
/// unknown).
#[derive(Clone, Copy)]
struct Odds<const L: usize> {
    stay: [f64; L],
    up: [f64; L],
    possible: [bool; L],
}

impl<const L: usize> Odds<L> {
    /// The binomial terms, which do not depend on the count.
    fn binomial(units: &[OneUnit; L]) -> Self {
        let mut odds = Odds {
            stay: [1.0; L],
            up: [0.0; L],
            possible: [true; L],
        };
        for (lane, unit) in units.iter().enumerate() {
            if let OneUnit::Binomial { stay, up } = *unit {
                (odds.stay[lane], odds.up[lane]) = (stay, up);
            }
        }
        odds
    }

    /// Each lane's terms for the count `found` after `drawn` units.
    fn at(units: &[OneUnit; L], drawn: u64, found: u64) -> Self {
        let mut odds = Odds {
            stay: [1.0; L],
            up: [0.0; L],
            possible: [true; L],
        };
        for (lane, unit) in units.iter().enumerate() {
            match unit.odds(drawn, found) {
                Some((stay, up)) => (odds.stay[lane], odds.up[lane]) = (stay, up),
                None => odds.possible[lane] = false,
            }
        }
        odds
    }
}

impl<const L: usize> Walk<'_, L> {
    /// Steps the one-unit `stage` with each lane's two-term count `units`,
    /// building the counts it leaves open (from `lowest_open` up) in `next`.
    pub(super) fn item_step(
        &mut self,
        stage: &Stage,
        units: [OneUnit; L],
        lowest_open: u64,
        next: &mut Vec<[f64; L]>,
    ) -> [Step; L] {
        let drawn = self.drawn;
        // The binomial odds do not depend on the count: a separate copy of
        // the loops keeps them in registers.
        match units[0] {
            OneUnit::Binomial { .. } => {
                let odds = Odds::binomial(&units);
                self.items(stage, lowest_open, next, |_| odds)
            }
            OneUnit::Hypergeometric { .. } => {
                self.items(stage, lowest_open, next, |d| Odds::at(&units, drawn, d))
            }
        }
    }

    /// [`Walk::closings`] for a one-unit stage of a two-term model; `None`
    /// for any other stage.
    pub(super) fn item_closing(&self, stage: &Stage) -> Option<[Step; L]> {
        if stage.n - self.drawn != 1 {
            return None;
        }
        let drawn = self.drawn;
        let units = self.one_unit?;
        Some(match units[0] {
            OneUnit::Binomial { .. } => {
                let odds = Odds::binomial(&units);
                self.decide(stage, false, |_| odds).0
            }
            OneUnit::Hypergeometric { .. } => {
                self.decide(stage, false, |d| Odds::at(&units, drawn, d)).0
            }
        })
    }

    fn items(
        &mut self,
        stage: &Stage,
        lowest_open: u64,
        next: &mut Vec<[f64; L]>,
        odds: impl Fn(u64) -> Odds<L>,
    ) -> [Step; L] {
        let (step, (units, known)) = self.decide(stage, self.curtail, &odds);
        (self.units, self.units_known) = (units, known);
        self.carry(stage.reject, lowest_open, next, &odds);
        step
    }

    /// The lots the unit decides in each lane, and the curtailed units
    /// (with whether each lane still knows them) when `curtail` asks for
    /// them.
    ///
    /// A lane whose lot cannot be at a count (`w(d) = 0`) adds zeros there:
    /// `x + 0 = x` to the bit for the non-negative sums here, so the lanes
    /// need not branch on it, and each sum is the one a walk of its own
    /// (which skips such counts) forms.
    #[allow(clippy::type_complexity)]
    fn decide(
        &self,
        stage: &Stage,
        curtail: bool,
        odds: impl Fn(u64) -> Odds<L>,
    ) -> ([Step; L], ([f64; L], [bool; L])) {
        let r = stage.reject;
        let (mut acc, mut rej) = ([0.0; L], [0.0; L]);
        let (mut units, mut known) = (self.units, self.units_known);
        for (d, w) in (self.lo..).zip(&self.open) {
            if d >= r {
                // Already at the rejection number: rejected before the unit.
                for lane in 0..L {
                    rej[lane] += w[lane];
                }
                continue;
            }
            let o = odds(d);
            let certain = stage.accept.is_some_and(|a| d < a);
            if certain {
                for lane in 0..L {
                    acc[lane] += w[lane];
                }
            } else if stage.accept == Some(d) {
                for lane in 0..L {
                    acc[lane] += w[lane] * o.stay[lane];
                }
            }
            if d + 1 >= r {
                for lane in 0..L {
                    rej[lane] += w[lane] * o.up[lane];
                }
            }
            if curtail {
                for lane in 0..L {
                    known[lane] &= o.possible[lane] || w[lane] == 0.0;
                    if !certain {
                        units[lane] += w[lane];
                    }
                }
            }
        }
        let steps = std::array::from_fn(|lane| Step {
            accept: acc[lane],
            reject: rej[lane],
        });
        (steps, (units, known))
    }

    /// `next[e - lowest_open] = w(e - 1) p_{e-1} + w(e) q_e` in each lane
    /// for the counts `e` the stage leaves open (one zero slot when it
    /// leaves none). Each slot is written once, from registers, rather than
    /// added to twice in memory; a missing term is a zero, so the sum is the
    /// same either way.
    fn carry(
        &self,
        r: u64,
        lowest_open: u64,
        next: &mut Vec<[f64; L]>,
        odds: impl Fn(u64) -> Odds<L>,
    ) {
        let width = r.saturating_sub(lowest_open) as usize;
        next.resize(width.max(1), [0.0; L]);
        next[0] = [0.0; L];
        let open = &self.open;
        // Counts are at most MAX_ACCEPTANCE_NUMBER + 1, far inside i64.
        let len = open.len() as i64;
        let base = lowest_open as i64 - self.lo as i64;
        for (k, (e, slot)) in (lowest_open..r).zip(next.iter_mut()).enumerate() {
            // `open[i]` holds the count `e`, `open[i - 1]` the count `e - 1`.
            let i = base + k as i64;
            let mut stayed = [0.0; L];
            if (0..len).contains(&i) {
                let (o, w) = (odds(e), &open[i as usize]);
                for lane in 0..L {
                    stayed[lane] = w[lane] * o.stay[lane];
                }
            }
            let mut risen = [0.0; L];
            if (1..=len).contains(&i) {
                let (o, w) = (odds(e - 1), &open[(i - 1) as usize]);
                for lane in 0..L {
                    risen[lane] = w[lane] * o.up[lane];
                }
            }
            for lane in 0..L {
                slot[lane] = risen[lane] + stayed[lane];
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use crate::model::{Model, ModelKind};
    use crate::plan::{Stage, StagedPlan, curtailed_outcomes};

    /// One unit per stage; stage 7 accepts the count 2 whatever its unit
    /// holds (curtailed: not inspected).
    fn plan(model: &Model) -> StagedPlan {
        let numbers = [
            (None, 2),
            (None, 3),
            (Some(0), 3),
            (Some(0), 3),
            (Some(0), 4),
            (Some(1), 4),
            (Some(3), 4),
        ];
        let stages = (1..)
            .zip(numbers)
            .map(|(n, (accept, reject))| Stage { n, accept, reject })
            .collect();
        StagedPlan::new(stages, model).unwrap()
    }

    /// Exhaustive search: every sequence of 7 units, its probability
    /// (`unit(found, drawn, bad)` gives the next unit's probability), the
    /// stage that decides it, and the units a curtailed inspection takes.
    fn enumerate(plan: &StagedPlan, unit: impl Fn(u64, u64, bool) -> f64) -> [Vec<f64>; 3] {
        let stages = plan.stages();
        let mut acc = vec![0.0; stages.len()];
        let mut rej = vec![0.0; stages.len()];
        let mut units = 0.0;
        for bits in 0u32..1 << stages.len() {
            let (mut weight, mut d) = (1.0, 0);
            for j in 0..stages.len() as u64 {
                let bad = bits >> j & 1 == 1;
                weight *= unit(d, j, bad);
                d += u64::from(bad);
            }
            let mut d = 0;
            for (j, s) in stages.iter().enumerate() {
                let certain = s.accept.is_some_and(|a| d < a);
                d += u64::from(bits >> j & 1 == 1);
                if s.accept.is_some_and(|a| d <= a) {
                    acc[j] += weight;
                } else if d >= s.reject {
                    rej[j] += weight;
                } else {
                    continue;
                }
                units += weight * (j as f64 + if certain { 0.0 } else { 1.0 });
                break;
            }
        }
        [acc, rej, vec![units]]
    }

    fn agree(got: f64, want: f64, what: &str) {
        assert!(
            (got - want).abs() <= 1e-14 * want.abs().max(1e-300),
            "{what}: {got:e} against {want:e}"
        );
    }

    #[test]
    fn item_steps_match_an_exhaustive_search() {
        let binomial = Model::new(ModelKind::Binomial, None).unwrap();
        let p = 0.3;
        let want = enumerate(&plan(&binomial), |_, _, bad| if bad { p } else { 1.0 - p });
        let lot = Model::new(ModelKind::Hypergeometric, Some(12)).unwrap();
        // D = 3 of 12 at p = 0.25.
        let want_lot = enumerate(&plan(&lot), |found, drawn, bad| {
            let (left, bad_left) = (12.0 - drawn as f64, 3.0 - found as f64);
            if bad {
                bad_left.max(0.0) / left
            } else {
                (left - bad_left) / left
            }
        });
        for (model, p, want) in [(binomial, p, want), (lot, 0.25, want_lot)] {
            let got = curtailed_outcomes(&plan(&model), &model, p);
            for (j, (a, r)) in got.accept.iter().zip(&got.reject).enumerate() {
                agree(*a, want[0][j], &format!("{model:?} accept {j}"));
                agree(*r, want[1][j], &format!("{model:?} reject {j}"));
            }
            agree(got.curtailed_units.unwrap(), want[2][0], "curtailed units");
        }
    }
}
