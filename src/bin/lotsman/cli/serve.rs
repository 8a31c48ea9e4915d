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
    /// The login asked of every browser before any page (at least 12 characters)
    #[arg(long, value_name = "T")]
    pub token: Option<String>,
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
        if let Some(token) = &args.token
            && token.chars().count() < MIN_TOKEN_CHARS
        {
            return Err(InputError::Inconsistent(format!(
                "--token has {} characters; give at least {MIN_TOKEN_CHARS}, hard to guess (a phrase of several words will do)",
                token.chars().count()
            )));
        }
        if !ip.is_loopback() && args.token.is_none() {
            return Err(InputError::Inconsistent(format!(
                "--listen {ip} lets other machines reach the pages: give --token T as well, the login every browser is asked for"
            )));
        }
        Ok(ServeSettings {
            workspace: args.workspace.unwrap_or_else(|| PathBuf::from(".")),
            address: SocketAddr::new(ip, args.port),
            token: args.token,
        })
    }
}
