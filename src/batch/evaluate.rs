//! Evaluating the plan a source records: the attributes or variables
//! report that `evaluate FILE.yaml` prints, for one source or many.

use std::path::Path;

use crate::input::InputError;
use crate::model::Model;
use crate::plan::{
    default_qualities, evaluate, evaluate_variables, evaluate_with_decided, variables_qualities,
};
use crate::report::{
    ClassEvaluationReport, EvaluationReport, SourceEvaluation, StandardEvaluationReport,
    VariablesEvaluationReport,
};
use crate::source::{Audited, PlanSource, SourceText};
use crate::source::{Error, SourceError};
use crate::source::{SourceJob, check_source};

/// The evaluation of the plan recorded in the source at `path`, at
/// `qualities`, or, when `qualities` is empty, at the default qualities of
/// its kind of plan: eight levels bracketing the risk points (for a
/// minimum-inspection plan, the process average and the LTPD)
/// ([`default_qualities`], [`variables_qualities`]); with `decided_at`, an
/// attributes plan's report holds the per-stage distribution of the
/// stage at which each lot is decided (a variables plan decides on its
/// one sample).
///
/// `lot_size` is the size of the lots the plan is used on, for a source
/// that gives none (`evaluate FILE --lot-size N`): the source's model is
/// kept, and the lot gives AOQ its factor `(N - n)/N` and ATI its 100%
/// inspection of rejected lots.
///
/// The source is read once and audited first ([`Audited::load`]): a
/// recorded plan that a re-solve and its recorded risk points do not
/// confirm is refused, or with `accept_recorded` evaluated as recorded,
/// the report then stating the discrepancy (`accepted_recorded`).
///
/// # Errors
/// [`SourceError`] when the file cannot be read, parsed or validated,
/// records no plan, records one the audit does not confirm (without
/// `accept_recorded`), or when `lot_size` is given for a source that has
/// one; [`Error::Input`] for a quality outside the model's range, or an
/// evaluation whose estimated work (the audit's re-solve included) passes
/// the budget;
/// [`Error::Numerical`] when a computed measure is out of its range.
///
/// ```
/// use lotsman::{SourceEvaluation, evaluate_source};
/// let path = std::path::Path::new("plans/tpw-cover-fit.yaml");
/// let e = evaluate_source(path, &[0.01], None, false, false).unwrap();
/// let SourceEvaluation::Attributes(report) = e else { panic!("an attributes plan") };
/// assert_eq!(report.points.len(), 1);
/// assert_eq!(report.accepted_recorded, None);
/// assert!(report.decided_at.is_none());
/// ```
pub fn evaluate_source(
    path: &Path,
    qualities: &[f64],
    lot_size: Option<u64>,
    accept_recorded: bool,
    decided_at: bool,
) -> Result<SourceEvaluation, Error> {
    let read = SourceText::read(path)?;
    evaluate_text(&read, qualities, lot_size, accept_recorded, decided_at)
}

/// [`evaluate_source`] of a source already read, so that the file is not
/// read again.
///
/// # Errors
/// As [`evaluate_source`], but for reading the file.
pub fn evaluate_text(
    read: &SourceText,
    qualities: &[f64],
    lot_size: Option<u64>,
    accept_recorded: bool,
    decided_at: bool,
) -> Result<SourceEvaluation, Error> {
    let path = read.path.as_path();
    let points = (!qualities.is_empty()).then_some(qualities.len());
    let Audited {
        source, accepted, ..
    } = Audited::from_text(read.clone(), accept_recorded, |source| {
        check_source(source, path, SourceJob::Evaluate { points, decided_at })
            .map_err(|e| InputError::from(e).into())
    })?;
    let source = in_lot(source, path, lot_size)?;
    let accepted = accepted.map(|d| d.to_string());
    let invalid = |e| SourceError::Invalid {
        path: path.to_path_buf(),
        source: e,
    };
    if source.is_standard() {
        let report =
            evaluate_standard(&source, qualities, decided_at, accepted).map_err(|e| match e {
                Error::Input(e) => invalid(e).into(),
                other => other,
            })?;
        return Ok(SourceEvaluation::Standard(report));
    }
    if source.is_variables() {
        let request = source.variables_request().map_err(invalid)?;
        let plan = source.recorded_variables_plan(&request).map_err(invalid)?;
        let defaults;
        let at = if qualities.is_empty() {
            defaults = variables_qualities(&plan, request.risks());
            &defaults
        } else {
            qualities
        };
        let evaluation = evaluate_variables(&plan, request.model().lot_size(), at)?;
        let report = VariablesEvaluationReport {
            accepted_recorded: accepted,
            ..VariablesEvaluationReport::from(&evaluation)
        };
        report.check()?;
        return Ok(SourceEvaluation::Variables(report));
    }
    let rectifying = source
        .is_rectifying()
        .then(|| source.rectifying_request())
        .transpose()
        .map_err(invalid)?;
    let model = match &rectifying {
        Some(request) => *request.model(),
        None => source.request().map_err(invalid)?.model,
    };
    let plan = source.recorded_plan(&model).map_err(invalid)?;
    let defaults;
    let at = if qualities.is_empty() {
        defaults = match &rectifying {
            Some(request) => request.default_qualities(&plan),
            None => {
                let risks = source.request().map_err(invalid)?.risks;
                default_qualities(&plan, &model, Some(&risks))
            }
        };
        &defaults
    } else {
        qualities
    };
    let evaluation = if decided_at {
        evaluate_with_decided(&plan, &model, at)?
    } else {
        evaluate(&plan, &model, at)?
    };
    let report = EvaluationReport {
        accepted_recorded: accepted,
        ..EvaluationReport::from(&evaluation)
    };
    report.check()?;
    Ok(SourceEvaluation::Attributes(report))
}

