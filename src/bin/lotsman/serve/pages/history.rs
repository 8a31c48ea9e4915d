//! The supplier-history screen: a ledger of the workspace with what
//! `lotsman status` prints (the severity, the next plan, the switching
//! counters in words, the process average with its interval and
//! warnings), the control chart of `lotsman history --output chart.svg`
//! inline (its bands show the severity of each lot), and the lots.

use std::collections::HashMap;

use askama::Template;
use axum::extract::rejection::QueryRejection;
use axum::extract::{Query, State};
use axum::response::{IntoResponse, Response};
use lotsman::{
    Error, Format, HistoryFormat, Ledger, StatusReport, format_significant, ledger_history,
    ledger_plans, ledger_status, render_history,
};

use crate::out::report_bytes;
use crate::serve::guard::{field, queried};
use crate::serve::page::{off_thread, render, shown_outcome};
use crate::serve::state::AppState;
use crate::serve::workspace::Workspace;

/// One lot as the table lists it.
struct LotRow {
    seq: u64,
    date: String,
    lot: String,
    severity: String,
    n: String,
    found: String,
    fraction: String,
    decision: String,
    out_of_control: bool,
}

/// What the page shows of a ledger.
struct Shown {
    /// The next lot's inspection in one phrase.
    standing: String,
    /// The status as `lotsman status` prints it.
    status: String,
    /// The control chart, inline SVG; or why there is none.
    chart: Result<String, String>,
    lots: Vec<LotRow>,
}

/// A ledger of the workspace, for the choice.
struct Choice {
    value: String,
    selected: bool,
}

#[derive(Template)]
#[template(path = "serve/history.html")]
struct HistoryPage {
    title: &'static str,
    ledger: String,
    class: String,
    ledgers: Vec<Choice>,
    error: Option<String>,
    result: Option<Shown>,
}

/// `GET /history?ledger=LOG.csv`.
pub async fn show(
    State(state): State<AppState>,
    query: Result<Query<HashMap<String, String>>, QueryRejection>,
) -> Response {
    let fields = match queried(query) {
        Ok(f) => f,
        Err(r) => return r.into_response(),
    };
    let text = |key: &str| field(&fields, key);
    let (ledger, class) = (text("ledger"), text("class"));
    let outcome = if ledger.is_empty() {
        None
    } else {
        let (worker, name, chosen) = (state.clone(), ledger.clone(), class.clone());
        Some(
            off_thread("the history", move || {
                shown(worker.workspace(), &name, &chosen)
            })
            .await,
        )
    };
    let (status, result, error) = shown_outcome(outcome, state.workspace());
    let page = HistoryPage {
        title: "Supplier history",
        ledgers: state
            .workspace()
            .files(&["csv"])
            .into_iter()
            .map(|value| Choice {
                selected: value == ledger,
                value,
            })
            .collect(),
        ledger,
        class,
        error,
        result,
    };
    render(status, &page)
}

/// The status, chart and lots of the ledger `name`, judged by the plan
/// sources beside it (those whose SHA-256 its rows record), as `status`
/// and `history` find them without `--plan`.
fn shown(workspace: &Workspace, name: &str, class: &str) -> Result<Shown, Error> {
    let path = workspace.file(name)?;
    let ledger = Ledger::read(&path)?;
    let plans = ledger_plans(&ledger, &[])?;
    let status = ledger_status(&ledger, &plans)?;
    let standing = match &status.state {
        Some(state) => match state.severity() {
            Some(s) => format!("{} inspection", s.name()),
            None => "inspection discontinued".to_string(),
        },
        None => "the same plan (no switching rules)".to_string(),
    };
    let report = StatusReport {
        ledger: workspace.shown(&path).into(),
        status,
    };
    let status = workspace.relative_words(&String::from_utf8_lossy(&report_bytes(
        &report,
        Format::Table,
    )?));
    let history = ledger_history(&ledger, &plans, Some(class).filter(|c| !c.is_empty()))?;
    let title = format!("Lot history: {}", workspace.shown(&path));
    let chart = render_history(&history, &title, HistoryFormat::Svg)
        .map(|bytes| {
            let svg = String::from_utf8_lossy(&bytes).into_owned();
            // Inline in HTML, the SVG needs no XML declaration.
            match svg.find("<svg") {
                Some(at) => svg[at..].to_string(),
                None => svg,
            }
        })
        .map_err(|e| e.to_string());
    let per_unit = history.per_unit();
    let quality = |x: Option<f64>| match x {
        None => "-".to_string(),
        Some(v) if per_unit => format_significant(v, 3),
        Some(v) => format!("{}%", format_significant(v * 100.0, 3)),
    };
    let count = |x: Option<u64>| x.map_or("-".to_string(), |v| v.to_string());
    let lots = history
        .lots
        .iter()
        .map(|l| LotRow {
            seq: l.seq,
            date: l.date.clone(),
            lot: l.lot.clone(),
            severity: l.severity.unwrap_or("").to_string(),
            n: count(l.n),
            found: count(l.found),
            fraction: quality(l.fraction),
            decision: if l.resubmitted {
                format!("{} (resubmitted)", l.decision)
            } else {
                l.decision.to_string()
            },
            out_of_control: l.out_of_control,
        })
        .collect();
    Ok(Shown {
        standing,
        status,
        chart,
        lots,
    })
}
