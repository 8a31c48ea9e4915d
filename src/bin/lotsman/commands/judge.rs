//! `judge`: decide a lot by the plan a source records, from the counts
//! found or from the sample's measurements.

use std::path::Path;

use lotsman::{
    Audited, Error, InputError, JudgeReport, MeasurementJudgeReport, Outcome, PlanSource,
    SourceError, SourceJob, StandardJudgeReport, check_source, judge, judge_cumulative,
    judge_measurements, read_measurements,
};

use crate::cli::judge::{Found, JudgeArgs};
use crate::out::{print_out, report_bytes, warn_accepted};

/// What was done with a recorded plan used at the user's request although
/// the audit does not confirm it, for [`warn_accepted`].
const DECIDED_AS_RECORDED: &str = "the lot is decided by the plan as recorded (--accept-recorded), with the discrepancy stated beside the decision";

pub fn run(args: JudgeArgs) -> Result<Outcome, Error> {
    if let (Some(csv), None) = (&args.measurements, &args.record.record) {
        return by_measurements(&args, csv);
    }
    let audited = Audited::load_checked(&args.source, args.accept_recorded, budget(&args.source))?;
    if let Some(log) = args.record.record.clone() {
        let (text, accepted) = super::record::run(&args, &log, audited)?;
        return print_warned(&args, &text, accepted);
    }
    if audited.source.is_standard() {
        return by_classes(&args, audited);
    }
    if args.severity.is_some() {
        return Err(not_standard("--severity"));
    }
    let invalid = |e| SourceError::Invalid {
        path: args.source.clone(),
        source: e,
    };
    let model = audited.source.staged_model().map_err(invalid)?;
    let plan = audited.source.recorded_plan(&model).map_err(invalid)?;
    let judgement = match Found::try_from(&args)? {
        Found::Stages(counts) => judge(&plan, &model, &counts)?,
        Found::Cumulative { inspected, found } => {
            judge_cumulative(&plan, &model, inspected, found)?
        }
    };
    let accepted = audited.accepted.map(|d| d.to_string());
    let report = JudgeReport {
        judgement,
        plan,
        source: args.source.clone(),
        accepted_recorded: accepted.clone(),
    };
    print_warned(
        &args,
        &report_bytes(&report, args.report.format.into())?,
        accepted,
    )
}

/// A standard-indexed source: every class judged by its own plan at the
/// severity in force (or `--severity`), and the lot overall.
fn by_classes(args: &JudgeArgs, audited: Audited) -> Result<Outcome, Error> {
    if args.inspected.is_some() {
        return Err(InputError::Inconsistent(
            "--inspected is for item-by-item plans; a standard-indexed plan takes the counts of each stage, --found CLASS=K,K,..".to_string(),
        )
        .into());
    }
    let found: Vec<&str> = args.found.iter().map(String::as_str).collect();
    let judged =
        audited
            .source
            .judge_standard(&args.source, args.severity.map(Into::into), &found)?;
    let accepted = audited.accepted.map(|d| d.to_string());
    let report = StandardJudgeReport {
        verdict: judged.verdict,
        plans: judged.plans,
        severity: judged.severity,
        source: args.source.clone(),
        accepted_recorded: accepted.clone(),
    };
    print_warned(
        args,
        &report_bytes(&report, args.report.format.into())?,
        accepted,
    )
}

/// The refusal of a flag that only a standard-indexed source takes.
fn not_standard(flag: &str) -> Error {
    InputError::Inconsistent(format!(
        "{flag} applies to standard-indexed plans (scheme: standard) only, and this source is designed from its own risk points"
    ))
    .into()
}

/// `judge --measurements`: a variables plan decides from the sample.
fn by_measurements(args: &JudgeArgs, csv: &Path) -> Result<Outcome, Error> {
    if args.severity.is_some() {
        return Err(not_standard("--severity"));
    }
    let (audited, request, plan) = PlanSource::load_with_variables_plan(
        &args.source,
        args.accept_recorded,
        budget(&args.source),
    )?;
    let readings = read_measurements(csv, args.column.as_deref())?;
    let judgement =
        judge_measurements(&plan, &readings.values, request.risks().producer().quality)?;
    judgement.check()?;
    let accepted = audited.accepted.map(|d| d.to_string());
    let report = MeasurementJudgeReport {
        judgement,
        plan,
        source: args.source.clone(),
        accepted_recorded: accepted.clone(),
    };
    print_warned(
        args,
        &report_bytes(&report, args.report.format.into())?,
        accepted,
    )
}

/// The work-budget check of `judge` on the source at `path`: its audit
/// re-solves the source before the lot is decided.
pub fn budget(path: &Path) -> impl FnOnce(&PlanSource) -> Result<(), Error> + '_ {
    move |source| {
        check_source(source, path, SourceJob::Judge).map_err(|e| InputError::from(e).into())
    }
}

/// Prints the decision, after the warning of a plan used as recorded.
fn print_warned(args: &JudgeArgs, text: &[u8], accepted: Option<String>) -> Result<Outcome, Error> {
    warn_accepted(&args.source, accepted.as_deref(), DECIDED_AS_RECORDED);
    print_out(text)?;
    Ok(Outcome::Ok)
}
