//! A plan source as the ledger knows it: its text's SHA-256 (the revision
//! a row names), and what it needs to decide a lot again from the row's
//! counts: the recorded plan, or for a standard-indexed source the plans
//! of each severity and its switching rules.
//!
//! # One switching state per ledger
//!
//! MIL-STD-105E keeps a switching state per class of defects (4.6), yet a
//! lot is sampled at one severity. The ledger keeps one state, driven by
//! the lot's overall decision (accepted when every class accepts, 4.7.1 to
//! 4.8), and applies that severity to every class. Reduced inspection
//! (4.7.3) is reached only for a source with one AQL: the limit number of
//! Table VIII is read per class, and one state cannot hold several
//! classes' windows; a source with several classes stays on normal and
//! tightened inspection, the stricter reading. For a source that keeps
//! reduced inspection (no `no_reduced: true`), the ledger takes 4.7.3 (c)
//! steady production and (d) the responsible authority's approval as
//! given; a contract that does not give them sets `no_reduced: true`.

use std::path::{Path, PathBuf};

use crate::design::Protection;
use crate::model::{Model, ModelKind};
use crate::plan::{
    Decision, Judgement, StagedPlan, VariablesPlan, decide_from_statistics, judge, judge_cumulative,
};
use crate::source::{Error, PlanSource, SourceError, parse_class_counts};
use crate::standard::{
    ClassAql, ClassPlans, ClassScheme, ClassVerdict, LotResult, Severity, SwitchingRules,
    judge_classes, text_sha256,
};

use super::measured::Measured;
use super::row::LotEntry;
use super::tally::Tally;

/// A plan source a ledger's rows may name, ready to decide their lots.
#[derive(Clone, Debug)]
pub struct KnownPlan {
    /// Where it was read.
    pub path: PathBuf,
    /// The SHA-256 of its text.
    pub sha256: String,
    /// Its `id` (empty when it has none).
    pub id: String,
    /// Its `revision` (empty when it has none).
    pub revision: String,
    /// The qualities its lots are held against, per class.
    pub targets: Vec<QualityTarget>,
    judge: PlanJudge,
}

/// The qualities one class of a plan is held against: the AQL (for a
/// designed plan, its producer's quality), the RQL (its consumer's
/// quality, a standard-indexed source's consumer point, or a
/// minimum-inspection plan's LTPD) and the process average a
/// minimum-inspection plan was designed for, as fractions nonconforming
/// or nonconformities per unit.
#[derive(Clone, Debug, PartialEq)]
pub struct QualityTarget {
    /// The class's name; `None` for a plan without named classes.
    pub class: Option<String>,
    /// The AQL, if the plan has one.
    pub aql: Option<f64>,
    /// The RQL, if the plan has one (a minimum-inspection plan's LTPD).
    pub rql: Option<f64>,
    /// The process average a minimum-inspection plan (`scheme:
    /// rectifying`) was designed for: it inspects the fewest units on
    /// average at this quality, and more when the supplier runs worse.
    pub design_average: Option<f64>,
}

#[derive(Clone, Debug)]
enum PlanJudge {
    Standard(Box<StandardPlans>),
    Counted { model: Model, plan: StagedPlan },
    Variables(Box<VariablesPlan>),
}

#[derive(Clone, Debug)]
struct StandardPlans {
    kind: ModelKind,
    classes: Vec<ClassAql>,
    by_severity: Vec<(Severity, ClassPlans)>,
    rules: SwitchingRules,
}

/// A lot decided by a known plan, with what the ledger records of it.
#[derive(Clone, Debug)]
pub struct Decided {
    /// Accept, reject or continue.
    pub decision: Decision,
    /// The counts found, per class, in the plan's order.
    pub found: Tally,
    /// The units inspected in all, per class.
    pub inspected: Tally,
    /// The code letter (standard-indexed plans).
    pub code_letter: Option<String>,
    /// The lot as the switching rules read it (standard-indexed plans,
    /// decided lots only).
    pub lot: Option<LotResult>,
    /// The judgement of a plan without classes.
    pub judgement: Option<Judgement>,
    /// The decisions of every class (standard-indexed plans).
    pub verdict: Option<ClassVerdict>,
}

