//! Several plans held against one pair of risk points: what each really
//! gives at the AQL and the RQL, its AOQL and its average sample numbers,
//! from the same evaluation `lotsman evaluate` prints (`lotsman compare`).

use super::evaluation::evaluate;
use crate::input::InputError;
use crate::model::{Model, ModelKind, RiskPair};
use crate::plan::{Aoql, Measures, StagedPlan};

/// The fewest plans a comparison holds.
pub const MIN_COMPARED: usize = 2;

/// The most plans a comparison holds: more curves on one chart cannot be
/// told apart.
pub const MAX_COMPARED: usize = 6;

/// One plan to compare, with what names it.
#[derive(Clone, Debug, PartialEq)]
pub struct ComparedPlan {
    /// The name the table and the charts' legends give it: the plan
    /// source's file name, or the typed stages.
    pub label: String,
    /// The plan.
    pub plan: StagedPlan,
    /// The model it is evaluated under.
    pub model: Model,
    /// What the reader must know about where the plan came from (which of
    /// a standard-indexed source's plans it is), if anything.
    pub note: Option<String>,
}

/// One plan of a comparison, evaluated at the two risk points.
#[derive(Clone, Debug, PartialEq)]
pub struct ComparedRow {
    /// The plan as given.
    pub compared: ComparedPlan,
    /// The measures at the AQL.
    pub at_aql: Measures,
    /// The measures at the RQL.
    pub at_rql: Measures,
    /// The AOQL, with the lot's `(N - n)/N` factor when the lot size is
    /// known, else the approximation `Pa p` (as `evaluate` reports it).
    pub aoql: Aoql,
}

impl ComparedRow {
    /// The producer's true risk: the probability of rejecting a lot at the
    /// AQL, `1 - Pa(AQL)`.
    pub fn producer_risk(&self) -> f64 {
        1.0 - self.at_aql.pa
    }

    /// The consumer's true risk: the probability of accepting a lot at the
    /// RQL, `Pa(RQL)`.
    pub fn consumer_risk(&self) -> f64 {
        self.at_rql.pa
    }
}

/// Plans held against one pair of risk points.
#[derive(Clone, Debug, PartialEq)]
pub struct Comparison {
    /// The risk points: AQL and alpha, RQL and beta.
    pub risks: RiskPair,
    /// Whether qualities are nonconformities per unit (Poisson plans).
    pub per_unit: bool,
    /// Each plan, in the order given.
    pub rows: Vec<ComparedRow>,
}

/// Refuses a comparison of `count` plans unless it is [`MIN_COMPARED`]
/// to [`MAX_COMPARED`]: a caller checks it before it reads the plans.
///
/// # Errors
/// [`InputError::Inconsistent`] saying how many plans a comparison takes.
pub fn check_compared_count(count: usize) -> Result<(), InputError> {
    if (MIN_COMPARED..=MAX_COMPARED).contains(&count) {
        return Ok(());
    }
    Err(InputError::Inconsistent(format!(
        "{count} plan{} given; a comparison takes {MIN_COMPARED} to {MAX_COMPARED} plans (plan sources, or --stage N:AC:RE once per plan)",
        if count == 1 { " was" } else { "s were" }
    )))
}

/// Evaluates each of `plans` at the AQL and the RQL of `risks`, with the
/// same [`evaluate`] as `lotsman evaluate`.
///
/// # Errors
/// [`InputError`] for fewer than [`MIN_COMPARED`] or more than
/// [`MAX_COMPARED`] plans; for Poisson plans (nonconformities per unit)
/// among plans of fractions nonconforming, whose qualities lie on another
/// axis; and whatever [`evaluate`] refuses (a quality the model cannot
/// take, work over the budget), naming the plan.
pub fn compare(plans: Vec<ComparedPlan>, risks: &RiskPair) -> Result<Comparison, InputError> {
    check_compared_count(plans.len())?;
    let per_unit = plans[0].model.kind() == ModelKind::Poisson;
    if let Some(other) = plans
        .iter()
        .find(|p| (p.model.kind() == ModelKind::Poisson) != per_unit)
    {
        let (poisson, fraction) = if per_unit {
            (&plans[0], other)
        } else {
            (other, &plans[0])
        };
        return Err(InputError::Inconsistent(format!(
            "{} counts nonconformities per unit (Poisson model) and {} a fraction nonconforming ({} model): their qualities are on different axes, so compare plans of one kind",
            poisson.label,
            fraction.label,
            fraction.model.kind()
        )));
    }
    let (aql, rql) = (risks.producer().quality, risks.consumer().quality);
    let mut rows = Vec::with_capacity(plans.len());
    for compared in plans {
        let evaluation = evaluate(&compared.plan, &compared.model, &[aql, rql])
            .map_err(|e| InputError::Inconsistent(format!("{}: {e}", compared.label)))?;
        let [at_aql, at_rql] = [evaluation.points[0], evaluation.points[1]];
        rows.push(ComparedRow {
            compared,
            at_aql,
            at_rql,
            aoql: evaluation.aoql,
        });
    }
    Ok(Comparison {
        risks: *risks,
        per_unit,
        rows,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::RiskPoint;

    fn typed(n: u64, c: u64, kind: ModelKind) -> ComparedPlan {
        let model = Model::new(kind, None).unwrap();
        ComparedPlan {
            label: format!("{n}:{c}:{}", c + 1),
            plan: StagedPlan::single(n, c, &model).unwrap(),
            model,
            note: None,
        }
    }

    fn risks() -> RiskPair {
        let model = Model::new(ModelKind::Binomial, None).unwrap();
        RiskPair::new(
            RiskPoint {
                quality: 0.01,
                risk: 0.05,
            },
            RiskPoint {
                quality: 0.06,
                risk: 0.10,
            },
            &model,
        )
        .unwrap()
    }

    #[test]
    fn each_plan_gets_its_risks_at_both_points() {
        let plans = vec![
            typed(125, 3, ModelKind::Binomial),
            typed(80, 2, ModelKind::Binomial),
        ];
        let c = compare(plans, &risks()).unwrap();
        // Pa(1%) of n = 125, c = 3: 0.962551 (scipy.stats.binom.cdf(3, 125, 0.01)).
        assert!((c.rows[0].at_aql.pa - 0.962551).abs() < 1e-6);
        assert!((c.rows[0].producer_risk() - 0.037449).abs() < 1e-6);
        assert!(c.rows[1].consumer_risk() > c.rows[0].consumer_risk());
    }

    #[test]
    fn one_plan_or_plans_on_two_axes_are_refused() {
        let one = compare(vec![typed(125, 3, ModelKind::Binomial)], &risks());
        assert!(one.unwrap_err().to_string().contains("1 plan was given"));
        let mixed = vec![
            typed(125, 3, ModelKind::Binomial),
            typed(80, 2, ModelKind::Poisson),
        ];
        let e = compare(mixed, &risks()).unwrap_err().to_string();
        assert!(e.contains("different axes"), "{e}");
    }
}
