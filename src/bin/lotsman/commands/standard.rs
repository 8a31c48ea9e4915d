//! `standard`: look a plan up in the standard's tables, with every
//! severity's plan, the OC curves and the risks the plan really gives;
//! with `--output`, the plan source that records it.

use std::path::Path;

use lotsman::{
    ConsumerPoint, Error, InputError, Outcome, PlanSource, STANDARD_ALPHA, StandardAssessment,
    StandardReport, StandardRequest, TableFileSource, Tables, UserTable, assess, read_user_table,
    relative_table_path, write_atomic,
};

use super::design::refuse_non_yaml_output;
use crate::cli::standard::{StandardArgs, table_of};
use crate::out::{print_report, say, shown};

pub fn run(args: StandardArgs) -> Result<Outcome, Error> {
    refuse_non_yaml_output(args.output.output.as_deref())?;
    let request = StandardRequest::try_from(&args)?;
    let mut tables = Tables::builtin()?.clone();
    let mut users = Vec::new();
    for text in &args.table {
        let (severity, path) = table_of(text, request.severity());
        let user = read_user_table(&path, severity)?;
        tables = tables.with_user_table(&user);
        users.push((path, user));
    }
    let at = args.at(&request)?;
    let consumer = args.consumer(&request)?;
    let assessment = assess(&request, &tables, at.as_deref(), consumer)?;
    if let Some(target) = &args.output.output {
        write_source(&args, target, &assessment, consumer, &users)?;
    }
    print_report(
        &StandardReport::from(&assessment),
        args.report.format.into(),
    )?;
    Ok(Outcome::Ok)
}

/// Writes the plan source of `assessment` to `target`: the index, the
/// consumer's point, the user tables by their path from the source's
/// folder and their SHA-256, and every severity's plans.
fn write_source(
    args: &StandardArgs,
    target: &Path,
    assessment: &StandardAssessment,
    consumer: Option<ConsumerPoint>,
    users: &[(std::path::PathBuf, UserTable)],
) -> Result<(), Error> {
    if let Some(point) = consumer
        && point.alpha != STANDARD_ALPHA
    {
        return Err(InputError::Inconsistent(format!(
            "--alpha {} sets the producer's risk of the two-point design shown beside the table plan, and a plan source keeps {STANDARD_ALPHA} for it (the AQL is its index): leave --alpha out when writing --output",
            point.alpha
        ))
        .into());
    }
    let mut records = Vec::with_capacity(users.len());
    for (path, user) in users {
        let file = relative_table_path(path, target)?;
        records.push(TableFileSource::for_user_table(file, user));
    }
    let title = args.title.as_deref().unwrap_or("Untitled plan");
    let mut source = PlanSource::from_assessment(title, assessment, consumer, records)?;
    source.describe((&args.description).into())?;
    write_atomic(target, source.to_yaml().as_bytes(), args.output.overwrite())?;
    say(format_args!("wrote plan source {}", shown(target)));
    Ok(())
}
