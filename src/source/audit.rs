//! The audit of a recorded plan before it is printed: does it still meet the
//! risk points recorded beside it, and is it the plan a re-solve of those
//! points gives (the comparison of [`verify`])? A sheet states a plan as the
//! agreement, so a plan edited by hand, or solved by a tool that has since
//! changed, must not reach one unnoticed.

use std::fmt;
use std::path::Path;

use super::{Difference, PlanSource, RISK_TOLERANCE, Verdict, verify};
use crate::design::Design;
use crate::error::{Error, SourceError};
use crate::model::{Model, ModelKind};
use crate::plan::{StagedPlan, VariablesPlan};
use crate::report::{format_quality, format_significant};
use crate::risk::RiskPair;

/// What the audit of a source found.
#[derive(Clone, Debug, PartialEq)]
pub struct Audit {
    /// The producer's risk `1 - Pa(p1)` and the consumer's risk `Pa(p2)`
    /// that the recorded plan achieves, computed now from the plan itself
    /// (not copied from the source).
    pub achieved: (f64, f64),
    /// What is wrong with the recorded plan; `None` when it is confirmed.
    pub discrepancy: Option<Discrepancy>,
}

/// Why a recorded plan is not confirmed: the fields in which it differs
/// from a re-solve, and the risk points it no longer meets. At least one of
/// the two lists is not empty.
///
/// Displayed, it is one line: `recorded plan differs from a re-solve:
/// plan.stages[0].n: recorded 150, re-solved 166; ...`, then each unmet
/// point.
#[derive(Clone, Debug, PartialEq)]
pub struct Discrepancy {
    /// The fields that differ, as [`verify`] names them.
    pub differences: Vec<Difference>,
    /// The agreed risk points the recorded plan does not meet.
    pub unmet: Vec<UnmetPoint>,
}

/// An agreed risk point that a recorded plan does not meet.
#[derive(Clone, Debug, PartialEq)]
pub struct UnmetPoint {
    /// `producer's` or `consumer's`.
    pub party: &'static str,
    /// The point's quality, as reports print it (`4.000%`).
    pub quality: String,
    /// `alpha` or `beta`.
    pub risk_name: &'static str,
    /// The agreed largest risk.
    pub agreed: f64,
    /// The risk the recorded plan achieves.
    pub achieved: f64,
}

impl fmt::Display for UnmetPoint {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "the recorded plan does not meet the {} point: {} at {} is {}, above the agreed {}",
            self.party,
            self.risk_name,
            self.quality,
            format_significant(self.achieved, 4),
            self.agreed
        )
    }
}

impl Discrepancy {
    /// The discrepancy in one line, with at most `fields` of the differing
    /// fields and the number of the others (a sheet has room for a few;
    /// `verify` lists them all).
    ///
    /// ```
    /// use lotsman::{Difference, Discrepancy};
    /// let field = |name: &str| Difference {
    ///     field: name.into(),
    ///     recorded: "1".into(),
    ///     resolved: "2".into(),
    /// };
    /// let d = Discrepancy {
    ///     differences: vec![field("plan.sequential.slope"), field("plan.sequential.truncation")],
    ///     unmet: Vec::new(),
    /// };
    /// assert_eq!(
    ///     d.brief(1),
    ///     "recorded plan differs from a re-solve: plan.sequential.slope: recorded 1, re-solved 2; and 1 more field (lotsman verify lists every one)"
    /// );
    /// assert_eq!(d.brief(2), d.to_string());
    /// ```
    pub fn brief(&self, fields: usize) -> String {
        let mut parts = Vec::new();
        if !self.differences.is_empty() {
            let mut shown: Vec<String> = self
                .differences
                .iter()
                .take(fields)
                .map(|d| d.to_string())
                .collect();
            match self.differences.len().saturating_sub(fields) {
                0 => {}
                1 => shown.push("and 1 more field (lotsman verify lists every one)".into()),
                more => shown.push(format!(
                    "and {more} more fields (lotsman verify lists every one)"
                )),
            }
            parts.push(format!(
                "recorded plan differs from a re-solve: {}",
                shown.join("; ")
            ));
        }
        parts.extend(self.unmet.iter().map(|u| u.to_string()));
        parts.join("; ")
    }
}

impl fmt::Display for Discrepancy {
    /// Every differing field, then every unmet point.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}", self.brief(usize::MAX))
    }
}

/// Audits the plan that `source` (read from `path`) records: computes the
/// risks it achieves at the recorded points, and re-solves the points as
/// [`verify`] does.
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
/// assert_eq!(found.differences[0].field, "plan.stages[0].n");
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
    let differences = match verify(source) {
        Ok(Verdict::Match) => Vec::new(),
        Ok(Verdict::Mismatch(d)) => d,
        Err(Error::Input(e)) => return Err(invalid(e).into()),
        Err(Error::Design(e)) => {
            return Err(SourceError::Design {
                path: path.to_path_buf(),
                source: e,
            }
            .into());
        }
        Err(e) => return Err(e),
    };
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
        })
        .collect();
    let discrepancy = (!differences.is_empty() || !unmet.is_empty())
        .then_some(Discrepancy { differences, unmet });
    Ok(Audit {
        achieved,
        discrepancy,
    })
}

/// The producer's and consumer's risks of an attributes plan at the
/// points, by the exact recursion every designer reports them with.
pub(crate) fn attributes_risks(plan: &StagedPlan, model: &Model, risks: &RiskPair) -> (f64, f64) {
    let d = Design::exact(plan.clone(), model, risks);
    (d.producer_risk, d.consumer_risk)
}

/// The producer's and consumer's risks of a variables plan at the points,
/// each in the configuration that is worse for that party (as the designer
/// holds them).
pub(crate) fn variables_risks(plan: &VariablesPlan, risks: &RiskPair) -> (f64, f64) {
    plan.achieved_risks(risks.producer().quality, risks.consumer().quality)
}
