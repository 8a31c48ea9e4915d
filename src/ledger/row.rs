//! One ledger row: one lot, as judged and recorded.
//!
//! # The columns
//!
//! | column | holds |
//! |---|---|
//! | `format` | [`LEDGER_FORMAT`], the layout's version, on every row |
//! | `seq` | the row's number, 1, 2, 3, ... with no gap |
//! | `date` | the date the lot was judged, `YYYY-MM-DD` |
//! | `lot` | the lot's identifier as the user gives it |
//! | `lot_size` | the lot's units, or empty when not given |
//! | `plan_id`, `plan_revision` | the plan source's `id` and `revision` (empty when it has none) |
//! | `plan_sha256` | the SHA-256 of the plan source's text, 64 hex digits |
//! | `severity` | `normal`, `tightened` or `reduced` for a standard-indexed plan; empty for other plans |
//! | `code_letter` | the standard's code letter (Table I); empty for other plans |
//! | `inspected` | units inspected in all when the lot was decided, per class where the plan has several ([`Tally`]); for a variables lot, the units measured |
//! | `found` | the count found in each stage's new units, per class ([`Tally`]); with one number and a multi-stage plan, the cumulative count at `inspected` units (`judge --inspected`); for a variables lot, the readings beyond a specification limit |
//! | `decision` | `accept` or `reject` |
//! | `inspector`, `note` | free text |
//! | `seed` | the seed of the random draw of the sample's units (`lotsman draw`), a whole number, when recorded (`judge --seed S` or `--seed-from-lot`) |
//! | `resubmitted` | `yes` for a resubmitted lot, `no` otherwise |
//! | `corrective_action` | for the first lot after inspection under the standard was discontinued, the supplier's corrective action that let it resume (MIL-STD-105E 4.8); empty otherwise |
//! | `mean`, `sd`, `data_sha256` | for a variables lot: its readings' mean and standard deviation, and the SHA-256 of the measurements file ([`Measured`]); empty otherwise |
//! | `prev_hash`, `hash` | the hash chain ([`chain_hash`](super::chain_hash)) |
//!
//! Free text may not hold line breaks or other control characters, and
//! may not start with `=`, `+` or `@` (a spreadsheet would read it as a
//! formula); every row is then one line of the file.

use crate::plan::Decision;
use crate::standard::Severity;

use super::date::LotDate;
use super::hash::{GENESIS, chain_hash, is_hash};
use super::measured::Measured;
use super::tally::Tally;

/// The layout's version, written in the `format` column of every row.
pub const LEDGER_FORMAT: &str = "lotsman-ledger-1";

/// The columns, in order; the header line names them.
pub const COLUMNS: [&str; 23] = [
    "format",
    "seq",
    "date",
    "lot",
    "lot_size",
    "plan_id",
    "plan_revision",
    "plan_sha256",
    "severity",
    "code_letter",
    "inspected",
    "found",
    "decision",
    "inspector",
    "note",
    "seed",
    "resubmitted",
    "corrective_action",
    "mean",
    "sd",
    "data_sha256",
    "prev_hash",
    "hash",
];

/// The header line of a ledger, without its line break.
pub fn ledger_header() -> String {
    COLUMNS.join(",")
}

/// What one lot's row records, before it is chained.
#[derive(Clone, Debug, PartialEq)]
pub struct LotEntry {
    /// The date the lot was judged.
    pub date: LotDate,
    /// The lot's identifier.
    pub lot: String,
    /// The lot's units, if given.
    pub lot_size: Option<u64>,
    /// The plan source's `id` (empty when it has none).
    pub plan_id: String,
    /// The plan source's `revision` (empty when it has none).
    pub plan_revision: String,
    /// The SHA-256 of the plan source's text.
    pub plan_sha256: String,
    /// The severity the plan was applied at (standard-indexed plans).
    pub severity: Option<Severity>,
    /// The code letter (standard-indexed plans).
    pub code_letter: Option<String>,
    /// Units inspected in all, per class.
    pub inspected: Tally,
    /// Counts found per stage, per class.
    pub found: Tally,
    /// Accept or reject (a lot still to be continued is not recorded).
    pub decision: Decision,
    /// Who inspected.
    pub inspector: String,
    /// A remark.
    pub note: String,
    /// The seed of the random draw, when recorded.
    pub seed: Option<String>,
    /// A resubmitted lot (105E 4.7 counts only original inspection).
    pub resubmitted: bool,
    /// The supplier's corrective action after which inspection resumed
    /// with this lot (105E 4.8).
    pub corrective_action: Option<String>,
    /// The statistics of a variables lot.
    pub measured: Option<Measured>,
}

