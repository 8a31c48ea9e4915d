//! Appending a lot to a ledger, safely when several shells record at
//! once and when the machine stops mid-write.
//!
//! 1. Open the file (created when missing) and take an exclusive lock on
//!    it (`File::lock`: `flock` on Unix, `LockFileEx` on Windows); every
//!    other `judge --record` on the same file waits here.
//! 2. Read the whole ledger under the lock. A torn last line or a broken
//!    chain refuses the append: the new row would chain from a row that
//!    cannot be trusted.
//! 3. Decide the lot (the caller's closure sees the rows, so the switching
//!    state it uses is the one the file holds under the lock).
//! 4. Write the header (new file) and the row in one `write`, in append
//!    mode, then `fsync`; the lock is released when the file is closed.
//!
//! A crash during step 4 leaves at most a torn last line, which the next
//! read reports.

use std::fs::File;
use std::io::Read;
use std::path::Path;

use super::error::LedgerError;
use super::read::{Ledger, MAX_LEDGER_BYTES};
use super::replay::chain_break;
use super::row::{COLUMNS, LedgerRow, LotEntry, ledger_header};
use crate::fs::{append_synced, open_locked_append};

/// Appends the lot that `decide` gives, under the file's lock. `decide`
/// sees the ledger as read under the lock and returns the lot to record
/// (`None` records nothing, e.g. a lot still to be continued) and a
/// value handed back to the caller.
///
/// The lot is refused when its identifier is already in the ledger and
/// it is not marked resubmitted, or marked resubmitted without an earlier
/// row.
///
/// # Errors
/// [`LedgerError`] when the file cannot be opened, locked, read, written
/// or synced, is not a ledger, has a torn last line or a broken chain, or
/// the lot is refused; `decide`'s own error.
pub fn append_lot<T, E, F>(path: &Path, decide: F) -> Result<(Option<LedgerRow>, T), E>
where
    F: Fn(&Ledger) -> Result<(Option<LotEntry>, T), E>,
    E: From<LedgerError>,
{
    let io = |source| LedgerError::Io {
        path: path.to_path_buf(),
        source,
    };
    if !path.exists() {
        // A new ledger: the lot is tried on an empty ledger before the file
        // is made, so that a refused or undecided lot leaves no empty file
        // behind. Should another shell create the file meanwhile, the lot is
        // decided again below, under the lock, on what the file then holds.
        let empty = Ledger::parse(path, &[])?;
        let (entry, value) = decide(&empty)?;
        match entry {
            None => return Ok((None, value)),
            Some(entry) => check_lot(&empty, &entry, path)?,
        }
    }
    let mut file = open_locked_append(path).map_err(io)?;
    let ledger = read_locked(&mut file, path)?;
    if let Some(torn) = &ledger.torn {
        return Err(LedgerError::Torn {
            path: path.to_path_buf(),
            line: torn.line,
            reason: torn.reason.clone(),
        }
        .into());
    }
    if let Some((line, seq, field)) = chain_break(&ledger) {
        return Err(LedgerError::Broken {
            path: path.to_path_buf(),
            line,
            seq,
            field,
        }
        .into());
    }
    let (entry, value) = decide(&ledger)?;
    let Some(entry) = entry else {
        return Ok((None, value));
    };
    check_lot(&ledger, &entry, path)?;
    let seq = ledger.rows.len() as u64 + 1;
    let prev = ledger
        .last()
        .map_or(super::hash::GENESIS, |r| r.hash.as_str())
        .to_string();
    let row = entry.chained(seq, &prev);
    let mut bytes = Vec::new();
    if ledger.rows.is_empty() {
        bytes.extend_from_slice(ledger_header().as_bytes());
        bytes.push(b'\n');
    }
    bytes.extend_from_slice(&row_line(&row).map_err(io)?);
    append_synced(&mut file, &bytes).map_err(io)?;
    Ok((Some(row), value))
}

/// Refuses `entry` when its text cannot stand in a row, its lot is
/// already in `ledger` and it is not marked resubmitted, or it is marked
/// resubmitted without an earlier row.
fn check_lot(ledger: &Ledger, entry: &LotEntry, path: &Path) -> Result<(), LedgerError> {
    let refuse = |message: String| LedgerError::Refused {
        path: path.to_path_buf(),
        message,
    };
    entry.check_text().map_err(refuse)?;
    let earlier = ledger.rows.iter().find(|l| l.row.entry.lot == entry.lot);
    match (earlier, entry.resubmitted) {
        (Some(l), false) => Err(refuse(format!(
            "the lot '{}' is already recorded (seq {}, line {}); a resubmitted lot is recorded with --resubmitted, another lot needs its own identifier",
            entry.lot, l.row.seq, l.line
        ))),
        (None, true) => Err(refuse(format!(
            "the lot '{}' is marked resubmitted but the ledger does not record it; judge its first submission without --resubmitted",
            entry.lot
        ))),
        _ => Ok(()),
    }
}

/// The ledger as the locked file holds it.
fn read_locked(file: &mut File, path: &Path) -> Result<Ledger, LedgerError> {
    let mut bytes = Vec::new();
    file.take(MAX_LEDGER_BYTES + 1)
        .read_to_end(&mut bytes)
        .map_err(|source| LedgerError::Io {
            path: path.to_path_buf(),
            source,
        })?;
    if bytes.len() as u64 > MAX_LEDGER_BYTES {
        return Err(LedgerError::Refused {
            path: path.to_path_buf(),
            message: format!(
                "the ledger has more than {MAX_LEDGER_BYTES} bytes; start a new ledger file for the next lots"
            ),
        });
    }
    Ledger::parse(path, &bytes)
}

/// One row as a CSV line, with its line break.
///
/// # Errors
/// When the CSV writer fails (it writes to memory).
pub fn row_line(row: &LedgerRow) -> std::io::Result<Vec<u8>> {
    let mut writer = csv::WriterBuilder::new()
        .terminator(csv::Terminator::Any(b'\n'))
        .from_writer(Vec::new());
    let fields = row.fields();
    debug_assert_eq!(fields.len(), COLUMNS.len());
    writer
        .write_record(&fields)
        .map_err(std::io::Error::other)?;
    writer
        .into_inner()
        .map_err(|e| std::io::Error::other(e.to_string()))
}
