//! The report of a standard-indexed plan (`lotsman standard`): the code
//! letter, each class's table plan at every severity of the switching
//! scheme, the OC curves side by side, and the risks the plan in force
//! really gives, against the two-point design when an RQL is given.
//!
//! JSON keys (the contract with scripts, docs/json.md): `code_letter`,
//! `plan_letter`, `severity`, `stages`, `points` (`quality`, `pa_normal`,
//! `pa_tightened`, `pa_reduced`, `scheme_pa`) and `true_risks` describe the first
//! class's plan in force; `classes` gives every class the same way.

use std::io::{self, Write};

use serde::Serialize;

use super::format::{Report, csv_writer, opt};
use super::table_kit::{grid, write_stage_table};
use crate::model::ModelKind;
use crate::numeric::{format_quality, format_significant};
use crate::plain::escape_controls;
use crate::plan::Stage;
use crate::source::tool_version;
use crate::standard::{
    ClassAssessment, CodeLetter, InspectionLevel, Severity, SeverityPa, StandardAnswer,
    StandardAssessment, TrueRisks,
};

/// The name of the tables' edition, as reports and sources give it.
pub const EDITION: &str = "MIL-STD-105E";

/// One quality of the OC curves.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct StandardPoint {
    /// The quality (fraction nonconforming, or nonconformities per unit).
    pub quality: f64,
    /// `Pa` on normal inspection (`null` when its answer is every unit).
    pub pa_normal: Option<f64>,
    /// `Pa` on tightened inspection.
    pub pa_tightened: Option<f64>,
    /// `Pa` on reduced inspection (`null` with --no-reduced).
    pub pa_reduced: Option<f64>,
    /// The switching scheme's long-run `Pa` (`null` when it cannot be
    /// given; the class's `scheme_note` says why).
    pub scheme_pa: Option<f64>,
}

impl From<&SeverityPa> for StandardPoint {
    fn from(p: &SeverityPa) -> Self {
        StandardPoint {
            quality: p.quality,
            pa_normal: p.normal,
            pa_tightened: p.tightened,
            pa_reduced: p.reduced,
            scheme_pa: p.scheme,
        }
    }
}

/// The table plan at one severity.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SeverityPlanReport {
    /// `normal`, `tightened` or `reduced`.
    pub severity: Severity,
    /// The row the plan was read from, after the arrows.
    pub plan_letter: CodeLetter,
    /// The table it was read from.
    pub table: String,
    /// The units the table's plan draws at the most (at least the lot
    /// when every unit is inspected).
    pub sample_size: u64,
    /// The stages with the table's own numbers (cumulative n, accept,
    /// reject); empty when every unit is inspected.
    pub stages: Vec<Stage>,
    /// Whether the sample reaches the lot, so every unit is inspected
    /// (the standard's rule) and there is no sampling plan.
    pub inspect_all: bool,
    /// Whether the cell rests on memory of the printed table.
    pub from_memory: bool,
    /// How the plan was found, in plain words.
    pub notes: Vec<String>,
}

impl SeverityPlanReport {
    fn new(severity: Severity, answer: &StandardAnswer) -> Self {
        let plan = answer.table_plan();
        let inspect_all = matches!(answer, StandardAnswer::InspectAll(_));
        SeverityPlanReport {
            severity,
            plan_letter: plan.plan_letter,
            table: plan.table.clone(),
            sample_size: plan.sample_size(),
            stages: if inspect_all {
                Vec::new()
            } else {
                plan.table_numbers.clone()
            },
            inspect_all,
            from_memory: plan.from_memory,
            notes: plan.notes.clone(),
        }
    }
}

/// The two-point design for the same points.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct TwoPointReport {
    /// Its stages.
    pub stages: Vec<Stage>,
    /// Its largest sample.
    pub n: u64,
    /// Its ASN at the AQL.
    pub asn_at_aql: f64,
    /// Its achieved producer's risk at the AQL.
    pub producer_risk: f64,
    /// Its achieved consumer's risk at the RQL.
    pub consumer_risk: f64,
}

