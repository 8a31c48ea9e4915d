//! What the sheet of a standard-indexed plan prints from: the document's
//! fields, the lot and its code letter, and for each class of defects
//! its table plans at normal, tightened and reduced inspection with the
//! risks its plan in force really gives ([`StandardFacts`]). The caller
//! answers the request with [`assess`](crate::standard::assess) and turns
//! the answer into facts with [`StandardFacts::from_assessment`];
//! the sheet computes nothing it could get wrong silently: it checks that
//! the facts hang together and draws them.

use rayon::prelude::*;

use crate::design::Scheme;
use crate::input::InputError;
use crate::model::{Model, ModelKind};
use crate::plan::{StagedPlan, quality_at_pa};
use crate::print::chart::scale::nice_ceiling;
use crate::standard::{
    Aql, ClassRule, ClassScheme, CodeLetter, InspectionLevel, LimitNumber, MIN_WINDOW_LOTS,
    Severity, StandardAnswer, StandardAssessment, StandardError, StandardPlan, TableSlot, Tables,
    TrueRisks,
};

/// The qualities at which the chart's scheme curve is computed.
pub const SCHEME_POINTS: usize = 80;

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

/// What Table VIII gives a class for switching from normal to reduced
/// inspection (105E, 4.7.3 b).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ReducedLimit {
    /// The lots the rule counts: ten, or more where Table VIII prints `*`
    /// at ten (the window of [`ClassScheme::limit_window`]).
    pub lots: u32,
    /// The sample units those lots on normal inspection give: `lots`
    /// times the sample (the first sample of a double or multiple plan,
    /// the least a lot gives).
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
    /// The model its counts follow (the assessment's).
    pub model: Model,
    /// The answer at each severity of the scheme, in the order normal,
    /// tightened, reduced (reduced left out where the contract leaves it
    /// out), as [`ClassAssessment::answers`](crate::standard::ClassAssessment::answers).
    pub answers: Vec<(Severity, StandardAnswer)>,
    /// The true risks of the plan in force ([`true_risks`](crate::standard::true_risks));
    /// `None` when it inspects every unit.
    pub risks: Option<TrueRisks>,
    /// Table VIII's limit number for the move to reduced inspection;
    /// `None` with no reduced inspection or when normal inspection takes
    /// every unit.
    pub limit: Option<ReducedLimit>,
}

impl StandardClassFacts {
    /// The answer at `severity`, if the class has one.
    pub fn at(&self, severity: Severity) -> Option<&StandardAnswer> {
        self.answers
            .iter()
            .find(|(s, _)| *s == severity)
            .map(|(_, a)| a)
    }

    /// Whether its counts are nonconformities per unit.
    pub fn per_unit(&self) -> bool {
        self.model.kind() == ModelKind::Poisson
    }
}

/// The long-run OC of the switching scheme on the sheet's chart.
#[derive(Clone, Debug, PartialEq)]
pub enum SchemeCurve {
    /// `(quality, Pa)` in the chart class's units.
    Drawn(Vec<(f64, f64)>),
    /// Why it is not drawn, in plain words: the chart says so in a note.
    Refused(String),
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
    /// The long-run OC of the switching scheme for the chart's class.
    pub scheme_oc: SchemeCurve,
}

impl StandardFacts {
    /// The facts of the assessment `a` (from [`assess`](crate::standard::assess))
    /// with the document's fields: each class's answers at each severity
    /// and the true risks of its plan in force as `a` gives them, Table
    /// VIII's limit number for ten lots of the normal plan's (first)
    /// sample read from `tables` (the tables `a` was answered from), and
    /// the switching scheme's long-run OC of the chart's class at
    /// [`SCHEME_POINTS`] qualities across the chart
    /// ([`StandardFacts::chart_reach`]), or why it is not drawn.
    ///
    /// # Errors
    /// [`StandardError`] when a plan of the chart's class does not fit
    /// the model.
    pub fn from_assessment(
        document: SheetDocument,
        a: &StandardAssessment,
        tables: &Tables,
    ) -> Result<StandardFacts, StandardError> {
        let r = &a.request;
        let limit_from_memory = !tables
            .user_tables()
            .iter()
            .any(|(slot, _, _)| *slot == TableSlot::LimitNumbers);
        let classes: Vec<StandardClassFacts> = a
            .classes
            .iter()
            .map(|c| {
                let limit = match (r.reduced(), c.at(Severity::Normal).and_then(|n| n.plan())) {
                    (true, Some(plan)) => {
                        let first = plan.stages.stages()[0].n;
                        // The window the scheme counts; where Table VIII
                        // gives none, what it prints at ten lots says why.
                        let (lots, number) = match ClassScheme::limit_window(tables, plan) {
                            Some(w) => (w.lots(), LimitNumber::Number(u64::from(w.limit()))),
                            None => (
                                MIN_WINDOW_LOTS,
                                tables
                                    .limit_number(u64::from(MIN_WINDOW_LOTS) * first, c.class.aql),
                            ),
                        };
                        Some(ReducedLimit {
                            lots,
                            units: u64::from(lots) * first,
                            number,
                            from_memory: limit_from_memory,
                        })
                    }
                    _ => None,
                };
                StandardClassFacts {
                    name: c.class.label(),
                    aql: c.class.aql,
                    model: *r.model(),
                    answers: c.answers.clone(),
                    risks: c.risks.clone(),
                    limit,
                }
            })
            .collect();
        let mut facts = StandardFacts {
            document,
            lot_size: r.lot_size(),
            level: r.level(),
            code_letter: a.in_force().code_letter,
            scheme: r.scheme(),
            severity: r.severity(),
            rule: r.rule(),
            classes,
            user_tables: tables
                .user_tables()
                .iter()
                .map(|(slot, file, sha)| format!("{}: {file} (SHA-256 {sha})", slot_name(*slot)))
                .collect(),
            scheme_oc: SchemeCurve::Refused(String::new()),
        };
        facts.scheme_oc = match facts.chart_class() {
            Some(k) => facts.scheme_curve(a, k, tables)?,
            None => SchemeCurve::Refused("every class inspects every unit".to_string()),
        };
        Ok(facts)
    }

