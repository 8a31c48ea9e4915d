//! The one way this crate writes a file: into a temporary file in the target's
//! own folder, flushed to disk, then renamed over the target, and the folder
//! flushed after the rename. A failed or killed run leaves the target as it
//! was, never half-written; the only trace a killed run can leave is a hidden
//! temporary file (`.lotsman-<pid>-XXXXXX.tmp`), which the batch commands
//! skip and the next run writing into that folder removes
//! ([`leftovers`](super::leftovers)). A set of files that belong together
//! (the demo's) is written as one with [`write_set`].
//!
//! No other code of the crate opens a file for writing (`tests/writes.rs`
//! scans the source tree for it).

use std::fs::File;
use std::io::Write;
use std::path::{Path, PathBuf};

use super::error::FileError;
use super::leftovers::{TEMPORARY_SUFFIX, sweep, temporary_prefix};

/// Whether a write may replace a file that is already at its target.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Overwrite {
    /// Write only where nothing exists yet; an existing target is
    /// [`FileError::Exists`] (the command-line default).
    Refuse,
    /// Replace an existing file (`--force`).
    Replace,
}

impl Overwrite {
    /// [`Overwrite::Replace`] when `force` is set.
    pub fn from_force(force: bool) -> Self {
        if force {
            Overwrite::Replace
        } else {
            Overwrite::Refuse
        }
    }
}

/// Writes `bytes` to `path` atomically: a temporary file in the same folder
/// is written and synced to disk, then renamed to `path` (with
/// [`Overwrite::Refuse`], by a rename that fails when `path` exists, so no
/// file that appears meanwhile is replaced either), and the folder is
/// synced so that the rename survives a power cut where the platform
/// allows it (Unix).
///
/// ```
/// use lotsman::{Overwrite, write_atomic};
/// let dir = tempfile::tempdir().unwrap();
/// let path = dir.path().join("plan.yaml");
/// write_atomic(&path, b"first", Overwrite::Refuse).unwrap();
/// assert!(write_atomic(&path, b"second", Overwrite::Refuse).is_err());
/// write_atomic(&path, b"second", Overwrite::Replace).unwrap();
/// assert_eq!(std::fs::read(&path).unwrap(), b"second");
/// ```
///
/// # Errors
/// [`FileError::Exists`] when `path` exists and `overwrite` is
/// [`Overwrite::Refuse`]; [`FileError::Io`] (naming `path`) when the
/// temporary file cannot be created, written, synced or renamed. In these
/// cases the target is untouched and the temporary file is removed. When
/// only the final sync of the folder fails, the target already holds the
/// new bytes and the error says that the rename may not be on disk yet.
pub fn write_atomic(path: &Path, bytes: &[u8], overwrite: Overwrite) -> Result<(), FileError> {
    write_with(path, overwrite, |file| file.write_all(bytes))
}

/// [`write_atomic`] with the temporary file's contents written by `fill`,
/// so that the unit tests can make the writing itself fail.
fn write_with(
    path: &Path,
    overwrite: Overwrite,
    fill: impl FnOnce(&mut File) -> std::io::Result<()>,
) -> Result<(), FileError> {
    let io = |source| FileError::Io {
        path: path.to_path_buf(),
        source,
    };
    // A folder in the target's place is no file to replace, with or
    // without --force: say so before anything is made.
    if path.is_dir() {
        return Err(io(std::io::Error::new(
            std::io::ErrorKind::IsADirectory,
            "is a folder; name a file to write",
        )));
    }
    let dir = match path.parent() {
        Some(d) if !d.as_os_str().is_empty() => d,
        _ => Path::new("."),
    };
    sweep(dir);
    // A temporary file is private (0600) by default; the file it becomes
    // gets the permissions any new file gets (0666 less the umask).
    let mut tmp = temporary(0o666)
        .tempfile_in(dir)
        .map_err(|e| io(folder_error(dir, e)))?;
    fill(tmp.as_file_mut()).map_err(io)?;
    tmp.as_file().sync_all().map_err(io)?;
    let persisted = match overwrite {
        Overwrite::Replace => tmp.persist(path),
        Overwrite::Refuse => tmp.persist_noclobber(path),
    };
    // A failed rename drops the temporary file with the error, which
    // removes it.
    persisted.map_err(|e| match e.error.kind() {
        std::io::ErrorKind::AlreadyExists if overwrite == Overwrite::Refuse => FileError::Exists {
            path: path.to_path_buf(),
        },
        _ => io(e.error),
    })?;
    sync_folder(dir).map_err(|e| {
        io(std::io::Error::new(
            e.kind(),
            format!("written, but its folder could not be synced to disk: {e}"),
        ))
    })
}

