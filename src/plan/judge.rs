//! The lot decision from the counts an inspector found.

use serde::Serialize;

use crate::input::InputError;
use crate::model::{Model, ModelKind};
use crate::plan::StagedPlan;

/// What to do with the lot.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Decision {
    /// Accept the lot.
    Accept,
    /// Reject the lot.
    Reject,
    /// Inspect the next stage's units and count again.
    Continue,
}

/// The decision after the counts given, with the figures it rests on.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Judgement {
    /// Accept, reject, or go on.
    pub decision: Decision,
    /// The stage (1-based) at which the decision was taken.
    pub stage: usize,
    /// Units inspected in all so far.
    pub inspected: u64,
    /// Cumulative count found so far.
    pub cumulative_count: u64,
    /// The acceptance number applied at that stage (`None`: cannot accept).
    pub accept: Option<u64>,
    /// The rejection number applied at that stage.
    pub reject: u64,
    /// For `Continue`: how many more units the next stage draws.
    pub next_units: Option<u64>,
}

/// Judges a lot from `found`, the count found in each stage's new units, in
/// order: the cumulative count after stage `j` is compared with that
/// stage's acceptance and rejection numbers.
///
/// # Errors
/// [`InputError`] when no count is given, more counts are given than the
/// plan has stages or than it needs (a decision came earlier), or a count
/// exceeds the units of its stage under a unit-count model.
///
/// # Example
/// ```
/// use lotsman::{judge, Decision, Model, ModelKind, StagedPlan};
/// let m = Model::new(ModelKind::Binomial, None).unwrap();
/// let plan = StagedPlan::single(80, 2, &m).unwrap();
/// assert_eq!(judge(&plan, &m, &[2]).unwrap().decision, Decision::Accept);
/// assert_eq!(judge(&plan, &m, &[3]).unwrap().decision, Decision::Reject);
/// ```
pub fn judge(plan: &StagedPlan, model: &Model, found: &[u64]) -> Result<Judgement, InputError> {
    let stages = plan.stages();
    if found.is_empty() {
        return Err(InputError::Inconsistent(
            "give the count found with --found K (once per stage)".into(),
        ));
    }
    if found.len() > stages.len() {
        return Err(InputError::Inconsistent(format!(
            "{} counts were given but the plan has {} stage{}",
            found.len(),
            stages.len(),
            if stages.len() == 1 { "" } else { "s" }
        )));
    }
    let mut cumulative = 0u64;
    let mut drawn = 0u64;
    let mut outcome = None;
    for (i, (&k, stage)) in found.iter().zip(stages).enumerate() {
        if let Some(Judgement {
            decision,
            stage: at,
            cumulative_count,
            ..
        }) = outcome
        {
            return Err(InputError::Inconsistent(format!(
                "the lot was already decided at stage {at} ({decision:?} with a cumulative count of {cumulative_count}); drop the later counts"
            )));
        }
        let units = stage.n - drawn;
        if model.kind() != ModelKind::Poisson && k > units {
            return Err(InputError::out_of_range(
                &format!("--found for stage {}", i + 1),
                k,
                &format!("0 to {units}, the units that stage inspects"),
            ));
        }
        cumulative = cumulative.saturating_add(k);
        drawn = stage.n;
        let judgement = at_stage(stages, i, cumulative);
        if judgement.decision == Decision::Continue && i + 1 < found.len() {
            continue;
        }
        outcome = Some(judgement);
    }
    outcome.ok_or_else(|| InputError::Inconsistent("no count was judged".into()))
}

