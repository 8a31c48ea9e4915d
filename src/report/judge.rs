//! The reports of `lotsman judge`: the decision on a lot from its counts
//! ([`JudgeReport`]) or from its measurements ([`MeasurementJudgeReport`]),
//! with the rule it rests on and the plan it was taken by.
//!
//! Their JSON is the judgement's fields with keys in alphabetical order,
//! and `accepted_recorded` added when the plan was used as recorded
//! although its audit does not confirm it.

use std::io::{self, Write};
use std::path::PathBuf;

use serde::ser::Error as _;
use serde::{Serialize, Serializer};
use serde_json::Value;

use super::format::{Report, cell, csv_writer, num, opt};
use crate::plain::escape_controls;
use crate::plan::{
    Decision, Judgement, MeasurementJudgement, NORMALITY_LEVEL, StagedPlan, VariablesPlan,
};

/// The decision on a lot from the counts found (`judge --found`, or
/// `--inspected` with the cumulative count).
#[derive(Clone, Debug, PartialEq)]
pub struct JudgeReport {
    /// The decision, with the figures it rests on.
    pub judgement: Judgement,
    /// The plan the lot was judged by.
    pub plan: StagedPlan,
    /// The plan source the plan was read from.
    pub source: PathBuf,
    /// The discrepancy of a recorded plan that the audit does not confirm
    /// and that decided the lot at the user's request
    /// (`--accept-recorded`); `None` otherwise.
    pub accepted_recorded: Option<String>,
}

/// The decision on a lot from its measurements (`judge --measurements`).
#[derive(Clone, Debug, PartialEq)]
pub struct MeasurementJudgeReport {
    /// The decision, with the statistics and the checks of the normal
    /// model it rests on.
    pub judgement: MeasurementJudgement,
    /// The variables plan the lot was judged by.
    pub plan: VariablesPlan,
    /// The plan source the plan was read from.
    pub source: PathBuf,
    /// As in [`JudgeReport::accepted_recorded`].
    pub accepted_recorded: Option<String>,
}

/// `judgement`'s fields as a JSON object (keys in alphabetical order),
/// with `accepted_recorded` added when given.
fn with_accepted<S: Serializer>(
    judgement: &impl Serialize,
    accepted: Option<&str>,
    s: S,
) -> Result<S::Ok, S::Error> {
    let mut value = serde_json::to_value(judgement).map_err(S::Error::custom)?;
    if let (Some(d), Value::Object(map)) = (accepted, &mut value) {
        map.insert("accepted_recorded".into(), d.into());
    }
    value.serialize(s)
}

impl Serialize for JudgeReport {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        with_accepted(&self.judgement, self.accepted_recorded.as_deref(), s)
    }
}

impl Serialize for MeasurementJudgeReport {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        with_accepted(&self.judgement, self.accepted_recorded.as_deref(), s)
    }
}

/// The first line of a decision by a plan used as recorded although the
/// audit does not confirm it; empty otherwise.
fn accepted_line(accepted: Option<&str>) -> String {
    accepted.map_or(String::new(), |d| {
        format!("DECIDED BY THE PLAN AS RECORDED (--accept-recorded): {d}\n")
    })
}

/// The decision as JSON and CSV name it.
fn decision_name(d: Decision) -> &'static str {
    match d {
        Decision::Accept => "accept",
        Decision::Reject => "reject",
        Decision::Continue => "continue",
    }
}

/// A path as a report shows it: its control characters escaped.
fn shown(path: &std::path::Path) -> String {
    escape_controls(&path.to_string_lossy()).into_owned()
}

