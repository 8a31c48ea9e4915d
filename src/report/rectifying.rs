//! The report of a minimum-inspection design (`lotsman rectify`): the plan
//! with the smallest average total inspection at the process average, what
//! it does under rectifying inspection, and the single plans it was chosen
//! from.

use std::io::{self, Write};

use serde::Serialize;

use super::format::{Report, csv_writer};
use super::table_kit::{grid, plan_headline, write_stage_table};
use super::words;
use crate::design::{Protection, RectifyingDesign, RectifyingPlan, RectifyingRow};
use crate::model::{ModelKind, nonconforming_in_lot};
use crate::numeric::Short;
use crate::numeric::{format_quality, format_significant};
use crate::plain::escape_controls;
use crate::plan::{Aoql, Stage, StagedPlan};
use crate::source::tool_version;

/// The protection asked for.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct ProtectionReport {
    /// `ltpd` or `aoql`.
    pub kind: &'static str,
    /// The LTPD or the AOQL.
    pub quality: f64,
    /// The consumer's risk at the LTPD (`null` for an AOQL).
    pub beta: Option<f64>,
}

/// A sampling plan and its measures under rectifying inspection.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct RectifyingPlanReport {
    /// The plan (for the formats; JSON carries its stages).
    #[serde(skip)]
    pub plan: StagedPlan,
    /// The plan's stages on cumulative counts.
    pub stages: Vec<Stage>,
    /// `Pa` at the process average.
    pub pa: f64,
    /// Average total inspection per lot at the process average.
    pub ati: f64,
    /// Average sample number at the process average.
    pub asn: f64,
    /// Units saved per lot against 100% inspection, `N - ATI`.
    pub saving: f64,
    /// The AOQL and the quality where the AOQ reaches it.
    pub aoql: Aoql,
    /// The quality at which `Pa` falls to `ltpd_risk`.
    pub ltpd: f64,
    /// beta for an LTPD protection, 0.10 for an AOQL one.
    pub ltpd_risk: f64,
    /// LTPD protection: `Pa` at the agreed LTPD.
    pub pa_at_ltpd: Option<f64>,
}

impl RectifyingPlanReport {
    fn new(p: &RectifyingPlan, lot: u64, ltpd_risk: f64) -> Self {
        RectifyingPlanReport {
            plan: p.plan.clone(),
            stages: p.plan.stages().to_vec(),
            pa: p.pa,
            ati: p.ati,
            asn: p.asn,
            saving: lot as f64 - p.ati,
            aoql: p.aoql,
            ltpd: p.ltpd,
            ltpd_risk,
            pa_at_ltpd: p.pa_at_ltpd,
        }
    }
}

/// What `rectify` reports.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct RectifyingReport {
    /// Title.
    pub title: String,
    /// `single` or `double`.
    pub scheme: &'static str,
    /// Model name.
    pub model: ModelKind,
    /// The unit of the qualities, AOQL and LTPD: `fraction` or `per_unit`
    /// ([`ModelKind::quality_unit`]).
    pub quality_unit: &'static str,
    /// The lot size `N`.
    pub lot_size: u64,
    /// The process average.
    pub process_average: f64,
    /// The protection asked for.
    pub protection: ProtectionReport,
    /// Whether 100% inspection is the answer.
    pub full_inspection: bool,
    /// The chosen plan; `null` for 100% inspection.
    pub plan: Option<RectifyingPlanReport>,
    /// Double requests: the best single plan, for comparison.
    pub single_plan: Option<RectifyingPlanReport>,
    /// The single plans by acceptance number: the smallest `n` giving the
    /// protection and its ATI, up to the `c` where the scan stopped.
    pub by_acceptance_number: Vec<RectifyingRow>,
    /// Remarks a reader should see.
    pub notes: Vec<String>,
    /// Tool and version.
    pub solved_by: String,
}

