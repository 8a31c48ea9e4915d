//! What the sheet of a standard-indexed plan prints from: the document's
//! fields, the lot and its code letter, and for each class of defects
//! its table plans at normal, tightened and reduced inspection with the
//! risks each really gives ([`StandardFacts`]). The caller gathers them
//! (from a source, or with [`StandardFacts::look_up`] from the tables);
//! the sheet computes nothing it could get wrong silently: it checks that
//! the facts hang together and draws them.

use crate::design::Scheme;
use crate::input::InputError;
use crate::model::{Model, ModelKind};
use crate::standard::{
    Aql, ClassAql, ClassRule, CodeLetter, ConsumerPoint, InspectionLevel, LimitNumber, Severity,
    StandardAnswer, StandardError, TableSlot, Tables, TrueRisks, true_risks,
};

/// The fields of a sheet as a controlled document: what its title block,
/// approval and footer print.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct SheetDocument {
    /// The title.
    pub title: String,
    /// The item inspected (part name and number).
    pub item: Option<String>,
    /// The characteristic inspected and what counts as nonconforming.
    pub characteristic: Option<String>,
    /// The plan ID (document number).
    pub id: Option<String>,
    /// The revision.
    pub revision: Option<String>,
    /// The revision's date, `YYYY-MM-DD` (from the source, never the clock).
    pub date: Option<String>,
    /// Who prepared the plan.
    pub prepared_by: Option<String>,
    /// Who approved it.
    pub approved_by: Option<String>,
    /// The source's file name, as the footer names it.
    pub file_name: String,
    /// The hex SHA-256 of the source text: printed in the footer, written
    /// in the PDF's subject, and the document ID.
    pub source_sha256: String,
    /// The command that prints the sheet again, as the footer gives it
    /// (`lotsman sheet plan.yaml --force`).
    pub regenerate: String,
}

/// One severity's answer for one class, with the risks its plan really
/// gives.
#[derive(Clone, Debug, PartialEq)]
pub struct SeverityPlan {
    /// The table plan, or every unit.
    pub answer: StandardAnswer,
    /// The true risks of the plan ([`true_risks`]); `None` when every unit
    /// is inspected.
    pub risks: Option<TrueRisks>,
}

/// What Table VIII gives a class for switching from normal to reduced
/// inspection (105E, 4.7.3 b).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ReducedLimit {
    /// The sample units ten lots on normal inspection give: ten times the
    /// sample (the first sample of a double or multiple plan, the least a
    /// lot gives).
    pub units: u64,
    /// The limit number there.
    pub number: LimitNumber,
    /// Whether Table VIII was entered from memory rather than read (the
    /// built-in table is; a user's is not).
    pub from_memory: bool,
}

/// One class of defects on the sheet.
#[derive(Clone, Debug, PartialEq)]
pub struct StandardClassFacts {
    /// The class's name (`major`), or `AQL 1.0` for a single AQL given
    /// without one.
    pub name: String,
    /// Its AQL.
    pub aql: Aql,
    /// The model its counts follow: the Poisson model above AQL 10.
    pub model: Model,
    /// Normal inspection.
    pub normal: SeverityPlan,
    /// Tightened inspection.
    pub tightened: SeverityPlan,
    /// Reduced inspection; `None` where the contract leaves it out.
    pub reduced: Option<SeverityPlan>,
    /// Table VIII's limit number for the move to reduced inspection;
    /// `None` with no reduced inspection or when normal inspection takes
    /// every unit.
    pub limit: Option<ReducedLimit>,
}

impl StandardClassFacts {
    /// The plan at `severity`, if the class has one.
    pub fn at(&self, severity: Severity) -> Option<&SeverityPlan> {
        match severity {
            Severity::Normal => Some(&self.normal),
            Severity::Tightened => Some(&self.tightened),
            Severity::Reduced => self.reduced.as_ref(),
        }
    }

    /// Whether its counts are nonconformities per unit.
    pub fn per_unit(&self) -> bool {
        self.model.kind() == ModelKind::Poisson
    }
}

/// What the sheet of a standard-indexed plan prints.
#[derive(Clone, Debug, PartialEq)]
pub struct StandardFacts {
    /// The document's fields.
    pub document: SheetDocument,
    /// The lot size.
    pub lot_size: u64,
    /// The inspection level.
    pub level: InspectionLevel,
    /// The code letter of Table I for the lot size and level.
    pub code_letter: CodeLetter,
    /// The scheme asked for (single, double or multiple).
    pub scheme: Scheme,
    /// The severity in force for the lots this sheet is used on.
    pub severity: Severity,
    /// How classes whose arrows lead to different rows were sampled.
    pub rule: ClassRule,
    /// The classes, the most important first: the OC chart shows the
    /// first one that is sampled at normal inspection
    /// ([`StandardFacts::chart_class`]).
    pub classes: Vec<StandardClassFacts>,
    /// The tables the user gave in place of the built-in ones: one line
    /// each, naming the table, the file and its SHA-256.
    pub user_tables: Vec<String>,
    /// The long-run OC of the switching scheme for the chart's class,
    /// `(quality, Pa)` in the class's units, when it has been computed.
    pub scheme_oc: Option<Vec<(f64, f64)>>,
}

/// What [`StandardFacts::look_up`] reads from the tables.
#[derive(Clone, Debug, PartialEq)]
pub struct StandardSheetRequest {
    /// The lot size.
    pub lot_size: u64,
    /// The inspection level.
    pub level: InspectionLevel,
    /// The classes with their AQLs, the most important first.
    pub classes: Vec<ClassAql>,
    /// Single, double or multiple.
    pub scheme: Scheme,
    /// The model of the counts (the Poisson model is taken for a class
    /// above AQL 10 whatever this says).
    pub model: ModelKind,
    /// The severity in force.
    pub severity: Severity,
    /// Whether reduced inspection is part of the scheme.
    pub reduced: bool,
    /// How classes whose arrows lead to different rows are sampled.
    pub rule: ClassRule,
    /// A consumer's point to hold every class's plans against.
    pub consumer: Option<ConsumerPoint>,
}

