//! `verify LOG.csv`: replay a ledger and print every break.

use std::path::Path;

use lotsman::{Error, Format, KnownPlan, Ledger, Outcome, replay};

use crate::cli::verify::VerifyArgs;
use crate::out::print_out;

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
    let result = replay(&ledger, &plans);
    let format: Format = args.report.format.into();
    let text = if format == Format::Csv {
        let mut writer = csv::Writer::from_writer(Vec::new());
        let mut rows = vec![[
            "line".to_string(),
            "seq".into(),
            "field".into(),
            "message".into(),
        ]];
        for f in &result.findings {
            rows.push([
                f.line.to_string(),
                f.seq.map_or(String::new(), |s| s.to_string()),
                f.field.to_string(),
                f.message.clone(),
            ]);
        }
        for row in rows {
            writer.write_record(&row).map_err(std::io::Error::other)?;
        }
        String::from_utf8_lossy(
            &writer
                .into_inner()
                .map_err(|e| std::io::Error::other(e.to_string()))?,
        )
        .into_owned()
    } else if format == Format::Json {
        let mut text = serde_json::to_string_pretty(&result).map_err(std::io::Error::other)?;
        text.push('\n');
        text
    } else {
        let mut text = format!(
            "{}: {} lot{}, {}\n",
            log.display(),
            result.rows,
            if result.rows == 1 { "" } else { "s" },
            if result.findings.is_empty() {
                "the chain holds".to_string()
            } else {
                format!("{} findings", result.findings.len())
            }
        );
        for f in &result.findings {
            let seq = f.seq.map_or(String::new(), |s| format!(" (seq {s})"));
            text.push_str(&format!(
                "  line {}{seq}, {}: {}\n",
                f.line, f.field, f.message
            ));
        }
        if !result.plans_checked {
            text.push_str("  the severities and decisions were not checked: give the plan sources with --plan\n");
        } else if let Some(state) = &result.state {
            text.push_str(&format!(
                "  the next lot: {} inspection\n",
                state.standing()
            ));
        }
        text
    };
    print_out(text.as_bytes())?;
    Ok(if result.findings.is_empty() {
        Outcome::Ok
    } else {
        Outcome::Mismatch
    })
}
