//! The keys of a standard-indexed plan source as stored: the `standard`
//! section (what the contract names: edition, inspection level, the AQL or
//! the defect classes, severity, form, user tables) and the table plans a
//! source records under `plan: classes:`.
//!
//! Values are read from the scalar's own text, so that `aql: 0.10` stays
//! the standard's `0.10` and a value that is not one of the standard's is
//! refused with the standard's own list.

use serde::de::{Error as _, Visitor};
use serde::{Deserialize, Deserializer, Serialize};

use crate::design::Scheme;
use crate::plan::Stage;
use crate::standard::{Aql, ClassRule, CodeLetter, InspectionLevel, Severity};

/// The edition whose tables and rules a source follows.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub enum Edition {
    /// MIL-STD-105E (10 May 1989), public domain; its tables are built in.
    #[serde(rename = "MIL-STD-105E")]
    MilStd105E,
}

impl Edition {
    /// The edition's name, as written in a source.
    pub fn name(self) -> &'static str {
        match self {
            Edition::MilStd105E => "MIL-STD-105E",
        }
    }
}

/// The `standard` section of a source with `scheme: standard`.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct StandardSource {
    /// The edition whose tables and rules apply.
    pub edition: Edition,
    /// The inspection level of Table I (`II`, `S-3`, ...).
    #[serde(deserialize_with = "level")]
    pub level: InspectionLevel,
    /// One AQL for the whole item, when it has no classes of defects.
    #[serde(
        default,
        skip_serializing_if = "Option::is_none",
        deserialize_with = "some_aql"
    )]
    pub aql: Option<Aql>,
    /// The classes of defects, each with its AQL, when there are several
    /// (or one named class).
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub classes: Vec<ClassSource>,
    /// The severity of inspection in force: normal, tightened or reduced.
    #[serde(deserialize_with = "severity")]
    pub severity: Severity,
    /// The table plans' form: single, double or multiple.
    pub form: Scheme,
    /// Reduced inspection is left out, as many contracts leave it.
    #[serde(default, skip_serializing_if = "is_false")]
    pub no_reduced: bool,
    /// How classes whose arrows lead to rows of different sample sizes are
    /// sampled (default `own-plans`).
    #[serde(
        default,
        skip_serializing_if = "Option::is_none",
        deserialize_with = "some_class_rule"
    )]
    pub class_rule: Option<ClassRule>,
    /// The user's own tables, each replacing one of the built-in ones.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub tables: Vec<TableFileSource>,
}

/// One class of defects as stored: its name and AQL.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ClassSource {
    /// The class's name (`critical`, `major`, `minor`).
    pub name: String,
    /// Its AQL.
    #[serde(deserialize_with = "aql")]
    pub aql: Aql,
}

/// A user's table file as stored: where it is, relative to the source's
/// folder, its SHA-256, and for a table of plans the severity it is for.
#[derive(Clone, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct TableFileSource {
    /// The path, relative to the folder of the source (`/` between
    /// folders).
    pub file: String,
    /// The SHA-256 of the file's bytes, 64 lower-case hex digits.
    pub sha256: String,
    /// For a table of plans: the severity it stands for (a table of code
    /// letters or of limit numbers has none).
    #[serde(
        default,
        skip_serializing_if = "Option::is_none",
        deserialize_with = "some_severity"
    )]
    pub severity: Option<Severity>,
}

/// One class's table plans as recorded: one per severity.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RecordedClass {
    /// The class's name; absent for the one AQL of a source without
    /// classes.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub name: Option<String>,
    /// Its AQL.
    #[serde(deserialize_with = "aql")]
    pub aql: Aql,
    /// The plan on normal inspection.
    pub normal: RecordedTablePlan,
    /// The plan on tightened inspection.
    pub tightened: RecordedTablePlan,
    /// The plan on reduced inspection; absent with `no_reduced`.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub reduced: Option<RecordedTablePlan>,
}

impl RecordedClass {
    /// The plan recorded for `severity`, if any.
    pub fn at(&self, severity: Severity) -> Option<&RecordedTablePlan> {
        match severity {
            Severity::Normal => Some(&self.normal),
            Severity::Tightened => Some(&self.tightened),
            Severity::Reduced => self.reduced.as_ref(),
        }
    }