impl KnownPlan {
    /// Reads and prepares the plan source at `path`.
    ///
    /// # Errors
    /// As [`KnownPlan::from_source`]; [`SourceError`] when it cannot be
    /// read.
    pub fn load(path: &Path) -> Result<KnownPlan, Error> {
        let text = PlanSource::read_text(path)?;
        let source = PlanSource::from_yaml(&text, path)?;
        KnownPlan::from_source(path, &text, &source)
    }

    /// Prepares `source`, read from `text` at `path`.
    ///
    /// # Errors
    /// [`SourceError::Invalid`] for a source without a recorded plan, or
    /// whose plans cannot be read.
    pub fn from_source(path: &Path, text: &str, source: &PlanSource) -> Result<KnownPlan, Error> {
        let invalid = |e| SourceError::Invalid {
            path: path.to_path_buf(),
            source: e,
        };
        let mut targets = vec![QualityTarget {
            class: None,
            aql: source.producer.map(|p| p.quality),
            rql: source.consumer.map(|c| c.quality),
            design_average: None,
        }];
        if source.is_rectifying() {
            let request = source.rectifying_request().map_err(invalid)?;
            targets[0].rql = match request.protection() {
                Protection::Ltpd(point) => Some(point.quality),
                Protection::Aoql(_) => None,
            };
            targets[0].design_average = Some(request.process_average());
        }
        let judge = if source.is_standard() {
            let request = source.standard_request().map_err(invalid)?;
            let mut by_severity = Vec::new();
            for severity in [Severity::Normal, Severity::Tightened, Severity::Reduced] {
                if severity == Severity::Reduced && !request.request.reduced() {
                    continue;
                }
                let plans = source
                    .recorded_class_plans(Some(severity))
                    .map_err(invalid)?;
                by_severity.push((severity, plans));
            }
            let classes = request.request.classes().to_vec();
            let rql = request.consumer.map(|c| c.rql);
            targets = classes
                .iter()
                .map(|c| QualityTarget {
                    class: c.name.clone(),
                    aql: Some(c.aql.quality()),
                    rql,
                    design_average: None,
                })
                .collect();
            let rules = ledger_rules(source, path, &by_severity, classes.len())?;
            PlanJudge::Standard(Box::new(StandardPlans {
                kind: request.request.model().kind(),
                classes,
                by_severity,
                rules,
            }))
        } else if source.is_variables() {
            let request = source.variables_request().map_err(invalid)?;
            let plan = source.recorded_variables_plan(&request).map_err(invalid)?;
            PlanJudge::Variables(Box::new(plan))
        } else {
            let model = source.staged_model().map_err(invalid)?;
            let plan = source.recorded_plan(&model).map_err(invalid)?;
            PlanJudge::Counted { model, plan }
        };
        Ok(KnownPlan {
            path: path.to_path_buf(),
            sha256: text_sha256(text),
            id: source.id.clone().unwrap_or_default(),
            revision: source.revision.clone().unwrap_or_default(),
            targets,
            judge,
        })
    }

    /// The switching rules of a standard-indexed source, `None` for other
    /// plans.
    pub fn rules(&self) -> Option<&SwitchingRules> {
        match &self.judge {
            PlanJudge::Standard(s) => Some(&s.rules),
            PlanJudge::Counted { .. } | PlanJudge::Variables(_) => None,
        }
    }

    /// The plans of a standard-indexed source at `severity`.
    pub fn plans_at(&self, severity: Severity) -> Option<&ClassPlans> {
        match &self.judge {
            PlanJudge::Standard(s) => s
                .by_severity
                .iter()
                .find(|(s, _)| *s == severity)
                .map(|(_, p)| p),
            PlanJudge::Counted { .. } | PlanJudge::Variables(_) => None,
        }
    }

