//! The report of a comparison (`lotsman compare`): the true risks of two
//! to six plans at one pair of risk points, one row per plan.

use std::io::{self, Write};

use serde::Serialize;

use super::format::{Report, csv_writer, num, quality_column};
use super::table_kit::{grid, quality_head};
use crate::model::ModelKind;
use crate::numeric::{format_quality, format_quality_cell};
use crate::plan::{ComparedRow, Comparison, Stage};

/// One plan's row of a comparison.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct ComparedPlanReport {
    /// The plan source's file name, or the typed stages.
    pub label: String,
    /// Which of a source's plans this is, when that needs saying (a
    /// standard-indexed source's normal plan of its first class); absent
    /// otherwise.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub note: Option<String>,
    /// The model the plan is evaluated under.
    pub model: ModelKind,
    /// The lot size, `null` when absent.
    pub lot_size: Option<u64>,
    /// The plan's stages, on cumulative figures.
    pub stages: Vec<Stage>,
    /// A single plan's sample size; `null` for a plan of several stages
    /// (see `asn_at_aql`).
    pub n: Option<u64>,
    /// The probability of acceptance at the AQL.
    pub pa_at_aql: f64,
    /// The producer's true risk, `1 - pa_at_aql`.
    pub producer_risk: f64,
    /// The consumer's true risk: the probability of acceptance at the RQL.
    pub consumer_risk: f64,
    /// The AOQL (with the lot's `(N - n)/N` factor when the lot size is
    /// known, else `Pa p`).
    pub aoql: f64,
    /// The quality at which the AOQ reaches the AOQL.
    pub aoql_quality: f64,
    /// The average sample number at the AQL.
    pub asn_at_aql: f64,
    /// The average sample number at the RQL.
    pub asn_at_rql: f64,
    /// Whether the producer's true risk is at most alpha.
    pub meets_alpha: bool,
    /// Whether the consumer's true risk is at most beta.
    pub meets_beta: bool,
}

/// What `compare` reports.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct CompareReport {
    /// The unit of the qualities and AOQLs: `fraction` or `per_unit`.
    pub quality_unit: &'static str,
    /// The producer's quality.
    pub aql: f64,
    /// The producer's risk the plans are held to.
    pub alpha: f64,
    /// The consumer's quality.
    pub rql: f64,
    /// The consumer's risk the plans are held to.
    pub beta: f64,
    /// Where the risk points came from: the flags, or the plan source
    /// that gave them.
    pub points_from: String,
    /// One row per plan, in the order given.
    pub plans: Vec<ComparedPlanReport>,
}

impl CompareReport {
    /// The report of `comparison`, whose risk points came from
    /// `points_from`.
    pub fn new(comparison: &Comparison, points_from: &str) -> Self {
        let (producer, consumer) = (comparison.risks.producer(), comparison.risks.consumer());
        CompareReport {
            quality_unit: if comparison.per_unit {
                ModelKind::Poisson.quality_unit()
            } else {
                ModelKind::Binomial.quality_unit()
            },
            aql: producer.quality,
            alpha: producer.risk,
            rql: consumer.quality,
            beta: consumer.risk,
            points_from: points_from.to_string(),
            plans: comparison
                .rows
                .iter()
                .map(|r| row(r, producer.risk, consumer.risk))
                .collect(),
        }
    }

    /// The line that says the one model and lot of every plan, when they
    /// share them; `None` when the plans differ.
    pub fn shared_model(&self) -> Option<String> {
        let (first, rest) = self.plans.split_first()?;
        if rest
            .iter()
            .any(|p| p.model_and_lot() != first.model_and_lot())
        {
            return None;
        }
        Some(match first.lot_size {
            Some(lot) => format!(
                "Every plan under the {} model, in lots of {lot} units",
                first.model
            ),
            None => format!("Every plan under the {} model", first.model),
        })
    }

    fn per_unit(&self) -> bool {
        self.quality_unit == ModelKind::Poisson.quality_unit()
    }
}

fn row(r: &ComparedRow, alpha: f64, beta: f64) -> ComparedPlanReport {
    let c = &r.compared;
    ComparedPlanReport {
        label: c.label.clone(),
        note: c.note.clone(),
        model: c.model.kind(),
        lot_size: c.model.lot_size(),
        stages: c.plan.stages().to_vec(),
        n: c.plan.as_single().map(|(n, _)| n),
        pa_at_aql: r.at_aql.pa,
        producer_risk: r.producer_risk(),
        consumer_risk: r.consumer_risk(),
        aoql: r.aoql.value,
        aoql_quality: r.aoql.quality,
        asn_at_aql: r.at_aql.asn,
        asn_at_rql: r.at_rql.asn,
        meets_alpha: r.producer_risk() <= alpha,
        meets_beta: r.consumer_risk() <= beta,
    }
}

