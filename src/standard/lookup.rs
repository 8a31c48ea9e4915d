//! Reading a plan from the master tables (MIL-STD-105E, 4.9.3 and the
//! tables' footnotes), in our words:
//!
//! 1. The code letter comes from Table I, by the lot size and the
//!    inspection level.
//! 2. The cell at that letter and the AQL, in the table of the severity
//!    and scheme asked for, gives the plan.
//! 3. An arrow sends the lookup to the first plan below (`↓`) or above
//!    (`↑`) in the same column; the plan's sample sizes are then those of
//!    the row where it stands, so the arrow changes the letter
//!    ([`StandardPlan::plan_letter`]) and the sample size.
//! 4. In a double or multiple table, `*` means the single plan of the same
//!    letter and AQL; in a multiple table, `++` the double plan. The
//!    standard lets the plan below be used instead where there is one; the
//!    lookup takes the first reading, the one the tables print, and says
//!    so in the plan's notes.
//! 5. A cell not transcribed (`?`) is refused, reached directly or through
//!    an arrow, `*` or `++`: never a guess.
//! 6. When the plan's sample equals or exceeds the lot (its last
//!    cumulative sample in a double or multiple plan, since a plan that
//!    may need more units than the lot holds cannot be carried out), every
//!    unit is inspected instead: [`StandardAnswer::InspectAll`].

use super::answer::{InspectAll, StandardAnswer, StandardPlan};
use super::aql::Aql;
use super::cell::TableCell;
use super::error::StandardError;
use super::letter::{CodeLetter, InspectionLevel};
use super::provenance::basis;
use super::severity::Severity;
use super::table::{MasterTable, lot_stages};
use super::tables::{TableSlot, Tables};
use crate::design::Scheme;
use crate::input::InputError;
use crate::model::{MAX_LOT_SIZE, Model, ModelKind};
use crate::plan::{Stage, StagedPlan};

/// What a lookup was asked for.
#[derive(Clone, Copy)]
struct Asked {
    letter: CodeLetter,
    aql: Aql,
    scheme: Scheme,
}

/// More steps than any path through the tables takes (an arrow runs at
/// most through every row, then `++` and `*` each switch table once).
const MAX_STEPS: usize = 64;

impl Tables {
    /// The plan of the standard at `letter` and `aql`, for `severity` and
    /// `scheme`, with the arrows, `*` and `++` resolved.
    ///
    /// # Errors
    /// [`StandardError::NotTranscribed`] for a cell marked `?` on the way;
    /// [`StandardError::NoPlan`] for a cell where nothing is printed;
    /// [`StandardError::Scheme`] for a scheme without tables.
    ///
    /// # Example
    /// ```
    /// use lotsman::{Aql, CodeLetter, Scheme, Severity, Tables};
    /// let t = Tables::builtin().unwrap();
    /// let f: CodeLetter = "F".parse().unwrap();
    /// let p = t.lookup(f, "1.0".parse().unwrap(), Severity::Normal, Scheme::Single).unwrap();
    /// assert_eq!(p.plan_letter.to_string(), "E"); // an arrow up: n = 13, Ac 0
    /// assert_eq!(p.stages.as_single(), Some((13, 0)));
    /// ```
    pub fn lookup(
        &self,
        letter: CodeLetter,
        aql: Aql,
        severity: Severity,
        scheme: Scheme,
    ) -> Result<StandardPlan, StandardError> {
        let mut table = self.master(severity, scheme)?;
        let mut row = letter;
        let mut notes = Vec::new();
        for _ in 0..MAX_STEPS {
            let Some(cell) = table.cell(row, aql) else {
                return Err(StandardError::NoPlan {
                    table: format!("{} (it has no row for code letter {row})", table.name()),
                    letter: letter.to_string(),
                    aql: aql.to_string(),
                });
            };
            match cell {
                TableCell::Plan(stages) => {
                    let asked = Asked {
                        letter,
                        aql,
                        scheme,
                    };
                    return self.plan_at(table, row, asked, stages, notes);
                }
                TableCell::Down | TableCell::Up => {
                    let to =
                        follow(table, row, aql, cell).ok_or_else(|| StandardError::NoPlan {
                            table: table.name().to_string(),
                            letter: row.to_string(),
                            aql: aql.to_string(),
                        })?;
                    notes.push(format!(
                        "{} has {} at code letter {row}, AQL {aql}: the plan is the first one {} it, at code letter {to}, with that row's sample size",
                        table.name(),
                        cell.text(),
                        if *cell == TableCell::Down { "below" } else { "above" },
                    ));
                    row = to;
                }
                TableCell::UseSingle | TableCell::UseDouble => {
                    let (to, words) = if *cell == TableCell::UseSingle {
                        (Scheme::Single, "single")
                    } else {
                        (Scheme::Double, "double")
                    };
                    notes.push(format!(
                        "{} has '{}' at code letter {row}, AQL {aql}: the corresponding {words} plan is used (the standard also allows the {} plan below, where there is one)",
                        table.name(),
                        cell.text(),
                        table.scheme()
                    ));
                    table = self.master(severity, to)?;
                }
                TableCell::NotTranscribed => {
                    let start = self.master(severity, scheme)?;
                    let via = if row == letter && table.scheme() == scheme {
                        String::new()
                    } else if table.scheme() == scheme {
                        format!(", where the lookup for code letter {letter} leads")
                    } else {
                        format!(
                            ", where the lookup for code letter {letter} in {} leads",
                            start.name()
                        )
                    };
                    return Err(StandardError::NotTranscribed {
                        table: table.name().to_string(),
                        letter: row.to_string(),
                        aql: aql.to_string(),
                        via,
                    });
                }
                TableCell::Blank => {
                    return Err(StandardError::NoPlan {
                        table: table.name().to_string(),
                        letter: row.to_string(),
                        aql: aql.to_string(),
                    });
                }
            }
        }
        Err(StandardError::NoPlan {
            table: table.name().to_string(),
            letter: letter.to_string(),
            aql: aql.to_string(),
        })
    }

