//! Verifying a standard-indexed source: its plans read again from the
//! tables (the built-in ones, and the user tables it names, found beside
//! it and checked by their SHA-256), and every recorded number compared.
//! A field that differs is named by its class, severity and stage:
//! `class major, tightened, stage 1 accept`.

use std::path::Path;

use super::record::derive_plans;
use super::schema::{RecordedClass, RecordedTablePlan};
use super::tables::{Hashes, read_tables};
use crate::input::InputError;
use crate::source::error::not_solved;
use crate::source::{Difference, Error, PlanSource};
use crate::standard::{Severity, Tables};

/// The fields in which the plans `source` records differ from those its
/// tables give now; `path` is where the source was read from, beside which
/// its user tables are (`None` for a source without a file, which may then
/// name no user table).
///
/// # Errors
/// [`Error::Input`] for an invalid source, one that records no plan, a
/// class without a plan in the tables, or user tables without a path;
/// [`Error::Source`] for a user table that is missing, changed or not a
/// table.
pub(crate) fn standard_differences(
    source: &PlanSource,
    path: Option<&Path>,
) -> Result<Vec<Difference>, Error> {
    let request = source.standard_request()?;
    let recorded = source.plan.as_ref().ok_or_else(not_solved)?;
    let tables = match (path, request.tables.is_empty()) {
        (_, true) => Tables::builtin()
            .map_err(|e| InputError::Inconsistent(e.to_string()))?
            .clone(),
        (Some(path), false) => read_tables(&request, path, Hashes::Checked)?.0,
        (None, false) => {
            return Err(InputError::Inconsistent(
                "the source names its own table files under standard.tables, which are found beside it: verify it from its file".to_string(),
            )
            .into());
        }
    };
    let (letter, classes) = derive_plans(&request, &tables)?;
    let mut diffs = Vec::new();
    let shown = |v: Option<String>| v.unwrap_or_else(|| "(none)".to_string());
    if recorded.code_letter != Some(letter) {
        diffs.push(Difference {
            field: "code_letter".into(),
            recorded: shown(recorded.code_letter.map(|l| l.to_string())),
            resolved: letter.to_string(),
        });
    }
    if !recorded.stages.is_empty() || recorded.sequential.is_some() || recorded.variables.is_some()
    {
        diffs.push(Difference {
            field: "plan".into(),
            recorded: "a plan designed from two risk points".into(),
            resolved: "table plans per class".into(),
        });
    }
    if recorded.classes.len() != classes.len() {
        diffs.push(Difference {
            field: "number of classes".into(),
            recorded: recorded.classes.len().to_string(),
            resolved: classes.len().to_string(),
        });
    }
    for (i, (r, d)) in recorded.classes.iter().zip(&classes).enumerate() {
        compare_class(i, r, d, &mut diffs);
    }
    Ok(diffs)
}

/// The prefix of a class's fields: `class major`, or `AQL 1.0` for the
/// one AQL of a source without classes.
fn class_field(class: &RecordedClass) -> String {
    match &class.name {
        Some(name) => format!("class {name}"),
        None => format!("AQL {}", class.aql),
    }
}

fn compare_class(
    index: usize,
    recorded: &RecordedClass,
    derived: &RecordedClass,
    diffs: &mut Vec<Difference>,
) {
    let opt = |v: &Option<String>| v.clone().unwrap_or_else(|| "(none)".to_string());
    if recorded.name != derived.name {
        diffs.push(Difference {
            field: format!("class {} name", index + 1),
            recorded: opt(&recorded.name),
            resolved: opt(&derived.name),
        });
    }
    let class = class_field(derived);
    if recorded.aql != derived.aql {
        diffs.push(Difference {
            field: format!("{class} aql"),
            recorded: recorded.aql.to_string(),
            resolved: derived.aql.to_string(),
        });
    }
    for severity in Severity::ALL {
        let field = format!("{class}, {severity}");
        match (recorded.at(severity), derived.at(severity)) {
            (Some(r), Some(d)) => compare_plan(&field, r, d, diffs),
            (None, None) => {}
            (r, d) => diffs.push(Difference {
                field,
                recorded: presence(r),
                resolved: presence(d),
            }),
        }
    }
}

/// A plan's presence, in words.
fn presence(plan: Option<&RecordedTablePlan>) -> String {
    match plan {
        Some(p) => format!("a plan at code letter {}", p.plan_letter),
        None => "(none)".to_string(),
    }
}

fn compare_plan(
    field: &str,
    recorded: &RecordedTablePlan,
    derived: &RecordedTablePlan,
    diffs: &mut Vec<Difference>,
) {
    let mut differ = |name: &str, r: String, d: String| {
        if r != d {
            diffs.push(Difference {
                field: format!("{field}, {name}"),
                recorded: r,
                resolved: d,
            });
        }
    };
    differ(
        "plan_letter",
        recorded.plan_letter.to_string(),
        derived.plan_letter.to_string(),
    );
    differ(
        "inspect_all",
        recorded.inspect_all.to_string(),
        derived.inspect_all.to_string(),
    );
    differ(
        "number of stages",
        format!("{} stages", recorded.stages.len()),
        format!("{} stages", derived.stages.len()),
    );
    let opt = |a: Option<u64>| a.map_or("none".to_string(), |v| v.to_string());
    for (i, (r, d)) in recorded.stages.iter().zip(&derived.stages).enumerate() {
        differ(
            &format!("stage {} n", i + 1),
            r.n.to_string(),
            d.n.to_string(),
        );
        differ(
            &format!("stage {} accept", i + 1),
            opt(r.accept),
            opt(d.accept),
        );
        differ(
            &format!("stage {} reject", i + 1),
            r.reject.to_string(),
            d.reject.to_string(),
        );
    }
}
