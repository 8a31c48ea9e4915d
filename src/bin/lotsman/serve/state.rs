//! The state every request shares: the workspace, the names the server
//! answers to, the login token and the sessions; and the largest body a
//! request may carry.

use std::net::{IpAddr, SocketAddr};
use std::sync::Arc;

use super::session::Sessions;
use super::workspace::Workspace;

/// The largest request body a page takes: a form of a few fields.
pub const MAX_BODY: usize = 64 * 1024;

/// What the handlers share.
#[derive(Clone)]
pub struct AppState(Arc<Inner>);

struct Inner {
    workspace: Workspace,
    /// `host:port` as the URL gives it.
    host: String,
    /// Every Host header the server answers (lower case).
    hosts: Vec<String>,
    token: Option<String>,
    sessions: Sessions,
    /// Held by a wrong login for [`WRONG_LOGIN_PAUSE`], so that logins
    /// are tried one at a time, at most one wrong one a second.
    login_gate: tokio::sync::Mutex<()>,
}

/// How long a wrong login holds the login gate: guessing a token of
/// twelve characters or more, one a second, takes far longer than any
/// server runs.
pub const WRONG_LOGIN_PAUSE: std::time::Duration = std::time::Duration::from_secs(1);

impl AppState {
    /// The state of a server over `workspace`, bound at `address`.
    pub fn new(workspace: Workspace, address: SocketAddr, token: Option<String>) -> Self {
        let port = address.port();
        let host = match address.ip() {
            IpAddr::V4(ip) => format!("{ip}:{port}"),
            IpAddr::V6(ip) => format!("[{ip}]:{port}"),
        };
        let mut hosts = vec![host.clone()];
        if address.ip().is_loopback() {
            hosts.push(format!("localhost:{port}"));
        }
        if port == 80 {
            // A browser leaves the default port out of the Host header.
            let bare: Vec<String> = hosts
                .iter()
                .filter_map(|h| h.strip_suffix(":80").map(str::to_string))
                .collect();
            hosts.extend(bare);
        }
        AppState(Arc::new(Inner {
            workspace,
            host,
            hosts,
            token,
            sessions: Sessions::new(port),
            login_gate: tokio::sync::Mutex::new(()),
        }))
    }

    /// The workspace.
    pub fn workspace(&self) -> &Workspace {
        &self.0.workspace
    }

    /// `host:port` of the URL.
    pub fn host(&self) -> &str {
        &self.0.host
    }

    /// Whether a request with this Host header is for this server.
    pub fn answers_to(&self, host: &str) -> bool {
        let host = host.to_ascii_lowercase();
        self.0.hosts.contains(&host)
    }

    /// The login token, if the server asks for one.
    pub fn token(&self) -> Option<&str> {
        self.0.token.as_deref()
    }

    /// The gate every login passes, one at a time.
    pub fn login_gate(&self) -> &tokio::sync::Mutex<()> {
        &self.0.login_gate
    }

    /// The sessions.
    pub fn sessions(&self) -> &Sessions {
        &self.0.sessions
    }
}
