//! The `lotsman` binary: parse the command line, turn it into validated
//! library requests, call the library, print, and map the outcome to an exit
//! code (0 ok, 1 verify mismatch, 2 invalid input or no plan).

mod cli;
mod progress;
mod quality_flags;

use std::io::Write;
use std::path::Path;
use std::process::ExitCode;

use clap::Parser;
use cli::{
    Cli, Command, CriterionArg, DesignFormat, LimitArg, ModelArg, ModelFlags, PaperArg,
    ReportFormatArg, SchemeArg, SigmaArg, SingleOrDoubleArg, TradeoffFormat,
};
use lotsman::{
    BatchSummary, Criterion, DemoReport, Description, DesignReport, DesignRequest, Error,
    EvaluationBatchReport, EvaluationEntry, EvaluationReport, Format, InputError, JudgeReport,
    LimitKind, MAX_LOT_SIZE, MeasurementJudgeReport, Model, ModelKind, Outcome, Overwrite, Paper,
    PlanSource, Protection, RectifyingReport, RectifyingRequest, RiskGrid, RiskPair, RiskPoint,
    Scheme, SchemeOptions, SheetNotes, SheetOptions, SheetVerdict, SigmaKind, SourceError,
    SourceEvaluation, SourceFile, SourceJob, Specification, StagedPlan, Steps, TradeoffReport,
    TradeoffRequest, VariablesDesignReport, VariablesRequest, VerificationReport, VerifyEntry,
    VerifyStatus, check_batch, check_sheet, default_qualities, design_rectifying, evaluate,
    evaluate_source, evaluate_with_decided, expand_paths, judge, judge_cumulative,
    judge_measurements, normalise_folder, parse_count, parse_fraction, parse_measurements,
    parse_number, parse_stage, read_limited, refuse_overwriting_input, render_tradeoff_map,
    run_demo, run_in_parallel, sensitivity, sheet_target, sheet_targets, solve, solve_variables,
    template, template_kinds, tradeoff, verify_file, write_atomic, write_report, write_sheet,
};
use lotsman::{escape_controls, shell_path, shell_word};
use progress::Progress;
use quality_flags::Qualities;

fn main() -> ExitCode {
    let cli = match Cli::try_parse() {
        Ok(cli) => cli,
        Err(e) => return arguments_refused(&e),
    };
    match run(cli) {
        Ok(code) => code,
        Err(e) => refuse(&e),
    }
}

/// The one-line refusal on stderr, exit code 2. Control characters that
/// came from a file or an argument are shown escaped, never sent raw to
/// the terminal.
fn refuse(e: &dyn std::fmt::Display) -> ExitCode {
    eprintln!("lotsman: error: {}", escape_controls(&e.to_string()));
    ExitCode::from(2)
}

/// A path as messages show it: its control characters escaped.
fn shown(path: &Path) -> String {
    escape_controls(&path.to_string_lossy()).into_owned()
}

/// What clap reports: help and version on stdout (exit 0, or 2 when they
/// cannot be written), an argument error as one line like every refusal.
fn arguments_refused(e: &clap::Error) -> ExitCode {
    use clap::error::ErrorKind;
    use std::io::IsTerminal;
    match e.kind() {
        ErrorKind::DisplayHelp | ErrorKind::DisplayVersion => {
            if std::io::stdout().is_terminal() {
                // clap's own printing keeps its styles on a terminal.
                let _ = e.print();
                return ExitCode::SUCCESS;
            }
            match print_out(e.render().to_string().as_bytes()) {
                Ok(()) => ExitCode::SUCCESS,
                Err(e) => refuse(&e),
            }
        }
        ErrorKind::DisplayHelpOnMissingArgumentOrSubcommand => refuse(&format!(
            "give a command: {}; what each does: lotsman --help",
            Cli::command_names().join(", ")
        )),
        _ => refuse(&one_line(&e.render().to_string())),
    }
}

/// clap's message on one line: the error and its tips, without the usage
/// block, and the command whose `--help` lists the options.
fn one_line(rendered: &str) -> String {
    let mut text = String::new();
    let command = std::env::args()
        .nth(1)
        .filter(|a| Cli::command_names().contains(a));
    let help = match command {
        Some(c) => format!("lotsman {c} --help"),
        None => "lotsman --help".to_string(),
    };
    for line in rendered.lines().map(str::trim).filter(|l| !l.is_empty()) {
        if line.starts_with("Usage: ") || line.starts_with("For more information") {
            continue;
        }
        let line = line.strip_prefix("error: ").unwrap_or(line);
        if !text.is_empty() {
            text.push_str(if text.ends_with(':') { " " } else { "; " });
        }
        text.push_str(line);
    }
    format!("{text}; the options: {help}")
}

fn run(cli: Cli) -> Result<ExitCode, Error> {
    match cli.command {
        Command::Design(args) => design(*args),
        Command::Evaluate(args) => evaluate_cmd(args),
        Command::Verify(args) => verify_cmd(args),
        Command::New(args) => match template(&args.kind) {
            Some(text) => {
                print_out(text.as_bytes())?;
                Ok(ExitCode::SUCCESS)
            }
            None => Err(InputError::unparsable(
                "template kind",
                &args.kind,
                &format!("one of: {}", template_kinds().join(", ")),
            )
            .into()),
        },
        Command::Demo(args) => demo(&args.output_dir, Overwrite::from_force(args.force)),
        Command::Tradeoff(args) => tradeoff_cmd(args),
        Command::Sheet(args) => sheet_cmd(args),
        Command::Judge(args) => judge_cmd(args),
        Command::Rectify(args) => rectify_cmd(args),
    }
}