    /// What its counts count: nonconforming units, or nonconformities
    /// (Poisson). A variables lot's count is of readings beyond a limit:
    /// nonconforming units of a sample, read as binomial.
    pub fn model_kind(&self) -> ModelKind {
        match &self.judge {
            PlanJudge::Standard(s) => s.kind,
            PlanJudge::Counted { model, .. } => model.kind(),
            PlanJudge::Variables(_) => ModelKind::Binomial,
        }
    }

    /// The recorded plan of a variables source.
    pub fn variables_plan(&self) -> Option<&VariablesPlan> {
        match &self.judge {
            PlanJudge::Variables(plan) => Some(plan),
            PlanJudge::Standard(_) | PlanJudge::Counted { .. } => None,
        }
    }

    /// The first sample of a row's lot, per class in the plan's order:
    /// `(count, units)` found in the first stage's units, judged at
    /// `severity`. An item-by-item plan's whole sample is its first
    /// sample. `None` when the row does not show it: one cumulative count
    /// (`judge --inspected`) past the first stage, or counts that do not
    /// fit the plan (which `verify` reports).
    pub fn first_samples(
        &self,
        severity: Option<Severity>,
        found: &Tally,
        inspected: &Tally,
    ) -> Option<Vec<(u64, u64)>> {
        let counts = found.counts();
        let units = inspected.counts();
        if counts.len() != units.len() {
            return None;
        }
        match &self.judge {
            PlanJudge::Variables(_) => {
                let (k, n) = (*counts.first()?.first()?, *units.first()?.first()?);
                Some(vec![(k, n)])
            }
            PlanJudge::Counted { plan, .. } => {
                let (k, n) = (counts.first()?, *units.first()?.first()?);
                if plan.sequential_lines().is_some() {
                    return Some(vec![(k.iter().sum(), n)]);
                }
                let n1 = plan.stages().first()?.n;
                match k.as_slice() {
                    // A cumulative count past the first stage.
                    [_] if n > n1 && plan.stages().len() > 1 => None,
                    [k1, ..] => Some(vec![(*k1, n1.min(n))]),
                    [] => None,
                }
            }
            PlanJudge::Standard(_) => {
                let plans = self.plans_at(severity.unwrap_or(Severity::Normal))?;
                if plans.classes.len() != counts.len() {
                    return None;
                }
                plans
                    .classes
                    .iter()
                    .zip(counts.iter().zip(&units))
                    .map(|(class, (k, n))| {
                        let n = *n.first()?;
                        let n1 = class
                            .answer
                            .plan()
                            .and_then(|p| p.stages.stages().first().map(|s| s.n))
                            .unwrap_or(n);
                        Some((*k.first()?, n1.min(n)))
                    })
                    .collect()
            }
        }
    }

    /// The recorded plan and model of a plan without classes.
    pub fn counted_plan(&self) -> Option<(&StagedPlan, &Model)> {
        match &self.judge {
            PlanJudge::Counted { model, plan } => Some((plan, model)),
            PlanJudge::Standard(_) | PlanJudge::Variables(_) => None,
        }
    }

    /// Decides a lot of a plan without classes from `counts`, the count
    /// in each stage's new units; or, with `cumulative` (the units
    /// inspected, `judge --inspected`), from one cumulative count.
    ///
    /// # Errors
    /// A message in plain words: the counts do not fit the plan, or this
    /// is a standard-indexed source.
    pub fn decide_counts(
        &self,
        counts: &[u64],
        cumulative: Option<u64>,
    ) -> Result<Decided, String> {
        let (model, plan) = match &self.judge {
            PlanJudge::Counted { model, plan } => (model, plan),
            PlanJudge::Standard(_) => {
                return Err(
                    "a standard-indexed plan takes the counts of each class (--found CLASS=K,K,..)"
                        .into(),
                );
            }
            PlanJudge::Variables(_) => {
                return Err(
                    "a variables plan decides from the sample's measurements (--measurements FILE), not from counts".into(),
                );
            }
        };
        let judgement = match (cumulative, counts) {
            (Some(inspected), [k]) => judge_cumulative(plan, model, inspected, *k),
            (Some(_), _) => {
                return Err("with the units inspected give one cumulative count".into());
            }
            (None, _) => judge(plan, model, counts),
        }
        .map_err(|e| e.to_string())?;
        Ok(Decided {
            decision: judgement.decision,
            found: Tally::single(counts.to_vec()),
            inspected: Tally::single(vec![judgement.inspected]),
            code_letter: None,
            lot: None,
            judgement: Some(judgement),
            verdict: None,
        })
    }

