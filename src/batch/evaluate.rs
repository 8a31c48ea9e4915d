//! Evaluating the plan a source records: the attributes or variables
//! report that `evaluate FILE.yaml` prints, for one source or many.

use std::path::Path;

use crate::error::{Error, InputError, SourceError};
use crate::plan::{default_qualities, evaluate, evaluate_variables, variables_qualities};
use crate::report::{EvaluationReport, SourceEvaluation, VariablesEvaluationReport};
use crate::source::PlanSource;

/// The evaluation of the plan recorded in the source at `path`, at
/// `qualities`, or, when `qualities` is empty, at the default qualities of
/// its kind of plan: eight levels bracketing the risk points
/// ([`default_qualities`], [`variables_qualities`]).
///
/// `lot_size` is the size of the lots the plan is used on, for a source
/// that gives none (`evaluate FILE --lot-size N`): the source's model is
/// kept, and the lot gives AOQ its factor `(N - n)/N` and ATI its 100%
/// inspection of rejected lots.
///
/// # Errors
/// [`SourceError`] when the file cannot be read, parsed or validated, or
/// records no plan, or when `lot_size` is given for a source that has one;
/// [`Error::Input`] for a quality outside the model's range;
/// [`Error::Numerical`] when a computed measure is out of its range.
///
/// ```
/// use lotsman::{SourceEvaluation, evaluate_source};
/// let fit = std::path::Path::new("plans/tpw-cover-fit.yaml");
/// let e = evaluate_source(fit, &[0.01], None).unwrap();
/// let SourceEvaluation::Attributes(report) = e else { panic!("an attributes plan") };
/// assert_eq!(report.points.len(), 1);
/// ```
pub fn evaluate_source(
    path: &Path,
    qualities: &[f64],
    lot_size: Option<u64>,
) -> Result<SourceEvaluation, Error> {
    let source = in_lot(PlanSource::load(path)?, path, lot_size)?;
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
    let evaluation = evaluate(&plan, &request.model, at)?;
    let report = EvaluationReport::from(&evaluation);
    report.check()?;
    Ok(SourceEvaluation::Attributes(report))
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