fn format_of(format: ReportFormatArg) -> Format {
    match format {
        ReportFormatArg::Table => Format::Table,
        ReportFormatArg::Json => Format::Json,
        ReportFormatArg::Csv => Format::Csv,
    }
}

/// Prints `bytes` on stdout in one write; a device that is full or a
/// reader that went away is refused in words (exit code 2).
fn print_out(bytes: &[u8]) -> Result<(), Error> {
    let mut out = std::io::stdout().lock();
    out.write_all(bytes)
        .and_then(|()| out.flush())
        .map_err(|e| {
            Error::Output(std::io::Error::new(
                e.kind(),
                format!("standard output {}", lotsman::io_reason(&e)),
            ))
        })
}

/// The model from `--model` and `--lot-size`: binomial by default, the
/// hypergeometric model when a lot size is given without a model.
fn model_from(flags: &ModelFlags) -> Result<Model, InputError> {
    model_of(flags.model, flags.lot_size.as_deref())
}

/// The model of `--model` and `--lot-size`: hypergeometric by default when
/// the lot size is given, binomial otherwise.
fn model_of(model: Option<ModelArg>, lot_size: Option<&str>) -> Result<Model, InputError> {
    let lot = lot_size
        .map(|t| parse_count("--lot-size", t, MAX_LOT_SIZE))
        .transpose()?;
    let kind = match (model, lot) {
        (Some(ModelArg::Binomial), _) => ModelKind::Binomial,
        (Some(ModelArg::Hypergeometric), _) => ModelKind::Hypergeometric,
        (Some(ModelArg::Poisson), _) => ModelKind::Poisson,
        (None, Some(_)) => ModelKind::Hypergeometric,
        (None, None) => ModelKind::Binomial,
    };
    Model::new(kind, lot)
}

fn design(args: cli::DesignArgs) -> Result<ExitCode, Error> {
    refuse_non_yaml_output(args.output.as_deref())?;
    if args.in_place && args.source.is_none() {
        return Err(InputError::Inconsistent(
            "--in-place re-solves a plan source and replaces it: name the source, as in lotsman design FILE.yaml --in-place; a plan designed from flags is written with --output FILE.yaml".to_string(),
        )
        .into());
    }
    let variables = match &args.source {
        Some(path) => {
            let source = PlanSource::load(path)?;
            if source.is_rectifying() {
                return design_rectifying_source(&args, source, path);
            }
            if source.is_variables() {
                let request = source
                    .variables_request()
                    .map_err(|e| SourceError::Invalid {
                        path: path.clone(),
                        source: e,
                    })?;
                Some((source, request))
            } else {
                None
            }
        }
        None if args.scheme == SchemeArg::Variables => {
            let request = variables_request_from(&args)?;
            let title = args
                .title
                .clone()
                .unwrap_or_else(|| "Untitled plan".to_string());
            let mut source = PlanSource::new_variables(&title, &request, args.unit.clone());
            source.describe(description_from(&args))?;
            Some((source, request))
        }
        None => {
            refuse_variables_flags(&args)?;
            None
        }
    };
    if let Some((source, request)) = variables {
        return design_variables_cmd(&args, source, &request);
    }
    let (mut source, request) = match &args.source {
        Some(path) => {
            let source = PlanSource::load(path)?;
            let request = source.request().map_err(|e| SourceError::Invalid {
                path: path.clone(),
                source: e,
            })?;
            (source, request)
        }
        None => {
            let model = model_from(&args.model)?;
            let risks = risks_from(&args, &model)?;
            let scheme = match args.scheme {
                SchemeArg::Single => Scheme::Single,
                SchemeArg::Double => Scheme::Double,
                SchemeArg::Multiple => Scheme::Multiple,
                SchemeArg::Sequential => Scheme::Sequential,
                SchemeArg::Variables => Scheme::Variables,
            };
            let defaults = SchemeOptions::default();
            let options = SchemeOptions {
                criterion: criterion_from(args.criterion),
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
                ))
                .into());
            }
            if args.stage_count.is_some() && scheme != Scheme::Multiple {
                return Err(InputError::Inconsistent(format!(
                    "--stage-count applies to multiple plans, not to a {scheme} plan"
                ))
                .into());
            }
            options.check(scheme)?;
            let request = DesignRequest {
                scheme,
                options,
                model,
                risks,
            };
            let title = args
                .title
                .clone()
                .unwrap_or_else(|| "Untitled plan".to_string());
            let mut source = PlanSource::new(&title, &request);
            source.describe(description_from(&args))?;
            (source, request)
        }
    };
    let solution = solve(&request).map_err(|e| design_error(&args, e))?;
    source.record(&solution);
    let step = |flag: &str, text: &Option<String>| {
        text.as_deref().map(|t| parse_fraction(flag, t)).transpose()
    };
    let steps = Steps::new(
        &request.risks,
        [
            step("--step-aql", &args.step_aql)?,
            step("--step-alpha", &args.step_alpha)?,
            step("--step-rql", &args.step_rql)?,
            step("--step-beta", &args.step_beta)?,
        ],
    )?;
    let rows = sensitivity(&request.model, &request.risks, solution.single.n, &steps);
    let report = DesignReport::new(&source.title, &solution).with_sensitivity(rows);
    // Nothing is written or printed from a report that fails its guard.
    report.check()?;
    write_source(&args, &source)?;
    let mut text = Vec::new();
    match args.format {
        DesignFormat::Table => write_report(&report, Format::Table, &mut text)?,
        DesignFormat::Json => write_report(&report, Format::Json, &mut text)?,
        DesignFormat::Yaml => text = source.to_yaml().into_bytes(),
    }
    print_out(&text)?;
    Ok(ExitCode::SUCCESS)
}

