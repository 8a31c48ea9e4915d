//! What the binary writes where: a report on stdout in one write, whose
//! failure is refused in words; and lines on stderr (refusals, warnings,
//! notes, what was written), whose failure is ignored, never a panic.

use std::fmt::Display;
use std::io::Write;
use std::path::Path;

use lotsman::{Error, Format, Report, escape_controls, io_reason, write_report};

/// Prints `bytes` on stdout in one write; a device that is full or a
/// reader that went away is refused in words (exit code 2).
pub fn print_out(bytes: &[u8]) -> Result<(), Error> {
    let mut out = std::io::stdout().lock();
    out.write_all(bytes)
        .and_then(|()| out.flush())
        .map_err(|e| {
            Error::Output(std::io::Error::new(
                e.kind(),
                format!("standard output {}", io_reason(&e)),
            ))
        })
}

/// The report in `format`, as the bytes to print.
pub fn report_bytes(report: &impl Report, format: Format) -> Result<Vec<u8>, Error> {
    let mut text = Vec::new();
    write_report(report, format, &mut text)?;
    Ok(text)
}

/// Prints the report in `format` on stdout ([`print_out`]).
pub fn print_report(report: &impl Report, format: Format) -> Result<(), Error> {
    print_out(&report_bytes(report, format)?)
}

/// Writes `text` on stderr as it is. A stderr that cannot be written (a
/// full device, a reader that went away) loses it: there is nowhere else
/// to tell, and the run's outcome stands. (`eprint!` would panic.)
pub fn to_stderr(text: &str) {
    let _ = std::io::stderr().lock().write_all(text.as_bytes());
}

/// One line on stderr, `lotsman: ` and `line` ([`to_stderr`]).
pub fn say(line: impl Display) {
    to_stderr(&format!("lotsman: {line}\n"));
}

/// A path as messages show it: its control characters escaped.
pub fn shown(path: &Path) -> String {
    escape_controls(&path.to_string_lossy()).into_owned()
}

/// The warning on stderr for a recorded plan used with a discrepancy at
/// the user's request (`done` says how): the output states it, and so
/// does the terminal.
pub fn warn_accepted(source: &Path, accepted: Option<&str>, done: &str) {
    if let Some(d) = accepted {
        say(format_args!(
            "warning: {}: {}; {done}",
            shown(source),
            escape_controls(d)
        ));
    }
}

/// The format of the page `--output path` asks for, by its extension:
/// `.pdf` or `.svg`; `what` names the page in the refusal of another name
/// ("the chart is", "the charts are").
pub fn page_format(path: &Path, what: &str) -> Result<lotsman::HistoryFormat, Error> {
    let ext = path
        .extension()
        .and_then(|e| e.to_str())
        .map(str::to_ascii_lowercase);
    match ext.as_deref() {
        Some("pdf") => Ok(lotsman::HistoryFormat::Pdf),
        Some("svg") => Ok(lotsman::HistoryFormat::Svg),
        _ => Err(lotsman::InputError::Inconsistent(format!(
            "--output {}: {what} drawn as a PDF or an SVG; name the file chart.pdf or chart.svg",
            shown(path)
        ))
        .into()),
    }
}
