//! `serve`: the arguments of the local web face, and the checked settings
//! they make: the workspace folder, the address to listen on, and the
//! login token that any address but this machine's own needs.

use std::net::{IpAddr, Ipv4Addr, SocketAddr};
use std::path::PathBuf;

use clap::Args;
use lotsman::InputError;

/// The port of `--port` when none is given.
pub const DEFAULT_PORT: u16 = 7420;

/// The fewest characters of a `--token`: a login guessed in a few tries
/// guards nothing.
pub const MIN_TOKEN_CHARS: usize = 12;

/// `serve`: the local web face over one workspace folder.
#[derive(Debug, Args)]
pub struct ServeArgs {
    /// The folder whose plan sources the pages read and write [default: the current folder]
    #[arg(long, value_name = "DIR")]
    pub workspace: Option<PathBuf>,
    /// The port to listen on; 0 picks a free one (the URL printed names it)
    #[arg(long, value_name = "P", default_value_t = DEFAULT_PORT)]
    pub port: u16,
    /// The address to listen on [default: 127.0.0.1, this machine only]; any other needs --token
    #[arg(long, value_name = "ADDR")]
    pub listen: Option<String>,
    /// The login asked of every browser before any page (at least 12 characters); other
    /// users of this machine can read it in the process list: --token-file keeps it out
    #[arg(long, value_name = "T", conflicts_with = "token_file")]
    pub token: Option<String>,
    /// Read the login token from the first line of this file instead of --token
    #[arg(long, value_name = "FILE")]
    pub token_file: Option<PathBuf>,
}

/// What `serve` was asked for, checked.
#[derive(Debug)]
pub struct ServeSettings {
    /// The workspace folder as given (the server resolves it).
    pub workspace: PathBuf,
    /// The address and port to bind.
    pub address: SocketAddr,
    /// The login token, if one is required.
    pub token: Option<String>,
}

impl TryFrom<ServeArgs> for ServeSettings {
    type Error = InputError;

    fn try_from(args: ServeArgs) -> Result<Self, InputError> {
        let ip = match &args.listen {
            None => IpAddr::V4(Ipv4Addr::LOCALHOST),
            Some(text) => text.trim().parse::<IpAddr>().map_err(|_| {
                InputError::unparsable(
                    "--listen",
                    text,
                    "an IP address of this machine, as 127.0.0.1 or 192.168.1.20",
                )
            })?,
        };
        if ip.is_unspecified() {
            return Err(InputError::Inconsistent(format!(
                "--listen {ip} would answer on every address, but each request is checked against the address it was sent to: give the one address the browsers reach this machine at, as 192.168.1.20"
            )));
        }
        let token = match &args.token_file {
            None => args.token.clone(),
            Some(path) => Some(token_of_file(path)?),
        };
        if let Some(token) = &token
            && token.chars().count() < MIN_TOKEN_CHARS
        {
            return Err(InputError::Inconsistent(format!(
                "--token has {} characters; give at least {MIN_TOKEN_CHARS}, hard to guess (a phrase of several words will do)",
                token.chars().count()
            )));
        }
        if !ip.is_loopback() && token.is_none() {
            return Err(InputError::Inconsistent(format!(
                "--listen {ip} lets other machines reach the pages: give --token T as well, the login every browser is asked for"
            )));
        }
        Ok(ServeSettings {
            workspace: args.workspace.unwrap_or_else(|| PathBuf::from(".")),
            address: SocketAddr::new(ip, args.port),
            token,
        })
    }
}

/// The token on the first line of the file at `path`, without its line
/// end.
fn token_of_file(path: &std::path::Path) -> Result<String, InputError> {
    let shown = lotsman::shell_path(path);
    let text = std::fs::read_to_string(path).map_err(|e| {
        InputError::Inconsistent(format!(
            "--token-file {shown}: the file {}; give a file whose first line is the token",
            lotsman::io_reason(&e)
        ))
    })?;
    let token = text.lines().next().unwrap_or("").trim_end_matches('\r');
    if token.is_empty() {
        return Err(InputError::Inconsistent(format!(
            "--token-file {shown}: the first line is empty; write the token on it"
        )));
    }
    Ok(token.to_string())
}
