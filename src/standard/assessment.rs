//! A standard-indexed request answered in full: the plans of every class
//! at each severity of the switching scheme, and what the plans in force
//! really do (the `standard` command's answer).
//!
//! The severity in force gives the plan an inspector uses today; the
//! other severities' plans are looked up too, since the switching rules
//! (105E, 4.7) may move the next lots onto them, and their OC curves are
//! shown beside each other. With `reduced: false` (contracts that leave
//! reduced inspection out) the reduced plans are not looked up at all.

use super::answer::StandardAnswer;
use super::class_scheme::ClassScheme;
use super::classes::{ClassAql, ClassPlans, ClassRule};
use super::error::StandardError;
use super::letter::InspectionLevel;
use super::risks::{ConsumerPoint, TrueRisks, true_risks};
use super::severity::Severity;
use super::switching::SwitchingError;
use super::tables::Tables;
use crate::design::Scheme;
use crate::input::InputError;
use crate::model::{Model, ModelKind};
use crate::plan::{acceptance_probability, default_qualities};

/// The index a contract names: the lot, the inspection level, the AQL of
/// each class, the severity in force and the scheme, as given.
#[derive(Clone, Debug, PartialEq)]
pub struct StandardIndex {
    /// The lot size.
    pub lot_size: u64,
    /// The inspection level.
    pub level: InspectionLevel,
    /// The classes with their AQLs (one class without a name for a single
    /// AQL).
    pub classes: Vec<ClassAql>,
    /// The severity in force.
    pub severity: Severity,
    /// Single, double or multiple sampling.
    pub scheme: Scheme,
    /// Whether reduced inspection is part of the switching scheme.
    pub reduced: bool,
    /// How classes whose plans differ in sample size are treated.
    pub rule: ClassRule,
}

/// A checked index with its model: what [`assess`] answers.
#[derive(Clone, Debug, PartialEq)]
pub struct StandardRequest {
    lot_size: u64,
    level: InspectionLevel,
    classes: Vec<ClassAql>,
    severity: Severity,
    scheme: Scheme,
    model: Model,
    reduced: bool,
    rule: ClassRule,
}

impl StandardRequest {
    /// A checked request.
    ///
    /// # Errors
    /// [`StandardError::Classes`] for no class; [`StandardError::Scheme`]
    /// for a scheme the tables do not hold;
    /// [`StandardError::AqlNeedsPoisson`] for an AQL above 10 under a
    /// model of the fraction nonconforming; [`StandardError::Input`] for a
    /// model whose lot is not the index's, or reduced inspection in force
    /// while it is left out.
    pub fn new(index: StandardIndex, model: Model) -> Result<Self, StandardError> {
        let StandardIndex {
            lot_size,
            level,
            classes,
            severity,
            scheme,
            reduced,
            rule,
        } = index;
        if classes.is_empty() {
            return Err(StandardError::Classes(
                "give at least one AQL: --aql 1.0, or one per class: --aql major=1.0 --aql minor=4.0"
                    .to_string(),
            ));
        }
        if !matches!(scheme, Scheme::Single | Scheme::Double | Scheme::Multiple) {
            return Err(StandardError::Scheme {
                given: scheme.name().to_string(),
            });
        }
        for c in &classes {
            c.aql.check_model(model.kind())?;
        }
        if let Some(lot) = model.lot_size()
            && lot != lot_size
        {
            return Err(InputError::Inconsistent(format!(
                "the model's lot of {lot} units is not the lot of {lot_size} units the plan is looked up for"
            ))
            .into());
        }
        if severity == Severity::Reduced && !reduced {
            return Err(InputError::Inconsistent(
                "reduced inspection is in force, yet left out of the scheme; drop --no-reduced, or give the severity in force (normal or tightened)".to_string(),
            )
            .into());
        }
        Ok(StandardRequest {
            lot_size,
            level,
            classes,
            severity,
            scheme,
            model,
            reduced,
            rule,
        })
    }

    /// The model the standard's AQLs call for when none is given: Poisson
    /// (nonconformities per unit) when some AQL is above 10, which the
    /// standard gives in nonconformities per 100 units only; binomial
    /// (fraction nonconforming) otherwise.
    pub fn default_model(classes: &[ClassAql]) -> ModelKind {
        if classes.iter().any(|c| c.aql.per_hundred_units_only()) {
            ModelKind::Poisson
        } else {
            ModelKind::Binomial
        }
    }

    /// The lot size.
    pub fn lot_size(&self) -> u64 {
        self.lot_size
    }

    /// The inspection level.
    pub fn level(&self) -> InspectionLevel {
        self.level
    }

    /// The classes, in the order given.
    pub fn classes(&self) -> &[ClassAql] {
        &self.classes
    }

    /// The severity in force.
    pub fn severity(&self) -> Severity {
        self.severity
    }

    /// The scheme.
    pub fn scheme(&self) -> Scheme {
        self.scheme
    }

    /// The model.
    pub fn model(&self) -> &Model {
        &self.model
    }

