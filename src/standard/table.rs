//! A master table of plans (MIL-STD-105E, Tables II-A to IV-C): for each
//! sample-size code letter, its sample sizes and the plan (or arrow) at
//! each of the 26 AQLs.
//!
//! The file shapes (one file per table, `data/standard/mil-std-105e/`):
//!
//! ```text
//! single:   code_letter,sample_size,0.010,...,1000                       one row per letter
//! double:   code_letter,sample,sample_size,cumulative_sample_size,...    rows first, second
//! multiple: code_letter,stage,sample_size,cumulative_sample_size,...     rows first ... seventh
//! ```
//!
//! An arrow, `*`, `++`, `?` or an empty cell is repeated on every stage row
//! of its letter; a plan gives `Ac Re` on each. The reader checks what a
//! lookup relies on: the letters run A, B, C, ... in order; a plan's
//! cumulative sizes rise and its stages are a valid staged plan (on
//! reduced inspection the last stage may leave a gap between Ac and Re,
//! 105E 4.10.1.4); `*` stands only in double and multiple tables, `++`
//! and `#` only in multiple ones; and every arrow, followed in its column,
//! reaches a cell that is not an arrow or empty before the table ends.

use super::aql::{AQL_VALUES, Aql};
use super::cell::{Mark, TableCell, Token, parse_token};
use super::csv_text::{CsvText, count};
use super::error::StandardError;
use super::letter::CodeLetter;
use super::severity::Severity;
use crate::design::Scheme;
use crate::model::{Model, ModelKind};
use crate::plan::{MAX_SAMPLE_SIZE, Stage, StagedPlan};

/// The stage rows' names in the double and multiple files.
const STAGE_NAMES: [&str; 7] = [
    "first", "second", "third", "fourth", "fifth", "sixth", "seventh",
];

/// One master table, read and checked.
#[derive(Clone, Debug, PartialEq)]
pub struct MasterTable {
    severity: Severity,
    scheme: Scheme,
    name: String,
    file: String,
    source: String,
    rows: Vec<Row>,
}

#[derive(Clone, Debug, PartialEq)]
struct Row {
    letter: CodeLetter,
    /// The file line of the letter's first row.
    line: u64,
    /// Cumulative sample size after each stage; empty where the table
    /// gives the letter no sample size (no plan of this scheme).
    sizes: Vec<u64>,
    cells: Vec<TableCell>,
}

/// The standard's name of the master table of `scheme` at `severity`,
/// with what it holds: `Table II-A (single sampling, normal inspection)`.
pub fn table_name(severity: Severity, scheme: Scheme) -> String {
    let number = match scheme {
        Scheme::Double => "III",
        Scheme::Multiple => "IV",
        _ => "II",
    };
    let part = match severity {
        Severity::Normal => "A",
        Severity::Tightened => "B",
        Severity::Reduced => "C",
    };
    format!("Table {number}-{part} ({scheme} sampling, {severity} inspection)")
}

impl MasterTable {
    /// Reads the master table of `scheme` at `severity` from a file's
    /// `text`; `file` names it in messages and `name` in lookups (the
    /// standard's table name, or the user's file).
    ///
    /// # Errors
    /// [`StandardError::TableFile`] naming the file, line and column of
    /// the first fault, and what the cell or line must hold;
    /// [`StandardError::Scheme`] for a scheme without tables.
    pub fn parse(
        file: &str,
        name: &str,
        text: &str,
        severity: Severity,
        scheme: Scheme,
    ) -> Result<MasterTable, StandardError> {
        let stages = match scheme {
            Scheme::Single => 1,
            Scheme::Double => 2,
            Scheme::Multiple => 7,
            other => {
                return Err(StandardError::Scheme {
                    given: other.name().to_string(),
                });
            }
        };
        let csv = CsvText::read(file, text)?;
        let first = check_header(&csv, scheme)?;
        if csv.records.len() % stages != 0 || csv.records.is_empty() {
            return Err(csv.file_fault(format!(
                "a {scheme}-sampling table has {stages} line{} per code letter, but the file has {} lines of rows",
                if stages == 1 { "" } else { "s" },
                csv.records.len()
            )));
        }
        let mut rows = Vec::new();
        for (i, group) in csv.records.chunks(stages).enumerate() {
            rows.push(read_letter(&csv, i, group, first, severity, scheme)?);
        }
        let table = MasterTable {
            severity,
            scheme,
            name: name.to_string(),
            file: file.to_string(),
            source: csv.source(),
            rows,
        };
        table.check_arrows(&csv)?;
        Ok(table)
    }

