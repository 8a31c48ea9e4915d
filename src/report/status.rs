//! The report of `lotsman status LOG.csv`: the severity of the next lot,
//! its plan, the counters behind the switching rules, and the process
//! average over first samples with its interval and warnings.
//!
//! JSON keys (docs/json.md): `ledger`, `lots`, `plan_id`,
//! `plan_revision`, `plan_sha256`, `severity` (`normal`, `tightened`,
//! `reduced`, `discontinued`, or null for a plan without switching
//! rules), `next_plan` (null while discontinued), `counters` (each
//! `key`, `value`, `limit`, `words`), `process_average` (`estimate`,
//! `lower`, `upper`, `level`, `found`, `inspected`, `lots`, `aql`, `rql`,
//! `design_average`;
//! for several classes an object of these per class name; null before
//! the first lot), `interval_method`, `resubmitted_left_out`,
//! `unread_left_out` and `warnings`.

use std::collections::BTreeMap;
use std::io::{self, Write};
use std::path::PathBuf;

use serde::ser::SerializeStruct;
use serde::{Serialize, Serializer};

use super::format::{Report, csv_writer};
use crate::ledger::{ClassAverage, LedgerStatus};
use crate::numeric::{format_quality, format_short};
use crate::plan::{Stage, StagedPlan};
use crate::standard::Counter;

/// Where a supplier stands after its ledger's lots.
#[derive(Clone, Debug)]
pub struct StatusReport {
    /// The ledger's file.
    pub ledger: PathBuf,
    /// The status.
    pub status: LedgerStatus,
}

/// One stage of the next plan.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct StageJson {
    /// The stage's new units.
    pub sample_size: u64,
    /// The units inspected in all after it.
    pub cumulative: u64,
    /// Its acceptance number (null where it cannot accept).
    pub accept: Option<u64>,
    /// Its rejection number.
    pub reject: u64,
}

/// One class's plan for the next lot.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct NextClassPlan {
    /// The class (null for a plan without named classes).
    pub class: Option<String>,
    /// Its AQL as the standard labels it (standard-indexed sources), or a
    /// designed plan's producer's quality as the report prints qualities.
    pub aql: Option<String>,
    /// The plan in words (`n = 125, c = 3`, stages, or item-by-item lines).
    pub plan: String,
    /// The stages (empty for an item-by-item plan, a variables plan or every unit).
    pub stages: Vec<StageJson>,
    /// Every unit is to be inspected.
    pub inspect_all: bool,
}

/// The plan of the next lot.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct NextPlan {
    /// The severity it applies at (standard-indexed sources).
    pub severity: Option<&'static str>,
    /// The code letter (standard-indexed sources).
    pub code_letter: Option<String>,
    /// Each class's plan.
    pub classes: Vec<NextClassPlan>,
}

fn stages_of(plan: &StagedPlan) -> Vec<StageJson> {
    if plan.sequential_lines().is_some() {
        return Vec::new();
    }
    let mut before = 0;
    plan.stages()
        .iter()
        .map(|&Stage { n, accept, reject }| {
            let s = StageJson {
                sample_size: n - before,
                cumulative: n,
                accept,
                reject,
            };
            before = n;
            s
        })
        .collect()
}

