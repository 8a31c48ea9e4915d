//! Terminal tables (comfy-table), for people.

use std::io::{self, Write};

use comfy_table::{CellAlignment, ContentArrangement, LineStyle, Table as Grid, TableStyle};

use super::RectifyingReport;
use super::words;
use super::{
    DesignReport, EvaluationBatchReport, EvaluationReport, PointReport, ReportFormat,
    SequentialReport, SourceEvaluation, TradeoffCellReport, TradeoffReport, VariablesDesignReport,
    VariablesEvaluationReport, VariablesReport, VerificationReport, quality_head, variables_rule,
};
use crate::design::{Input, Moved};
use crate::model::ModelKind;
use crate::numeric::{Short, format_quality, format_quality_cell, format_significant};
use crate::plain::escape_controls;
use crate::plan::{Stage, StagedPlan};

/// Aligned text tables for a terminal.
#[derive(Clone, Copy, Debug, Default)]
pub struct Table;

/// Rules above and below the table and under its header, none between rows.
const RULED: TableStyle = TableStyle::new()
    .top_border(LineStyle::none().fill('─').junction('─'))
    .header_separator(LineStyle::none().fill('─').junction('─'))
    .bottom_border(LineStyle::none().fill('─').junction('─'));

/// Heads of the lot columns of an evaluation under the hypergeometric
/// model.
const LOT_D: &str = "D in the lot";
const LOT_QUALITY: &str = "Lot quality D/N";

/// How many rows of alternatives a terminal table shows.
const ALTERNATIVE_ROWS: usize = 12;

pub(super) fn grid(header: &[&str]) -> Grid {
    let mut g = Grid::new();
    g.load_style(RULED)
        .set_content_arrangement(ContentArrangement::Dynamic);
    g.set_header(header.iter().copied());
    for i in 1..header.len() {
        if let Some(col) = g.column_mut(i) {
            col.set_cell_alignment(CellAlignment::Right);
        }
    }
    g
}

/// How many rows of an item table a terminal shows.
const ITEM_ROWS: usize = 24;

pub(super) fn write_stage_table(out: &mut dyn Write, stages: &[Stage]) -> io::Result<()> {
    let mut g = grid(&[
        "Stage",
        "New units",
        "Units in all",
        "Accept if count <=",
        "Reject if count >=",
    ]);
    let mut drawn = 0;
    for (i, s) in stages.iter().enumerate() {
        g.add_row(vec![
            (i + 1).to_string(),
            (s.n - drawn).to_string(),
            s.n.to_string(),
            s.accept.map_or("-".to_string(), |a| a.to_string()),
            s.reject.to_string(),
        ]);
        drawn = s.n;
    }
    writeln!(out, "{g}")
}

fn write_item_table(out: &mut dyn Write, seq: &SequentialReport) -> io::Result<()> {
    let mut g = grid(&[
        "Units inspected",
        "Accept if count <=",
        "Reject if count >=",
    ]);
    for run in seq.table.iter().take(ITEM_ROWS) {
        let items = if run.first == run.last {
            run.first.to_string()
        } else {
            format!("{} to {}", run.first, run.last)
        };
        g.add_row(vec![
            items,
            run.accept.map_or("-".to_string(), |a| a.to_string()),
            run.reject.to_string(),
        ]);
    }
    writeln!(out, "{g}")?;
    if seq.table.len() > ITEM_ROWS {
        writeln!(
            out,
            "({} more rows up to unit {}; --format json lists them all)",
            seq.table.len() - ITEM_ROWS,
            seq.truncation
        )?;
    }
    Ok(())
}

/// The two risk points with their agreed and achieved risks.
fn write_risk_points(
    out: &mut dyn Write,
    producer: &PointReport,
    consumer: &PointReport,
    per_unit: bool,
) -> io::Result<()> {
    let mut g = grid(&["Risk point", "Quality", "Agreed risk", "Achieved risk"]);
    for (name, greek, p) in [
        ("Producer (AQL)", "alpha", producer),
        ("Consumer (RQL)", "beta", consumer),
    ] {
        g.add_row(vec![
            name.to_string(),
            format_quality(p.quality, per_unit),
            format!("{greek} {}", Short(p.risk)),
            format_significant(p.achieved_risk, 4),
        ]);
    }
    writeln!(out, "{g}")
}

