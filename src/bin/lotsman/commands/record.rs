//! `judge --record`: decide the lot under the ledger's lock, at the
//! severity its history requires, and append the decided lot.

use std::path::Path;

use lotsman::{
    Audited, Decided, Error, InputError, JudgeReport, KnownPlan, LedgerError, LotDate, LotEntry,
    PlanSource, StandardJudgeReport, append_lot, parse_count, replay,
};

use crate::cli::judge::{Found, JudgeArgs};
use crate::out::report_bytes;

/// Judges and records the lot of `args` by the audited source.
pub fn run(
    args: &JudgeArgs,
    log: &Path,
    audited: Audited,
) -> Result<(Vec<u8>, Option<String>), Error> {
    let flags = &args.record;
    if args.severity.is_some() {
        return Err(InputError::Inconsistent(
            "--severity and --record exclude each other: with --record the severity is the one the ledger's switching history requires".to_string(),
        )
        .into());
    }
    let lot = flags.lot.clone().unwrap_or_default();
    let date = match &flags.date {
        Some(text) => LotDate::parse(text),
        None => LotDate::today(),
    }
    .map_err(|m| InputError::Inconsistent(format!("--date: {m}")))?;
    let lot_size = match &flags.lot_size {
        Some(text) => Some(parse_count("--lot-size", text, u64::MAX)?),
        None => audited.source.lot_size,
    };
    let text = PlanSource::read_text(&args.source)?;
    let known = KnownPlan::from_source(&args.source, &text, &audited.source)?;
    let found = if known.rules().is_some() {
        None
    } else {
        Some(Found::try_from(args)?)
    };
    let invalid = |m: String| Error::from(InputError::Inconsistent(m));
    let (row, (decided, severity)) = append_lot(log, |ledger| {
        let (decided, severity) = if known.rules().is_some() {
            if args.inspected.is_some() {
                return Err(invalid("--inspected is for item-by-item plans; a standard-indexed plan takes the counts of each stage, --found CLASS=K,K,..".into()));
            }
            let state = replay(ledger, std::slice::from_ref(&known)).state;
            let Some(severity) = state.as_ref().and_then(lotsman::SwitchingState::severity) else {
                return Err(LedgerError::Refused {
                    path: log.to_path_buf(),
                    message: "inspection under the standard is discontinued: five lots were not accepted on tightened inspection (MIL-STD-105E 4.8); no lot is accepted under the standard until the supplier's corrective action, and the lot was not recorded".to_string(),
                }
                .into());
            };
            (
                known
                    .decide_classes(severity, &args.found)
                    .map_err(invalid)?,
                Some(severity),
            )
        } else {
            let decided = match &found {
                Some(Found::Stages(counts)) => known.decide_counts(counts, None),
                Some(Found::Cumulative { inspected, found }) => {
                    known.decide_counts(&[*found], Some(*inspected))
                }
                None => Err("no count was given".to_string()),
            }
            .map_err(invalid)?;
            (decided, None)
        };
        let entry = (decided.decision != lotsman::Decision::Continue).then(|| LotEntry {
            date,
            lot: lot.clone(),
            lot_size,
            plan_id: known.id.clone(),
            plan_revision: known.revision.clone(),
            plan_sha256: known.sha256.clone(),
            severity,
            code_letter: decided.code_letter.clone(),
            inspected: decided.inspected.clone(),
            found: decided.found.clone(),
            decision: decided.decision,
            inspector: flags.inspector.clone().unwrap_or_default(),
            note: flags.note.clone().unwrap_or_default(),
            seed: None,
            resubmitted: flags.resubmitted,
        });
        Ok::<_, Error>((entry, (decided, severity)))
    })?;
    let again = match &found {
        Some(Found::Cumulative { .. }) => {
            "judge it again with the units inspected in all and the cumulative count (--inspected N --found K)"
        }
        _ => "judge it again with every stage's count",
    };
    let note = match row {
        Some(row) => format!("recorded as seq {} in {}", row.seq, log.display()),
        None => format!(
            "not recorded in {}: the lot is not decided yet; inspect the next stage and {again}",
            log.display()
        ),
    };
    let accepted = audited.accepted.map(|d| d.to_string());
    let bytes = report(args, &known, decided, severity, accepted.clone())?;
    eprintln!("{note}");
    Ok((bytes, accepted))
}

/// The decision's report, as `judge` prints it without --record.
fn report(
    args: &JudgeArgs,
    known: &KnownPlan,
    decided: Decided,
    severity: Option<lotsman::Severity>,
    accepted: Option<String>,
) -> Result<Vec<u8>, Error> {
    let format = args.report.format.into();
    if let (Some(verdict), Some(severity)) = (decided.verdict, severity) {
        let plans = known.plans_at(severity).cloned().ok_or_else(|| {
            InputError::Inconsistent(format!("the source has no {severity} plan"))
        })?;
        let report = StandardJudgeReport {
            verdict,
            plans,
            severity,
            source: args.source.clone(),
            accepted_recorded: accepted,
        };
        return report_bytes(&report, format);
    }
    let (Some(judgement), Some((plan, _))) = (decided.judgement, known.counted_plan()) else {
        return Err(InputError::Inconsistent("the lot was not judged".to_string()).into());
    };
    let report = JudgeReport {
        judgement,
        plan: plan.clone(),
        source: args.source.clone(),
        accepted_recorded: accepted,
    };
    report_bytes(&report, format)
}
