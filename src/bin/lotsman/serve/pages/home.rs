//! The home page: the screens there are, and the caution every plan
//! carries.

use askama::Template;
use axum::extract::State;
use axum::http::StatusCode;
use axum::response::Response;

use crate::serve::page::render;
use crate::serve::state::AppState;

#[derive(Template)]
#[template(path = "serve/home.html")]
struct HomePage {
    title: &'static str,
    workspace: String,
}

/// `GET /`.
pub async fn show(State(state): State<AppState>) -> Response {
    render(
        StatusCode::OK,
        &HomePage {
            title: "Acceptance sampling",
            workspace: lotsman::escape_controls(&state.workspace().root().to_string_lossy())
                .into_owned(),
        },
    )
}