impl StatusReport {
    /// The severity in one word; `None` for a plan without switching
    /// rules.
    pub fn severity(&self) -> Option<&'static str> {
        self.status.state.as_ref().map(|s| s.standing())
    }

    /// The plan of the next lot; `None` while inspection is discontinued.
    pub fn next_plan(&self) -> Option<NextPlan> {
        let plan = &self.status.plan;
        match &self.status.state {
            Some(state) => {
                let severity = state.severity()?;
                let plans = plan.plans_at(severity)?;
                Some(NextPlan {
                    severity: Some(severity.name()),
                    code_letter: Some(plans.code_letter.to_string()),
                    classes: plans
                        .classes
                        .iter()
                        .map(|c| match c.answer.plan() {
                            Some(p) => NextClassPlan {
                                class: c.class.name.clone(),
                                aql: Some(c.class.aql.label().to_string()),
                                plan: p.stages.to_string(),
                                stages: stages_of(&p.stages),
                                inspect_all: false,
                            },
                            None => NextClassPlan {
                                class: c.class.name.clone(),
                                aql: Some(c.class.aql.label().to_string()),
                                plan: "inspect every unit".into(),
                                stages: Vec::new(),
                                inspect_all: true,
                            },
                        })
                        .collect(),
                })
            }
            None => {
                let (text, stages) = match (plan.counted_plan(), plan.variables_plan()) {
                    (Some((p, _)), _) => (p.to_string(), stages_of(p)),
                    (None, Some(v)) => (v.to_string(), Vec::new()),
                    (None, None) => return None,
                };
                Some(NextPlan {
                    severity: None,
                    code_letter: None,
                    classes: vec![NextClassPlan {
                        class: None,
                        aql: plan
                            .targets
                            .first()
                            .and_then(|t| t.aql)
                            .map(|q| self.quality(q)),
                        plan: text,
                        stages,
                        inspect_all: false,
                    }],
                })
            }
        }
    }

    /// The counters behind the switching rules (empty for a plan without
    /// them).
    pub fn counters(&self) -> Vec<Counter> {
        match (&self.status.state, self.status.plan.rules()) {
            (Some(state), Some(rules)) => state.counters(rules),
            _ => Vec::new(),
        }
    }

    /// The interval's method, in words.
    pub fn interval_method(&self) -> &'static str {
        if self.status.nonconformities() {
            "exact Poisson (Garwood), two-sided 95%"
        } else if self.status.plan.variables_plan().is_some() {
            "Clopper-Pearson, two-sided 95%, of the readings beyond a specification limit"
        } else {
            "Clopper-Pearson, two-sided 95%"
        }
    }

    fn quality(&self, q: f64) -> String {
        format_quality(q, self.status.nonconformities())
    }

    /// The warnings on the process average, in plain words.
    pub fn warnings(&self) -> Vec<String> {
        let mut out = Vec::new();
        for a in &self.status.averages {
            let of = match &a.class {
                Some(c) => format!(" of class {c}"),
                None => String::new(),
            };
            if let (true, Some(aql)) = (a.above_aql(), a.aql) {
                out.push(format!(
                    "the process average{of} is above the AQL: its whole 95% interval, {} to {}, lies above {}; the supplier's process is worse than the plan assumes",
                    self.quality(a.interval.lower),
                    self.quality(a.interval.upper),
                    self.quality(aql)
                ));
            }
            if let (true, Some(p)) = (a.above_design_average(), a.design_average) {
                out.push(format!(
                    "the process average{of} is above the one the plan was designed for: its whole 95% interval, {} to {}, lies above {} (rectifying.process_average); the plan no longer inspects the fewest units on average: design it again with the supplier's process average",
                    self.quality(a.interval.lower),
                    self.quality(a.interval.upper),
                    self.quality(p)
                ));
            }
            if let (true, Some(rql)) = (a.reaches_rql(), a.rql) {
                out.push(format!(
                    "the process average{of} may reach the RQL: the upper end of its 95% interval, {}, is at or above {}",
                    self.quality(a.interval.upper),
                    self.quality(rql)
                ));
            }
        }
        out
    }
}

/// One class's process average in the JSON.
#[derive(Serialize)]
struct AverageJson {
    estimate: f64,
    lower: f64,
    upper: f64,
    level: f64,
    found: u64,
    inspected: u64,
    lots: u64,
    aql: Option<f64>,
    rql: Option<f64>,
    design_average: Option<f64>,
}

impl From<&ClassAverage> for AverageJson {
    fn from(a: &ClassAverage) -> Self {
        AverageJson {
            estimate: a.interval.estimate,
            lower: a.interval.lower,
            upper: a.interval.upper,
            level: a.interval.level,
            found: a.found,
            inspected: a.inspected,
            lots: a.lots,
            aql: a.aql,
            rql: a.rql,
            design_average: a.design_average,
        }
    }
}

impl Serialize for StatusReport {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        let st = &self.status;
        let mut m = s.serialize_struct("StatusReport", 14)?;
        m.serialize_field("ledger", &self.ledger)?;
        m.serialize_field("lots", &st.rows)?;
        m.serialize_field("plan_id", &st.plan.id)?;
        m.serialize_field("plan_revision", &st.plan.revision)?;
        m.serialize_field("plan_sha256", &st.plan.sha256)?;
        m.serialize_field("severity", &self.severity())?;
        m.serialize_field("next_plan", &self.next_plan())?;
        m.serialize_field("counters", &self.counters())?;
        match st.averages.as_slice() {
            [] => m.serialize_field("process_average", &None::<()>)?,
            [one] if one.class.is_none() => {
                m.serialize_field("process_average", &AverageJson::from(one))?;
            }
            many => {
                let by_class: BTreeMap<String, AverageJson> = many
                    .iter()
                    .map(|a| (a.class.clone().unwrap_or_default(), AverageJson::from(a)))
                    .collect();
                m.serialize_field("process_average", &by_class)?;
            }
        }
        m.serialize_field("interval_method", self.interval_method())?;
        m.serialize_field("resubmitted_left_out", &st.resubmitted)?;
        m.serialize_field("unread_left_out", &st.unread)?;
        m.serialize_field("warnings", &self.warnings())?;
        m.end()
    }
}

