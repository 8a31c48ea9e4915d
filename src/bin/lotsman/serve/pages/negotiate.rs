//! What the design screen shows for a negotiation, below the plan: the
//! expected inspection at the process quality (Pa, ATI and the cost per
//! lot), the nearby plans or the average sample number against the
//! single plan, and what one step of each input does. Every row comes
//! from the report of `lotsman design` or from the library's measures;
//! this file only lays them out for the page.

use lotsman::{
    DesignReport, InspectionCost, ModelKind, NearbyRow, check_quality, format_quality,
    format_significant, measures, parse_number,
};

use super::design_form::DesignFields;
use crate::cli::qualities::Qualities;
use crate::commands::design::Designed;
use crate::serve::page::Refusal;

/// The expected inspection of the plan at the process quality.
pub struct AtProcess {
    /// The process quality, as the page prints it.
    pub quality: String,
    /// Whether it is the AQL because none was given.
    pub at_aql: bool,
    /// The probability of accepting a lot there.
    pub pa: String,
    /// The average total inspection per lot there (units), with a lot size.
    pub ati: Option<String>,
    /// The expected inspection cost per lot, with a cost and a lot size.
    pub cost: Option<String>,
    /// The cost per unit as given.
    pub per_unit: Option<String>,
    /// Why a figure is missing (no lot size).
    pub note: Option<String>,
}

impl AtProcess {
    /// The panel for `fields`, when a cost or a process quality is given:
    /// the process quality defaults to the AQL; the cost is checked as
    /// `lotsman tradeoff --cost-per-unit` checks it, in the same words.
    pub fn of(fields: &DesignFields, designed: &Designed) -> Result<Option<Self>, Refusal> {
        if fields.cost.is_empty() && fields.process.is_empty() {
            return Ok(None);
        }
        let model = &designed.request.model;
        let qualities = Qualities::of(model.kind());
        let at_aql = fields.process.is_empty();
        let process = if at_aql {
            designed.request.risks.producer().quality
        } else {
            qualities.one("--process-average", &fields.process)?
        };
        check_quality(model, "process average", process).map_err(Refusal::from)?;
        let cost = match fields.cost.as_str() {
            "" => None,
            text => {
                let per_unit = parse_number("--cost-per-unit", text)?;
                Some(InspectionCost::new(per_unit, process, model)?)
            }
        };
        let plan = &designed.solution.design.plan;
        let m = measures(plan, model, process);
        let per_unit = model.kind() == ModelKind::Poisson;
        let at = cost.and_then(|k| k.at(plan, model));
        let note = model.lot_size().is_none().then(|| {
            let what = if cost.is_some() {
                "The inspection cost per lot and the ATI need"
            } else {
                "The ATI needs"
            };
            format!(
                "{what} a lot size: they count the 100% inspection of rejected lots. Give the lot size N."
            )
        });
        Ok(Some(AtProcess {
            quality: format_quality(process, per_unit),
            at_aql,
            pa: format_significant(m.pa, 4),
            ati: m.ati.map(|a| format!("{a:.1}")),
            cost: at.map(|k| format!("{:.2}", k.cost)),
            per_unit: cost.map(|k| decimal(k.per_unit())),
            note,
        }))
    }
}

/// A number a person typed, as typed: no padding digits (`2`, `0.35`).
fn decimal(v: f64) -> String {
    format!("{}", format!("{v:.11e}").parse::<f64>().unwrap_or(v))
}

/// The tables of a design's report for the page.
pub struct Tables {
    /// The nearby plans (single plans): how many smaller acceptance
    /// numbers are left out, and the rows.
    pub nearby: Option<(usize, Vec<NearbyRow>)>,
    /// Staged plans: the average sample number, `(where, units)`.
    pub asn: Vec<(String, String)>,
    /// The single plan the sensitivity moves, `n = 110, c = 3`.
    pub single: String,
    /// The sensitivity rows as the report prints them.
    pub sensitivity: Vec<[String; 7]>,
    /// The moves with no plan, and why.
    pub no_plan: Vec<String>,
    /// The report's notes.
    pub notes: Vec<String>,
}

impl Tables {
    /// The tables of `report`.
    pub fn of(report: &DesignReport) -> Self {
        let per_unit = report.model == ModelKind::Poisson;
        let single = format!("n = {}, c = {}", report.single_plan.n, report.single_plan.c);
        let asn = report.asn.map_or_else(Vec::new, |a| {
            vec![
                ("at the AQL".to_string(), format!("{:.1}", a.at_aql)),
                ("at the RQL".to_string(), format!("{:.1}", a.at_rql)),
                (
                    format!("largest (at {})", format_quality(a.max_quality, per_unit)),
                    format!("{:.1}", a.max),
                ),
                ("largest sample".to_string(), a.max_sample.to_string()),
                (format!("single plan {single}"), a.single_n.to_string()),
            ]
        });
        let (sensitivity, no_plan) = report.sensitivity_rows();
        Tables {
            nearby: report.asn.is_none().then(|| report.nearby_rows()),
            asn,
            single,
            sensitivity,
            no_plan,
            notes: report.notes.clone(),
        }
    }
}
