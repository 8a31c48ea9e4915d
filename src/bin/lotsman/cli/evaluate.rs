//! `evaluate`: the arguments, the plan they give by its numbers, and the
//! qualities asked for.

use std::path::PathBuf;

use clap::Args;
use lotsman::{Error, InputError, Model, ModelKind, StagedPlan, parse_count, parse_stage};

use super::groups::{FormatFlag, ModelFlags};
use super::qualities::Qualities;
use super::values::ReportFormatArg;

#[derive(Debug, Args)]
pub struct EvaluateArgs {
    /// Plan sources whose recorded plans to evaluate, or folders of them
    /// (searched through subfolders for *.yaml and *.yml)
    #[arg(value_name = "FILE.yaml|DIR", conflicts_with_all = ["n", "c", "stage", "model"])]
    pub sources: Vec<PathBuf>,
    /// Sample size of a single plan
    #[arg(
        long,
        requires = "c",
        conflicts_with = "stage",
        allow_hyphen_values = true
    )]
    pub n: Option<String>,
    /// Acceptance number of a single plan
    #[arg(long, requires = "n", allow_hyphen_values = true)]
    pub c: Option<String>,
    /// A stage N:AC:RE on cumulative figures (AC may be '-' for no acceptance); repeat per stage
    #[arg(long, value_name = "N:AC:RE", allow_hyphen_values = true)]
    pub stage: Vec<String>,
    #[command(flatten)]
    pub model: ModelFlags,
    /// Qualities to evaluate at, comma-separated (1%,2.5%,0.04)
    #[arg(long, value_name = "P,P,..", allow_hyphen_values = true)]
    pub at: Option<String>,
    /// Evenly spaced qualities LO:HI:COUNT (0.5%:8%:50)
    #[arg(long, value_name = "LO:HI:COUNT", allow_hyphen_values = true)]
    pub range: Option<String>,
    /// Evaluate a recorded plan that differs from a re-solve or no longer meets its risk
    /// points, the discrepancy stated in the output (without it, such a source is refused)
    #[arg(long, requires = "sources")]
    pub accept_recorded: bool,
    /// JSON only: add decided_at, the probability that a lot is decided at each stage
    /// (one number per stage and quality)
    #[arg(long)]
    pub decided_at: bool,
    #[command(flatten)]
    pub report: FormatFlag<ReportFormatArg>,
}

impl EvaluateArgs {
    /// The plan of `--n --c` or `--stage`, for `model`.
    pub fn plan(&self, model: &Model) -> Result<StagedPlan, Error> {
        match (&self.n, &self.c) {
            (Some(n), Some(c)) => Ok(StagedPlan::single(
                parse_count("--n", n, u64::MAX)?,
                parse_count("--c", c, u64::MAX)?,
                model,
            )?),
            _ if !self.stage.is_empty() => {
                let stages = self
                    .stage
                    .iter()
                    .map(|s| parse_stage(s))
                    .collect::<Result<Vec<_>, _>>()?;
                Ok(StagedPlan::new(stages, model)?)
            }
            _ => Err(InputError::Inconsistent(
                "give a plan: FILE.yaml, or --n N --c C, or --stage N:AC:RE (repeated)".to_string(),
            )
            .into()),
        }
    }

    /// The qualities of `--at` and `--range`, in that order, for plans
    /// whose models are `kinds`.
    pub fn qualities(
        &self,
        kinds: impl IntoIterator<Item = ModelKind>,
    ) -> Result<Vec<f64>, InputError> {
        let parser = Qualities::of_any(kinds);
        let mut qualities = Vec::new();
        if let Some(list) = &self.at {
            qualities.extend(parser.list("--at", list)?);
        }
        if let Some(range) = &self.range {
            qualities.extend(parser.range("--range", range)?);
        }
        Ok(qualities)
    }
}