    /// The severity the table is for.
    pub fn severity(&self) -> Severity {
        self.severity
    }

    /// The scheme of its plans.
    pub fn scheme(&self) -> Scheme {
        self.scheme
    }

    /// Its name in lookups and messages, e.g. `Table II-A (single
    /// sampling, normal inspection)`.
    pub fn name(&self) -> &str {
        &self.name
    }

    /// The file it was read from.
    pub fn file(&self) -> &str {
        &self.file
    }

    /// The first comment line of its file, which names its source.
    pub fn source(&self) -> &str {
        &self.source
    }

    /// Its code letters, in order.
    pub fn letters(&self) -> impl Iterator<Item = CodeLetter> + '_ {
        self.rows.iter().map(|r| r.letter)
    }

    /// The cell at `letter` and `aql`; `None` for a letter the table does
    /// not hold.
    pub fn cell(&self, letter: CodeLetter, aql: Aql) -> Option<&TableCell> {
        self.rows.get(letter.row())?.cells.get(aql.column())
    }

    /// The cumulative sample size after each stage at `letter`; empty
    /// where the table gives the letter no sample size, `None` for a
    /// letter it does not hold.
    pub fn sample_sizes(&self, letter: CodeLetter) -> Option<&[u64]> {
        self.rows.get(letter.row()).map(|r| r.sizes.as_slice())
    }

    /// Each arrow, followed in its column, must reach a cell that is not
    /// an arrow or empty.
    fn check_arrows(&self, csv: &CsvText) -> Result<(), StandardError> {
        for (i, row) in self.rows.iter().enumerate() {
            for (column, cell) in row.cells.iter().enumerate() {
                let step: isize = match cell {
                    TableCell::Down => 1,
                    TableCell::Up => -1,
                    _ => continue,
                };
                let mut at = i as isize;
                let end = loop {
                    at += step;
                    let Some(c) = usize::try_from(at).ok().and_then(|a| self.rows.get(a)) else {
                        break None;
                    };
                    if c.cells[column] != *cell {
                        break Some(&c.cells[column]);
                    }
                };
                let direction = if step > 0 { "below" } else { "above" };
                let reason = match end {
                    None => format!(
                        "the arrow {} at code letter {} runs off the table: there is no plan {direction} it in this column",
                        cell.text(),
                        row.letter
                    ),
                    Some(TableCell::Blank | TableCell::Down | TableCell::Up) => format!(
                        "the arrow {} at code letter {} leads to an empty cell or a reversed arrow, not to a plan {direction} it",
                        cell.text(),
                        row.letter
                    ),
                    Some(_) => continue,
                };
                return Err(csv.fault(row.line, Some(column + first_aql(self.scheme)), reason));
            }
        }
        Ok(())
    }
}

/// The column of the first AQL in the files of `scheme`.
fn first_aql(scheme: Scheme) -> usize {
    match scheme {
        Scheme::Single => 2,
        _ => 4,
    }
}

