//! `verify`: re-solve every source and compare, and check the sheets
//! named beside them.

use lotsman::{
    Error, InputError, Outcome, SourceJob, VerificationReport, VerifyEntry, VerifyStatus,
    check_sheet, check_sheet_entry, check_sheet_text, expand_paths, verify_text,
};

use std::io::{BufRead, BufReader, Read};
use std::path::Path;

use super::batch::{check, finish_batch, read_all, run_batch};
use crate::cli::values::ReportFormatArg;
use crate::cli::verify::VerifyArgs;
use crate::out::print_report;

pub fn run(args: VerifyArgs) -> Result<Outcome, Error> {
    if let [log] = args.sources.as_slice()
        && is_ledger(log)
    {
        return super::verify_ledger::run(&args, log);
    }
    if let Some(plan) = args.plan.first() {
        return Err(InputError::Inconsistent(format!(
            "--plan {} names the plan of a ledger's rows, and no ledger was given: verify a ledger with lotsman verify LOG.csv --plan {}",
            plan.display(),
            plan.display()
        ))
        .into());
    }
    if !args.sheet.is_empty() {
        if let Some(folder) = args.sources.iter().find(|p| p.is_dir()) {
            return Err(InputError::Inconsistent(format!(
                "--sheet pairs each sheet with a source named on the command line, and {} is a folder; name its sources one by one, or verify the folder without --sheet",
                folder.display()
            ))
            .into());
        }
        if args.sheet.len() != args.sources.len() {
            return Err(InputError::Inconsistent(format!(
                "--sheet was given {} times for {} sources; give one sheet per source, in the same order",
                args.sheet.len(),
                args.sources.len()
            ))
            .into());
        }
    }
    let entries = read_all(expand_paths(&args.sources));
    check(entries.iter().map(Result::as_ref), SourceJob::Verify)?;
    if !args.sheet.is_empty() && entries.len() != args.sources.len() {
        return Err(InputError::Inconsistent(
            "--sheet pairs sheets with sources in order, and a source is named twice; name each source once".to_string(),
        )
        .into());
    }
    let mut results = run_batch(&entries, "sources verified", |entry| match entry {
        Ok(read) => verify_text(read),
        Err(unread) => VerifyEntry {
            path: unread.path.display().to_string(),
            status: VerifyStatus::Invalid,
            differences: Vec::new(),
            message: Some(unread.message.clone()),
        },
    });
    let named = entries.iter().zip(&args.sources).zip(&args.sheet);
    for (result, ((entry, source), pdf)) in results.iter_mut().zip(named) {
        // A source that could not be read is tried again by the check, which
        // then says why of the sheet or of the source, as it finds first.
        let verdict = match entry {
            Ok(read) => check_sheet_text(read, pdf),
            Err(_) => check_sheet(source, pdf),
        };
        check_sheet_entry(result, pdf, verdict);
    }
    let report = VerificationReport {
        results,
        every_source: args.list,
    };
    print_report(&report, args.report.format.into())?;
    Ok(finish_batch(
        &report.summary(),
        args.report.format == ReportFormatArg::Table,
    ))
}

/// Whether the file at `path` starts with the ledger's header line.
pub fn is_ledger(path: &Path) -> bool {
    let Ok(file) = std::fs::File::open(path) else {
        return false;
    };
    let mut first = String::new();
    let limit = lotsman::ledger_header().len() as u64 + 2;
    if BufReader::new(file)
        .take(limit)
        .read_line(&mut first)
        .is_err()
    {
        return false;
    }
    first.trim_end_matches(['\n', '\r']) == lotsman::ledger_header()
}
