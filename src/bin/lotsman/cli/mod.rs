//! The command line, as clap derive structs. Only parsing lives here: every
//! value is text or a plain number until `main` converts it into a
//! validated library request.

use std::path::PathBuf;

use clap::{Args, Parser, Subcommand, ValueEnum};

/// Acceptance-sampling plans from two risk points.
#[derive(Debug, Parser)]
#[command(name = "lotsman", version, about, long_about = None, max_term_width = 100)]
pub struct Cli {
    #[command(subcommand)]
    pub command: Command,
}

impl Cli {
    /// The names of the commands, in the order of `--help`.
    pub fn command_names() -> Vec<String> {
        use clap::CommandFactory;
        Cli::command()
            .get_subcommands()
            .map(|c| c.get_name().to_string())
            .collect()
    }
}

#[derive(Debug, Subcommand)]
pub enum Command {
    /// Design the smallest plan that meets both risk points.
    Design(Box<DesignArgs>),
    /// Evaluate a plan: OC, AOQ, ATI and ASN at chosen qualities, AOQL.
    Evaluate(EvaluateArgs),
    /// Re-solve plan sources and compare with the plans they record.
    Verify(VerifyArgs),
    /// Decide a lot from the counts found: accept, reject, or go on.
    Judge(JudgeArgs),
    /// Print the plan sheet (PDF) of each plan source.
    Sheet(SheetArgs),
    /// Solve a grid of risk points: the plan, and its inspection cost, for
    /// each AQL and RQL.
    Tradeoff(TradeoffArgs),
    /// Print a commented plan-source template.
    New(NewArgs),
    /// Run the whole job on the demo plans of the invented scenario.
    Demo(DemoArgs),
    /// Design the plan with the least average total inspection at the process
    /// average (rectifying inspection, Dodge and Romig's method).
    Rectify(RectifyArgs),
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum ModelArg {
    Binomial,
    Hypergeometric,
    Poisson,
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

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum CriterionArg {
    /// ASN at the AQL
    #[value(name = "asn-aql")]
    Aql,
    /// ASN at the RQL
    #[value(name = "asn-rql")]
    Rql,
    /// Largest ASN over all qualities (double plans)
    #[value(name = "asn-max")]
    Max,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum DesignFormat {
    Table,
    Json,
    Yaml,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum ReportFormatArg {
    Table,
    Json,
    Csv,
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

#[derive(Debug, Args)]
pub struct DesignArgs {
    /// A plan source to solve instead of the flags below
    #[arg(value_name = "FILE.yaml", conflicts_with_all = ["aql", "rql", "alpha", "beta", "model", "lot_size", "title", "scheme", "criterion", "second_ratio", "stage_count", "sigma", "limit", "sigma_value", "lower", "upper", "unit", "id", "revision", "date", "item", "characteristic", "prepared_by", "approved_by"])]
    pub source: Option<PathBuf>,
    /// Producer's quality p1 (AQL), as a fraction (0.01) or a percent (1%)
    #[arg(
        long,
        value_name = "P1",
        required_unless_present = "source",
        allow_hyphen_values = true
    )]
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
    #[arg(
        long,
        value_name = "P2",
        required_unless_present = "source",
        allow_hyphen_values = true
    )]
    pub rql: Option<String>,
    /// Consumer's risk: largest probability of accepting a lot at the RQL
    #[arg(
        long,
        value_name = "B",
        default_value = "0.10",
        allow_hyphen_values = true
    )]
    pub beta: String,
    #[command(flatten)]
    pub model: ModelFlags,
    /// Sampling scheme
    #[arg(long, value_enum, ignore_case = true, default_value = "single")]
    pub scheme: SchemeArg,
    /// What a double or multiple plan minimises [default: asn-aql]
    #[arg(long, value_enum, ignore_case = true)]
    pub criterion: Option<CriterionArg>,
    /// Double plans: fix the second sample at R times the first (n2 = R n1)
    #[arg(long, value_name = "R", allow_hyphen_values = true)]
    pub second_ratio: Option<String>,
    /// Multiple plans: number of equal stages, 2 to 7 [default: 7]
    #[arg(long, value_name = "K", allow_hyphen_values = true)]
    pub stage_count: Option<String>,
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
    /// Title recorded in the plan source written with --output
    #[arg(long)]
    pub title: Option<String>,
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
    /// Output format on stdout
    #[arg(long, value_enum, ignore_case = true, default_value = "table")]
    pub format: DesignFormat,
    /// Write the solved plan source to this file (atomically; never over the source read)
    #[arg(long, value_name = "FILE.yaml")]
    pub output: Option<PathBuf>,
    /// Let --output replace a file that exists already
    #[arg(long, requires = "output")]
    pub force: bool,
    /// Re-solve the plan source FILE.yaml and replace it with the solved source (atomically)
    #[arg(long, conflicts_with = "output")]
    pub in_place: bool,
}

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
    /// Output format
    #[arg(long, value_enum, ignore_case = true, default_value = "table")]
    pub format: ReportFormatArg,
}