/// "yes" or "no".
fn yes(b: bool) -> &'static str {
    if b { "yes" } else { "no" }
}

impl ComparedPlanReport {
    /// The plan's model and lot, as the table's column says it
    /// (`hypergeometric, lot of 2500`).
    pub fn model_and_lot(&self) -> String {
        match self.lot_size {
            Some(lot) => format!("{}, lot of {lot}", self.model),
            None => self.model.to_string(),
        }
    }
}

impl Report for CompareReport {
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        let per_unit = self.per_unit();
        writeln!(
            out,
            "True risks at AQL {} (alpha {}) and RQL {} (beta {}), the points from {}",
            format_quality(self.aql, per_unit),
            self.alpha,
            format_quality(self.rql, per_unit),
            self.beta,
            self.points_from
        )?;
        // One model and lot for every plan is said once, above the table.
        let shared = self.shared_model();
        if let Some(line) = &shared {
            writeln!(out, "{line}")?;
        }
        let aoql = quality_head("AOQL", per_unit);
        let mut header = vec!["Plan"];
        if shared.is_none() {
            header.push("Model");
        }
        header.extend([
            "n",
            "Pa at AQL",
            "Producer's risk",
            "Consumer's risk",
            &aoql,
            "ASN at AQL",
            "ASN at RQL",
            "Meets alpha",
            "Meets beta",
        ]);
        let mut g = grid(&header);
        for p in &self.plans {
            let mut row = vec![p.label.clone()];
            if shared.is_none() {
                row.push(p.model_and_lot());
            }
            row.extend([
                p.n.map_or_else(|| format!("ASN {:.1}", p.asn_at_aql), |n| n.to_string()),
                format!("{:.4}", p.pa_at_aql),
                format!("{:.4}", p.producer_risk),
                format!("{:.4}", p.consumer_risk),
                format_quality_cell(p.aoql, per_unit),
                format!("{:.1}", p.asn_at_aql),
                format!("{:.1}", p.asn_at_rql),
                yes(p.meets_alpha).to_string(),
                yes(p.meets_beta).to_string(),
            ]);
            g.add_row(row);
        }
        writeln!(out, "{g}")?;
        writeln!(
            out,
            "Producer's risk: 1 - Pa at the AQL; consumer's risk: Pa at the RQL."
        )?;
        if self.plans.iter().any(|p| p.n.is_none()) {
            writeln!(
                out,
                "A plan of several stages has no one sample size: its n column gives the average sample number at the AQL."
            )?;
        }
        if self.plans.iter().any(|p| p.lot_size.is_none()) {
            writeln!(
                out,
                "The AOQL of a plan without a lot size is the largest Pa x p; with one, AOQ carries the factor (N - n)/N."
            )?;
        }
        for p in &self.plans {
            if let Some(note) = &p.note {
                writeln!(out, "{}: {note}", p.label)?;
            }
        }
        Ok(())
    }

    /// One row per plan.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let model = if self.per_unit() {
            ModelKind::Poisson
        } else {
            ModelKind::Binomial
        };
        let mut w = csv_writer(out);
        let mut header: Vec<String> = ["label", "model", "lot_size", "stages", "n"]
            .map(String::from)
            .to_vec();
        header.extend([quality_column("aql", model), "alpha".to_string()]);
        header.extend([quality_column("rql", model), "beta".to_string()]);
        header.extend(
            [
                "pa_at_aql",
                "producer_risk",
                "consumer_risk",
                "aoql",
                "aoql_quality",
            ]
            .map(|h| match h {
                "aoql" | "aoql_quality" => quality_column(h, model),
                _ => h.to_string(),
            }),
        );
        header.extend(
            [
                "asn_at_aql",
                "asn_at_rql",
                "meets_alpha",
                "meets_beta",
                "note",
            ]
            .map(String::from),
        );
        w.write_record(&header)?;
        for p in &self.plans {
            let stages: Vec<String> = p.stages.iter().map(Stage::to_string).collect();
            w.write_record([
                p.label.clone(),
                p.model.to_string(),
                p.lot_size.map_or(String::new(), |n| n.to_string()),
                stages.join("+"),
                p.n.map_or(String::new(), |n| n.to_string()),
                num(self.aql),
                num(self.alpha),
                num(self.rql),
                num(self.beta),
                num(p.pa_at_aql),
                num(p.producer_risk),
                num(p.consumer_risk),
                num(p.aoql),
                num(p.aoql_quality),
                num(p.asn_at_aql),
                num(p.asn_at_rql),
                p.meets_alpha.to_string(),
                p.meets_beta.to_string(),
                p.note.clone().unwrap_or_default(),
            ])?;
        }
        w.flush()
    }
}
