//! What the batch commands (`verify`, `evaluate`, `sheet`) share: each
//! source read once, the budget checked on what was read, the work run
//! with a progress bar, and the summary.

use std::path::PathBuf;

use lotsman::{
    BatchError, BatchSummary, InputError, Outcome, SourceFile, SourceJob, SourceText, check_texts,
    run_in_parallel,
};

use crate::out::to_stderr;
use crate::progress::Progress;

/// A path of a batch that gives no text to work on: why, in words.
pub struct Unread {
    /// The path the message is about.
    pub path: PathBuf,
    /// The message of its entry.
    pub message: String,
    /// Whether the path is a source file that could not be read (it
    /// counts in the budget's total), not a path that named none.
    file: bool,
}

impl From<BatchError> for Unread {
    fn from(e: BatchError) -> Self {
        Unread {
            path: e.path().to_path_buf(),
            message: e.to_string(),
            file: false,
        }
    }
}

/// The source `file`, read once.
pub fn read(file: &SourceFile) -> Result<SourceText, Unread> {
    SourceText::read(&file.path).map_err(|e| Unread {
        path: file.path.clone(),
        message: e.to_string(),
        file: true,
    })
}

/// Every source of a batch, read once.
pub fn read_all(found: Vec<Result<SourceFile, BatchError>>) -> Vec<Result<SourceText, Unread>> {
    found.into_iter().map(|entry| read(&entry?)).collect()
}

/// Checks `job` on the sources read against the budget
/// ([`check_texts`]).
pub fn check<'a>(
    entries: impl IntoIterator<Item = Result<&'a SourceText, &'a Unread>>,
    job: SourceJob,
) -> Result<(), InputError> {
    let files = entries.into_iter().filter_map(|entry| match entry {
        Ok(text) => Some(Some(text)),
        Err(unread) => unread.file.then_some(None),
    });
    check_texts(files, job).map_err(InputError::from)
}

/// Runs `work` over `items` in parallel, with a progress bar on a
/// terminal once the run has lasted a second.
pub fn run_batch<T: Sync, R: Send>(
    items: &[T],
    what: &'static str,
    work: impl Fn(&T) -> R + Sync + Send,
) -> Vec<R> {
    let progress = Progress::start(items.len(), what);
    let answers = run_in_parallel(items, work, &|done, _| progress.set(done));
    progress.finish();
    answers
}

/// The outcome of a batch: its worst. The table format has printed the
/// summary on stdout; beside JSON and CSV it goes to stderr, so that
/// stdout stays machine-readable.
pub fn finish_batch(summary: &BatchSummary, table: bool) -> Outcome {
    if !table {
        to_stderr(&summary.to_string());
    }
    summary.worst()
}
