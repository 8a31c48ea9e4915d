//! `status LOG.csv`: the severity and plan of the next lot, the counters
//! behind the switching rules, and the supplier's process average.

use lotsman::{Error, Ledger, Outcome, StatusReport, ledger_plans, ledger_status};

use crate::cli::status::StatusArgs;
use crate::out::print_report;

pub fn run(args: StatusArgs) -> Result<Outcome, Error> {
    let ledger = Ledger::read(&args.ledger)?;
    let plans = ledger_plans(&ledger, &args.plan)?;
    let status = ledger_status(&ledger, &plans)?;
    print_report(
        &StatusReport {
            ledger: args.ledger,
            status,
        },
        args.report.format.into(),
    )?;
    Ok(Outcome::Ok)
}