/// The first line of a single or staged plan: `  PLAN  n = 110, c = 3
/// (reject at 4)`, or the number of stages.
pub(super) fn plan_headline(plan: &StagedPlan) -> String {
    match plan.as_single() {
        Some((n, c)) => format!("  PLAN  n = {n}, c = {c} (reject at {})", c + 1),
        None => format!("  PLAN  {} stages (cumulative counts)", plan.stages().len()),
    }
}

fn optional(v: Option<u64>, prefix: &str) -> String {
    v.map_or("none".to_string(), |x| format!("{prefix}{x}"))
}

impl ReportFormat for Table {
    fn design(&self, out: &mut dyn Write, r: &DesignReport) -> io::Result<()> {
        let per_unit = r.model == ModelKind::Poisson;
        writeln!(out, "{}", escape_controls(&r.title))?;
        let lot = r
            .lot_size
            .map_or("no lot size".to_string(), |n| format!("lot of {n} units"));
        writeln!(out, "{} plan, {} model, {lot}", r.scheme, r.model)?;
        writeln!(out)?;
        let plan = &r.plan;
        if let Some(seq) = &r.sequential {
            writeln!(
                out,
                "  PLAN  item by item: accept when d <= {:.5} n - {:.5}, reject when d >= {:.5} n + {:.5}; at item {} accept d <= {}",
                seq.slope,
                seq.h_accept,
                seq.slope,
                seq.h_reject,
                seq.truncation,
                seq.final_acceptance
            )?;
        } else {
            writeln!(out, "{}", plan_headline(plan))?;
        }
        for step in words::plan_procedure(plan, per_unit) {
            writeln!(out, "  {step}")?;
        }
        if let Some(seq) = &r.sequential {
            writeln!(out)?;
            write_item_table(out, seq)?;
        } else if plan.as_single().is_none() {
            writeln!(out)?;
            write_stage_table(out, &r.stages)?;
        }
        writeln!(out)?;
        write_risk_points(out, &r.producer, &r.consumer, per_unit)?;
        for note in &r.notes {
            writeln!(out, "Note: {note}")?;
        }
        if let Some(a) = &r.asn {
            writeln!(out)?;
            let mut g = grid(&["Average sample number", "Units"]);
            g.add_row(vec!["at the AQL".to_string(), format!("{:.1}", a.at_aql)]);
            g.add_row(vec!["at the RQL".to_string(), format!("{:.1}", a.at_rql)]);
            g.add_row(vec![
                format!("largest (at {})", format_quality(a.max_quality, per_unit)),
                format!("{:.1}", a.max),
            ]);
            g.add_row(vec!["largest sample".to_string(), a.max_sample.to_string()]);
            g.add_row(vec![
                format!(
                    "single plan n = {}, c = {}",
                    r.single_plan.n, r.single_plan.c
                ),
                r.single_plan.n.to_string(),
            ]);
            writeln!(out, "{g}")?;
            if let Some(w) = r.sequential.as_ref().and_then(|s| s.wald) {
                writeln!(
                    out,
                    "Wald's approximations (untruncated test): ASN {:.1} at the AQL, {:.1} at the RQL, {:.1} at most",
                    w.asn_aql, w.asn_rql, w.asn_max
                )?;
            }
            if let Some(c) = r.criterion {
                writeln!(out, "The designer minimised {c}.")?;
            }
            write_sensitivity(out, r, per_unit)?;
            return writeln!(out, "{}", words::CAUTION);
        }
        writeln!(out)?;
        writeln!(
            out,
            "Nearby plans (sample sizes meeting each point, by acceptance number)"
        )?;
        let chosen = r.stages[0].accept.unwrap_or(0) as usize;
        let last = r.alternatives.len();
        let first = (chosen + 1 + 3).saturating_sub(ALTERNATIVE_ROWS).min(last);
        let mut g = grid(&["c", "meets RQL from n", "meets AQL up to n", "both"]);
        for a in &r.alternatives[first..] {
            let both = if a.feasible {
                format!("n = {} to {}", a.n_min.unwrap_or(0), a.n_max.unwrap_or(0))
            } else {
                "no".to_string()
            };
            let mark = if a.c as usize == chosen { " *" } else { "" };
            g.add_row(vec![
                format!("{}{mark}", a.c),
                optional(a.n_min, ""),
                optional(a.n_max, ""),
                both,
            ]);
        }
        writeln!(out, "{g}")?;
        if first > 0 {
            writeln!(
                out,
                "({first} smaller acceptance numbers meet no n; --format json lists them all)"
            )?;
        }
        writeln!(out, "* the chosen plan.")?;
        write_sensitivity(out, r, per_unit)?;
        writeln!(out, "{}", words::CAUTION)
    }

