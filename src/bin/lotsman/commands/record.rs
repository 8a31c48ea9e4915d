//! `judge --record`: decide the lot under the ledger's lock, at the
//! severity its history requires, and append the decided lot. The web
//! face's inspection screen takes the same path ([`judge_lot`]), both to
//! show the decision before it is recorded and to record it.

use std::path::Path;

use lotsman::{
    Audited, Decided, Decision, Error, InputError, JudgeReport, KnownPlan, Ledger, LedgerError,
    LotDate, LotEntry, Measured, MeasurementJudgeReport, MeasurementJudgement, PlanSource,
    Readings, Severity, StandardJudgeReport, Tally, VariablesPlan, append_lot, draw_seed,
    judge_measurements, parse_count, placeholders, read_measurements, replay, text_sha256,
};

use crate::cli::judge::{Found, JudgeArgs};
use crate::out::{report_bytes, say};

/// Judges and records the lot of `args` by the audited source.
pub fn run(
    args: &JudgeArgs,
    log: &Path,
    audited: Audited,
) -> Result<(Vec<u8>, Option<String>), Error> {
    let readings = match &args.measurements {
        Some(csv) => Measurements::File(csv, args.column.as_deref()),
        None => Measurements::None,
    };
    let judged = judge_lot(args, log, audited, readings, Mode::Record)?;
    eprintln!("{}", judged.note);
    Ok((judged.report, judged.accepted))
}

/// Whether [`judge_lot`] appends the decided lot or only decides it.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Mode {
    /// Append the decided lot to the ledger, under its lock.
    Record,
    /// Decide the lot as recording would, on the ledger as it stands, and
    /// write nothing.
    Preview,
}

/// The measurements of a variables lot: a CSV file (`--measurements`,
/// `--column`), or readings already read (pasted into the web page).
pub enum Measurements<'a> {
    /// No measurements: the lot is decided from counts.
    None,
    /// A CSV file and the column to read.
    File(&'a Path, Option<&'a str>),
    /// Readings read elsewhere, with the SHA-256 of their text.
    Given(Readings),
}

/// A lot judged by the path of `judge --record`.
pub struct JudgedLot {
    /// The decision's report, as `judge` prints it.
    pub report: Vec<u8>,
    /// Accept, reject, or continue to the next stage.
    pub decision: Decision,
    /// The row's `seq`, when the lot was recorded.
    pub seq: Option<u64>,
    /// What was done with the ledger, in words.
    pub note: String,
    /// The normality and spread warnings of a variables lot.
    pub warnings: Vec<String>,
    /// The discrepancy of a recorded plan used as recorded.
    pub accepted: Option<String>,
}

/// Judges the lot of `args` by the audited source at the severity the
/// ledger at `log` requires, and in [`Mode::Record`] appends it.
pub fn judge_lot(
    args: &JudgeArgs,
    log: &Path,
    audited: Audited,
    readings: Measurements,
    mode: Mode,
) -> Result<JudgedLot, Error> {
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
    // The seed kept is one `lotsman draw` takes: a whole number, given, or
    // the one it derives from the lot ID and this source's SHA-256.
    let seed = match (&flags.seed, flags.seed_from_lot) {
        (Some(s), _) => Some(parse_count("seed (--seed)", s, u64::MAX)?.to_string()),
        (None, true) => Some(draw_seed(Some(&text_sha256(&text)), &lot).to_string()),
        (None, false) => None,
    };
    let known = KnownPlan::from_source(&args.source, &text, &audited.source)?;
    // The row keeps the source's id and revision as written: a template's
    // placeholder there would name no document for years.
    for p in placeholders(&audited.source)
        .iter()
        .filter(|p| matches!(p.field, "id" | "revision"))
    {
        say(format_args!(
            "warning: {}: the {} still holds the template's placeholder {}; the ledger keeps it in this row as written: fill in the source's {} before recording more lots",
            args.source.display(),
            p.field,
            p.text,
            p.field
        ));
    }
    let invalid = |m: String| Error::from(InputError::Inconsistent(m));
    if flags.corrective_action.is_some() && known.rules().is_none() {
        return Err(invalid(
            "--corrective-action resumes inspection under the standard's switching rules, and this plan has none: judge the lot without it".into(),
        ));
    }
    // Every plan but a standard-indexed one decides the lot whatever the
    // ledger holds: decided before the lock is taken.
    let fixed = match (readings, known.variables_plan()) {
        (Measurements::None, Some(_)) => {
            return Err(invalid(
                "a variables plan decides from the sample's measurements: give --measurements FILE (and --column NAME for a file with several columns)".into(),
            ));
        }
        (given, Some(plan)) => Some(measured(args, given.read()?, plan, &known)?),
        (Measurements::File(..) | Measurements::Given(_), None) => {
            return Err(invalid(
                "--measurements is for variables plans; this plan decides from the counts found, --found K".into(),
            ));
        }
        (Measurements::None, None) if known.rules().is_some() => None,
        (Measurements::None, None) => Some(Lot {
            decided: match Found::try_from(args)? {
                Found::Stages(counts) => known.decide_counts(&counts, None),
                Found::Cumulative { inspected, found } => {
                    known.decide_counts(&[found], Some(inspected))
                }
            }
            .map_err(invalid)?,
            measured: None,
        }),
    };
    let decide = |ledger: &Ledger| {
        let (judged, severity) = if known.rules().is_some() {
            if args.inspected.is_some() {
                return Err(invalid("--inspected is for item-by-item plans; a standard-indexed plan takes the counts of each stage, --found CLASS=K,K,..".into()));
            }
            let state = replay(ledger, std::slice::from_ref(&known))
                .state
                .unwrap_or_default();
            let state = match (&flags.corrective_action, state.is_discontinued()) {
                (Some(_), true) => state.resume().map_err(|e| invalid(e.to_string()))?,
                (Some(_), false) => {
                    return Err(invalid(format!(
                        "--corrective-action resumes inspection after discontinuation, and the ledger is on {} inspection: judge the lot without it",
                        state.standing()
                    )));
                }
                (None, _) => state,
            };
            let Some(severity) = state.severity() else {
                return Err(LedgerError::Refused {
                    path: log.to_path_buf(),
                    message: "inspection under the standard is discontinued: five lots were not accepted on tightened inspection (MIL-STD-105E 4.8); the lot was not recorded. When the supplier's corrective action is accepted, judge the next lot with --corrective-action \"WHAT WAS DONE\": inspection resumes on tightened".to_string(),
                }
                .into());
            };
            let decided = known
                .decide_classes(severity, &args.found)
                .map_err(invalid)?;
            (
                Lot {
                    decided,
                    measured: None,
                },
                Some(severity),
            )
        } else {
            (
                fixed
                    .clone()
                    .ok_or_else(|| invalid("no count was given".into()))?,
                None,
            )
        };
        let decided = &judged.decided;
        let entry = (decided.decision != Decision::Continue).then(|| LotEntry {
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
            seed: seed.clone(),
            resubmitted: flags.resubmitted,
            corrective_action: flags.corrective_action.clone(),
            measured: judged.measured.as_ref().map(|m| m.cells.clone()),
        });
        Ok::<_, Error>((entry, (judged, severity)))
    };
    let (row, (judged, severity)) = match mode {
        Mode::Record => append_lot(log, decide)?,
        Mode::Preview => {
            let ledger = if log.exists() {
                Ledger::read(log)?
            } else {
                Ledger::parse(log, &[])?
            };
            (None, decide(&ledger)?.1)
        }
    };
    let again = if args.inspected.is_some() {
        "judge it again with the units inspected in all and the cumulative count (--inspected N --found K)"
    } else {
        "judge it again with every stage's count"
    };
    let decision = judged.decided.decision;
    let note = match (&row, mode) {
        (Some(row), _) => format!("recorded as seq {} in {}", row.seq, log.display()),
        (None, Mode::Record) => format!(
            "not recorded in {}: the lot is not decided yet; inspect the next stage and {again}",
            log.display()
        ),
        (None, Mode::Preview) => format!("not recorded in {} yet", log.display()),
    };
    let accepted = audited.accepted.map(|d| d.to_string());
    let warnings = judged
        .measured
        .as_ref()
        .map(|m| m.judgement.warnings.clone())
        .unwrap_or_default();
    let report = report(args, &known, judged, severity, accepted.clone())?;
    Ok(JudgedLot {
        report,
        decision,
        seq: row.map(|r| r.seq),
        note,
        warnings,
        accepted,
    })
}

