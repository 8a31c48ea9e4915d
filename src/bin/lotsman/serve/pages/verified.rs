//! What the plans and audit screens share: plan sources of the workspace
//! verified as `lotsman verify` verifies them (each read once, the work
//! held to the budget first, every source re-solved and compared), and
//! each outcome as a row of file, status and what differs, in the
//! command's words.

use lotsman::{
    Difference, Error, InputError, SourceJob, SourceText, VerifyEntry, VerifyStatus, check_texts,
    escape_controls, run_in_parallel, verify_text,
};

use crate::serve::workspace::Workspace;

/// A source named on a page, read (or why not) and verified.
pub struct Checked {
    /// The name as the pages give it (relative to the workspace).
    pub name: String,
    /// The text read, when it could be.
    pub read: Option<SourceText>,
    /// What `verify` finds.
    pub entry: VerifyEntry,
}

/// Reads the sources `names` of the workspace, checks their verification
/// against the work budget as `verify` does before it starts, and
/// verifies each, in parallel. A source that cannot be read is an
/// invalid entry, as on the command line.
///
/// # Errors
/// As the command: a name that leads outside the workspace, and work
/// over the budget.
pub fn verify_named(workspace: &Workspace, names: &[String]) -> Result<Vec<Checked>, Error> {
    let mut reads = Vec::with_capacity(names.len());
    for name in names {
        let path = workspace.file(name)?;
        let read = SourceText::read(&path).map_err(|e| VerifyEntry {
            path: path.display().to_string(),
            status: VerifyStatus::Invalid,
            differences: Vec::new(),
            message: Some(e.to_string()),
        });
        reads.push((name.clone(), read));
    }
    check_texts(
        reads.iter().map(|(_, read)| read.as_ref().ok()),
        SourceJob::Verify,
    )
    .map_err(InputError::from)?;
    let entries = run_in_parallel(
        &reads,
        |(_, read)| match read {
            Ok(text) => relative(workspace, verify_text(text)),
            Err(unread) => relative(workspace, unread.clone()),
        },
        &|_, _| {},
    );
    Ok(reads
        .into_iter()
        .zip(entries)
        .map(|((name, read), entry)| Checked {
            name,
            read: read.ok(),
            entry,
        })
        .collect())
}

/// `entry` with the workspace's paths made relative, as the pages name
/// files and as `verify` names them when run in the workspace folder
/// (before any report lays out its columns).
pub fn relative(workspace: &Workspace, entry: VerifyEntry) -> VerifyEntry {
    let words = |text: &str| workspace.relative_words(text);
    VerifyEntry {
        path: words(&entry.path),
        status: entry.status,
        differences: entry
            .differences
            .iter()
            .map(|d| Difference {
                field: words(&d.field),
                recorded: words(&d.recorded),
                resolved: words(&d.resolved),
            })
            .collect(),
        message: entry.message.as_deref().map(words),
    }
}

/// One differing field, as `verify` lists it.
pub struct DiffRow {
    pub field: String,
    pub recorded: String,
    pub resolved: String,
}

/// One source's verification as a row: file, status, what differs.
pub struct VerifyRow {
    pub file: String,
    /// `match`, `mismatch` or `invalid`, the command's words.
    pub status: &'static str,
    /// What the status means, in a few words.
    pub meaning: &'static str,
    /// Every differing field.
    pub differences: Vec<DiffRow>,
    /// Why the source is invalid (or the sheet's check says), if so.
    pub message: Option<String>,
}

impl VerifyRow {
    /// The row of `entry` (made [`relative`]), the source `file`.
    pub fn of(file: &str, entry: &VerifyEntry) -> Self {
        let words = |text: &str| escape_controls(text).into_owned();
        VerifyRow {
            file: file.to_string(),
            status: entry.status.name(),
            meaning: match entry.status {
                VerifyStatus::Match => "the recorded plan is the one a re-solve gives",
                VerifyStatus::Mismatch => "the recorded plan differs from a re-solve",
                VerifyStatus::Invalid => "the source cannot be read, solved or checked",
            },
            differences: entry
                .differences
                .iter()
                .map(|d| DiffRow {
                    field: words(&d.field),
                    recorded: words(&d.recorded),
                    resolved: words(&d.resolved),
                })
                .collect(),
            message: entry.message.as_deref().map(words),
        }
    }
}