    fn evaluation(&self, out: &mut dyn Write, r: &EvaluationReport) -> io::Result<()> {
        let per_unit = r.model == ModelKind::Poisson;
        accepted_line(out, r.accepted_recorded.as_deref())?;
        let lot = r
            .lot_size
            .map_or("no lot size".to_string(), |n| format!("lot of {n} units"));
        match &r.sequential {
            Some(seq) => writeln!(
                out,
                "Plan item by item: accept d <= {:.5} n - {:.5}, reject d >= {:.5} n + {:.5}, at item {} accept d <= {}; {} model, {lot}",
                seq.slope,
                seq.h_accept,
                seq.slope,
                seq.h_reject,
                seq.truncation,
                seq.final_acceptance,
                r.model
            )?,
            None => {
                let plan: Vec<String> = r.stages.iter().map(Stage::to_string).collect();
                writeln!(
                    out,
                    "Plan {} (N:AC:RE), {} model, {lot}",
                    plan.join(" "),
                    r.model
                )?
            }
        }
        let (quality, aoq) = (
            quality_head("Quality", per_unit),
            quality_head("AOQ", per_unit),
        );
        // A finite lot holds a whole number D of nonconforming units: each
        // row says which, and the lot quality D/N its measures are at.
        let lot = r.points.iter().any(|p| p.lot_nonconforming.is_some());
        let mut header = vec![quality.as_str()];
        if lot {
            header.extend([LOT_D, LOT_QUALITY]);
        }
        header.extend(["Pa", &aoq, "ATI", "ASN", "ASN curtailed"]);
        let mut g = grid(&header);
        for p in &r.points {
            let mut row = vec![format_quality_cell(p.quality, per_unit)];
            if lot {
                row.push(
                    p.lot_nonconforming
                        .map_or("-".to_string(), |d| d.to_string()),
                );
                row.push(
                    p.lot_quality
                        .map_or("-".to_string(), |q| format_quality_cell(q, per_unit)),
                );
            }
            row.extend([
                format!("{:.4}", p.pa),
                format_quality_cell(p.aoq, per_unit),
                p.ati.map_or("-".to_string(), |v| format!("{v:.1}")),
                format!("{:.1}", p.asn),
                p.asn_curtailed
                    .map_or("-".to_string(), |v| format!("{v:.1}")),
            ]);
            g.add_row(row);
        }
        writeln!(out, "{g}")?;
        // Both are lot qualities D/N under the hypergeometric model.
        let with_d = |q: f64| match r.lot_size {
            Some(n) if lot => format!(
                "{} (D = {})",
                format_quality(q, per_unit),
                crate::model::nonconforming_in_lot(q, n)
            ),
            _ => format_quality(q, per_unit),
        };
        writeln!(
            out,
            "AOQL {} at {}quality {}; indifference quality (Pa = 0.5) {}",
            format_quality(r.aoql.value, per_unit),
            if lot { "lot " } else { "" },
            with_d(r.aoql.quality),
            with_d(r.indifference_quality)
        )?;
        if lot {
            writeln!(
                out,
                "A lot of N units holds D = round(p N) nonconforming units: every measure of a row is at its lot quality D/N."
            )?;
        }
        if r.lot_size.is_none() {
            writeln!(
                out,
                "AOQ without a lot size is Pa x p; give --lot-size for ATI and the (N - n)/N factor."
            )?;
        }
        Ok(())
    }

