//! `history LOG.csv`: each lot's first sample against its control limits
//! and the running process average, as a table and a chart.

use lotsman::{
    Error, HistoryReport, Ledger, Outcome, ledger_history, ledger_plans, render_history,
    write_atomic,
};

use crate::cli::history::HistoryArgs;
use crate::out::{page_format, print_report, say, shown};

pub fn run(args: HistoryArgs) -> Result<Outcome, Error> {
    let chart = match &args.output.output {
        None => None,
        Some(path) => Some((path, page_format(path, "the chart is")?)),
    };
    let ledger = Ledger::read(&args.ledger)?;
    let plans = ledger_plans(&ledger, &args.plan)?;
    let history = ledger_history(&ledger, &plans, args.class.as_deref())?;
    if let Some((path, format)) = chart {
        let title = format!("Lot history: {}", shown(&args.ledger));
        let bytes = render_history(&history, &title, format)?;
        write_atomic(path, &bytes, args.output.overwrite())?;
        say(format_args!("wrote {}", shown(path)));
    }
    print_report(
        &HistoryReport {
            ledger: args.ledger,
            history,
        },
        args.report.format.into(),
    )?;
    Ok(Outcome::Ok)
}
