//! `standard`: look a plan up in the standard's tables, with every
//! severity's plan, the OC curves and the risks the plan really gives.

use lotsman::{Error, Outcome, StandardReport, StandardRequest, Tables, assess, read_user_table};

use crate::cli::standard::{StandardArgs, table_of};
use crate::out::print_report;

pub fn run(args: StandardArgs) -> Result<Outcome, Error> {
    let request = StandardRequest::try_from(&args)?;
    let mut tables = Tables::builtin()?.clone();
    for text in &args.table {
        let (severity, path) = table_of(text, request.severity());
        tables = tables.with_user_table(&read_user_table(&path, severity)?);
    }
    let at = args.at(&request)?;
    let consumer = args.consumer(&request)?;
    let assessment = assess(&request, &tables, at.as_deref(), consumer)?;
    print_report(
        &StandardReport::from(&assessment),
        args.report.format.into(),
    )?;
    Ok(Outcome::Ok)
}
