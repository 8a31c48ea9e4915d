//! `lotsman serve` over HTTP (the harness here, the tests in `contract`
//! and `security`): the built binary started on a free port
//! over a temporary workspace, asked with a plain HTTP client (ureq; raw
//! TCP for the Host header), and stopped at the end. The security rules
//! (Host check, login, CSRF, file names confined to the workspace, the
//! body limit, the work budget) and the contract the later screens build
//! on: `GET /`, `GET /design?...`, `POST /plans`. The plan numbers are
//! compared with what `lotsman design` prints for the same flags, the
//! refusals with its words.

mod compare;
mod contract;
mod inspect;
mod negotiate;
mod plans_audit;
mod security;

use std::io::{BufRead, BufReader, Read, Write};
use std::net::TcpStream;
use std::process::{Child, Command, Stdio};
use std::time::Duration;

pub const BIN: &str = env!("CARGO_BIN_EXE_lotsman");

/// The query of the contract's design.
pub const DESIGN: &str = "aql=1%25&rql=6%25&alpha=0.05&beta=0.10&model=binomial";

/// A running server over a temporary workspace, killed when dropped.
pub struct Server {
    pub child: Child,
    pub url: String,
    pub port: u16,
    pub workspace: tempfile::TempDir,
}

impl Server {
    pub fn start(extra: &[&str]) -> Server {
        let workspace = tempfile::tempdir().unwrap();
        let mut child = Command::new(BIN)
            .args(["serve", "--port", "0", "--workspace"])
            .arg(workspace.path())
            .args(extra)
            .stdin(Stdio::null())
            .stdout(Stdio::piped())
            .stderr(Stdio::null())
            .spawn()
            .unwrap();
        let mut line = String::new();
        BufReader::new(child.stdout.take().unwrap())
            .read_line(&mut line)
            .unwrap();
        let at = line.find("http://").unwrap_or_else(|| {
            let _ = child.kill();
            panic!("no URL in the first line: {line:?}")
        });
        let url = line[at..].split_whitespace().next().unwrap().to_string();
        let port = url
            .trim_start_matches("http://127.0.0.1:")
            .trim_end_matches('/')
            .parse()
            .unwrap();
        Server {
            child,
            url,
            port,
            workspace,
        }
    }

    pub fn path(&self, name: &str) -> std::path::PathBuf {
        self.workspace.path().join(name)
    }

    /// `GET path` with the cookie, if any.
    pub fn get(&self, path: &str, cookie: Option<&str>) -> Answer {
        let mut request = agent().get(format!("{}{}", self.url, path.trim_start_matches('/')));
        if let Some(c) = cookie {
            request = request.header("Cookie", c);
        }
        Answer::of(request.call().unwrap())
    }

    /// `POST path` of `fields` as a form, with the cookie, if any.
    pub fn post(&self, path: &str, cookie: Option<&str>, fields: &[(&str, &str)]) -> Answer {
        let mut request = agent().post(format!("{}{}", self.url, path.trim_start_matches('/')));
        if let Some(c) = cookie {
            request = request.header("Cookie", c);
        }
        Answer::of(request.send_form(fields.iter().copied()).unwrap())
    }

    /// A session: its cookie and the CSRF token of its design page.
    pub fn session(&self) -> (String, String) {
        let page = self.get(&format!("/design?{DESIGN}"), None);
        assert_eq!(page.status, 200, "{}", page.body);
        let cookie = page.cookie.clone().expect("a session cookie");
        (cookie, csrf_of(&page.body))
    }

    /// A request with a Host header of our choosing, over raw TCP: the
    /// status code.
    pub fn status_with_host(&self, host: &str) -> u16 {
        let mut stream = TcpStream::connect(("127.0.0.1", self.port)).unwrap();
        stream
            .set_read_timeout(Some(Duration::from_secs(30)))
            .unwrap();
        write!(
            stream,
            "GET / HTTP/1.1\r\nHost: {host}\r\nConnection: close\r\n\r\n"
        )
        .unwrap();
        let mut text = String::new();
        stream.read_to_string(&mut text).unwrap();
        text.split_whitespace().nth(1).unwrap().parse().unwrap()
    }
}

impl Drop for Server {
    fn drop(&mut self) {
        let _ = self.child.kill();
        let _ = self.child.wait();
    }
}

/// A client that reports every status as it is, follows no redirect and
/// uses no proxy.
fn agent() -> ureq::Agent {
    ureq::Agent::config_builder()
        .http_status_as_error(false)
        .max_redirects(0)
        .proxy(None)
        .timeout_global(Some(Duration::from_secs(60)))
        .build()
        .into()
}

/// What a request got.
pub struct Answer {
    pub status: u16,
    /// `name=value` of the Set-Cookie header, if any.
    pub cookie: Option<String>,
    pub location: Option<String>,
    pub content_type: String,
    pub body: String,
}

impl Answer {
    fn of(mut r: ureq::http::Response<ureq::Body>) -> Answer {
        let header = |name: &str| {
            r.headers()
                .get(name)
                .map(|v| v.to_str().unwrap().to_string())
        };
        let cookie = header("set-cookie").map(|c| c.split(';').next().unwrap().to_string());
        let location = header("location");
        let content_type = header("content-type").unwrap_or_default();
        Answer {
            status: r.status().as_u16(),
            cookie,
            location,
            content_type,
            body: r.body_mut().read_to_string().unwrap(),
        }
    }
}

/// The CSRF token in a page's hidden field.
pub fn csrf_of(page: &str) -> String {
    let at = page.find("name=\"csrf\" value=\"").expect("a CSRF field") + 19;
    page[at..at + 64].to_string()
}

/// What `lotsman design ARGS` refuses, the words after `error: `.
pub fn cli_refusal(args: &[&str]) -> String {
    let out = Command::new(BIN).arg("design").args(args).output().unwrap();
    assert_eq!(out.status.code(), Some(2));
    let text = String::from_utf8(out.stderr).unwrap();
    let line = text.lines().find(|l| l.contains("error: ")).unwrap();
    line.split_once("error: ").unwrap().1.to_string()
}

/// `text` as the templates escape it.
pub fn escaped(text: &str) -> String {
    text.replace('&', "&amp;")
        .replace('<', "&lt;")
        .replace('>', "&gt;")
        .replace('"', "&quot;")
        .replace('\'', "&#39;")
}

/// The form of a save, the CSRF token and the file name given.
pub fn save_form<'a>(csrf: &'a str, file: &'a str) -> Vec<(&'a str, &'a str)> {
    vec![
        ("csrf", csrf),
        ("aql", "1%"),
        ("rql", "6%"),
        ("alpha", "0.05"),
        ("beta", "0.10"),
        ("model", "binomial"),
        ("scheme", "single"),
        ("title", "Cover fit, incoming"),
        ("prepared_by", "A. Inspector, quality"),
        ("file", file),
    ]
}