    /// The standard's answer for a lot of `lot_size` units at `level`: the
    /// code letter from Table I, the plan from the master table, and the
    /// 100 percent rule.
    ///
    /// # Errors
    /// As [`Tables::lookup`]; [`StandardError::Input`] for a lot size of 0
    /// or above 10^12.
    ///
    /// # Example
    /// ```
    /// use lotsman::{InspectionLevel, Scheme, Severity, StandardAnswer, Tables};
    /// let t = Tables::builtin().unwrap();
    /// let aql = "1.0".parse().unwrap();
    /// let a = t.plan_for_lot(1500, InspectionLevel::II, aql, Severity::Normal, Scheme::Single).unwrap();
    /// assert_eq!(a.plan().unwrap().stages.as_single(), Some((125, 3)));
    /// let small = t.plan_for_lot(10, InspectionLevel::II, aql, Severity::Normal, Scheme::Single).unwrap();
    /// assert!(matches!(small, StandardAnswer::InspectAll(_)));
    /// ```
    pub fn plan_for_lot(
        &self,
        lot_size: u64,
        level: InspectionLevel,
        aql: Aql,
        severity: Severity,
        scheme: Scheme,
    ) -> Result<StandardAnswer, StandardError> {
        if lot_size == 0 || lot_size > MAX_LOT_SIZE {
            return Err(InputError::out_of_range("lot size", lot_size, "1 to 10^12 units").into());
        }
        let letter = self.code_letter(lot_size, level)?;
        let plan = self.lookup(letter, aql, severity, scheme)?;
        Ok(if plan.sample_size() >= lot_size {
            StandardAnswer::InspectAll(InspectAll { lot_size, plan })
        } else {
            StandardAnswer::Sample(plan)
        })
    }

    /// The plan found at `row` of `table`, with its basis and notes.
    fn plan_at(
        &self,
        table: &MasterTable,
        row: CodeLetter,
        asked: Asked,
        numbers: &[Stage],
        mut notes: Vec<String>,
    ) -> Result<StandardPlan, StandardError> {
        let Asked {
            letter,
            aql,
            scheme,
        } = asked;
        let severity = table.severity();
        // The loosest model (no lot, counts of nonconformities): the table
        // plan as data; `StandardPlan::plan_for` checks it for the model
        // of an evaluation.
        let model = Model::new(ModelKind::Poisson, None)?;
        let stages = StagedPlan::new(lot_stages(numbers, severity), &model)?;
        let slot = TableSlot::Master(severity, table.scheme());
        let basis = match self.user_table(slot) {
            Some((file, sha)) => format!("the user table {file} (SHA-256 {sha})"),
            None => basis(table.file(), &row.to_string(), aql.label())
                .unwrap_or_else(|| "not recorded".to_string()),
        };
        let from_memory = basis.contains("memory");
        if let Some(last) = numbers.last()
            && severity == Severity::Reduced
            && last.accept.is_some_and(|a| a + 1 < last.reject)
        {
            notes.push(format!(
                "reduced inspection: a final count above Ac {} and below Re {} accepts the lot, and the next lot returns to normal inspection (105E, 4.7.4 and 4.10.1.4)",
                last.accept.unwrap_or(0),
                last.reject
            ));
        }
        if from_memory {
            notes.push(format!(
                "this cell of {} was entered from memory of the printed standard, not read from a copy (its basis: {basis}); check it against a copy of MIL-STD-105E, or give your own table, before relying on it",
                table.name()
            ));
        }
        Ok(StandardPlan {
            code_letter: letter,
            plan_letter: row,
            aql,
            severity,
            scheme,
            table_scheme: table.scheme(),
            table: table.name().to_string(),
            table_numbers: numbers.to_vec(),
            stages,
            basis,
            from_memory,
            notes,
        })
    }
}

/// The row where the arrow `cell` at `row`, followed in its column, ends;
/// `None` past the table's edge (the readers refuse such tables).
fn follow(table: &MasterTable, row: CodeLetter, aql: Aql, cell: &TableCell) -> Option<CodeLetter> {
    let mut at = row.row();
    loop {
        at = if *cell == TableCell::Down {
            at + 1
        } else {
            at.checked_sub(1)?
        };
        let letter = CodeLetter::from_row(at)?;
        if table.cell(letter, aql)? != cell {
            return Some(letter);
        }
    }
}
