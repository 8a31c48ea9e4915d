//! `judge`: decide a lot by the plan a source records, from the counts
//! found or from the sample's measurements.

use std::path::Path;

use lotsman::{
    Error, InputError, JudgeReport, MeasurementJudgeReport, Outcome, PlanSource, SourceJob,
    check_source, judge, judge_cumulative, judge_measurements, read_measurements,
};

use crate::cli::judge::{Found, JudgeArgs};
use crate::out::{print_out, report_bytes, warn_accepted};

/// What was done with a recorded plan used at the user's request although
/// the audit does not confirm it, for [`warn_accepted`].
const DECIDED_AS_RECORDED: &str = "the lot is decided by the plan as recorded (--accept-recorded), with the discrepancy stated beside the decision";

pub fn run(args: JudgeArgs) -> Result<Outcome, Error> {
    if let Some(csv) = &args.measurements {
        return by_measurements(&args, csv);
    }
    let (audited, model, plan) =
        PlanSource::load_with_plan(&args.source, args.accept_recorded, budget(&args.source))?;
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

/// `judge --measurements`: a variables plan decides from the sample.
fn by_measurements(args: &JudgeArgs, csv: &Path) -> Result<Outcome, Error> {
    let (audited, request, plan) = PlanSource::load_with_variables_plan(
        &args.source,
        args.accept_recorded,
        budget(&args.source),
    )?;
    let values = read_measurements(csv, args.column.as_deref())?;
    let judgement = judge_measurements(&plan, &values, request.risks().producer().quality)?;
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
fn budget(path: &Path) -> impl FnOnce(&PlanSource) -> Result<(), Error> + '_ {
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
