//! The set of tables a lookup reads: Table I, the nine master tables
//! (II-A to IV-C) and Table VIII. The built-in set is MIL-STD-105E's, kept
//! as data in `data/standard/mil-std-105e/` (one file per table, its
//! source at its head) and embedded in the library; a user may replace any
//! table with a file of the same shape ([`load_user_table`]), for an
//! edition the built-in data do not hold or to fill cells the built-in
//! data leave untranscribed. A user table is recorded by its file name and
//! SHA-256, which a plan read from it carries.

use std::sync::OnceLock;

use sha2::{Digest, Sha256};

use super::aql::Aql;
use super::code_letters::CodeLetterTable;
use super::csv_text::CsvText;
use super::error::StandardError;
use super::letter::{CodeLetter, InspectionLevel};
use super::limit_numbers::{LimitNumber, LimitNumberTable};
use super::severity::Severity;
use super::table::{MasterTable, table_name};
use crate::design::Scheme;

/// The built-in files, embedded.
macro_rules! data {
    ($file:literal) => {
        (
            $file,
            include_str!(concat!("../../data/standard/mil-std-105e/", $file)),
        )
    };
}

const CODE_LETTERS: (&str, &str) = data!("table-1-code-letters.csv");
const LIMIT_NUMBERS: (&str, &str) = data!("table-8-limit-numbers.csv");
/// The master tables, normal, tightened, reduced for each scheme.
const MASTERS: [(Scheme, [(&str, &str); 3]); 3] = [
    (
        Scheme::Single,
        [
            data!("table-2a-single-normal.csv"),
            data!("table-2b-single-tightened.csv"),
            data!("table-2c-single-reduced.csv"),
        ],
    ),
    (
        Scheme::Double,
        [
            data!("table-3a-double-normal.csv"),
            data!("table-3b-double-tightened.csv"),
            data!("table-3c-double-reduced.csv"),
        ],
    ),
    (
        Scheme::Multiple,
        [
            data!("table-4a-multiple-normal.csv"),
            data!("table-4b-multiple-tightened.csv"),
            data!("table-4c-multiple-reduced.csv"),
        ],
    ),
];

/// Which table of the set a file stands for.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum TableSlot {
    /// Table I.
    CodeLetters,
    /// A master table: its severity and scheme.
    Master(Severity, Scheme),
    /// Table VIII.
    LimitNumbers,
}

/// A table file given by the user, read and checked, with what it stands
/// for and its SHA-256.
#[derive(Clone, Debug, PartialEq)]
pub struct UserTable {
    /// What it replaces.
    pub slot: TableSlot,
    /// The file's name, as given.
    pub file: String,
    /// The SHA-256 of its text, in lower-case hex.
    pub sha256: String,
    table: Loaded,
}

#[derive(Clone, Debug, PartialEq)]
enum Loaded {
    CodeLetters(CodeLetterTable),
    Master(Box<MasterTable>),
    LimitNumbers(LimitNumberTable),
}

/// The SHA-256 of a table's text in lower-case hex: what a user table
/// records of the file it was read from, and what a plan source checks
/// the file against before reading plans from it again.
pub fn text_sha256(text: &str) -> String {
    Sha256::digest(text.as_bytes())
        .iter()
        .map(|b| format!("{b:02x}"))
        .collect()
}

/// Reads a user's own table. Its header tells which kind it is: Table I
/// (`lot_min,...`), Table VIII (`units_min,...`), or a master table of
/// single, double or multiple plans (`code_letter,sample_size,...`,
/// `code_letter,sample,...`, `code_letter,stage,...`), which then stands
/// for the master table of that scheme at `severity`. `file` names it in
/// messages and in the plans read from it.
///
/// # Errors
/// [`StandardError::TableFile`] naming the file, line and column of the
/// first fault in its shape.
///
/// # Example
/// ```
/// use lotsman::{Severity, load_user_table};
/// let text = "lot_min,lot_max,S-1,S-2,S-3,S-4,I,II,III\n2,,A,A,A,A,A,A,B\n";
/// let t = load_user_table("mine.csv", text, Severity::Normal).unwrap();
/// assert_eq!(t.sha256.len(), 64);
/// let e = load_user_table("mine.csv", "x,y\n1,2\n", Severity::Normal).unwrap_err();
/// assert!(e.to_string().starts_with("mine.csv: the header"));
/// ```
pub fn load_user_table(
    file: &str,
    text: &str,
    severity: Severity,
) -> Result<UserTable, StandardError> {
    let csv = CsvText::read(file, text)?;
    let first = |i: usize| csv.header.get(i).map(String::as_str);
    let (slot, table) = match (first(0), first(1)) {
        (Some("lot_min"), _) => (
            TableSlot::CodeLetters,
            Loaded::CodeLetters(CodeLetterTable::parse(file, text)?),
        ),
        (Some("units_min"), _) => (
            TableSlot::LimitNumbers,
            Loaded::LimitNumbers(LimitNumberTable::parse(file, text)?),
        ),
        (Some("code_letter"), second) => {
            let scheme = match second {
                Some("sample") => Scheme::Double,
                Some("stage") => Scheme::Multiple,
                _ => Scheme::Single,
            };
            let name = format!("the user table {file} ({scheme} sampling, {severity} inspection)");
            (
                TableSlot::Master(severity, scheme),
                Loaded::Master(Box::new(MasterTable::parse(
                    file, &name, text, severity, scheme,
                )?)),
            )
        }
        _ => {
            return Err(csv.file_fault(
                "the header does not start like a table of the standard: a code-letter table starts lot_min,lot_max; a table of plans code_letter,sample_size (single), code_letter,sample (double) or code_letter,stage (multiple); a limit-number table units_min,units_max".to_string(),
            ));
        }
    };
    Ok(UserTable {
        slot,
        file: file.to_string(),
        sha256: text_sha256(text),
        table,
    })
}