    /// The name for messages: the class's name, or `AQL 1.0`.
    pub fn label(&self) -> String {
        self.name
            .clone()
            .unwrap_or_else(|| format!("AQL {}", self.aql))
    }
}

/// A plan as the table gives it for one class and severity.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RecordedTablePlan {
    /// The code letter of the row where the plan stands (after arrows).
    #[serde(deserialize_with = "code_letter")]
    pub plan_letter: CodeLetter,
    /// The stages as the table prints them: cumulative sample sizes, Ac
    /// (absent where a stage cannot accept) and Re. On reduced inspection
    /// the last stage may leave a gap between Ac and Re.
    pub stages: Vec<Stage>,
    /// The plan's sample reaches the lot, so every unit is inspected
    /// instead (the tables' 100 percent rule).
    #[serde(default, skip_serializing_if = "is_false")]
    pub inspect_all: bool,
}

/// Serde's test for a `false` left out.
fn is_false(b: &bool) -> bool {
    !*b
}

/// A visitor of a scalar's text, which `read` turns into a value or the
/// words of a refusal.
struct Text<F> {
    expecting: &'static str,
    read: F,
}

impl<T, F: FnOnce(&str) -> Result<T, String>> Visitor<'_> for Text<F> {
    type Value = T;
    fn expecting(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.expecting)
    }
    fn visit_str<E: serde::de::Error>(self, text: &str) -> Result<T, E> {
        (self.read)(text).map_err(E::custom)
    }
}

/// Reads a value that must be one of `names` (compared exactly), refused
/// as an unknown name, which the source's reader says with the list and
/// the nearest name.
fn one_of<'de, D: Deserializer<'de>, T>(
    d: D,
    expecting: &'static str,
    names: &'static [&'static str],
    parse: fn(&str) -> Option<T>,
) -> Result<T, D::Error> {
    let text: String = d.deserialize_str(Text {
        expecting,
        read: |t: &str| Ok(t.to_string()),
    })?;
    parse(&text)
        .filter(|_| names.contains(&text.as_str()))
        .ok_or_else(|| D::Error::unknown_variant(&text, names))
}

/// The level names as Table I heads its columns.
const LEVELS: &[&str] = &["I", "II", "III", "S-1", "S-2", "S-3", "S-4"];

fn level<'de, D: Deserializer<'de>>(d: D) -> Result<InspectionLevel, D::Error> {
    one_of(d, "an inspection level such as II", LEVELS, |t| {
        InspectionLevel::parse(t).ok()
    })
}

const SEVERITIES: &[&str] = &["normal", "tightened", "reduced"];

fn severity<'de, D: Deserializer<'de>>(d: D) -> Result<Severity, D::Error> {
    one_of(d, "normal, tightened or reduced", SEVERITIES, |t| {
        Severity::parse(t).ok()
    })
}

fn some_severity<'de, D: Deserializer<'de>>(d: D) -> Result<Option<Severity>, D::Error> {
    severity(d).map(Some)
}

const CLASS_RULES: &[&str] = &["own-plans", "largest-sample"];

fn some_class_rule<'de, D: Deserializer<'de>>(d: D) -> Result<Option<ClassRule>, D::Error> {
    one_of(d, "own-plans or largest-sample", CLASS_RULES, |t| match t {
        "own-plans" => Some(ClassRule::OwnPlans),
        "largest-sample" => Some(ClassRule::LargestSample),
        _ => None,
    })
    .map(Some)
}

fn aql<'de, D: Deserializer<'de>>(d: D) -> Result<Aql, D::Error> {
    d.deserialize_str(Text {
        expecting: "one of the standard's AQLs such as 1.0",
        read: |t: &str| Aql::parse(t).map_err(|e| e.to_string()),
    })
}

fn some_aql<'de, D: Deserializer<'de>>(d: D) -> Result<Option<Aql>, D::Error> {
    aql(d).map(Some)
}

fn code_letter<'de, D: Deserializer<'de>>(d: D) -> Result<CodeLetter, D::Error> {
    d.deserialize_str(Text {
        expecting: "a code letter such as K",
        read: |t: &str| CodeLetter::parse(t).map_err(|e| e.to_string()),
    })
}

/// [`code_letter`] for an optional field.
pub(crate) fn some_code_letter<'de, D: Deserializer<'de>>(
    d: D,
) -> Result<Option<CodeLetter>, D::Error> {
    code_letter(d).map(Some)
}