/// Checks the header of a `scheme` table; returns the first AQL column.
fn check_header(csv: &CsvText, scheme: Scheme) -> Result<usize, StandardError> {
    let expected: &[&str] = match scheme {
        Scheme::Single => &["code_letter", "sample_size"],
        Scheme::Double => &[
            "code_letter",
            "sample",
            "sample_size",
            "cumulative_sample_size",
        ],
        _ => &[
            "code_letter",
            "stage",
            "sample_size",
            "cumulative_sample_size",
        ],
    };
    let first = expected.len();
    let h = &csv.header;
    let aqls_ok = h.len() == first + AQL_VALUES.len()
        && h[first..]
            .iter()
            .enumerate()
            .all(|(i, name)| Aql::parse(name).is_ok_and(|a| a.column() == i));
    if h.len() < first || h[..first] != *expected || !aqls_ok {
        return Err(csv.file_fault(format!(
            "the header must be {},{} (the standard's AQLs in order), as in the built-in {scheme}-sampling tables",
            expected.join(","),
            AQL_VALUES.join(",")
        )));
    }
    Ok(first)
}

/// Reads the stage rows of the `i`-th code letter.
fn read_letter(
    csv: &CsvText,
    i: usize,
    group: &[(u64, Vec<String>)],
    first: usize,
    severity: Severity,
    scheme: Scheme,
) -> Result<Row, StandardError> {
    let line = group[0].0;
    let Some(letter) = CodeLetter::from_row(i) else {
        return Err(csv.fault(
            line,
            Some(0),
            "the tables have at most 17 code letters, A to S".to_string(),
        ));
    };
    let mut sizes = Vec::new();
    for (stage, (l, fields)) in group.iter().enumerate() {
        if CodeLetter::parse(&fields[0]).ok() != Some(letter) {
            return Err(csv.fault(
                *l,
                Some(0),
                format!(
                    "expected code letter {letter} here, found '{}': the letters run A, B, C, ... R (without I and O), each on {} line{}",
                    fields[0],
                    group.len(),
                    if group.len() == 1 { "" } else { "s" }
                ),
            ));
        }
        if scheme != Scheme::Single && fields[1] != STAGE_NAMES[stage] {
            return Err(csv.fault(
                *l,
                Some(1),
                format!(
                    "expected the {} sample's line here, found '{}'",
                    STAGE_NAMES[stage], fields[1]
                ),
            ));
        }
        // The sample size, and for double and multiple plans the
        // cumulative one: both empty on a letter without plans.
        let (size_column, cumulative_column) = match scheme {
            Scheme::Single => (1, None),
            _ => (2, Some(3)),
        };
        let size = fields[size_column].as_str();
        let cumulative = cumulative_column.map(|c| fields[c].as_str());
        if size.is_empty() && cumulative.is_none_or(str::is_empty) {
            continue;
        }
        let Some(n) = count(size).filter(|n| (1..=MAX_SAMPLE_SIZE).contains(n)) else {
            return Err(csv.fault(
                *l,
                Some(size_column),
                format!(
                    "'{size}' is not a sample size: give a whole number of units from 1 to {MAX_SAMPLE_SIZE}"
                ),
            ));
        };
        // Both at most 7 x 10^9: no overflow.
        let total = sizes.last().copied().unwrap_or(0) + n;
        if let (Some(c), Some(column)) = (cumulative, cumulative_column)
            && count(c) != Some(total)
        {
            return Err(csv.fault(
                *l,
                Some(column),
                format!(
                    "'{c}' is not the cumulative sample size: it must be the sum of the sample sizes so far, {total}"
                ),
            ));
        }
        sizes.push(total);
    }
    if !sizes.is_empty() && sizes.len() != group.len() {
        return Err(csv.fault(
            line,
            Some(first - 1),
            format!("code letter {letter} gives sample sizes on some of its lines only: give them on every line, or on none"),
        ));
    }
    let mut cells = Vec::with_capacity(AQL_VALUES.len());
    for column in first..first + AQL_VALUES.len() {
        cells.push(read_cell(
            csv, group, column, letter, &sizes, severity, scheme,
        )?);
    }
    Ok(Row {
        letter,
        line,
        sizes,
        cells,
    })
}