/// A row as it stands in the ledger: the lot, its place and its hashes.
#[derive(Clone, Debug, PartialEq)]
pub struct LedgerRow {
    /// The row's number, from 1.
    pub seq: u64,
    /// The lot.
    pub entry: LotEntry,
    /// The previous row's hash ([`GENESIS`] for the first).
    pub prev_hash: String,
    /// This row's hash as written.
    pub hash: String,
}

impl LotEntry {
    /// Checks the free-text fields: no control character, no leading
    /// formula sign, a lot identifier that is not empty.
    ///
    /// # Errors
    /// A message naming the field.
    pub fn check_text(&self) -> Result<(), String> {
        if self.lot.trim().is_empty() {
            return Err("the lot identifier is empty; give --lot ID".into());
        }
        for (name, text) in [
            ("the lot identifier", &self.lot),
            ("the inspector", &self.inspector),
            ("the note", &self.note),
            ("the plan's id", &self.plan_id),
            ("the plan's revision", &self.plan_revision),
        ] {
            check_free_text(name, text)?;
        }
        if let Some(seed) = &self.seed {
            check_free_text("the seed", seed)?;
        }
        if let Some(action) = &self.corrective_action {
            if action.trim().is_empty() {
                return Err("the corrective action is empty; say what the supplier did".into());
            }
            check_free_text("the corrective action", action)?;
        }
        Ok(())
    }

    /// This lot chained after a row whose hash is `prev_hash`, as row
    /// `seq`.
    pub fn chained(self, seq: u64, prev_hash: &str) -> LedgerRow {
        let mut row = LedgerRow {
            seq,
            entry: self,
            prev_hash: prev_hash.to_string(),
            hash: String::new(),
        };
        row.hash = row.expected_hash();
        row
    }
}

/// Refuses text a one-line CSV cell that a spreadsheet opens as text
/// cannot hold.
fn check_free_text(name: &str, text: &str) -> Result<(), String> {
    if text.chars().any(char::is_control) {
        return Err(format!(
            "{name} holds a line break or another control character; write it on one line"
        ));
    }
    if text.starts_with(['=', '+', '@']) {
        return Err(format!(
            "{name} '{text}' starts with '{}', which a spreadsheet reads as a formula; start it with a letter or digit",
            &text[..1]
        ));
    }
    Ok(())
}

impl LedgerRow {
    /// The cells of the row, in column order.
    pub fn fields(&self) -> [String; 23] {
        let e = &self.entry;
        let [mean, sd, data_sha256] = Measured::cells(e.measured.as_ref());
        [
            LEDGER_FORMAT.to_string(),
            self.seq.to_string(),
            e.date.to_string(),
            e.lot.clone(),
            e.lot_size.map_or(String::new(), |n| n.to_string()),
            e.plan_id.clone(),
            e.plan_revision.clone(),
            e.plan_sha256.clone(),
            e.severity.map_or(String::new(), |s| s.name().to_string()),
            e.code_letter.clone().unwrap_or_default(),
            e.inspected.to_string(),
            e.found.to_string(),
            decision_name(e.decision).to_string(),
            e.inspector.clone(),
            e.note.clone(),
            e.seed.clone().unwrap_or_default(),
            if e.resubmitted { "yes" } else { "no" }.to_string(),
            e.corrective_action.clone().unwrap_or_default(),
            mean,
            sd,
            data_sha256,
            self.prev_hash.clone(),
            self.hash.clone(),
        ]
    }

    /// The hash this row's fields and `prev_hash` give.
    pub fn expected_hash(&self) -> String {
        let fields = self.fields();
        let hashed: Vec<&str> = fields[..COLUMNS.len() - 2]
            .iter()
            .map(String::as_str)
            .collect();
        chain_hash(&self.prev_hash, &hashed)
    }