    /// The switching scheme's long-run OC of class `k` of `a` at
    /// [`SCHEME_POINTS`] qualities evenly across the chart
    /// ([`ClassScheme::long_run`](crate::standard::ClassScheme::long_run)), or why it is not drawn: the scheme
    /// cannot be built, its estimated work is beyond the budget, or a
    /// point is refused.
    ///
    /// # Errors
    /// As [`StandardFacts::chart_reach`].
    fn scheme_curve(
        &self,
        a: &StandardAssessment,
        k: usize,
        tables: &Tables,
    ) -> Result<SchemeCurve, StandardError> {
        let reach = self.chart_reach(k)?;
        let scheme = match a.classes[k].scheme(&a.request, tables) {
            Ok(s) => s,
            Err(e) => return Ok(SchemeCurve::Refused(e.to_string())),
        };
        if let Err(e) = scheme.work(SCHEME_POINTS).check(
            "the switching scheme's curve",
            "the chart shows each severity's own curve, and the standard command gives the scheme's OC at a few qualities",
        ) {
            return Ok(SchemeCurve::Refused(e.to_string()));
        }
        // The chain takes qualities up to 1: a chart of nonconformities
        // per unit reaching beyond shows the scheme's curve up to 1.
        let qualities: Vec<f64> = (1..=SCHEME_POINTS)
            .map(|i| reach * i as f64 / SCHEME_POINTS as f64)
            .filter(|&q| q <= 1.0)
            .collect();
        // Each quality's chain is solved on its own (a few ms each with
        // reduced inspection): in parallel, the points kept in order, and
        // the first refusal in order reported, so the curve and its words
        // do not depend on the threads.
        let solved: Vec<_> = qualities
            .par_iter()
            .map(|&q| scheme.long_run(q).map(|oc| (q, oc.figures.pa)))
            .collect();
        match solved.into_iter().collect::<Result<Vec<_>, _>>() {
            Ok(points) => Ok(SchemeCurve::Drawn(points)),
            Err(e) => Ok(SchemeCurve::Refused(e.to_string())),
        }
    }

    /// The plans of class `k` at the severities on the sheet, ready to
    /// evaluate.
    ///
    /// # Errors
    /// [`StandardError`] when a plan does not fit the class's model.
    pub fn staged(
        &self,
        k: usize,
    ) -> Result<Vec<(Severity, &StandardPlan, StagedPlan)>, StandardError> {
        let cl = &self.classes[k];
        let mut plans = Vec::new();
        for s in self.severities() {
            if let Some(p) = cl.at(s).and_then(StandardAnswer::plan) {
                plans.push((s, p, p.plan_for(&cl.model)?));
            }
        }
        Ok(plans)
    }

    /// The right end of the OC chart of class `k`: a round quality half as
    /// far again as where every plan's `Pa` falls to 0.02 (and twice the
    /// AQL), so that the top right corner is clear for the legend.
    ///
    /// # Errors
    /// As [`StandardFacts::staged`].
    pub fn chart_reach(&self, k: usize) -> Result<f64, StandardError> {
        let cl = &self.classes[k];
        let reach = self
            .staged(k)?
            .iter()
            .map(|(_, _, staged)| quality_at_pa(staged, &cl.model, 0.02))
            .fold(cl.aql.quality() * 2.0, f64::max);
        Ok(nice_ceiling(reach * 1.5))
    }

    /// The index of the class the OC chart shows: the first one sampled
    /// at normal inspection, else the first one sampled at any severity;
    /// `None` when every class inspects every unit.
    pub fn chart_class(&self) -> Option<usize> {
        let sampled = |s: Severity| {
            self.classes
                .iter()
                .position(|c| c.at(s).is_some_and(|p| p.plan().is_some()))
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
        let with_reduced = self
            .classes
            .iter()
            .filter(|c| c.at(Severity::Reduced).is_some())
            .count();
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
        self.classes
            .iter()
            .all(|c| c.at(Severity::Reduced).is_some())
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