/// Reads the cell in `column` across the stage rows of `letter`.
fn read_cell(
    csv: &CsvText,
    group: &[(u64, Vec<String>)],
    column: usize,
    letter: CodeLetter,
    sizes: &[u64],
    severity: Severity,
    scheme: Scheme,
) -> Result<TableCell, StandardError> {
    let mut tokens = Vec::with_capacity(group.len());
    for (l, fields) in group {
        let token = parse_token(&fields[column]).map_err(|r| csv.fault(*l, Some(column), r))?;
        let misplaced = match token {
            Token::Mark(Mark::UseSingle) if scheme == Scheme::Single => {
                Some("'*' (use the single plan) belongs to the double and multiple tables")
            }
            Token::Mark(Mark::UseDouble) if scheme != Scheme::Multiple => {
                Some("'++' (use the double plan) belongs to the multiple tables")
            }
            Token::Numbers(None, _) if scheme != Scheme::Multiple => {
                Some("'#' (no acceptance at this stage) belongs to the multiple tables")
            }
            _ => None,
        };
        if let Some(reason) = misplaced {
            return Err(csv.fault(*l, Some(column), reason.to_string()));
        }
        tokens.push((*l, token));
    }
    let line = group[0].0;
    if let Token::Mark(m) = tokens[0].1 {
        if let Some((l, _)) = tokens.iter().find(|(_, t)| *t != Token::Mark(m)) {
            return Err(csv.fault(
                *l,
                Some(column),
                format!(
                    "an arrow, '*', '++', '?' or an empty cell stands on every line of its code letter ({letter}): repeat it"
                ),
            ));
        }
        return Ok(m.cell());
    }
    if sizes.is_empty() {
        return Err(csv.fault(
            line,
            Some(column),
            format!("code letter {letter} has no sample size, so it cannot carry a plan: give its sample sizes, or put the arrow or mark that stands there"),
        ));
    }
    let mut stages = Vec::with_capacity(tokens.len());
    for ((l, token), &n) in tokens.iter().zip(sizes) {
        let Token::Numbers(accept, reject) = *token else {
            return Err(csv.fault(
                *l,
                Some(column),
                format!("a plan gives 'Ac Re' on every line of its code letter ({letter})"),
            ));
        };
        stages.push(Stage { n, accept, reject });
    }
    check_plan(&stages, severity).map_err(|reason| {
        csv.fault(
            line,
            Some(column),
            format!("the plan at code letter {letter} cannot be used: {reason}"),
        )
    })?;
    Ok(TableCell::Plan(stages))
}

/// The plan that decides a lot from a table's stages: as printed, except
/// that on reduced inspection a count between Ac and Re at the last stage
/// accepts the lot (105E, 4.10.1.4), so its acceptance number becomes
/// `Re - 1`.
pub(crate) fn lot_stages(stages: &[Stage], severity: Severity) -> Vec<Stage> {
    let mut lot = stages.to_vec();
    if severity == Severity::Reduced
        && let Some(last) = lot.last_mut()
    {
        last.accept = Some(last.reject.saturating_sub(1));
    }
    lot
}

/// A table plan must be a valid staged plan (on reduced inspection, once
/// its last stage's gap is read as acceptance), and its last stage must be
/// able to accept.
fn check_plan(stages: &[Stage], severity: Severity) -> Result<(), String> {
    if stages.last().is_some_and(|s| s.accept.is_none()) {
        return Err("its last stage cannot accept ('#'), so it decides no lot".to_string());
    }
    // The loosest model: no lot size, and a count may pass the sample size
    // (the plans of AQLs above 10 count nonconformities).
    let model = Model::new(ModelKind::Poisson, None).map_err(|e| e.to_string())?;
    StagedPlan::new(lot_stages(stages, severity), &model)
        .map(|_| ())
        .map_err(|e| e.to_string())
}