impl RectifyingReport {
    /// The report of `design`, under `title`.
    pub fn new(title: &str, design: &RectifyingDesign) -> Self {
        let r = &design.request;
        let lot = r.lot_size();
        let per_unit = r.model().kind() == ModelKind::Poisson;
        let risk = r.ltpd_risk();
        let protection = ProtectionReport {
            kind: r.protection().name(),
            quality: r.protection().quality(),
            beta: match r.protection() {
                Protection::Ltpd(point) => Some(point.risk),
                Protection::Aoql(_) => None,
            },
        };
        let mut notes = Vec::new();
        let gave_up = design.rows.last().is_none_or(|row| row.n_min.is_none());
        match (&design.plan, &design.single) {
            (None, _) if gave_up => notes.push(format!(
                "no single plan with a sample within the lot of {lot} gives the protection: inspect every unit"
            )),
            (None, _) => notes.push(format!(
                "no {} plan that gives the protection inspects fewer than the {lot} units of the lot on average at the process average: inspect every unit",
                r.scheme()
            )),
            (Some(plan), Some(single)) => notes.push(format!(
                "the double plan inspects {:.1} units per lot on average against {:.1} for the best single plan ({}), {:.0}% less",
                plan.ati,
                single.ati,
                single.plan,
                100.0 * (1.0 - plan.ati / single.ati)
            )),
            (Some(_), None) => {}
        }
        if let Protection::Aoql(_) = r.protection() {
            notes.push(format!(
                "the LTPD is read where Pa = {risk}, the consumer's risk of Dodge and Romig's tables"
            ));
        }
        if r.scheme() == crate::design::Scheme::Double {
            notes.push(
                "double plans take Dodge and Romig's form: the first sample rejects only beyond the final acceptance number".to_string(),
            );
        }
        if per_unit {
            notes.push("qualities are nonconformities per unit (Poisson model)".to_string());
        }
        if r.model().kind() == ModelKind::Hypergeometric {
            let mut given = vec![("process average", r.process_average())];
            if let Protection::Ltpd(point) = r.protection() {
                given.push(("LTPD", point.quality));
            }
            for (name, p) in given {
                let d = nonconforming_in_lot(p, lot);
                let quality = d as f64 / lot as f64;
                if (quality - p).abs() > 1e-9 * p {
                    notes.push(format!(
                        "in a lot of {lot} units the {name} {} means {d} nonconforming unit{} (D = round(p N)), a lot quality of {}",
                        format_quality(p, false),
                        if d == 1 { "" } else { "s" },
                        format_quality(quality, false)
                    ));
                }
            }
        }
        RectifyingReport {
            title: title.to_string(),
            scheme: r.scheme().name(),
            model: r.model().kind(),
            quality_unit: r.model().kind().quality_unit(),
            lot_size: lot,
            process_average: r.process_average(),
            protection,
            full_inspection: design.plan.is_none(),
            plan: design
                .plan
                .as_ref()
                .map(|p| RectifyingPlanReport::new(p, lot, risk)),
            single_plan: design
                .single
                .as_ref()
                .map(|p| RectifyingPlanReport::new(p, lot, risk)),
            by_acceptance_number: design.rows.clone(),
            notes,
            solved_by: tool_version(),
        }
    }

    /// The acceptance number of the best single plan: the chosen plan of a
    /// single request, the comparison plan of a double one.
    fn best_single_c(&self) -> Option<u64> {
        let best = match self.scheme {
            "double" => self.single_plan.as_ref(),
            _ => self.plan.as_ref(),
        }?;
        best.stages[0].accept
    }
}

/// How many rows of the acceptance-number table a terminal shows.
const ROWS: usize = 14;

impl Report for RectifyingReport {
    fn write_table(&self, out: &mut dyn Write) -> io::Result<()> {
        let r = self;
        let per_unit = r.model == ModelKind::Poisson;
        let q = |x: f64| format_quality(x, per_unit);
        writeln!(out, "{}", escape_controls(&r.title))?;
        writeln!(
            out,
            "minimum-inspection {} plan (Dodge and Romig's method), {} model, lot of {} units",
            r.scheme, r.model, r.lot_size
        )?;
        let protection = match r.protection.beta {
            Some(beta) => format!(
                "LTPD {} with consumer's risk {}",
                q(r.protection.quality),
                Short(beta)
            ),
            None => format!("AOQL {}", q(r.protection.quality)),
        };
        writeln!(
            out,
            "process average {}; protection: {protection}",
            q(r.process_average)
        )?;
        writeln!(out)?;
        match &r.plan {
            None => {
                writeln!(
                    out,
                    "  PLAN  inspect every unit of the lot (100% inspection), {} units per lot",
                    r.lot_size
                )?;
            }
            Some(p) => {
                let plan = &p.plan;
                writeln!(out, "{}", plan_headline(plan))?;
                for step in words::rectifying_procedure(plan, per_unit) {
                    writeln!(out, "  {step}")?;
                }
                if plan.as_single().is_none() {
                    writeln!(out)?;
                    write_stage_table(out, &p.stages)?;
                }
                writeln!(out)?;
                write_measures(out, r, p)?;
            }
        }
        for note in &r.notes {
            writeln!(out, "Note: {note}")?;
        }
        if r.scheme == "single" {
            writeln!(out)?;
            write_rows(out, r)?;
        }
        writeln!(out, "{}", words::CAUTION)
    }

