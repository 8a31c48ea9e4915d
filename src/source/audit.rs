//! The audit of a recorded plan before it is printed: does it still meet the
//! risk points recorded beside it, and is it the plan a re-solve of those
//! points gives (the comparison of [`verify`](crate::verify))? A sheet states a plan as the
//! agreement, so a plan edited by hand, or solved by a tool that has since
//! changed, must not reach one unnoticed.

use std::path::Path;

use super::discrepancy::{Difference, Discrepancy, UnmetPoint};
use super::error::{Error, SourceError};
use super::schema::PlanSource;
use super::text::SourceText;
use super::verify::{RISK_TOLERANCE, Verdict, verify_at};
use crate::design::{Design, Protection, RectifyingPlan, VariablesRequest};
use crate::input::InputError;
use crate::model::RiskPair;
use crate::model::{Model, ModelKind};
use crate::numeric::format_quality;
use crate::plan::{StagedPlan, VariablesPlan};

/// What the audit of a source found.
#[derive(Clone, Debug, PartialEq)]
pub struct Audit {
    /// The producer's risk `1 - Pa(p1)` and the consumer's risk `Pa(p2)`
    /// that the recorded plan achieves, computed now from the plan itself
    /// (not copied from the source). For a minimum-inspection plan, the
    /// chance of rejecting a lot at the process average and `Pa` at the
    /// LTPD (for an AOQL protection, at the plan's own LTPD, where `Pa`
    /// falls to 0.10). For a standard-indexed plan, those of the first
    /// class's plan at the severity in force at its AQL and at the
    /// consumer's quality (without one, where `Pa` falls to 0.10); both 0
    /// when it inspects every unit.
    pub achieved: (f64, f64),
    /// What is wrong with the recorded plan; `None` when it is confirmed.
    pub discrepancy: Option<Discrepancy>,
}

/// Audits the plan that `source` (read from `path`) records: computes the
/// risks it achieves at the recorded points, and re-solves the points as
/// [`verify`](crate::verify) does.
///
/// A risk counts as unmet when it exceeds the agreed one by more than
/// [`RISK_TOLERANCE`] (relative), the tolerance `verify` allows recorded
/// risks.
///
/// ```
/// use lotsman::{PlanSource, audit};
/// let path = std::path::Path::new("plans/tpw-seal-visual.yaml");
/// let mut source = PlanSource::load(path).unwrap();
/// assert_eq!(audit(&source, path).unwrap().discrepancy, None);
/// source.plan.as_mut().unwrap().stages[0].n = 120;
/// let found = audit(&source, path).unwrap().discrepancy.unwrap();
/// assert_eq!(found.differences[0].field, "stage 1 n");
/// assert_eq!(found.unmet[0].party, "consumer's");
/// ```
///
/// # Errors
/// [`SourceError::Invalid`] (naming `path`) when the source's inputs are
/// invalid or it records no valid plan; [`SourceError::Design`] when its
/// risk points have no plan.
pub fn audit(source: &PlanSource, path: &Path) -> Result<Audit, Error> {
    let invalid = |e| SourceError::Invalid {
        path: path.to_path_buf(),
        source: e,
    };
    if source.is_standard() {
        // A table plan is agreed by its index, not by risk points: only
        // the comparison with the tables can fail.
        let differences = differences(source, path)?;
        let achieved = source.standard_achieved().map_err(invalid)?;
        return Ok(Audit {
            achieved,
            discrepancy: (!differences.is_empty()).then_some(Discrepancy {
                differences,
                unmet: Vec::new(),
            }),
        });
    }
    if source.is_rectifying() {
        let differences = differences(source, path)?;
        let (achieved, unmet) = rectifying_unmet(source).map_err(invalid)?;
        let discrepancy = (!differences.is_empty() || !unmet.is_empty())
            .then_some(Discrepancy { differences, unmet });
        return Ok(Audit {
            achieved,
            discrepancy,
        });
    }
    let (risks, achieved, per_unit) = if source.is_variables() {
        let request = source.variables_request().map_err(invalid)?;
        let plan = source.recorded_variables_plan(&request).map_err(invalid)?;
        (
            *request.risks(),
            variables_risks(&plan, request.risks()),
            false,
        )
    } else {
        let request = source.request().map_err(invalid)?;
        let plan = source.recorded_plan(&request.model).map_err(invalid)?;
        (
            request.risks,
            attributes_risks(&plan, &request.model, &request.risks),
            request.model.kind() == ModelKind::Poisson,
        )
    };
    let differences = differences(source, path)?;
    let points = [
        ("producer's", "alpha", risks.producer(), achieved.0),
        ("consumer's", "beta", risks.consumer(), achieved.1),
    ];
    let unmet: Vec<UnmetPoint> = points
        .into_iter()
        .filter(|(_, _, point, risk)| risk.is_nan() || *risk > point.risk * (1.0 + RISK_TOLERANCE))
        .map(|(party, risk_name, point, risk)| UnmetPoint {
            party,
            quality: format_quality(point.quality, per_unit),
            risk_name,
            agreed: point.risk,
            achieved: risk,
            per_unit,
        })
        .collect();
    let discrepancy = (!differences.is_empty() || !unmet.is_empty())
        .then_some(Discrepancy { differences, unmet });
    Ok(Audit {
        achieved,
        discrepancy,
    })
}