/// The table plan against a consumer's point.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct ConsumerReport {
    /// The RQL.
    pub rql: f64,
    /// beta.
    pub beta: f64,
    /// alpha used for the two-point design.
    pub alpha: f64,
    /// `Pa(RQL)` of the table plan: the consumer's risk it really gives.
    pub consumer_risk: f64,
    /// Whether that is at most beta.
    pub meets_beta: bool,
    /// The table plan's largest sample.
    pub table_n: u64,
    /// The table plan's ASN at the AQL.
    pub table_asn_at_aql: f64,
    /// The two-point plan (`null` when the points have none).
    pub design: Option<TwoPointReport>,
    /// Why there is no two-point plan.
    pub design_refused: Option<String>,
}

/// The risks the plan in force really gives.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct TrueRisksReport {
    /// The AQL as a quality of the model (AQL 1.0 is 0.01).
    pub aql_quality: f64,
    /// `1 - Pa(AQL)`.
    pub producer_risk: f64,
    /// The quality at which `Pa = 0.95`.
    pub quality_at_pa_95: f64,
    /// The quality at which `Pa = 0.50`.
    pub quality_at_pa_50: f64,
    /// The quality at which `Pa = 0.10`.
    pub quality_at_pa_10: f64,
    /// The AOQL of the plan under rectification.
    pub aoql: f64,
    /// Against the consumer's point, when an RQL is given.
    pub consumer: Option<ConsumerReport>,
}

impl From<&TrueRisks> for TrueRisksReport {
    fn from(r: &TrueRisks) -> Self {
        TrueRisksReport {
            aql_quality: r.aql_quality,
            producer_risk: r.producer_risk,
            quality_at_pa_95: r.quality_at_pa_95,
            quality_at_pa_50: r.quality_at_pa_50,
            quality_at_pa_10: r.quality_at_pa_10,
            aoql: r.evaluation.aoql.value,
            consumer: r.consumer.as_ref().map(|c| ConsumerReport {
                rql: c.point.rql,
                beta: c.point.beta,
                alpha: c.point.alpha,
                consumer_risk: c.consumer_risk,
                meets_beta: c.meets_beta,
                table_n: c.table_n,
                table_asn_at_aql: c.table_asn_at_aql,
                design: c.design.as_ref().ok().map(|d| TwoPointReport {
                    stages: d.design.plan.stages().to_vec(),
                    n: d.n,
                    asn_at_aql: d.asn_at_aql,
                    producer_risk: d.design.producer_risk,
                    consumer_risk: d.design.consumer_risk,
                }),
                design_refused: c.design.as_ref().err().map(ToString::to_string),
            }),
        }
    }
}

/// One class: its AQL, its plan in force, its plans at every severity,
/// its OC curves and true risks.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct ClassReport {
    /// The class's name (`null` for a single AQL given without one).
    pub class: Option<String>,
    /// The AQL as the standard prints it.
    pub aql: String,
    /// The row of the plan in force, after the arrows.
    pub plan_letter: CodeLetter,
    /// The stages of the plan in force (the table's numbers).
    pub stages: Vec<Stage>,
    /// Whether the plan in force takes every unit of the lot.
    pub inspect_all: bool,
    /// The plans at each severity of the scheme.
    pub plans: Vec<SeverityPlanReport>,
    /// The OC curves at the qualities shown.
    pub points: Vec<StandardPoint>,
    /// The true risks of the plan in force (`null` for every unit).
    pub true_risks: Option<TrueRisksReport>,
    /// Why `scheme_pa` is `null`, or that it is bracketed rather than
    /// exact; `null` when it is exact.
    pub scheme_note: Option<String>,
}

impl ClassReport {
    fn new(c: &ClassAssessment, severity: Severity) -> Self {
        let plans: Vec<SeverityPlanReport> = c
            .answers
            .iter()
            .map(|(s, a)| SeverityPlanReport::new(*s, a))
            .collect();
        let in_force = plans
            .iter()
            .find(|p| p.severity == severity)
            .unwrap_or(&plans[0]);
        ClassReport {
            class: c.class.name.clone(),
            aql: c.class.aql.label().to_string(),
            plan_letter: in_force.plan_letter,
            stages: in_force.stages.clone(),
            inspect_all: in_force.inspect_all,
            points: c.points.iter().map(StandardPoint::from).collect(),
            true_risks: c.risks.as_ref().map(TrueRisksReport::from),
            scheme_note: c.scheme_note.clone(),
            plans,
        }
    }

