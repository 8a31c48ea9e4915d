//! `evaluate`: a plan given by its numbers, one plan source, or a batch of
//! them.

use std::path::Path;

use lotsman::{
    Error, EvaluationBatchReport, EvaluationEntry, EvaluationReport, InputError, Model, Outcome,
    SourceEvaluation, SourceJob, SourceText, default_qualities, evaluate, evaluate_text,
    evaluate_with_decided, expand_paths, write_report,
};

use super::batch::{check, finish_batch, read_all, run_batch};
use crate::cli::evaluate::EvaluateArgs;
use crate::cli::values::ReportFormatArg;
use crate::out::{print_out, print_report, warn_accepted};

/// What was done with a recorded plan used at the user's request although
/// the audit does not confirm it, for [`warn_accepted`].
const EVALUATED_AS_RECORDED: &str =
    "evaluated as recorded (--accept-recorded), with the discrepancy stated in the report";

pub fn run(args: EvaluateArgs) -> Result<Outcome, Error> {
    if args.decided_at && args.report.format != ReportFormatArg::Json {
        return Err(InputError::Inconsistent(
            "--decided-at adds the per-stage distribution to the JSON report; give --format json"
                .to_string(),
        )
        .into());
    }
    match args.sources.as_slice() {
        [] => plan(&args),
        [one] if !one.is_dir() => source(&args, one),
        _ => sources(&args),
    }
}

/// `evaluate --n --c` or `--stage`: a plan given by its numbers.
fn plan(args: &EvaluateArgs) -> Result<Outcome, Error> {
    let model = Model::try_from(&args.model)?;
    let plan = args.plan(&model)?;
    let mut qualities = args.qualities([model.kind()])?;
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
    print_report(&report, args.report.format.into())?;
    Ok(Outcome::Ok)
}

/// `evaluate FILE`: the plan one source records, the source read once.
fn source(args: &EvaluateArgs, path: &Path) -> Result<Outcome, Error> {
    let read = SourceText::read(path);
    // The model, for the note on bare fractions; a source that does not
    // load is refused below, after the flags.
    let kind = read
        .as_ref()
        .ok()
        .and_then(|r| r.parse().ok())
        .map(|s| s.model);
    let qualities = args.qualities(kind)?;
    let lot = args.model.lot()?;
    let evaluation = evaluate_text(
        &read?,
        &qualities,
        lot,
        args.accept_recorded,
        args.decided_at,
    )?;
    let mut text = Vec::new();
    let format = args.report.format.into();
    match &evaluation {
        SourceEvaluation::Attributes(r) => write_report(r, format, &mut text)?,
        SourceEvaluation::Variables(r) => write_report(r, format, &mut text)?,
        SourceEvaluation::Standard(r) => write_report(r, format, &mut text)?,
    }
    warn_accepted(path, evaluation.accepted_recorded(), EVALUATED_AS_RECORDED);
    print_out(&text)?;
    Ok(Outcome::Ok)
}

/// `evaluate` over several sources or folders: every source evaluated,
/// the summary after the table, or on stderr beside JSON and CSV.
fn sources(args: &EvaluateArgs) -> Result<Outcome, Error> {
    let entries = read_all(expand_paths(&args.sources));
    let kinds = entries
        .iter()
        .flatten()
        .filter_map(|read| read.parse().ok())
        .map(|s| s.model);
    let qualities = args.qualities(kinds)?;
    let lot = args.model.lot()?;
    let job = SourceJob::Evaluate {
        points: (!qualities.is_empty()).then_some(qualities.len()),
        decided_at: args.decided_at,
    };
    check(entries.iter().map(Result::as_ref), job)?;
    let results = run_batch(&entries, "sources evaluated", |entry| match entry {
        Ok(read) => EvaluationEntry::new(
            read.path.display().to_string(),
            evaluate_text(read, &qualities, lot, args.accept_recorded, args.decided_at)
                .map_err(|e| e.to_string()),
        ),
        Err(unread) => EvaluationEntry::new(
            unread.path.display().to_string(),
            Err(unread.message.clone()),
        ),
    });
    for e in &results {
        if let Some(evaluation) = &e.evaluation {
            let accepted = evaluation.accepted_recorded();
            warn_accepted(Path::new(&e.path), accepted, EVALUATED_AS_RECORDED);
        }
    }
    let report = EvaluationBatchReport { results };
    print_report(&report, args.report.format.into())?;
    Ok(finish_batch(
        &report.summary(),
        args.report.format == ReportFormatArg::Table,
    ))
}
