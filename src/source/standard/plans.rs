//! The plans a standard-indexed source records, read back for use: checked
//! as table plans, and turned into the standard's [`ClassPlans`] at a
//! severity, which `judge` decides a lot by and `evaluate` evaluates.
//!
//! A recorded plan is used as recorded: its stages are the table's
//! numbers, so on reduced inspection a final count between Ac and Re
//! accepts the lot (105E, 4.10.1.4), as a plan read from the tables does.

use super::request::{StandardSourceRequest, plain};
use super::schema::RecordedTablePlan;
use crate::design::Scheme;
use crate::input::InputError;
use crate::model::{Model, ModelKind};
use crate::plan::{Stage, StagedPlan, measures};
use crate::source::{PlanSource, RecordedPlan};
use crate::standard::{
    ClassAql, ClassPlan, ClassPlans, CodeLetter, InspectAll, Severity, StandardAnswer,
    StandardPlan, StandardRequest, table_name,
};

/// What [`StandardPlan::basis`] says of a plan read back from a source.
const AS_RECORDED: &str = "as recorded in the plan source";

/// The stages that decide a lot, from the table's numbers at `severity`:
/// on reduced inspection a final count below Re accepts (105E, 4.10.1.4).
fn deciding(stages: &[Stage], severity: Severity) -> Vec<Stage> {
    let mut lot = stages.to_vec();
    if severity == Severity::Reduced
        && let Some(last) = lot.last_mut()
    {
        last.accept = Some(last.reject.saturating_sub(1));
    }
    lot
}

/// The form of the table a plan of `stages` stages comes from.
fn form_of(stages: usize) -> Scheme {
    match stages {
        1 => Scheme::Single,
        2 => Scheme::Double,
        _ => Scheme::Multiple,
    }
}

impl PlanSource {
    /// The recorded plan of a standard-indexed source, checked: it records
    /// the lot's code letter and one entry per class of the `standard`
    /// section (same names and AQLs, in order), each with a plan at normal
    /// and tightened inspection and at reduced inspection exactly when it
    /// is not left out; each plan a valid table plan (stages rising, Ac
    /// below Re, a last stage that can accept); a sampling plan whose
    /// sample stays below the lot; and none of the figures of plans
    /// designed from two risk points.
    ///
    /// # Errors
    /// [`InputError::NotSolved`] when the source records no plan or a plan
    /// of another kind; [`InputError`] naming the class, severity and what
    /// is wrong otherwise.
    pub fn recorded_standard(&self) -> Result<(&RecordedPlan, StandardSourceRequest), InputError> {
        let source_request = self.standard_request()?;
        let request = &source_request.request;
        let recorded = self
            .plan
            .as_ref()
            .ok_or_else(crate::source::error::not_solved)?;
        let other = !recorded.stages.is_empty()
            || recorded.sequential.is_some()
            || recorded.variables.is_some();
        if other || recorded.code_letter.is_none() || recorded.classes.is_empty() {
            return Err(InputError::NotSolved {
                why: "the recorded plan is not a standard-indexed plan (plan: code_letter: and classes:, with each class's plan at each severity)".to_string(),
            });
        }
        for (key, given) in [
            ("producer_risk", recorded.producer_risk.is_some()),
            ("consumer_risk", recorded.consumer_risk.is_some()),
            ("ati", recorded.ati.is_some()),
            ("aoql", recorded.aoql.is_some()),
        ] {
            if given {
                return Err(InputError::Inconsistent(format!(
                    "plan.{key} belongs to plans designed from two risk points or for rectifying inspection, and this source's scheme is standard; remove it"
                )));
            }
        }
        if recorded.classes.len() != request.classes().len() {
            return Err(InputError::NotSolved {
                why: format!(
                    "the recorded plan has {} classes and the standard section {}",
                    recorded.classes.len(),
                    request.classes().len()
                ),
            });
        }
        for (i, (r, c)) in recorded.classes.iter().zip(request.classes()).enumerate() {
            if r.name != c.name || r.aql != c.aql {
                return Err(InputError::NotSolved {
                    why: format!(
                        "class {} of the recorded plan is {} with AQL {}, and the standard section names {} with AQL {}",
                        i + 1,
                        r.label(),
                        r.aql,
                        c.label(),
                        c.aql
                    ),
                });
            }
            if r.reduced.is_some() != request.reduced() {
                return Err(InputError::NotSolved {
                    why: format!(
                        "class {} of the recorded plan {} a reduced plan, and the standard section {} reduced inspection",
                        r.label(),
                        if !request.reduced() { "has" } else { "has no" },
                        if !request.reduced() {
                            "leaves out"
                        } else {
                            "keeps"
                        },
                    ),
                });
            }
            for severity in request.severities() {
                if let Some(plan) = r.at(severity) {
                    check_table_plan(plan, severity, request.lot_size()).map_err(|why| {
                        InputError::Inconsistent(format!(
                            "the recorded {severity} plan of class {} is not a table plan: {why}",
                            r.label()
                        ))
                    })?;
                }
            }
        }
        Ok((recorded, source_request))
    }