    /// Decides a row's lot again from its cells: a plan without classes
    /// reads one count on a plan of several stages as the cumulative count
    /// at `inspected` units (see the row's columns); a standard-indexed
    /// source judges at the row's severity; a variables plan decides from
    /// the row's mean and standard deviation of its `inspected` readings.
    ///
    /// # Errors
    /// As [`KnownPlan::decide_counts`] and [`KnownPlan::decide_classes`];
    /// a variables row without its statistics, or an attributes row with
    /// them.
    pub fn decide_row(&self, e: &LotEntry) -> Result<Decided, String> {
        let (found, inspected) = (&e.found, &e.inspected);
        match (&self.judge, &e.measured) {
            (PlanJudge::Variables(plan), Some(m)) => decide_measured(plan, e, m),
            (PlanJudge::Variables(_), None) => {
                Err("the row has no mean and sd, and a variables plan decides from them".into())
            }
            (_, Some(_)) => Err(
                "the row has a mean and sd, and this plan decides from counts, not measurements"
                    .into(),
            ),
            (PlanJudge::Counted { plan, .. }, None) => {
                let counts = found.counts().concat();
                let units = inspected.counts().concat();
                let cumulative = match (counts.as_slice(), units.as_slice()) {
                    ([_], [n]) if plan.stages().len() > 1 => Some(*n),
                    _ => None,
                };
                self.decide_counts(&counts, cumulative)
            }
            (PlanJudge::Standard(s), None) => {
                let severity = e.severity.unwrap_or(Severity::Normal);
                // A row written by the ledger names the classes in the
                // plan's order: its counts are taken as they stand. Any
                // other cell is read as `--found` reads it, for its words.
                let names = found.classes().iter().map(|(n, _)| n.as_deref());
                if names.eq(s.classes.iter().map(|c| c.name.as_deref())) {
                    self.decide_class_counts(s, severity, found.counts())
                } else {
                    self.decide_classes(severity, &found.found_args())
                }
            }
        }
    }

    /// Decides a lot of a standard-indexed source at `severity` from the
    /// texts of `--found` ([`parse_class_counts`]).
    ///
    /// # Errors
    /// A message in plain words: the counts do not fit the plans, the
    /// severity has no plan, or this is not a standard-indexed source.
    pub fn decide_classes(&self, severity: Severity, found: &[String]) -> Result<Decided, String> {
        match &self.judge {
            PlanJudge::Counted { .. } | PlanJudge::Variables(_) => {
                Err("a severity applies only to a standard-indexed plan (scheme: standard)".into())
            }
            PlanJudge::Standard(s) => {
                let texts: Vec<&str> = found.iter().map(String::as_str).collect();
                let counts = parse_class_counts(&texts, &s.classes).map_err(|e| e.to_string())?;
                self.decide_class_counts(s, severity, counts)
            }
        }
    }

