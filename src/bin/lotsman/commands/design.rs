//! `design`: solve the risk points of the flags, or the plan source named,
//! write the solved source where asked, and print the report (or the
//! source itself).

use std::path::Path;

use lotsman::{
    DesignError, DesignReport, DesignRequest, Error, Format, InputError, Outcome, PlanSource,
    RectifyingReport, Report, Solution, SourceError, StandardPlansReport, VariablesDesignReport,
    VariablesRequest, design_rectifying, refuse_overwriting_input, sensitivity, shell_path,
    shell_word, solve_listing, solve_variables, write_atomic,
};

use crate::cli::design::{DesignArgs, DesignFormat, SchemeArg};
use crate::out::{print_out, report_bytes, say, shown};

pub fn run(args: DesignArgs) -> Result<Outcome, Error> {
    refuse_non_yaml_output(args.output.output.as_deref())?;
    if args.in_place && args.source.is_none() {
        return Err(InputError::Inconsistent(
            "--in-place re-solves a plan source and replaces it: name the source, as in lotsman design FILE.yaml --in-place; a plan designed from flags is written with --output FILE.yaml".to_string(),
        )
        .into());
    }
    match &args.source {
        Some(path) => {
            let source = PlanSource::load(path)?;
            let invalid = |e| SourceError::Invalid {
                path: path.clone(),
                source: e,
            };
            if source.is_rectifying() {
                rectifying(&args, source, path)
            } else if source.is_standard() {
                standard(&args, source, path)
            } else if source.is_variables() {
                let request = source.variables_request().map_err(invalid)?;
                variables(&args, source, &request)
            } else {
                let request = source.request().map_err(invalid)?;
                let designed = attributes(&args, source, request)?;
                finish(&args, &designed.report, &designed.source)
            }
        }
        None if args.scheme == SchemeArg::Variables => {
            let request = VariablesRequest::try_from(&args)?;
            let unit = args.variables.unit.clone();
            let mut source = PlanSource::new_variables(&args.title(), &request, unit);
            source.describe((&args.description).into())?;
            variables(&args, source, &request)
        }
        None => {
            let designed = from_flags(&args)?;
            finish(&args, &designed.report, &designed.source)
        }
    }
}

/// An attributes plan designed from the flags, with what a caller shows
/// of it: `lotsman design` prints the report, `lotsman serve` draws the
/// plan's OC chart from the request and the solution beside it.
pub(crate) struct Designed {
    /// The validated request.
    pub request: DesignRequest,
    /// The solved plan, with the single plan and the alternatives.
    pub solution: Solution,
    /// The plan source recording it, ready to write.
    pub source: PlanSource,
    /// The report, its guard checked.
    pub report: DesignReport,
}

/// The attributes plan of the flags (no plan source, not `--scheme
/// variables`): the one path from flags to a plan, for the command line
/// and the web page alike.
pub(crate) fn from_flags(args: &DesignArgs) -> Result<Designed, Error> {
    let request = DesignRequest::try_from(args)?;
    let mut source = PlanSource::new(&args.title(), &request);
    source.describe((&args.description).into())?;
    attributes(args, source, request)
}

/// An attributes plan: solved, recorded, and reported with its
/// sensitivity to the risk points.
fn attributes(
    args: &DesignArgs,
    mut source: PlanSource,
    request: DesignRequest,
) -> Result<Designed, Error> {
    let solution =
        solve_listing(&request, args.nearby.into()).map_err(|e| design_error(args, e))?;
    source.record(&solution);
    let steps = args.steps.steps(&request.risks)?;
    let rows = sensitivity(&request.model, &request.risks, solution.single.n, &steps);
    let report = DesignReport::new(&source.title, &solution).with_sensitivity(rows);
    // Nothing is written or printed from a report that fails its guard.
    report.check()?;
    Ok(Designed {
        request,
        solution,
        source,
        report,
    })
}

/// A variables plan: solved, recorded and reported.
fn variables(
    args: &DesignArgs,
    mut source: PlanSource,
    request: &VariablesRequest,
) -> Result<Outcome, Error> {
    let solution = solve_variables(request).map_err(|e| design_error(args, e))?;
    source.record_variables(&solution);
    let report = VariablesDesignReport::new(&source.title, &solution);
    report.check()?;
    finish(args, &report, &source)
}

/// `design FILE` of a minimum-inspection source: solved as `rectify`
/// solves it, recorded when it is written, and reported.
fn rectifying(args: &DesignArgs, mut source: PlanSource, path: &Path) -> Result<Outcome, Error> {
    let invalid = |e| SourceError::Invalid {
        path: path.to_path_buf(),
        source: e,
    };
    let request = source.rectifying_request().map_err(invalid)?;
    let design = design_rectifying(&request).map_err(|e| design_error(args, e))?;
    let report = RectifyingReport::new(&source.title, &design);
    report.check()?;
    let written = args.in_place || args.output.output.is_some();
    if written || args.format.format == DesignFormat::Yaml {
        source.record_rectifying(&design).map_err(invalid)?;
    }
    finish(args, &report, &source)
}

/// `design FILE` of a standard-indexed source: its plans read from the
/// tables (its own tables read from beside it as they are now, their
/// hashes recorded anew), recorded, and reported.
fn standard(args: &DesignArgs, mut source: PlanSource, path: &Path) -> Result<Outcome, Error> {
    source.record_standard_at(path)?;
    let report = StandardPlansReport::new(&source).map_err(|e| SourceError::Invalid {
        path: path.to_path_buf(),
        source: e,
    })?;
    finish(args, &report, &source)
}

/// Writes the solved source where asked, then prints the report, or with
/// `--format yaml` the source itself.
fn finish(args: &DesignArgs, report: &impl Report, source: &PlanSource) -> Result<Outcome, Error> {
    write_source(args, source)?;
    let text = match args.format.format {
        DesignFormat::Table => report_bytes(report, Format::Table)?,
        DesignFormat::Json => report_bytes(report, Format::Json)?,
        DesignFormat::Yaml => source.to_yaml().into_bytes(),
    };
    print_out(&text)?;
    Ok(Outcome::Ok)
}

/// A designer's refusal, naming the source it came from.
fn design_error(args: &DesignArgs, e: DesignError) -> Error {
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
fn write_source(args: &DesignArgs, source: &PlanSource) -> Result<(), Error> {
    if let (true, Some(path)) = (args.in_place, &args.source) {
        write_atomic(
            path,
            source.to_yaml().as_bytes(),
            lotsman::Overwrite::Replace,
        )?;
        say(format_args!("re-solved {} in place", shown(path)));
    }
    if let Some(target) = &args.output.output {
        refuse_overwriting_input(target, args.source.as_deref(), true)?;
        write_atomic(target, source.to_yaml().as_bytes(), args.output.overwrite())?;
        say(format_args!("wrote plan source {}", shown(target)));
    }
    Ok(())
}

/// `design --output` (and `standard --output`) writes a plan source, so its name must end in
/// `.yaml` or `.yml`: the name the folder search finds, and not a PDF
/// (the sheet is printed from the source by `lotsman sheet`).
pub(crate) fn refuse_non_yaml_output(output: Option<&Path>) -> Result<(), InputError> {
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
