//! Reading a ledger, strictly: the header, then one row per line, each
//! field as the ledger writes it. A misread row is refused with its file,
//! line and column, never decided on. A torn last line (no line break at
//! its end, or too few fields) is kept apart and reported.

use std::path::{Path, PathBuf};

use super::error::LedgerError;
use super::row::{COLUMNS, LedgerRow, ledger_header};

/// The most bytes a ledger may have: about three million lots.
pub const MAX_LEDGER_BYTES: u64 = 1 << 30;

/// A row and the line it stands on.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct LedgerLine {
    /// The line, counted from 1 (the header is line 1).
    pub line: u64,
    /// The row.
    pub row: LedgerRow,
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
#[derive(Clone, Debug, PartialEq, Eq)]
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
        let mut lines = text.split('\n');
        if lines.next().map(|h| h.strip_suffix('\r').unwrap_or(h)) != Some(header.as_str()) {
            return Err(not_ledger());
        }
        let complete = text.ends_with('\n');
        let lines: Vec<&str> = lines.collect();
        // After a final line break, split gives one empty piece: no line.
        let count = if complete {
            lines.len() - 1
        } else {
            lines.len()
        };
        for (i, line) in lines.iter().take(count).enumerate() {
            let number = i as u64 + 2;
            let last = i + 1 == count;
            if !complete && last {
                ledger.torn = Some(TornLine {
                    line: number,
                    reason: "its line break is missing".into(),
                });
                break;
            }
            let cells = cells(path, number, line)?;
            if cells.len() < COLUMNS.len() && last {
                ledger.torn = Some(TornLine {
                    line: number,
                    reason: format!("it has {} of a row's {} fields", cells.len(), COLUMNS.len()),
                });
                break;
            }
            if cells.len() != COLUMNS.len() {
                return Err(LedgerError::Row {
                    path: path.to_path_buf(),
                    line: number,
                    found: cells.len(),
                    expected: COLUMNS.len(),
                });
            }
            let refs: Vec<&str> = cells.iter().map(String::as_str).collect();
            let row =
                LedgerRow::from_fields(&refs).map_err(|(column, message)| LedgerError::Field {
                    path: path.to_path_buf(),
                    line: number,
                    column,
                    message,
                })?;
            ledger.rows.push(LedgerLine { line: number, row });
        }
        Ok(ledger)
    }

    /// The last row, if any.
    pub fn last(&self) -> Option<&LedgerRow> {
        self.rows.last().map(|l| &l.row)
    }
}

/// The cells of one line, read by the csv crate (quotes undone).
fn cells(path: &Path, line: u64, text: &str) -> Result<Vec<String>, LedgerError> {
    let text = text.strip_suffix('\r').unwrap_or(text);
    let mut reader = csv::ReaderBuilder::new()
        .has_headers(false)
        .flexible(true)
        .from_reader(text.as_bytes());
    let mut record = csv::StringRecord::new();
    match reader.read_record(&mut record) {
        Ok(true) => Ok(record.iter().map(str::to_string).collect()),
        Ok(false) => Ok(Vec::new()),
        Err(_) => Err(LedgerError::Field {
            path: path.to_path_buf(),
            line,
            column: "format",
            message: "the line is not one CSV row (a quote is not closed)".into(),
        }),
    }
}