/// Table I, the nine master tables and Table VIII.
///
/// The built-in master tables are read when a lookup first needs them
/// (reading all nine costs a few milliseconds, most of a command's start);
/// Table I and Table VIII at once.
#[derive(Clone, Debug, PartialEq)]
pub struct Tables {
    code_letters: CodeLetterTable,
    /// Indexed by [`slot_index`]; a built-in table is read on first use,
    /// a user table is set when it is given.
    masters: Vec<OnceLock<Result<MasterTable, StandardError>>>,
    limit_numbers: LimitNumberTable,
    /// The user tables in the set, in the order given.
    users: Vec<(TableSlot, String, String)>,
}

/// The index of a master table in [`Tables::masters`].
fn slot_index(severity: Severity, scheme: Scheme) -> Option<usize> {
    let s = Severity::ALL.iter().position(|&v| v == severity)?;
    let k = MASTERS.iter().position(|(m, _)| *m == scheme)?;
    Some(k * 3 + s)
}

impl Tables {
    /// The built-in MIL-STD-105E tables, read once (the master tables on
    /// first use).
    ///
    /// # Errors
    /// [`StandardError::TableFile`] if the built-in Table I or VIII does
    /// not read (the structural tests keep them readable).
    pub fn builtin() -> Result<&'static Tables, StandardError> {
        static BUILTIN: OnceLock<Result<Tables, StandardError>> = OnceLock::new();
        BUILTIN
            .get_or_init(read_builtin)
            .as_ref()
            .map_err(Clone::clone)
    }

    /// These tables with `user` in place of the table it stands for.
    pub fn with_user_table(&self, user: &UserTable) -> Tables {
        let mut t = self.clone();
        match &user.table {
            Loaded::CodeLetters(c) => t.code_letters = c.clone(),
            Loaded::LimitNumbers(l) => t.limit_numbers = l.clone(),
            Loaded::Master(m) => {
                if let Some(i) = slot_index(m.severity(), m.scheme()) {
                    t.masters[i] = OnceLock::from(Ok((**m).clone()));
                }
            }
        }
        t.users.retain(|(slot, _, _)| *slot != user.slot);
        t.users
            .push((user.slot, user.file.clone(), user.sha256.clone()));
        t
    }

    /// Table I.
    pub fn code_letters(&self) -> &CodeLetterTable {
        &self.code_letters
    }

    /// The code letter of a lot of `lot_size` units at `level` (Table I).
    ///
    /// # Errors
    /// As [`CodeLetterTable::letter`].
    ///
    /// # Example
    /// ```
    /// use lotsman::{InspectionLevel, Tables};
    /// let t = Tables::builtin().unwrap();
    /// assert_eq!(t.code_letter(1500, InspectionLevel::II).unwrap().to_string(), "K");
    /// ```
    pub fn code_letter(
        &self,
        lot_size: u64,
        level: InspectionLevel,
    ) -> Result<CodeLetter, StandardError> {
        self.code_letters.letter(lot_size, level)
    }

    /// The master table of `scheme` at `severity`.
    ///
    /// # Errors
    /// [`StandardError::Scheme`] for a scheme without tables (sequential,
    /// variables, rectifying); [`StandardError::TableFile`] if a built-in
    /// file does not read (the structural tests keep them readable).
    pub fn master(
        &self,
        severity: Severity,
        scheme: Scheme,
    ) -> Result<&MasterTable, StandardError> {
        let Some((i, slot)) =
            slot_index(severity, scheme).and_then(|i| Some((i, self.masters.get(i)?)))
        else {
            return Err(StandardError::Scheme {
                given: scheme.name().to_string(),
            });
        };
        slot.get_or_init(|| {
            let (file, text) = MASTERS[i / 3].1[i % 3];
            MasterTable::parse(file, &table_name(severity, scheme), text, severity, scheme)
        })
        .as_ref()
        .map_err(Clone::clone)
    }

    /// Table VIII.
    pub fn limit_numbers(&self) -> &LimitNumberTable {
        &self.limit_numbers
    }

    /// The limit number of Table VIII for `units` sample units from the
    /// last ten lots at `aql`.
    pub fn limit_number(&self, units: u64, aql: Aql) -> LimitNumber {
        self.limit_numbers.limit_number(units, aql)
    }

    /// The user tables in the set: what each stands for, its file and its
    /// SHA-256.
    pub fn user_tables(&self) -> &[(TableSlot, String, String)] {
        &self.users
    }

    /// The user table standing for `slot`, if any: its file and SHA-256.
    pub(crate) fn user_table(&self, slot: TableSlot) -> Option<(&str, &str)> {
        self.users
            .iter()
            .find(|(s, _, _)| *s == slot)
            .map(|(_, f, h)| (f.as_str(), h.as_str()))
    }
}

fn read_builtin() -> Result<Tables, StandardError> {
    Ok(Tables {
        code_letters: CodeLetterTable::parse(CODE_LETTERS.0, CODE_LETTERS.1)?,
        masters: (0..9).map(|_| OnceLock::new()).collect(),
        limit_numbers: LimitNumberTable::parse(LIMIT_NUMBERS.0, LIMIT_NUMBERS.1)?,
        users: Vec::new(),
    })
}
