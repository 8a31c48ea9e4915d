//! Leftovers of killed runs: the hidden temporary files (and the demo's
//! temporary folders) that a run killed outright leaves beside its
//! targets, removed by the next run that writes into the same folder.
//!
//! # The rule
//!
//! Before a run first writes into a folder, it removes each entry of that
//! folder that is a leftover, which is when all of these hold:
//!
//! 1. its name is one the writer gives: `.lotsman-<pid>-<random>.tmp`,
//!    where `<pid>` is the process that made it (or `.lotsman-<random>.tmp`,
//!    the form earlier versions gave);
//! 2. it was last modified before this run started (before its first
//!    write);
//! 3. where the system lists its processes (`/proc` on Linux), no process
//!    with that pid is running.
//!
//! Nothing else is touched: not a file of any other name, not a link, not
//! a file newer than the run.
//!
//! # Concurrent runs
//!
//! Another run writing into the same folder at the same time keeps its
//! temporary files: each is being written after this run started, or, on
//! Linux, belongs to a process that is still running. The race that the
//! age alone cannot close (a temporary file that a run finished writing
//! just before this run started, and is still syncing or renaming) is
//! closed by the process check; where the system gives no list of
//! processes, such a file can be removed, and that run then reports the
//! failed rename of its target, which keeps its previous contents: nothing
//! is lost. A pid that a new process has taken since the leftover was made
//! keeps the leftover for a later run.

use std::collections::HashSet;
use std::path::{Path, PathBuf};
use std::sync::{Mutex, OnceLock};
use std::time::SystemTime;

/// The first part of every temporary name the writer gives.
pub(crate) const TEMPORARY_PREFIX: &str = ".lotsman-";

/// The last part of every temporary name the writer gives.
pub(crate) const TEMPORARY_SUFFIX: &str = ".tmp";

/// The prefix of this process's temporary names: `.lotsman-<pid>-`.
pub(crate) fn temporary_prefix() -> &'static str {
    static PREFIX: OnceLock<String> = OnceLock::new();
    PREFIX.get_or_init(|| format!("{TEMPORARY_PREFIX}{}-", std::process::id()))
}

/// When this run started writing: the first call, from any thread.
fn run_start() -> SystemTime {
    static START: OnceLock<SystemTime> = OnceLock::new();
    *START.get_or_init(SystemTime::now)
}

/// The folders this run has swept already.
fn swept() -> &'static Mutex<HashSet<PathBuf>> {
    static SWEPT: OnceLock<Mutex<HashSet<PathBuf>>> = OnceLock::new();
    SWEPT.get_or_init(|| Mutex::new(HashSet::new()))
}

/// Removes the leftovers in `dir` (see the module documentation), once per
/// folder and run. The folder is locked while it is swept, so that no
/// thread of this run writes into it meanwhile. A leftover that cannot be
/// removed stays, as it would have without the sweep.
pub(crate) fn sweep(dir: &Path) {
    let start = run_start();
    let key = dir.canonicalize().unwrap_or_else(|_| dir.to_path_buf());
    // A thread that panicked while holding the lock left the set usable.
    let mut done = swept().lock().unwrap_or_else(|e| e.into_inner());
    if !done.insert(key) {
        return;
    }
    let Ok(entries) = std::fs::read_dir(dir) else {
        return;
    };
    let processes_listed = Path::new("/proc/self").exists();
    for entry in entries.flatten() {
        let name = entry.file_name();
        let Some(owner) = name.to_str().and_then(owner_of) else {
            continue;
        };
        // The entry itself, never what a link points to.
        let Ok(meta) = std::fs::symlink_metadata(entry.path()) else {
            continue;
        };
        let old = meta.modified().is_ok_and(|m| m < start);
        let running = processes_listed
            && owner.is_some_and(|pid| Path::new("/proc").join(pid.to_string()).exists());
        if !old || running || meta.file_type().is_symlink() {
            continue;
        }
        let _ = if meta.is_dir() {
            std::fs::remove_dir_all(entry.path())
        } else {
            std::fs::remove_file(entry.path())
        };
    }
}

/// For a name the writer gives, the pid it names (`None` for the form
/// without one); `None` at the outer level for any other name.
fn owner_of(name: &str) -> Option<Option<u32>> {
    let middle = name
        .strip_prefix(TEMPORARY_PREFIX)?
        .strip_suffix(TEMPORARY_SUFFIX)?;
    // The random part is six letters and digits, as the writer draws it.
    let random_ok = |r: &str| r.len() == 6 && r.chars().all(|c| c.is_ascii_alphanumeric());
    match middle.split_once('-') {
        Some((pid, random)) if random_ok(random) => {
            let pid = pid.parse().ok()?;
            Some(Some(pid))
        }
        None if random_ok(middle) => Some(None),
        _ => None,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn only_the_writers_own_names_are_taken_for_leftovers() {
        assert_eq!(owner_of(".lotsman-4242-Ab3xYz.tmp"), Some(Some(4242)));
        assert_eq!(owner_of(".lotsman-Ab3xYz.tmp"), Some(None));
        for other in [
            "lotsman-4242-Ab3xYz.tmp",
            ".lotsman-4242-Ab3xYz.tmp.bak",
            ".lotsman-4242-Ab.tmp",
            ".lotsman-x42-Ab3xYz.tmp",
            ".lotsman-notes.tmp",
            ".lotsman-4242-Ab3xYz7.tmp",
            ".lotsman-4242-Ab3x.Yz.tmp",
            "plan.yaml",
        ] {
            assert_eq!(owner_of(other), None, "{other}");
        }
        let own = format!("{}Ab3xYz{TEMPORARY_SUFFIX}", temporary_prefix());
        assert_eq!(owner_of(&own), Some(Some(std::process::id())));
    }
}