/// `design FILE` of a minimum-inspection source: solved as `rectify`
/// solves it, recorded, written to `--output` and reported.
fn design_rectifying_source(
    args: &cli::DesignArgs,
    mut source: PlanSource,
    path: &Path,
) -> Result<ExitCode, Error> {
    let request = source
        .rectifying_request()
        .map_err(|e| SourceError::Invalid {
            path: path.to_path_buf(),
            source: e,
        })?;
    let design = design_rectifying(&request).map_err(|e| design_error(args, e))?;
    let report = RectifyingReport::new(&source.title, &design);
    report.check()?;
    if args.output.is_some() || args.format == DesignFormat::Yaml {
        source
            .record_rectifying(&design)
            .map_err(|e| SourceError::Invalid {
                path: path.to_path_buf(),
                source: e,
            })?;
    }
    write_source(args, &source)?;
    let mut text = Vec::new();
    match args.format {
        DesignFormat::Table => write_report(&report, Format::Table, &mut text)?,
        DesignFormat::Json => write_report(&report, Format::Json, &mut text)?,
        DesignFormat::Yaml => text = source.to_yaml().into_bytes(),
    }
    print_out(&text)?;
    Ok(ExitCode::SUCCESS)
}

/// The document fields of `--id`, `--revision`, `--date`, `--item`,
/// `--characteristic`, `--prepared-by` and `--approved-by`.
fn description_from(args: &cli::DesignArgs) -> Description {
    Description {
        id: args.id.clone(),
        revision: args.revision.clone(),
        date: args.date.clone(),
        item: args.item.clone(),
        characteristic: args.characteristic.clone(),
        prepared_by: args.prepared_by.clone(),
        approved_by: args.approved_by.clone(),
    }
}

/// The criterion of `--criterion`, or the default.
fn criterion_from(arg: Option<CriterionArg>) -> Criterion {
    match arg {
        None => SchemeOptions::default().criterion,
        Some(CriterionArg::Aql) => Criterion::AsnAql,
        Some(CriterionArg::Rql) => Criterion::AsnRql,
        Some(CriterionArg::Max) => Criterion::AsnMax,
    }
}

fn scheme_of(arg: SingleOrDoubleArg) -> Scheme {
    match arg {
        SingleOrDoubleArg::Single => Scheme::Single,
        SingleOrDoubleArg::Double => Scheme::Double,
    }
}

fn tradeoff_cmd(args: cli::TradeoffArgs) -> Result<ExitCode, Error> {
    let model = model_from(&args.model)?;
    let qualities = Qualities::of(model.kind());
    let scheme = scheme_of(args.scheme);
    if args.criterion.is_some() && scheme != Scheme::Double {
        return Err(InputError::Inconsistent(
            "--criterion applies to double plans (--scheme double)".to_string(),
        )
        .into());
    }
    let cost = match (&args.cost_per_unit, &args.process_average) {
        (Some(k), Some(p)) => Some((
            parse_number("--cost-per-unit", k)?,
            qualities.one("--process-average", p)?,
        )),
        _ => None,
    };
    let request = TradeoffRequest::new(
        RiskGrid {
            aql: qualities.axis("--aql", &args.aql)?,
            rql: qualities.axis("--rql", &args.rql)?,
            alpha: parse_fraction("--alpha", &args.alpha)?,
            beta: parse_fraction("--beta", &args.beta)?,
        },
        model,
        scheme,
        criterion_from(args.criterion),
        cost,
    )?;
    if args.format == TradeoffFormat::Pdf && args.output.is_none() {
        return Err(InputError::Inconsistent(
            "--format pdf writes a file: give --output FILE.pdf".to_string(),
        )
        .into());
    }
    let progress = Progress::start(request.cell_count(), "cells solved");
    let done = std::sync::atomic::AtomicUsize::new(0);
    let grid = tradeoff(&request, &|| {
        progress.set(done.fetch_add(1, std::sync::atomic::Ordering::Relaxed) + 1)
    });
    progress.finish();
    let report = TradeoffReport::new(args.title.as_deref(), &grid);
    report.check()?;
    let text = match args.format {
        TradeoffFormat::Pdf => {
            let title = args
                .title
                .as_deref()
                .unwrap_or("Trade-off of the risk points");
            render_tradeoff_map(
                &grid,
                title,
                Some(&regenerate_command()),
                paper_from(args.paper),
            )?
            .pdf
        }
        format => {
            let mut text = Vec::new();
            let format = match format {
                TradeoffFormat::Json => Format::Json,
                TradeoffFormat::Csv => Format::Csv,
                _ => Format::Table,
            };
            write_report(&report, format, &mut text)?;
            text
        }
    };
    match &args.output {
        Some(path) => {
            write_atomic(path, &text, Overwrite::from_force(args.force))?;
            eprintln!("lotsman: wrote {}", shown(path));
        }
        None => print_out(&text)?,
    }
    Ok(ExitCode::SUCCESS)
}

