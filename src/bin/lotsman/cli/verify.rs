//! `verify`: the arguments.

use std::path::PathBuf;

use clap::Args;

use super::groups::FormatFlag;
use super::values::ReportFormatArg;

#[derive(Debug, Args)]
pub struct VerifyArgs {
    /// Plan sources to verify, or folders of them (searched through subfolders
    /// for *.yaml and *.yml); or one ledger, LOG.csv, replayed row by row
    #[arg(value_name = "FILE.yaml|DIR|LOG.csv", required = true)]
    pub sources: Vec<PathBuf>,
    /// A sheet to check against its source's hash; repeat once per source, in order
    /// (sources named one by one, not folders)
    #[arg(long, value_name = "FILE.pdf")]
    pub sheet: Vec<PathBuf>,
    /// Verifying a ledger (LOG.csv, as judge --record writes it): a plan source its
    /// rows were judged by, each revision once (repeat); without it, the hash chain and
    /// the lots only
    #[arg(long, value_name = "PLAN.yaml")]
    pub plan: Vec<PathBuf>,
    /// Table format: list every source, not only the failures
    #[arg(long)]
    pub list: bool,
    #[command(flatten)]
    pub report: FormatFlag<ReportFormatArg>,
}
