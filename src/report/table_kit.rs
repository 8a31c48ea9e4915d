//! The pieces of the terminal tables that several reports share: the
//! ruled grid, the stage and item tables of a plan, the risk points, and
//! the lines around them.

use std::io::{self, Write};

use comfy_table::{CellAlignment, ContentArrangement, LineStyle, Table as Grid, TableStyle};

use super::parts::{PointReport, SequentialReport, VariablesReport};
use crate::numeric::{Short, format_quality, format_significant};
use crate::plan::{Stage, StagedPlan};

/// Rules above and below the table and under its header, none between rows.
pub(crate) const RULED: TableStyle = TableStyle::new()
    .top_border(LineStyle::none().fill('─').junction('─'))
    .header_separator(LineStyle::none().fill('─').junction('─'))
    .bottom_border(LineStyle::none().fill('─').junction('─'));

/// A ruled grid with `header`, every column but the first right-aligned.
pub(crate) fn grid(header: &[&str]) -> Grid {
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

/// The stages of a plan on cumulative counts, one row each.
pub(crate) fn write_stage_table(out: &mut dyn Write, stages: &[Stage]) -> io::Result<()> {
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

/// The inspector's table of an item-by-item plan, in runs of items with
/// the same numbers; the first [`ITEM_ROWS`] of them.
pub(crate) fn write_item_table(out: &mut dyn Write, seq: &SequentialReport) -> io::Result<()> {
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
pub(crate) fn write_risk_points(
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
pub(crate) fn plan_headline(plan: &StagedPlan) -> String {
    match plan.as_single() {
        Some((n, c)) => format!("  PLAN  n = {n}, c = {c} (reject at {})", c + 1),
        None => format!("  PLAN  {} stages (cumulative counts)", plan.stages().len()),
    }
}

/// An optional count, `none` when absent.
pub(crate) fn optional(v: Option<u64>, prefix: &str) -> String {
    v.map_or("none".to_string(), |x| format!("{prefix}{x}"))
}

/// `variables plan, sigma unknown, upper limit U = 12.05`.
pub(crate) fn specification_line(v: &VariablesReport) -> String {
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
pub(crate) fn accepted_line(out: &mut dyn Write, accepted: Option<&str>) -> io::Result<()> {
    match accepted {
        Some(d) => writeln!(out, "EVALUATED AS RECORDED (--accept-recorded): {d}"),
        None => Ok(()),
    }
}

/// The head of a table column of qualities (or AOQs) named `name`: the
/// name alone for fractions, which print with their `%`; with both units
/// for nonconformities ([`format_quality_cell`]).
pub(crate) fn quality_head(name: &str, per_unit: bool) -> String {
    if per_unit {
        format!("{name} per unit (per 100 units)")
    } else {
        name.to_string()
    }
}