/// This run's command line, as a shell would take it back (each argument
/// a shell word), with `--force` added when it is not there: the command
/// printed on a map regenerates it over the file it wrote.
fn regenerate_command() -> String {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let force = (!args.iter().any(|a| a == "--force")).then(|| "--force".to_string());
    std::iter::once("lotsman".to_string())
        .chain(args.iter().map(|a| shell_word(a)))
        .chain(force)
        .collect::<Vec<_>>()
        .join(" ")
}

fn paper_from(arg: PaperArg) -> Paper {
    match arg {
        PaperArg::A4 => Paper::A4,
        PaperArg::Letter => Paper::Letter,
    }
}

/// A designer's refusal, naming the source it came from.
fn design_error(args: &cli::DesignArgs, e: lotsman::DesignError) -> Error {
    match &args.source {
        Some(path) => Error::Source(SourceError::Design {
            path: path.clone(),
            source: e,
        }),
        None => Error::Design(e),
    }
}

/// Writes the solved source to `--output`, if given: never over the
/// source read, and over another file only with `--force`; or, with
/// `--in-place`, over the source read, which is what that flag asks for.
fn write_source(args: &cli::DesignArgs, source: &PlanSource) -> Result<(), Error> {
    if let (true, Some(path)) = (args.in_place, &args.source) {
        write_atomic(path, source.to_yaml().as_bytes(), Overwrite::Replace)?;
        eprintln!("lotsman: re-solved {} in place", shown(path));
    }
    if let Some(target) = &args.output {
        refuse_overwriting_input(target, args.source.as_deref(), true)?;
        write_atomic(
            target,
            source.to_yaml().as_bytes(),
            Overwrite::from_force(args.force),
        )?;
        eprintln!("lotsman: wrote plan source {}", shown(target));
    }
    Ok(())
}

/// `design --output` writes a plan source, so its name must end in
/// `.yaml` or `.yml`: the name the folder search finds, and not a PDF
/// (the sheet is printed from the source by `lotsman sheet`).
fn refuse_non_yaml_output(output: Option<&Path>) -> Result<(), InputError> {
    // A folder in the target's place is refused as such when written.
    let Some(target) = output.filter(|t| !t.is_dir()) else {
        return Ok(());
    };
    let extension = target
        .extension()
        .map(|e| e.to_string_lossy().to_ascii_lowercase());
    if matches!(extension.as_deref(), Some("yaml" | "yml")) {
        return Ok(());
    }
    let yaml = target.with_extension("yaml");
    let rerun = this_command_with_output(&yaml);
    let sheet = if extension.as_deref() == Some("pdf") {
        format!(
            ", then print its sheet with: lotsman sheet {}",
            shell_path(&yaml)
        )
    } else {
        String::new()
    };
    Err(InputError::Inconsistent(format!(
        "--output {} would hold the plan source, which is YAML, and its name does not end in .yaml or .yml; write it with: {rerun}{sheet}",
        target.display()
    )))
}

/// This run's command line with the value of `--output` replaced by
/// `output`, as a shell takes it back.
fn this_command_with_output(output: &Path) -> String {
    let mut words = vec!["lotsman".to_string()];
    let mut args = std::env::args_os().skip(1);
    while let Some(arg) = args.next() {
        let text = arg.to_string_lossy();
        if text == "--output" {
            args.next();
            words.push(format!("--output {}", shell_path(output)));
        } else if text.starts_with("--output=") {
            words.push(format!("--output {}", shell_path(output)));
        } else {
            words.push(shell_word(&text));
        }
    }
    words.join(" ")
}

fn design_variables_cmd(
    args: &cli::DesignArgs,
    mut source: PlanSource,
    request: &VariablesRequest,
) -> Result<ExitCode, Error> {
    let solution = solve_variables(request).map_err(|e| design_error(args, e))?;
    source.record_variables(&solution);
    let report = VariablesDesignReport::new(&source.title, &solution);
    report.check()?;
    write_source(args, &source)?;
    let mut text = Vec::new();
    match args.format {
        DesignFormat::Table => write_report(&report, Format::Table, &mut text)?,
        DesignFormat::Json => write_report(&report, Format::Json, &mut text)?,
        DesignFormat::Yaml => text = source.to_yaml().into_bytes(),
    }
    print_out(&text)?;
    Ok(ExitCode::SUCCESS)
}

/// The risk points of `--aql`, `--alpha`, `--rql`, `--beta` for `model`.
fn risks_from(args: &cli::DesignArgs, model: &Model) -> Result<RiskPair, InputError> {
    let qualities = Qualities::of(model.kind());
    let point = |q: &Option<String>,
                 q_name: &str,
                 r: &str,
                 r_name: &str|
     -> Result<RiskPoint, InputError> {
        Ok(RiskPoint {
            quality: qualities.one(q_name, q.as_deref().unwrap_or(""))?,
            risk: parse_fraction(r_name, r)?,
        })
    };
    RiskPair::new(
        point(&args.aql, "--aql", &args.alpha, "--alpha")?,
        point(&args.rql, "--rql", &args.beta, "--beta")?,
        model,
    )
}

