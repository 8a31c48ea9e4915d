//! The user's own tables of a standard-indexed source: each named under
//! `standard.tables` by its path relative to the source's folder and its
//! SHA-256, read from beside the source and checked against that hash
//! before any plan is read from it. A table that is missing, unreadable,
//! or whose bytes have changed since the plans were recorded is refused:
//! plans read from another table than the recorded one would be a quiet
//! wrong answer.

use std::path::{Component, Path, PathBuf};

use super::request::StandardSourceRequest;
use super::schema::TableFileSource;
use crate::input::InputError;
use crate::plain::{io_reason, shell_path};
use crate::source::user_table::read_table_text;
use crate::source::{PlanSource, SourceError};
use crate::standard::{Severity, TableSlot, Tables, load_user_table, text_sha256};

/// Whether the recorded hashes must match the files (`verify`, `judge`,
/// `evaluate`), or the files as they are now are taken and their hashes
/// recorded anew (`design FILE`, which records the plans again).
#[derive(Clone, Copy, PartialEq, Eq)]
pub(crate) enum Hashes {
    Checked,
    Renewed,
}

impl PlanSource {
    /// The tables the plans of the standard-indexed source read from
    /// `path` come from: the built-in MIL-STD-105E tables, with each user
    /// table named under `standard.tables` read from beside the source and
    /// checked against its recorded SHA-256.
    ///
    /// ```
    /// use lotsman::{PlanSource, template};
    /// let path = std::path::Path::new("s.yaml");
    /// let source = PlanSource::from_yaml(template("standard").unwrap(), path).unwrap();
    /// let tables = source.standard_tables(path).unwrap();
    /// assert!(tables.user_tables().is_empty());
    /// ```
    ///
    /// # Errors
    /// [`SourceError::Invalid`] (naming the source) for a source that is
    /// not a valid standard-indexed one; a table file that is missing, not
    /// readable, larger than [`MAX_SOURCE_BYTES`](crate::MAX_SOURCE_BYTES), not UTF-8, whose SHA-256
    /// differs from the recorded one, that does not have the tables'
    /// shape, that stands for a table another file replaces too, or whose
    /// severity is missing (a table of plans) or misplaced (Table I or
    /// VIII).
    pub fn standard_tables(&self, path: &Path) -> Result<Tables, SourceError> {
        let request = self.standard_request().map_err(|e| invalid(path, e))?;
        read_tables(&request, path, Hashes::Checked).map(|(t, _)| t)
    }
}

/// The tables of `request`, a source read from `path`, and the table
/// records with the hashes of the files as read.
pub(crate) fn read_tables(
    request: &StandardSourceRequest,
    path: &Path,
    hashes: Hashes,
) -> Result<(Tables, Vec<TableFileSource>), SourceError> {
    let fail = |e| invalid(path, e);
    let builtin = Tables::builtin().map_err(|e| fail(InputError::Inconsistent(e.to_string())))?;
    let mut tables = builtin.clone();
    let mut records = Vec::with_capacity(request.tables.len());
    let folder = path.parent().unwrap_or(Path::new(""));
    for (i, entry) in request.tables.iter().enumerate() {
        let place = folder.join(&entry.file);
        let text = read_table_text(&place).map_err(|e| {
            fail(InputError::Inconsistent(format!(
                "the table file {} named under standard.tables (item {}) is looked for relative to the source's folder, and {e}; put it there, or correct the path",
                entry.file,
                i + 1,
            )))
        })?;
        let sha256 = text_sha256(&text);
        if hashes == Hashes::Checked && sha256 != entry.sha256 {
            return Err(fail(InputError::Inconsistent(format!(
                "the table file {} has SHA-256 {sha256}, and the source records {}: the table has changed since the plans were recorded; restore the table the plans were read from, or read them again from the table as it is now with: lotsman design {} --in-place",
                entry.file,
                entry.sha256,
                shell_path(path)
            ))));
        }
        let user = load_user_table(
            &entry.file,
            &text,
            entry.severity.unwrap_or(Severity::Normal),
        )
        .map_err(|e| fail(InputError::Inconsistent(e.to_string())))?;
        match (user.slot, entry.severity) {
            (TableSlot::Master(..), None) => {
                return Err(fail(InputError::Inconsistent(format!(
                    "the table file {} is a table of plans: give the severity it stands for with severity: normal, tightened or reduced under its file:",
                    entry.file
                ))));
            }
            (TableSlot::CodeLetters | TableSlot::LimitNumbers, Some(_)) => {
                return Err(fail(InputError::Inconsistent(format!(
                    "the table file {} is a table of {}, which has no severity: remove severity: under its file:",
                    entry.file,
                    if user.slot == TableSlot::CodeLetters {
                        "code letters (Table I)"
                    } else {
                        "limit numbers (Table VIII)"
                    }
                ))));
            }
            _ => {}
        }
        if let Some((_, other, _)) = tables
            .user_tables()
            .iter()
            .find(|(s, _, _)| *s == user.slot)
        {
            return Err(fail(InputError::Inconsistent(format!(
                "the table files {other} and {} stand for the same table of the standard: keep one",
                entry.file
            ))));
        }
        tables = tables.with_user_table(&user);
        records.push(TableFileSource {
            sha256,
            ..entry.clone()
        });
    }
    Ok((tables, records))
}

/// The source at `path` is invalid for `e`.
pub(crate) fn invalid(path: &Path, e: InputError) -> SourceError {
    SourceError::Invalid {
        path: path.to_path_buf(),
        source: e,
    }
}

/// The path of the table file at `table` relative to the folder of the
/// plan source at `source` (which need not exist yet; its folder must), as
/// a source records it under `standard.tables`: folders joined by `/`,
/// `..` to go up.
///
/// ```
/// use lotsman::relative_table_path;
/// let p = relative_table_path(
///     std::path::Path::new("data/standard/mil-std-105e/table-2a-single-normal.csv"),
///     std::path::Path::new("plans/new-plan.yaml"),
/// ).unwrap();
/// assert_eq!(p, "../data/standard/mil-std-105e/table-2a-single-normal.csv");
/// ```
///
/// # Errors
/// [`InputError`] when the table or the source's folder cannot be found,
/// or no relative path leads from one to the other (another drive) or it
/// is not UTF-8.
pub fn relative_table_path(table: &Path, source: &Path) -> Result<String, InputError> {
    let found = |p: &Path, what: &str| {
        p.canonicalize().map_err(|e| {
            InputError::Inconsistent(format!("{what} {} {}", p.display(), io_reason(&e)))
        })
    };
    let table_at = found(table, "the table file")?;
    let folder = match source.parent() {
        Some(f) if !f.as_os_str().is_empty() => f.to_path_buf(),
        _ => PathBuf::from("."),
    };
    let folder_at = found(&folder, "the folder of the plan source")?;
    let from: Vec<Component> = folder_at.components().collect();
    let to: Vec<Component> = table_at.components().collect();
    let common = from.iter().zip(&to).take_while(|(a, b)| a == b).count();
    if common == 0 {
        return Err(InputError::Inconsistent(format!(
            "no relative path leads from the folder of {} to the table file {}: keep the table on the same drive as the source",
            source.display(),
            table.display()
        )));
    }
    let mut parts: Vec<String> = vec!["..".to_string(); from.len() - common];
    for c in &to[common..] {
        let Some(part) = c.as_os_str().to_str() else {
            return Err(InputError::Inconsistent(format!(
                "the path of the table file {} is not UTF-8 text, which a plan source cannot hold: rename it",
                table.display()
            )));
        };
        parts.push(part.to_string());
    }
    Ok(parts.join("/"))
}