impl Report for JudgeReport {
    /// The verdict, where it was taken (stage, or item of an item-by-item
    /// plan) with the cumulative count against the plan's numbers, and the
    /// plan.
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        let j = &self.judgement;
        let item_by_item = self.plan.sequential_lines().is_some();
        let rule = match j.decision {
            Decision::Accept => format!(
                "{} <= acceptance number {}",
                j.cumulative_count,
                j.accept.unwrap_or(0)
            ),
            Decision::Reject => {
                format!("{} >= rejection number {}", j.cumulative_count, j.reject)
            }
            Decision::Continue => format!(
                "{} lies between the acceptance number {} and the rejection number {}; inspect {} more unit{}",
                j.cumulative_count,
                j.accept.map_or("(none yet)".to_string(), |a| a.to_string()),
                j.reject,
                j.next_units.unwrap_or(0),
                if j.next_units == Some(1) { "" } else { "s" }
            ),
        };
        let verdict = match (j.decision, item_by_item) {
            (Decision::Accept, _) => "ACCEPT the lot",
            (Decision::Reject, _) => "REJECT the lot",
            (Decision::Continue, true) => "GO ON to the next item",
            (Decision::Continue, false) => "GO ON to the next stage",
        };
        let place = if item_by_item { "item" } else { "stage" };
        write!(
            out,
            "{}{verdict}\n  {place} {}: {} units inspected in all, cumulative count {rule}\n  plan {} from {}\n",
            accepted_line(self.accepted_recorded.as_deref()),
            j.stage,
            j.inspected,
            self.plan,
            shown(&self.source)
        )
    }

    /// One row: the decision and its figures.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let j = &self.judgement;
        let mut w = csv_writer(out);
        w.write_record([
            "decision",
            "stage",
            "inspected",
            "cumulative_count",
            "accept",
            "reject",
            "next_units",
            "accepted_recorded",
        ])?;
        w.write_record([
            decision_name(j.decision).to_string(),
            j.stage.to_string(),
            j.inspected.to_string(),
            j.cumulative_count.to_string(),
            cell(j.accept),
            j.reject.to_string(),
            cell(j.next_units),
            self.accepted_recorded.clone().unwrap_or_default(),
        ])?;
        w.flush()
    }
}

