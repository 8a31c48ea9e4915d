//! `sheet`: the arguments, and the options of the sheets they ask for.

use std::path::PathBuf;

use clap::Args;
use lotsman::{Overwrite, SheetOptions};

use super::groups::PaperFlag;

#[derive(Debug, Args)]
pub struct SheetArgs {
    /// Plan sources to print, or folders of them (searched through subfolders
    /// for *.yaml and *.yml)
    #[arg(value_name = "FILE.yaml|DIR", required = true)]
    pub sources: Vec<PathBuf>,
    /// The PDF to write (one source only) [default: the source's name with .pdf]
    #[arg(long, value_name = "FILE.pdf", conflicts_with = "output_dir")]
    pub output: Option<PathBuf>,
    /// Folder for the PDFs, named after their sources; a source found in a folder keeps
    /// its subfolders below it (created as needed)
    #[arg(long, value_name = "DIR")]
    pub output_dir: Option<PathBuf>,
    #[command(flatten)]
    pub paper: PaperFlag,
    /// Replace PDFs that exist already (without it, a source whose PDF exists is refused)
    #[arg(long)]
    pub force: bool,
    /// Print a recorded plan that differs from a re-solve or no longer meets its risk
    /// points, with the discrepancy stated on the sheet (without it, such a source is refused)
    #[arg(long)]
    pub accept_recorded: bool,
}

impl From<&SheetArgs> for SheetOptions {
    fn from(args: &SheetArgs) -> Self {
        SheetOptions {
            paper: args.paper.paper.into(),
            accept_recorded: args.accept_recorded,
            overwrite: Overwrite::from_force(args.force),
        }
    }
}
