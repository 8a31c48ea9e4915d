//! `demo`: the arguments.

use std::path::PathBuf;

use clap::Args;

#[derive(Debug, Args)]
pub struct DemoArgs {
    /// Folder for the demo's plan sources, OC tables and sheets
    #[arg(long, value_name = "DIR", default_value = "lotsman-demo")]
    pub output_dir: PathBuf,
    /// Replace files of the demo that exist already in the folder (without it, the
    /// demo writes nothing when one exists)
    #[arg(long)]
    pub force: bool,
}
