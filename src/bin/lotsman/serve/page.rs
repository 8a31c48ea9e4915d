//! What every page shares: rendering a template into a response, the
//! refusal page (the same plain words as the command line, with a status
//! of 400, 403, 404 or 413, never a trace), and the two assets embedded in
//! the binary: the stylesheet and htmx.

use askama::Template;
use axum::http::{HeaderValue, StatusCode, header};
use axum::response::{Html, IntoResponse, Response};
use lotsman::{Error, InputError, escape_controls};

/// The stylesheet of every page.
pub const STYLE: &str = include_str!("../../../../templates/serve/style.css");

/// htmx, vendored (`vendor/htmx/README.md` names its version and source).
pub const HTMX: &str = include_str!("../../../../vendor/htmx/htmx.min.js");

/// `template` rendered, with `status`.
pub fn render(status: StatusCode, template: &impl Template) -> Response {
    match template.render() {
        Ok(text) => (status, Html(text)).into_response(),
        // Only a failed write into a string gets here; there is no page
        // to show it in.
        Err(_) => (
            StatusCode::INTERNAL_SERVER_ERROR,
            "the page could not be drawn; reload it",
        )
            .into_response(),
    }
}

/// An asset: `body` as `content_type`, kept by the browser for an hour.
pub fn asset(content_type: &'static str, body: &'static str) -> Response {
    (
        [
            (header::CONTENT_TYPE, HeaderValue::from_static(content_type)),
            (
                header::CACHE_CONTROL,
                HeaderValue::from_static("private, max-age=3600"),
            ),
        ],
        body,
    )
        .into_response()
}

/// A request refused, in words: the page says what is wrong and how to
/// put it right.
#[derive(Debug)]
pub struct Refusal {
    status: StatusCode,
    heading: &'static str,
    message: String,
}

impl Refusal {
    /// Input that cannot be used (400), in the command line's words.
    pub fn bad(message: impl Into<String>) -> Self {
        Refusal {
            status: StatusCode::BAD_REQUEST,
            heading: "This cannot be done",
            message: message.into(),
        }
    }

    /// A request the server does not take from this sender (403).
    pub fn forbidden(message: impl Into<String>) -> Self {
        Refusal {
            status: StatusCode::FORBIDDEN,
            heading: "Refused",
            message: message.into(),
        }
    }

    /// No page at this address (404).
    pub fn not_found() -> Self {
        Refusal {
            status: StatusCode::NOT_FOUND,
            heading: "No such page",
            message: "there is no page at this address; start from the home page".to_string(),
        }
    }

    /// A form larger than the server takes (413).
    pub fn too_large(limit: usize) -> Self {
        Refusal {
            status: StatusCode::PAYLOAD_TOO_LARGE,
            heading: "Too much sent",
            message: format!(
                "the form sent more than {} kB, the most a page takes; send less",
                limit / 1024
            ),
        }
    }

    /// Something the server could not do, not the sender's fault (500).
    pub fn failed(message: impl Into<String>) -> Self {
        Refusal {
            status: StatusCode::INTERNAL_SERVER_ERROR,
            heading: "Not done",
            message: message.into(),
        }
    }

    /// The status it answers with.
    pub fn status(&self) -> StatusCode {
        self.status
    }

    /// Its message.
    pub fn message(&self) -> &str {
        &self.message
    }

    /// The same refusal with the workspace's paths in its words made
    /// relative to it.
    pub fn relative_to(self, workspace: &super::workspace::Workspace) -> Self {
        Refusal {
            message: workspace.relative_words(&self.message),
            ..self
        }
    }
}

impl From<Error> for Refusal {
    fn from(e: Error) -> Self {
        Refusal::bad(escape_controls(&e.to_string()).into_owned())
    }
}

impl From<InputError> for Refusal {
    fn from(e: InputError) -> Self {
        Error::from(e).into()
    }
}

/// The refusal page.
#[derive(Template)]
#[template(path = "serve/refusal.html")]
struct RefusalPage<'a> {
    title: &'a str,
    message: &'a str,
}

impl IntoResponse for Refusal {
    fn into_response(self) -> Response {
        render(
            self.status,
            &RefusalPage {
                title: self.heading,
                message: &self.message,
            },
        )
    }
}

/// Runs `work` off the server's request threads (a design, a replay or a
/// check can take a while), its error in the command line's words; `what`
/// names the work in the refusal when it stops before it finishes ("the
/// history").
pub async fn off_thread<T: Send + 'static>(
    what: &str,
    work: impl FnOnce() -> Result<T, Error> + Send + 'static,
) -> Result<T, Refusal> {
    tokio::task::spawn_blocking(work)
        .await
        .map_err(|_| {
            Refusal::failed(format!(
                "{what} stopped before it finished; reload the page or send the form again"
            ))
        })?
        .map_err(Refusal::from)
}

/// What a page shows of a piece of work asked for or not (`None`): its
/// status, its result, and the refusal in words, with the workspace's
/// paths made relative to it.
pub fn shown_outcome<T>(
    outcome: Option<Result<T, Refusal>>,
    workspace: &super::workspace::Workspace,
) -> (StatusCode, Option<T>, Option<String>) {
    match outcome {
        None => (StatusCode::OK, None, None),
        Some(Ok(shown)) => (StatusCode::OK, Some(shown), None),
        Some(Err(r)) => (
            r.status(),
            None,
            Some(workspace.relative_words(r.message())),
        ),
    }
}

/// `bytes` as a download of `content_type` named `name` (a sheet, a
/// table).
pub fn download(content_type: &'static str, name: &str, bytes: Vec<u8>) -> Response {
    let disposition = HeaderValue::from_str(&attachment(name))
        .unwrap_or_else(|_| HeaderValue::from_static("attachment"));
    (
        [
            (header::CONTENT_TYPE, HeaderValue::from_static(content_type)),
            (header::CONTENT_DISPOSITION, disposition),
        ],
        bytes,
    )
        .into_response()
}

/// The Content-Disposition of a download named `name`: a plain ASCII
/// name for every browser, and the name itself, percent-encoded, for
/// those that read it (RFC 6266).
fn attachment(name: &str) -> String {
    let plain: String = name
        .chars()
        .map(|c| {
            if c.is_ascii_graphic() && c != '"' && c != '\\' || c == ' ' {
                c
            } else {
                '_'
            }
        })
        .collect();
    let encoded: String = name
        .bytes()
        .map(|b| {
            if b.is_ascii_alphanumeric() || b"-._~".contains(&b) {
                (b as char).to_string()
            } else {
                format!("%{b:02X}")
            }
        })
        .collect();
    format!("attachment; filename=\"{plain}\"; filename*=UTF-8''{encoded}")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_download_name_is_quoted_and_encoded() {
        assert_eq!(
            attachment("cover-fit.pdf"),
            "attachment; filename=\"cover-fit.pdf\"; filename*=UTF-8''cover-fit.pdf"
        );
        assert_eq!(
            attachment("a\"b é.pdf"),
            "attachment; filename=\"a_b _.pdf\"; filename*=UTF-8''a%22b%20%C3%A9.pdf"
        );
    }
}