    /// Reads a row from its cells, strictly: each cell must be written as
    /// the ledger writes it.
    ///
    /// # Errors
    /// The column misread and what it takes.
    pub fn from_fields(cells: &[&str]) -> Result<LedgerRow, (&'static str, String)> {
        let [
            format,
            seq,
            date,
            lot,
            lot_size,
            plan_id,
            plan_revision,
            plan_sha256,
            severity,
            code_letter,
            inspected,
            found,
            decision,
            inspector,
            note,
            seed,
            resubmitted,
            corrective_action,
            mean,
            sd,
            data_sha256,
            prev_hash,
            hash,
        ] = cells
        else {
            return Err((
                "format",
                format!(
                    "the row has {} fields, a ledger row {}",
                    cells.len(),
                    COLUMNS.len()
                ),
            ));
        };
        if *format != LEDGER_FORMAT {
            return Err((
                "format",
                format!("'{format}' is not a ledger format this version reads ({LEDGER_FORMAT})"),
            ));
        }
        let number = |column: &'static str, text: &str| {
            let plain = !text.is_empty()
                && text.bytes().all(|b| b.is_ascii_digit())
                && (text == "0" || !text.starts_with('0'));
            text.parse::<u64>().ok().filter(|_| plain).ok_or((
                column,
                format!("'{text}' is not a whole number written plainly"),
            ))
        };
        let seq = number("seq", seq)?;
        let date = LotDate::parse(date).map_err(|m| ("date", m))?;
        let lot_size = if lot_size.is_empty() {
            None
        } else {
            Some(number("lot_size", lot_size)?)
        };
        for (column, text) in [
            ("plan_sha256", plan_sha256),
            ("prev_hash", prev_hash),
            ("hash", hash),
        ] {
            if !is_hash(text) {
                return Err((
                    column,
                    format!(
                        "'{text}' is not a SHA-256 written as 64 lower-case hexadecimal digits"
                    ),
                ));
            }
        }
        let severity = match *severity {
            "" => None,
            "normal" => Some(Severity::Normal),
            "tightened" => Some(Severity::Tightened),
            "reduced" => Some(Severity::Reduced),
            other => {
                return Err((
                    "severity",
                    format!("'{other}' is not a severity: normal, tightened, reduced, or empty"),
                ));
            }
        };
        let code_letter = match *code_letter {
            "" => None,
            l if l.len() == 1 && l.bytes().all(|b| (b'A'..=b'R').contains(&b)) => {
                Some(l.to_string())
            }
            other => {
                return Err((
                    "code_letter",
                    format!("'{other}' is not a code letter (A to R) or empty"),
                ));
            }
        };
        let decision = match *decision {
            "accept" => Decision::Accept,
            "reject" => Decision::Reject,
            other => {
                return Err((
                    "decision",
                    format!("'{other}' is not a recorded decision: accept or reject"),
                ));
            }
        };
        let resubmitted = match *resubmitted {
            "yes" => true,
            "no" => false,
            other => {
                return Err(("resubmitted", format!("'{other}' is neither yes nor no")));
            }
        };
        let entry = LotEntry {
            date,
            lot: lot.to_string(),
            lot_size,
            plan_id: plan_id.to_string(),
            plan_revision: plan_revision.to_string(),
            plan_sha256: plan_sha256.to_string(),
            severity,
            code_letter,
            inspected: Tally::parse(inspected).map_err(|m| ("inspected", m))?,
            found: Tally::parse(found).map_err(|m| ("found", m))?,
            decision,
            inspector: inspector.to_string(),
            note: note.to_string(),
            seed: if seed.is_empty() {
                None
            } else {
                Some(number("seed", seed)?.to_string())
            },
            resubmitted,
            corrective_action: (!corrective_action.is_empty())
                .then(|| corrective_action.to_string()),
            measured: Measured::from_cells(mean, sd, data_sha256)?,
        };
        entry.check_text().map_err(|m| ("lot", m))?;
        Ok(LedgerRow {
            seq,
            entry,
            prev_hash: prev_hash.to_string(),
            hash: hash.to_string(),
        })
    }

    /// Whether this is the first row's genesis link.
    pub fn starts_chain(&self) -> bool {
        self.prev_hash == GENESIS
    }
}

/// The word a decision is written with.
pub fn decision_name(decision: Decision) -> &'static str {
    match decision {
        Decision::Accept => "accept",
        Decision::Reject => "reject",
        Decision::Continue => "continue",
    }
}
