//! Verification: re-solve a source from its risk points and compare with the
//! plan it records.

use std::path::Path;

use super::discrepancy::Difference;
use super::error::{Error, not_solved};
use super::schema::{PlanSource, RecordedPlan, RecordedVariables};
use super::standard::standard_differences;
use crate::design::{RectifyingPlan, design_for, design_rectifying};
use crate::plan::{SequentialLines, Stage};

/// Relative tolerance for recorded achieved risks. The plan numbers must
/// match exactly; the risks are printed with 17 significant digits, so a
/// difference above `1e-9` (relative) means the model, not the printing,
/// changed.
pub const RISK_TOLERANCE: f64 = 1e-9;

/// The result of verifying one source.
#[derive(Clone, Debug, PartialEq)]
pub enum Verdict {
    /// The recorded plan is the plan the risk points give.
    Match,
    /// Recorded and re-solved differ in these fields.
    Mismatch(Vec<Difference>),
}

/// Re-solves `source` and compares the result with its recorded plan.
///
/// # Errors
/// [`Error`] when the source's inputs are invalid, it records no plan
/// ([`InputError::NotSolved`](crate::InputError::NotSolved)), or its risk
/// points have no plan (the source is then invalid, not a mismatch).
///
/// # Example
/// Each demo source records the plan its risk points give:
/// ```
/// use std::path::Path;
/// use lotsman::{DEMO_PLANS, PlanSource, Verdict, verify};
/// let (name, text) = DEMO_PLANS[0];
/// let source = PlanSource::from_yaml(text, Path::new(name)).unwrap();
/// assert_eq!(verify(&source).unwrap(), Verdict::Match);
/// ```
pub fn verify(source: &PlanSource) -> Result<Verdict, Error> {
    verify_in(source, None)
}

/// [`verify`] of the source read from the file at `path`: a
/// standard-indexed source's own tables (`standard.tables`) are read from
/// beside it and checked by their SHA-256 before its plans are read from
/// them again.
///
/// ```
/// use lotsman::{PlanSource, Verdict, template, verify_at};
/// let path = std::path::Path::new("s.yaml");
/// let mut source = PlanSource::from_yaml(template("standard").unwrap(), path).unwrap();
/// source.record_standard_at(path).unwrap();
/// assert_eq!(verify_at(&source, path).unwrap(), Verdict::Match);
/// source.plan.as_mut().unwrap().classes[1].normal.stages[0].accept = Some(2);
/// let Verdict::Mismatch(d) = verify_at(&source, path).unwrap() else { panic!("a mismatch") };
/// assert_eq!(d[0].field, "class major, normal, stage 1 accept");
/// ```
///
/// # Errors
/// As [`verify`]; [`Error::Source`](crate::Error::Source) for a user table
/// that is missing, has changed since the plans were recorded, or is not
/// a table.
pub fn verify_at(source: &PlanSource, path: &Path) -> Result<Verdict, Error> {
    verify_in(source, Some(path))
}

fn verify_in(source: &PlanSource, path: Option<&Path>) -> Result<Verdict, Error> {
    if source.is_standard() {
        return Ok(verdict(standard_differences(source, path)?));
    }
    if source.is_variables() {
        return verify_variables(source);
    }
    if source.is_rectifying() {
        return verify_rectifying(source);
    }
    let request = source.request()?;
    // A source that records no plan is not solved yet: invalid, not a
    // mismatch, and refused before the work of a re-solve.
    let recorded = source.plan.as_ref().ok_or_else(not_solved)?;
    let design = design_for(&request)?;
    let mut diffs = Vec::new();
    match (&recorded.sequential, design.plan.sequential_lines()) {
        (Some(r), Some(s)) => compare_lines(r, s, &mut diffs),
        (None, None) => compare_stages(&recorded.stages, design.plan.stages(), &mut diffs),
        (r, s) => diffs.push(Difference {
            field: "plan".into(),
            recorded: if r.is_some() {
                "sequential lines"
            } else {
                "stages"
            }
            .into(),
            resolved: if s.is_some() {
                "sequential lines"
            } else {
                "stages"
            }
            .into(),
        }),
    }
    compare_risks(
        recorded,
        (design.producer_risk, design.consumer_risk),
        &mut diffs,
    );
    Ok(verdict(diffs))
}

/// A minimum-inspection source: re-solved by [`design_rectifying`], the
/// stages must match exactly, the ATI, AOQL and (with an LTPD) `Pa` at the
/// LTPD within [`RISK_TOLERANCE`]. A re-solve that answers 100%
/// inspection differs in `plan`.
fn verify_rectifying(source: &PlanSource) -> Result<Verdict, Error> {
    let request = source.rectifying_request()?;
    // Not solved yet: invalid, not a mismatch (as for the other schemes).
    if source.plan.is_none() {
        return Err(not_solved().into());
    }
    let design = design_rectifying(&request)?;
    let resolved = |plan: Option<&RectifyingPlan>| {
        plan.map_or("inspect every unit (100%)".to_string(), |p| {
            p.plan.to_string()
        })
    };
    let (Some(recorded), Some(chosen)) = (&source.plan, &design.plan) else {
        return Ok(match (&source.plan, &design.plan) {
            (None, None) => Verdict::Match,
            (recorded, _) => Verdict::Mismatch(vec![Difference {
                field: "plan".into(),
                recorded: if recorded.is_some() {
                    "a sampling plan"
                } else {
                    "(none)"
                }
                .into(),
                resolved: resolved(design.plan.as_ref()),
            }]),
        });
    };
    let mut diffs = Vec::new();
    compare_stages(&recorded.stages, chosen.plan.stages(), &mut diffs);
    compare_figures(
        &[
            (
                "plan.consumer_risk",
                recorded.consumer_risk,
                chosen.pa_at_ltpd,
            ),
            ("plan.ati", recorded.ati, Some(chosen.ati)),
            ("plan.aoql", recorded.aoql, Some(chosen.aoql.value)),
        ],
        &mut diffs,
    );
    Ok(verdict(diffs))
}

