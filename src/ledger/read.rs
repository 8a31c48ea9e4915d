//! Reading a ledger, strictly: the header, then one row per line, each
//! field as the ledger writes it. A misread row is refused with its file,
//! line and column, never decided on. A torn last line (no line break at
//! its end, or too few fields) is kept apart and reported.

use std::path::{Path, PathBuf};

use super::error::LedgerError;
use super::hash::chain_hash;
use super::row::{COLUMNS, LedgerRow, ledger_header};

/// The most bytes a ledger may have: about three million lots.
pub const MAX_LEDGER_BYTES: u64 = 1 << 30;

/// A row and the line it stands on.
#[derive(Clone, Debug, PartialEq)]
pub struct LedgerLine {
    /// The line, counted from 1 (the header is line 1).
    pub line: u64,
    /// The row.
    pub row: LedgerRow,
    /// Whether the row's `hash` is the one its cells give, as read
    /// ([`chain_hash`](super::chain_hash) of `prev_hash` and the cells
    /// from `format` to `resubmitted`).
    pub sealed: bool,
}

/// A last line cut short while it was written.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct TornLine {
    /// The line, counted from 1.
    pub line: u64,
    /// Why it is torn, in words.
    pub reason: String,
}

/// A ledger as read: its rows, and a torn last line if there is one.
#[derive(Clone, Debug, PartialEq)]
pub struct Ledger {
    /// The file.
    pub path: PathBuf,
    /// The rows, in file order.
    pub rows: Vec<LedgerLine>,
    /// The torn last line, if any.
    pub torn: Option<TornLine>,
}

impl Ledger {
    /// Reads the ledger at `path`.
    ///
    /// # Errors
    /// [`LedgerError::Io`] when it cannot be read; as [`Ledger::parse`].
    pub fn read(path: &Path) -> Result<Ledger, LedgerError> {
        let bytes =
            crate::fs::read_limited(path, MAX_LEDGER_BYTES, "a ledger").map_err(|source| {
                LedgerError::Io {
                    path: path.to_path_buf(),
                    source,
                }
            })?;
        Ledger::parse(path, &bytes)
    }

    /// Reads a ledger from its bytes; `path` names it in messages. An
    /// empty text is a ledger without rows (a new file).
    ///
    /// # Errors
    /// [`LedgerError::Header`] for a first line that is not the header;
    /// [`LedgerError::Row`] and [`LedgerError::Field`] for a row before
    /// the last line that is misread.
    pub fn parse(path: &Path, bytes: &[u8]) -> Result<Ledger, LedgerError> {
        let mut ledger = Ledger {
            path: path.to_path_buf(),
            rows: Vec::new(),
            torn: None,
        };
        if bytes.is_empty() {
            return Ok(ledger);
        }
        let header = ledger_header();
        let not_ledger = || LedgerError::Header {
            path: path.to_path_buf(),
            expected: header.clone(),
        };
        let text = std::str::from_utf8(bytes).map_err(|e| {
            let line = bytes[..e.valid_up_to()]
                .iter()
                .filter(|&&b| b == b'\n')
                .count()
                + 1;
            LedgerError::Field {
                path: path.to_path_buf(),
                line: line as u64,
                column: "format",
                message: "the line is not UTF-8 text; the file was saved in another encoding"
                    .into(),
            }
        })?;
        let (first, body) = text.split_once('\n').unwrap_or((text, ""));
        if first.strip_suffix('\r').unwrap_or(first) != header {
            return Err(not_ledger());
        }
        let complete = text.ends_with('\n');
        // Every row is one line (the writer refuses line breaks in a
        // field), so a blank line is not part of any row: the csv crate
        // would skip it, the ledger refuses it.
        if let Some(at) = blank_line(body) {
            return Err(LedgerError::Row {
                path: path.to_path_buf(),
                line: at,
                found: 0,
                expected: COLUMNS.len(),
            });
        }
        // One reader for the whole file: building a csv reader per line
        // cost half of a replay's time (benches/ledger.rs).
        let mut reader = csv::ReaderBuilder::new()
            .has_headers(false)
            .flexible(true)
            .from_reader(body.as_bytes());
        let mut record = csv::StringRecord::new();
        loop {
            // The csv crate counts lines from 1 after the header.
            let number = reader.position().line() + 1;
            match reader.read_record(&mut record) {
                Ok(true) => {}
                Ok(false) => break,
                Err(_) => {
                    return Err(LedgerError::Field {
                        path: path.to_path_buf(),
                        line: number,
                        column: "format",
                        message: "the line is not one CSV row (a quote is not closed)".into(),
                    });
                }
            }
            let number = record.position().map_or(number, |p| p.line() + 1);
            let last = reader.position().byte() >= body.len() as u64;
            if !complete && last {
                ledger.torn = Some(TornLine {
                    line: number,
                    reason: "its line break is missing".into(),
                });
                break;
            }
            if record.len() < COLUMNS.len() && last {
                ledger.torn = Some(TornLine {
                    line: number,
                    reason: format!(
                        "it has {} of a row's {} fields",
                        record.len(),
                        COLUMNS.len()
                    ),
                });
                break;
            }
            if record.len() != COLUMNS.len() {
                return Err(LedgerError::Row {
                    path: path.to_path_buf(),
                    line: number,
                    found: record.len(),
                    expected: COLUMNS.len(),
                });
            }
            let cells: Vec<&str> = record.iter().collect();
            let row =
                LedgerRow::from_fields(&cells).map_err(|(column, message)| LedgerError::Field {
                    path: path.to_path_buf(),
                    line: number,
                    column,
                    message,
                })?;
            // The hash is taken over the cells as written, which the strict
            // reading above holds to the one text each value has.
            let sealed = chain_hash(&row.prev_hash, &cells[..COLUMNS.len() - 2]) == row.hash;
            ledger.rows.push(LedgerLine {
                line: number,
                row,
                sealed,
            });
        }
        Ok(ledger)
    }

    /// The last row, if any.
    pub fn last(&self) -> Option<&LedgerRow> {
        self.rows.last().map(|l| &l.row)
    }
}

/// The line (counted from 1, the header being line 1) of the first
/// blank line in `body`, the text after the header. The piece after a
/// last line break is the file's end, not a line.
fn blank_line(body: &str) -> Option<u64> {
    let mut line = 2;
    let mut start = 0;
    for (i, b) in body.bytes().enumerate() {
        if b == b'\n' {
            if matches!(&body.as_bytes()[start..i], b"" | b"\r") {
                return Some(line);
            }
            line += 1;
            start = i + 1;
        }
    }
    None
}
