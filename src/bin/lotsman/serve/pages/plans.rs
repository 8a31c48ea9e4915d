//! The plans screen: the workspace's plan sources with what `lotsman
//! verify` finds of each (`GET /plans`); one source with its differing
//! fields, its OC chart as its sheet draws it and the risks its recorded
//! plan runs at its two points (`GET /plans/view?file=NAME.yaml`); and
//! its sheet, the bytes `lotsman sheet NAME.yaml` writes, as a download
//! (`GET /plans/sheet?file=NAME.yaml`).

use std::collections::HashMap;

use askama::Template;
use axum::extract::rejection::QueryRejection;
use axum::extract::{Query, State};
use axum::http::StatusCode;
use axum::response::{IntoResponse, Response};
use lotsman::{
    Error, Paper, SourceText, format_quality, format_significant, sheet_of_text, shell_word,
    source_oc_svg,
};

use super::verified::{VerifyRow, verify_named};
use crate::serve::guard::{field, queried};
use crate::serve::page::{download, off_thread, render};
use crate::serve::state::AppState;
use crate::serve::workspace::Workspace;

/// The size of the OC chart, mm (it scales to the page's width).
const CHART_SIZE: (f64, f64) = (160.0, 100.0);

/// The extensions of plan sources.
pub const SOURCES: &[&str] = &["yaml", "yml"];

/// One source of the list.
struct Listed {
    title: String,
    row: VerifyRow,
}

#[derive(Template)]
#[template(path = "serve/plans.html")]
struct PlansPage {
    title: &'static str,
    plans: Vec<Listed>,
    error: Option<String>,
}

/// `GET /plans`: every plan source of the workspace, verified.
pub async fn list(State(state): State<AppState>) -> Response {
    let worker = state.clone();
    let listed = off_thread("the verification", move || listed(worker.workspace())).await;
    let (status, plans, error) = match listed {
        Ok(plans) => (StatusCode::OK, plans, None),
        Err(r) => (
            r.status(),
            Vec::new(),
            Some(state.workspace().relative_words(r.message())),
        ),
    };
    render(
        status,
        &PlansPage {
            title: "Plans",
            plans,
            error,
        },
    )
}

/// Every plan source of the workspace, verified.
fn listed(workspace: &Workspace) -> Result<Vec<Listed>, Error> {
    let names = workspace.files(SOURCES);
    Ok(verify_named(workspace, &names)?
        .into_iter()
        .map(|c| Listed {
            title: c
                .read
                .as_ref()
                .and_then(|r| r.parse().ok())
                .map(|s| s.title)
                .unwrap_or_default(),
            row: VerifyRow::of(&c.name, &c.entry),
        })
        .collect())
}

/// One point a plan is held to, as the page lists it.
struct PointRow {
    point: String,
    quality: String,
    agreed: String,
    achieved: String,
}

