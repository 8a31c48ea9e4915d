//! `compare`: the arguments, the plans they type as stages, and the risk
//! points asked for.

use std::path::PathBuf;

use clap::Args;
use lotsman::{
    ComparedPlan, Error, InputError, Model, RiskPair, RiskPoint, StagedPlan, parse_fraction,
    parse_stage,
};

use super::groups::{FormatFlag, ModelFlags, OutputFlags};
use super::qualities::Qualities;
use super::values::ReportFormatArg;

/// `compare`: two to six plans at one pair of risk points.
#[derive(Debug, Args)]
#[command(
    mut_arg("output", |a| a.value_name("chart.pdf|chart.svg").help(
        "Draw the OC, AOQ and ASN charts and the table on one page into this file \
         (PDF or SVG, by its extension), written atomically; the table still goes to stdout"
    )),
    mut_arg("model", |a| a.help(
        "Likelihood model of the plans typed with --stage [default: binomial, or \
         hypergeometric with --lot-size]"
    )),
    mut_arg("lot_size", |a| a.help(
        "Lot size N of the plans typed with --stage (gives the AOQ its (N-n)/N); \
         a plan source keeps its own"
    ))
)]
pub struct CompareArgs {
    /// Plan sources whose recorded plans to compare (a standard-indexed source by the
    /// normal-inspection plan of its first class); they come first, in the order given
    #[arg(value_name = "FILE.yaml")]
    pub sources: Vec<PathBuf>,
    /// A plan typed by its stages N:AC:RE on cumulative figures, joined by '+' for a plan
    /// of several (50:0:3+100:3:4); repeat once per plan
    #[arg(long, value_name = "N:AC:RE[+N:AC:RE..]", allow_hyphen_values = true)]
    pub stage: Vec<String>,
    #[command(flatten)]
    pub model: ModelFlags,
    /// Producer's quality (AQL), as a fraction (0.01) or a percent (1%)
    /// [default: the points of the first plan source that gives them]
    #[arg(long, value_name = "P1", requires = "rql", allow_hyphen_values = true)]
    pub aql: Option<String>,
    /// Consumer's quality (RQL), as a fraction or a percent
    #[arg(long, value_name = "P2", requires = "aql", allow_hyphen_values = true)]
    pub rql: Option<String>,
    /// Producer's risk each plan is held to at the AQL [default: 0.05]
    #[arg(long, value_name = "A", requires = "aql", allow_hyphen_values = true)]
    pub alpha: Option<String>,
    /// Consumer's risk each plan is held to at the RQL [default: 0.10]
    #[arg(long, value_name = "B", requires = "aql", allow_hyphen_values = true)]
    pub beta: Option<String>,
    /// Compare a recorded plan that differs from a re-solve or no longer meets its risk
    /// points, the discrepancy stated in the output (without it, such a source is refused)
    #[arg(long, requires = "sources")]
    pub accept_recorded: bool,
    #[command(flatten)]
    pub output: OutputFlags,
    #[command(flatten)]
    pub report: FormatFlag<ReportFormatArg>,
}

impl CompareArgs {
    /// The plans of `--stage`, each labelled with its stages as typed, under
    /// the model of `--model` and `--lot-size`.
    pub fn typed_plans(&self) -> Result<Vec<ComparedPlan>, Error> {
        if self.stage.is_empty() {
            if self.model.model.is_some() || self.model.lot_size.is_some() {
                return Err(InputError::Inconsistent(
                    "--model and --lot-size describe the plans typed with --stage; a plan source keeps its own model and lot".to_string(),
                )
                .into());
            }
            return Ok(Vec::new());
        }
        let model = Model::try_from(&self.model)?;
        let mut plans = Vec::with_capacity(self.stage.len());
        for text in &self.stage {
            let stages = text
                .split('+')
                .map(parse_stage)
                .collect::<Result<Vec<_>, _>>()?;
            let plan = StagedPlan::new(stages, &model)?;
            let label = plan
                .stages()
                .iter()
                .map(ToString::to_string)
                .collect::<Vec<_>>()
                .join("+");
            plans.push(ComparedPlan {
                label,
                plan,
                model,
                note: None,
            });
        }
        Ok(plans)
    }

    /// The risk points of `--aql`, `--alpha`, `--rql` and `--beta`, for
    /// plans under `model`; `None` when `--aql` is not given.
    pub fn risks(&self, model: &Model) -> Result<Option<RiskPair>, InputError> {
        let (Some(aql), Some(rql)) = (&self.aql, &self.rql) else {
            return Ok(None);
        };
        let qualities = Qualities::of(model.kind());
        let risk = |flag: &str, text: &Option<String>, default: &str| {
            parse_fraction(flag, text.as_deref().unwrap_or(default))
        };
        RiskPair::new(
            RiskPoint {
                quality: qualities.one("--aql", aql)?,
                risk: risk("--alpha", &self.alpha, "0.05")?,
            },
            RiskPoint {
                quality: qualities.one("--rql", rql)?,
                risk: risk("--beta", &self.beta, "0.10")?,
            },
            model,
        )
        .map(Some)
    }
}
