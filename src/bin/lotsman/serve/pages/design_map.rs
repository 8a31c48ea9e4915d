//! The trade-off map of the design screen, its own page (`GET
//! /design/map`), so that the design answers at once and a slow grid
//! (double plans) follows when it is ready: the grid of `lotsman
//! tradeoff` around the agreed points (each AQL from half to twice the
//! agreed one, each RQL likewise, `map` values a side, 7 unless given),
//! read from the same flags by the same path, solved by the same library
//! call, drawn by the print layer as the PDF map is, and its cells as a
//! table with the chosen plan's cells marked.

use std::collections::HashMap;

use askama::Template;
use axum::extract::Query;
use axum::extract::rejection::QueryRejection;
use axum::http::StatusCode;
use axum::response::{IntoResponse, Response};
use clap::ValueEnum;
use lotsman::{
    ModelKind, Paper, Scheme, StagedPlan, TradeoffReport, TradeoffRequest, format_quality,
    render_tradeoff_map_svg, shell_word, tradeoff,
};

use super::design_form::{DesignFields, design, inline_svg};
use crate::cli::design::{DescriptionFlags, DesignArgs};
use crate::cli::groups::{FormatFlag, OutputFlags, PaperFlag, RiskFlags};
use crate::cli::tradeoff::{TradeoffArgs, TradeoffFormat};
use crate::cli::values::{PaperArg, SingleOrDoubleArg};
use crate::commands::design::Designed;
use crate::serve::guard::queried;
use crate::serve::page::{Refusal, render};

/// The largest grid whose cells the page lists as a table; a larger one
/// is shown as the map only (its numbers: the command, `--format csv`).
const MOST_LISTED: usize = 30;

/// The title on the map.
const TITLE: &str = "Trade-off around the agreed points";

/// One row of the cells' table: the AQL and each RQL's cell.
struct CellRow {
    aql: String,
    cells: Vec<CellShown>,
}

/// One cell as the table shows it.
struct CellShown {
    /// `n/c` (single) or `ASN (largest sample)` (double), `-` without a
    /// plan.
    plan: String,
    /// The cost per lot, when the grid has a cost.
    cost: Option<String>,
    /// Why there is no plan.
    reason: Option<String>,
    /// Whether the designed plan is this cell's plan.
    chosen: bool,
}

/// What the page shows of the map.
struct Shown {
    svg: String,
    described: String,
    command: String,
    single_note: Option<String>,
    cost_note: Option<String>,
    columns: Vec<String>,
    rows: Vec<CellRow>,
    listed: bool,
    double: bool,
    /// Whether the cells carry a cost per lot.
    costed: bool,
}

#[derive(Template)]
#[template(path = "serve/design_map.html")]
struct MapPage {
    title: &'static str,
    back: String,
    error: Option<String>,
    result: Option<Shown>,
}

/// `GET /design/map`: the trade-off map around the points of the design
/// form's fields.
pub async fn show(query: Result<Query<HashMap<String, String>>, QueryRejection>) -> Response {
    let fields = match queried(query) {
        Ok(f) => DesignFields::of(&f),
        Err(r) => return r.into_response(),
    };
    let back = format!("/design?{}", fields.query());
    let (status, result, error) = match mapped(fields).await {
        Ok(shown) => (StatusCode::OK, Some(shown), None),
        Err(r) => (r.status(), None, Some(r.message().to_string())),
    };
    render(
        status,
        &MapPage {
            title: "Trade-off map",
            back,
            error,
            result,
        },
    )
}