/// A variables request from the flags: `--sigma` and `--limit` are
/// required, the attribute settings refused.
fn variables_request_from(args: &cli::DesignArgs) -> Result<VariablesRequest, InputError> {
    for (flag, given) in [
        ("--criterion", args.criterion.is_some()),
        ("--second-ratio", args.second_ratio.is_some()),
        ("--stage-count", args.stage_count.is_some()),
    ] {
        if given {
            return Err(InputError::Inconsistent(format!(
                "{flag} is an attributes setting; a variables plan does not take it"
            )));
        }
    }
    let sigma = match args.sigma {
        Some(SigmaArg::Known) => SigmaKind::Known,
        Some(SigmaArg::Unknown) => SigmaKind::Unknown,
        None => {
            return Err(InputError::Inconsistent(
                "--scheme variables needs --sigma known (with --sigma-value S) or --sigma unknown"
                    .to_string(),
            ));
        }
    };
    let limit = match args.limit {
        Some(LimitArg::Lower) => LimitKind::Lower,
        Some(LimitArg::Upper) => LimitKind::Upper,
        Some(LimitArg::Both) => LimitKind::Both,
        None => {
            return Err(InputError::Inconsistent(
                "--scheme variables needs --limit lower (with --lower L), upper (with --upper U) or both".to_string(),
            ));
        }
    };
    let number =
        |flag: &str, v: &Option<String>| v.as_deref().map(|t| parse_number(flag, t)).transpose();
    let spec = Specification::new(
        sigma,
        number("--sigma-value", &args.sigma_value)?,
        limit,
        number("--lower", &args.lower)?,
        number("--upper", &args.upper)?,
    )?;
    let model = model_from(&args.model)?;
    let risks = risks_from(args, &model)?;
    VariablesRequest::new(spec, risks, model)
}

/// The variables flags on an attributes scheme are a mistake to report.
fn refuse_variables_flags(args: &cli::DesignArgs) -> Result<(), InputError> {
    for (flag, given) in [
        ("--sigma", args.sigma.is_some()),
        ("--limit", args.limit.is_some()),
        ("--sigma-value", args.sigma_value.is_some()),
        ("--lower", args.lower.is_some()),
        ("--upper", args.upper.is_some()),
        ("--unit", args.unit.is_some()),
    ] {
        if given {
            return Err(InputError::Inconsistent(format!(
                "{flag} applies to variables plans (--scheme variables)"
            )));
        }
    }
    Ok(())
}

/// The qualities of `--at` and `--range`, in that order, for plans whose
/// models are `kinds`.
fn asked_qualities(
    args: &cli::EvaluateArgs,
    kinds: impl IntoIterator<Item = ModelKind>,
) -> Result<Vec<f64>, InputError> {
    let parser = Qualities::of_any(kinds);
    let mut qualities = Vec::new();
    if let Some(list) = &args.at {
        qualities.extend(parser.list("--at", list)?);
    }
    if let Some(range) = &args.range {
        qualities.extend(parser.range("--range", range)?);
    }
    Ok(qualities)
}

/// The models of the sources that load, for the note on bare fractions
/// (a source that does not load is refused by the evaluation itself).
fn source_models<'a>(paths: impl IntoIterator<Item = &'a Path>) -> Vec<ModelKind> {
    paths
        .into_iter()
        .filter_map(|p| PlanSource::load(p).ok())
        .map(|s| s.model)
        .collect()
}

fn evaluate_cmd(args: cli::EvaluateArgs) -> Result<ExitCode, Error> {
    if args.decided_at && args.format != ReportFormatArg::Json {
        return Err(InputError::Inconsistent(
            "--decided-at adds the per-stage distribution to the JSON report; give --format json"
                .to_string(),
        )
        .into());
    }
    match args.sources.as_slice() {
        [] => evaluate_plan_cmd(&args),
        [one] if !one.is_dir() => {
            let qualities = asked_qualities(&args, source_models([one.as_path()]))?;
            let mut text = Vec::new();
            let evaluation = evaluate_source(
                one,
                &qualities,
                source_lot(&args)?,
                args.accept_recorded,
                args.decided_at,
            )?;
            match &evaluation {
                SourceEvaluation::Attributes(r) => {
                    write_report(r, format_of(args.format), &mut text)?
                }
                SourceEvaluation::Variables(r) => {
                    write_report(r, format_of(args.format), &mut text)?
                }
            }
            warn_accepted(one, evaluation.accepted_recorded(), EVALUATED_AS_RECORDED);
            print_out(&text)?;
            Ok(ExitCode::SUCCESS)
        }
        _ => evaluate_batch_cmd(&args),
    }
}

/// `--lot-size` beside plan sources: the lot of a source that gives none.
fn source_lot(args: &cli::EvaluateArgs) -> Result<Option<u64>, InputError> {
    args.model
        .lot_size
        .as_deref()
        .map(|t| parse_count("--lot-size", t, MAX_LOT_SIZE))
        .transpose()
}

/// `evaluate --n --c` or `--stage`: a plan given by its numbers.
fn evaluate_plan_cmd(args: &cli::EvaluateArgs) -> Result<ExitCode, Error> {
    let model = model_from(&args.model)?;
    let plan = match (&args.n, &args.c) {
        (Some(n), Some(c)) => StagedPlan::single(
            parse_count("--n", n, u64::MAX)?,
            parse_count("--c", c, u64::MAX)?,
            &model,
        )?,
        _ if !args.stage.is_empty() => {
            let stages = args
                .stage
                .iter()
                .map(|s| parse_stage(s))
                .collect::<Result<Vec<_>, _>>()?;
            StagedPlan::new(stages, &model)?
        }
        _ => {
            return Err(InputError::Inconsistent(
                "give a plan: FILE.yaml, or --n N --c C, or --stage N:AC:RE (repeated)".to_string(),
            )
            .into());
        }
    };
    let mut qualities = asked_qualities(args, [model.kind()])?;
    if qualities.is_empty() {
        qualities = default_qualities(&plan, &model, None);
    }
    let evaluation = if args.decided_at {
        evaluate_with_decided(&plan, &model, &qualities)?
    } else {
        evaluate(&plan, &model, &qualities)?
    };
    let report = EvaluationReport::from(&evaluation);
    report.check()?;
    let mut text = Vec::new();
    write_report(&report, format_of(args.format), &mut text)?;
    print_out(&text)?;
    Ok(ExitCode::SUCCESS)
}

