//! `history LOG.csv`: each lot's first sample against its control limits
//! and the running process average, as a table and a chart.

use lotsman::{
    Error, HistoryFormat, HistoryReport, InputError, Ledger, Outcome, ledger_history, ledger_plans,
    render_history, write_atomic,
};

use crate::cli::history::HistoryArgs;
use crate::out::{print_report, say, shown};

pub fn run(args: HistoryArgs) -> Result<Outcome, Error> {
    let chart = match &args.output.output {
        None => None,
        Some(path) => {
            let ext = path
                .extension()
                .and_then(|e| e.to_str())
                .map(str::to_ascii_lowercase);
            let format = match ext.as_deref() {
                Some("pdf") => HistoryFormat::Pdf,
                Some("svg") => HistoryFormat::Svg,
                _ => {
                    return Err(InputError::Inconsistent(format!(
                        "--output {}: the chart is drawn as a PDF or an SVG; name the file chart.pdf or chart.svg",
                        shown(path)
                    ))
                    .into());
                }
            };
            Some((path, format))
        }
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
