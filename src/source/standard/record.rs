//! Recording a standard-indexed source's plans: for each class, the plan
//! the tables give at each severity (normal, tightened and, unless it is
//! left out, reduced), with the letter of the row where it stands and its
//! stages as the table prints them, so that an auditor reads the exact
//! plans in the source and `verify` can read them again.

use std::path::Path;

use super::request::{StandardSourceRequest, plain};
use super::schema::{RecordedClass, RecordedTablePlan};
use super::tables::{Hashes, invalid, read_tables};
use crate::input::InputError;
use crate::source::{PlanSource, RecordedPlan, SourceError, tool_version};
use crate::standard::{
    ClassPlans, CodeLetter, ConsumerPoint, Severity, StandardAnswer, StandardAssessment,
    StandardError, Tables, plans_by_severity,
};

/// The plans of every class at each severity the source records, looked
/// up in `tables` as `lotsman standard` looks them up
/// ([`plans_by_severity`]).
///
/// # Errors
/// [`InputError`] when a class has no plan at a severity (a cell not
/// transcribed, nothing printed); on reduced inspection the message adds
/// that the source can leave reduced inspection out.
pub(crate) fn derive_plans(
    request: &StandardSourceRequest,
    tables: &Tables,
) -> Result<(CodeLetter, Vec<RecordedClass>), InputError> {
    let plans = plans_by_severity(&request.request, tables).map_err(|e| {
        let untranscribed = matches!(
            e,
            StandardError::NotTranscribed { .. } | StandardError::NoPlan { .. }
        );
        let mut e = plain(e);
        if untranscribed
            && request.request.reduced()
            && let InputError::Inconsistent(text) = &mut e
        {
            text.push_str(
                "; where the contract leaves reduced inspection out, say so with no_reduced: true in the standard section",
            );
        }
        e
    })?;
    Ok(recorded_classes(&plans))
}

/// The code letter and each class's recorded plans from the plans at each
/// severity (normal first, as [`plans_by_severity`] gives them).
fn recorded_classes(plans: &[(Severity, ClassPlans)]) -> (CodeLetter, Vec<RecordedClass>) {
    let at = |severity: Severity, i: usize| {
        plans
            .iter()
            .find(|(s, _)| *s == severity)
            .and_then(|(_, p)| p.classes.get(i))
            .map(|c| recorded(&c.answer))
    };
    let first = &plans[0].1;
    let classes = first
        .classes
        .iter()
        .enumerate()
        .filter_map(|(i, c)| {
            Some(RecordedClass {
                name: c.class.name.clone(),
                aql: c.class.aql,
                normal: at(Severity::Normal, i)?,
                tightened: at(Severity::Tightened, i)?,
                reduced: at(Severity::Reduced, i),
            })
        })
        .collect();
    (first.code_letter, classes)
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
        self.record_classes(letter, classes);
        Ok(())
    }

    /// The standard-indexed source of what `lotsman standard` answered:
    /// the index and model of `assessment`, the consumer's point and the
    /// user tables (by file relative to the source's folder, and SHA-256)
    /// it was answered with, and its plans at every severity recorded.
    ///
    /// ```
    /// use lotsman::{ClassRule, InspectionLevel, Model, ModelKind, PlanSource, Scheme, Severity,
    ///     StandardIndex, StandardRequest, Tables, Verdict, assess, parse_classes, verify};
    /// let index = StandardIndex {
    ///     lot_size: 1500, level: InspectionLevel::II, classes: parse_classes(&["1.0"]).unwrap(),
    ///     severity: Severity::Normal, scheme: Scheme::Double, reduced: true, rule: ClassRule::OwnPlans,
    /// };
    /// let request = StandardRequest::new(index, Model::new(ModelKind::Binomial, None).unwrap()).unwrap();
    /// let answer = assess(&request, Tables::builtin().unwrap(), None, None).unwrap();
    /// let source = PlanSource::from_assessment("Covers", &answer, None, Vec::new()).unwrap();
    /// assert_eq!(verify(&source).unwrap(), Verdict::Match);
    /// ```
    ///
    /// # Errors
    /// As [`PlanSource::new_standard`].
    pub fn from_assessment(
        title: &str,
        assessment: &StandardAssessment,
        consumer: Option<ConsumerPoint>,
        tables: Vec<super::TableFileSource>,
    ) -> Result<PlanSource, InputError> {
        let request = StandardSourceRequest::new(assessment.request.clone(), consumer, tables)?;
        let mut source = PlanSource::new_standard(title, &request)?;
        let (letter, classes) = recorded_classes(&assessment.plans);
        source.record_classes(letter, classes);
        Ok(source)
    }

    /// Records `classes` at code letter `letter` as this tool's plan.
    fn record_classes(&mut self, letter: CodeLetter, classes: Vec<RecordedClass>) {
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