    /// Whether reduced inspection is part of the scheme.
    pub fn reduced(&self) -> bool {
        self.reduced
    }

    /// How classes whose plans differ in sample size are treated.
    pub fn rule(&self) -> ClassRule {
        self.rule
    }

    /// The severities of the scheme: all three, or normal and tightened.
    pub fn severities(&self) -> Vec<Severity> {
        Severity::ALL
            .into_iter()
            .filter(|s| self.reduced || *s != Severity::Reduced)
            .collect()
    }
}

/// One quality on the OC curves of one class: `Pa` under the plan of each
/// severity (`None` where that severity's answer is to inspect every unit,
/// or reduced inspection is left out).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SeverityPa {
    /// The quality.
    pub quality: f64,
    /// `Pa` on normal inspection.
    pub normal: Option<f64>,
    /// `Pa` on tightened inspection.
    pub tightened: Option<f64>,
    /// `Pa` on reduced inspection.
    pub reduced: Option<f64>,
    /// The switching scheme's long-run `Pa` (`None` when the scheme's OC
    /// cannot be given; [`ClassAssessment::scheme_note`] says why).
    pub scheme: Option<f64>,
}

/// One class's answer at every severity.
#[derive(Clone, Debug, PartialEq)]
pub struct ClassAssessment {
    /// The class and its AQL.
    pub class: ClassAql,
    /// The answer at each severity of the scheme, in the order normal,
    /// tightened, reduced.
    pub answers: Vec<(Severity, StandardAnswer)>,
    /// The true risks of the plan in force (`None` when its answer is to
    /// inspect every unit).
    pub risks: Option<TrueRisks>,
    /// The OC curves of the severities at the qualities asked for.
    pub points: Vec<SeverityPa>,
    /// Why the scheme's long-run `Pa` is not given, or that it is the
    /// middle of a proven bracket rather than exact; `None` when exact.
    pub scheme_note: Option<String>,
}

impl ClassAssessment {
    /// The class's switching scheme under `request`'s contract, with
    /// Table VIII from `tables`.
    ///
    /// # Errors
    /// As [`ClassScheme::new`].
    pub fn scheme(
        &self,
        request: &StandardRequest,
        tables: &Tables,
    ) -> Result<ClassScheme, SwitchingError> {
        ClassScheme::new(
            &self.answers,
            *request.model(),
            request.lot_size(),
            request.reduced(),
            tables,
        )
    }

    /// The answer at `severity`, if it is part of the scheme.
    pub fn at(&self, severity: Severity) -> Option<&StandardAnswer> {
        self.answers
            .iter()
            .find(|(s, _)| *s == severity)
            .map(|(_, a)| a)
    }
}

/// The whole answer.
#[derive(Clone, Debug, PartialEq)]
pub struct StandardAssessment {
    /// The request answered.
    pub request: StandardRequest,
    /// The plans of all classes at each severity of the scheme.
    pub plans: Vec<(Severity, ClassPlans)>,
    /// Each class, in the order given.
    pub classes: Vec<ClassAssessment>,
}

impl StandardAssessment {
    /// The plans of all classes at the severity in force.
    pub fn in_force(&self) -> &ClassPlans {
        let severity = self.request.severity;
        // `assess` looks up every severity of the scheme, the one in force
        // among them (`StandardRequest::new` refuses reduced in force when
        // it is left out).
        &self
            .plans
            .iter()
            .find(|(s, _)| *s == severity)
            .unwrap_or(&self.plans[0])
            .1
    }
}