    /// The recorded plans of every class at `severity` (`None`: the
    /// severity in force, `standard.severity`), as the plans a lot is
    /// judged and evaluated by.
    ///
    /// ```
    /// use lotsman::{PlanSource, Severity, template};
    /// let path = std::path::Path::new("s.yaml");
    /// let mut source = PlanSource::from_yaml(template("standard").unwrap(), path).unwrap();
    /// source.record_standard_at(path).unwrap();
    /// let plans = source.recorded_class_plans(Some(Severity::Tightened)).unwrap();
    /// let major = plans.classes[1].answer.plan().unwrap();
    /// assert_eq!(major.stages.as_single(), Some((125, 2)));
    /// ```
    ///
    /// # Errors
    /// As [`PlanSource::recorded_standard`]; [`InputError`] for reduced
    /// inspection on a source that leaves it out.
    pub fn recorded_class_plans(
        &self,
        severity: Option<Severity>,
    ) -> Result<ClassPlans, InputError> {
        let (recorded, source_request) = self.recorded_standard()?;
        let request = &source_request.request;
        let severity = severity.unwrap_or(request.severity());
        let code_letter = recorded.code_letter.unwrap_or_default();
        let mut classes = Vec::with_capacity(recorded.classes.len());
        for (r, class) in recorded.classes.iter().zip(request.classes()) {
            let Some(plan) = r.at(severity) else {
                return Err(InputError::Inconsistent(
                    "the source leaves reduced inspection out (no_reduced: true), so it records no reduced plan: choose normal or tightened inspection".to_string(),
                ));
            };
            classes.push(class_plan(class, plan, severity, code_letter, request)?);
        }
        Ok(ClassPlans {
            code_letter,
            lot_size: request.lot_size(),
            rule: request.rule(),
            classes,
        })
    }

    /// What the recorded plan of the first class at the severity in force
    /// achieves: `1 - Pa` at its AQL, and `Pa` at the consumer's quality
    /// (without one, at the quality where `Pa` falls to 0.10, so 0.10); a
    /// class that inspects every unit runs neither risk.
    ///
    /// # Errors
    /// As [`PlanSource::recorded_class_plans`].
    pub(crate) fn standard_achieved(&self) -> Result<(f64, f64), InputError> {
        let plans = self.recorded_class_plans(None)?;
        let source_request = self.standard_request()?;
        let Some(first) = plans.classes.first() else {
            return Ok((0.0, 0.0));
        };
        let Some(plan) = first.answer.plan() else {
            return Ok((0.0, 0.0));
        };
        let model = source_request.request.model();
        let staged = plan.plan_for(model).map_err(plain)?;
        let producer = 1.0 - measures(&staged, model, first.class.aql.quality()).pa;
        let consumer = match source_request.consumer {
            Some(point) if model.accepts_quality(point.rql) => {
                measures(&staged, model, point.rql).pa
            }
            _ => 0.10,
        };
        Ok((producer, consumer))
    }
}

/// The standard's plan of one class from its record.
fn class_plan(
    class: &ClassAql,
    recorded: &RecordedTablePlan,
    severity: Severity,
    code_letter: CodeLetter,
    request: &StandardRequest,
) -> Result<ClassPlan, InputError> {
    let loose = Model::new(ModelKind::Poisson, None)?;
    let table_scheme = form_of(recorded.stages.len());
    let plan = StandardPlan {
        code_letter,
        plan_letter: recorded.plan_letter,
        aql: class.aql,
        severity,
        scheme: request.scheme(),
        table_scheme,
        table: table_name(severity, table_scheme),
        table_numbers: recorded.stages.clone(),
        stages: StagedPlan::new(deciding(&recorded.stages, severity), &loose)?,
        basis: AS_RECORDED.to_string(),
        from_memory: false,
        notes: Vec::new(),
    };
    let answer = if recorded.inspect_all {
        StandardAnswer::InspectAll(InspectAll {
            lot_size: request.lot_size(),
            plan,
        })
    } else {
        StandardAnswer::Sample(plan)
    };
    Ok(ClassPlan {
        class: class.clone(),
        answer,
    })
}

/// Checks one recorded table plan at `severity` for a lot of `lot_size`.
fn check_table_plan(
    plan: &RecordedTablePlan,
    severity: Severity,
    lot_size: u64,
) -> Result<(), String> {
    let stages = &plan.stages;
    if stages.is_empty() || stages.len() > 7 {
        return Err(format!(
            "it has {} stages, and a table plan has 1 (single), 2 (double) or up to 7 (multiple)",
            stages.len()
        ));
    }
    if stages.last().is_some_and(|s| s.accept.is_none()) {
        return Err("its last stage cannot accept, so it decides no lot".to_string());
    }
    if severity != Severity::Reduced
        && let Some(last) = stages.last()
        && last
            .accept
            .is_some_and(|a| a.saturating_add(1) != last.reject)
    {
        return Err(format!(
            "its last stage leaves a gap between Ac and Re ({}), which only a reduced plan may",
            last
        ));
    }
    let loose = Model::new(ModelKind::Poisson, None).map_err(|e| e.to_string())?;
    StagedPlan::new(deciding(stages, severity), &loose).map_err(|e| e.to_string())?;
    let sample = stages.last().map_or(0, |s| s.n);
    if !plan.inspect_all && sample >= lot_size {
        return Err(format!(
            "it samples up to {sample} units from a lot of {lot_size}, so the tables' rule is to inspect every unit (inspect_all: true)"
        ));
    }
    Ok(())
}
