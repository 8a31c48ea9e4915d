//! The report of a variables design (`lotsman design --scheme variables`):
//! the plan judged on measurements, its rule, the risks it achieves, and
//! the sample sizes of the plans it is compared with.

use std::io::{self, Write};

use serde::Serialize;

use super::format::{Report, cell, csv_writer, num, opt};
use super::parts::{
    PointReport, SinglePlanReport, VariablesReport, achieved_points, variables_rule,
};
use super::table_kit::{grid, specification_line, write_risk_points};
use super::words;
use crate::design::VariablesSolution;
use crate::model::ModelKind;
use crate::numeric::{format_quality, format_significant};
use crate::plain::escape_controls;
use crate::plan::{LimitKind, SigmaKind, VariablesPlan, WorstSplit};
use crate::source::tool_version;

/// What `design` reports for a variables plan.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct VariablesDesignReport {
    /// Plan title.
    pub title: String,
    /// Always `variables`.
    pub scheme: &'static str,
    /// The attributes model of the comparison plan.
    pub model: ModelKind,
    /// Lot size, `null` when absent.
    pub lot_size: Option<u64>,
    /// The plan for the terminal table.
    #[serde(skip)]
    pub plan: VariablesPlan,
    /// The plan and its specification.
    pub variables: VariablesReport,
    /// The producer's point and achieved risk.
    pub producer: PointReport,
    /// The consumer's point and achieved risk.
    pub consumer: PointReport,
    /// Two limits, sigma unknown: the split of the nonconforming between
    /// the tails at which each risk is reached; `null` otherwise.
    pub worst_split: Option<WorstSplitReport>,
    /// The sample size the same points need with sigma known.
    pub known_sigma_n: u64,
    /// Sigma unknown, one limit: the large-sample approximation of `n`.
    pub large_sample_n: Option<f64>,
    /// The attributes single plan for the same points, `null` when none
    /// fits within the caps.
    pub attributes_plan: Option<SinglePlanReport>,
    /// Units the variables plan saves against the attributes plan.
    pub sample_saved: Option<i64>,
    /// Why the constant is the one chosen, and other remarks.
    pub notes: Vec<String>,
    /// Tool and version.
    pub solved_by: String,
}

/// The worst splits of a two-limit, sigma-unknown design: each the share
/// of the nonconforming beyond the lower limit (0 to 1/2; the mirror
/// image is as bad) and `Pa` there.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct WorstSplitReport {
    /// At the AQL: the split with the lowest `Pa`.
    pub producer: WorstSplit,
    /// At the RQL: the split with the highest `Pa`.
    pub consumer: WorstSplit,
}

