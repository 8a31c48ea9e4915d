//! Several classes of defects on one sample (MIL-STD-105E, 4.9.3 and the
//! provision for classes whose plans differ in sample size; its section
//! number is not confirmed in our reading of the standard).
//!
//! A contract often names one AQL per class: `critical=0.065`,
//! `major=1.0`, `minor=4.0`. Each class has its own acceptance and
//! rejection numbers, read in the same table on the row of the lot's code
//! letter, so one sample serves them all and each class is decided on its
//! own count.
//!
//! **When the classes' arrows lead to different rows.** An arrow changes
//! the row and so the sample size, and the standard takes the sample size
//! of the row where the plan stands. Our choice, [`ClassRule::OwnPlans`]
//! (the default): each class keeps the plan its own cell leads to, sample
//! size included. One draw of units still serves every class: draw the
//! largest sample any class needs ([`ClassPlans::sample_size`]), and let
//! each class count the nonconformities of its kind in the first units of
//! that draw, as many as its own plan takes. The standard also allows,
//! where the responsible authority designates or approves it, the code
//! letter of the largest sample for all classes:
//! [`ClassRule::LargestSample`] reads each class at that letter; a class
//! whose cell there is not a plan (an arrow, `*`, `++`) keeps its own plan,
//! because that row has none for its AQL.
//!
//! A lot is decided per class and overall: it is accepted only when every
//! class accepts it, rejected as soon as one class rejects it; in double
//! and multiple sampling, inspection goes on while any class is undecided
//! and none has rejected. Switching (105E, 4.7) runs per class.

use serde::Serialize;

use super::answer::{InspectAll, StandardAnswer};
use super::aql::Aql;
use super::error::StandardError;
use super::letter::{CodeLetter, InspectionLevel};
use super::severity::Severity;
use super::tables::Tables;
use crate::design::Scheme;
use crate::model::{Model, ModelKind};
use crate::plan::{Decision, Judgement, judge};

/// The longest class name accepted.
const MAX_NAME: usize = 40;

/// One class of defects with its AQL.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct ClassAql {
    /// The class's name (`major`); `None` for a single AQL given without
    /// one.
    pub name: Option<String>,
    /// Its AQL.
    pub aql: Aql,
}

impl ClassAql {
    /// Parses `CLASS=VALUE` (`major=1.0`), or a bare AQL (`1.0`).
    ///
    /// # Errors
    /// [`StandardError::Classes`] for an empty, overlong or unprintable
    /// name; [`StandardError::Aql`] for a value that is not one of the
    /// standard's AQLs.
    pub fn parse(text: &str) -> Result<ClassAql, StandardError> {
        let Some((name, value)) = text.split_once('=') else {
            return Ok(ClassAql {
                name: None,
                aql: Aql::parse(text)?,
            });
        };
        let name = name.trim();
        if name.is_empty()
            || name.chars().count() > MAX_NAME
            || name.chars().any(|c| c.is_control() || c == ',')
        {
            return Err(StandardError::Classes(format!(
                "'{}' is not CLASS=VALUE with a class name of 1 to {MAX_NAME} characters (no commas), e.g. major=1.0",
                text.escape_debug()
            )));
        }
        Ok(ClassAql {
            name: Some(name.to_string()),
            aql: Aql::parse(value)?,
        })
    }

    /// The name for messages: the class's name, or `the AQL 1.0`.
    pub fn label(&self) -> String {
        self.name
            .clone()
            .unwrap_or_else(|| format!("AQL {}", self.aql))
    }
}

/// Parses the AQLs of a request: one bare AQL, or one or more
/// `CLASS=VALUE` with distinct names (compared without regard to case).
///
/// # Errors
/// As [`ClassAql::parse`]; [`StandardError::Classes`] for no value, a bare
/// AQL beside others, or a name given twice.
///
/// # Example
/// ```
/// use lotsman::parse_classes;
/// let c = parse_classes(&["critical=0.065", "major=1.0", "minor=4.0"]).unwrap();
/// assert_eq!(c[1].name.as_deref(), Some("major"));
/// assert!(parse_classes(&["major=1.0", "MAJOR=2.5"]).is_err());
/// assert!(parse_classes(&["1.0", "minor=4.0"]).is_err());
/// ```
pub fn parse_classes(texts: &[&str]) -> Result<Vec<ClassAql>, StandardError> {
    let classes = texts
        .iter()
        .map(|t| ClassAql::parse(t))
        .collect::<Result<Vec<_>, _>>()?;
    if classes.is_empty() {
        return Err(StandardError::Classes(
            "give the AQL, or one CLASS=VALUE per class of defects (e.g. major=1.0)".to_string(),
        ));
    }
    if classes.len() > 1 && classes.iter().any(|c| c.name.is_none()) {
        return Err(StandardError::Classes(
            "with several AQLs, name each one's class: CLASS=VALUE, e.g. critical=0.065 major=1.0 minor=4.0".to_string(),
        ));
    }
    for (i, c) in classes.iter().enumerate() {
        let lower = c.name.as_ref().map(|n| n.to_lowercase());
        if classes[..i]
            .iter()
            .any(|d| d.name.as_ref().map(|n| n.to_lowercase()) == lower)
        {
            return Err(StandardError::Classes(format!(
                "the class '{}' is named twice: give each class once",
                c.label()
            )));
        }
    }
    Ok(classes)
}

