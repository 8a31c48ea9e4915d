//! The web face in a real browser: `lotsman serve` on a free port over a
//! temporary workspace, headless Chromium driven through WebDriver
//! (Debian's `chromium` and `chromium-driver`, which `.ci/run` installs;
//! the client is fantoccini), and a screenshot of every screen reached,
//! written under `target/browser-screens/` to be looked at.

mod flow;

use std::io::{BufRead, BufReader};
use std::net::TcpListener;
use std::path::{Path, PathBuf};
use std::process::{Child, Command, Stdio};
use std::time::{Duration, Instant};

use fantoccini::{Client, ClientBuilder, Locator};
use serde_json::json;

pub const BIN: &str = env!("CARGO_BIN_EXE_lotsman");

/// The most a page or a swap is waited for.
const PATIENCE: Duration = Duration::from_secs(30);

/// A child process killed when dropped.
struct Running(Child);

impl Drop for Running {
    fn drop(&mut self) {
        let _ = self.0.kill();
        let _ = self.0.wait();
    }
}

/// A free port of the loopback interface.
fn free_port() -> u16 {
    TcpListener::bind("127.0.0.1:0")
        .unwrap()
        .local_addr()
        .unwrap()
        .port()
}

/// The browser, the server and the workspace of one walk through the
/// screens.
pub struct Walk {
    pub client: Client,
    pub url: String,
    pub workspace: tempfile::TempDir,
    shots: PathBuf,
    // Dropped after the client's session is closed (see `end`).
    _server: Running,
    _driver: Running,
}

impl Walk {
    /// Starts chromedriver and `lotsman serve`, with `prepare` run on the
    /// workspace first, and opens a browser session.
    pub async fn start(prepare: impl FnOnce(&Path)) -> Walk {
        let workspace = tempfile::tempdir().unwrap();
        prepare(workspace.path());
        let port = free_port();
        let driver = Running(
            Command::new("chromedriver")
                .arg(format!("--port={port}"))
                .stdout(Stdio::null())
                .stderr(Stdio::null())
                .spawn()
                .expect("chromedriver (Debian's chromium-driver; .ci/run installs it)"),
        );
        let mut server = Command::new(BIN)
            .args(["serve", "--port", "0", "--workspace"])
            .arg(workspace.path())
            .stdin(Stdio::null())
            .stdout(Stdio::piped())
            .stderr(Stdio::null())
            .spawn()
            .unwrap();
        let mut line = String::new();
        BufReader::new(server.stdout.take().unwrap())
            .read_line(&mut line)
            .unwrap();
        let server = Running(server);
        let at = line.find("http://").expect("the URL in serve's first line");
        let url = line[at..].split_whitespace().next().unwrap().to_string();
        let mut capabilities = serde_json::Map::new();
        capabilities.insert(
            "goog:chromeOptions".to_string(),
            json!({"args": ["--headless", "--no-sandbox", "--disable-gpu",
                            "--hide-scrollbars", "--window-size=1280,1000"]}),
        );
        let connector = hyper_util::client::legacy::connect::HttpConnector::new();
        let started = Instant::now();
        let client = loop {
            let mut builder = ClientBuilder::new(connector.clone());
            builder.capabilities(capabilities.clone());
            match builder.connect(&format!("http://127.0.0.1:{port}")).await {
                Ok(client) => break client,
                Err(e) if started.elapsed() > PATIENCE => panic!("no WebDriver session: {e}"),
                Err(_) => tokio::time::sleep(Duration::from_millis(200)).await,
            }
        };
        let shots = Path::new(env!("CARGO_TARGET_TMPDIR"))
            .parent()
            .unwrap()
            .join("browser-screens");
        std::fs::create_dir_all(&shots).unwrap();
        Walk {
            client,
            url,
            workspace,
            shots,
            _server: server,
            _driver: driver,
        }
    }

    /// The folder the screenshots are written to.
    pub fn shots_dir(&self) -> &Path {
        &self.shots
    }