/// A variables source: `n` and the constant must match exactly (they are
/// rounded decimals chosen by the same rule), the risks within
/// [`RISK_TOLERANCE`].
fn verify_variables(source: &PlanSource) -> Result<Verdict, Error> {
    let request = source.variables_request()?;
    let recorded = source.plan.as_ref().ok_or_else(not_solved)?;
    let design = request.design()?;
    let plan = &design.plan;
    let resolved = RecordedVariables {
        n: plan.n(),
        k: plan.k(),
        m: plan.m(),
    };
    let Some(numbers) = recorded.variables else {
        return Ok(Verdict::Mismatch(vec![Difference {
            field: "plan.variables".into(),
            recorded: "(none)".into(),
            resolved: plan.to_string(),
        }]));
    };
    let mut diffs = Vec::new();
    let opt = |a: Option<f64>| a.map_or("none".to_string(), |v| v.to_string());
    for (name, a, b) in [
        ("n", numbers.n.to_string(), resolved.n.to_string()),
        ("k", opt(numbers.k), opt(resolved.k)),
        ("m", opt(numbers.m), opt(resolved.m)),
    ] {
        if a != b {
            diffs.push(Difference {
                field: format!("plan.variables.{name}"),
                recorded: a,
                resolved: b,
            });
        }
    }
    compare_risks(
        recorded,
        (design.producer_risk, design.consumer_risk),
        &mut diffs,
    );
    Ok(verdict(diffs))
}

fn verdict(diffs: Vec<Difference>) -> Verdict {
    if diffs.is_empty() {
        Verdict::Match
    } else {
        Verdict::Mismatch(diffs)
    }
}

fn compare_risks(recorded: &RecordedPlan, resolved: (f64, f64), diffs: &mut Vec<Difference>) {
    compare_figures(
        &[
            (
                "plan.producer_risk",
                recorded.producer_risk,
                Some(resolved.0),
            ),
            (
                "plan.consumer_risk",
                recorded.consumer_risk,
                Some(resolved.1),
            ),
        ],
        diffs,
    );
}

/// Compares recorded figures `(field, recorded, re-solved)` within
/// [`RISK_TOLERANCE`] (relative); a figure present on one side only is a
/// difference too.
fn compare_figures(figures: &[(&str, Option<f64>, Option<f64>)], diffs: &mut Vec<Difference>) {
    let shown = |v: Option<f64>| v.map_or("(none)".to_string(), |v| v.to_string());
    for &(name, a, b) in figures {
        let agree = match (a, b) {
            // Written so that a recorded NaN or infinity is a difference too.
            (Some(a), Some(b)) => (a - b).abs() <= RISK_TOLERANCE * b.abs().max(f64::MIN_POSITIVE),
            (None, None) => true,
            _ => false,
        };
        if !agree {
            diffs.push(Difference {
                field: name.into(),
                recorded: shown(a),
                resolved: shown(b),
            });
        }
    }
}

/// The name of the field `key` of the recorded plan's stage `index`
/// (counted from 0 in the file's list, from 1 in every message, table and
/// report): `stage 1 n`, `stage 2 accept`.
pub(crate) fn stage_field(index: usize, key: &str) -> String {
    format!("stage {} {key}", index + 1)
}

fn compare_stages(recorded: &[Stage], resolved: &[Stage], diffs: &mut Vec<Difference>) {
    if recorded.len() != resolved.len() {
        diffs.push(Difference {
            field: "number of stages".into(),
            recorded: format!("{} stages", recorded.len()),
            resolved: format!("{} stages", resolved.len()),
        });
    }
    for (i, (r, s)) in recorded.iter().zip(resolved).enumerate() {
        let opt = |a: Option<u64>| a.map_or("none".to_string(), |v| v.to_string());
        for (name, a, b) in [
            ("n", r.n.to_string(), s.n.to_string()),
            ("accept", opt(r.accept), opt(s.accept)),
            ("reject", r.reject.to_string(), s.reject.to_string()),
        ] {
            if a != b {
                diffs.push(Difference {
                    field: stage_field(i, name),
                    recorded: a,
                    resolved: b,
                });
            }
        }
    }
}

/// The lines are formed by the same operations on every machine, so they
/// must agree to the last bit; the truncation and final number exactly.
fn compare_lines(r: &SequentialLines, s: &SequentialLines, diffs: &mut Vec<Difference>) {
    for (name, a, b) in [
        ("h_accept", r.h_accept, s.h_accept),
        ("h_reject", r.h_reject, s.h_reject),
        ("slope", r.slope, s.slope),
    ] {
        if a != b {
            diffs.push(Difference {
                field: format!("plan.sequential.{name}"),
                recorded: a.to_string(),
                resolved: b.to_string(),
            });
        }
    }
    for (name, a, b) in [
        ("truncation", r.truncation, s.truncation),
        ("final_acceptance", r.final_acceptance, s.final_acceptance),
    ] {
        if a != b {
            diffs.push(Difference {
                field: format!("plan.sequential.{name}"),
                recorded: a.to_string(),
                resolved: b.to_string(),
            });
        }
    }
}
