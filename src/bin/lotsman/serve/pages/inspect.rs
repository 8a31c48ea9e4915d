//! The inspection screen, for the receiving dock: choose a plan source
//! and its ledger, give the lot ID and size, see the plan in force and
//! the units to draw ([`lot_plan`](super::lot_plan)); enter the counts or
//! paste the readings and get the decision in large type; record the lot
//! and see the next lot's severity ([`lot_judge`](super::lot_judge)).
//!
//! `GET /inspect` shows the plan; `POST /inspect/judge` decides the lot
//! without writing; `POST /inspect/record` records it. Each answers the
//! whole page, so that it works as plain forms with JavaScript off.

use std::collections::HashMap;

use askama::Template;
use axum::Extension;
use axum::extract::rejection::{FormRejection, QueryRejection};
use axum::extract::{Form, Query, State};
use axum::http::StatusCode;
use axum::response::{IntoResponse, Response};
use lotsman::Error;

use super::lot_judge::{Judged, judge};
use super::lot_plan::{Entry, InForce, LotFields, in_force};
use crate::commands::record::Mode;
use crate::serve::guard::{posted, queried};
use crate::serve::page::{Refusal, render};
use crate::serve::session::Session;
use crate::serve::state::AppState;

/// A field of the counts form, refilled with what was typed.
struct Input {
    name: String,
    label: String,
    value: String,
}

/// A plan source of the workspace, for the choice.
struct Choice {
    value: String,
    selected: bool,
}

/// What recording did, and where the next lot stands.
struct Recorded {
    seq: u64,
    /// The next lot's inspection, in words.
    next: String,
}

#[derive(Template)]
#[template(path = "serve/inspect.html")]
struct InspectPage {
    title: &'static str,
    csrf: String,
    f: LotFields,
    ledger: String,
    plans: Vec<Choice>,
    error: Option<String>,
    p: Option<InForce>,
    inputs: Vec<Input>,
    /// How to fill in the counts form.
    hint: &'static str,
    readings: Option<String>,
    judged: Option<Judged>,
    recorded: Option<Recorded>,
}

/// `GET /inspect`: the form, and the plan in force once a plan is chosen.
pub async fn show(
    State(state): State<AppState>,
    Extension(session): Extension<Session>,
    query: Result<Query<HashMap<String, String>>, QueryRejection>,
) -> Response {
    match queried(query) {
        Ok(fields) => answer(state, session, fields, None).await,
        Err(r) => r.into_response(),
    }
}

/// `POST /inspect/judge`: the decision, not recorded yet.
pub async fn decide(
    State(state): State<AppState>,
    Extension(session): Extension<Session>,
    form: Result<Form<HashMap<String, String>>, FormRejection>,
) -> Response {
    match posted(&session, form) {
        Ok(fields) => answer(state, session, fields, Some(Mode::Preview)).await,
        Err(r) => r.into_response(),
    }
}

/// `POST /inspect/record`: the lot appended to its ledger.
pub async fn record(
    State(state): State<AppState>,
    Extension(session): Extension<Session>,
    form: Result<Form<HashMap<String, String>>, FormRejection>,
) -> Response {
    match posted(&session, form) {
        Ok(fields) => answer(state, session, fields, Some(Mode::Record)).await,
        Err(r) => r.into_response(),
    }
}

/// The page for `fields`: the plan in force, and with `mode` the lot
/// judged (and recorded); the work runs off the request threads.
async fn answer(
    state: AppState,
    session: Session,
    fields: HashMap<String, String>,
    mode: Option<Mode>,
) -> Response {
    let f = LotFields::of(&fields);
    let (worker, lot, form) = (state.clone(), f.clone(), fields.clone());
    let Ok(worked) = tokio::task::spawn_blocking(move || work(&worker, &lot, &form, mode)).await
    else {
        return Refusal::failed("the inspection stopped before it finished; send the form again")
            .into_response();
    };
    let status = match &worked.error {
        Some(_) => StatusCode::BAD_REQUEST,
        None => StatusCode::OK,
    };
    let page = InspectPage {
        title: "Inspect a lot",
        csrf: session.csrf,
        ledger: f.ledger_name(),
        plans: state
            .workspace()
            .files(&["yaml", "yml"])
            .into_iter()
            .map(|value| Choice {
                selected: value == f.plan,
                value,
            })
            .collect(),
        f,
        error: worked.error.map(|m| state.workspace().relative_words(&m)),
        inputs: worked
            .p
            .as_ref()
            .map(|p| inputs(p, &fields))
            .unwrap_or_default(),
        hint: worked.p.as_ref().map_or("", |p| hint(p.entry)),
        readings: fields.get("readings").cloned(),
        p: worked.p,
        judged: worked.judged,
        recorded: worked.recorded,
    };
    render(status, &page)
}

