//! The one other way, beside the atomic writer, that lotsman writes a
//! file: a shared record that is only ever appended to (the lot ledger).
//! A whole file cannot be replaced atomically under several writers, so
//! the file is opened for appending, locked exclusively while it is read
//! and extended, and synced before the lock is released.

use std::fs::{File, OpenOptions};
use std::io::{self, Write};
use std::path::Path;

/// The file at `path`, created when missing, opened to be read and
/// appended to, with an exclusive lock held (`File::lock`: `flock` on
/// Unix, `LockFileEx` on Windows) until it is closed or unlocked. Every
/// other caller on the same file waits here.
///
/// # Errors
/// The system's error when the file cannot be opened, created or locked.
pub fn open_locked_append(path: &Path) -> io::Result<File> {
    let file = OpenOptions::new()
        .read(true)
        .append(true)
        .create(true)
        .open(path)?;
    file.lock()?;
    Ok(file)
}

/// Appends `bytes` in one write to `file` (opened by
/// [`open_locked_append`]), syncs it to the disk and releases the lock: a
/// crash leaves at most a torn last line, never a lost earlier one.
///
/// # Errors
/// The system's error when the write or the sync fails.
pub fn append_synced(file: &mut File, bytes: &[u8]) -> io::Result<()> {
    file.write_all(bytes)?;
    file.sync_all()?;
    file.unlock()
}