/// The map of `fields`: the design first (for the agreed points and the
/// chosen plan), then the grid, off the server's request threads.
async fn mapped(fields: DesignFields) -> Result<Shown, Refusal> {
    if !fields.asked() {
        return Err(Refusal::bad(
            "give the AQL and the RQL in the design form first; the map is drawn around them",
        ));
    }
    if !fields.map.chars().all(|c| c.is_ascii_digit()) {
        return Err(Refusal::bad(format!(
            "the map size '{}' is not a whole number: give the number of AQL and of RQL values, as 7",
            lotsman::escape_controls(&fields.map)
        )));
    }
    let designed = design(fields.clone(), None, DescriptionFlags::default()).await?;
    let (args, cost_note) = grid_args(&fields, &designed)?;
    let request = TradeoffRequest::try_from(&args)?;
    let command = command(&args);
    tokio::task::spawn_blocking(move || shown(&designed, &request, command, cost_note))
        .await
        .map_err(|_| Refusal::failed("the map stopped before it finished; reload the page"))?
}

/// The arguments `lotsman tradeoff` would get for the map of `fields`,
/// and a note when the cost is left out for want of a lot size.
fn grid_args(
    fields: &DesignFields,
    designed: &Designed,
) -> Result<(TradeoffArgs, Option<String>), Refusal> {
    let DesignArgs { risks, model, .. } = fields.args(None, DescriptionFlags::default())?;
    let per_unit = designed.request.model.kind() == ModelKind::Poisson;
    let (p, c) = (
        designed.request.risks.producer().quality,
        designed.request.risks.consumer().quality,
    );
    let axis = |q: f64| {
        format!(
            "{}:{}:{}",
            quality_text(q / 2.0, per_unit),
            quality_text(q * 2.0, per_unit),
            fields.map
        )
    };
    let scheme = match designed.request.scheme {
        Scheme::Double => SingleOrDoubleArg::Double,
        _ => SingleOrDoubleArg::Single,
    };
    let has_cost = !fields.cost.is_empty();
    let cost_note = (has_cost && model.lot_size.is_none()).then(|| {
        "The cost panel needs a lot size: it counts the 100% inspection of rejected lots. Give the lot size N.".to_string()
    });
    let with_cost = has_cost && cost_note.is_none();
    let process = match fields.process.as_str() {
        "" => fields.aql.clone(),
        text => text.to_string(),
    };
    let args = TradeoffArgs {
        risks: RiskFlags {
            aql: Some(axis(p)),
            alpha: risks.alpha,
            rql: Some(axis(c)),
            beta: risks.beta,
        },
        model,
        scheme,
        criterion: None,
        cost_per_unit: with_cost.then(|| fields.cost.clone()),
        process_average: with_cost.then_some(process),
        title: Some(TITLE.to_string()),
        report: FormatFlag {
            format: TradeoffFormat::Pdf,
        },
        output: OutputFlags {
            output: Some("trade-off.pdf".into()),
            force: false,
        },
        paper: PaperFlag {
            paper: PaperArg::A4,
        },
    };
    Ok((args, cost_note))
}

/// A quality as a flag takes it: a percent (`0.5%`) for a fraction, the
/// rate itself per unit, with no padding digits.
fn quality_text(q: f64, per_unit: bool) -> String {
    let decimal = |v: f64| format!("{}", format!("{v:.11e}").parse::<f64>().unwrap_or(v));
    if per_unit {
        decimal(q)
    } else {
        format!("{}%", decimal(100.0 * q))
    }
}

/// The command that draws the same map as a PDF.
fn command(args: &TradeoffArgs) -> String {
    let r = &args.risks;
    let mut words = vec![
        "lotsman tradeoff".to_string(),
        format!("--aql {}", shell_word(r.aql.as_deref().unwrap_or(""))),
        format!("--rql {}", shell_word(r.rql.as_deref().unwrap_or(""))),
        format!("--alpha {}", shell_word(&r.alpha)),
        format!("--beta {}", shell_word(&r.beta)),
    ];
    if let Some(m) = args.model.model.and_then(|m| m.to_possible_value()) {
        words.push(format!("--model {}", m.get_name()));
    }
    if let Some(n) = &args.model.lot_size {
        words.push(format!("--lot-size {}", shell_word(n)));
    }
    if args.scheme == SingleOrDoubleArg::Double {
        words.push("--scheme double".to_string());
    }
    if let (Some(k), Some(p)) = (&args.cost_per_unit, &args.process_average) {
        words.push(format!(
            "--cost-per-unit {} --process-average {}",
            shell_word(k),
            shell_word(p)
        ));
    }
    words.push(format!("--title {}", shell_word(TITLE)));
    words.push("--format pdf --output trade-off.pdf".to_string());
    words.join(" ")
}