/// A source read once and audited, as the commands that use its recorded
/// plan (`sheet`, `judge`, `evaluate`) take it: the text (which a sheet
/// hashes), the parsed source, and the discrepancy it is used with at the
/// user's request (`--accept-recorded`), if any.
#[derive(Clone, Debug)]
pub struct Audited {
    /// The source's text as read.
    pub text: String,
    /// The parsed source.
    pub source: PlanSource,
    /// What the audit found, when the plan is used as recorded although
    /// the audit does not confirm it; `None` when it is confirmed.
    pub accepted: Option<Discrepancy>,
}

impl Audited {
    /// Reads the source at `path` once, parses it and [`audit`]s its
    /// recorded plan. A plan the audit does not confirm is refused, unless
    /// `accept_recorded` is set: it is then kept with its discrepancy, for
    /// the caller to state in its output.
    ///
    /// ```
    /// use lotsman::Audited;
    /// let path = std::path::Path::new("plans/tpw-seal-visual.yaml");
    /// let audited = Audited::load(path, false).unwrap();
    /// assert_eq!(audited.accepted, None);
    /// ```
    ///
    /// # Errors
    /// As [`PlanSource::load`] and [`audit`];
    /// [`SourceError::Unconfirmed`], naming the first differing field with
    /// both values, when the audit finds a discrepancy and
    /// `accept_recorded` is off.
    pub fn load(path: &Path, accept_recorded: bool) -> Result<Self, Error> {
        Self::load_checked(path, accept_recorded, |_| Ok(()))
    }

    /// [`Audited::load`], with `check` run on the parsed source before the
    /// audit's re-solve: the caller's work-budget check, so that a source
    /// whose work passes the budget is refused before any of it is done.
    ///
    /// # Errors
    /// As [`Audited::load`], and whatever `check` returns.
    pub fn load_checked(
        path: &Path,
        accept_recorded: bool,
        check: impl FnOnce(&PlanSource) -> Result<(), Error>,
    ) -> Result<Self, Error> {
        Self::from_text(SourceText::read(path)?, accept_recorded, check)
    }

    /// [`Audited::load_checked`] of a source already read: parses it, runs
    /// `check` on it and audits it, without reading the file again.
    ///
    /// ```
    /// use lotsman::{Audited, SourceText};
    /// let read = SourceText::read(std::path::Path::new("plans/tpw-seal-visual.yaml")).unwrap();
    /// let audited = Audited::from_text(read, false, |_| Ok(())).unwrap();
    /// assert_eq!(audited.accepted, None);
    /// ```
    ///
    /// # Errors
    /// As [`Audited::load_checked`], but for reading the file.
    pub fn from_text(
        read: SourceText,
        accept_recorded: bool,
        check: impl FnOnce(&PlanSource) -> Result<(), Error>,
    ) -> Result<Self, Error> {
        let source = read.parse()?;
        check(&source)?;
        let SourceText { path, text } = read;
        let accepted = audit(&source, &path)?.discrepancy;
        match accepted {
            Some(discrepancy) if !accept_recorded => {
                Err(SourceError::Unconfirmed { path, discrepancy }.into())
            }
            accepted => Ok(Audited {
                text,
                source,
                accepted,
            }),
        }
    }
}

impl PlanSource {
    /// Loads and audits a source that must record a staged plan
    /// ([`Audited::load`]): an attributes plan designed from two risk
    /// points, or a minimum-inspection plan. Returns it with its model and
    /// its validated plan: what `judge FILE --found K` starts from.
    ///
    /// # Errors
    /// As [`Audited::load_checked`] (`check` runs on the parsed source before
    /// the audit); [`SourceError::Invalid`] when the source records no plan
    /// or an invalid one.
    pub fn load_with_plan(
        path: &Path,
        accept_recorded: bool,
        check: impl FnOnce(&PlanSource) -> Result<(), Error>,
    ) -> Result<(Audited, Model, StagedPlan), Error> {
        let audited = Audited::load_checked(path, accept_recorded, check)?;
        let invalid = |e| SourceError::Invalid {
            path: path.to_path_buf(),
            source: e,
        };
        let model = audited.source.staged_model().map_err(invalid)?;
        let plan = audited.source.recorded_plan(&model).map_err(invalid)?;
        Ok((audited, model, plan))
    }