impl StandardFacts {
    /// The facts of `request` read from `tables`: each class's plans at
    /// the three severities (two with no reduced inspection), their true
    /// risks, and Table VIII's limit number for ten lots of the normal
    /// plan's (first) sample.
    ///
    /// # Errors
    /// [`StandardError`] as [`Tables::classes_for_lot`] and
    /// [`true_risks`] give it: a cell not transcribed, an AQL above 10
    /// with a model of the fraction nonconforming, an RQL not above a
    /// class's AQL.
    pub fn look_up(
        document: SheetDocument,
        tables: &Tables,
        request: &StandardSheetRequest,
    ) -> Result<StandardFacts, StandardError> {
        let r = request;
        let plans = |severity| {
            tables.classes_for_lot(r.lot_size, r.level, &r.classes, severity, r.scheme, r.rule)
        };
        let normal = plans(Severity::Normal)?;
        let tightened = plans(Severity::Tightened)?;
        let reduced = if r.reduced {
            Some(plans(Severity::Reduced)?)
        } else {
            None
        };
        let limit_from_memory = !tables
            .user_tables()
            .iter()
            .any(|(slot, _, _)| *slot == TableSlot::LimitNumbers);
        let mut classes = Vec::with_capacity(r.classes.len());
        for (k, class) in r.classes.iter().enumerate() {
            let kind = if class.aql.per_hundred_units_only() {
                ModelKind::Poisson
            } else {
                r.model
            };
            let model = Model::new(kind, Some(r.lot_size))?;
            let at = |answer: &StandardAnswer| -> Result<SeverityPlan, StandardError> {
                let risks = match answer.plan() {
                    Some(plan) => Some(true_risks(plan, &model, &[], r.consumer)?),
                    None => None,
                };
                Ok(SeverityPlan {
                    answer: answer.clone(),
                    risks,
                })
            };
            let normal_answer = &normal.classes[k].answer;
            let limit = match (r.reduced, normal_answer.plan()) {
                (true, Some(plan)) => {
                    let units = 10 * plan.stages.stages()[0].n;
                    Some(ReducedLimit {
                        units,
                        number: tables.limit_number(units, class.aql),
                        from_memory: limit_from_memory,
                    })
                }
                _ => None,
            };
            classes.push(StandardClassFacts {
                name: class.label(),
                aql: class.aql,
                model,
                normal: at(normal_answer)?,
                tightened: at(&tightened.classes[k].answer)?,
                reduced: match &reduced {
                    Some(p) => Some(at(&p.classes[k].answer)?),
                    None => None,
                },
                limit,
            });
        }
        Ok(StandardFacts {
            document,
            lot_size: r.lot_size,
            level: r.level,
            code_letter: normal.code_letter,
            scheme: r.scheme,
            severity: r.severity,
            rule: r.rule,
            classes,
            user_tables: tables
                .user_tables()
                .iter()
                .map(|(slot, file, sha)| format!("{}: {file} (SHA-256 {sha})", slot_name(*slot)))
                .collect(),
            scheme_oc: None,
        })
    }

    /// The index of the class the OC chart shows: the first one sampled
    /// at normal inspection, else the first one sampled at any severity;
    /// `None` when every class inspects every unit.
    pub fn chart_class(&self) -> Option<usize> {
        let sampled = |s: Severity| {
            self.classes
                .iter()
                .position(|c| c.at(s).is_some_and(|p| p.answer.plan().is_some()))
        };
        Severity::ALL.into_iter().find_map(sampled)
    }

    /// Checks that the facts hang together: at least one class, a
    /// reduced plan for every class or for none, and one where reduced
    /// inspection is in force.
    ///
    /// # Errors
    /// [`InputError::Inconsistent`] naming what does not.
    pub fn check(&self) -> Result<(), InputError> {
        let bad = |why: String| Err(InputError::Inconsistent(why));
        if self.classes.is_empty() {
            return bad("a standard-indexed sheet needs at least one class of defects".into());
        }
        let with_reduced = self.classes.iter().filter(|c| c.reduced.is_some()).count();
        if with_reduced != 0 && with_reduced != self.classes.len() {
            return bad(
                "reduced inspection is given for some classes and not for others: give it for every class or for none"
                    .into(),
            );
        }
        if self.severity == Severity::Reduced && with_reduced == 0 {
            return bad(
                "reduced inspection is in force, but the plan has no reduced inspection".into(),
            );
        }
        Ok(())
    }

    /// Whether reduced inspection is part of the scheme.
    pub fn has_reduced(&self) -> bool {
        self.classes.iter().all(|c| c.reduced.is_some())
    }

    /// The severities on the sheet: normal and tightened, and reduced
    /// where it is part of the scheme.
    pub fn severities(&self) -> Vec<Severity> {
        Severity::ALL
            .into_iter()
            .filter(|&s| s != Severity::Reduced || self.has_reduced())
            .collect()
    }
}

/// A table slot as the sheet names it.
fn slot_name(slot: TableSlot) -> String {
    match slot {
        TableSlot::CodeLetters => "Table I".to_string(),
        TableSlot::Master(severity, scheme) => crate::standard::table_name(severity, scheme),
        TableSlot::LimitNumbers => "Table VIII".to_string(),
    }
}
