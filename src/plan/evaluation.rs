//! The evaluation of a plan over a set of qualities: the rows of an OC
//! table plus the curve's AOQL and indifference quality.

use rayon::prelude::*;

use super::work::{evaluation_advice, evaluation_work};
use crate::input::InputError;
use crate::model::Model;
use crate::model::RiskPair;
use crate::plan::measures::{lane_measures, quality_at_pa};
use crate::plan::{Aoql, Measures, StagedPlan, aoql};

/// How many qualities one walk of an evaluation carries side by side:
/// eight took 64 ms of CPU for the 0.1%/0.3% item-by-item plan at 1,001
/// qualities where four took 75 ms and sixteen 66 ms (whole process,
/// release build, this machine, 4 December 2026).
const LANES: usize = 8;

/// A plan evaluated at a list of qualities.
#[derive(Clone, Debug, PartialEq)]
pub struct Evaluation {
    /// The plan.
    pub plan: StagedPlan,
    /// The model it was evaluated under.
    pub model: Model,
    /// The measures at each quality, in the order asked.
    pub points: Vec<Measures>,
    /// `decided[i][j]`: the probability that a lot of quality `points[i]`
    /// is decided at stage `j`, after `stages[j].n` units. This is the
    /// distribution of the number of units inspected without curtailment;
    /// computed only when asked for ([`evaluate_with_decided`]), since it
    /// holds one number per stage and quality.
    pub decided: Option<Vec<Vec<f64>>>,
    /// The AOQL and where it occurs.
    pub aoql: Aoql,
    /// The quality at which `Pa = 0.5`.
    pub indifference_quality: f64,
}

/// Evaluates `plan` under `model` at `qualities`: the measures at each,
/// the AOQL and the indifference quality.
///
/// # Errors
/// [`InputError::OutOfRange`] for a quality the model cannot take;
/// [`InputError::OverBudget`] when the evaluation's estimated work
/// ([`evaluation_work`]) passes the budget.
///
/// # Example
/// The plan n = 125, c = 3 at 1% nonconforming (binomial model):
/// ```
/// use lotsman::{Model, ModelKind, StagedPlan, evaluate};
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// let plan = StagedPlan::single(125, 3, &model).unwrap();
/// let evaluation = evaluate(&plan, &model, &[0.01]).unwrap();
/// // Pa(1%) = P(X <= 3), X ~ Binomial(125, 0.01) = 0.962551 (scipy.stats.binom.cdf(3, 125, 0.01)).
/// assert!((evaluation.points[0].pa - 0.962551).abs() < 1e-6);
/// ```
pub fn evaluate(
    plan: &StagedPlan,
    model: &Model,
    qualities: &[f64],
) -> Result<Evaluation, InputError> {
    evaluate_as(plan, model, qualities, false)
}

/// [`evaluate`], with the distribution of the stage at which each lot is
/// decided ([`Evaluation::decided`]), from the same walk as each quality's
/// measures: one more number per stage and quality.
///
/// # Errors
/// As [`evaluate`].
pub fn evaluate_with_decided(
    plan: &StagedPlan,
    model: &Model,
    qualities: &[f64],
) -> Result<Evaluation, InputError> {
    evaluate_as(plan, model, qualities, true)
}

