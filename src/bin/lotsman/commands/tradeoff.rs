//! `tradeoff`: solve the grid, and print or write it as a table, JSON, CSV
//! or a PDF heat map.

use std::sync::atomic::{AtomicUsize, Ordering};

use lotsman::{
    Error, Format, InputError, Outcome, TradeoffReport, TradeoffRequest, render_tradeoff_map,
    shell_word, tradeoff, write_atomic,
};

use crate::cli::tradeoff::{TradeoffArgs, TradeoffFormat};
use crate::out::{print_out, report_bytes, say, shown};
use crate::progress::Progress;

pub fn run(args: TradeoffArgs) -> Result<Outcome, Error> {
    let request = TradeoffRequest::try_from(&args)?;
    if args.report.format == TradeoffFormat::Pdf && args.output.output.is_none() {
        return Err(InputError::Inconsistent(
            "--format pdf writes a file: give --output FILE.pdf".to_string(),
        )
        .into());
    }
    let progress = Progress::start(request.cell_count(), "cells solved");
    let done = AtomicUsize::new(0);
    let grid = tradeoff(&request, &|| {
        progress.set(done.fetch_add(1, Ordering::Relaxed) + 1)
    });
    progress.finish();
    let report = TradeoffReport::new(args.title.as_deref(), &grid);
    report.check()?;
    let text = match args.report.format {
        TradeoffFormat::Pdf => {
            let title = args
                .title
                .as_deref()
                .unwrap_or("Trade-off of the risk points");
            let paper = args.paper.paper.into();
            render_tradeoff_map(&grid, title, Some(&regenerate_command()), paper)?.pdf
        }
        TradeoffFormat::Table => report_bytes(&report, Format::Table)?,
        TradeoffFormat::Json => report_bytes(&report, Format::Json)?,
        TradeoffFormat::Csv => report_bytes(&report, Format::Csv)?,
    };
    match &args.output.output {
        Some(path) => {
            write_atomic(path, &text, args.output.overwrite())?;
            say(format_args!("wrote {}", shown(path)));
        }
        None => print_out(&text)?,
    }
    Ok(Outcome::Ok)
}

/// This run's command line, as a shell would take it back (each argument
/// a shell word), with `--force` added when it is not there: the command
/// printed on a map regenerates it over the file it wrote.
fn regenerate_command() -> String {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let force = (!args.iter().any(|a| a == "--force")).then(|| "--force".to_string());
    std::iter::once("lotsman".to_string())
        .chain(args.iter().map(|a| shell_word(a)))
        .chain(force)
        .collect::<Vec<_>>()
        .join(" ")
}
