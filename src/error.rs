//! Error types. Every message names the parameter, the value it was given
//! and the range it must lie in, so that one line on a terminal is enough to
//! fix the input.

use std::path::PathBuf;

use thiserror::Error;

/// A value that is not a valid input.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum InputError {
    /// A number outside its valid range.
    #[error("{parameter} = {value} is out of range: it must be {range}")]
    OutOfRange {
        /// What the value is (for example "producer's quality (--aql)").
        parameter: String,
        /// The value as given.
        value: String,
        /// The valid range, in words.
        range: String,
    },
    /// Text that does not parse as the expected kind of value.
    #[error("{parameter} = '{value}' is not {expected}")]
    Unparsable {
        /// What the value is.
        parameter: String,
        /// The text as given.
        value: String,
        /// What was expected, in words.
        expected: String,
    },
    /// The hypergeometric model without a lot size.
    #[error(
        "the hypergeometric model needs a lot size: give --lot-size N (or lot_size in the plan source)"
    )]
    LotSizeMissing,
    /// Values that are each valid but do not fit together.
    #[error("{0}")]
    Inconsistent(String),
    /// A plan source without the solved plan the work needs, or with a
    /// plan of the wrong kind: solving it is the fix. Inside a
    /// [`SourceError::Invalid`], `FILE.yaml` in the advice is the source's
    /// own name.
    #[error("{why}; solve it with: lotsman design FILE.yaml --in-place")]
    NotSolved {
        /// What the source lacks, e.g. `not solved yet: the source records
        /// no plan`.
        why: String,
    },
    /// A request whose work passes the budget
    /// ([`TIME_BUDGET`](crate::TIME_BUDGET),
    /// [`MEMORY_BUDGET`](crate::MEMORY_BUDGET)).
    #[error(transparent)]
    OverBudget(#[from] crate::budget::OverBudget),
}

impl InputError {
    /// Shorthand for [`InputError::OutOfRange`].
    pub fn out_of_range(parameter: &str, value: impl ToString, range: &str) -> Self {
        InputError::OutOfRange {
            parameter: parameter.to_string(),
            value: value.to_string(),
            range: range.to_string(),
        }
    }

    /// Shorthand for [`InputError::Unparsable`].
    pub fn unparsable(parameter: &str, value: &str, expected: &str) -> Self {
        InputError::Unparsable {
            parameter: parameter.to_string(),
            value: value.to_string(),
            expected: expected.to_string(),
        }
    }
}

/// Why a design request has no answer.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum DesignError {
    /// No sample size and acceptance number meet both risk points.
    #[error("no plan meets both risk points: {reason}; {suggestion}")]
    NoPlan {
        /// Why, in terms of the inputs.
        reason: String,
        /// What the user can do.
        suggestion: String,
    },
    /// The points are so close that the plan would exceed the search caps.
    #[error(
        "the risk points are too close: a plan would need {what} beyond the designer's limit of {cap}; widen the points (raise the RQL or lower the AQL) or relax alpha or beta"
    )]
    BeyondCap {
        /// The quantity that would exceed its cap.
        what: String,
        /// The cap.
        cap: String,
    },
    /// The risk points need a sample larger than the lot: no sampling plan
    /// fits, and the answer is to inspect every unit.
    #[error(
        "no plan: the risk points need a sample of n = {needed} {unit} from a lot of {lot} units, and a sample cannot be larger than its lot; inspect all {lot} units (100%), or agree points further apart (raise the RQL, lower the AQL, or relax alpha or beta)"
    )]
    WholeLot {
        /// The sample the points need.
        needed: u64,
        /// The lot size.
        lot: u64,
        /// What the sample counts: `units`, or `measurements` for a
        /// variables plan.
        unit: &'static str,
    },
    /// A minimum-inspection request (rectifying inspection) with no answer
    /// of the scheme asked for within the designer's limits.
    #[error("no minimum-inspection plan: {reason}; {suggestion}")]
    NoRectifyingPlan {
        /// Why, in terms of the inputs.
        reason: String,
        /// What the user can do.
        suggestion: String,
    },
    /// A search whose work passes the budget
    /// ([`TIME_BUDGET`](crate::TIME_BUDGET)).
    #[error(transparent)]
    OverBudget(#[from] crate::budget::OverBudget),
}

