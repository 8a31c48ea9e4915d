//! Table VIII of MIL-STD-105E: the limit numbers for reduced inspection
//! (105E, 4.7.3 b). Reduced inspection may begin only when the defectives
//! (or defects) found in the samples of the last ten lots on normal
//! inspection total at most the limit number for the AQL and the number of
//! sample units those lots gave.
//!
//! The built-in file is entered from memory only and is unverified (its
//! head says so, and so does [`LimitNumberTable::source`]); the switching
//! scheme takes the limit number as an input and leaves the choice to the
//! caller.
//!
//! The file `table-8-limit-numbers.csv`: `units_min,units_max,<26 AQLs>`,
//! one row per range of sample units, an empty `units_max` for the last;
//! a cell is a whole number, `*` (too few sample units for this AQL) or
//! empty (no number printed).

use serde::Serialize;

use super::aql::{AQL_VALUES, Aql};
use super::csv_text::{CsvText, count};
use super::error::StandardError;

/// What Table VIII gives for a number of sample units and an AQL.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case", tag = "kind", content = "value")]
pub enum LimitNumber {
    /// The limit number: reduced inspection needs a total count at most
    /// this.
    Number(u64),
    /// `*`: the sample units of ten lots are too few for this AQL; more
    /// lots may be counted (the most recent ones, all on normal
    /// inspection and none rejected).
    TooFewUnits,
    /// Nothing printed for these units and AQL.
    NotPrinted,
}

/// Table VIII, read and checked.
#[derive(Clone, Debug, PartialEq)]
pub struct LimitNumberTable {
    file: String,
    source: String,
    rows: Vec<(u64, Option<u64>, Vec<LimitNumber>)>,
}

impl LimitNumberTable {
    /// Reads Table VIII from a file's `text`; `file` names it in messages.
    ///
    /// # Errors
    /// [`StandardError::TableFile`] naming the file, line and column of
    /// the first fault.
    pub fn parse(file: &str, text: &str) -> Result<LimitNumberTable, StandardError> {
        let csv = CsvText::read(file, text)?;
        let aqls_ok = csv.header.len() == 2 + AQL_VALUES.len()
            && csv.header[2..]
                .iter()
                .enumerate()
                .all(|(i, h)| Aql::parse(h).is_ok_and(|a| a.column() == i));
        if csv.header.len() < 2 || csv.header[..2] != ["units_min", "units_max"] || !aqls_ok {
            return Err(csv.file_fault(format!(
                "the header of a limit-number table must be units_min,units_max,{}",
                AQL_VALUES.join(",")
            )));
        }
        let mut rows: Vec<(u64, Option<u64>, Vec<LimitNumber>)> = Vec::new();
        let last = csv.records.len().saturating_sub(1);
        for (i, (line, f)) in csv.records.iter().enumerate() {
            let min = count(&f[0]).ok_or_else(|| {
                csv.fault(
                    *line,
                    Some(0),
                    format!("'{}' is not a number of units", f[0]),
                )
            })?;
            let max = match (f[1].as_str(), i == last) {
                ("", true) => None,
                (text, _) => Some(count(text).filter(|&m| m >= min).ok_or_else(|| {
                    csv.fault(
                        *line,
                        Some(1),
                        format!("'{text}' is not a number of units at least units_min ({min}); only the last range may be open"),
                    )
                })?),
            };
            if let Some((_, previous, _)) = rows.last()
                && previous.map(|m| m.saturating_add(1)) != Some(min)
            {
                return Err(csv.fault(
                    *line,
                    Some(0),
                    "the ranges must follow each other without gap or overlap".to_string(),
                ));
            }
            let mut cells = Vec::with_capacity(AQL_VALUES.len());
            for (k, text) in f[2..].iter().enumerate() {
                cells.push(match text.as_str() {
                    "*" => LimitNumber::TooFewUnits,
                    "" => LimitNumber::NotPrinted,
                    t => LimitNumber::Number(count(t).ok_or_else(|| {
                        csv.fault(
                            *line,
                            Some(2 + k),
                            format!("'{t}' is not a limit number (a whole number), '*' or empty"),
                        )
                    })?),
                });
            }
            rows.push((min, max, cells));
        }
        if rows.is_empty() {
            return Err(csv.file_fault("the table has no rows".to_string()));
        }
        Ok(LimitNumberTable {
            file: file.to_string(),
            source: csv.source(),
            rows,
        })
    }

    /// The file it was read from.
    pub fn file(&self) -> &str {
        &self.file
    }

    /// The first comment line of its file, which names its source (and,
    /// for the built-in table, that it is unverified).
    pub fn source(&self) -> &str {
        &self.source
    }

    /// The limit number for `units` sample units from the last ten lots at
    /// `aql`; fewer units than the first range holds are too few.
    pub fn limit_number(&self, units: u64, aql: Aql) -> LimitNumber {
        self.rows
            .iter()
            .find(|(min, max, _)| *min <= units && max.is_none_or(|m| units <= m))
            .map_or(LimitNumber::TooFewUnits, |(_, _, cells)| {
                cells[aql.column()]
            })
    }
}
