//! `verify`: the arguments.

use std::path::PathBuf;

use clap::Args;

use super::groups::FormatFlag;
use super::values::ReportFormatArg;

#[derive(Debug, Args)]
pub struct VerifyArgs {
    /// Plan sources to verify, or folders of them (searched through subfolders
    /// for *.yaml and *.yml)
    #[arg(value_name = "FILE.yaml|DIR", required = true)]
    pub sources: Vec<PathBuf>,
    /// A sheet to check against its source's hash; repeat once per source, in order
    /// (sources named one by one, not folders)
    #[arg(long, value_name = "FILE.pdf")]
    pub sheet: Vec<PathBuf>,
    /// Table format: list every source, not only the failures
    #[arg(long)]
    pub list: bool,
    #[command(flatten)]
    pub report: FormatFlag<ReportFormatArg>,
}