    /// Opens `path` (`/design?...`).
    pub async fn open(&self, path: &str) {
        self.client
            .goto(&format!("{}{}", self.url, path.trim_start_matches('/')))
            .await
            .unwrap();
    }

    /// Types `value` into the field named `name` of the form `form` (a
    /// CSS selector), replacing what it held.
    ///
    /// A field that a swap or a page load replaces between finding it and
    /// typing (a stale element) is found again, until [`PATIENCE`].
    pub async fn fill(&self, form: &str, name: &str, value: &str) {
        let css = format!("{form} [name=\"{name}\"]");
        let started = Instant::now();
        loop {
            let typed = match self.client.find(Locator::Css(&css)).await {
                Ok(field) => match field.clear().await {
                    Ok(()) => field.send_keys(value).await.map_err(|e| e.to_string()),
                    Err(e) => Err(e.to_string()),
                },
                Err(e) => Err(e.to_string()),
            };
            match typed {
                Ok(()) => return,
                Err(e) if started.elapsed() > PATIENCE => panic!("no field {name} in {form}: {e}"),
                Err(_) => tokio::time::sleep(Duration::from_millis(50)).await,
            }
        }
    }

    /// Waits until the page's address holds `part` (a page loaded by a
    /// plain form, not swapped in place).
    pub async fn wait_url(&self, part: &str) {
        let started = Instant::now();
        loop {
            if let Ok(url) = self.client.current_url().await
                && url.as_str().contains(part)
            {
                return;
            }
            assert!(
                started.elapsed() <= PATIENCE,
                "the address never held {part}"
            );
            tokio::time::sleep(Duration::from_millis(50)).await;
        }
    }

    /// Chooses `value` in the select named `name` of `form`.
    pub async fn choose(&self, form: &str, name: &str, value: &str) {
        self.client
            .find(Locator::Css(&format!("{form} select[name=\"{name}\"]")))
            .await
            .unwrap()
            .select_by_value(value)
            .await
            .unwrap();
    }

    /// Clicks the element `css`.
    pub async fn click(&self, css: &str) {
        self.client
            .find(Locator::Css(css))
            .await
            .unwrap_or_else(|e| panic!("nothing to click at {css}: {e}"))
            .click()
            .await
            .unwrap();
    }

    /// Waits until the element `css` holds `text`, and gives its text.
    pub async fn wait_text(&self, css: &str, text: &str) -> String {
        let started = Instant::now();
        loop {
            if let Ok(found) = self.client.find(Locator::Css(css)).await
                && let Ok(shown) = found.text().await
                && shown.contains(text)
            {
                return shown;
            }
            if started.elapsed() > PATIENCE {
                let page = self.client.source().await.unwrap_or_default();
                panic!("'{text}' never appeared in {css}; the page:\n{page}");
            }
            tokio::time::sleep(Duration::from_millis(50)).await;
        }
    }

    /// The whole page as a PNG in `target/browser-screens/NAME.png`: the
    /// window is made as tall as the page first.
    pub async fn shot(&self, name: &str) {
        let height = self
            .client
            .execute(
                "return Math.ceil(document.documentElement.scrollHeight);",
                vec![],
            )
            .await
            .unwrap()
            .as_u64()
            .unwrap_or(1000)
            .clamp(600, 6000);
        self.client
            .set_window_size(1280, height as u32 + 20)
            .await
            .unwrap();
        self.client
            .execute("window.scrollTo(0, 0);", vec![])
            .await
            .unwrap();
        let png = self.client.screenshot().await.unwrap();
        std::fs::write(self.shots.join(format!("{name}.png")), png).unwrap();
        self.client.set_window_size(1280, 1000).await.unwrap();
    }

    /// Ends the browser session before the driver and the server stop (a
    /// driver stopped first can leave its browser behind).
    pub async fn end(self) {
        self.client.clone().close().await.unwrap();
    }
}
