//! Judging a lot by the plans a standard-indexed source records, per class
//! and overall ([`judge_classes`]), from the counts found in it, as
//! `judge --found` gives them: `NAME=K` per class (`major=2`), with one
//! count per stage inspected separated by commas for double and multiple
//! plans (`major=1,3`); for a source with one AQL and no classes, bare
//! counts as for any plan (`--found 2`, repeated or comma-separated per
//! stage).

use std::path::Path;

use super::request::plain;
use super::tables::invalid;
use crate::input::InputError;
use crate::numeric::parse_count;
use crate::source::{Error, PlanSource};
use crate::standard::{ClassAql, ClassPlans, ClassVerdict, Severity, judge_classes};

/// A lot judged by a standard-indexed source's plans.
#[derive(Clone, Debug, PartialEq)]
pub struct StandardJudgement {
    /// The severity whose plans decided.
    pub severity: Severity,
    /// Those plans, as recorded.
    pub plans: ClassPlans,
    /// The decision of every class and of the lot.
    pub verdict: ClassVerdict,
}

impl PlanSource {
    /// Judges a lot by the plans this standard-indexed source records at
    /// `severity` (`None`: the severity in force), from the texts of
    /// `--found` ([`parse_class_counts`]): each class by its own plan on
    /// its own count, the lot accepted when every class accepts and
    /// rejected when any class rejects ([`judge_classes`]). A class whose
    /// AQL is above 10 counts nonconformities (Poisson); the others count
    /// as the source's model reads them.
    ///
    /// The source, read from `path` (which messages about it name), should
    /// have been audited first ([`Audited`](crate::Audited)): the plans are
    /// taken as recorded.
    ///
    /// ```
    /// use lotsman::{Decision, PlanSource, template};
    /// let path = std::path::Path::new("s.yaml");
    /// let mut source = PlanSource::from_yaml(template("standard").unwrap(), path).unwrap();
    /// source.record_standard_at(path).unwrap();
    /// let j = source.judge_standard(path, None, &["critical=0", "major=4", "minor=5"]).unwrap();
    /// assert_eq!(j.verdict.decision, Decision::Reject);
    /// ```
    ///
    /// # Errors
    /// [`SourceError::Invalid`](crate::SourceError::Invalid) naming `path`, as
    /// [`PlanSource::recorded_class_plans`]; [`Error::Input`] as
    /// [`parse_class_counts`], and when a class's counts do not fit its
    /// plan (more stages than it has, a count above the units inspected)
    /// or a class is to inspect every unit.
    pub fn judge_standard(
        &self,
        path: &Path,
        severity: Option<Severity>,
        found: &[&str],
    ) -> Result<StandardJudgement, Error> {
        let source_request = self.standard_request().map_err(|e| invalid(path, e))?;
        let request = &source_request.request;
        let plans = self
            .recorded_class_plans(severity)
            .map_err(|e| invalid(path, e))?;
        let counts = parse_class_counts(found, request.classes())?;
        let verdict = judge_classes(&plans, request.model().kind(), &counts).map_err(plain)?;
        Ok(StandardJudgement {
            severity: severity.unwrap_or(request.severity()),
            plans,
            verdict,
        })
    }
}

/// The counts of each class, in the classes' order, from the texts of
/// `--found`: each class's counts in each stage's new units.
///
/// ```
/// use lotsman::{parse_class_counts, parse_classes};
/// let classes = parse_classes(&["critical=0.065", "major=1.0", "minor=4.0"]).unwrap();
/// let found = parse_class_counts(&["major=1,3", "critical=0", "MINOR=2"], &classes).unwrap();
/// assert_eq!(found, vec![vec![0], vec![1, 3], vec![2]]);
/// assert!(parse_class_counts(&["major=1"], &classes).unwrap_err().to_string().contains("critical"));
/// let one = parse_classes(&["1.0"]).unwrap();
/// assert_eq!(parse_class_counts(&["1", "3"], &one).unwrap(), vec![vec![1, 3]]);
/// ```
///
/// # Errors
/// [`InputError`] for a count that is not a whole number, a class named
/// that the source does not have or named twice, a class without its
/// count, or bare counts for a source with named classes.
pub fn parse_class_counts(
    found: &[&str],
    classes: &[ClassAql],
) -> Result<Vec<Vec<u64>>, InputError> {
    // The names and the example are written only into a refusal: a
    // ledger's replay calls this once per row.
    let names = || -> Vec<String> { classes.iter().filter_map(|c| c.name.clone()).collect() };
    let example = || {
        names()
            .iter()
            .map(|n| format!("--found {n}=K"))
            .collect::<Vec<_>>()
            .join(" ")
    };
    if found.is_empty() {
        return Err(InputError::Inconsistent(if names().is_empty() {
            "give the count found with --found K (once per stage)".to_string()
        } else {
            format!("give the count found in each class: {}", example())
        }));
    }
    let named = found.iter().any(|f| f.contains('='));
    if !named {
        if classes.len() != 1 {
            return Err(InputError::Inconsistent(format!(
                "this source has the classes {}: give the count of each by its name, {} (for double and multiple plans one count per stage, e.g. --found {}=1,3)",
                names().join(", "),
                example(),
                names().first().map_or("major", String::as_str)
            )));
        }
        let mut counts = Vec::new();
        for f in found {
            counts.extend(counts_of("--found", f)?);
        }
        return Ok(vec![counts]);
    }
    let mut counts: Vec<Option<Vec<u64>>> = vec![None; classes.len()];
    for f in found {
        let Some((name, list)) = f.split_once('=') else {
            return Err(InputError::Inconsistent(format!(
                "--found {f} gives no class: give every count as CLASS=K, e.g. {}",
                example()
            )));
        };
        let name = name.trim();
        let Some(i) = classes.iter().position(|c| {
            c.name
                .as_deref()
                .is_some_and(|n| n.eq_ignore_ascii_case(name))
        }) else {
            return Err(InputError::Inconsistent(if names().is_empty() {
                format!(
                    "--found {f} names the class '{name}', and this source has one AQL and no classes: give the counts alone, --found K"
                )
            } else {
                format!(
                    "--found {f} names the class '{name}', which this source does not have; its classes are {}",
                    names().join(", ")
                )
            }));
        };
        if counts[i].is_some() {
            let label = classes[i].label();
            return Err(InputError::Inconsistent(format!(
                "the class {label} is given twice with --found: give each class once, with its counts per stage separated by commas (e.g. --found {label}=1,3)"
            )));
        }
        counts[i] = Some(counts_of(&format!("--found {name}"), list)?);
    }
    counts
        .into_iter()
        .zip(classes)
        .map(|(c, class)| {
            c.ok_or_else(|| {
                InputError::Inconsistent(format!(
                    "no count was given for the class {}: give --found {}=K (every class is counted in the sample)",
                    class.label(),
                    class.label()
                ))
            })
        })
        .collect()
}

/// The counts of one `--found` value: whole numbers separated by commas.
fn counts_of(parameter: &str, text: &str) -> Result<Vec<u64>, InputError> {
    text.split(',')
        .map(|k| parse_count(parameter, k, u64::MAX))
        .collect()
}
