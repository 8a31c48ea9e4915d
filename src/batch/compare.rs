//! A plan source as `lotsman compare` takes it: the plan it records, its
//! model, and the risk points it gives, after the same audit as
//! `evaluate FILE.yaml`.

use crate::input::InputError;
use crate::model::{Model, RiskPair, RiskPoint};
use crate::plain::escape_controls;
use crate::plan::ComparedPlan;
use crate::source::{Audited, Error, PlanSource, SourceError, SourceJob, SourceText, check_source};
use crate::standard::Severity;

/// The plan of one source, with the risk points the source gives.
#[derive(Clone, Debug, PartialEq)]
pub struct SourcePlan {
    /// The plan, labelled with the file name as given.
    pub compared: ComparedPlan,
    /// The source's AQL and RQL with their risks: those of a plan designed
    /// from two risk points; a standard-indexed source's first AQL (alpha
    /// as its consumer's point states it) when it gives a consumer's
    /// point; none for a minimum-inspection plan.
    pub risks: Option<RiskPair>,
    /// The discrepancy of a recorded plan that the audit does not confirm
    /// and that is compared as recorded at the user's request; `None`
    /// otherwise. The plan's note states it too.
    pub accepted_recorded: Option<String>,
}

/// The plan that the source `read` records, audited as `evaluate`
/// audits it (with `accept_recorded`, a plan the audit does not confirm
/// is compared as recorded, its note stating the discrepancy): a designed single, double, multiple or item-by-item plan
/// or a minimum-inspection plan as recorded, under its model; a
/// standard-indexed source's normal-inspection plan of its first class,
/// in its lot, with a note that says so.
///
/// # Errors
/// [`SourceError`] when the source cannot be parsed or validated, records
/// no plan, or records one the audit does not confirm (without
/// `accept_recorded`); a variables plan
/// (its OC is against the fraction beyond the specification limits of
/// measured units, not against counted nonconforming units); a
/// standard-indexed source whose first class inspects every unit; and
/// work over the budget.
pub fn compared_source(read: &SourceText, accept_recorded: bool) -> Result<SourcePlan, Error> {
    let path = read.path.as_path();
    let job = SourceJob::Evaluate {
        points: Some(2),
        decided_at: false,
    };
    let Audited {
        source, accepted, ..
    } = Audited::from_text(read.clone(), accept_recorded, |source| {
        check_source(source, path, job).map_err(|e| InputError::from(e).into())
    })?;
    let accepted = accepted.map(|d| d.to_string());
    let invalid = |e| SourceError::Invalid {
        path: path.to_path_buf(),
        source: e,
    };
    let label = escape_controls(&path.display().to_string()).into_owned();
    if source.is_variables() {
        return Err(invalid(InputError::Inconsistent(format!(
            "'{}' is a variables plan, decided from measurements: its OC is against the fraction beyond the specification limits, and compare charts plans that count nonconforming units; evaluate it with lotsman evaluate",
            source.title
        )))
        .into());
    }
    if source.is_standard() {
        let mut plan = standard_plan(&source, label).map_err(invalid)?;
        plan.compared.note = joined(plan.compared.note, accepted.as_deref());
        plan.accepted_recorded = accepted;
        return Ok(plan);
    }
    let (model, risks) = if source.is_rectifying() {
        (*source.rectifying_request().map_err(invalid)?.model(), None)
    } else {
        let request = source.request().map_err(invalid)?;
        (request.model, Some(request.risks))
    };
    let plan = source.recorded_plan(&model).map_err(invalid)?;
    Ok(SourcePlan {
        compared: ComparedPlan {
            label,
            plan,
            model,
            note: joined(None, accepted.as_deref()),
        },
        risks,
        accepted_recorded: accepted,
    })
}

/// A plan's note with the discrepancy of a plan compared as recorded, if
/// any, after it.
fn joined(note: Option<String>, accepted: Option<&str>) -> Option<String> {
    let accepted = accepted.map(|d| format!("compared as recorded (--accept-recorded): {d}"));
    match (note, accepted) {
        (Some(n), Some(a)) => Some(format!("{n}; {a}")),
        (n, a) => n.or(a),
    }
}

/// The normal-inspection plan of the first class of a standard-indexed
/// source, under its model in its lot.
fn standard_plan(source: &PlanSource, label: String) -> Result<SourcePlan, InputError> {
    let request = source.standard_request()?;
    let lot_size = request.request.lot_size();
    let model = Model::new(request.request.model().kind(), Some(lot_size))?;
    let plans = source.recorded_class_plans(Some(Severity::Normal))?;
    let Some(first) = plans.classes.first() else {
        return Err(InputError::Inconsistent(
            "the source records no class".to_string(),
        ));
    };
    let class = match &first.class.name {
        Some(name) => format!("its first class, {name} (AQL {})", first.class.aql),
        None => format!("its AQL {}", first.class.aql),
    };
    let Some(table_plan) = first.answer.plan() else {
        return Err(InputError::Inconsistent(format!(
            "the normal-inspection plan of {class} inspects every unit of the lot of {lot_size}, so it has no OC curve to compare"
        )));
    };
    let plan = table_plan
        .plan_for(&model)
        .map_err(|e| InputError::Inconsistent(e.to_string()))?;
    let aql = first.class.aql.quality();
    let risks = request.consumer.and_then(|point| {
        RiskPair::new(
            RiskPoint {
                quality: aql,
                risk: point.alpha,
            },
            RiskPoint {
                quality: point.rql,
                risk: point.beta,
            },
            &model,
        )
        .ok()
    });
    Ok(SourcePlan {
        compared: ComparedPlan {
            label,
            plan,
            model,
            note: Some(format!(
                "a standard-indexed source: compared by the normal-inspection plan of {class}, code letter {}, in its lot of {lot_size}",
                plans.code_letter
            )),
        },
        risks,
        accepted_recorded: None,
    })
}
