//! Table I of MIL-STD-105E: the sample-size code letter of a lot, by its
//! size and the inspection level (105E, 4.9.2).
//!
//! The file `table-1-code-letters.csv` has one row per lot-size range:
//! `lot_min,lot_max,S-1,S-2,S-3,S-4,I,II,III`, an empty `lot_max` for the
//! last, open range. The reader checks that the ranges follow each other
//! without gap or overlap from the first, and that only the last is open.

use super::csv_text::{CsvText, count};
use super::error::StandardError;
use super::letter::{CodeLetter, InspectionLevel};
use crate::input::InputError;

/// The header of a Table I file.
const HEADER: [&str; 9] = [
    "lot_min", "lot_max", "S-1", "S-2", "S-3", "S-4", "I", "II", "III",
];

/// Table I, read and checked.
#[derive(Clone, Debug, PartialEq)]
pub struct CodeLetterTable {
    file: String,
    source: String,
    rows: Vec<LotRange>,
}

/// One row of Table I.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct LotRange {
    /// The smallest lot of the range.
    pub lot_min: u64,
    /// The largest lot of the range; `None` for the last ("and over").
    pub lot_max: Option<u64>,
    /// The code letter at each level, in [`InspectionLevel::ALL`]'s order.
    pub letters: [CodeLetter; 7],
}

impl CodeLetterTable {
    /// Reads Table I from a file's `text`; `file` names it in messages.
    ///
    /// # Errors
    /// [`StandardError::TableFile`] naming the file, line and column of
    /// the first fault.
    pub fn parse(file: &str, text: &str) -> Result<CodeLetterTable, StandardError> {
        let csv = CsvText::read(file, text)?;
        if csv.header != HEADER {
            return Err(csv.file_fault(format!(
                "the header of a code-letter table must be {}",
                HEADER.join(",")
            )));
        }
        let mut rows: Vec<LotRange> = Vec::new();
        let last = csv.records.len().saturating_sub(1);
        for (i, (line, f)) in csv.records.iter().enumerate() {
            let Some(lot_min) = count(&f[0]).filter(|&m| m >= 1) else {
                return Err(csv.fault(
                    *line,
                    Some(0),
                    format!("'{}' is not a lot size (a whole number, at least 1)", f[0]),
                ));
            };
            let lot_max = match (f[1].as_str(), i == last) {
                ("", true) => None,
                ("", false) => {
                    return Err(csv.fault(
                        *line,
                        Some(1),
                        "only the last range may be open ('and over'): give the largest lot of this range".to_string(),
                    ));
                }
                (text, _) => match count(text).filter(|&m| m >= lot_min) {
                    Some(m) => Some(m),
                    None => {
                        return Err(csv.fault(
                            *line,
                            Some(1),
                            format!("'{text}' is not a lot size at least lot_min ({lot_min})"),
                        ));
                    }
                },
            };
            if let Some(previous) = rows.last()
                && previous.lot_max.map(|m| m.saturating_add(1)) != Some(lot_min)
            {
                return Err(csv.fault(
                    *line,
                    Some(0),
                    format!(
                        "the ranges must follow each other without gap or overlap: this one should start at {}",
                        previous.lot_max.map_or(0, |m| m.saturating_add(1))
                    ),
                ));
            }
            let mut letters = [CodeLetter::default(); 7];
            for (k, letter) in letters.iter_mut().enumerate() {
                *letter = CodeLetter::parse(&f[2 + k])
                    .map_err(|e| csv.fault(*line, Some(2 + k), e.to_string()))?;
            }
            rows.push(LotRange {
                lot_min,
                lot_max,
                letters,
            });
        }
        if rows.is_empty() {
            return Err(csv.file_fault("the table has no rows".to_string()));
        }
        Ok(CodeLetterTable {
            file: file.to_string(),
            source: csv.source(),
            rows,
        })
    }

    /// The file it was read from.
    pub fn file(&self) -> &str {
        &self.file
    }

    /// The first comment line of its file, which names its source.
    pub fn source(&self) -> &str {
        &self.source
    }

    /// Its rows, smallest lots first.
    pub fn ranges(&self) -> &[LotRange] {
        &self.rows
    }

    /// The code letter of a lot of `lot_size` units at `level`. A lot
    /// smaller than the first range (Table I starts at 2 units) is read in
    /// the first range: every plan then takes the whole lot, which the
    /// 100 percent rule turns into inspecting every unit.
    ///
    /// # Errors
    /// [`InputError::OutOfRange`] for a lot size of 0.
    pub fn letter(
        &self,
        lot_size: u64,
        level: InspectionLevel,
    ) -> Result<CodeLetter, StandardError> {
        if lot_size == 0 {
            return Err(InputError::out_of_range("lot size", 0, "at least 1 unit").into());
        }
        let row = self
            .rows
            .iter()
            .find(|r| r.lot_max.is_none_or(|m| lot_size <= m))
            .unwrap_or(&self.rows[self.rows.len() - 1]);
        Ok(row.letters[level.column()])
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const SMALL: &str =
        "lot_min,lot_max,S-1,S-2,S-3,S-4,I,II,III\n2,8,A,A,A,A,A,A,B\n9,,A,A,A,A,A,B,C\n";

    #[test]
    fn lots_find_their_range() {
        let t = CodeLetterTable::parse("t.csv", SMALL).unwrap();
        assert_eq!(t.letter(8, InspectionLevel::III).unwrap().to_string(), "B");
        assert_eq!(t.letter(9, InspectionLevel::II).unwrap().to_string(), "B");
        assert_eq!(t.letter(1, InspectionLevel::II).unwrap().to_string(), "A");
        assert!(t.letter(0, InspectionLevel::II).is_err());
    }

    #[test]
    fn gaps_and_open_ranges_inside_are_refused() {
        let gap = SMALL.replace("9,,", "10,,");
        let e = CodeLetterTable::parse("t.csv", &gap).unwrap_err();
        assert!(e.to_string().contains("line 3, column 'lot_min'"), "{e}");
        let open = SMALL.replace("2,8,", "2,,");
        assert!(CodeLetterTable::parse("t.csv", &open).is_err());
        let letter = SMALL.replace("A,B\n9", "A,I\n9");
        let e = CodeLetterTable::parse("t.csv", &letter).unwrap_err();
        assert!(e.to_string().contains("column 'III'"), "{e}");
    }
}
