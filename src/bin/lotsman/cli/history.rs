//! `history`: the arguments.

use std::path::PathBuf;

use clap::Args;

use super::groups::{FormatFlag, OutputFlags};
use super::values::ReportFormatArg;

/// `history`: each lot of a ledger on a control chart.
#[derive(Debug, Args)]
#[command(mut_arg("output", |a| a.value_name("chart.pdf|chart.svg").help(
    "Draw the chart into this file (PDF or SVG, by its extension), written atomically; \
     the table still goes to stdout"
)))]
pub struct HistoryArgs {
    /// The ledger, as judge --record writes it
    #[arg(value_name = "LOG.csv")]
    pub ledger: PathBuf,
    /// A plan source the ledger's rows were judged by, each revision once (repeat)
    /// [default: the plan sources in the ledger's folder whose SHA-256 its rows record]
    #[arg(long, value_name = "PLAN.yaml")]
    pub plan: Vec<PathBuf>,
    /// The class of defects to chart, by its name in the plan source (default: its first class)
    #[arg(long, value_name = "NAME")]
    pub class: Option<String>,
    #[command(flatten)]
    pub output: OutputFlags,
    #[command(flatten)]
    pub report: FormatFlag<ReportFormatArg>,
}
