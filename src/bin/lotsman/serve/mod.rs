//! `lotsman serve`: the local web face. It binds the address (this
//! machine only by default), prints the URL on stdout, and serves the
//! pages until Ctrl-C, when it finishes the requests under way and stops.
//!
//! The web stack lives here, in the binary, and only here: the pages call
//! the same library functions as the commands (and, for a design, the same
//! path from arguments to plan as `lotsman design`), so no page shows a
//! number the command line would not print.
//!
//! - [`app`]: the routes; [`state`]: what the requests share;
//! - [`guard`], [`session`]: the Host check, the login and the CSRF
//!   token of every form;
//! - [`workspace`]: file names confined to the workspace folder;
//! - [`page`]: the frame of every page, error pages and the assets;
//! - [`pages`]: one file per screen.

mod app;
mod guard;
mod page;
mod pages;
mod session;
mod state;
mod workspace;

use std::io::{ErrorKind, Write};
use std::net::SocketAddr;

use lotsman::{Error, InputError, Outcome, io_reason};

use crate::cli::serve::{ServeArgs, ServeSettings};
use app::router;
use state::AppState;
use workspace::Workspace;

/// Runs the server until Ctrl-C.
pub fn run(args: ServeArgs) -> Result<Outcome, Error> {
    let settings = ServeSettings::try_from(args)?;
    let workspace = Workspace::open(&settings.workspace)?;
    let runtime = tokio::runtime::Builder::new_multi_thread()
        .enable_all()
        .build()
        .map_err(|e| {
            InputError::Inconsistent(format!("the server cannot start: {}", io_reason(&e)))
        })?;
    runtime.block_on(serve(settings, workspace))
}

/// Binds, prints the URL, and serves until Ctrl-C.
async fn serve(settings: ServeSettings, workspace: Workspace) -> Result<Outcome, Error> {
    let listener = tokio::net::TcpListener::bind(settings.address)
        .await
        .map_err(|e| not_bound(settings.address, &e))?;
    let address = listener
        .local_addr()
        .map_err(|e| not_bound(settings.address, &e))?;
    let state = AppState::new(workspace, address, settings.token);
    let url = format!("http://{}/", state.host());
    announce(&url, &state.workspace().root().display().to_string())?;
    axum::serve(listener, router(state))
        .with_graceful_shutdown(async {
            // A Ctrl-C that cannot be listened for leaves the server to be
            // stopped as any process is.
            if tokio::signal::ctrl_c().await.is_err() {
                std::future::pending::<()>().await;
            }
        })
        .await
        .map_err(|e| InputError::Inconsistent(format!("the server stopped: {}", io_reason(&e))))?;
    crate::out::say("stopped serving");
    Ok(Outcome::Ok)
}

/// The one line on stdout naming the URL, flushed at once, so that a
/// program that started the server can read it.
fn announce(url: &str, root: &str) -> Result<(), Error> {
    let line = format!(
        "lotsman serves {url} for the workspace {}; open it in a browser, Ctrl-C stops it\n",
        lotsman::escape_controls(root)
    );
    let mut out = std::io::stdout().lock();
    out.write_all(line.as_bytes())
        .and_then(|()| out.flush())
        .map_err(|e| {
            Error::Output(std::io::Error::new(
                e.kind(),
                format!("standard output {}", io_reason(&e)),
            ))
        })
}

/// Why the address could not be bound, and what to do about it.
fn not_bound(address: SocketAddr, e: &std::io::Error) -> Error {
    let why = match e.kind() {
        ErrorKind::AddrInUse => {
            "it is in use by another program; give another --port, or --port 0 for a free one"
                .to_string()
        }
        ErrorKind::AddrNotAvailable => {
            "it is not an address of this machine; give one of its own with --listen".to_string()
        }
        ErrorKind::PermissionDenied => {
            "this user may not listen there (ports below 1024 need more rights); give a --port above 1023".to_string()
        }
        _ => io_reason(e),
    };
    InputError::Inconsistent(format!("cannot listen on {address}: {why}")).into()
}
