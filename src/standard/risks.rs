//! The risks a table plan really gives: what no table booklet prints.
//!
//! The standard indexes its plans by the AQL and does not state a
//! producer's risk; the plan's exact OC does. Here the plan that decides
//! each lot ([`StandardPlan::stages`]) goes through the crate's exact
//! evaluation ([`evaluate`], the same recursion `evaluate` and `design`
//! use) under the binomial, Poisson or hypergeometric model:
//!
//! ```text
//! producer's risk at the AQL   = 1 - Pa(AQL)
//! qualities at Pa = 0.95, 0.50, 0.10 (bisection on the OC)
//! consumer's risk at the RQL   = Pa(RQL)
//! ```
//!
//! Against a consumer's point (RQL, beta) the two-point designer of the
//! same scheme gives the smallest plan holding `1 - Pa(AQL) <= alpha` and
//! `Pa(RQL) <= beta`; both plans' largest samples and ASNs at the AQL are
//! set side by side.
//!
//! Under the hypergeometric model a lot of `N` units holds `round(p N)`
//! nonconforming ones, and every figure is at that lot's quality
//! ([`Measures::lot_quality`](crate::Measures::lot_quality)).

use super::answer::StandardPlan;
use super::error::StandardError;
use crate::design::{Design, DesignError, DesignRequest, SchemeOptions, design_for};
use crate::model::{Model, RiskPair, RiskPoint};
use crate::plan::{Evaluation, evaluate, measures, quality_at_pa};

/// The consumer's point a table plan is held against, with the producer's
/// risk the two-point design must keep at the AQL (contracts indexed by
/// the AQL name none; 0.05 is common practice).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ConsumerPoint {
    /// The rejectable quality level (fraction nonconforming, or
    /// nonconformities per unit under Poisson).
    pub rql: f64,
    /// The largest probability of accepting a lot at the RQL.
    pub beta: f64,
    /// The largest probability of rejecting a lot at the AQL, for the
    /// two-point design.
    pub alpha: f64,
}

/// The plan the two-point designer gives for the same points.
#[derive(Clone, Debug, PartialEq)]
pub struct TwoPointPlan {
    /// The design, with its achieved risks.
    pub design: Design,
    /// Its largest sample.
    pub n: u64,
    /// Its ASN at the AQL.
    pub asn_at_aql: f64,
}

/// The table plan against the consumer's point.
#[derive(Clone, Debug, PartialEq)]
pub struct ConsumerRisk {
    /// The point.
    pub point: ConsumerPoint,
    /// `Pa(RQL)` of the table plan.
    pub consumer_risk: f64,
    /// Whether it is at most beta.
    pub meets_beta: bool,
    /// The table plan's largest sample.
    pub table_n: u64,
    /// The table plan's ASN at the AQL.
    pub table_asn_at_aql: f64,
    /// The two-point design for `(AQL, alpha)` and `(RQL, beta)`, or why
    /// there is none.
    pub design: Result<TwoPointPlan, DesignError>,
}

/// The true risks of a table plan.
#[derive(Clone, Debug, PartialEq)]
pub struct TrueRisks {
    /// The model they are computed under.
    pub model: Model,
    /// The AQL as a quality of the model (AQL 1.0 is 0.01).
    pub aql_quality: f64,
    /// `1 - Pa(AQL)`.
    pub producer_risk: f64,
    /// The quality at which `Pa = 0.95`.
    pub quality_at_pa_95: f64,
    /// The quality at which `Pa = 0.50` (the indifference quality).
    pub quality_at_pa_50: f64,
    /// The quality at which `Pa = 0.10` (the plan's LTPD at beta 0.10).
    pub quality_at_pa_10: f64,
    /// The OC and the other measures at the qualities asked for, with the
    /// plan's AOQL.
    pub evaluation: Evaluation,
    /// Against a consumer's point, when one is given.
    pub consumer: Option<ConsumerRisk>,
}

/// The true risks of `plan` under `model` (with the lot size where
/// known; the hypergeometric model needs it), its OC at the qualities
/// `at`, and, given a consumer's point, the risk there and the two-point
/// plan for the same points.
///
/// # Errors
/// [`StandardError::AqlNeedsPoisson`] for an AQL above 10 with a model of
/// the fraction nonconforming; [`StandardError::Input`] for a plan that
/// does not fit the model's lot, a quality the model cannot take, an RQL
/// not above the AQL, risks out of range, or an evaluation over budget.
///
/// # Example
/// ```
/// use lotsman::{InspectionLevel, Model, ModelKind, Scheme, Severity, Tables, true_risks};
/// let t = Tables::builtin().unwrap();
/// let k = t.code_letter(1500, InspectionLevel::II).unwrap();
/// let plan = t.lookup(k, "1.0".parse().unwrap(), Severity::Normal, Scheme::Single).unwrap();
/// let m = Model::new(ModelKind::Binomial, None).unwrap();
/// let r = true_risks(&plan, &m, &[0.01], None).unwrap();
/// // scipy.stats: 1 - binom.cdf(3, 125, 0.01) = 0.0374491
/// assert!((r.producer_risk - 0.0374491).abs() < 1e-7);
/// ```
pub fn true_risks(
    plan: &StandardPlan,
    model: &Model,
    at: &[f64],
    consumer: Option<ConsumerPoint>,
) -> Result<TrueRisks, StandardError> {
    let staged = plan.plan_for(model)?;
    let evaluation = evaluate(&staged, model, at)?;
    let aql_quality = plan.aql.quality();
    let at_aql = measures(&staged, model, aql_quality);
    let consumer = match consumer {
        None => None,
        Some(point) => {
            let risks = RiskPair::new(
                RiskPoint {
                    quality: aql_quality,
                    risk: point.alpha,
                },
                RiskPoint {
                    quality: point.rql,
                    risk: point.beta,
                },
                model,
            )?;
            let consumer_risk = measures(&staged, model, point.rql).pa;
            let request = DesignRequest {
                scheme: plan.scheme,
                options: SchemeOptions::default(),
                model: *model,
                risks,
            };
            let design = design_for(&request).map(|design| TwoPointPlan {
                n: design.plan.max_sample(),
                asn_at_aql: measures(&design.plan, model, aql_quality).asn,
                design,
            });
            Some(ConsumerRisk {
                point,
                consumer_risk,
                meets_beta: consumer_risk <= point.beta,
                table_n: staged.max_sample(),
                table_asn_at_aql: at_aql.asn,
                design,
            })
        }
    };
    Ok(TrueRisks {
        model: *model,
        aql_quality,
        producer_risk: 1.0 - at_aql.pa,
        quality_at_pa_95: quality_at_pa(&staged, model, 0.95),
        quality_at_pa_50: quality_at_pa(&staged, model, 0.50),
        quality_at_pa_10: quality_at_pa(&staged, model, 0.10),
        evaluation,
        consumer,
    })
}
