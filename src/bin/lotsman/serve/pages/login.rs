//! The login, when the server was started with `--token`: a form asking
//! for the token; the right one opens a new, logged-in session (a new ID,
//! so that a session ID known before the login is worth nothing after).

use std::collections::HashMap;

use askama::Template;
use axum::Extension;
use axum::extract::rejection::FormRejection;
use axum::extract::{Form, State};
use axum::http::{HeaderValue, StatusCode, header};
use axum::response::{IntoResponse, Redirect, Response};

use crate::serve::guard::posted;
use crate::serve::page::{Refusal, render};
use crate::serve::session::{Session, same};
use crate::serve::state::{AppState, WRONG_LOGIN_PAUSE};

#[derive(Template)]
#[template(path = "serve/login.html")]
struct LoginPage<'a> {
    title: &'static str,
    csrf: &'a str,
    error: Option<&'a str>,
}

/// `GET /login`: the form, or the home page when there is nothing to log
/// in to.
pub async fn show(
    State(state): State<AppState>,
    Extension(session): Extension<Session>,
) -> Response {
    if state.token().is_none() || session.logged_in {
        return Redirect::to("/").into_response();
    }
    login_page(StatusCode::OK, &session, None)
}

/// `POST /login`: the token checked; the right one logs the browser in.
pub async fn enter(
    State(state): State<AppState>,
    Extension(session): Extension<Session>,
    form: Result<Form<HashMap<String, String>>, FormRejection>,
) -> Response {
    let Some(token) = state.token() else {
        return Redirect::to("/").into_response();
    };
    let fields = match posted(&session, form) {
        Ok(f) => f,
        Err(r) => return r.into_response(),
    };
    let given = fields.get("token").map(String::as_str).unwrap_or("");
    // One login at a time; a wrong one keeps the gate for a second.
    let _gate = state.login_gate().lock().await;
    if !same(given, token) {
        tokio::time::sleep(WRONG_LOGIN_PAUSE).await;
        return login_page(
            StatusCode::FORBIDDEN,
            &session,
            Some("that is not the token the server was started with; give it again"),
        );
    }
    let sessions = state.sessions();
    sessions.close(&session.id);
    let Ok(new) = sessions.open(true) else {
        return Refusal::failed(
            "the system's random generator did not answer, so no session could be opened; try again",
        )
        .into_response();
    };
    let mut response = Redirect::to("/").into_response();
    if let Ok(value) = HeaderValue::from_str(&sessions.cookie(&new)) {
        response.headers_mut().append(header::SET_COOKIE, value);
    }
    response
}

fn login_page(status: StatusCode, session: &Session, error: Option<&str>) -> Response {
    render(
        status,
        &LoginPage {
            title: "Log in",
            csrf: &session.csrf,
            error,
        },
    )
}
