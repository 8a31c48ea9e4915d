//! Evaluating the plan a source records: the attributes or variables
//! report that `evaluate FILE.yaml` prints, for one source or many.

use std::path::Path;

use crate::error::{Error, SourceError};
use crate::plan::{default_qualities, evaluate, evaluate_variables, variables_qualities};
use crate::report::{EvaluationReport, SourceEvaluation, VariablesEvaluationReport};
use crate::source::PlanSource;

/// The evaluation of the plan recorded in the source at `path`, at
/// `qualities`, or, when `qualities` is empty, at the default qualities of
/// its kind of plan: eight levels bracketing the risk points
/// ([`default_qualities`], [`variables_qualities`]).
///
/// # Errors
/// [`SourceError`] when the file cannot be read, parsed or validated, or
/// records no plan; [`Error::Input`] for a quality outside the model's
/// range; [`Error::Numerical`] when a computed measure is out of its range.
///
/// ```
/// use lotsman::{SourceEvaluation, evaluate_source};
/// let e = evaluate_source(std::path::Path::new("plans/tpw-cover-fit.yaml"), &[0.01]).unwrap();
/// let SourceEvaluation::Attributes(report) = e else { panic!("an attributes plan") };
/// assert_eq!(report.points.len(), 1);
/// ```
pub fn evaluate_source(path: &Path, qualities: &[f64]) -> Result<SourceEvaluation, Error> {
    let source = PlanSource::load(path)?;
    let invalid = |e| SourceError::Invalid {
        path: path.to_path_buf(),
        source: e,
    };
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
    let evaluation = evaluate(&plan, &request.model, at)?;
    let report = EvaluationReport::from(&evaluation);
    report.check()?;
    Ok(SourceEvaluation::Attributes(report))
}