/// `evaluate` over several sources or folders: every source evaluated,
/// the summary after the table, or on stderr beside JSON and CSV.
fn evaluate_batch_cmd(args: &cli::EvaluateArgs) -> Result<ExitCode, Error> {
    let found = expand_paths(&args.sources);
    let kinds = source_models(
        found
            .iter()
            .filter_map(|e| e.as_ref().ok())
            .map(|s| s.path.as_path()),
    );
    let qualities = asked_qualities(args, kinds)?;
    let lot = source_lot(args)?;
    let job = SourceJob::Evaluate {
        points: (!qualities.is_empty()).then_some(qualities.len()),
        decided_at: args.decided_at,
    };
    check_batch(found.iter().flatten().map(|s| s.path.as_path()), job).map_err(InputError::from)?;
    let results = run_batch(&found, "sources evaluated", |entry| match entry {
        Ok(s) => EvaluationEntry::new(
            s.path.display().to_string(),
            evaluate_source(
                &s.path,
                &qualities,
                lot,
                args.accept_recorded,
                args.decided_at,
            )
            .map_err(|e| e.to_string()),
        ),
        Err(e) => EvaluationEntry::new(e.path().display().to_string(), Err(e.to_string())),
    });
    for e in &results {
        if let Some(evaluation) = &e.evaluation {
            let accepted = evaluation.accepted_recorded();
            warn_accepted(Path::new(&e.path), accepted, EVALUATED_AS_RECORDED);
        }
    }
    let report = EvaluationBatchReport { results };
    let mut text = Vec::new();
    write_report(&report, format_of(args.format), &mut text)?;
    print_out(&text)?;
    Ok(finish_batch(&report.summary(), args.format))
}

/// Runs `work` over `items` in parallel, with a progress bar on a
/// terminal once the run has lasted a second.
fn run_batch<T: Sync, R: Send>(
    items: &[T],
    what: &'static str,
    work: impl Fn(&T) -> R + Sync + Send,
) -> Vec<R> {
    let progress = Progress::start(items.len(), what);
    let answers = run_in_parallel(items, work, &|done, _| progress.set(done));
    progress.finish();
    answers
}

/// The exit code of a batch: its worst outcome. The table format has
/// printed the summary on stdout; beside JSON and CSV it goes to stderr,
/// so that stdout stays machine-readable.
fn finish_batch(summary: &BatchSummary, format: ReportFormatArg) -> ExitCode {
    if format != ReportFormatArg::Table {
        eprint!("{summary}");
    }
    exit_code(summary.worst())
}

fn exit_code(worst: Outcome) -> ExitCode {
    match worst {
        Outcome::Ok => ExitCode::SUCCESS,
        Outcome::Mismatch => ExitCode::from(1),
        Outcome::Invalid => ExitCode::from(2),
    }
}

/// Checks that the sheet at `pdf` is the sheet this tool prints from the
/// source at `source` (see [`check_sheet`]): a forged or foreign sheet
/// makes the entry a mismatch, an unreadable one invalid.
fn check_sheet_entry(entry: &mut VerifyEntry, source: &Path, pdf: &Path) {
    match check_sheet(source, pdf) {
        SheetVerdict::Genuine => {}
        SheetVerdict::Foreign { reason, hashes } => {
            if entry.status == VerifyStatus::Match {
                entry.status = VerifyStatus::Mismatch;
            }
            if let Some((recorded, resolved)) = hashes {
                entry.differences.push(lotsman::Difference {
                    field: format!("sheet {} source SHA-256", pdf.display()),
                    recorded,
                    resolved,
                });
            }
            if entry.message.is_none() {
                entry.message = Some(reason);
            }
        }
        SheetVerdict::Unreadable(message) => {
            entry.status = VerifyStatus::Invalid;
            entry.message = Some(message);
        }
    }
}