    fn name(&self) -> String {
        match &self.class {
            Some(n) => format!("{} (AQL {})", escape_controls(n), self.aql),
            None => format!("AQL {}", self.aql),
        }
    }
}

/// What `standard` reports.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct StandardReport {
    /// The tables' edition.
    pub edition: &'static str,
    /// The lot size.
    pub lot_size: u64,
    /// The inspection level.
    pub level: InspectionLevel,
    /// The code letter from Table I.
    pub code_letter: CodeLetter,
    /// The severity in force.
    pub severity: Severity,
    /// `single`, `double` or `multiple`.
    pub scheme: &'static str,
    /// The model the risks are computed under.
    pub model: ModelKind,
    /// `fraction` or `per_unit`.
    pub quality_unit: &'static str,
    /// Units to draw on the severity in force (the largest sample of any
    /// class; the lot when a class takes every unit).
    pub sample_size: u64,
    /// First class: the row of its plan in force.
    pub plan_letter: CodeLetter,
    /// First class: the stages of its plan in force (empty when every
    /// unit is inspected).
    pub stages: Vec<Stage>,
    /// First class: whether its answer is to inspect every unit, the
    /// standard's rule when the sample reaches the lot.
    pub inspect_all: bool,
    /// First class: the OC curves.
    pub points: Vec<StandardPoint>,
    /// First class: the true risks of its plan in force.
    pub true_risks: Option<TrueRisksReport>,
    /// Every class.
    pub classes: Vec<ClassReport>,
    /// The tool that answered.
    pub solved_by: String,
}

impl From<&StandardAssessment> for StandardReport {
    fn from(a: &StandardAssessment) -> Self {
        let r = &a.request;
        let classes: Vec<ClassReport> = a
            .classes
            .iter()
            .map(|c| ClassReport::new(c, r.severity()))
            .collect();
        let first = &classes[0];
        StandardReport {
            edition: EDITION,
            lot_size: r.lot_size(),
            level: r.level(),
            code_letter: a.in_force().code_letter,
            severity: r.severity(),
            scheme: r.scheme().name(),
            model: r.model().kind(),
            quality_unit: r.model().kind().quality_unit(),
            sample_size: a.in_force().sample_size(),
            plan_letter: first.plan_letter,
            stages: first.stages.clone(),
            inspect_all: first.inspect_all,
            points: first.points.clone(),
            true_risks: first.true_risks.clone(),
            solved_by: tool_version(),
            classes,
        }
    }
}

impl StandardReport {
    fn per_unit(&self) -> bool {
        self.model == ModelKind::Poisson
    }

    fn q(&self, v: f64) -> String {
        format_quality(v, self.per_unit())
    }

    fn write_class(&self, out: &mut dyn Write, c: &ClassReport) -> io::Result<()> {
        writeln!(out)?;
        writeln!(out, "{}", c.name())?;
        for p in &c.plans {
            let mark = if p.severity == self.severity {
                " (in force)"
            } else {
                ""
            };
            writeln!(
                out,
                "  {}{mark}: code letter {}, {} units{}",
                p.severity.name(),
                p.plan_letter,
                p.sample_size,
                if p.inspect_all {
                    ", at least the lot: inspect every unit (100%)"
                } else {
                    ""
                }
            )?;
            if !p.inspect_all {
                write_stage_table(out, &p.stages)?;
            }
            for note in &p.notes {
                writeln!(out, "  - {}", escape_controls(note))?;
            }
        }
        if let Some(t) = &c.true_risks {
            self.write_risks(out, t)?;
        }
        self.write_points(out, c)
    }