/// The builder of this process's temporary names,
/// `.lotsman-<pid>-XXXXXX.tmp`, made with `mode` (less the umask) where
/// the platform has modes.
fn temporary(mode: u32) -> tempfile::Builder<'static, 'static> {
    let mut builder = tempfile::Builder::new();
    builder
        .prefix(temporary_prefix())
        .suffix(TEMPORARY_SUFFIX)
        .rand_bytes(6);
    #[cfg(unix)]
    builder.permissions(std::os::unix::fs::PermissionsExt::from_mode(mode));
    #[cfg(not(unix))]
    let _ = mode;
    builder
}

/// Writes the files of a set (`(name, bytes)`, names relative to `dir`,
/// one level) into `dir` as one: every byte of the set is written and
/// synced in a hidden temporary folder first, and only then moved into
/// place, so that a full disk or any other failure of the writing leaves
/// `dir` as it was, never with part of the set.
///
/// * When `dir` does not exist, the temporary folder is made beside it
///   (its parents are created as needed) and renamed to `dir` whole: `dir`
///   appears complete or not at all.
/// * When `dir` exists, the temporary folder is made inside it (on the same
///   file system), and each file is then moved onto its target: renames,
///   which take no space, so they cannot run out of it. With
///   [`Overwrite::Refuse`] each move fails when its target exists, and the
///   files already moved are taken back, leaving `dir` as it was; with
///   [`Overwrite::Replace`] only a process killed between two of those
///   renames could leave part of the new set beside the old (each file
///   whole).
///
/// # Errors
/// [`FileError::Exists`] when a target exists and `overwrite` refuses;
/// [`FileError::Io`] when `dir` is a file, a target is a folder, or the
/// writing fails (naming the file).
pub fn write_set(
    dir: &Path,
    files: &[(String, Vec<u8>)],
    overwrite: Overwrite,
) -> Result<(), FileError> {
    let io = |path: &Path, source| FileError::Io {
        path: path.to_path_buf(),
        source,
    };
    let targets: Vec<PathBuf> = files.iter().map(|(name, _)| dir.join(name)).collect();
    if dir.exists() && !dir.is_dir() {
        return Err(io(
            dir,
            std::io::Error::new(
                std::io::ErrorKind::NotADirectory,
                "this is a file; give a folder",
            ),
        ));
    }
    for target in &targets {
        if target.is_dir() {
            return Err(io(
                target,
                std::io::Error::new(
                    std::io::ErrorKind::IsADirectory,
                    "is a folder; it cannot be replaced by a file",
                ),
            ));
        }
        if overwrite == Overwrite::Refuse && target.exists() {
            return Err(FileError::Exists {
                path: target.clone(),
            });
        }
    }
    let fresh = !dir.exists();
    let home = if fresh {
        let parent = match dir.parent() {
            Some(p) if !p.as_os_str().is_empty() => p,
            _ => Path::new("."),
        };
        std::fs::create_dir_all(parent).map_err(|e| io(parent, e))?;
        parent.to_path_buf()
    } else {
        dir.to_path_buf()
    };
    sweep(&home);
    // The folder gets the permissions of any new folder (0777 less the
    // umask) once it is renamed into place.
    let staging = temporary(0o777)
        .tempdir_in(&home)
        .map_err(|e| io(dir, folder_error(&home, e)))?;
    for (name, bytes) in files {
        let path = staging.path().join(name);
        let mut file = File::create(&path).map_err(|e| io(&dir.join(name), e))?;
        file.write_all(bytes)
            .and_then(|()| file.sync_all())
            .map_err(|e| io(&dir.join(name), e))?;
    }
    sync_folder(staging.path()).map_err(|e| io(dir, e))?;
    if fresh {
        // One rename puts the whole set in place; the guard must not
        // remove what is now `dir`.
        let staged = staging.keep();
        if let Err(e) = std::fs::rename(&staged, dir) {
            let _ = std::fs::remove_dir_all(&staged);
            return Err(io(dir, e));
        }
        return sync_folder(&home).map_err(|e| io(dir, e));
    }
    let mut placed = Vec::new();
    for ((name, _), target) in files.iter().zip(&targets) {
        let staged = staging.path().join(name);
        let moved = match overwrite {
            Overwrite::Replace => std::fs::rename(&staged, target),
            // A link fails when the target exists, so nothing that
            // appeared meanwhile is replaced.
            Overwrite::Refuse => std::fs::hard_link(&staged, target),
        };
        if let Err(e) = moved {
            for done in &placed {
                let _ = std::fs::remove_file(done);
            }
            return Err(match e.kind() {
                std::io::ErrorKind::AlreadyExists => FileError::Exists {
                    path: target.clone(),
                },
                _ => io(target, e),
            });
        }
        placed.push(target.clone());
    }
    sync_folder(dir).map_err(|e| io(dir, e))
}

