//! `verify LOG.csv`: replay a ledger and print every break.

use std::path::Path;

use lotsman::{Error, KnownPlan, Ledger, LedgerVerifyReport, Outcome, replay};

use crate::cli::verify::VerifyArgs;
use crate::out::print_report;

/// Replays the ledger at `log` against the `--plan` sources.
pub fn run(args: &VerifyArgs, log: &Path) -> Result<Outcome, Error> {
    if !args.sheet.is_empty() {
        return Err(lotsman::InputError::Inconsistent(
            "--sheet checks a plan source's sheet; a ledger has none: verify the ledger without --sheet".to_string(),
        )
        .into());
    }
    let plans = args
        .plan
        .iter()
        .map(|p| KnownPlan::load(p))
        .collect::<Result<Vec<_>, _>>()?;
    let ledger = Ledger::read(log)?;
    let report = LedgerVerifyReport {
        ledger: log.to_path_buf(),
        replay: replay(&ledger, &plans),
    };
    print_report(&report, args.report.format.into())?;
    Ok(if report.holds() {
        Outcome::Ok
    } else {
        Outcome::Mismatch
    })
}
