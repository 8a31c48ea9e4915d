//! The argument groups several commands share, flattened into each
//! (`#[command(flatten)]`) where its flags stand in that command's help.
//! A command that words a shared flag for its own use says so with
//! `mut_arg` on its arguments; the name, value and default stay here.

use std::path::PathBuf;

use clap::{Args, ValueEnum};
use lotsman::{InputError, MAX_LOT_SIZE, Model, ModelKind, Overwrite, parse_count};

use super::values::{ModelArg, PaperArg};

/// The two risk points: the producer's quality and risk (`--aql`,
/// `--alpha`) and the consumer's (`--rql`, `--beta`). `design` needs the
/// qualities unless it solves a plan source; `tradeoff` requires them and
/// reads each as an axis of its grid.
#[derive(Debug, Args)]
pub struct RiskFlags {
    /// Producer's quality p1 (AQL), as a fraction (0.01) or a percent (1%)
    #[arg(long, value_name = "P1", allow_hyphen_values = true)]
    pub aql: Option<String>,
    /// Producer's risk: largest probability of rejecting a lot at the AQL
    #[arg(
        long,
        value_name = "A",
        default_value = "0.05",
        allow_hyphen_values = true
    )]
    pub alpha: String,
    /// Consumer's quality p2 (RQL, LTPD), as a fraction or a percent
    #[arg(long, value_name = "P2", allow_hyphen_values = true)]
    pub rql: Option<String>,
    /// Consumer's risk: largest probability of accepting a lot at the RQL
    #[arg(
        long,
        value_name = "B",
        default_value = "0.10",
        allow_hyphen_values = true
    )]
    pub beta: String,
}

/// The inputs that describe the lot and the model.
#[derive(Debug, Args)]
pub struct ModelFlags {
    /// Likelihood model [default: binomial, or hypergeometric with --lot-size]
    #[arg(long, value_enum, ignore_case = true)]
    pub model: Option<ModelArg>,
    /// Lot size N (required by the hypergeometric model; gives ATI and AOQ's (N-n)/N); beside a
    /// plan source, the lot of a source that gives none
    #[arg(long, value_name = "N", allow_hyphen_values = true)]
    pub lot_size: Option<String>,
}

impl ModelFlags {
    /// The lot size of `--lot-size`, if given.
    pub fn lot(&self) -> Result<Option<u64>, InputError> {
        lot_of(self.lot_size.as_deref())
    }
}

/// The model from `--model` and `--lot-size`: binomial by default, the
/// hypergeometric model when a lot size is given without a model.
impl TryFrom<&ModelFlags> for Model {
    type Error = InputError;

    fn try_from(flags: &ModelFlags) -> Result<Self, InputError> {
        model_of(flags.model, flags.lot_size.as_deref())
    }
}

/// The model of `--model` and `--lot-size`: hypergeometric by default when
/// the lot size is given, binomial otherwise.
pub fn model_of(model: Option<ModelArg>, lot_size: Option<&str>) -> Result<Model, InputError> {
    let lot = lot_of(lot_size)?;
    let kind = match (model, lot) {
        (Some(kind), _) => kind.into(),
        (None, Some(_)) => ModelKind::Hypergeometric,
        (None, None) => ModelKind::Binomial,
    };
    Model::new(kind, lot)
}

/// The lot size of `--lot-size`.
fn lot_of(text: Option<&str>) -> Result<Option<u64>, InputError> {
    text.map(|t| parse_count("--lot-size", t, MAX_LOT_SIZE))
        .transpose()
}

/// A file to write besides stdout, and whether it may replace one. Each
/// command words `--output` for what it writes (`mut_arg`).
#[derive(Debug, Args)]
pub struct OutputFlags {
    #[arg(long)]
    pub output: Option<PathBuf>,
    /// Let --output replace a file that exists already
    #[arg(long, requires = "output")]
    pub force: bool,
}

impl OutputFlags {
    /// What `--force` allows the writer.
    pub fn overwrite(&self) -> Overwrite {
        Overwrite::from_force(self.force)
    }
}

/// The paper of a PDF.
#[derive(Debug, Args)]
pub struct PaperFlag {
    /// Paper size
    #[arg(long, value_enum, ignore_case = true, default_value = "a4")]
    pub paper: PaperArg,
}

/// The format of what a command prints, among the formats `F` it offers,
/// a table by default.
#[derive(Debug, Args)]
pub struct FormatFlag<F: ValueEnum + Clone + Send + Sync + 'static> {
    /// Output format
    #[arg(long, value_enum, ignore_case = true, default_value = "table")]
    pub format: F,
}
