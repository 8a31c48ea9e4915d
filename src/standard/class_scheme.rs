//! One class's switching scheme built from its table plans: the rules that
//! apply (reduced inspection in the contract or not, Table VIII's limit
//! number for the normal plan) and the per-lot outcomes of each severity's
//! plan at a quality, exactly, for the scheme's long-run OC
//! ([`SwitchingScheme::long_run`]).
//!
//! Each class of defects keeps its own switching state (MIL-STD-105E 4.6),
//! so each has its own scheme.
//!
//! The scheme's figures assume what the standard leaves to people: that
//! production is steady and the responsible authority approves reduced
//! inspection whenever the limit-number rule allows it (105E 4.7.3 c, d).
//!
//! The limit-number window counts the first samples of its lots (the
//! reading the switching module's doc recommends for double and multiple
//! plans: the fewest units those lots can have, so the smallest limit
//! number). Where Table VIII prints `*` for ten lots, the fewest more lots
//! whose units reach a printed number are counted (its note).

use super::answer::{StandardAnswer, StandardPlan};
use super::limit_numbers::LimitNumber;
use super::severity::Severity;
use super::switching::{
    LimitWindow, LotOutcomes, MAX_WINDOW_LOTS, MIN_WINDOW_LOTS, SchemeOc, SwitchingError,
    SwitchingRules, SwitchingScheme,
};
use super::tables::Tables;
use crate::budget::Work;
use crate::model::Model;
use crate::plan::{StagedPlan, stage_outcomes};

/// A class's switching scheme, ready to give its long-run OC at any
/// quality.
#[derive(Clone, Debug)]
pub struct ClassScheme {
    scheme: SwitchingScheme,
    model: Model,
    lot_size: u64,
    normal: StagedPlan,
    tightened: StagedPlan,
    reduced: Option<(StagedPlan, StandardPlan)>,
}

/// The plan of `severity` among `answers`, or why the scheme cannot
/// sample.
fn sampled(
    answers: &[(Severity, StandardAnswer)],
    severity: Severity,
    model: &Model,
) -> Result<Option<(StagedPlan, StandardPlan)>, SwitchingError> {
    match answers.iter().find(|(s, _)| *s == severity).map(|(_, a)| a) {
        None => Ok(None),
        Some(answer) => match answer.plan() {
            Some(plan) => {
                let staged = plan
                    .plan_for(model)
                    .map_err(|e| SwitchingError::Inconsistent(e.to_string()))?;
                Ok(Some((staged, plan.clone())))
            }
            None => Err(SwitchingError::Inconsistent(format!(
                "the {severity} plan inspects every unit of the lot, so the switching scheme has no sampling OC"
            ))),
        },
    }
}

/// Table VIII's window for the normal plan `normal` at the class's AQL:
/// ten lots, or the fewest more whose first-sample units reach a printed
/// limit number; `None` when the table prints none.
pub(crate) fn limit_window(tables: &Tables, normal: &StandardPlan) -> Option<LimitWindow> {
    let first = normal.stages.stages().first().map_or(0, |s| s.n);
    for lots in MIN_WINDOW_LOTS..=MAX_WINDOW_LOTS {
        match tables.limit_number(u64::from(lots) * first, normal.aql) {
            LimitNumber::Number(limit) => {
                return u32::try_from(limit)
                    .ok()
                    .and_then(|l| LimitWindow::new(lots, l).ok());
            }
            LimitNumber::TooFewUnits => continue,
            LimitNumber::NotPrinted => return None,
        }
    }
    None
}

impl ClassScheme {
    /// The scheme of a class whose answers at each severity are `answers`
    /// (reduced among them when `reduced`, the contract keeping reduced
    /// inspection), under `model` in lots of `lot_size`, with Table VIII
    /// from `tables`. [`ClassAssessment::scheme`](super::ClassAssessment::scheme)
    /// calls it with an assessed class.
    ///
    /// # Errors
    /// [`SwitchingError::Inconsistent`] when a severity's answer is to
    /// inspect every unit; [`SwitchingError::WindowTooLarge`] when the
    /// limit-number rule's exact window is beyond its budget.
    pub fn new(
        answers: &[(Severity, StandardAnswer)],
        model: Model,
        lot_size: u64,
        reduced: bool,
        tables: &Tables,
    ) -> Result<ClassScheme, SwitchingError> {
        let missing =
            |s: Severity| SwitchingError::Inconsistent(format!("the {s} plan was not looked up"));
        let (normal, normal_table) =
            sampled(answers, Severity::Normal, &model)?.ok_or_else(|| missing(Severity::Normal))?;
        let (tightened, _) = sampled(answers, Severity::Tightened, &model)?
            .ok_or_else(|| missing(Severity::Tightened))?;
        let (rules, reduced) = if reduced {
            let reduced = sampled(answers, Severity::Reduced, &model)?
                .ok_or_else(|| missing(Severity::Reduced))?;
            (
                SwitchingRules::new(true, limit_window(tables, &normal_table)),
                Some(reduced),
            )
        } else {
            (SwitchingRules::without_reduced(), None)
        };
        let largest = normal.stages().last().and_then(|s| s.accept).unwrap_or(0);
        Ok(ClassScheme {
            scheme: SwitchingScheme::new(rules, largest)?,
            model,
            lot_size,
            normal,
            tightened,
            reduced,
        })
    }

