//! `sheet`: print the sheet of one source, or of every source of a batch.

use std::path::Path;

use lotsman::{
    BatchSummary, Error, InputError, Outcome, SheetNotes, SheetOptions, SourceFile, SourceJob,
    SourceText, escape_controls, expand_paths, normalise_folder, sheet_target, sheet_targets,
    write_source_sheet,
};

use super::batch::{Unread, check, read, run_batch};
use crate::cli::sheet::SheetArgs;
use crate::out::{print_out, say, shown, warn_accepted};

/// What was done with a recorded plan used at the user's request although
/// the audit does not confirm it, for [`warn_accepted`].
const PRINTED_AS_RECORDED: &str =
    "printed as recorded (--accept-recorded), with the discrepancy stated on the sheet";

pub fn run(args: SheetArgs) -> Result<Outcome, Error> {
    let options = SheetOptions::from(&args);
    // `x/../y/../z` creates `z` only, never the folders it steps out of.
    let output_dir = args.output_dir.as_deref().map(normalise_folder);
    let output_dir = output_dir.as_deref();
    let batch = args.sources.len() > 1 || args.sources.iter().any(|p| p.is_dir());
    if !batch {
        let source = &args.sources[0];
        let out = match &args.output {
            Some(out) => out.clone(),
            None => {
                let named = SourceFile {
                    path: source.clone(),
                    below: None,
                };
                sheet_target(&named, output_dir)
            }
        };
        let read = SourceText::read(source)?;
        let notes = write_source_sheet(&read, &out, &options, output_dir.is_some())?;
        warn_notes(source, &notes);
        say(format_args!("wrote sheet {}", shown(&out)));
        return Ok(Outcome::Ok);
    }
    if args.output.is_some() {
        return Err(InputError::Inconsistent(
            "--output names one PDF; for several sources or a folder use --output-dir DIR"
                .to_string(),
        )
        .into());
    }
    let planned: Vec<Result<_, Unread>> = sheet_targets(expand_paths(&args.sources), output_dir)
        .into_iter()
        .map(|entry| {
            let (file, target) = entry?;
            Ok((read(&file)?, target))
        })
        .collect();
    check(
        planned.iter().map(|e| e.as_ref().map(|(read, _)| read)),
        SourceJob::Sheet,
    )?;
    let results = run_batch(&planned, "sheets written", |entry| match entry {
        Ok((read, target)) => (
            read.path.clone(),
            write_source_sheet(read, target, &options, output_dir.is_some())
                .map_err(|e| e.to_string()),
        ),
        Err(unread) => (unread.path.clone(), Err(unread.message.clone())),
    });
    let mut summary = BatchSummary::new("written", false);
    for (path, result) in &results {
        let shown = path.display().to_string();
        match result {
            Ok(notes) => {
                warn_notes(path, notes);
                summary.push(&shown, Outcome::Ok, "");
            }
            Err(message) => summary.push(&shown, Outcome::Invalid, message),
        }
    }
    print_out(summary.to_string().as_bytes())?;
    Ok(summary.worst())
}

/// The warnings of a sheet written from `source`: the discrepancy it
/// states, and one line per field that still holds a template's
/// placeholder.
fn warn_notes(source: &Path, notes: &SheetNotes) {
    let accepted = notes.accepted.as_ref().map(|d| d.to_string());
    warn_accepted(source, accepted.as_deref(), PRINTED_AS_RECORDED);
    for p in &notes.placeholders {
        say(format_args!(
            "warning: {}: {}",
            shown(source),
            escape_controls(&p.to_string())
        ));
    }
}
