//! The guards every request passes: the Host check (a page of another
//! site that made its name point at this machine, DNS rebinding, is
//! refused), the session and the login, the CSRF token of a form, and
//! the headers that keep the pages from being framed or sniffed.

use std::collections::HashMap;

use axum::extract::rejection::{FormRejection, QueryRejection};
use axum::extract::{Form, Query, Request, State};
use axum::http::{HeaderMap, HeaderValue, Method, StatusCode, header};
use axum::middleware::Next;
use axum::response::{IntoResponse, Redirect, Response};
use lotsman::escape_controls;

use super::page::Refusal;
use super::session::{Session, same};
use super::state::{AppState, MAX_BODY};

/// The form field of the CSRF token.
pub const CSRF_FIELD: &str = "csrf";

/// What the pages may load: their own stylesheet and script, nothing from
/// elsewhere; they may not be framed, and their forms post only here.
const POLICY: &str = "default-src 'self'; style-src 'self' 'unsafe-inline'; img-src 'self' data:; \
                      frame-ancestors 'none'; form-action 'self'; base-uri 'none'";

/// Refuses a request whose Host header is not a name of this server.
pub async fn host(State(state): State<AppState>, request: Request, next: Next) -> Response {
    let given = request
        .headers()
        .get(header::HOST)
        .and_then(|h| h.to_str().ok());
    match given {
        Some(h) if state.answers_to(h) => next.run(request).await,
        other => {
            let sent = match other {
                Some(h) => format!("the request was addressed to {}", escape_controls(h)),
                None => "the request named no host".to_string(),
            };
            Refusal::forbidden(format!(
                "this server answers only requests addressed to http://{}/ ({sent}); open http://{}/ in the browser",
                state.host(),
                state.host()
            ))
            .into_response()
        }
    }
}

/// Finds the session of the request's cookie, or opens one; without a
/// login where one is needed, a page sends the browser to the login form
/// and a form post is refused.
pub async fn session(State(state): State<AppState>, mut request: Request, next: Next) -> Response {
    let sessions = state.sessions();
    let found = cookie(request.headers(), sessions.cookie_name()).and_then(|id| sessions.find(id));
    let (session, new) = match found {
        Some(s) => (s, false),
        None => match sessions.open(state.token().is_none()) {
            Ok(s) => (s, true),
            Err(_) => {
                return Refusal::failed(
                    "the system's random generator did not answer, so no session could be opened; try again",
                )
                .into_response();
            }
        },
    };
    let path = request.uri().path();
    let open = path == "/login" || path.starts_with("/assets/");
    let mut response = if session.logged_in || open {
        request.extensions_mut().insert(session.clone());
        next.run(request).await
    } else if matches!(*request.method(), Method::GET | Method::HEAD) {
        Redirect::to("/login").into_response()
    } else {
        Refusal::forbidden("log in first: this server asks for the token it was started with")
            .into_response()
    };
    if new && let Ok(value) = HeaderValue::from_str(&sessions.cookie(&session)) {
        response.headers_mut().append(header::SET_COOKIE, value);
    }
    response
}

/// Adds the headers of every answer: the content policy, no framing, no
/// type sniffing, no referrer, and no caching of pages.
pub async fn headers(request: Request, next: Next) -> Response {
    let mut response = next.run(request).await;
    let h = response.headers_mut();
    h.insert(
        header::CONTENT_SECURITY_POLICY,
        HeaderValue::from_static(POLICY),
    );
    h.insert(header::X_FRAME_OPTIONS, HeaderValue::from_static("DENY"));
    h.insert(
        header::X_CONTENT_TYPE_OPTIONS,
        HeaderValue::from_static("nosniff"),
    );
    h.insert(
        header::REFERRER_POLICY,
        HeaderValue::from_static("no-referrer"),
    );
    if !h.contains_key(header::CACHE_CONTROL) {
        h.insert(header::CACHE_CONTROL, HeaderValue::from_static("no-store"));
    }
    response
}

/// The value of the cookie `name` in the request's headers.
fn cookie<'a>(headers: &'a HeaderMap, name: &str) -> Option<&'a str> {
    headers
        .get_all(header::COOKIE)
        .iter()
        .filter_map(|v| v.to_str().ok())
        .flat_map(|v| v.split(';'))
        .filter_map(|pair| pair.trim().split_once('='))
        .find(|(key, _)| *key == name)
        .map(|(_, value)| value)
}

/// The fields of a posted form, its CSRF token checked against the
/// session's: a form without it, or with another, is refused (403).
pub fn posted(
    session: &Session,
    form: Result<Form<HashMap<String, String>>, FormRejection>,
) -> Result<HashMap<String, String>, Refusal> {
    let Form(fields) = form.map_err(|e| {
        if e.status() == StatusCode::PAYLOAD_TOO_LARGE {
            Refusal::too_large(MAX_BODY)
        } else {
            Refusal::bad("the form could not be read; send it again from the page")
        }
    })?;
    match fields.get(CSRF_FIELD) {
        Some(given) if same(given, &session.csrf) => Ok(fields),
        Some(_) => Err(Refusal::forbidden(
            "the form carried another session's token (a page from before the server's last start, or from another site); reload the page and send it again",
        )),
        None => Err(Refusal::forbidden(
            "the form carried no session token, so it may have come from another site; send it from the server's own page",
        )),
    }
}

/// The fields of a query string.
pub fn queried(
    query: Result<Query<HashMap<String, String>>, QueryRejection>,
) -> Result<HashMap<String, String>, Refusal> {
    query.map(|Query(fields)| fields).map_err(|_| unreadable())
}

/// The fields of a query string in order, a name given more than once
/// (ticked boxes) kept each time.
pub fn queried_pairs(
    query: Result<Query<Vec<(String, String)>>, QueryRejection>,
) -> Result<Vec<(String, String)>, Refusal> {
    query.map(|Query(pairs)| pairs).map_err(|_| unreadable())
}

fn unreadable() -> Refusal {
    Refusal::bad("the address's fields could not be read; send the form again from the page")
}

/// The field `key` of a form or query, trimmed; empty when absent.
pub fn field(fields: &HashMap<String, String>, key: &str) -> String {
    fields
        .get(key)
        .map(|v| v.trim().to_string())
        .unwrap_or_default()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_cookie_is_found_among_others() {
        let mut h = HeaderMap::new();
        h.insert(
            header::COOKIE,
            HeaderValue::from_static("a=1; lotsman_session_7=abc; b=2"),
        );
        assert_eq!(cookie(&h, "lotsman_session_7"), Some("abc"));
        assert_eq!(cookie(&h, "lotsman_session_8"), None);
    }
}