    /// Loads and audits a variables source that must record a plan
    /// ([`Audited::load`]), with its request and validated plan: what
    /// `evaluate FILE` and `judge FILE` start from.
    ///
    /// # Errors
    /// As [`Audited::load_checked`] (`check` runs on the parsed source before
    /// the audit); [`SourceError::Invalid`] when the source records no plan
    /// or an invalid one.
    pub fn load_with_variables_plan(
        path: &Path,
        accept_recorded: bool,
        check: impl FnOnce(&PlanSource) -> Result<(), Error>,
    ) -> Result<(Audited, VariablesRequest, VariablesPlan), Error> {
        let audited = Audited::load_checked(path, accept_recorded, check)?;
        let invalid = |e| SourceError::Invalid {
            path: path.to_path_buf(),
            source: e,
        };
        let request = audited.source.variables_request().map_err(invalid)?;
        let plan = audited
            .source
            .recorded_variables_plan(&request)
            .map_err(invalid)?;
        Ok((audited, request, plan))
    }
}

/// The fields in which `source` (read from `path`) differs from a
/// re-solve, as [`verify`](crate::verify) names them.
fn differences(source: &PlanSource, path: &Path) -> Result<Vec<Difference>, Error> {
    match verify_at(source, path) {
        Ok(Verdict::Match) => Ok(Vec::new()),
        Ok(Verdict::Mismatch(d)) => Ok(d),
        Err(Error::Input(e)) => Err(SourceError::Invalid {
            path: path.to_path_buf(),
            source: e,
        }
        .into()),
        Err(Error::Design(e)) => Err(SourceError::Design {
            path: path.to_path_buf(),
            source: e,
        }
        .into()),
        Err(e) => Err(e),
    }
}

/// What the plan a minimum-inspection source records achieves (see
/// [`Audit::achieved`]), and the protection it does not give: `Pa` at the
/// LTPD above beta, or an AOQL above the agreed one, beyond
/// [`RISK_TOLERANCE`].
fn rectifying_unmet(source: &PlanSource) -> Result<((f64, f64), Vec<UnmetPoint>), InputError> {
    let request = source.rectifying_request()?;
    let plan = source.recorded_plan(request.model())?;
    let figures = RectifyingPlan::new(plan, &request);
    let per_unit = request.model().kind() == ModelKind::Poisson;
    let at_ltpd = figures.pa_at_ltpd.unwrap_or_else(|| request.ltpd_risk());
    let achieved = (1.0 - figures.pa, at_ltpd);
    let above = |got: f64, agreed: f64| got.is_nan() || got > agreed * (1.0 + RISK_TOLERANCE);
    let unmet = match request.protection() {
        Protection::Ltpd(point) if above(at_ltpd, point.risk) => vec![UnmetPoint {
            party: "consumer's",
            quality: format_quality(point.quality, per_unit),
            risk_name: "beta",
            agreed: point.risk,
            achieved: at_ltpd,
            per_unit,
        }],
        Protection::Aoql(limit) if above(figures.aoql.value, limit) => vec![UnmetPoint {
            party: "consumer's",
            quality: format_quality(limit, per_unit),
            risk_name: "AOQL",
            agreed: limit,
            achieved: figures.aoql.value,
            per_unit,
        }],
        _ => Vec::new(),
    };
    Ok((achieved, unmet))
}

/// The producer's and consumer's risks of an attributes plan at the
/// points, by the exact recursion every designer reports them with.
pub(crate) fn attributes_risks(plan: &StagedPlan, model: &Model, risks: &RiskPair) -> (f64, f64) {
    let d = Design::exact(plan.clone(), model, risks);
    (d.producer_risk, d.consumer_risk)
}

/// The producer's and consumer's risks of a variables plan at the points,
/// each at the split of the nonconforming between two limits that is worse
/// for that party (as the designer holds them).
pub(crate) fn variables_risks(plan: &VariablesPlan, risks: &RiskPair) -> (f64, f64) {
    plan.achieved_risks(risks.producer().quality, risks.consumer().quality)
}
