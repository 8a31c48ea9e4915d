//! Recording a standard-indexed source's plans: for each class, the plan
//! the tables give at each severity (normal, tightened and, unless it is
//! left out, reduced), with the letter of the row where it stands and its
//! stages as the table prints them, so that an auditor reads the exact
//! plans in the source and `verify` can read them again.

use std::path::Path;

use super::request::StandardSourceRequest;
use super::schema::{RecordedClass, RecordedTablePlan};
use super::tables::{Hashes, invalid, read_tables};
use crate::input::InputError;
use crate::source::{PlanSource, RecordedPlan, SourceError, tool_version};
use crate::standard::{ClassPlans, CodeLetter, Severity, StandardAnswer, StandardError, Tables};

/// A refusal of the standard's tables as an input error of the source.
pub(crate) fn plain(e: StandardError) -> InputError {
    match e {
        StandardError::Input(e) => e,
        other => InputError::Inconsistent(other.to_string()),
    }
}

/// The plans of every class at `severity` for `request`, from `tables`.
///
/// # Errors
/// [`InputError`] when a class has no plan there (a cell not transcribed,
/// a cell with nothing printed); on reduced inspection the message adds
/// that reduced inspection can be left out.
pub(crate) fn plans_at(
    request: &StandardSourceRequest,
    tables: &Tables,
    severity: Severity,
) -> Result<ClassPlans, InputError> {
    tables
        .classes_for_lot(
            request.lot_size,
            request.level,
            &request.classes,
            severity,
            request.form,
            request.class_rule,
        )
        .map_err(|e| {
            let reduced = severity == Severity::Reduced
                && matches!(
                    e,
                    StandardError::NotTranscribed { .. } | StandardError::NoPlan { .. }
                );
            let mut e = plain(e);
            if reduced && let InputError::Inconsistent(text) = &mut e {
                text.push_str(
                    "; or, where the contract leaves reduced inspection out, say so with no_reduced: true in the standard section",
                );
            }
            e
        })
}

/// The lot's code letter and each class's plans at every severity
/// `request` records.
///
/// # Errors
/// As [`plans_at`].
pub(crate) fn derive_plans(
    request: &StandardSourceRequest,
    tables: &Tables,
) -> Result<(CodeLetter, Vec<RecordedClass>), InputError> {
    let normal = plans_at(request, tables, Severity::Normal)?;
    let tightened = plans_at(request, tables, Severity::Tightened)?;
    let reduced = if request.no_reduced {
        None
    } else {
        Some(plans_at(request, tables, Severity::Reduced)?)
    };
    let reduced = |i: usize| {
        reduced
            .as_ref()
            .and_then(|r| r.classes.get(i))
            .map(|c| recorded(&c.answer))
    };
    let classes = request
        .classes
        .iter()
        .zip(normal.classes.iter().zip(&tightened.classes))
        .enumerate()
        .map(|(i, (class, (n, t)))| RecordedClass {
            name: class.name.clone(),
            aql: class.aql,
            normal: recorded(&n.answer),
            tightened: recorded(&t.answer),
            reduced: reduced(i),
        })
        .collect();
    Ok((normal.code_letter, classes))
}

/// A table answer as recorded.
fn recorded(answer: &StandardAnswer) -> RecordedTablePlan {
    let plan = answer.table_plan();
    RecordedTablePlan {
        plan_letter: plan.plan_letter,
        stages: plan.table_numbers.clone(),
        inspect_all: matches!(answer, StandardAnswer::InspectAll(_)),
    }
}

impl PlanSource {
    /// Records the table plans of this standard-indexed source, read from
    /// `tables`, which must hold exactly the user tables the source names
    /// (by file and SHA-256): the lot's code letter and, for each class,
    /// its plan at normal, tightened and (unless left out) reduced
    /// inspection, recorded by this tool version.
    ///
    /// # Errors
    /// As [`PlanSource::standard_request`]; [`InputError`] when `tables`
    /// does not hold the source's user tables, or a class has no plan at a
    /// severity (a cell not transcribed, nothing printed).
    pub fn record_standard(&mut self, tables: &Tables) -> Result<(), InputError> {
        let request = self.standard_request()?;
        let users = tables.user_tables();
        let named = request.tables.iter().all(|t| {
            users
                .iter()
                .any(|(_, file, sha)| *file == t.file && *sha == t.sha256)
        });
        if !named || users.len() != request.tables.len() {
            return Err(InputError::Inconsistent(format!(
                "the tables to read the plans from hold the user tables {}, and the source names {} under standard.tables: read them with the source's own tables",
                listed(users.iter().map(|(_, f, _)| f.as_str())),
                listed(request.tables.iter().map(|t| t.file.as_str()))
            )));
        }
        let (letter, classes) = derive_plans(&request, tables)?;
        self.plan = Some(RecordedPlan {
            stages: Vec::new(),
            sequential: None,
            variables: None,
            code_letter: Some(letter),
            classes,
            producer_risk: None,
            consumer_risk: None,
            ati: None,
            aoql: None,
            solved_by: tool_version(),
        });
        Ok(())
    }

    /// Records the table plans of the standard-indexed source read from
    /// `path` ([`PlanSource::record_standard`]), reading its user tables
    /// from beside it as they are now and recording their SHA-256 anew:
    /// what `design FILE --in-place` does with such a source.
    ///
    /// # Errors
    /// [`SourceError::Invalid`] naming the source, as
    /// [`PlanSource::standard_tables`] (but for a changed hash, which is
    /// recorded) and [`PlanSource::record_standard`].
    pub fn record_standard_at(&mut self, path: &Path) -> Result<(), SourceError> {
        let request = self.standard_request().map_err(|e| invalid(path, e))?;
        let (tables, records) = read_tables(&request, path, Hashes::Renewed)?;
        if let Some(s) = self.standard.as_mut() {
            s.tables = records;
        }
        self.record_standard(&tables).map_err(|e| invalid(path, e))
    }
}

/// `a, b` or `none`.
fn listed<'a>(files: impl Iterator<Item = &'a str>) -> String {
    let all: Vec<&str> = files.collect();
    if all.is_empty() {
        "none".to_string()
    } else {
        all.join(", ")
    }
}