/// What the page shows of one source.
struct Shown {
    plan_title: String,
    /// Its document fields, label and value, those given.
    fields: Vec<(&'static str, String)>,
    row: VerifyRow,
    /// The OC chart, inline SVG; or why there is none.
    chart: Result<String, String>,
    /// The class charted, for a standard-indexed source.
    class: Option<String>,
    points: Vec<PointRow>,
    /// The name as one shell word, for the commands.
    word: String,
}

#[derive(Template)]
#[template(path = "serve/plan.html")]
struct PlanPage {
    title: &'static str,
    result: Option<Shown>,
    error: Option<String>,
}

/// `GET /plans/view?file=NAME.yaml`: one source.
pub async fn view(
    State(state): State<AppState>,
    query: Result<Query<HashMap<String, String>>, QueryRejection>,
) -> Response {
    let file = match queried(query) {
        Ok(f) => field(&f, "file"),
        Err(r) => return r.into_response(),
    };
    let worker = state.clone();
    let outcome = off_thread("the verification", move || shown(worker.workspace(), &file)).await;
    let (status, result, error) = match outcome {
        Ok(shown) => (StatusCode::OK, Some(shown), None),
        Err(r) => (
            r.status(),
            None,
            Some(state.workspace().relative_words(r.message())),
        ),
    };
    render(
        status,
        &PlanPage {
            title: "Plan source",
            result,
            error,
        },
    )
}

/// The source `name` verified, with its chart and risks.
fn shown(workspace: &Workspace, name: &str) -> Result<Shown, Error> {
    let path = workspace.file(name)?;
    let shown_name = workspace.shown(&path);
    let checked = verify_named(workspace, std::slice::from_ref(&shown_name))?;
    let Some(c) = checked.into_iter().next() else {
        return Err(
            lotsman::InputError::Inconsistent(format!("{shown_name} was not verified")).into(),
        );
    };
    let row = VerifyRow::of(&c.name, &c.entry);
    let parsed = c.read.as_ref().map(|r| (r, r.parse()));
    let (plan_title, fields) = match &parsed {
        Some((_, Ok(s))) => {
            let given = [
                ("ID", &s.id),
                ("Revision", &s.revision),
                ("Item", &s.item),
                ("Characteristic", &s.characteristic),
                ("Prepared by", &s.prepared_by),
                ("Approved by", &s.approved_by),
            ];
            let fields = given
                .into_iter()
                .filter_map(|(label, v)| v.as_ref().map(|v| (label, v.clone())))
                .collect();
            (s.title.clone(), fields)
        }
        _ => (String::new(), Vec::new()),
    };
    let oc = match &parsed {
        Some((read, Ok(source))) => source_oc_svg(source, &read.text, &path, CHART_SIZE)
            .map_err(|e| workspace.relative_words(&e.to_string())),
        Some((_, Err(e))) => Err(workspace.relative_words(&e.to_string())),
        None => Err(row
            .message
            .clone()
            .unwrap_or_else(|| "the source cannot be read".to_string())),
    };
    let (chart, class, points) = match oc {
        Ok(oc) => {
            let points = oc
                .points
                .iter()
                .map(|p| PointRow {
                    point: p.point.clone(),
                    quality: format_quality(p.quality, oc.per_unit),
                    agreed: p.agreed.clone().unwrap_or_else(|| "-".to_string()),
                    achieved: format_significant(p.achieved, 4),
                })
                .collect();
            // Inline in HTML, the SVG needs no XML declaration.
            let svg = match oc.svg.find("<svg") {
                Some(at) => oc.svg[at..].to_string(),
                None => oc.svg,
            };
            (Ok(svg), oc.class, points)
        }
        Err(why) => (Err(why), None, Vec::new()),
    };
    Ok(Shown {
        plan_title,
        fields,
        row,
        chart,
        class,
        points,
        word: shell_word(&shown_name),
    })
}

/// `GET /plans/sheet?file=NAME.yaml`: the sheet as `lotsman sheet
/// NAME.yaml` writes it, as a PDF download named after the source.
pub async fn sheet(
    State(state): State<AppState>,
    query: Result<Query<HashMap<String, String>>, QueryRejection>,
) -> Response {
    let file = match queried(query) {
        Ok(f) => field(&f, "file"),
        Err(r) => return r.into_response(),
    };
    let worker = state.clone();
    let made = off_thread("the sheet", move || -> Result<(String, Vec<u8>), Error> {
        let path = worker.workspace().file(&file)?;
        let read = SourceText::read(&path)?;
        let (sheet, _) = sheet_of_text(&read, Paper::A4, false)?;
        let name = path.with_extension("pdf").file_name().map_or_else(
            || "sheet.pdf".to_string(),
            |n| n.to_string_lossy().into_owned(),
        );
        Ok((name, sheet.pdf))
    })
    .await;
    match made {
        Ok((name, pdf)) => download("application/pdf", &name, pdf),
        Err(r) => r.relative_to(state.workspace()).into_response(),
    }
}