/// A plan source that cannot be read, parsed or written.
#[derive(Debug, Error)]
pub enum SourceError {
    /// The file system refused.
    #[error("{}", crate::plain::io_message(path, source))]
    Io {
        /// The file.
        path: PathBuf,
        /// The cause.
        source: std::io::Error,
    },
    /// The YAML does not parse, or does not fit the schema (the message
    /// says, in plain words, what the field must hold, and gives its line).
    #[error("{path}: {message}")]
    Parse {
        /// The file.
        path: PathBuf,
        /// What is wrong and where, in plain words.
        message: String,
    },
    /// The YAML parses but holds an invalid value.
    #[error("{}", invalid_message(path, source))]
    Invalid {
        /// The file.
        path: PathBuf,
        /// What is wrong.
        source: InputError,
    },
    /// The source's risk points have no plan.
    #[error("{path}: {source}")]
    Design {
        /// The file.
        path: PathBuf,
        /// Why.
        source: DesignError,
    },
    /// The recorded plan differs from a re-solve of its risk points, or no
    /// longer meets them, and using it as recorded (to print, evaluate or
    /// judge by) was not asked for.
    #[error(
        "{path}: {discrepancy}; re-solve it with: lotsman design {} --in-place, or use the plan as recorded with --accept-recorded, which states the discrepancy in the output",
        crate::plain::shell_path(path)
    )]
    Unconfirmed {
        /// The source.
        path: PathBuf,
        /// What the audit found.
        discrepancy: crate::source::Discrepancy,
    },
    /// A file to be written exists already, and replacing it was not asked
    /// for.
    #[error("{path} already exists; give --force to replace it (nothing was written)")]
    Exists {
        /// The existing file.
        path: PathBuf,
    },
}

/// A path of a batch that yields no plan source to work on, or a sheet
/// that would replace another sheet of the same run. Each is reported
/// against its path; the rest of the batch goes on.
#[derive(Debug, Error)]
pub enum BatchError {
    /// The path does not exist or cannot be inspected.
    #[error(
        "{}; give a plan source (FILE.yaml) or a folder that holds some",
        crate::plain::io_message(path, source)
    )]
    Missing {
        /// The path as given.
        path: PathBuf,
        /// The cause.
        source: std::io::Error,
    },
    /// A folder, or a folder below it, cannot be listed.
    #[error(
        "{path}: the folder cannot be listed: it {}",
        crate::plain::io_reason(source)
    )]
    Unlistable {
        /// The folder.
        path: PathBuf,
        /// The cause.
        source: std::io::Error,
    },
    /// A folder holds no plan source.
    #[error(
        "{path}: the folder holds no plan sources; a folder is searched through its subfolders for files ending in .yaml or .yml, skipping names that start with '.'"
    )]
    EmptyFolder {
        /// The folder as given.
        path: PathBuf,
    },
    /// Two sources of one run would print to the same sheet.
    #[error(
        "{path}: its sheet {target} is already the sheet of {first} in this run; rename one of the two sources, or (for files of one name in different subfolders) give their common folder instead of the files, so that --output-dir keeps the subfolders apart"
    )]
    SheetCollision {
        /// The source whose sheet is refused.
        path: PathBuf,
        /// The PDF both would write.
        target: PathBuf,
        /// The earlier source that keeps the PDF.
        first: PathBuf,
    },
}

impl BatchError {
    /// The path the error is reported against.
    pub fn path(&self) -> &std::path::Path {
        match self {
            BatchError::Missing { path, .. }
            | BatchError::Unlistable { path, .. }
            | BatchError::EmptyFolder { path }
            | BatchError::SheetCollision { path, .. } => path,
        }
    }
}

/// Any error of the library, for callers that only report it.
#[derive(Debug, Error)]
pub enum Error {
    /// See [`InputError`].
    #[error(transparent)]
    Input(#[from] InputError),
    /// See [`DesignError`].
    #[error(transparent)]
    Design(#[from] DesignError),
    /// See [`SourceError`].
    #[error(transparent)]
    Source(#[from] SourceError),
    /// A computed number out of its range; see
    /// [`NumericalError`](crate::NumericalError).
    #[error(transparent)]
    Numerical(#[from] crate::numeric::NumericalError),
    /// Writing a report failed.
    #[error("{}", crate::plain::io_message(std::path::Path::new("the output"), .0).trim_start_matches("the output: "))]
    Output(#[from] std::io::Error),
}

/// The message of [`SourceError::Invalid`]: the path, then what is wrong;
/// the advice of [`InputError::NotSolved`] names the source itself.
fn invalid_message(path: &std::path::Path, source: &InputError) -> String {
    match source {
        InputError::NotSolved { why } => format!(
            "{}: {why}; solve it with: lotsman design {} --in-place",
            path.display(),
            crate::plain::shell_path(path)
        ),
        other => format!("{}: {other}", path.display()),
    }
}