    fn verification(&self, out: &mut dyn Write, r: &VerificationReport) -> io::Result<()> {
        let summary = r.summary();
        if !r.every_source {
            return write!(out, "{summary}");
        }
        let mut g = grid(&["Source", "Result", "Details"]);
        if let Some(col) = g.column_mut(2) {
            col.set_cell_alignment(CellAlignment::Left);
        }
        for e in &r.results {
            let details = if let Some(m) = &e.message {
                m.clone()
            } else {
                e.differences
                    .iter()
                    .map(|d| {
                        format!(
                            "{}: recorded {}, re-solved {}",
                            d.field, d.recorded, d.resolved
                        )
                    })
                    .collect::<Vec<_>>()
                    .join("; ")
            };
            g.add_row(vec![
                escape_controls(&e.path).into_owned(),
                e.status.name().to_string(),
                escape_controls(&details).into_owned(),
            ]);
        }
        writeln!(out, "{g}")?;
        writeln!(out, "{}", summary.counts())
    }

    fn evaluations(&self, out: &mut dyn Write, r: &EvaluationBatchReport) -> io::Result<()> {
        for e in &r.results {
            writeln!(out, "Source {}", escape_controls(&e.path))?;
            match (&e.evaluation, &e.message) {
                (Some(SourceEvaluation::Attributes(report)), _) => self.evaluation(out, report)?,
                (Some(SourceEvaluation::Variables(report)), _) => {
                    self.variables_evaluation(out, report)?
                }
                (None, message) => writeln!(
                    out,
                    "invalid: {}",
                    escape_controls(message.as_deref().unwrap_or(""))
                )?,
            }
            writeln!(out)?;
        }
        write!(out, "{}", r.summary())
    }