fn evaluate_as(
    plan: &StagedPlan,
    model: &Model,
    qualities: &[f64],
    decided_at: bool,
) -> Result<Evaluation, InputError> {
    for &q in qualities {
        if !model.accepts_quality(q) {
            return Err(InputError::out_of_range(
                "quality",
                crate::numeric::Short(q),
                model.quality_range(),
            ));
        }
    }
    check_evaluation(plan, model, qualities.len(), decided_at)?;
    // The qualities are walked in groups of LANES side by side, and the
    // groups and the curve searches (two more chains of walks) run side by
    // side on the machine's cores (a walk of an item-by-item plan is one
    // long chain of dependent steps, which one core cannot shorten, but can
    // interleave with others). Each number is computed as on one core, by
    // a walk of its own.
    let (walked, (aoql, indifference_quality)) = rayon::join(
        || {
            qualities
                .par_chunks(LANES)
                .flat_map_iter(|group| {
                    // The last group is filled up with its own last quality,
                    // whose extra lanes are dropped.
                    let mut asked = [group[group.len() - 1]; LANES];
                    asked[..group.len()].copy_from_slice(group);
                    lane_measures(plan, model, asked)
                        .into_iter()
                        .take(group.len())
                        .map(|(point, outcomes)| (point, decided_at.then(|| outcomes.decided())))
                })
                .collect::<Vec<_>>()
        },
        || rayon::join(|| aoql(plan, model), || quality_at_pa(plan, model, 0.5)),
    );
    let (points, decided): (Vec<Measures>, Vec<Option<Vec<f64>>>) = walked.into_iter().unzip();
    let decided = decided_at.then(|| decided.into_iter().flatten().collect());
    Ok(Evaluation {
        plan: plan.clone(),
        model: *model,
        points,
        decided,
        aoql,
        indifference_quality,
    })
}

/// Refuses an evaluation of `plan` at `points` qualities whose estimated
/// work passes the budget, saying how many qualities would fit.
fn check_evaluation(
    plan: &StagedPlan,
    model: &Model,
    points: usize,
    decided_at: bool,
) -> Result<(), InputError> {
    let work = evaluation_work(plan, model, points, decided_at);
    if work.fits() {
        return Ok(());
    }
    let advice = evaluation_advice(plan, model, points, decided_at);
    let what = match (plan.sequential_lines(), plan.as_single()) {
        (Some(lines), _) => format!("the item-by-item plan of up to {} items", lines.truncation),
        (None, Some(_)) => format!("the plan {plan}"),
        (None, None) => format!("the {}-stage plan {plan}", plan.stages().len()),
    };
    work.check(
        &format!(
            "evaluating {what} ({} model) at {points} qualit{}{}",
            model.kind(),
            if points == 1 { "y" } else { "ies" },
            if decided_at {
                " with the per-stage distribution"
            } else {
                ""
            }
        ),
        &advice,
    )?;
    Ok(())
}

/// Qualities for an OC table when none are asked for.
///
/// With risk points: eight levels that bracket them, `p1/4, p1/2, p1,
/// sqrt(p1 p2), p2, 1.5 p2, 2 p2, 3 p2` (kept within the model's range).
/// Without: ten even steps up to the quality where `Pa = 0.05`. For the
/// hypergeometric model the qualities stay as they are (each row of an
/// evaluation carries the lot's `D` and `D / N` beside it), but those whose
/// lot holds no nonconforming unit, or the same `D` as an earlier one, are
/// dropped: they would repeat a row.
pub fn default_qualities(plan: &StagedPlan, model: &Model, risks: Option<&RiskPair>) -> Vec<f64> {
    let mut qs: Vec<f64> = match risks {
        Some(r) => bracketing_qualities(r),
        None => {
            let top = quality_at_pa(plan, model, 0.05);
            (1..=10).map(|i| top * i as f64 / 10.0).collect()
        }
    };
    qs.retain(|&q| model.accepts_quality(q));
    // The qualities rise, so D never falls: keep the first of each D > 0.
    let mut last_d = 0;
    qs.retain(|&q| match model.nonconforming_in_lot(q) {
        Some(d) if d <= last_d => false,
        Some(d) => {
            last_d = d;
            true
        }
        None => true,
    });
    qs.dedup();
    qs
}

/// The eight qualities that bracket a pair of risk points:
/// `p1/4, p1/2, p1, sqrt(p1 p2), p2, 1.5 p2, 2 p2, 3 p2`.
pub(crate) fn bracketing_qualities(risks: &RiskPair) -> Vec<f64> {
    let (p1, p2) = (risks.producer().quality, risks.consumer().quality);
    vec![
        p1 / 4.0,
        p1 / 2.0,
        p1,
        (p1 * p2).sqrt(),
        p2,
        1.5 * p2,
        2.0 * p2,
        3.0 * p2,
    ]
}