impl Report for MeasurementJudgeReport {
    /// The warnings first, then the verdict with its rule, the statistics,
    /// the estimate, the normality test, the spread against a known sigma,
    /// and the plan.
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        let j = &self.judgement;
        let known = self.plan.spec().sigma();
        let mut t = accepted_line(self.accepted_recorded.as_deref());
        for w in &j.warnings {
            t.push_str(&format!("WARNING: {w}\n"));
        }
        let verdict = match (j.decided.decision, j.warnings.is_empty()) {
            (Decision::Accept, true) => "ACCEPT the lot",
            (Decision::Accept, false) => {
                "ACCEPT the lot by the variables rule, but read the warnings above before releasing it"
            }
            _ => "REJECT the lot",
        };
        t.push_str(&format!("{verdict}: {}\n", j.decided.rule));
        t.push_str(&format!(
            "  n = {}, mean = {:.6}, s = {:.6}{}\n",
            j.n,
            j.mean,
            j.s,
            known.map_or(String::new(), |s| format!(
                " (statistics use the known sigma {s})"
            ))
        ));
        let by = if known.is_some() { "sigma" } else { "s" };
        for (name, side) in [
            ("Q_L = (xbar - L)", j.decided.lower),
            ("Q_U = (U - xbar)", j.decided.upper),
        ] {
            if let Some(sd) = side {
                t.push_str(&format!(
                    "  {name} / {by} = {:.4} (limit {}){}\n",
                    sd.q,
                    sd.limit,
                    sd.estimate.map_or(String::new(), |e| format!(
                        ", estimated {:.4}% beyond",
                        100.0 * e
                    ))
                ));
            }
        }
        if let Some(e) = j.decided.estimate {
            t.push_str(&format!(
                "  estimated fraction nonconforming {:.4}%\n",
                100.0 * e
            ));
        }
        if let Some(ad) = j.normality {
            t.push_str(&format!(
                "  normality: Anderson-Darling A*^2 = {:.3}, p = {:.4}{}\n",
                ad.a2_star,
                ad.p_value,
                if ad.p_value < NORMALITY_LEVEL {
                    " (contradicts the normal model)"
                } else {
                    " (no evidence against the normal model)"
                }
            ));
        }
        if let Some(p) = j.sigma_p_value {
            t.push_str(&format!(
                "  spread against the known sigma: chi-square p = {p:.4}\n"
            ));
        }
        t.push_str(&format!(
            "  plan {} from {}\n",
            self.plan,
            shown(&self.source)
        ));
        out.write_all(t.as_bytes())
    }

    /// One row: the decision, its rule, the statistics and the checks; the
    /// warnings joined by `; `.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let j = &self.judgement;
        let mut w = csv_writer(out);
        w.write_record([
            "decision",
            "rule",
            "n",
            "mean",
            "s",
            "sigma_used",
            "q_lower",
            "q_upper",
            "estimate",
            "normality_p_value",
            "sigma_p_value",
            "warnings",
            "accepted_recorded",
        ])?;
        w.write_record([
            decision_name(j.decided.decision).to_string(),
            j.decided.rule.clone(),
            j.n.to_string(),
            num(j.mean),
            num(j.s),
            num(j.decided.sigma_used),
            opt(j.decided.lower.map(|sd| sd.q)),
            opt(j.decided.upper.map(|sd| sd.q)),
            opt(j.decided.estimate),
            opt(j.normality.map(|ad| ad.p_value)),
            opt(j.sigma_p_value),
            j.warnings.join("; "),
            self.accepted_recorded.clone().unwrap_or_default(),
        ])?;
        w.flush()
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::{Model, ModelKind};
    use crate::plan::judge;

    fn report(found: &[u64], accepted: Option<&str>) -> JudgeReport {
        let model = Model::new(ModelKind::Binomial, None).unwrap();
        let plan = StagedPlan::new(
            vec![
                crate::plan::Stage {
                    n: 50,
                    accept: Some(1),
                    reject: 4,
                },
                crate::plan::Stage {
                    n: 100,
                    accept: Some(4),
                    reject: 5,
                },
            ],
            &model,
        )
        .unwrap();
        JudgeReport {
            judgement: judge(&plan, &model, found).unwrap(),
            plan,
            source: PathBuf::from("lot.yaml"),
            accepted_recorded: accepted.map(str::to_string),
        }
    }

    #[test]
    fn a_count_between_the_numbers_goes_on_to_the_next_stage() {
        let mut text = Vec::new();
        report(&[2], None).write_table(&mut text).unwrap();
        assert_eq!(
            String::from_utf8(text).unwrap(),
            "GO ON to the next stage\n  stage 1: 50 units inspected in all, cumulative count 2 lies between the acceptance number 1 and the rejection number 4; inspect 50 more units\n  plan 50:1:4 100:4:5 from lot.yaml\n"
        );
    }

    #[test]
    fn the_json_keys_are_sorted_with_the_discrepancy_among_them() {
        let json = serde_json::to_string(&report(&[0], Some("plan differs"))).unwrap();
        assert_eq!(
            json,
            r#"{"accept":1,"accepted_recorded":"plan differs","cumulative_count":0,"decision":"accept","inspected":50,"next_units":null,"reject":4,"stage":1}"#
        );
    }

    #[test]
    fn the_csv_is_one_row_of_the_decision() {
        let mut text = Vec::new();
        report(&[2, 3], None).write_csv(&mut text).unwrap();
        assert_eq!(
            String::from_utf8(text).unwrap(),
            "decision,stage,inspected,cumulative_count,accept,reject,next_units,accepted_recorded\nreject,2,100,5,4,5,,\n"
        );
    }

    #[test]
    fn a_measured_lot_is_one_csv_row_with_its_statistics() {
        use crate::plan::{LimitKind, SigmaKind, Specification, judge_measurements};
        let spec = Specification::new(SigmaKind::Unknown, None, LimitKind::Upper, None, Some(10.0))
            .unwrap();
        let plan = VariablesPlan::new(spec, 5, 1.5).unwrap();
        let values = [9.0, 9.2, 8.8, 9.1, 8.9];
        let report = MeasurementJudgeReport {
            judgement: judge_measurements(&plan, &values, 0.01).unwrap(),
            plan,
            source: PathBuf::from("plates.yaml"),
            accepted_recorded: None,
        };
        let mut text = Vec::new();
        report.write_csv(&mut text).unwrap();
        let text = String::from_utf8(text).unwrap();
        let mut lines = text.lines();
        assert_eq!(
            lines.next(),
            Some(
                "decision,rule,n,mean,s,sigma_used,q_lower,q_upper,estimate,normality_p_value,sigma_p_value,warnings,accepted_recorded"
            )
        );
        // Q_U = (10 - 9) / s with s = sqrt(0.025): the lot is accepted.
        let row = lines.next().unwrap();
        assert!(row.starts_with("accept,"), "{row}");
        assert!(row.contains(",5,9,"), "{row}");
        assert_eq!(lines.next(), None);
    }
}