fn verify_cmd(args: cli::VerifyArgs) -> Result<ExitCode, Error> {
    if !args.sheet.is_empty() {
        if let Some(folder) = args.sources.iter().find(|p| p.is_dir()) {
            return Err(InputError::Inconsistent(format!(
                "--sheet pairs each sheet with a source named on the command line, and {} is a folder; name its sources one by one, or verify the folder without --sheet",
                folder.display()
            ))
            .into());
        }
        if args.sheet.len() != args.sources.len() {
            return Err(InputError::Inconsistent(format!(
                "--sheet was given {} times for {} sources; give one sheet per source, in the same order",
                args.sheet.len(),
                args.sources.len()
            ))
            .into());
        }
    }
    let found = expand_paths(&args.sources);
    check_batch(
        found.iter().flatten().map(|s| s.path.as_path()),
        SourceJob::Verify,
    )
    .map_err(InputError::from)?;
    if !args.sheet.is_empty() && found.len() != args.sources.len() {
        return Err(InputError::Inconsistent(
            "--sheet pairs sheets with sources in order, and a source is named twice; name each source once".to_string(),
        )
        .into());
    }
    let mut results = run_batch(&found, "sources verified", |entry| match entry {
        Ok(source) => verify_file(&source.path),
        Err(e) => VerifyEntry {
            path: e.path().display().to_string(),
            status: VerifyStatus::Invalid,
            differences: Vec::new(),
            message: Some(e.to_string()),
        },
    });
    for ((entry, source), pdf) in results.iter_mut().zip(&args.sources).zip(&args.sheet) {
        check_sheet_entry(entry, source, pdf);
    }
    let report = VerificationReport {
        results,
        every_source: args.list,
    };
    let mut text = Vec::new();
    write_report(&report, format_of(args.format), &mut text)?;
    print_out(&text)?;
    Ok(finish_batch(&report.summary(), args.format))
}

/// The largest measurements file read (10 MiB), refused by size first.
const MAX_MEASUREMENTS_BYTES: u64 = 10 << 20;

fn judge_measurements_cmd(args: &cli::JudgeArgs, csv: &Path) -> Result<ExitCode, Error> {
    let (audited, request, plan) = PlanSource::load_with_variables_plan(
        &args.source,
        args.accept_recorded,
        judge_budget(&args.source),
    )?;
    let accepted = audited.accepted.map(|d| d.to_string());
    let io = |e: std::io::Error| SourceError::Io {
        path: csv.to_path_buf(),
        source: e,
    };
    let bytes = read_limited(csv, MAX_MEASUREMENTS_BYTES, "a measurements file").map_err(io)?;
    let text = String::from_utf8(bytes).map_err(|_| {
        InputError::Inconsistent(format!(
            "{}: the measurements file is not UTF-8 text",
            csv.display()
        ))
    })?;
    let values = parse_measurements(&text, args.column.as_deref())?;
    let j = judge_measurements(&plan, &values, request.risks().producer().quality)?;
    j.check()?;
    let report = MeasurementJudgeReport {
        judgement: j,
        plan,
        source: args.source.clone(),
        accepted_recorded: accepted.clone(),
    };
    let mut text = Vec::new();
    write_report(&report, judge_format(args.format), &mut text)?;
    warn_accepted(&args.source, accepted.as_deref(), DECIDED_AS_RECORDED);
    print_out(&text)?;
    Ok(ExitCode::SUCCESS)
}

/// The work-budget check of `judge` on the source at `path`: its audit
/// re-solves the source before the lot is decided.
fn judge_budget(path: &Path) -> impl FnOnce(&PlanSource) -> Result<(), Error> + '_ {
    move |source| {
        lotsman::check_source(source, path, SourceJob::Judge)
            .map_err(|e| InputError::from(e).into())
    }
}

fn judge_cmd(args: cli::JudgeArgs) -> Result<ExitCode, Error> {
    if let Some(csv) = &args.measurements {
        return judge_measurements_cmd(&args, csv);
    }
    let (audited, model, plan) = PlanSource::load_with_plan(
        &args.source,
        args.accept_recorded,
        judge_budget(&args.source),
    )?;
    let accepted = audited.accepted.map(|d| d.to_string());
    let found = args
        .found
        .iter()
        .map(|k| parse_count("--found", k, u64::MAX))
        .collect::<Result<Vec<_>, _>>()?;
    let j = match &args.inspected {
        Some(n) => {
            let [count] = found.as_slice() else {
                return Err(InputError::Inconsistent(
                    "with --inspected give one --found: the cumulative count so far".to_string(),
                )
                .into());
            };
            judge_cumulative(
                &plan,
                &model,
                parse_count("--inspected", n, u64::MAX)?,
                *count,
            )?
        }
        None => judge(&plan, &model, &found)?,
    };
    let report = JudgeReport {
        judgement: j,
        plan,
        source: args.source.clone(),
        accepted_recorded: accepted.clone(),
    };
    let mut text = Vec::new();
    write_report(&report, judge_format(args.format), &mut text)?;
    warn_accepted(&args.source, accepted.as_deref(), DECIDED_AS_RECORDED);
    print_out(&text)?;
    Ok(ExitCode::SUCCESS)
}

