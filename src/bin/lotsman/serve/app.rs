//! The routes, behind the guards.

use axum::Router;
use axum::extract::DefaultBodyLimit;
use axum::middleware::{from_fn, from_fn_with_state};
use axum::routing::{get, post};

use super::guard;
use super::page::{HTMX, Refusal, STYLE, asset};
use super::pages;
use super::state::{AppState, MAX_BODY};

/// Every route, behind the guards: the Host check first, then the
/// session (and the login, when asked for); the CSRF token is checked by
/// each form's handler, which reads the form.
pub fn router(state: AppState) -> Router {
    Router::new()
        .route("/", get(pages::home::show))
        .route("/design", get(pages::design::show))
        .route("/design/map", get(pages::design_map::show))
        .route("/plans", get(pages::plans::list).post(pages::save::save))
        .route("/plans/view", get(pages::plans::view))
        .route("/plans/sheet", get(pages::plans::sheet))
        .route("/audit", get(pages::audit::show))
        .route("/inspect", get(pages::inspect::show))
        .route("/inspect/judge", post(pages::inspect::decide))
        .route("/inspect/record", post(pages::inspect::record))
        .route("/history", get(pages::history::show))
        .route("/compare", get(pages::compare::show))
        .route("/compare.csv", get(pages::compare::csv))
        .route("/login", get(pages::login::show).post(pages::login::enter))
        .route(
            "/assets/style.css",
            get(|| async { asset("text/css; charset=utf-8", STYLE) }),
        )
        .route(
            "/assets/htmx.min.js",
            get(|| async { asset("text/javascript; charset=utf-8", HTMX) }),
        )
        .fallback(|| async { Refusal::not_found() })
        .layer(DefaultBodyLimit::max(MAX_BODY))
        .layer(from_fn_with_state(state.clone(), guard::session))
        .layer(from_fn_with_state(state.clone(), guard::host))
        .layer(from_fn(guard::headers))
        .with_state(state)
}