/// What the work of a request gave.
#[derive(Default)]
struct Worked {
    p: Option<InForce>,
    judged: Option<Judged>,
    recorded: Option<Recorded>,
    error: Option<String>,
}

/// The plan in force, and with `mode` the lot judged (and recorded).
fn work(
    state: &AppState,
    f: &LotFields,
    fields: &HashMap<String, String>,
    mode: Option<Mode>,
) -> Worked {
    let words = |e: Error| Refusal::from(e).message().to_string();
    let mut worked = Worked::default();
    if f.plan.is_empty() {
        if mode.is_some() {
            worked.error = Some("choose the plan source the lot is inspected by".to_string());
        }
        return worked;
    }
    let p = match in_force(state.workspace(), f) {
        Ok(p) => p,
        Err(e) => {
            worked.error = Some(words(e));
            return worked;
        }
    };
    if let Some(mode) = mode {
        match judge(&p, f, fields, mode) {
            Ok(judged) => {
                if let Some(seq) = judged.seq {
                    let next = LotFields {
                        lot: String::new(),
                        ..f.clone()
                    };
                    let next = match in_force(state.workspace(), &next) {
                        Ok(n) => next_lot(&n),
                        Err(e) => words(e),
                    };
                    worked.recorded = Some(Recorded { seq, next });
                }
                worked.judged = Some(judged);
            }
            Err(e) => worked.error = Some(words(e)),
        }
    }
    worked.p = Some(p);
    worked
}

/// The next lot's inspection, in words.
fn next_lot(next: &InForce) -> String {
    if let Some(why) = &next.discontinued {
        return why.clone();
    }
    match (next.severity, &next.code_letter) {
        (Some(s), Some(letter)) => format!("{} inspection, code letter {letter}", s.name()),
        (Some(s), None) => format!("{} inspection", s.name()),
        (None, _) => "the same plan (this plan has no switching rules)".to_string(),
    }
}

/// How to fill in the counts form of `entry`.
fn hint(entry: Entry) -> &'static str {
    match entry {
        Entry::Stages => {
            "Enter the count of each stage inspected so far; leave the later stages empty."
        }
        Entry::Items => {
            "Inspect the units one at a time in the order drawn; enter how many were inspected and the count found in them."
        }
        Entry::Classes => {
            "Enter each class's count in the units its plan takes; for a plan of several stages, the count of each stage inspected so far, separated by commas."
        }
        Entry::Readings => {
            "Paste the sample's readings, one value per line, with decimal points, in the unit of the specification limits."
        }
    }
}

/// The fields of the counts form for the plan in force, refilled.
fn inputs(p: &InForce, fields: &HashMap<String, String>) -> Vec<Input> {
    let input = |name: String, label: String| Input {
        value: fields.get(&name).cloned().unwrap_or_default(),
        name,
        label,
    };
    match p.entry {
        Entry::Stages => p
            .classes
            .iter()
            .flat_map(|c| &c.stages)
            .map(|s| {
                input(
                    format!("found_{}", s.stage),
                    format!("Stage {}: found in its {} units", s.stage, s.sample),
                )
            })
            .collect(),
        Entry::Items => vec![
            input(
                "inspected".to_string(),
                "Units inspected so far".to_string(),
            ),
            input("found_1".to_string(), "Found in them".to_string()),
        ],
        Entry::Classes => p
            .classes
            .iter()
            .map(|c| {
                let per_stage = if c.stages.len() > 1 {
                    " (per stage: 1,3)"
                } else {
                    ""
                };
                input(c.field.clone(), format!("{}{per_stage}", c.label))
            })
            .collect(),
        Entry::Readings => Vec::new(),
    }
}