/// Flushes a folder's entries (the rename just made) to disk.
#[cfg(unix)]
fn sync_folder(dir: &Path) -> std::io::Result<()> {
    File::open(dir)?.sync_all()
}

/// Other platforms give no handle on a folder to sync; the rename is as
/// durable as the platform makes it.
#[cfg(not(unix))]
fn sync_folder(_dir: &Path) -> std::io::Result<()> {
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

#[cfg(test)]
mod tests {
    use super::*;

    /// The names in `dir`, sorted.
    fn names(dir: &Path) -> Vec<String> {
        let mut v: Vec<String> = std::fs::read_dir(dir)
            .unwrap()
            .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
            .collect();
        v.sort();
        v
    }

    #[test]
    fn a_failure_while_writing_keeps_the_existing_file_and_removes_the_temporary_one() {
        let dir = tempfile::tempdir().unwrap();
        let target = dir.path().join("sheet.pdf");
        write_atomic(&target, b"the previous sheet", Overwrite::Refuse).unwrap();
        for overwrite in [Overwrite::Refuse, Overwrite::Replace] {
            let err = write_with(&target, overwrite, |f| {
                f.write_all(b"half of a new")?;
                Err(std::io::Error::other("the disk is full (injected)"))
            })
            .unwrap_err();
            assert!(
                matches!(&err, FileError::Io { path, .. } if *path == target),
                "{err}"
            );
            assert!(err.to_string().contains("injected"), "{err}");
            assert_eq!(std::fs::read(&target).unwrap(), b"the previous sheet");
            assert_eq!(names(dir.path()), ["sheet.pdf"]);
        }
    }

    #[test]
    fn an_existing_file_is_replaced_only_when_asked() {
        let dir = tempfile::tempdir().unwrap();
        let target = dir.path().join("plan.yaml");
        std::fs::write(&target, b"kept").unwrap();
        let err = write_atomic(&target, b"new", Overwrite::Refuse).unwrap_err();
        assert!(matches!(err, FileError::Exists { .. }), "{err}");
        assert!(err.to_string().contains("--force"), "{err}");
        assert_eq!(std::fs::read(&target).unwrap(), b"kept");
        assert_eq!(names(dir.path()), ["plan.yaml"]);
        write_atomic(&target, b"new", Overwrite::Replace).unwrap();
        assert_eq!(std::fs::read(&target).unwrap(), b"new");
        assert_eq!(names(dir.path()), ["plan.yaml"]);
    }

    #[cfg(unix)]
    #[test]
    fn a_written_file_has_the_permissions_of_any_new_file() {
        use std::os::unix::fs::PermissionsExt;
        let dir = tempfile::tempdir().unwrap();
        let plain = dir.path().join("plain.pdf");
        std::fs::write(&plain, b"%PDF").unwrap();
        let atomic = dir.path().join("atomic.pdf");
        write_atomic(&atomic, b"%PDF", Overwrite::Refuse).unwrap();
        let mode = |p: &Path| std::fs::metadata(p).unwrap().permissions().mode() & 0o777;
        assert_eq!(mode(&atomic), mode(&plain));
    }

    #[test]
    fn a_failed_rename_leaves_the_folder_as_it_was() {
        // A folder in the target's place: even with Replace, a file cannot
        // be renamed over it (and this fails for root too).
        let dir = tempfile::tempdir().unwrap();
        let target = dir.path().join("out.pdf");
        std::fs::create_dir(&target).unwrap();
        std::fs::write(target.join("inside.txt"), b"inside").unwrap();
        for overwrite in [Overwrite::Refuse, Overwrite::Replace] {
            assert!(write_atomic(&target, b"%PDF", overwrite).is_err());
            assert_eq!(names(dir.path()), ["out.pdf"]);
            assert_eq!(names(&target), ["inside.txt"]);
        }
    }
}
