//! `standard`: the arguments of a plan looked up in the standard's tables,
//! and the request they make.

use std::path::PathBuf;

use clap::{Args, ValueEnum};
use lotsman::{
    ClassRule, ConsumerPoint, InputError, InspectionLevel, MAX_LOT_SIZE, Model, Scheme, Severity,
    StandardIndex, StandardRequest, parse_classes, parse_count, parse_fraction,
};

use super::design::DescriptionFlags;
use super::groups::{FormatFlag, OutputFlags};
use super::qualities::Qualities;
use super::values::{ModelArg, ReportFormatArg};

/// `standard`: a plan from the AQL tables of MIL-STD-105E.
#[derive(Debug, Args)]
#[command(mut_arg("output", |a| a.value_name("FILE.yaml").help(
    "Write a plan source that records the index and every severity's plans to this file (atomically); lotsman verify, judge and evaluate read it"
)))]
pub struct StandardArgs {
    /// Lot size N: gives the code letter (Table I)
    #[arg(long, value_name = "N", allow_hyphen_values = true)]
    pub lot_size: String,
    /// Inspection level: I, II or III (general; II is usual), or S-1 to S-4 (special)
    #[arg(long, value_name = "LEVEL", allow_hyphen_values = true)]
    pub level: String,
    /// The AQL, one of the standard's values (1.0 is 1 percent), or one per defect class as
    /// CLASS=VALUE, repeated: --aql critical=0.065 --aql major=1.0 --aql minor=4.0
    #[arg(long, value_name = "A", required = true, allow_hyphen_values = true)]
    pub aql: Vec<String>,
    /// The severity of inspection in force
    #[arg(long, value_enum, ignore_case = true, default_value = "normal")]
    pub severity: SeverityArg,
    /// Sampling scheme
    #[arg(long, value_enum, ignore_case = true, default_value = "single")]
    pub scheme: TableSchemeArg,
    /// Likelihood model of the risks [default: binomial; poisson when an AQL is above 10]
    #[arg(long, value_enum, ignore_case = true)]
    pub model: Option<ModelArg>,
    /// Leave reduced inspection out of the switching scheme, as many contracts do
    #[arg(long)]
    pub no_reduced: bool,
    /// Classes whose plans differ in sample size all use the code letter of the largest sample
    /// (where the responsible authority designates or approves it)
    #[arg(long)]
    pub largest_sample: bool,
    /// Qualities at which to show the OC of each severity, p,p,.. as fractions or percents
    /// [default: spread over the OC curve]
    #[arg(long, value_name = "P,P,..", allow_hyphen_values = true)]
    pub at: Option<String>,
    /// A rejectable quality level to hold the table plan against, as a fraction or a percent
    #[arg(long, value_name = "P", allow_hyphen_values = true)]
    pub rql: Option<String>,
    /// Consumer's risk at the RQL [default: 0.10]
    #[arg(long, value_name = "B", requires = "rql", allow_hyphen_values = true)]
    pub beta: Option<String>,
    /// Producer's risk at the AQL for the two-point design beside the table plan [default: 0.05]
    #[arg(long, value_name = "A", requires = "rql", allow_hyphen_values = true)]
    pub alpha: Option<String>,
    /// Your own copy of a table (same columns as the built-in CSV files) in place of the built-in
    /// one; a table of plans stands for the severity in force, or the one named:
    /// --table reduced=mine-2c.csv; repeat for several tables
    #[arg(long, value_name = "[SEVERITY=]FILE.csv")]
    pub table: Vec<String>,
    /// Title recorded in the plan source written with --output
    #[arg(long, requires = "output")]
    pub title: Option<String>,
    #[command(flatten)]
    pub description: DescriptionFlags,
    #[command(flatten)]
    pub output: OutputFlags,
    #[command(flatten)]
    pub report: FormatFlag<ReportFormatArg>,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum SeverityArg {
    Normal,
    Tightened,
    Reduced,
}

impl From<SeverityArg> for Severity {
    fn from(arg: SeverityArg) -> Self {
        match arg {
            SeverityArg::Normal => Severity::Normal,
            SeverityArg::Tightened => Severity::Tightened,
            SeverityArg::Reduced => Severity::Reduced,
        }
    }
}

/// The schemes the standard's tables hold.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum TableSchemeArg {
    Single,
    Double,
    Multiple,
}

impl From<TableSchemeArg> for Scheme {
    fn from(arg: TableSchemeArg) -> Self {
        match arg {
            TableSchemeArg::Single => Scheme::Single,
            TableSchemeArg::Double => Scheme::Double,
            TableSchemeArg::Multiple => Scheme::Multiple,
        }
    }
}

/// The flags as a checked request.
impl TryFrom<&StandardArgs> for StandardRequest {
    type Error = lotsman::Error;

    fn try_from(args: &StandardArgs) -> Result<Self, lotsman::Error> {
        let lot_size = parse_count("--lot-size", &args.lot_size, MAX_LOT_SIZE)?;
        let level = InspectionLevel::parse(&args.level)?;
        let texts: Vec<&str> = args.aql.iter().map(String::as_str).collect();
        let classes = parse_classes(&texts)?;
        let kind = match args.model {
            Some(m) => m.into(),
            None => StandardRequest::default_model(&classes),
        };
        let lot = (kind == lotsman::ModelKind::Hypergeometric).then_some(lot_size);
        let model = Model::new(kind, lot)?;
        let index = StandardIndex {
            lot_size,
            level,
            classes,
            severity: args.severity.into(),
            scheme: args.scheme.into(),
            reduced: !args.no_reduced,
            rule: if args.largest_sample {
                ClassRule::LargestSample
            } else {
                ClassRule::OwnPlans
            },
        };
        Ok(StandardRequest::new(index, model)?)
    }
}

impl StandardArgs {
    /// The qualities of `--at`, if given.
    pub fn at(&self, request: &StandardRequest) -> Result<Option<Vec<f64>>, InputError> {
        self.at
            .as_deref()
            .map(|t| Qualities::of(request.model().kind()).list("--at", t))
            .transpose()
    }

    /// The consumer's point of `--rql` and `--beta`, with `--alpha` for
    /// the two-point design.
    pub fn consumer(&self, request: &StandardRequest) -> Result<Option<ConsumerPoint>, InputError> {
        let Some(rql) = &self.rql else {
            return Ok(None);
        };
        Ok(Some(ConsumerPoint {
            rql: Qualities::of(request.model().kind()).one("--rql", rql)?,
            beta: parse_fraction("--beta", self.beta.as_deref().unwrap_or("0.10"))?,
            alpha: parse_fraction("--alpha", self.alpha.as_deref().unwrap_or("0.05"))?,
        }))
    }
}

/// A `--table` value: the severity it names (or the one in force) and the
/// file.
pub fn table_of(text: &str, in_force: Severity) -> (Severity, PathBuf) {
    for (name, severity) in [
        ("normal=", Severity::Normal),
        ("tightened=", Severity::Tightened),
        ("reduced=", Severity::Reduced),
    ] {
        if let Some(file) = text.strip_prefix(name) {
            return (severity, PathBuf::from(file));
        }
    }
    (in_force, PathBuf::from(text))
}