/// Judges a lot from the cumulative count `count` after `inspected` units,
/// for an inspector who followed the plan up to there (an item-by-item plan
/// is judged after every unit this way): the numbers of the stage that ends
/// at `inspected` units decide.
///
/// # Errors
/// [`InputError`] when no stage ends at `inspected` units, or the count
/// exceeds the units inspected under a unit-count model.
///
/// # Example
/// ```
/// use lotsman::{judge_cumulative, Decision, Model, ModelKind, Stage, StagedPlan};
/// let m = Model::new(ModelKind::Binomial, None).unwrap();
/// let stages = vec![
///     Stage { n: 50, accept: Some(1), reject: 4 },
///     Stage { n: 100, accept: Some(4), reject: 5 },
/// ];
/// let plan = StagedPlan::new(stages, &m).unwrap();
/// assert_eq!(judge_cumulative(&plan, &m, 50, 2).unwrap().decision, Decision::Continue);
/// assert_eq!(judge_cumulative(&plan, &m, 100, 4).unwrap().decision, Decision::Accept);
/// ```
pub fn judge_cumulative(
    plan: &StagedPlan,
    model: &Model,
    inspected: u64,
    count: u64,
) -> Result<Judgement, InputError> {
    let stages = plan.stages();
    let Some(i) = stages.iter().position(|s| s.n == inspected) else {
        let ends: Vec<String> = stages.iter().take(12).map(|s| s.n.to_string()).collect();
        return Err(InputError::out_of_range(
            "--inspected",
            inspected,
            &format!(
                "a count of units at which a stage ends: {}{}",
                ends.join(", "),
                if stages.len() > 12 { ", ..." } else { "" }
            ),
        ));
    };
    if model.kind() != ModelKind::Poisson && count > inspected {
        return Err(InputError::out_of_range(
            "--found",
            count,
            &format!("0 to {inspected}, the units inspected"),
        ));
    }
    Ok(at_stage(stages, i, count))
}

/// The judgement at stage `i` (0-based) on the cumulative count `count`.
fn at_stage(stages: &[crate::plan::Stage], i: usize, count: u64) -> Judgement {
    let stage = stages[i];
    let decision = if stage.accept.is_some_and(|a| count <= a) {
        Decision::Accept
    } else if count >= stage.reject {
        Decision::Reject
    } else {
        Decision::Continue
    };
    Judgement {
        decision,
        stage: i + 1,
        inspected: stage.n,
        cumulative_count: count,
        accept: stage.accept,
        reject: stage.reject,
        next_units: match decision {
            Decision::Continue => stages.get(i + 1).map(|s| s.n - stage.n),
            _ => None,
        },
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::plan::Stage;

    fn double() -> (StagedPlan, Model) {
        let m = Model::new(ModelKind::Binomial, None).unwrap();
        let stages = vec![
            Stage {
                n: 50,
                accept: Some(1),
                reject: 4,
            },
            Stage {
                n: 100,
                accept: Some(4),
                reject: 5,
            },
        ];
        (StagedPlan::new(stages, &m).unwrap(), m)
    }

    #[test]
    fn a_double_plan_goes_on_then_decides_on_the_cumulative_count() {
        let (plan, m) = double();
        let first = judge(&plan, &m, &[2]).unwrap();
        assert_eq!(
            (first.decision, first.next_units),
            (Decision::Continue, Some(50))
        );
        assert_eq!(
            judge(&plan, &m, &[2, 2]).unwrap().decision,
            Decision::Accept
        );
        assert_eq!(
            judge(&plan, &m, &[2, 3]).unwrap().decision,
            Decision::Reject
        );
        assert_eq!(judge(&plan, &m, &[1]).unwrap().decision, Decision::Accept);
        assert_eq!(judge(&plan, &m, &[4]).unwrap().decision, Decision::Reject);
    }

    #[test]
    fn counts_after_a_decision_or_beyond_the_stage_are_refused() {
        let (plan, m) = double();
        assert!(
            judge(&plan, &m, &[1, 0])
                .unwrap_err()
                .to_string()
                .contains("already decided at stage 1")
        );
        assert!(
            judge(&plan, &m, &[51])
                .unwrap_err()
                .to_string()
                .contains("0 to 50")
        );
        assert!(judge(&plan, &m, &[2, 1, 0]).is_err());
        assert!(judge(&plan, &m, &[]).is_err());
    }
}
