//! `design`: the arguments, and the validated request they make when no
//! plan source is given: attributes ([`DesignRequest`]) or variables
//! ([`VariablesRequest`]).

use std::path::PathBuf;

use clap::{Args, ValueEnum};
use lotsman::{
    Description, DesignRequest, InputError, LimitKind, Model, Nearby, RiskPair, RiskPoint, Scheme,
    SchemeOptions, SigmaKind, Specification, Steps, VariablesRequest, parse_count, parse_fraction,
    parse_number,
};

use super::groups::{FormatFlag, ModelFlags, OutputFlags, RiskFlags};
use super::qualities::Qualities;
use super::values::{CriterionArg, criterion_of};

#[derive(Debug, Args)]
#[command(
    mut_arg("aql", |a| a.required_unless_present("source")),
    mut_arg("rql", |a| a.required_unless_present("source")),
    mut_arg("format", |a| a.help("Output format on stdout")),
    mut_arg("output", |a| a.value_name("FILE.yaml").help(
        "Write the solved plan source to this file (atomically; never over the source read)"
    )),
)]
pub struct DesignArgs {
    /// A plan source to solve instead of the flags below
    #[arg(value_name = "FILE.yaml", conflicts_with_all = ["aql", "rql", "alpha", "beta", "model", "lot_size", "title", "scheme", "criterion", "second_ratio", "stage_count", "sigma", "limit", "sigma_value", "lower", "upper", "unit", "id", "revision", "date", "item", "characteristic", "prepared_by", "approved_by"])]
    pub source: Option<PathBuf>,
    #[command(flatten)]
    pub risks: RiskFlags,
    #[command(flatten)]
    pub model: ModelFlags,
    /// Sampling scheme
    #[arg(long, value_enum, ignore_case = true, default_value = "single")]
    pub scheme: SchemeArg,
    /// Single plans: which nearby plans the report lists (table, JSON and CSV alike)
    #[arg(long, value_enum, ignore_case = true, default_value = "window")]
    pub nearby: NearbyArg,
    /// What a double or multiple plan minimises [default: asn-aql]
    #[arg(long, value_enum, ignore_case = true)]
    pub criterion: Option<CriterionArg>,
    /// Double plans: fix the second sample at R times the first (n2 = R n1)
    #[arg(long, value_name = "R", allow_hyphen_values = true)]
    pub second_ratio: Option<String>,
    /// Multiple plans: number of equal stages, 2 to 7 [default: 7]
    #[arg(long, value_name = "K", allow_hyphen_values = true)]
    pub stage_count: Option<String>,
    #[command(flatten)]
    pub variables: VariablesFlags,
    /// Title recorded in the plan source written with --output
    #[arg(long)]
    pub title: Option<String>,
    #[command(flatten)]
    pub description: DescriptionFlags,
    #[command(flatten)]
    pub steps: StepFlags,
    #[command(flatten)]
    pub format: FormatFlag<DesignFormat>,
    #[command(flatten)]
    pub output: OutputFlags,
    /// Re-solve the plan source FILE.yaml and replace it with the solved source (atomically)
    #[arg(long, conflicts_with = "output")]
    pub in_place: bool,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum SchemeArg {
    Single,
    Double,
    Multiple,
    Sequential,
    /// Measurements against specification limits (normal model)
    Variables,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum NearbyArg {
    /// The acceptance numbers from eight below the chosen one to three past it
    Window,
    /// Every acceptance number from 0 to three past the chosen one (at close points in a large lot, thousands)
    All,
}

impl From<NearbyArg> for Nearby {
    fn from(arg: NearbyArg) -> Self {
        match arg {
            NearbyArg::Window => Nearby::Window,
            NearbyArg::All => Nearby::All,
        }
    }
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum DesignFormat {
    Table,
    Json,
    Yaml,
}

/// The specification of a variables plan.
#[derive(Debug, Args)]
pub struct VariablesFlags {
    /// Variables plans: is the process sigma known or estimated by s
    #[arg(long, value_enum, ignore_case = true)]
    pub sigma: Option<SigmaArg>,
    /// Variables plans: which specification limits
    #[arg(long, value_enum, ignore_case = true)]
    pub limit: Option<LimitArg>,
    /// Variables plans, sigma known: its value, in the unit of the measurements
    #[arg(long, value_name = "S", allow_hyphen_values = true)]
    pub sigma_value: Option<String>,
    /// Variables plans: lower specification limit L
    #[arg(long, value_name = "L", allow_hyphen_values = true)]
    pub lower: Option<String>,
    /// Variables plans: upper specification limit U
    #[arg(long, value_name = "U", allow_hyphen_values = true)]
    pub upper: Option<String>,
    /// Variables plans: unit of the measurements, for the sheet (mm, ohm, g)
    #[arg(long)]
    pub unit: Option<String>,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum SigmaArg {
    /// Sigma known from the process record (give --sigma-value)
    Known,
    /// Sigma estimated from each sample by s
    Unknown,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum LimitArg {
    Lower,
    Upper,
    Both,
}

/// The document fields recorded in the plan source for its sheet.
#[derive(Debug, Default, Args)]
pub struct DescriptionFlags {
    /// Plan identifier (document number), recorded as `id` for the sheet
    #[arg(long, value_name = "TEXT")]
    pub id: Option<String>,
    /// Revision of the plan document, recorded as `revision`
    #[arg(long, value_name = "TEXT")]
    pub revision: Option<String>,
    /// Date of the revision, YYYY-MM-DD, recorded as `date`
    #[arg(long, value_name = "YYYY-MM-DD")]
    pub date: Option<String>,
    /// The item inspected (part name, number, drawing revision), recorded as `item`
    #[arg(long, value_name = "TEXT")]
    pub item: Option<String>,
    /// What is checked and what makes a unit nonconforming, recorded as `characteristic`
    #[arg(long, value_name = "TEXT")]
    pub characteristic: Option<String>,
    /// Who prepared the plan (name, function), recorded as `prepared_by`
    #[arg(long, value_name = "TEXT")]
    pub prepared_by: Option<String>,
    /// Who approved the plan (name, function), recorded as `approved_by`
    #[arg(long, value_name = "TEXT")]
    pub approved_by: Option<String>,
}

impl From<&DescriptionFlags> for Description {
    fn from(flags: &DescriptionFlags) -> Self {
        Description {
            id: flags.id.clone(),
            revision: flags.revision.clone(),
            date: flags.date.clone(),
            item: flags.item.clone(),
            characteristic: flags.characteristic.clone(),
            prepared_by: flags.prepared_by.clone(),
            approved_by: flags.approved_by.clone(),
        }
    }
}

/// The steps of the sensitivity table.
#[derive(Debug, Args)]
pub struct StepFlags {
    /// Sensitivity: the step by which the AQL moves [default: 1-2-5 step near a fifth of it]
    #[arg(long, value_name = "P", allow_hyphen_values = true)]
    pub step_aql: Option<String>,
    /// Sensitivity: the step by which alpha moves [default: as --step-aql]
    #[arg(long, value_name = "A", allow_hyphen_values = true)]
    pub step_alpha: Option<String>,
    /// Sensitivity: the step by which the RQL moves [default: as --step-aql]
    #[arg(long, value_name = "P", allow_hyphen_values = true)]
    pub step_rql: Option<String>,
    /// Sensitivity: the step by which beta moves [default: as --step-aql]
    #[arg(long, value_name = "B", allow_hyphen_values = true)]
    pub step_beta: Option<String>,
}

impl StepFlags {
    /// The steps by which the sensitivity table moves each of `risks`.
    pub fn steps(&self, risks: &RiskPair) -> Result<Steps, InputError> {
        let step = |flag: &str, text: &Option<String>| {
            text.as_deref().map(|t| parse_fraction(flag, t)).transpose()
        };
        Steps::new(
            risks,
            [
                step("--step-aql", &self.step_aql)?,
                step("--step-alpha", &self.step_alpha)?,
                step("--step-rql", &self.step_rql)?,
                step("--step-beta", &self.step_beta)?,
            ],
        )
    }
}

impl DesignArgs {
    /// The title of a plan designed from the flags.
    pub fn title(&self) -> String {
        self.title
            .clone()
            .unwrap_or_else(|| "Untitled plan".to_string())
    }

    /// The risk points of `--aql`, `--alpha`, `--rql`, `--beta` for `model`.
    fn risks(&self, model: &Model) -> Result<RiskPair, InputError> {
        let qualities = Qualities::of(model.kind());
        let flags = &self.risks;
        let point = |q: &Option<String>, q_name: &str, r: &str, r_name: &str| {
            Ok::<_, InputError>(RiskPoint {
                quality: qualities.one(q_name, q.as_deref().unwrap_or(""))?,
                risk: parse_fraction(r_name, r)?,
            })
        };
        RiskPair::new(
            point(&flags.aql, "--aql", &flags.alpha, "--alpha")?,
            point(&flags.rql, "--rql", &flags.beta, "--beta")?,
            model,
        )
    }

    /// The first of `flags` that was given, refused with `why` it does
    /// not belong.
    fn refuse_given(
        flags: &[(&str, bool)],
        why: impl Fn(&str) -> String,
    ) -> Result<(), InputError> {
        match flags.iter().find(|(_, given)| *given) {
            Some((flag, _)) => Err(InputError::Inconsistent(why(flag))),
            None => Ok(()),
        }
    }
}

/// An attributes request from the flags; the variables flags are a
/// mistake to report.
impl TryFrom<&DesignArgs> for DesignRequest {
    type Error = InputError;

    fn try_from(args: &DesignArgs) -> Result<Self, InputError> {
        let v = &args.variables;
        DesignArgs::refuse_given(
            &[
                ("--sigma", v.sigma.is_some()),
                ("--limit", v.limit.is_some()),
                ("--sigma-value", v.sigma_value.is_some()),
                ("--lower", v.lower.is_some()),
                ("--upper", v.upper.is_some()),
                ("--unit", v.unit.is_some()),
            ],
            |flag| format!("{flag} applies to variables plans (--scheme variables)"),
        )?;
        let model = Model::try_from(&args.model)?;
        let risks = args.risks(&model)?;
        let scheme = match args.scheme {
            SchemeArg::Single => Scheme::Single,
            SchemeArg::Double => Scheme::Double,
            SchemeArg::Multiple => Scheme::Multiple,
            SchemeArg::Sequential => Scheme::Sequential,
            SchemeArg::Variables => Scheme::Variables,
        };
        let defaults = SchemeOptions::default();
        let options = SchemeOptions {
            criterion: criterion_of(args.criterion),
            second_ratio: args
                .second_ratio
                .as_deref()
                .map(|t| parse_number("--second-ratio", t))
                .transpose()?,
            stages: match &args.stage_count {
                Some(t) => u32::try_from(parse_count("--stage-count", t, 7)?).unwrap_or(7),
                None => defaults.stages,
            },
        };
        if args.criterion.is_some() && !matches!(scheme, Scheme::Double | Scheme::Multiple) {
            return Err(InputError::Inconsistent(format!(
                "--criterion applies to double and multiple plans, not to a {scheme} plan"
            )));
        }
        if args.stage_count.is_some() && scheme != Scheme::Multiple {
            return Err(InputError::Inconsistent(format!(
                "--stage-count applies to multiple plans, not to a {scheme} plan"
            )));
        }
        options.check(scheme)?;
        Ok(DesignRequest {
            scheme,
            options,
            model,
            risks,
        })
    }
}

/// A variables request from the flags: `--sigma` and `--limit` are
/// required, the attribute settings refused.
impl TryFrom<&DesignArgs> for VariablesRequest {
    type Error = InputError;

    fn try_from(args: &DesignArgs) -> Result<Self, InputError> {
        DesignArgs::refuse_given(
            &[
                ("--criterion", args.criterion.is_some()),
                ("--second-ratio", args.second_ratio.is_some()),
                ("--stage-count", args.stage_count.is_some()),
            ],
            |flag| format!("{flag} is an attributes setting; a variables plan does not take it"),
        )?;
        let v = &args.variables;
        let sigma = match v.sigma {
            Some(SigmaArg::Known) => SigmaKind::Known,
            Some(SigmaArg::Unknown) => SigmaKind::Unknown,
            None => {
                return Err(InputError::Inconsistent(
                    "--scheme variables needs --sigma known (with --sigma-value S) or --sigma unknown"
                        .to_string(),
                ));
            }
        };
        let limit = match v.limit {
            Some(LimitArg::Lower) => LimitKind::Lower,
            Some(LimitArg::Upper) => LimitKind::Upper,
            Some(LimitArg::Both) => LimitKind::Both,
            None => {
                return Err(InputError::Inconsistent(
                    "--scheme variables needs --limit lower (with --lower L), upper (with --upper U) or both".to_string(),
                ));
            }
        };
        let number = |flag: &str, value: &Option<String>| {
            value.as_deref().map(|t| parse_number(flag, t)).transpose()
        };
        let spec = Specification::new(
            sigma,
            number("--sigma-value", &v.sigma_value)?,
            limit,
            number("--lower", &v.lower)?,
            number("--upper", &v.upper)?,
        )?;
        let model = Model::try_from(&args.model)?;
        let risks = args.risks(&model)?;
        VariablesRequest::new(spec, risks, model)
    }
}