    fn variables_design(&self, out: &mut dyn Write, r: &VariablesDesignReport) -> io::Result<()> {
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
        if r.variables.sigma == crate::plan::SigmaKind::Unknown {
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

    fn variables_evaluation(
        &self,
        out: &mut dyn Write,
        r: &VariablesEvaluationReport,
    ) -> io::Result<()> {
        accepted_line(out, r.accepted_recorded.as_deref())?;
        let lot = r
            .lot_size
            .map_or("no lot size".to_string(), |n| format!("lot of {n} units"));
        writeln!(out, "Plan {}; {lot}", r.plan)?;
        writeln!(out, "{}", specification_line(&r.variables))?;
        let centred = r.points.iter().any(|p| p.pa_centred.is_some());
        let mut header = vec!["Quality", "Pa"];
        if centred {
            header[1] = "Pa one-sided";
            header.push("Pa centred");
        }
        header.extend(["AOQ", "ATI"]);
        let mut g = grid(&header);
        for p in &r.points {
            let mut row = vec![format_quality(p.quality, false), format!("{:.4}", p.pa)];
            if centred {
                row.push(p.pa_centred.map_or("-".to_string(), |v| format!("{v:.4}")));
            }
            row.push(format_quality(p.aoq, false));
            row.push(p.ati.map_or("-".to_string(), |v| format!("{v:.1}")));
            g.add_row(row);
        }
        writeln!(out, "{g}")?;
        writeln!(
            out,
            "AOQL {} at quality {}; indifference quality (Pa = 0.5) {}; every lot inspects n = {} (ASN)",
            format_quality(r.aoql.value, false),
            format_quality(r.aoql.quality, false),
            format_quality(r.indifference_quality, false),
            r.variables.n
        )?;
        if r.lot_size.is_none() {
            writeln!(
                out,
                "AOQ without a lot size is Pa x p; give lot_size for ATI and the (N - n)/N factor."
            )?;
        }
        Ok(())
    }

    fn tradeoff(&self, out: &mut dyn Write, r: &TradeoffReport) -> io::Result<()> {
        let per_unit = r.model == ModelKind::Poisson;
        if let Some(title) = &r.title {
            writeln!(out, "{}", escape_controls(title))?;
        }
        let lot = r
            .lot_size
            .map_or("no lot size".to_string(), |n| format!("lot of {n} units"));
        writeln!(
            out,
            "{} plans, {} model, {lot}; alpha {} and beta {} in every cell",
            r.scheme,
            r.model,
            Short(r.alpha),
            Short(r.beta)
        )?;
        if per_unit {
            writeln!(
                out,
                "AQL and RQL in nonconformities per unit (per 100 units in brackets)"
            )?;
        }
        writeln!(out)?;
        let double = r.criterion.is_some();
        if double {
            writeln!(
                out,
                "ASN at the AQL (largest sample n1 + n2) of the double plan minimising {} for each AQL (row) and RQL (column)",
                r.criterion.unwrap_or_default()
            )?;
        } else {
            writeln!(
                out,
                "Sample size and acceptance number n/c of the smallest single plan for each AQL (row) and RQL (column)"
            )?;
        }
        write_matrix(out, r, per_unit, |c| match (c.n, c.c) {
            _ if c.full_inspection => "100%".to_string(),
            (Some(n), Some(_)) if double => {
                format!("{:.1} ({n})", c.asn_at_aql.unwrap_or(f64::NAN))
            }
            (Some(n), Some(acc)) => format!("{n}/{acc}"),
            _ => "-".to_string(),
        })?;
        if let Some(k) = &r.cost {
            writeln!(out)?;
            writeln!(
                out,
                "Expected inspection cost per lot at the process average {} ({} per unit inspected; ATI: sample, plus the whole lot when rejected)",
                format_quality(k.process_average, per_unit),
                k.per_unit
            )?;
            write_matrix(out, r, per_unit, |c| {
                c.cost
                    .flatten()
                    .map_or("-".to_string(), |v| format!("{v:.2}"))
            })?;
        }
        let whole = r.cells.iter().filter(|c| c.full_inspection).count();
        if let (true, Some(lot)) = (whole > 0, r.lot_size) {
            writeln!(
                out,
                "- 100% in {whole} of {} cells: their points need a sample larger than the lot of {lot} units, so every unit is inspected (ATI {lot}{})",
                r.cells.len(),
                r.cost.as_ref().map_or(String::new(), |k| format!(
                    ", cost {:.2} per lot",
                    k.per_unit * lot as f64
                ))
            )?;
        }
        let failed: Vec<&TradeoffCellReport> = r
            .cells
            .iter()
            .filter(|c| c.reason.is_some() && !c.full_inspection)
            .collect();
        if let Some(first) = failed.first() {
            writeln!(
                out,
                "- no plan in {} of {} cells (--format json gives each reason), e.g. at AQL {}, RQL {}: {}",
                failed.len(),
                r.cells.len(),
                format_quality(first.aql, per_unit),
                format_quality(first.rql, per_unit),
                first.reason.as_deref().unwrap_or_default()
            )?;
        }
        writeln!(
            out,
            "The grid is a negotiation aid: record the agreed plan with `lotsman design ... --output FILE.yaml`."
        )?;
        writeln!(out, "{}", words::CAUTION)
    }

    fn rectifying(&self, out: &mut dyn Write, report: &RectifyingReport) -> io::Result<()> {
        super::rectifying::write_table(out, report)
    }
}

/// What each concession saves and each tightening costs, one row per input.
fn write_sensitivity(out: &mut dyn Write, r: &DesignReport, per_unit: bool) -> io::Result<()> {
    if r.sensitivity.is_empty() {
        return Ok(());
    }
    writeln!(out)?;
    writeln!(
        out,
        "What one step of each input does to the single plan (n = {}, c = {}), the other three as agreed{}",
        r.single_plan.n,
        r.single_plan.c,
        if per_unit {
            " (AQL and RQL per unit, per 100 units in brackets)"
        } else {
            ""
        }
    )?;
    let mut g = grid(&[
        "Input",
        "Agreed",
        "Step",
        "Conceded to",
        "n",
        "Tightened to",
        "n",
    ]);
    // The inputs and steps are decimals a person chose: print them as
    // written, with no padding digits.
    let decimal = |v: f64| format!("{}", format!("{v:.11e}").parse::<f64>().unwrap_or(v));
    let value = |input: Input, v: f64| match input {
        Input::Aql | Input::Rql if per_unit => format!("{} ({})", decimal(v), decimal(100.0 * v)),
        Input::Aql | Input::Rql => format!("{}%", decimal(100.0 * v)),
        _ => decimal(v),
    };
    let n = |m: &Moved| match (m.n, m.change) {
        (Some(n), Some(d)) if d != 0 => format!("{n} ({d:+})"),
        (Some(n), _) => format!("{n} (same)"),
        _ => "no plan".to_string(),
    };
    let mut reasons = Vec::new();
    for s in &r.sensitivity {
        for m in [&s.conceded, &s.tightened] {
            if let Some(why) = &m.reason {
                reasons.push(format!(
                    "{} = {}: {why}",
                    s.input.label(),
                    value(s.input, m.value)
                ));
            }
        }
        g.add_row(vec![
            s.input.label().to_string(),
            value(s.input, s.value),
            value(s.input, s.step),
            value(s.input, s.conceded.value),
            n(&s.conceded),
            value(s.input, s.tightened.value),
            n(&s.tightened),
        ]);
    }
    writeln!(out, "{g}")?;
    for why in reasons {
        writeln!(out, "  no plan at {why}")?;
    }
    writeln!(
        out,
        "A concession is a lower AQL or a larger alpha (producer), a higher RQL or a larger beta (consumer); --step-aql, --step-alpha, --step-rql, --step-beta set the steps."
    )
}

/// How many RQL columns one block of a grid shows.
const GRID_COLUMNS: usize = 8;

/// The grid as blocks of at most [`GRID_COLUMNS`] RQL columns, one row per
/// AQL, each cell as `text` writes it.
fn write_matrix(
    out: &mut dyn Write,
    r: &TradeoffReport,
    per_unit: bool,
    text: impl Fn(&TradeoffCellReport) -> String,
) -> io::Result<()> {
    for first in (0..r.rql.len()).step_by(GRID_COLUMNS) {
        let last = (first + GRID_COLUMNS).min(r.rql.len());
        let mut header = vec!["AQL \\ RQL".to_string()];
        header.extend(
            r.rql[first..last]
                .iter()
                .map(|&q| format_quality_cell(q, per_unit)),
        );
        let mut g = Grid::new();
        g.load_style(RULED)
            .set_content_arrangement(ContentArrangement::Disabled);
        g.set_header(header);
        for i in 1..=last - first {
            if let Some(col) = g.column_mut(i) {
                col.set_cell_alignment(CellAlignment::Right);
            }
        }
        for (i, &aql) in r.aql.iter().enumerate() {
            let mut row = vec![format_quality_cell(aql, per_unit)];
            row.extend((first..last).map(|j| text(r.cell(i, j))));
            g.add_row(row);
        }
        writeln!(out, "{g}")?;
    }
    Ok(())
}

/// `variables plan, sigma unknown, upper limit U = 12.05`.
fn specification_line(v: &VariablesReport) -> String {
    let mut limits = Vec::new();
    if let Some(l) = v.lower {
        limits.push(format!("L = {l}"));
    }
    if let Some(u) = v.upper {
        limits.push(format!("U = {u}"));
    }
    let sigma = match v.sigma_value {
        Some(s) => format!("sigma known = {s}"),
        None => "sigma unknown (estimated by s)".to_string(),
    };
    format!(
        "variables plan, {sigma}, {} limit{} {}",
        v.limit.name(),
        if v.lower.is_some() && v.upper.is_some() {
            "s"
        } else {
            ""
        },
        limits.join(", ")
    )
}

/// The first line of an evaluation of a plan used as recorded although the
/// audit does not confirm it (`--accept-recorded`): the discrepancy.
fn accepted_line(out: &mut dyn Write, accepted: Option<&str>) -> io::Result<()> {
    match accepted {
        Some(d) => writeln!(out, "EVALUATED AS RECORDED (--accept-recorded): {d}"),
        None => Ok(()),
    }
}