/// How classes whose plans lead to different rows are sampled.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum ClassRule {
    /// Each class keeps the plan its own cell leads to (the default).
    #[default]
    OwnPlans,
    /// The code letter of the largest sample for every class whose cell
    /// there is a plan, as the responsible authority may designate or
    /// approve.
    LargestSample,
}

/// One class's answer.
#[derive(Clone, Debug, PartialEq)]
pub struct ClassPlan {
    /// The class and its AQL.
    pub class: ClassAql,
    /// Its plan, or every unit.
    pub answer: StandardAnswer,
}

/// The answers of all classes for one lot.
#[derive(Clone, Debug, PartialEq)]
pub struct ClassPlans {
    /// The lot's code letter (Table I).
    pub code_letter: CodeLetter,
    /// The lot size.
    pub lot_size: u64,
    /// How differing sample sizes were treated.
    pub rule: ClassRule,
    /// Each class, in the order given.
    pub classes: Vec<ClassPlan>,
}

impl ClassPlans {
    /// The units to draw: the largest sample any class's plan can take
    /// (each class counts in the first units of the draw, as many as its
    /// own plan takes); the lot size when a class is to inspect every
    /// unit.
    pub fn sample_size(&self) -> u64 {
        if self.inspect_all() {
            return self.lot_size;
        }
        self.classes
            .iter()
            .map(|c| c.answer.table_plan().sample_size())
            .max()
            .unwrap_or(0)
    }

    /// Whether some class's plan takes the whole lot, so that every unit
    /// is inspected anyway.
    pub fn inspect_all(&self) -> bool {
        self.classes
            .iter()
            .any(|c| matches!(c.answer, StandardAnswer::InspectAll(_)))
    }
}

impl Tables {
    /// The plans of several classes for a lot of `lot_size` units at
    /// `level`, on one severity and scheme (classes on different
    /// severities take one call per severity).
    ///
    /// # Errors
    /// As [`Tables::plan_for_lot`], for the first class that has no plan;
    /// [`StandardError::Classes`] for no class.
    ///
    /// # Example
    /// ```
    /// use lotsman::{ClassRule, InspectionLevel, Scheme, Severity, Tables, parse_classes};
    /// let t = Tables::builtin().unwrap();
    /// let classes = parse_classes(&["critical=0.065", "major=1.0", "minor=4.0"]).unwrap();
    /// let p = t.classes_for_lot(1500, InspectionLevel::II, &classes, Severity::Normal,
    ///     Scheme::Single, ClassRule::OwnPlans).unwrap();
    /// let n: Vec<u64> = p.classes.iter().map(|c| c.answer.table_plan().sample_size()).collect();
    /// assert_eq!(n, [200, 125, 125]); // critical's arrow leads to L
    /// assert_eq!(p.sample_size(), 200);
    /// ```
    pub fn classes_for_lot(
        &self,
        lot_size: u64,
        level: InspectionLevel,
        classes: &[ClassAql],
        severity: Severity,
        scheme: Scheme,
        rule: ClassRule,
    ) -> Result<ClassPlans, StandardError> {
        if classes.is_empty() {
            return Err(StandardError::Classes(
                "give at least one class with its AQL".to_string(),
            ));
        }
        let mut plans = Vec::with_capacity(classes.len());
        for c in classes {
            let answer = self.plan_for_lot(lot_size, level, c.aql, severity, scheme)?;
            plans.push(ClassPlan {
                class: c.clone(),
                answer,
            });
        }
        let code_letter = self.code_letter(lot_size, level)?;
        if rule == ClassRule::LargestSample {
            self.to_largest_sample(&mut plans, lot_size, severity, scheme)?;
        }
        Ok(ClassPlans {
            code_letter,
            lot_size,
            rule,
            classes: plans,
        })
    }

