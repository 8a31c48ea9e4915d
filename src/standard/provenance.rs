//! What each cell of the built-in tables rests on: `provenance.csv` beside
//! them gives, per file, row and column, the value written and its basis
//! (`excerpt`, `structure`, `memory + OC check`, `unknown`, ...; the
//! folder's README explains each). A plan read from a cell whose basis
//! names memory says so in its notes.

use std::collections::HashMap;
use std::sync::OnceLock;

/// The file, embedded.
const PROVENANCE: &str = include_str!("../../data/standard/mil-std-105e/provenance.csv");

/// (file, row, column) to basis.
type Bases = HashMap<(String, String, String), String>;

fn bases() -> &'static Bases {
    static BASES: OnceLock<Bases> = OnceLock::new();
    BASES.get_or_init(|| {
        let mut reader = csv::ReaderBuilder::new()
            .comment(Some(b'#'))
            .flexible(true)
            .from_reader(PROVENANCE.as_bytes());
        reader
            .records()
            .filter_map(Result::ok)
            .filter_map(|r| match (r.get(0), r.get(1), r.get(2), r.get(4)) {
                (Some(f), Some(row), Some(col), Some(basis)) => Some((
                    (f.to_string(), row.to_string(), col.to_string()),
                    basis.to_string(),
                )),
                _ => None,
            })
            .collect()
    })
}

/// The basis of the cell at `row` (a code letter, or a lot range of Table
/// I) and `column` (an AQL as printed, or a level) of the built-in `file`.
pub(crate) fn basis(file: &str, row: &str, column: &str) -> Option<&'static str> {
    bases()
        .get(&(file.to_string(), row.to_string(), column.to_string()))
        .map(String::as_str)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_issue_example_cell_has_its_basis() {
        assert_eq!(
            basis("table-2a-single-normal.csv", "K", "1.0"),
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