#[derive(Debug, Args)]
pub struct VerifyArgs {
    /// Plan sources to verify, or folders of them (searched through subfolders
    /// for *.yaml and *.yml)
    #[arg(value_name = "FILE.yaml|DIR", required = true)]
    pub sources: Vec<PathBuf>,
    /// A sheet to check against its source's hash; repeat once per source, in order
    /// (sources named one by one, not folders)
    #[arg(long, value_name = "FILE.pdf")]
    pub sheet: Vec<PathBuf>,
    /// Table format: list every source, not only the failures
    #[arg(long)]
    pub list: bool,
    /// Output format
    #[arg(long, value_enum, ignore_case = true, default_value = "table")]
    pub format: ReportFormatArg,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum JudgeFormat {
    /// The decision in words (`text`, its earlier name, is still read)
    #[value(alias = "text")]
    Table,
    Json,
}

#[derive(Debug, Args)]
pub struct JudgeArgs {
    /// The plan source whose recorded plan decides
    #[arg(value_name = "FILE.yaml")]
    pub source: PathBuf,
    /// Count found in each stage's new units, in order (repeat per stage); with
    /// --inspected, the one cumulative count so far
    #[arg(
        long,
        value_name = "K",
        required_unless_present = "measurements",
        conflicts_with = "measurements",
        allow_hyphen_values = true
    )]
    pub found: Vec<String>,
    /// Variables plans: the sample's measurements, a CSV file with one value per row
    /// (or a header row and --column)
    #[arg(long, value_name = "FILE.csv")]
    pub measurements: Option<PathBuf>,
    /// The CSV column that holds the measurements, by its header name
    #[arg(long, value_name = "NAME", requires = "measurements")]
    pub column: Option<String>,
    /// Units inspected so far, for one cumulative --found count (item-by-item plans)
    #[arg(long, value_name = "N", allow_hyphen_values = true)]
    pub inspected: Option<String>,
    /// Decide by a recorded plan that differs from a re-solve or no longer meets its risk
    /// points, the discrepancy stated beside the decision (without it, such a source is refused)
    #[arg(long)]
    pub accept_recorded: bool,
    /// Output format
    #[arg(long, value_enum, ignore_case = true, default_value = "table")]
    pub format: JudgeFormat,
}

/// The schemes of the grid and of minimum-inspection plans.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum SingleOrDoubleArg {
    Single,
    Double,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum TradeoffFormat {
    Table,
    Json,
    Csv,
    /// A heat map of the grid with labelled contours (needs --output FILE.pdf)
    Pdf,
}

#[derive(Debug, Args)]
pub struct TradeoffArgs {
    /// Producer's qualities, one row each: LO:HI:COUNT (0.2%:2%:10) or a list (0.5%,1%,1.5%)
    #[arg(long, value_name = "LO:HI:COUNT", allow_hyphen_values = true)]
    pub aql: String,
    /// Producer's risk in every cell
    #[arg(
        long,
        value_name = "A",
        default_value = "0.05",
        allow_hyphen_values = true
    )]
    pub alpha: String,
    /// Consumer's qualities, one column each: LO:HI:COUNT (3%:12%:10) or a list
    #[arg(long, value_name = "LO:HI:COUNT", allow_hyphen_values = true)]
    pub rql: String,
    /// Consumer's risk in every cell
    #[arg(
        long,
        value_name = "B",
        default_value = "0.10",
        allow_hyphen_values = true
    )]
    pub beta: String,
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
    /// Output format
    #[arg(long, value_enum, ignore_case = true, default_value = "table")]
    pub format: TradeoffFormat,
    /// Write the output to this file (atomically) instead of stdout; required for pdf
    #[arg(long, value_name = "FILE")]
    pub output: Option<PathBuf>,
    /// Let --output replace a file that exists already
    #[arg(long, requires = "output")]
    pub force: bool,
    /// Paper size of the pdf heat map (printed landscape)
    #[arg(long, value_enum, ignore_case = true, default_value = "a4")]
    pub paper: PaperArg,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum PaperArg {
    A4,
    Letter,
}

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
    /// Paper size
    #[arg(long, value_enum, ignore_case = true, default_value = "a4")]
    pub paper: PaperArg,
    /// Replace PDFs that exist already (without it, a source whose PDF exists is refused)
    #[arg(long)]
    pub force: bool,
    /// Print a recorded plan that differs from a re-solve or no longer meets its risk
    /// points, with the discrepancy stated on the sheet (without it, such a source is refused)
    #[arg(long)]
    pub accept_recorded: bool,
}

#[derive(Debug, Args)]
pub struct NewArgs {
    /// Template kind: binomial, hypergeometric, poisson, double, multiple, sequential, variables
    /// or rectifying
    #[arg(value_name = "KIND")]
    pub kind: String,
}

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

/// `rectify`: minimum-inspection plans for rectifying inspection.
#[derive(Debug, Args)]
#[command(group(clap::ArgGroup::new("protection").required(true).args(["ltpd", "aoql"])))]
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
    /// Output format
    #[arg(long, value_enum, ignore_case = true, default_value = "table")]
    pub format: ReportFormatArg,
    /// Write the plan as a plan source (scheme: rectifying) to this file, atomically, for
    /// verify, sheet, evaluate and judge
    #[arg(long, value_name = "FILE.yaml")]
    pub output: Option<PathBuf>,
    /// Let --output replace a file that exists already
    #[arg(long, requires = "output")]
    pub force: bool,
}