/// Answers `request` from `tables`: every class's plan at each severity,
/// the true risks of the plans in force (against `consumer` when given),
/// and `Pa` of every severity's plan at `at` (by default, qualities
/// spread over the OC curve of the first class's plan in force).
///
/// # Errors
/// As [`Tables::classes_for_lot`] for any severity of the scheme (a cell
/// not transcribed on reduced inspection names the cell; leaving reduced
/// inspection out avoids it); as [`true_risks`].
///
/// # Example
/// ```
/// use lotsman::{ClassRule, InspectionLevel, Model, ModelKind, Scheme, Severity,
///     StandardIndex, StandardRequest, Tables, assess, parse_classes};
/// let index = StandardIndex {
///     lot_size: 1500, level: InspectionLevel::II, classes: parse_classes(&["1.0"]).unwrap(),
///     severity: Severity::Normal, scheme: Scheme::Single, reduced: true, rule: ClassRule::OwnPlans,
/// };
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// let request = StandardRequest::new(index, model).unwrap();
/// let a = assess(&request, Tables::builtin().unwrap(), None, None).unwrap();
/// let plan = a.classes[0].at(Severity::Tightened).unwrap().plan().unwrap();
/// assert_eq!(plan.stages.stages()[0].accept, Some(2)); // 105E Table II-B, K at 1.0: Ac 2 Re 3
/// ```
pub fn assess(
    request: &StandardRequest,
    tables: &Tables,
    at: Option<&[f64]>,
    consumer: Option<ConsumerPoint>,
) -> Result<StandardAssessment, StandardError> {
    let plans = plans_by_severity(request, tables)?;
    let model = &request.model;
    let qualities = match at {
        Some(q) => q.to_vec(),
        None => default_at(&plans, request, model)?,
    };
    let mut classes = Vec::with_capacity(request.classes.len());
    for (i, class) in request.classes.iter().enumerate() {
        let answers: Vec<(Severity, StandardAnswer)> = plans
            .iter()
            .map(|(s, p)| (*s, p.classes[i].answer.clone()))
            .collect();
        let in_force = answers
            .iter()
            .find(|(s, _)| *s == request.severity)
            .and_then(|(_, a)| a.plan());
        let risks = match in_force {
            Some(plan) => Some(true_risks(plan, model, &qualities, consumer)?),
            None => None,
        };
        let mut staged = Vec::with_capacity(answers.len());
        for (s, a) in &answers {
            let plan = match a.plan() {
                Some(p) => Some(p.plan_for(model)?),
                None => None,
            };
            staged.push((*s, plan));
        }
        let pa_of = |severity: Severity, q: f64| {
            staged
                .iter()
                .find(|(s, _)| *s == severity)
                .and_then(|(_, p)| p.as_ref())
                .map(|p| acceptance_probability(p, model, q))
        };
        let points = qualities
            .iter()
            .map(|&q| SeverityPa {
                quality: q,
                normal: pa_of(Severity::Normal, q),
                tightened: pa_of(Severity::Tightened, q),
                reduced: pa_of(Severity::Reduced, q),
                scheme: None,
            })
            .collect();
        let mut assessed = ClassAssessment {
            class: class.clone(),
            answers,
            risks,
            points,
            scheme_note: None,
        };
        assessed.scheme_note = scheme_points(&mut assessed, request, tables);
        classes.push(assessed);
    }
    Ok(StandardAssessment {
        request: request.clone(),
        plans,
        classes,
    })
}

/// The plans of every class of `request` at each severity of its scheme
/// (normal, tightened and, unless left out, reduced), from `tables`: the
/// look-up [`assess`] answers from, and which a plan source records.
///
/// # Errors
/// As [`Tables::classes_for_lot`] for any severity of the scheme.
pub fn plans_by_severity(
    request: &StandardRequest,
    tables: &Tables,
) -> Result<Vec<(Severity, ClassPlans)>, StandardError> {
    request
        .severities()
        .into_iter()
        .map(|severity| {
            let plans = tables.classes_for_lot(
                request.lot_size,
                request.level,
                &request.classes,
                severity,
                request.scheme,
                request.rule,
            )?;
            Ok((severity, plans))
        })
        .collect()
}

/// The qualities shown by default: those spread over the OC curve of the
/// first class's plan in force, with its AQL among them; a class to be
/// inspected in full has no curve, so the next class's plan serves.
fn default_at(
    plans: &[(Severity, ClassPlans)],
    request: &StandardRequest,
    model: &Model,
) -> Result<Vec<f64>, StandardError> {
    let in_force = plans
        .iter()
        .find(|(s, _)| *s == request.severity)
        .map(|(_, p)| p);
    let first = in_force.and_then(|p| p.classes.iter().find_map(|c| c.answer.plan()));
    let mut qs = match first {
        Some(plan) => default_qualities(&plan.plan_for(model)?, model, None),
        None => Vec::new(),
    };
    for c in &request.classes {
        let q = c.aql.quality();
        if !qs.iter().any(|x| (x - q).abs() <= 1e-12 * q) {
            qs.push(q);
        }
    }
    qs.sort_by(f64::total_cmp);
    Ok(qs)
}

/// Fills in the scheme's long-run `Pa` at each point of `class`, and says
/// why not, or that the figures are bracketed, in the returned note.
fn scheme_points(
    class: &mut ClassAssessment,
    request: &StandardRequest,
    tables: &Tables,
) -> Option<String> {
    let scheme = match class.scheme(request, tables) {
        Ok(s) => s,
        Err(e) => return Some(format!("the switching scheme's OC is not given: {e}")),
    };
    let work = scheme.work(class.points.len());
    if let Err(e) = work.check(
        "the switching scheme's OC with reduced inspection",
        "ask for fewer qualities with --at, or leave reduced inspection out with --no-reduced (the scheme's OC is then exact and quick)",
    ) {
        return Some(format!("the switching scheme's OC is not given: {e}"));
    }
    let mut note = None;
    for point in &mut class.points {
        match scheme.long_run(point.quality) {
            Ok(oc) => {
                point.scheme = Some(oc.figures.pa);
                if let super::switching::WindowSolution::Bracketed { states, .. } = oc.window {
                    note = Some(format!(
                        "the scheme's OC follows the limit-number rule over {states} states lot by lot, with a proven bound on the rest: each figure lies within about 1e-13 of the value given"
                    ));
                }
            }
            Err(e) => {
                return Some(format!(
                    "the switching scheme's OC is not given at quality {}: {e}",
                    point.quality
                ));
            }
        }
    }
    note
}
