//! The one way this crate writes a file: into a temporary file in the target's
//! own folder, flushed to disk, then renamed over the target. A failed run
//! leaves the target as it was, never half-written.

use std::io::Write;
use std::path::Path;

/// Writes `bytes` to `path` atomically.
///
/// # Errors
/// The I/O error of creating, writing, syncing or renaming the temporary
/// file; the target is untouched in every case.
pub fn write_atomic(path: &Path, bytes: &[u8]) -> std::io::Result<()> {
    let dir = match path.parent() {
        Some(d) if !d.as_os_str().is_empty() => d,
        _ => Path::new("."),
    };
    let mut tmp = tempfile::Builder::new()
        .prefix(".lotsman-")
        .suffix(".tmp")
        .tempfile_in(dir)
        .map_err(|e| folder_error(dir, e))?;
    tmp.write_all(bytes)?;
    tmp.as_file().sync_all()?;
    tmp.persist(path).map_err(|e| e.error)?;
    Ok(())
}

/// The error of creating the temporary file, said of the folder when the
/// folder is the cause: the temporary file's name means nothing to the user.
fn folder_error(dir: &Path, e: std::io::Error) -> std::io::Error {
    let why = match e.kind() {
        std::io::ErrorKind::NotFound => "does not exist; create it first",
        std::io::ErrorKind::PermissionDenied => "cannot be written to (permission denied)",
        _ => return e,
    };
    std::io::Error::new(e.kind(), format!("the folder {} {why}", dir.display()))
}