    /// The rules the scheme follows.
    pub fn rules(&self) -> &SwitchingRules {
        self.scheme.rules()
    }

    /// Whether the figures are exact rather than bracketed.
    pub fn exact(&self) -> bool {
        self.scheme.exact()
    }

    /// The estimated work of the long-run OC at `qualities` qualities.
    pub fn work(&self, qualities: usize) -> Work {
        self.scheme.work(qualities)
    }

    /// The scheme's long-run OC at `quality`.
    ///
    /// # Errors
    /// As [`SwitchingScheme::long_run`].
    pub fn long_run(&self, quality: f64) -> Result<SchemeOc, SwitchingError> {
        let window = self.scheme.window().is_some();
        let normal = outcomes(&self.normal, &self.model, quality, Severity::Normal, None)?;
        let normal = if window {
            let counts = accepted_by_count(&self.normal, &self.model, quality);
            let largest = self
                .normal
                .stages()
                .last()
                .and_then(|s| s.accept)
                .unwrap_or(0);
            let mut total = vec![0.0; largest as usize + 1];
            for stage in counts {
                for (x, p) in stage.into_iter().enumerate() {
                    total[x] += p;
                }
            }
            normal.with_counts(total)?
        } else {
            normal
        };
        let tightened = outcomes(
            &self.tightened,
            &self.model,
            quality,
            Severity::Tightened,
            None,
        )?;
        let reduced = match &self.reduced {
            Some((staged, table)) => Some(outcomes(
                staged,
                &self.model,
                quality,
                Severity::Reduced,
                Some(table),
            )?),
            None => None,
        };
        self.scheme.long_run(
            quality,
            Some(self.lot_size),
            &normal,
            &tightened,
            reduced.as_ref(),
        )
    }
}

/// One severity's per-lot outcomes at `p` from the plan's exact stage
/// outcomes: `Pa`, the ASN `sum_j (a_j + r_j) n_j`, the units inspected on
/// accepted lots `sum_j a_j n_j`, and on reduced inspection the chance of
/// an acceptance that reinstates normal inspection (105E 4.10.1.4).
fn outcomes(
    plan: &StagedPlan,
    model: &Model,
    p: f64,
    severity: Severity,
    reduced: Option<&StandardPlan>,
) -> Result<LotOutcomes, SwitchingError> {
    let o = stage_outcomes(plan, model, p);
    let (mut accept, mut reject, mut asn, mut accepted_units) = (0.0, 0.0, 0.0, 0.0);
    for ((a, r), stage) in o.accept.iter().zip(&o.reject).zip(plan.stages()) {
        let n = stage.n as f64;
        accept += a;
        reject += r;
        asn += (a + r) * n;
        accepted_units += a * n;
    }
    let lot = LotOutcomes::new(
        severity,
        accept.min(1.0),
        reject.min(1.0),
        asn,
        accepted_units,
    )?;
    match reduced {
        Some(table) => {
            let by_count = accepted_by_count(plan, model, p);
            let between: f64 = by_count
                .iter()
                .enumerate()
                .flat_map(|(j, counts)| {
                    counts
                        .iter()
                        .enumerate()
                        .filter(move |(x, _)| table.reinstates_normal(j + 1, *x as u64))
                        .map(|(_, p)| *p)
                })
                .sum();
            let most = lot.accept();
            lot.with_between(between.min(most))
        }
        None => Ok(lot),
    }
}

/// `out[j][x]`: the chance that a lot of quality `p` is accepted at stage
/// `j` (from 0) with a cumulative count of `x`, by the same recursion as
/// the plan's OC (`plan::oc`) kept count by count:
///
/// ```text
/// w_1(0) = 1
/// out_j(x)    = sum_d w_j(d) P(X_j = x - d),   x <= a_j
/// w_{j+1}(x)  = sum_d w_j(d) P(X_j = x - d),   a_j < x < r_j
/// ```
///
/// Table plans have small acceptance numbers, so the count-by-count sums
/// are short; each term comes from the model's own probability.
fn accepted_by_count(plan: &StagedPlan, model: &Model, p: f64) -> Vec<Vec<f64>> {
    let mut open: Vec<(u64, f64)> = vec![(0, 1.0)];
    let mut drawn = 0;
    let mut out = Vec::with_capacity(plan.stages().len());
    for stage in plan.stages() {
        let m = stage.n - drawn;
        let top = stage.accept.map_or(0, |a| a as usize + 1);
        let mut accepted = vec![0.0; top];
        let low = stage.accept.map_or(0, |a| a + 1);
        let mut next = vec![0.0; stage.reject.saturating_sub(low) as usize];
        for &(d, w) in &open {
            for x in d..stage.reject {
                let pr = w * model.pmf(m, x - d, p, drawn, d);
                if stage.accept.is_some_and(|a| x <= a) {
                    accepted[x as usize] += pr;
                } else {
                    next[(x - low) as usize] += pr;
                }
            }
        }
        out.push(accepted);
        open = next
            .into_iter()
            .enumerate()
            .map(|(i, w)| (low + i as u64, w))
            .collect();
        drawn = stage.n;
    }
    out
}
