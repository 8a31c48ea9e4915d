//! Verification: re-solve a source from its risk points and compare with the
//! plan it records.

use serde::Serialize;

use super::PlanSource;
use crate::design::design_for;
use crate::error::Error;

/// Relative tolerance for recorded achieved risks. The plan numbers must
/// match exactly; the risks are printed with 17 significant digits, so a
/// difference above `1e-9` (relative) means the model, not the printing,
/// changed.
pub const RISK_TOLERANCE: f64 = 1e-9;

/// One field whose recorded value differs from the re-solved one.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Difference {
    /// The field, e.g. `plan.stages[0].n`.
    pub field: String,
    /// As recorded in the source.
    pub recorded: String,
    /// As re-solved now.
    pub resolved: String,
}

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
/// [`Error`] when the source's inputs are invalid or its risk points have
/// no plan (the source is then invalid, not a mismatch).
pub fn verify(source: &PlanSource) -> Result<Verdict, Error> {
    let design = design_for(&source.request()?)?;
    let Some(recorded) = &source.plan else {
        return Ok(Verdict::Mismatch(vec![Difference {
            field: "plan".into(),
            recorded: "(none)".into(),
            resolved: design.plan.to_string(),
        }]));
    };
    let mut diffs = Vec::new();
    let resolved = design.plan.stages();
    if recorded.stages.len() != resolved.len() {
        diffs.push(Difference {
            field: "plan.stages".into(),
            recorded: format!("{} stages", recorded.stages.len()),
            resolved: format!("{} stages", resolved.len()),
        });
    }
    for (i, (r, s)) in recorded.stages.iter().zip(resolved).enumerate() {
        let opt = |a: Option<u64>| a.map_or("none".to_string(), |v| v.to_string());
        for (name, a, b) in [
            ("n", r.n.to_string(), s.n.to_string()),
            ("accept", opt(r.accept), opt(s.accept)),
            ("reject", r.reject.to_string(), s.reject.to_string()),
        ] {
            if a != b {
                diffs.push(Difference {
                    field: format!("plan.stages[{i}].{name}"),
                    recorded: a,
                    resolved: b,
                });
            }
        }
    }
    for (name, a, b) in [
        (
            "plan.producer_risk",
            recorded.producer_risk,
            design.producer_risk,
        ),
        (
            "plan.consumer_risk",
            recorded.consumer_risk,
            design.consumer_risk,
        ),
    ] {
        if (a - b).abs() > RISK_TOLERANCE * b.abs().max(f64::MIN_POSITIVE) {
            diffs.push(Difference {
                field: name.into(),
                recorded: a.to_string(),
                resolved: b.to_string(),
            });
        }
    }
    Ok(if diffs.is_empty() {
        Verdict::Match
    } else {
        Verdict::Mismatch(diffs)
    })
}
