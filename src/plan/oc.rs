//! Exact operating characteristic of a staged plan by dynamic programming
//! over the cumulative count.

use crate::model::Model;
use crate::plan::StagedPlan;

/// How lots of one quality end, stage by stage.
#[derive(Clone, Debug, PartialEq)]
pub struct StageOutcomes {
    /// `accept[j]`: probability that the lot is accepted at stage `j`.
    pub accept: Vec<f64>,
    /// `reject[j]`: probability that the lot is rejected at stage `j`.
    pub reject: Vec<f64>,
}

impl StageOutcomes {
    /// Probability of acceptance `Pa`, the OC at this quality.
    pub fn pa(&self) -> f64 {
        self.accept.iter().sum::<f64>().min(1.0)
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
/// producer's risk keeps its relative accuracy. A single plan is one tail
/// evaluation.
///
/// Source: the convolution recursion for multi-stage OC, e.g. Schilling and
/// Neubauer, *Acceptance Sampling in Quality Control* (2nd ed., 2009),
/// ch. 8 (from memory).
pub fn stage_outcomes(plan: &StagedPlan, model: &Model, p: f64) -> StageOutcomes {
    let stages = plan.stages();
    let mut accept = Vec::with_capacity(stages.len());
    let mut reject = Vec::with_capacity(stages.len());
    // States still undecided: cumulative count and its probability.
    let mut open: Vec<(u64, f64)> = vec![(0, 1.0)];
    let mut drawn = 0;
    for stage in stages {
        let m = stage.n - drawn;
        let lowest_open = stage.accept.map_or(0, |a| a + 1);
        let mut acc = 0.0;
        let mut rej = 0.0;
        let mut next: Vec<(u64, f64)> = Vec::new();
        if stage.reject > lowest_open {
            next = (lowest_open..stage.reject).map(|d| (d, 0.0)).collect();
        }
        for &(d, w) in &open {
            if w == 0.0 {
                continue;
            }
            let a_left = stage.accept.and_then(|a| a.checked_sub(d));
            // Count that rejects from here: x >= reject - d.
            let r_left = stage.reject.saturating_sub(d);
            if r_left == 0 {
                rej += w;
                continue;
            }
            let rej_tail = model.tails(m, r_left - 1, p, drawn, d);
            rej += w * rej_tail.sf;
            match a_left {
                Some(a) if a + 1 == r_left => acc += w * rej_tail.cdf,
                Some(a) => acc += w * model.tails(m, a, p, drawn, d).cdf,
                None => {}
            }
            for slot in next.iter_mut().filter(|slot| slot.0 >= d) {
                slot.1 += w * model.pmf(m, slot.0 - d, p, drawn, d);
            }
        }
        accept.push(acc);
        reject.push(rej);
        open = next;
        drawn = stage.n;
    }
    StageOutcomes { accept, reject }
}
