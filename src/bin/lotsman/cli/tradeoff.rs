//! `tradeoff`: the arguments, and the grid they ask for.

use clap::{Args, ValueEnum};
use lotsman::{InputError, Model, RiskGrid, Scheme, TradeoffRequest, parse_fraction, parse_number};

use super::groups::{FormatFlag, ModelFlags, OutputFlags, PaperFlag, RiskFlags};
use super::qualities::Qualities;
use super::values::{CriterionArg, SingleOrDoubleArg, criterion_of};

/// The risk flags give the grid: each quality an axis, each risk the same
/// in every cell.
#[derive(Debug, Args)]
#[command(
    mut_arg("aql", |a| a.required(true).value_name("LO:HI:COUNT").help(
        "Producer's qualities, one row each: LO:HI:COUNT (0.2%:2%:10) or a list (0.5%,1%,1.5%)"
    )),
    mut_arg("alpha", |a| a.help("Producer's risk in every cell")),
    mut_arg("rql", |a| a.required(true).value_name("LO:HI:COUNT").help(
        "Consumer's qualities, one column each: LO:HI:COUNT (3%:12%:10) or a list"
    )),
    mut_arg("beta", |a| a.help("Consumer's risk in every cell")),
    mut_arg("output", |a| a.value_name("FILE").help(
        "Write the output to this file (atomically) instead of stdout; required for pdf"
    )),
    mut_arg("paper", |a| a.help("Paper size of the pdf heat map (printed landscape)")),
)]
pub struct TradeoffArgs {
    #[command(flatten)]
    pub risks: RiskFlags,
    #[command(flatten)]
    pub model: ModelFlags,
    /// Sampling scheme of every cell
    #[arg(long, value_enum, ignore_case = true, default_value = "single")]
    pub scheme: SingleOrDoubleArg,
    /// What the double designer minimises [default: asn-aql]
    #[arg(long, value_enum, ignore_case = true)]
    pub criterion: Option<CriterionArg>,
    /// Cost of inspecting one unit: adds the expected inspection cost per lot (needs --lot-size)
    #[arg(
        long,
        value_name = "X",
        requires = "process_average",
        allow_hyphen_values = true
    )]
    pub cost_per_unit: Option<String>,
    /// Process average: the supplier's usual quality, at which the cost is taken (ATI there)
    // `--process-quality`, the flag's first name, is still read (hidden),
    // so that scripts written for it keep working.
    #[arg(
        long,
        value_name = "P",
        alias = "process-quality",
        requires = "cost_per_unit",
        allow_hyphen_values = true
    )]
    pub process_average: Option<String>,
    /// Title printed above the grid
    #[arg(long)]
    pub title: Option<String>,
    #[command(flatten)]
    pub report: FormatFlag<TradeoffFormat>,
    #[command(flatten)]
    pub output: OutputFlags,
    #[command(flatten)]
    pub paper: PaperFlag,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum TradeoffFormat {
    Table,
    Json,
    Csv,
    /// A heat map of the grid with labelled contours (needs --output FILE.pdf)
    Pdf,
}

/// The grid of the flags, with the cost of inspection when asked for.
impl TryFrom<&TradeoffArgs> for TradeoffRequest {
    type Error = InputError;

    fn try_from(args: &TradeoffArgs) -> Result<Self, InputError> {
        let model = Model::try_from(&args.model)?;
        let qualities = Qualities::of(model.kind());
        let scheme = Scheme::from(args.scheme);
        if args.criterion.is_some() && scheme != Scheme::Double {
            return Err(InputError::Inconsistent(
                "--criterion applies to double plans (--scheme double)".to_string(),
            ));
        }
        let cost = match (&args.cost_per_unit, &args.process_average) {
            (Some(k), Some(p)) => Some((
                parse_number("--cost-per-unit", k)?,
                qualities.one("--process-average", p)?,
            )),
            _ => None,
        };
        let risks = &args.risks;
        let axis =
            |flag: &str, text: &Option<String>| qualities.axis(flag, text.as_deref().unwrap_or(""));
        TradeoffRequest::new(
            RiskGrid {
                aql: axis("--aql", &risks.aql)?,
                rql: axis("--rql", &risks.rql)?,
                alpha: parse_fraction("--alpha", &risks.alpha)?,
                beta: parse_fraction("--beta", &risks.beta)?,
            },
            model,
            scheme,
            criterion_of(args.criterion),
            cost,
        )
    }
}
