//! Evaluating the plan a source records: the attributes or variables
//! report that `evaluate FILE.yaml` prints, for one source or many.

use std::path::Path;

use crate::error::{Error, SourceError};
use crate::plan::{default_qualities, evaluate, evaluate_variables, variables_qualities};
use crate::report::{EvaluationReport, SourceEvaluation, VariablesEvaluationReport};
use crate::source::Audited;

/// The evaluation of the plan recorded in the source at `path`, at
/// `qualities`, or, when `qualities` is empty, at the default qualities of
/// its kind of plan: eight levels bracketing the risk points (for a
/// minimum-inspection plan, the process average and the LTPD)
/// ([`default_qualities`], [`variables_qualities`]).
///
/// The source is read once and audited first ([`Audited::load`]): a
/// recorded plan that a re-solve and its recorded risk points do not
/// confirm is refused, or with `accept_recorded` evaluated as recorded,
/// the report then stating the discrepancy (`accepted_recorded`).
///
/// # Errors
/// [`SourceError`] when the file cannot be read, parsed or validated,
/// records no plan, or records one the audit does not confirm (without
/// `accept_recorded`); [`Error::Input`] for a quality outside the model's
/// range; [`Error::Numerical`] when a computed measure is out of its range.
///
/// ```
/// use lotsman::{SourceEvaluation, evaluate_source};
/// let path = std::path::Path::new("plans/tpw-cover-fit.yaml");
/// let e = evaluate_source(path, &[0.01], false).unwrap();
/// let SourceEvaluation::Attributes(report) = e else { panic!("an attributes plan") };
/// assert_eq!(report.points.len(), 1);
/// assert_eq!(report.accepted_recorded, None);
/// ```
pub fn evaluate_source(
    path: &Path,
    qualities: &[f64],
    accept_recorded: bool,
) -> Result<SourceEvaluation, Error> {
    let Audited {
        source, accepted, ..
    } = Audited::load(path, accept_recorded)?;
    let accepted = accepted.map(|d| d.to_string());
    let invalid = |e| SourceError::Invalid {
        path: path.to_path_buf(),
        source: e,
    };
    if source.is_variables() {
        let request = source.variables_request().map_err(invalid)?;
        let plan = source
            .recorded_variables_plan(request.spec())
            .map_err(invalid)?;
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
    let evaluation = evaluate(&plan, &model, at)?;
    let report = EvaluationReport {
        accepted_recorded: accepted,
        ..EvaluationReport::from(&evaluation)
    };
    report.check()?;
    Ok(SourceEvaluation::Attributes(report))
}