impl VariablesDesignReport {
    /// The report of `solution`, under `title`.
    pub fn new(title: &str, solution: &VariablesSolution) -> Self {
        let d = &solution.design;
        let risks = solution.request.risks();
        let model = solution.request.model();
        let two = d.plan.spec().limit() == LimitKind::Both;
        let (name, lo, hi) = if two {
            (
                "M",
                format_quality(d.range.0, false),
                format_quality(d.range.1, false),
            )
        } else {
            (
                "k",
                format_significant(d.range.0, 6),
                format_significant(d.range.1, 6),
            )
        };
        let mut notes = vec![format!(
            "every {name} from {lo} to {hi} meets both points at n = {}; the plan takes the middle {}, rounded, so that neither party's allowance is spent to its limit",
            d.plan.n(),
            if two {
                "on the normal-quantile scale"
            } else {
                "of the interval"
            }
        )];
        if let Some(a) = d.approximate_n {
            notes.push(format!(
                "the large-sample approximation n = (1 + k^2/2) ((z_alpha + z_beta)/(z_p1 - z_p2))^2 gives {a:.1}; the exact noncentral t answer is n = {}",
                d.plan.n()
            ));
        }
        if let Some((producer, consumer)) = d.worst_splits {
            let split = |w: WorstSplit| {
                if w.share == 0.0 {
                    "all beyond one limit".to_string()
                } else {
                    format!(
                        "{} beyond one limit and the rest beyond the other",
                        format_quality(w.share, false)
                    )
                }
            };
            notes.push(format!(
                "with two limits and sigma estimated, Pa depends on how the nonconforming split between the limits; the plan meets both points at the worst split: at the AQL {}, at the RQL {}",
                split(producer),
                split(consumer)
            ));
        }
        notes.push(
            "the rule rests on normally distributed measurements: judge each lot from its readings (judge with --measurements), which also tests them for normality".to_string(),
        );
        let (producer, consumer) =
            achieved_points(risks, (d.producer_risk, d.consumer_risk), &mut notes);
        let attributes = solution.attributes.as_ref().ok();
        if let Err(e) = &solution.attributes {
            notes.push(format!("no attributes single plan for comparison: {e}"));
        }
        VariablesDesignReport {
            title: title.to_string(),
            scheme: "variables",
            model: model.kind(),
            lot_size: model.lot_size(),
            plan: d.plan.clone(),
            variables: VariablesReport::new(&d.plan, Some(d.range)),
            producer,
            consumer,
            worst_split: d
                .worst_splits
                .map(|(producer, consumer)| WorstSplitReport { producer, consumer }),
            known_sigma_n: d.known_sigma_n,
            large_sample_n: d.approximate_n,
            attributes_plan: attributes.map(|a| SinglePlanReport { n: a.n, c: a.c }),
            sample_saved: attributes.map(|a| a.n as i64 - d.plan.n() as i64),
            notes,
            solved_by: tool_version(),
        }
    }
}

impl Report for VariablesDesignReport {
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        let r = self;
        writeln!(out, "{}", escape_controls(&r.title))?;
        writeln!(out, "{}", specification_line(&r.variables))?;
        writeln!(out)?;
        writeln!(out, "  PLAN  {}", r.plan)?;
        for line in variables_rule(&r.plan) {
            writeln!(out, "  {line}")?;
        }
        writeln!(out)?;
        write_risk_points(out, &r.producer, &r.consumer, false)?;
        writeln!(out)?;
        let mut g = grid(&["Plan for the same points", "Sample size"]);
        g.add_row(vec![
            format!("variables, sigma {}", r.variables.sigma.name()),
            r.variables.n.to_string(),
        ]);
        if r.variables.sigma == SigmaKind::Unknown {
            g.add_row(vec![
                "variables, sigma known".to_string(),
                r.known_sigma_n.to_string(),
            ]);
        }
        if let Some(a) = r.large_sample_n {
            g.add_row(vec![
                "large-sample approximation".to_string(),
                format!("{a:.1}"),
            ]);
        }
        if let Some(a) = r.attributes_plan {
            g.add_row(vec![
                format!("attributes single, c = {} ({} model)", a.c, r.model),
                a.n.to_string(),
            ]);
        }
        writeln!(out, "{g}")?;
        if let Some(saved) = r.sample_saved {
            writeln!(
                out,
                "The variables plan measures {} units {} than the attributes plan inspects.",
                saved.abs(),
                if saved >= 0 { "fewer" } else { "more" }
            )?;
        }
        for note in &r.notes {
            writeln!(out, "Note: {note}")?;
        }
        writeln!(out, "{}", words::CAUTION)
    }

    /// One row: the plan, its constant's interval, the achieved risks and
    /// the attributes plan.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let r = self;
        let v = &r.variables;
        let range = v.k_range.or(v.m_range);
        let mut w = csv_writer(out);
        w.write_record([
            "n",
            "k",
            "m",
            "range_min",
            "range_max",
            "producer_risk",
            "consumer_risk",
            "attributes_n",
            "attributes_c",
        ])?;
        w.write_record([
            v.n.to_string(),
            opt(v.k),
            opt(v.m),
            opt(range.map(|x| x[0])),
            opt(range.map(|x| x[1])),
            num(r.producer.achieved_risk),
            num(r.consumer.achieved_risk),
            cell(r.attributes_plan.map(|a| a.n)),
            cell(r.attributes_plan.map(|a| a.c)),
        ])?;
        w.flush()
    }
}
