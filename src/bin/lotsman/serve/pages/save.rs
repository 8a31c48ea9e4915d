//! Saving a designed plan as a plan source in the workspace: the plan is
//! designed again from the posted risk points (never taken from the
//! form), titled, described, and written with the atomic writer; a file
//! of that name is replaced only when the form says so.

use std::collections::HashMap;
use std::path::Path;

use askama::Template;
use axum::Extension;
use axum::extract::rejection::FormRejection;
use axum::extract::{Form, State};
use axum::http::StatusCode;
use axum::response::{IntoResponse, Response};
use lotsman::{Error, FileError, Overwrite, shell_word, write_atomic};

use super::design::headline;
use super::design_form::{DesignFields, design};
use crate::cli::design::DescriptionFlags;
use crate::serve::guard::posted;
use crate::serve::page::{Refusal, render};
use crate::serve::session::Session;
use crate::serve::state::AppState;

#[derive(Template)]
#[template(path = "serve/saved.html")]
struct SavedPage {
    title: &'static str,
    file: String,
    file_word: String,
    plan_title: String,
    headline: String,
}

/// `POST /plans`.
pub async fn save(
    State(state): State<AppState>,
    Extension(session): Extension<Session>,
    form: Result<Form<HashMap<String, String>>, FormRejection>,
) -> Response {
    match saved(&state, &session, form).await {
        Ok(page) => render(StatusCode::OK, &page),
        Err(r) => r.into_response(),
    }
}

async fn saved(
    state: &AppState,
    session: &Session,
    form: Result<Form<HashMap<String, String>>, FormRejection>,
) -> Result<SavedPage, Refusal> {
    let fields = posted(session, form)?;
    let text = |key: &str| {
        fields
            .get(key)
            .map(|v| v.trim())
            .filter(|v| !v.is_empty())
            .map(str::to_string)
    };
    let title = text("title").ok_or_else(|| {
        Refusal::bad("give the plan a title (what it inspects, as 'Cover fit, incoming'); the sheet prints it")
    })?;
    let prepared_by = text("prepared_by").ok_or_else(|| {
        Refusal::bad(
            "say who prepared the plan (name, function); the sheet prints it for signature",
        )
    })?;
    let name = fields.get("file").map(String::as_str).unwrap_or("");
    let path = state.workspace().file(name)?;
    refuse_non_yaml(name, &path)?;
    let description = DescriptionFlags {
        id: text("id"),
        revision: text("revision"),
        date: text("date"),
        item: text("item"),
        characteristic: text("characteristic"),
        prepared_by: Some(prepared_by),
        approved_by: text("approved_by"),
    };
    let designed = design(DesignFields::of(&fields), Some(title), description).await?;
    let replace = fields.get("replace").is_some_and(|v| v == "yes");
    let shown = state.workspace().shown(&path);
    write_atomic(
        &path,
        designed.source.to_yaml().as_bytes(),
        Overwrite::from_force(replace),
    )
    .map_err(|e| match e {
        FileError::Exists { .. } => Refusal::bad(format!(
            "{shown} already exists in the workspace; to replace it, tick 'Replace a file of that name' and save again (nothing was written)"
        )),
        other => Refusal::from(Error::from(other)),
    })?;
    crate::out::say(format_args!("wrote plan source {shown}"));
    Ok(SavedPage {
        title: "Plan source saved",
        file_word: shell_word(&shown),
        file: shown,
        plan_title: designed.source.title.clone(),
        headline: headline(&designed),
    })
}

/// A plan source is YAML, and the folder search of `verify` and `sheet`
/// finds it by a name ending in `.yaml` or `.yml`.
fn refuse_non_yaml(name: &str, path: &Path) -> Result<(), Refusal> {
    let extension = path
        .extension()
        .map(|e| e.to_string_lossy().to_ascii_lowercase());
    if matches!(extension.as_deref(), Some("yaml" | "yml")) {
        return Ok(());
    }
    Err(Refusal::bad(format!(
        "the file name '{}' does not end in .yaml or .yml, and a plan source is YAML; give a name such as cover-fit.yaml",
        lotsman::escape_controls(name)
    )))
}
