//! The demo's month of lots: invented counts of carbon seal faces
//! (`plans/tpw-seal-face-lots.csv`) decided one by one by the
//! standard-indexed demo plan at the severity its switching rules require,
//! chained into a ledger exactly as `judge --record` appends it, with the
//! ledger's status and its history chart.
//!
//! The counts are chosen so that the record shows the rules at work: two
//! lots not accepted within five on normal inspection (lots 8 and 11) put
//! lot 12 on tightened inspection, and five accepted there bring lot 17
//! back to normal (MIL-STD-105E 4.7.1, 4.7.2).

use std::path::Path;

use crate::input::InputError;
use crate::ledger::{
    GENESIS, KnownPlan, Ledger, LotDate, LotEntry, ledger_header, ledger_history, ledger_status,
    replay, row_line,
};
use crate::print::{HistoryFormat, render_history};
use crate::report::{Report, StatusReport};
use crate::source::{Error, PlanSource};

/// `(file name, text)` of the demo lots: date, lot, the count of each
/// class, inspector.
pub const DEMO_LOTS: (&str, &str) = (
    "tpw-seal-face-lots.csv",
    include_str!("../plans/tpw-seal-face-lots.csv"),
);

/// The file names the demo writes for the ledger, its status and its
/// history chart.
pub const DEMO_LEDGER_FILES: [&str; 3] = [
    "tpw-seal-face-ledger.csv",
    "tpw-seal-face-status.txt",
    "tpw-seal-face-history.pdf",
];

/// The ledger of the demo lots under `source` (parsed from `text`, the
/// file `name`), its status as the `status` command prints it, and its
/// history chart: the bytes of [`DEMO_LEDGER_FILES`], in order.
///
/// # Errors
/// [`Error`] when a demo lot cannot be read or decided (a build defect:
/// the lots are built in).
pub(crate) fn demo_ledger(
    source: &PlanSource,
    text: &str,
    name: &str,
) -> Result<[Vec<u8>; 3], Error> {
    let known = KnownPlan::from_source(Path::new(name), text, source)?;
    let plans = std::slice::from_ref(&known);
    let path = Path::new(DEMO_LEDGER_FILES[0]);
    let mut bytes = format!("{}\n", ledger_header()).into_bytes();
    let mut reader = csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .from_reader(DEMO_LOTS.1.as_bytes());
    let defect = |m: String| Error::from(InputError::Inconsistent(format!("demo lots: {m}")));
    for (i, record) in reader.records().enumerate() {
        let record = record.map_err(|e| defect(e.to_string()))?;
        let cell = |k: usize| record.get(k).unwrap_or_default().to_string();
        let ledger = Ledger::parse(path, &bytes)?;
        let severity = replay(&ledger, plans)
            .state
            .as_ref()
            .and_then(crate::standard::SwitchingState::severity)
            .ok_or_else(|| defect(format!("lot {} finds inspection discontinued", i + 1)))?;
        let found = ["critical", "major", "minor"]
            .iter()
            .enumerate()
            .map(|(k, class)| format!("{class}={}", cell(k + 2)))
            .collect::<Vec<_>>();
        let decided = known.decide_classes(severity, &found).map_err(defect)?;
        let entry = LotEntry {
            date: LotDate::parse(&cell(0)).map_err(defect)?,
            lot: cell(1),
            lot_size: source.lot_size,
            plan_id: known.id.clone(),
            plan_revision: known.revision.clone(),
            plan_sha256: known.sha256.clone(),
            severity: Some(severity),
            code_letter: decided.code_letter.clone(),
            inspected: decided.inspected.clone(),
            found: decided.found.clone(),
            decision: decided.decision,
            inspector: cell(5),
            note: String::new(),
            seed: None,
            resubmitted: false,
            corrective_action: None,
            measured: None,
        };
        let prev = ledger.last().map_or(GENESIS, |r| r.hash.as_str());
        let row = entry.chained(i as u64 + 1, prev);
        bytes.extend(row_line(&row).map_err(|e| defect(e.to_string()))?);
    }
    let ledger = Ledger::parse(path, &bytes)?;
    let status = StatusReport {
        ledger: path.to_path_buf(),
        status: ledger_status(&ledger, plans)?,
    };
    let mut status_text = Vec::new();
    status.write_table(&mut status_text)?;
    // The major class: the one whose lots moved the switching state.
    let history = ledger_history(&ledger, plans, Some("major"))?;
    let chart = render_history(&history, &source.title, HistoryFormat::Pdf)?;
    Ok([bytes, status_text, chart])
}