    /// Decides a lot of the standard-indexed source `s` at `severity`
    /// from the counts of each class, in the plan's order.
    fn decide_class_counts(
        &self,
        s: &StandardPlans,
        severity: Severity,
        counts: Vec<Vec<u64>>,
    ) -> Result<Decided, String> {
        let plans = self.plans_at(severity).ok_or_else(|| {
                    "the source leaves reduced inspection out (no_reduced: true), so it has no reduced plan".to_string()
                })?;
        let verdict = judge_classes(plans, s.kind, &counts).map_err(|e| e.to_string())?;
        let named = s.classes.iter().all(|c| c.name.is_some());
        let per_class = |values: Vec<Vec<u64>>| {
            if named {
                Tally::named(
                    s.classes
                        .iter()
                        .map(|c| c.name.clone().unwrap_or_default())
                        .zip(values)
                        .collect(),
                )
            } else {
                Tally::single(values.concat())
            }
        };
        let inspected: Vec<Vec<u64>> = verdict
            .classes
            .iter()
            .map(|c| vec![c.judgement.inspected])
            .collect();
        let lot = lot_result(&verdict, counts.len());
        Ok(Decided {
            decision: verdict.decision,
            found: per_class(counts),
            inspected: per_class(inspected),
            code_letter: Some(plans.code_letter.to_string()),
            lot,
            judgement: None,
            verdict: Some(verdict),
        })
    }
}

/// A variables row's lot decided again from its statistics: `n` is the
/// row's units inspected, which must be the plan's sample.
fn decide_measured(plan: &VariablesPlan, e: &LotEntry, m: &Measured) -> Result<Decided, String> {
    let n = match e.inspected.counts().as_slice() {
        [units] if units.as_slice() == [plan.n()] => plan.n(),
        _ => {
            return Err(format!(
                "the units inspected are {}, and the variables plan measures n = {}",
                e.inspected,
                plan.n()
            ));
        }
    };
    match e.found.counts().as_slice() {
        [k] if matches!(k.as_slice(), [k] if *k <= n) => {}
        _ => {
            return Err(format!(
                "{} is not one count of readings beyond a limit, at most n = {n}",
                e.found
            ));
        }
    }
    let decided = decide_from_statistics(plan, n, m.mean, m.sd);
    Ok(Decided {
        decision: decided.decision,
        found: e.found.clone(),
        inspected: e.inspected.clone(),
        code_letter: None,
        lot: None,
        judgement: None,
        verdict: None,
    })
}

/// The lot as the switching rules read it: accepted or not, its count and
/// units (the one class's, for the limit number; the largest over classes
/// otherwise), and whether a count between Ac and Re on reduced
/// inspection returns the next lot to normal (105E 4.10.1.4).
fn lot_result(verdict: &ClassVerdict, classes: usize) -> Option<LotResult> {
    let count = verdict
        .classes
        .iter()
        .map(|c| c.judgement.cumulative_count)
        .sum();
    let units = verdict
        .classes
        .iter()
        .map(|c| c.judgement.inspected)
        .max()?;
    let between = classes == 1 && verdict.classes.iter().any(|c| c.reinstates_normal);
    match verdict.decision {
        Decision::Accept if between => LotResult::accepted_between(count, units).ok(),
        Decision::Accept => LotResult::accepted(count, units).ok(),
        Decision::Reject => LotResult::rejected(count, units).ok(),
        Decision::Continue => None,
    }
}

/// The rules the ledger follows for a standard-indexed source (see the
/// module doc): reduced inspection with Table VIII's window for a source
/// with one AQL that keeps it, otherwise normal and tightened only.
fn ledger_rules(
    source: &PlanSource,
    path: &Path,
    by_severity: &[(Severity, ClassPlans)],
    classes: usize,
) -> Result<SwitchingRules, Error> {
    let normal = by_severity
        .iter()
        .find(|(s, _)| *s == Severity::Normal)
        .and_then(|(_, p)| p.classes.first())
        .and_then(|c| c.answer.plan());
    let keeps_reduced = by_severity.iter().any(|(s, _)| *s == Severity::Reduced);
    match normal {
        Some(plan) if keeps_reduced && classes == 1 => {
            let tables = source.standard_tables(path)?;
            Ok(SwitchingRules::new(
                true,
                ClassScheme::limit_window(&tables, plan),
            ))
        }
        _ => Ok(SwitchingRules::without_reduced()),
    }
}
