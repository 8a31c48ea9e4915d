//! Judging a lot at the receiving dock, and recording it: the posted
//! counts (or pasted readings) become the arguments of `lotsman judge
//! PLAN.yaml --record LEDGER --lot ID --seed-from-lot`, and the lot takes
//! the path of that command ([`judge_lot`]): shown first without writing
//! ([`Mode::Preview`]), then appended to the ledger under its lock
//! ([`Mode::Record`]), refused in the command's words.

use std::collections::HashMap;

use lotsman::{Audited, Decision, Error, InputError, Readings, parse_measurements, text_sha256};

use super::lot_plan::{Entry, InForce, LotFields};
use crate::cli::groups::FormatFlag;
use crate::cli::judge::{JudgeArgs, JudgeFormat, RecordFlags};
use crate::commands::judge::budget;
use crate::commands::record::{Measurements, Mode, judge_lot};

/// The decision as the page shows it.
pub struct Judged {
    /// ACCEPT, REJECT or GO ON, in large type.
    pub word: &'static str,
    /// The style of the answer: `accept`, `reject` or `continue`.
    pub style: &'static str,
    /// What to do next, in words.
    pub next: String,
    /// The normality and spread warnings of a variables lot.
    pub warnings: Vec<String>,
    /// The decision's report, as `judge` prints it.
    pub report: String,
    /// The row written, when the lot was recorded.
    pub seq: Option<u64>,
}

/// Judges the lot of `fields` by the plan in force, and records it in
/// [`Mode::Record`].
pub fn judge(
    shown: &InForce,
    lot: &LotFields,
    fields: &HashMap<String, String>,
    mode: Mode,
) -> Result<Judged, Error> {
    if lot.lot.is_empty() {
        return Err(InputError::Inconsistent(
            "the lot ID is empty; give the lot's ID as written on its label".to_string(),
        )
        .into());
    }
    if let Some(why) = &shown.discontinued {
        return Err(InputError::Inconsistent(why.clone()).into());
    }
    let text = |key: &str| {
        fields
            .get(key)
            .map(|v| v.trim())
            .filter(|v| !v.is_empty())
            .map(str::to_string)
    };
    let Counts {
        found,
        inspected,
        readings,
        stages,
    } = counts(shown, &text, fields)?;
    let args = JudgeArgs {
        source: shown.plan_path.clone(),
        found,
        measurements: None,
        column: None,
        inspected,
        accept_recorded: false,
        severity: None,
        record: RecordFlags {
            record: Some(shown.ledger_path.clone()),
            lot: Some(lot.lot.clone()),
            date: None,
            inspector: text("inspector"),
            note: text("note"),
            resubmitted: false,
            seed: None,
            seed_from_lot: true,
            corrective_action: None,
            lot_size: Some(lot.lot_size.clone()).filter(|s| !s.is_empty()),
        },
        report: FormatFlag {
            format: JudgeFormat::Table,
        },
    };
    let audited = Audited::load_checked(&args.source, false, budget(&args.source))?;
    let log = shown.ledger_path.clone();
    let judged = judge_lot(&args, &log, audited, readings, mode)?;
    let (word, style, next) = match judged.decision {
        Decision::Accept => ("ACCEPT", "accept", "accept the lot".to_string()),
        Decision::Reject => ("REJECT", "reject", "reject the lot".to_string()),
        Decision::Continue => ("GO ON", "continue", go_on(shown, stages)),
    };
    Ok(Judged {
        word,
        style,
        next,
        warnings: judged.warnings,
        report: String::from_utf8_lossy(&judged.report).into_owned(),
        seq: judged.seq,
    })
}

/// What the form says was found, as `judge` takes it.
struct Counts {
    /// The `--found` texts.
    found: Vec<String>,
    /// `--inspected`, for an item-by-item plan.
    inspected: Option<String>,
    readings: Measurements<'static>,
    /// The stages whose counts were given.
    stages: usize,
}

/// What the form says was found, as the plan in force takes it.
fn counts(
    shown: &InForce,
    text: &impl Fn(&str) -> Option<String>,
    fields: &HashMap<String, String>,
) -> Result<Counts, Error> {
    let none = |what: &str| Error::from(InputError::Inconsistent(what.to_string()));
    match shown.entry {
        Entry::Stages => {
            // The stages inspected: the counts up to the first empty one.
            let found: Vec<String> = (1..).map_while(|i| text(&format!("found_{i}"))).collect();
            if found.is_empty() {
                return Err(none("enter the count found in stage 1's units"));
            }
            Ok(Counts {
                stages: found.len(),
                found,
                inspected: None,
                readings: Measurements::None,
            })
        }
        Entry::Items => {
            let found = text("found_1")
                .ok_or_else(|| none("enter the count found so far in the units inspected"))?;
            let inspected = text("inspected").ok_or_else(|| {
                none("enter the number of units inspected so far, one at a time in the order drawn")
            })?;
            Ok(Counts {
                found: vec![found],
                inspected: Some(inspected),
                readings: Measurements::None,
                stages: 1,
            })
        }
        Entry::Classes => {
            let (mut found, mut stages) = (Vec::new(), 0);
            for class in &shown.classes {
                let counts = text(&class.field).ok_or_else(|| {
                    none(&format!(
                        "enter the count found for {} (one count per stage inspected, as 1 or 1,3)",
                        class.label
                    ))
                })?;
                stages = stages.max(counts.split(',').count());
                match &class.name {
                    Some(name) => found.push(format!("{name}={counts}")),
                    None => found.extend(counts.split(',').map(|k| k.trim().to_string())),
                }
            }
            Ok(Counts {
                found,
                inspected: None,
                readings: Measurements::None,
                stages,
            })
        }
        Entry::Readings => {
            let pasted = fields.get("readings").map(String::as_str).unwrap_or("");
            if pasted.trim().is_empty() {
                return Err(none(
                    "paste the sample's readings, one value per line, with decimal points",
                ));
            }
            let readings = Readings {
                values: parse_measurements(pasted, None)?,
                sha256: text_sha256(pasted),
            };
            Ok(Counts {
                found: Vec::new(),
                inspected: None,
                readings: Measurements::Given(readings),
                stages: 1,
            })
        }
    }
}

/// What to inspect next when the lot is not decided yet.
fn go_on(shown: &InForce, given: usize) -> String {
    match shown.entry {
        Entry::Items => {
            "inspect the next item in the order drawn, then enter the units inspected and the count so far".to_string()
        }
        _ => {
            let sample = shown
                .classes
                .iter()
                .filter_map(|c| c.stages.get(given).map(|s| s.sample))
                .max();
            match sample {
                Some(n) => format!(
                    "inspect stage {}: {n} more units (the units drawn for it), then enter its count beside the others",
                    given + 1
                ),
                None => "inspect the next stage, then enter its count beside the others"
                    .to_string(),
            }
        }
    }
}