/// The evaluation of a standard-indexed source's recorded plans at the
/// severity in force, each class's plan under the source's model, at
/// `qualities` or, when none are given, at the default qualities of that
/// plan with the class's AQL among them.
pub(crate) fn evaluate_standard(
    source: &PlanSource,
    qualities: &[f64],
    decided_at: bool,
    accepted: Option<String>,
) -> Result<StandardEvaluationReport, Error> {
    let request = source.standard_request()?;
    // The lot the plans were looked up for gives AOQ its factor and ATI
    // its 100 percent inspection of rejected lots, whatever the model.
    let lot_size = request.request.lot_size();
    let model = &Model::new(request.request.model().kind(), Some(lot_size))?;
    let plans = source.recorded_class_plans(None)?;
    let mut classes = Vec::with_capacity(plans.classes.len());
    for class in &plans.classes {
        let table = class.answer.table_plan();
        let Some(plan) = class.answer.plan() else {
            classes.push(ClassEvaluationReport {
                class: class.class.name.clone(),
                aql: class.class.aql,
                plan_letter: table.plan_letter,
                evaluation: None,
                inspect_all: Some(format!(
                    "The plan's sample of {} units reaches the lot of {}: every unit is inspected (100 percent inspection), and there is no OC to evaluate.",
                    table.stages.max_sample(),
                    lot_size
                )),
            });
            continue;
        };
        let staged = plan
            .plan_for(model)
            .map_err(|e| InputError::Inconsistent(e.to_string()))?;
        let mut at = qualities.to_vec();
        if at.is_empty() {
            at = default_qualities(&staged, model, None);
            let aql = class.class.aql.quality();
            if !at.iter().any(|q| (q - aql).abs() <= 1e-12 * aql) {
                at.push(aql);
                at.sort_by(f64::total_cmp);
            }
        }
        let evaluation = if decided_at {
            evaluate_with_decided(&staged, model, &at)?
        } else {
            evaluate(&staged, model, &at)?
        };
        classes.push(ClassEvaluationReport {
            class: class.class.name.clone(),
            aql: class.class.aql,
            plan_letter: plan.plan_letter,
            evaluation: Some(EvaluationReport::from(&evaluation)),
            inspect_all: None,
        });
    }
    let report = StandardEvaluationReport {
        severity: request.request.severity(),
        code_letter: plans.code_letter,
        classes,
        accepted_recorded: accepted,
    };
    report.check()?;
    Ok(report)
}

/// `source` used on lots of `lot_size` units: a source that gives no lot
/// size takes this one; one that gives a lot size keeps it, and a second
/// one is refused, since the plan was agreed for that lot.
fn in_lot(
    mut source: PlanSource,
    path: &Path,
    lot_size: Option<u64>,
) -> Result<PlanSource, SourceError> {
    match (lot_size, source.lot_size) {
        (None, _) => {}
        (Some(n), None) => source.lot_size = Some(n),
        (Some(n), Some(own)) => {
            return Err(SourceError::Invalid {
                path: path.to_path_buf(),
                source: InputError::Inconsistent(format!(
                    "--lot-size {n} is for a source that gives no lot size, and this one gives lot_size: {own}, the lot its plan was agreed for; to evaluate the plan in another lot, design it for that lot"
                )),
            });
        }
    }
    Ok(source)
}
