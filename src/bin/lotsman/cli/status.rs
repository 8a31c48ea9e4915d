//! `status`: the arguments.

use std::path::PathBuf;

use clap::Args;

use super::groups::FormatFlag;
use super::values::ReportFormatArg;

/// `status`: where a supplier stands after its ledger's lots.
#[derive(Debug, Args)]
pub struct StatusArgs {
    /// The ledger, as judge --record writes it
    #[arg(value_name = "LOG.csv")]
    pub ledger: PathBuf,
    /// A plan source the ledger's rows were judged by, each revision once (repeat); the
    /// next lot's plan is the revision of the last row [default: the plan sources in the
    /// ledger's folder whose SHA-256 its rows record]
    #[arg(long, value_name = "PLAN.yaml")]
    pub plan: Vec<PathBuf>,
    #[command(flatten)]
    pub report: FormatFlag<ReportFormatArg>,
}
