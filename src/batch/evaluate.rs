//! Evaluating the plan a source records: the attributes or variables
//! report that `evaluate FILE.yaml` prints, for one source or many.

use std::path::Path;

use crate::budget::{SourceJob, check_source};
use crate::error::{Error, InputError, SourceError};
use crate::plan::{
    default_qualities, evaluate, evaluate_variables, evaluate_with_decided, variables_qualities,
};
use crate::report::{EvaluationReport, SourceEvaluation, VariablesEvaluationReport};
use crate::source::PlanSource;

/// The evaluation of the plan recorded in the source at `path`, at
/// `qualities`, or, when `qualities` is empty, at the default qualities of
/// its kind of plan: eight levels bracketing the risk points
/// ([`default_qualities`], [`variables_qualities`]); with `decided_at`, an
/// attributes plan's report holds the per-stage distribution of the
/// stage at which each lot is decided (a variables plan decides on its
/// one sample).
///
/// # Errors
/// [`SourceError`] when the file cannot be read, parsed or validated, or
/// records no plan; [`Error::Input`] for a quality outside the model's
/// range, or an evaluation whose estimated work passes the budget
/// (naming the source); [`Error::Numerical`] when a computed measure is
/// out of its range.
///
/// ```
/// use lotsman::{SourceEvaluation, evaluate_source};
/// let path = std::path::Path::new("plans/tpw-cover-fit.yaml");
/// let e = evaluate_source(path, &[0.01], false).unwrap();
/// let SourceEvaluation::Attributes(report) = e else { panic!("an attributes plan") };
/// assert_eq!(report.points.len(), 1);
/// assert!(report.decided_at.is_none());
/// ```
pub fn evaluate_source(
    path: &Path,
    qualities: &[f64],
    decided_at: bool,
) -> Result<SourceEvaluation, Error> {
    let source = PlanSource::load(path)?;
    let points = (!qualities.is_empty()).then_some(qualities.len());
    check_source(&source, path, SourceJob::Evaluate { points, decided_at })
        .map_err(InputError::from)?;
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
        let report = VariablesEvaluationReport::from(&evaluation);
        report.check()?;
        return Ok(SourceEvaluation::Variables(report));
    }
    let request = source.request().map_err(invalid)?;
    let plan = source.recorded_plan(&request.model).map_err(invalid)?;
    let defaults;
    let at = if qualities.is_empty() {
        defaults = default_qualities(&plan, &request.model, Some(&request.risks));
        &defaults
    } else {
        qualities
    };
    let evaluation = if decided_at {
        evaluate_with_decided(&plan, &request.model, at)?
    } else {
        evaluate(&plan, &request.model, at)?
    };
    let report = EvaluationReport::from(&evaluation);
    report.check()?;
    Ok(SourceEvaluation::Attributes(report))
}