impl Report for StatusReport {
    /// The severity and plan of the next lot, the counters, the process
    /// average and the warnings.
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        let st = &self.status;
        let mut t = format!(
            "Ledger {}: {} lot{}, plan {}{}\n",
            self.ledger.display(),
            st.rows,
            if st.rows == 1 { "" } else { "s" },
            st.plan.path.display(),
            if st.plan.revision.is_empty() {
                String::new()
            } else {
                format!(" (revision {})", st.plan.revision)
            }
        );
        match (self.severity(), self.next_plan()) {
            (Some(s), Some(next)) => {
                t.push_str(&format!(
                    "Next lot: {s} inspection, code letter {}\n",
                    next.code_letter.as_deref().unwrap_or("")
                ));
                for c in &next.classes {
                    let label = match (&c.class, &c.aql) {
                        (Some(n), Some(a)) => format!("{n} (AQL {a})"),
                        (None, Some(a)) => format!("AQL {a}"),
                        _ => String::new(),
                    };
                    t.push_str(&format!("  {label}: {}\n", stage_words(c)));
                }
            }
            (Some(_), None) => t.push_str(
                "Next lot: inspection under the standard is discontinued (MIL-STD-105E 4.8); when the supplier's corrective action is accepted, judge the next lot with --corrective-action \"WHAT WAS DONE\" --record: inspection resumes on tightened\n",
            ),
            (None, Some(next)) => {
                for c in &next.classes {
                    t.push_str(&format!(
                        "Next lot: the recorded plan, {} (no switching rules)\n",
                        stage_words(c)
                    ));
                }
            }
            (None, None) => {}
        }
        let counters = self.counters();
        if !counters.is_empty() {
            t.push_str("Switching rules:\n");
            for c in &counters {
                let limit = c.limit.map_or(String::new(), |l| format!(" of {l}"));
                t.push_str(&format!("  {} = {}{limit}: {}\n", c.key, c.value, c.words));
            }
        }
        if st.averages.is_empty() {
            t.push_str("Process average: no lot counted yet\n");
        } else {
            t.push_str(&format!(
                "Process average over first samples of original inspection ({}):\n",
                self.interval_method()
            ));
            for a in &st.averages {
                let label = a.class.as_ref().map_or(String::new(), |c| format!("{c}: "));
                // A rate reads "per unit (per 100 units)" already: its
                // interval follows in words rather than in more brackets.
                let (estimate, interval) = if st.nonconformities() {
                    (
                        self.quality(a.interval.estimate),
                        format!(
                            ", 95% interval {} to {} per unit ({} to {} per 100 units)",
                            format_short(a.interval.lower, 4),
                            format_short(a.interval.upper, 4),
                            format_short(100.0 * a.interval.lower, 4),
                            format_short(100.0 * a.interval.upper, 4)
                        ),
                    )
                } else {
                    (
                        self.quality(a.interval.estimate),
                        format!(
                            " ({} to {})",
                            self.quality(a.interval.lower),
                            self.quality(a.interval.upper)
                        ),
                    )
                };
                t.push_str(&format!(
                    "  {label}{estimate}{interval}, {} found in {} units of {} lot{}\n",
                    a.found,
                    a.inspected,
                    a.lots,
                    if a.lots == 1 { "" } else { "s" }
                ));
            }
        }
        if st.resubmitted > 0 || st.unread > 0 {
            t.push_str(&format!(
                "  left out: {} resubmitted lot{}, {} lot{} recorded with one cumulative count past the first stage\n",
                st.resubmitted,
                if st.resubmitted == 1 { "" } else { "s" },
                st.unread,
                if st.unread == 1 { "" } else { "s" }
            ));
        }
        for w in self.warnings() {
            t.push_str(&format!("warning: {w}\n"));
        }
        out.write_all(t.as_bytes())
    }

    /// One row per class: the severity, the next plan, the process
    /// average and its interval.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let mut w = csv_writer(out);
        w.write_record([
            "class",
            "severity",
            "next_plan",
            "lots",
            "found",
            "inspected",
            "estimate",
            "lower",
            "upper",
            "aql",
            "rql",
            "design_average",
        ])?;
        let next = self.next_plan();
        let severity = self.severity().unwrap_or("");
        let opt = |x: Option<f64>| x.map_or(String::new(), |v| v.to_string());
        for (i, target) in self.status.plan.targets.iter().enumerate() {
            let plan = next
                .as_ref()
                .and_then(|n| n.classes.get(i))
                .map_or(String::new(), |c| c.plan.clone());
            let class = target.class.clone();
            let a = self.status.averages.iter().find(|a| a.class == class);
            w.write_record([
                class.unwrap_or_default(),
                severity.to_string(),
                plan,
                a.map_or(String::new(), |a| a.lots.to_string()),
                a.map_or(String::new(), |a| a.found.to_string()),
                a.map_or(String::new(), |a| a.inspected.to_string()),
                opt(a.map(|a| a.interval.estimate)),
                opt(a.map(|a| a.interval.lower)),
                opt(a.map(|a| a.interval.upper)),
                opt(a.and_then(|a| a.aql)),
                opt(a.and_then(|a| a.rql)),
                opt(a.and_then(|a| a.design_average)),
            ])?;
        }
        w.flush()
    }
}

/// A class's plan in the table: its stages as `n = 125, Ac 3, Re 4`.
fn stage_words(c: &NextClassPlan) -> String {
    if c.stages.is_empty() {
        return c.plan.clone();
    }
    c.stages
        .iter()
        .enumerate()
        .map(|(i, s)| {
            let ac = s.accept.map_or("-".to_string(), |a| a.to_string());
            let stage = if c.stages.len() > 1 {
                format!("stage {}: ", i + 1)
            } else {
                String::new()
            };
            format!("{stage}n = {}, Ac {ac}, Re {}", s.sample_size, s.reject)
        })
        .collect::<Vec<_>>()
        .join("; ")
}
