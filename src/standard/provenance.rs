//! What each cell of the built-in tables rests on: `provenance.csv` beside
//! them gives, per file, row and column, the value written and its basis
//! (`excerpt`, `structure`, `memory + OC check`, `unknown`, ...; the
//! folder's README explains each). A plan read from a cell whose basis
//! names memory says so in its notes.

use std::collections::HashMap;
use std::sync::OnceLock;

/// The file, embedded.
const PROVENANCE: &str = include_str!("../../data/standard/mil-std-105e/provenance.csv");

/// Each line's `file,row,column` to the line, found by its third comma
/// (file names, letters, ranges, AQLs and levels hold none): cheaper than
/// reading every line as CSV, which only the one line a lookup needs is.
fn lines() -> &'static HashMap<&'static str, &'static str> {
    static LINES: OnceLock<HashMap<&'static str, &'static str>> = OnceLock::new();
    LINES.get_or_init(|| {
        PROVENANCE
            .lines()
            .filter(|l| !l.starts_with('#'))
            .filter_map(|l| {
                let end = l.match_indices(',').nth(2)?.0;
                Some((&l[..end], l))
            })
            .collect()
    })
}

/// The basis of the cell at `row` (a code letter, or a lot range of Table
/// I) and `column` (an AQL as printed, or a level) of the built-in `file`.
pub(crate) fn basis(file: &str, row: &str, column: &str) -> Option<String> {
    let line = lines().get(format!("{file},{row},{column}").as_str())?;
    let mut reader = csv::ReaderBuilder::new()
        .has_headers(false)
        .flexible(true)
        .from_reader(line.as_bytes());
    let record = reader.records().next()?.ok()?;
    record.get(4).map(str::to_string)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_issue_example_cell_has_its_basis() {
        assert_eq!(
            basis("table-2a-single-normal.csv", "K", "1.0").as_deref(),
            Some("excerpt (level-II derived table, column-aligned) + structure")
        );
        assert!(
            basis("table-3a-double-normal.csv", "K", "1.0")
                .unwrap()
                .contains("memory")
        );
        assert_eq!(basis("table-2a-single-normal.csv", "Z", "1.0"), None);
    }
}