    /// The single plans by acceptance number: `c, n_min, ati,
    /// best_single`.
    fn write_csv(&self, out: &mut dyn Write) -> io::Result<()> {
        let mut w = csv_writer(out);
        w.write_record(["c", "n_min", "ati", "best_single"])?;
        let best = self.best_single_c();
        for row in &self.by_acceptance_number {
            w.write_record([
                row.c.to_string(),
                row.n_min.map_or(String::new(), |n| n.to_string()),
                row.ati.map_or(String::new(), |a| a.to_string()),
                (best == Some(row.c)).to_string(),
            ])?;
        }
        w.flush()
    }
}

/// Pa, ATI and ASN at the process average against 100% inspection (and the
/// best single plan for a double one), then the AOQL and the LTPD.
fn write_measures(
    out: &mut dyn Write,
    r: &RectifyingReport,
    p: &RectifyingPlanReport,
) -> io::Result<()> {
    let per_unit = r.model == ModelKind::Poisson;
    let q = |x: f64| format_quality(x, per_unit);
    let heading = format!("Per lot at the process average {}", q(r.process_average));
    let mut g = grid(&[heading.as_str(), "Value"]);
    g.add_row(vec![
        "probability of acceptance Pa".to_string(),
        format!("{:.4}", p.pa),
    ]);
    if p.stages.len() > 1 {
        g.add_row(vec![
            "average sample number ASN".to_string(),
            format!("{:.1}", p.asn),
        ]);
    }
    g.add_row(vec![
        "average total inspection ATI".to_string(),
        format!("{:.1}", p.ati),
    ]);
    if let Some(s) = &r.single_plan {
        g.add_row(vec![
            format!("ATI of the best single plan, {}", s.plan),
            format!("{:.1}", s.ati),
        ]);
    }
    g.add_row(vec!["100% inspection".to_string(), r.lot_size.to_string()]);
    g.add_row(vec![
        "saved against 100% inspection".to_string(),
        format!(
            "{:.1} ({:.1}%)",
            p.saving,
            100.0 * p.saving / r.lot_size as f64
        ),
    ]);
    writeln!(out, "{g}")?;
    let achieved = p.pa_at_ltpd.map_or(String::new(), |pa| {
        format!("; Pa at the agreed LTPD {}", format_significant(pa, 4))
    });
    writeln!(
        out,
        "AOQL {} at quality {}; LTPD (Pa = {}) {}{achieved}",
        q(p.aoql.value),
        q(p.aoql.quality),
        p.ltpd_risk,
        q(p.ltpd)
    )
}

/// The single plans by acceptance number, with the row where the scan
/// stopped and why.
fn write_rows(out: &mut dyn Write, r: &RectifyingReport) -> io::Result<()> {
    writeln!(
        out,
        "Single plans by acceptance number (the smallest n giving the protection, and its ATI)"
    )?;
    let chosen = r.best_single_c();
    let rows = &r.by_acceptance_number;
    let first = match chosen {
        Some(c) => (c as usize + 3).saturating_sub(ROWS - 1).min(rows.len()),
        None => rows.len().saturating_sub(ROWS),
    };
    let mut g = grid(&["c", "smallest n", "ATI"]);
    for row in &rows[first..] {
        let mark = if Some(row.c) == chosen { " *" } else { "" };
        g.add_row(vec![
            format!("{}{mark}", row.c),
            row.n_min.map_or("none".to_string(), |n| n.to_string()),
            row.ati.map_or("-".to_string(), |a| format!("{a:.1}")),
        ]);
    }
    writeln!(out, "{g}")?;
    if first > 0 {
        writeln!(
            out,
            "({first} smaller acceptance numbers above; --format json lists them all)"
        )?;
    }
    if chosen.is_some() {
        writeln!(out, "* the chosen plan.")?;
    }
    match rows.last() {
        Some(RectifyingRow {
            c, n_min: Some(n), ..
        }) => {
            let best = r.plan.as_ref().map_or(r.lot_size as f64, |p| p.ati);
            writeln!(
                out,
                "The scan stops at c = {c}: its smallest n, {n}, is at least the best ATI, {best:.1}, and a larger c needs a larger n."
            )
        }
        Some(RectifyingRow { c, .. }) => writeln!(
            out,
            "The scan stops at c = {c}: no sample within the lot gives the protection with it, nor with a larger c."
        ),
        None => Ok(()),
    }
}