    fn write_risks(&self, out: &mut dyn Write, t: &TrueRisksReport) -> io::Result<()> {
        writeln!(
            out,
            "True risks of the plan in force: producer's risk at the AQL ({}) {}; Pa = 0.95 at {}, 0.50 at {}, 0.10 at {}; AOQL {}",
            self.q(t.aql_quality),
            format_significant(t.producer_risk, 3),
            self.q(t.quality_at_pa_95),
            self.q(t.quality_at_pa_50),
            self.q(t.quality_at_pa_10),
            self.q(t.aoql),
        )?;
        if let Some(c) = &t.consumer {
            writeln!(
                out,
                "At the RQL {}: the table plan accepts with probability {} ({} beta {}); n = {} against the two-point design's {}",
                self.q(c.rql),
                format_significant(c.consumer_risk, 3),
                if c.meets_beta { "within" } else { "above" },
                format_significant(c.beta, 3),
                c.table_n,
                c.design
                    .as_ref()
                    .map_or("none".to_string(), |d| d.n.to_string()),
            )?;
            if let Some(why) = &c.design_refused {
                writeln!(out, "  no two-point design: {}", escape_controls(why))?;
            }
        }
        Ok(())
    }

    fn write_points(&self, out: &mut dyn Write, c: &ClassReport) -> io::Result<()> {
        if c.points
            .iter()
            .all(|p| p.pa_normal.is_none() && p.pa_tightened.is_none() && p.pa_reduced.is_none())
        {
            return Ok(());
        }
        let mut head = vec!["Quality", "Pa normal", "Pa tightened"];
        let reduced = c.points.iter().any(|p| p.pa_reduced.is_some());
        if reduced {
            head.push("Pa reduced");
        }
        head.push("Pa scheme");
        let mut g = grid(&head);
        let pa = |v: Option<f64>| v.map_or("-".to_string(), |x| format!("{x:.4}"));
        for p in &c.points {
            let mut row = vec![self.q(p.quality), pa(p.pa_normal), pa(p.pa_tightened)];
            if reduced {
                row.push(pa(p.pa_reduced));
            }
            row.push(pa(p.scheme_pa));
            g.add_row(row);
        }
        writeln!(out, "{g}")?;
        writeln!(
            out,
            "Pa scheme: the long-run share of lots accepted under the switching rules{}.",
            if reduced {
                ", production steady and reduced inspection approved whenever the rules allow it"
            } else {
                " without reduced inspection, production steady"
            }
        )?;
        if let Some(note) = &c.scheme_note {
            writeln!(out, "  - {}", escape_controls(note))?;
        }
        Ok(())
    }
}

impl Report for StandardReport {
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        writeln!(
            out,
            "{EDITION}: lot of {} units, inspection level {}: code letter {}; {} sampling, {} inspection in force; draw {} units",
            self.lot_size,
            self.level.name(),
            self.code_letter,
            self.scheme,
            self.severity.name(),
            self.sample_size,
        )?;
        for c in &self.classes {
            self.write_class(out, c)?;
        }
        writeln!(out)?;
        writeln!(
            out,
            "Sampling does not guarantee the quality of any one lot. Critical and safety characteristics follow the applicable contract, regulation and licensed practice."
        )
    }

    /// One row per class and quality: the class's plan in force and `Pa`
    /// at each severity.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let mut w = csv_writer(out);
        w.write_record([
            "class",
            "aql",
            "code_letter",
            "plan_letter",
            "severity",
            "n",
            "quality",
            "pa_normal",
            "pa_tightened",
            "pa_reduced",
            "scheme_pa",
        ])?;
        for c in &self.classes {
            let n = c.plans.iter().find(|p| p.severity == self.severity);
            for p in &c.points {
                w.write_record([
                    c.class.clone().unwrap_or_default(),
                    c.aql.clone(),
                    self.code_letter.to_string(),
                    c.plan_letter.to_string(),
                    self.severity.name().to_string(),
                    n.map_or(String::new(), |x| x.sample_size.to_string()),
                    p.quality.to_string(),
                    opt(p.pa_normal),
                    opt(p.pa_tightened),
                    opt(p.pa_reduced),
                    opt(p.scheme_pa),
                ])?;
            }
        }
        w.flush()
    }
}
