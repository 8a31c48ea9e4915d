//! What a lookup in the standard's tables answers: a plan read from a
//! master table, with where it was read and what that cell rests on, or,
//! when the plan's sample would take the whole lot, the standard's rule to
//! inspect every unit (the footnote of its master tables).

use super::aql::Aql;
use super::error::StandardError;
use super::letter::CodeLetter;
use super::severity::Severity;
use crate::design::Scheme;
use crate::model::Model;
use crate::plan::{Stage, StagedPlan};

/// A plan read from the standard's tables.
///
/// `stages` is the plan that decides each lot, on cumulative sample sizes
/// as `design` gives plans (a stage of a multiple plan that cannot accept
/// has `accept: None`). It is the table's own numbers
/// (`table_numbers`), except on reduced inspection, where the table's last
/// stage may leave a gap between Ac and Re: a count in the gap accepts
/// the lot and returns the next lot to normal inspection (105E,
/// 4.10.1.4), so `stages` accepts up to `Re - 1` and
/// [`StandardPlan::reinstates_normal`] tells the gap apart.
#[derive(Clone, Debug, PartialEq)]
pub struct StandardPlan {
    /// The code letter looked up (from Table I, or given).
    pub code_letter: CodeLetter,
    /// The letter of the row the plan was read from, after the arrows:
    /// its sample sizes are the plan's.
    pub plan_letter: CodeLetter,
    /// The AQL.
    pub aql: Aql,
    /// The severity of inspection.
    pub severity: Severity,
    /// The scheme asked for.
    pub scheme: Scheme,
    /// The scheme of the table the plan was read from: the single table
    /// where a double or multiple table says `*`, the double table where a
    /// multiple table says `++`.
    pub table_scheme: Scheme,
    /// The name of the table the plan was read from.
    pub table: String,
    /// The stages with the acceptance and rejection numbers as the table
    /// prints them.
    pub table_numbers: Vec<Stage>,
    /// The plan that decides each lot.
    pub stages: StagedPlan,
    /// What the table cell rests on (for the built-in tables, its line in
    /// `provenance.csv`; for a user table, the file and its SHA-256).
    pub basis: String,
    /// Whether that basis is memory of the printed standard rather than a
    /// reading of it.
    pub from_memory: bool,
    /// How the plan was found and what to know when using it, in plain
    /// words: arrows followed, `*` or `++` read, the reduced-inspection
    /// gap, a basis in memory.
    pub notes: Vec<String>,
}

impl StandardPlan {
    /// The largest number of units the plan can inspect: the sample size,
    /// or the last cumulative sample size of a double or multiple plan.
    pub fn sample_size(&self) -> u64 {
        self.stages.max_sample()
    }

    /// Whether a lot accepted at `stage` (counted from 1) with a
    /// cumulative count of `count` sends the next lot to normal
    /// inspection: on reduced inspection, a count above the table's Ac and
    /// below its Re at the last stage (105E, 4.7.4 b and 4.10.1.4).
    pub fn reinstates_normal(&self, stage: usize, count: u64) -> bool {
        let last = self.table_numbers.len();
        self.severity == Severity::Reduced
            && stage == last
            && self
                .table_numbers
                .last()
                .is_some_and(|s| s.accept.is_some_and(|a| count > a) && count < s.reject)
    }

    /// The plan that decides each lot, checked for `model`: the AQL must
    /// be one the model can carry (above 10 only Poisson), and the plan
    /// must fit the model's lot.
    ///
    /// # Errors
    /// [`StandardError::AqlNeedsPoisson`]; [`StandardError::Input`] when
    /// the plan breaks a rule of the model (a sample larger than the lot,
    /// an acceptance number not below its sample size under a model of
    /// the fraction nonconforming).
    pub fn plan_for(&self, model: &Model) -> Result<StagedPlan, StandardError> {
        self.aql.check_model(model.kind())?;
        Ok(StagedPlan::new(self.stages.stages().to_vec(), model)?)
    }
}

/// The standard's 100 percent rule: the plan's sample (its last
/// cumulative sample in a double or multiple plan) equals or exceeds the
/// lot, so every unit of the lot is inspected instead.
#[derive(Clone, Debug, PartialEq)]
pub struct InspectAll {
    /// The lot size.
    pub lot_size: u64,
    /// The plan the tables give, whose sample reaches the lot.
    pub plan: StandardPlan,
}

impl InspectAll {
    /// Why, in plain words.
    pub fn reason(&self) -> String {
        format!(
            "the table plan (code letter {}) inspects up to {} units, which {} the lot of {}: inspect every unit of the lot instead (the 100 percent rule of the standard's master tables)",
            self.plan.plan_letter,
            self.plan.sample_size(),
            if self.plan.sample_size() == self.lot_size {
                "equals"
            } else {
                "exceeds"
            },
            self.lot_size
        )
    }
}

/// What the standard gives for a lot: a sampling plan, or every unit.
#[derive(Clone, Debug, PartialEq)]
pub enum StandardAnswer {
    /// Sample by this plan.
    Sample(StandardPlan),
    /// Inspect every unit of the lot.
    InspectAll(InspectAll),
}

impl StandardAnswer {
    /// The table plan, whether it samples or reaches the lot.
    pub fn table_plan(&self) -> &StandardPlan {
        match self {
            StandardAnswer::Sample(p) => p,
            StandardAnswer::InspectAll(a) => &a.plan,
        }
    }

    /// The sampling plan; `None` when every unit is to be inspected.
    pub fn plan(&self) -> Option<&StandardPlan> {
        match self {
            StandardAnswer::Sample(p) => Some(p),
            StandardAnswer::InspectAll(_) => None,
        }
    }
}
