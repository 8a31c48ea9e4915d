//! `rectify`: the arguments, and the minimum-inspection request they make.

use clap::Args;
use lotsman::{InputError, Protection, RectifyingRequest, RiskPoint, parse_fraction};

use super::groups::{FormatFlag, OutputFlags, model_of};
use super::qualities::Qualities;
use super::values::{ModelArg, ReportFormatArg, SingleOrDoubleArg};

/// `rectify`: minimum-inspection plans for rectifying inspection.
#[derive(Debug, Args)]
#[command(group(clap::ArgGroup::new("protection").required(true).args(["ltpd", "aoql"])))]
#[command(mut_arg("output", |a| a.value_name("FILE.yaml").help(
    "Write the plan as a plan source (scheme: rectifying) to this file, atomically, for verify, sheet, evaluate and judge"
)))]
pub struct RectifyArgs {
    /// Lot size N: rejected lots are screened, so the design needs it
    #[arg(long, value_name = "N", allow_hyphen_values = true)]
    pub lot_size: String,
    /// Process average: the supplier's usual quality, as a fraction or a percent
    #[arg(long, value_name = "P", allow_hyphen_values = true)]
    pub process_average: String,
    /// Protect by the LTPD: a lot this bad is accepted with probability at most --beta
    #[arg(long, value_name = "P", allow_hyphen_values = true)]
    pub ltpd: Option<String>,
    /// Consumer's risk at the LTPD [default: 0.10]
    #[arg(
        long,
        value_name = "B",
        conflicts_with = "aoql",
        allow_hyphen_values = true
    )]
    pub beta: Option<String>,
    /// Protect by the AOQL: the average outgoing quality never exceeds this
    #[arg(long, value_name = "L", allow_hyphen_values = true)]
    pub aoql: Option<String>,
    /// Sampling scheme
    #[arg(long, value_enum, ignore_case = true, default_value = "single")]
    pub scheme: SingleOrDoubleArg,
    /// Likelihood model [default: hypergeometric, since the lot size is known]
    #[arg(long, value_enum, ignore_case = true)]
    pub model: Option<ModelArg>,
    /// Title printed above the plan, and recorded in the plan source written with --output
    #[arg(long)]
    pub title: Option<String>,
    #[command(flatten)]
    pub report: FormatFlag<ReportFormatArg>,
    #[command(flatten)]
    pub output: OutputFlags,
}

/// The flags as a validated minimum-inspection request. A PDF named for
/// `--output`, which writes the plan source, is refused before the
/// request's own checks.
impl TryFrom<&RectifyArgs> for RectifyingRequest {
    type Error = InputError;

    fn try_from(args: &RectifyArgs) -> Result<Self, InputError> {
        // The lot size is required, so the default model is hypergeometric.
        let model = model_of(args.model, Some(&args.lot_size))?;
        let qualities = Qualities::of(model.kind());
        let process_average = qualities.one("--process-average", &args.process_average)?;
        let protection = match (&args.ltpd, &args.aoql) {
            (Some(ltpd), _) => Protection::Ltpd(RiskPoint {
                quality: qualities.one("--ltpd", ltpd)?,
                risk: parse_fraction("--beta", args.beta.as_deref().unwrap_or("0.10"))?,
            }),
            (None, Some(aoql)) => Protection::Aoql(qualities.one("--aoql", aoql)?),
            (None, None) => {
                return Err(InputError::Inconsistent(
                    "give the protection: --ltpd P (with --beta B) or --aoql L".to_string(),
                ));
            }
        };
        if let Some(target) = &args.output.output
            && target
                .extension()
                .is_some_and(|e| e.eq_ignore_ascii_case("pdf"))
        {
            return Err(InputError::Inconsistent(format!(
                "--output writes the plan source, YAML, and {} names a PDF; write FILE.yaml, then print its sheet with: lotsman sheet FILE.yaml",
                target.display()
            )));
        }
        RectifyingRequest::new(model, process_average, protection, args.scheme.into())
    }
}