fn sheet_cmd(args: cli::SheetArgs) -> Result<ExitCode, Error> {
    let options = SheetOptions {
        paper: paper_from(args.paper),
        accept_recorded: args.accept_recorded,
        overwrite: Overwrite::from_force(args.force),
    };
    // `x/../y/../z` creates `z` only, never the folders it steps out of.
    let output_dir = args.output_dir.as_deref().map(normalise_folder);
    let output_dir = output_dir.as_deref();
    let batch = args.sources.len() > 1 || args.sources.iter().any(|p| p.is_dir());
    if !batch {
        let source = &args.sources[0];
        let out = match &args.output {
            Some(out) => out.clone(),
            None => {
                let named = SourceFile {
                    path: source.clone(),
                    below: None,
                };
                sheet_target(&named, output_dir)
            }
        };
        let notes = write_one_sheet(source, &out, &options, output_dir.is_some())?;
        warn_sheet_notes(source, &notes);
        eprintln!("lotsman: wrote sheet {}", shown(&out));
        return Ok(ExitCode::SUCCESS);
    }
    if args.output.is_some() {
        return Err(InputError::Inconsistent(
            "--output names one PDF; for several sources or a folder use --output-dir DIR"
                .to_string(),
        )
        .into());
    }
    let planned = sheet_targets(expand_paths(&args.sources), output_dir);
    check_batch(
        planned.iter().flatten().map(|(s, _)| s.path.as_path()),
        SourceJob::Sheet,
    )
    .map_err(InputError::from)?;
    let results = run_batch(&planned, "sheets written", |entry| match entry {
        Ok((source, target)) => (
            source.path.clone(),
            write_one_sheet(&source.path, target, &options, output_dir.is_some())
                .map_err(|e| e.to_string()),
        ),
        Err(e) => (e.path().to_path_buf(), Err(e.to_string())),
    });
    let mut summary = BatchSummary::new("written", false);
    for (path, result) in &results {
        let shown = path.display().to_string();
        match result {
            Ok(notes) => {
                warn_sheet_notes(path, notes);
                summary.push(&shown, Outcome::Ok, "");
            }
            Err(message) => summary.push(&shown, Outcome::Invalid, message),
        }
    }
    print_out(summary.to_string().as_bytes())?;
    Ok(exit_code(summary.worst()))
}

/// What was done with a recorded plan used at the user's request although
/// the audit does not confirm it, for [`warn_accepted`].
const PRINTED_AS_RECORDED: &str =
    "printed as recorded (--accept-recorded), with the discrepancy stated on the sheet";
const EVALUATED_AS_RECORDED: &str =
    "evaluated as recorded (--accept-recorded), with the discrepancy stated in the report";
const DECIDED_AS_RECORDED: &str = "the lot is decided by the plan as recorded (--accept-recorded), with the discrepancy stated beside the decision";

/// The warning on stderr for a recorded plan used with a discrepancy at
/// the user's request (`done` says how): the output states it, and so
/// does the terminal.
fn warn_accepted(source: &Path, accepted: Option<&str>, done: &str) {
    if let Some(d) = accepted {
        eprintln!(
            "lotsman: warning: {}: {}; {done}",
            shown(source),
            escape_controls(d)
        );
    }
}

/// The warnings of a sheet written from `source`: the discrepancy it
/// states, and one line per field that still holds a template's
/// placeholder.
fn warn_sheet_notes(source: &Path, notes: &SheetNotes) {
    let accepted = notes.accepted.as_ref().map(|d| d.to_string());
    warn_accepted(source, accepted.as_deref(), PRINTED_AS_RECORDED);
    for p in &notes.placeholders {
        eprintln!(
            "lotsman: warning: {}: {}",
            shown(source),
            escape_controls(&p.to_string())
        );
    }
}

/// The format of a judgement: a table, or JSON.
fn judge_format(format: cli::JudgeFormat) -> Format {
    match format {
        cli::JudgeFormat::Table => Format::Table,
        cli::JudgeFormat::Json => Format::Json,
    }
}

/// Writes the sheet of `source` to `target`, never over the source itself;
/// with `make_folders` (an output folder) the target's folders are created.
/// Returns what the sheet states or still holds, for the warnings.
fn write_one_sheet(
    source: &Path,
    target: &Path,
    options: &SheetOptions,
    make_folders: bool,
) -> Result<SheetNotes, Error> {
    refuse_overwriting_input(target, Some(source), false)?;
    if make_folders && let Some(folder) = target.parent() {
        std::fs::create_dir_all(folder).map_err(|e| SourceError::Io {
            path: folder.to_path_buf(),
            source: e,
        })?;
    }
    write_sheet(source, target, options)
}

fn demo(dir: &Path, overwrite: Overwrite) -> Result<ExitCode, Error> {
    let report = DemoReport {
        rows: run_demo(dir, overwrite)?,
    };
    let mut text = Vec::new();
    write_report(&report, Format::Table, &mut text)?;
    print_out(&text)?;
    Ok(if report.verified() {
        ExitCode::SUCCESS
    } else {
        ExitCode::from(1)
    })
}

/// `rectify`: the flags as a validated minimum-inspection request, the
/// design, and its report.
fn rectify_cmd(args: cli::RectifyArgs) -> Result<ExitCode, Error> {
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
            )
            .into());
        }
    };
    if let Some(target) = &args.output
        && target
            .extension()
            .is_some_and(|e| e.eq_ignore_ascii_case("pdf"))
    {
        return Err(InputError::Inconsistent(format!(
            "--output writes the plan source, YAML, and {} names a PDF; write FILE.yaml, then print its sheet with: lotsman sheet FILE.yaml",
            target.display()
        ))
        .into());
    }
    let request =
        RectifyingRequest::new(model, process_average, protection, scheme_of(args.scheme))?;
    let design = design_rectifying(&request)?;
    let title = args
        .title
        .unwrap_or_else(|| "Minimum-inspection plan".to_string());
    let report = RectifyingReport::new(&title, &design);
    report.check()?;
    if let Some(target) = &args.output {
        let mut source = PlanSource::new_rectifying(&title, &request);
        source.record_rectifying(&design)?;
        write_atomic(
            target,
            source.to_yaml().as_bytes(),
            Overwrite::from_force(args.force),
        )?;
        eprintln!("lotsman: wrote plan source {}", target.display());
    }
    let mut text = Vec::new();
    write_report(&report, format_of(args.format), &mut text)?;
    print_out(&text)?;
    Ok(ExitCode::SUCCESS)
}