impl Measurements<'_> {
    /// The readings: the file's, read now, or those given.
    fn read(self) -> Result<Readings, Error> {
        match self {
            Measurements::File(csv, column) => read_measurements(csv, column),
            Measurements::Given(readings) => Ok(readings),
            Measurements::None => {
                Err(InputError::Inconsistent("no measurements were given".to_string()).into())
            }
        }
    }
}

/// A lot as judged, before it is recorded.
#[derive(Clone)]
struct Lot {
    decided: Decided,
    /// A variables lot's judgement and the cells the ledger keeps of it.
    measured: Option<MeasuredLot>,
}

#[derive(Clone)]
struct MeasuredLot {
    judgement: MeasurementJudgement,
    plan: VariablesPlan,
    cells: Measured,
}

/// A variables lot judged from `readings`. The ledger counts the
/// readings beyond a specification limit (a reading on a limit conforms)
/// as the lot's `found`, for the process average and chart.
fn measured(
    args: &JudgeArgs,
    readings: Readings,
    plan: &VariablesPlan,
    known: &KnownPlan,
) -> Result<Lot, Error> {
    let aql = known.targets.first().and_then(|t| t.aql).ok_or_else(|| {
        InputError::Inconsistent(format!(
            "{}: the variables source names no producer's quality (AQL)",
            args.source.display()
        ))
    })?;
    let judgement = judge_measurements(plan, &readings.values, aql)?;
    judgement.check()?;
    let spec = plan.spec();
    let beyond = readings
        .values
        .iter()
        .filter(|&&v| spec.lower().is_some_and(|l| v < l) || spec.upper().is_some_and(|u| v > u))
        .count() as u64;
    Ok(Lot {
        decided: Decided {
            decision: judgement.decided.decision,
            found: Tally::single(vec![beyond]),
            inspected: Tally::single(vec![judgement.n]),
            code_letter: None,
            lot: None,
            judgement: None,
            verdict: None,
        },
        measured: Some(MeasuredLot {
            cells: Measured {
                mean: judgement.mean,
                sd: judgement.s,
                data_sha256: readings.sha256,
            },
            judgement,
            plan: plan.clone(),
        }),
    })
}

/// The decision's report, as `judge` prints it without --record.
fn report(
    args: &JudgeArgs,
    known: &KnownPlan,
    judged: Lot,
    severity: Option<Severity>,
    accepted: Option<String>,
) -> Result<Vec<u8>, Error> {
    let format = args.report.format.into();
    if let Some(m) = judged.measured {
        let report = MeasurementJudgeReport {
            judgement: m.judgement,
            plan: m.plan,
            source: args.source.clone(),
            accepted_recorded: accepted,
        };
        return report_bytes(&report, format);
    }
    let decided = judged.decided;
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
