//! `status LOG.csv`: the severity and plan of the next lot, the counters
//! behind the switching rules, and the supplier's process average.

use lotsman::{Error, KnownPlan, Ledger, Outcome, StatusReport, ledger_status, plans_beside};

use crate::cli::status::StatusArgs;
use crate::out::print_report;

pub fn run(args: StatusArgs) -> Result<Outcome, Error> {
    let ledger = Ledger::read(&args.ledger)?;
    let plans = if args.plan.is_empty() {
        plans_beside(&ledger)?
    } else {
        args.plan
            .iter()
            .map(|p| KnownPlan::load(p))
            .collect::<Result<Vec<_>, _>>()?
    };
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