/// The grid solved, checked as the command checks it, drawn and listed.
fn shown(
    designed: &Designed,
    request: &TradeoffRequest,
    command: String,
    cost_note: Option<String>,
) -> Result<Shown, Refusal> {
    let grid = tradeoff(request, &|| {});
    // The map checks the report's guard before it draws.
    let report = TradeoffReport::new(Some(TITLE), &grid);
    let risks = &designed.request.risks;
    let agreed = (risks.consumer().quality, risks.producer().quality);
    let svg = render_tradeoff_map_svg(&grid, TITLE, Some(&command), Paper::A4, Some(agreed))?;
    let scheme = designed.request.scheme;
    let double = scheme == Scheme::Double;
    // The plan each cell is compared with: the designed one, or for a
    // multiple or sequential design its single plan, which the map shows.
    let single = &designed.solution.single;
    let chosen = match scheme {
        Scheme::Single | Scheme::Double => designed.solution.design.plan.clone(),
        _ => StagedPlan::single(single.n, single.c, &designed.request.model)
            .map_err(Refusal::from)?,
    };
    let single_note = (!matches!(scheme, Scheme::Single | Scheme::Double)).then(|| {
        format!(
            "The map is of single plans: a trade-off grid is solved for single and double plans only. The {scheme} plan above compares itself with the single plan n = {}, c = {}, ringed cells hold that plan.",
            single.n, single.c
        )
    });
    let per_unit = request.model().kind() == ModelKind::Poisson;
    let listed = request.cell_count() <= MOST_LISTED * MOST_LISTED;
    let rows = if listed {
        request
            .aql()
            .iter()
            .enumerate()
            .map(|(i, &aql)| CellRow {
                aql: format_quality(aql, per_unit),
                cells: (0..request.rql().len())
                    .map(|j| cell(&grid.cell(i, j).outcome, &report, (i, j), &chosen, double))
                    .collect(),
            })
            .collect()
    } else {
        Vec::new()
    };
    Ok(Shown {
        svg: inline_svg(svg),
        described: format!(
            "{} plans, {}; alpha {} and beta {} in every cell",
            request.scheme(),
            request.model().described(),
            lotsman::Short(request.alpha()),
            lotsman::Short(request.beta())
        ),
        command,
        single_note,
        cost_note,
        columns: request
            .rql()
            .iter()
            .map(|&q| format_quality(q, per_unit))
            .collect(),
        rows,
        listed,
        double,
        costed: request.cost().is_some(),
    })
}

/// Cell `(i, j)` of the grid as the table shows it: the plan as the
/// command's table writes it, and the cost of the report's cell.
fn cell(
    outcome: &Result<lotsman::CellPlan, lotsman::DesignError>,
    report: &TradeoffReport,
    (i, j): (usize, usize),
    chosen: &StagedPlan,
    double: bool,
) -> CellShown {
    let r = report.cell(i, j);
    match outcome {
        Ok(p) => CellShown {
            plan: if double {
                format!("{:.1} ({})", p.asn_at_aql, p.plan.max_sample())
            } else {
                format!("{}/{}", p.n(), p.c())
            },
            cost: r.cost.flatten().map(|k| format!("{k:.2}")),
            reason: None,
            chosen: &p.plan == chosen,
        },
        Err(_) => CellShown {
            plan: "-".to_string(),
            cost: r.cost.flatten().map(|k| format!("{k:.2}")),
            reason: r.reason.clone(),
            chosen: false,
        },
    }
}
