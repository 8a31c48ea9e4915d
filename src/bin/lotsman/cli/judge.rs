//! `judge`: the arguments, and the counts found.

use std::path::PathBuf;

use clap::{Args, ValueEnum};
use lotsman::{Format, InputError, Severity, parse_count};

use super::groups::FormatFlag;

#[derive(Debug, Args)]
pub struct JudgeArgs {
    /// The plan source whose recorded plan decides
    #[arg(value_name = "FILE.yaml")]
    pub source: PathBuf,
    /// Count found in each stage's new units, in order (repeat per stage); with
    /// --inspected, the one cumulative count so far. A standard-indexed source with
    /// classes: CLASS=K per class, K,K,.. per stage (--found major=1,3 --found minor=0)
    #[arg(
        long,
        value_name = "K",
        required_unless_present = "measurements",
        conflicts_with = "measurements",
        allow_hyphen_values = true
    )]
    pub found: Vec<String>,
    /// Variables plans: the sample's measurements, a CSV file with one value per row
    /// (or a header row and --column)
    #[arg(long, value_name = "FILE.csv")]
    pub measurements: Option<PathBuf>,
    /// The CSV column that holds the measurements, by its header name
    #[arg(long, value_name = "NAME", requires = "measurements")]
    pub column: Option<String>,
    /// Units inspected so far, for one cumulative --found count (item-by-item plans)
    #[arg(long, value_name = "N", allow_hyphen_values = true)]
    pub inspected: Option<String>,
    /// Decide by a recorded plan that differs from a re-solve or no longer meets its risk
    /// points, the discrepancy stated beside the decision (without it, such a source is refused)
    #[arg(long)]
    pub accept_recorded: bool,
    /// Standard-indexed sources: judge by the plans of this severity instead of the one
    /// in force (standard.severity)
    #[arg(long, value_enum, value_name = "SEVERITY")]
    pub severity: Option<SeverityArg>,
    #[command(flatten)]
    pub record: RecordFlags,
    #[command(flatten)]
    pub report: FormatFlag<JudgeFormat>,
}

/// Recording the decided lot in a ledger (`--record`).
#[derive(Debug, Args)]
pub struct RecordFlags {
    /// Append the decided lot to this ledger (created when missing); a standard-indexed
    /// plan is applied at the severity the ledger's switching history requires
    #[arg(long, value_name = "LOG.csv", requires = "lot")]
    pub record: Option<PathBuf>,
    /// The lot's identifier, once per ledger (with --record)
    #[arg(long, value_name = "ID", requires = "record")]
    pub lot: Option<String>,
    /// The date the lot was judged, YYYY-MM-DD [default: today, UTC]
    #[arg(long, value_name = "YYYY-MM-DD", requires = "record")]
    pub date: Option<String>,
    /// Who inspected the lot, for the ledger
    #[arg(long, value_name = "NAME", requires = "record")]
    pub inspector: Option<String>,
    /// A remark kept in the ledger's row
    #[arg(long, value_name = "TEXT", requires = "record")]
    pub note: Option<String>,
    /// The lot was rejected before and is submitted again (it does not count
    /// for the switching rules)
    #[arg(long, requires = "record")]
    pub resubmitted: bool,
    /// The seed of the draw the sample was taken by, as lotsman draw printed it; kept in
    /// the ledger's row so that an auditor can draw the same units again
    #[arg(
        long,
        value_name = "S",
        requires = "record",
        conflicts_with = "seed_from_lot",
        allow_hyphen_values = true
    )]
    pub seed: Option<String>,
    /// The sample was drawn with lotsman draw --lot ID --plan PLAN.yaml (seeded from the lot
    /// ID and this plan source's SHA-256): keep that seed in the ledger's row
    #[arg(long, requires = "record")]
    pub seed_from_lot: bool,
    /// After inspection under the standard was discontinued (five lots not accepted on
    /// tightened): the supplier's corrective action that lets it resume, on tightened
    /// inspection, from this lot (MIL-STD-105E 4.8); kept in the ledger's row
    #[arg(long, value_name = "TEXT", requires = "record")]
    pub corrective_action: Option<String>,
    /// The lot's size, for the ledger [default: the source's lot size]
    #[arg(
        long,
        value_name = "N",
        requires = "record",
        allow_hyphen_values = true
    )]
    pub lot_size: Option<String>,
}

/// A severity of inspection.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum SeverityArg {
    Normal,
    Tightened,
    Reduced,
}

impl From<SeverityArg> for Severity {
    fn from(severity: SeverityArg) -> Self {
        match severity {
            SeverityArg::Normal => Severity::Normal,
            SeverityArg::Tightened => Severity::Tightened,
            SeverityArg::Reduced => Severity::Reduced,
        }
    }
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum JudgeFormat {
    /// The decision in words (`text`, its earlier name, is still read)
    #[value(alias = "text")]
    Table,
    Json,
}

impl From<JudgeFormat> for Format {
    fn from(format: JudgeFormat) -> Self {
        match format {
            JudgeFormat::Table => Format::Table,
            JudgeFormat::Json => Format::Json,
        }
    }
}

/// What `--found` and `--inspected` say was found.
pub enum Found {
    /// The count in each stage's new units, in order.
    Stages(Vec<u64>),
    /// The one cumulative count in the units inspected so far.
    Cumulative { inspected: u64, found: u64 },
}

impl TryFrom<&JudgeArgs> for Found {
    type Error = InputError;

    fn try_from(args: &JudgeArgs) -> Result<Self, InputError> {
        let found = args
            .found
            .iter()
            .map(|k| parse_count("--found", k, u64::MAX))
            .collect::<Result<Vec<_>, _>>()?;
        let Some(inspected) = &args.inspected else {
            return Ok(Found::Stages(found));
        };
        let [count] = found.as_slice() else {
            return Err(InputError::Inconsistent(
                "with --inspected give one --found: the cumulative count so far".to_string(),
            ));
        };
        Ok(Found::Cumulative {
            inspected: parse_count("--inspected", inspected, u64::MAX)?,
            found: *count,
        })
    }
}