    /// Moves every class whose cell at the row of the largest sample is a
    /// plan onto that row.
    fn to_largest_sample(
        &self,
        plans: &mut [ClassPlan],
        lot_size: u64,
        severity: Severity,
        scheme: Scheme,
    ) -> Result<(), StandardError> {
        let Some(largest) = plans
            .iter()
            .map(|c| c.answer.table_plan())
            .max_by_key(|p| p.sample_size())
            .map(|p| p.plan_letter)
        else {
            return Ok(());
        };
        let table = self.master(severity, scheme)?;
        for c in plans.iter_mut() {
            let own = c.answer.table_plan();
            let is_plan = matches!(
                table.cell(largest, c.class.aql),
                Some(super::cell::TableCell::Plan(_))
            );
            if own.plan_letter == largest || !is_plan {
                continue;
            }
            let mut plan = self.lookup(largest, c.class.aql, severity, scheme)?;
            plan.code_letter = own.code_letter;
            plan.notes.insert(
                0,
                format!(
                    "read at code letter {largest}, the row of the largest sample among the classes, instead of code letter {} (allowed where the responsible authority designates or approves it)",
                    own.plan_letter
                ),
            );
            c.answer = if plan.sample_size() >= lot_size {
                StandardAnswer::InspectAll(InspectAll { lot_size, plan })
            } else {
                StandardAnswer::Sample(plan)
            };
        }
        Ok(())
    }
}

/// One class's decision.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct ClassDecision {
    /// The class.
    pub class: ClassAql,
    /// Its decision, with the figures it rests on.
    pub judgement: Judgement,
    /// On reduced inspection, whether the class's count fell between Ac
    /// and Re at the last stage: the lot is accepted, and the next lot of
    /// this class returns to normal inspection (105E, 4.10.1.4).
    pub reinstates_normal: bool,
}

/// The decisions of all classes and of the lot.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct ClassVerdict {
    /// Each class, in order.
    pub classes: Vec<ClassDecision>,
    /// The lot: accept when every class accepts, reject when any class
    /// rejects, otherwise inspect the next stage for the undecided classes.
    pub decision: Decision,
}

/// Judges a lot for every class: `found[i]` holds class `i`'s count in each
/// stage's new units, as [`judge`] takes them. A class whose AQL is above
/// 10 counts nonconformities (they may outnumber the units); the others
/// count as `kind` reads them (nonconforming units for the binomial and
/// hypergeometric models, nonconformities for Poisson).
///
/// # Errors
/// [`StandardError::Classes`] when the counts do not match the classes, a
/// class is to inspect every unit (no sampling decision), or a class's
/// counts do not fit its plan (the message names the class).
pub fn judge_classes(
    plans: &ClassPlans,
    kind: ModelKind,
    found: &[Vec<u64>],
) -> Result<ClassVerdict, StandardError> {
    if found.len() != plans.classes.len() {
        return Err(StandardError::Classes(format!(
            "{} classes have plans but counts were given for {}: give the counts of every class",
            plans.classes.len(),
            found.len()
        )));
    }
    let mut classes = Vec::with_capacity(found.len());
    for (c, counts) in plans.classes.iter().zip(found) {
        let name = c.class.label();
        let plan = match &c.answer {
            StandardAnswer::Sample(p) => p,
            StandardAnswer::InspectAll(a) => {
                return Err(StandardError::Classes(format!(
                    "class {name}: {}; the plan gives no sampling decision",
                    a.reason()
                )));
            }
        };
        let kind = if c.class.aql.per_hundred_units_only() {
            ModelKind::Poisson
        } else {
            kind
        };
        let model = Model::new(kind, Some(plans.lot_size))?;
        let judgement = judge(&plan.stages, &model, counts)
            .map_err(|e| StandardError::Classes(format!("class {name}: {e}")))?;
        let reinstates_normal = judgement.decision == Decision::Accept
            && plan.reinstates_normal(judgement.stage, judgement.cumulative_count);
        classes.push(ClassDecision {
            class: c.class.clone(),
            judgement,
            reinstates_normal,
        });
    }
    let decision = if classes
        .iter()
        .any(|c| c.judgement.decision == Decision::Reject)
    {
        Decision::Reject
    } else if classes
        .iter()
        .all(|c| c.judgement.decision == Decision::Accept)
    {
        Decision::Accept
    } else {
        Decision::Continue
    };
    Ok(ClassVerdict { classes, decision })
}
