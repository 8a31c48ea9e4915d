//! The plan sources a ledger's rows were judged by, found beside the
//! ledger when the user names none: the YAML files in the ledger's folder
//! whose text has the SHA-256 a row records (`plan_sha256`). A file is
//! matched by its hash alone, so a source edited since is never taken for
//! the revision a lot was judged by.

use std::collections::HashSet;
use std::path::{Path, PathBuf};

use super::error::LedgerError;
use super::plan::KnownPlan;
use super::read::Ledger;

use crate::source::{Error, MAX_SOURCE_BYTES, PlanSource};
use crate::standard::text_sha256;

/// The most files of the folder looked at: beyond it the search is
/// refused before it starts, and the user names the sources.
pub const MAX_FOLDER_FILES: usize = 2_000;

/// The plan sources in `ledger`'s folder whose SHA-256 a row records, in
/// file-name order.
///
/// # Errors
/// [`LedgerError::Refused`] when the folder cannot be listed, holds more
/// than [`MAX_FOLDER_FILES`] files, or no source in it matches (the
/// message says how to name one with `--plan`); as [`KnownPlan::load`]
/// for a matching file that is not a plan source this version reads.
pub fn plans_beside(ledger: &Ledger) -> Result<Vec<KnownPlan>, Error> {
    // A ledger named without a folder is in the current one: its plan
    // sources are then named without one too.
    let parent = ledger.path.parent().unwrap_or(Path::new(""));
    let folder = if parent.as_os_str().is_empty() {
        Path::new(".")
    } else {
        parent
    };
    let refuse = |message: String| -> Error {
        LedgerError::Refused {
            path: ledger.path.clone(),
            message,
        }
        .into()
    };
    let wanted: HashSet<&str> = ledger
        .rows
        .iter()
        .map(|l| l.row.entry.plan_sha256.as_str())
        .collect();
    let Some(last) = ledger.last() else {
        return Err(refuse(
            "the ledger has no lot yet, so it names no plan source: give it with --plan PLAN.yaml"
                .into(),
        ));
    };
    let advice = format!(
        "give the plan source the lots were judged by with --plan PLAN.yaml (the last row's plan {} revision {}, SHA-256 {})",
        or_none(&last.entry.plan_id),
        or_none(&last.entry.plan_revision),
        last.entry.plan_sha256
    );
    let entries = std::fs::read_dir(folder).map_err(|e| {
        refuse(format!(
            "the folder {} cannot be listed to find the plan source ({}); {advice}",
            folder.display(),
            crate::plain::io_reason(&e)
        ))
    })?;
    let mut files: Vec<PathBuf> = Vec::new();
    for entry in entries.flatten() {
        if files.len() == MAX_FOLDER_FILES {
            return Err(refuse(format!(
                "the folder {} holds more than {MAX_FOLDER_FILES} files, too many to search for the plan source; {advice}",
                folder.display()
            )));
        }
        files.push(parent.join(entry.file_name()));
    }
    files.sort();
    let mut found = Vec::new();
    for path in files.iter().filter(|p| is_yaml(p)) {
        // A file too large or unreadable cannot be a plan source a row
        // names; only a file whose hash matches is read as one.
        let Ok(meta) = std::fs::metadata(path) else {
            continue;
        };
        if !meta.is_file() || meta.len() > MAX_SOURCE_BYTES {
            continue;
        }
        let Ok(text) = PlanSource::read_text(path) else {
            continue;
        };
        let sha = text_sha256(&text);
        // Two copies of one revision: the first by name serves.
        if wanted.contains(sha.as_str()) && found.iter().all(|k: &KnownPlan| k.sha256 != sha) {
            found.push(KnownPlan::load(path)?);
        }
    }
    if found.is_empty() {
        return Err(refuse(format!(
            "no plan source in the folder {} has the SHA-256 the ledger's rows record; {advice}",
            folder.display()
        )));
    }
    Ok(found)
}

/// The plan sources of `ledger`'s rows: those `given` (`--plan`), or
/// when none is given, the ones beside it ([`plans_beside`]).
///
/// # Errors
/// As [`KnownPlan::load`] and [`plans_beside`].
pub fn ledger_plans(ledger: &Ledger, given: &[PathBuf]) -> Result<Vec<KnownPlan>, Error> {
    if given.is_empty() {
        plans_beside(ledger)
    } else {
        given.iter().map(|p| KnownPlan::load(p)).collect()
    }
}

fn is_yaml(path: &Path) -> bool {
    path.extension()
        .and_then(|e| e.to_str())
        .is_some_and(|e| e.eq_ignore_ascii_case("yaml") || e.eq_ignore_ascii_case("yml"))
}

fn or_none(text: &str) -> &str {
    if text.is_empty() { "(none)" } else { text }
}
