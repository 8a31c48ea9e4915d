//! The error of a standard-indexed request: a value that is not one of the
//! standard's, a table cell that was never transcribed, a table file that
//! does not have the tables' shape. Every message says what is wrong,
//! where, and how to fix it, in the words of the trade.

use thiserror::Error;

use crate::input::InputError;

/// Why a standard-indexed request (MIL-STD-105E tables) has no answer.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum StandardError {
    /// An inspection level other than the standard's seven.
    #[error(
        "inspection level '{given}' is not one of the standard's levels: I, II, III (general levels; II is the usual one) or S-1, S-2, S-3, S-4 (special levels)"
    )]
    Level {
        /// The text as given.
        given: String,
    },
    /// An AQL other than the standard's 26 values.
    #[error(
        "AQL '{given}' is not one of the standard's values; give one of 0.010, 0.015, 0.025, 0.040, 0.065, 0.10, 0.15, 0.25, 0.40, 0.65, 1.0, 1.5, 2.5, 4.0, 6.5, 10 (percent nonconforming or nonconformities per 100 units) or 15, 25, 40, 65, 100, 150, 250, 400, 650, 1000 (nonconformities per 100 units only)"
    )]
    Aql {
        /// The text as given.
        given: String,
    },
    /// An inspection severity other than normal, tightened and reduced.
    #[error("severity '{given}' is not one of normal, tightened, reduced")]
    Severity {
        /// The text as given.
        given: String,
    },
    /// A code letter that is not one of the tables' rows.
    #[error(
        "code letter '{given}' is not one of the standard's sample-size code letters A to R (the letters I and O are not used)"
    )]
    CodeLetter {
        /// The text as given.
        given: String,
    },
    /// A scheme the standard's tables do not hold.
    #[error(
        "the standard's tables hold single, double and multiple plans, not {given} plans; choose --scheme single, double or multiple"
    )]
    Scheme {
        /// The scheme asked for.
        given: String,
    },
    /// An AQL above 10 with a model of the fraction nonconforming.
    #[error(
        "AQL {aql} is in nonconformities per 100 units only (the standard's AQLs above 10 are), so the count is Poisson: use the poisson model, not {model}"
    )]
    AqlNeedsPoisson {
        /// The AQL as the standard prints it.
        aql: String,
        /// The model asked for.
        model: String,
    },
    /// A table cell that could not be transcribed ('?'), reached directly
    /// or through an arrow, `*` or `++`.
    #[error(
        "{table} has no transcribed plan at code letter {letter}, AQL {aql}{via}: the cell is marked '?' because no source available when the table was entered settles it, and lotsman never guesses a plan; give your own copy of the table (lotsman standard --table SEVERITY=FILE.csv), leave reduced inspection out (--no-reduced) when the cell is on reduced inspection, or choose another scheme"
    )]
    NotTranscribed {
        /// The table holding the cell, e.g. `Table II-C (single sampling,
        /// reduced inspection)`.
        table: String,
        /// The code letter of the cell.
        letter: String,
        /// The AQL as the standard prints it.
        aql: String,
        /// Where the lookup started when it is not that cell, e.g. `,
        /// where the lookup for code letter C leads`; empty otherwise.
        via: String,
    },
    /// A table cell on which the table prints nothing.
    #[error(
        "{table} prints no plan for code letter {letter} at AQL {aql}; choose another AQL or scheme"
    )]
    NoPlan {
        /// The table.
        table: String,
        /// The code letter.
        letter: String,
        /// The AQL as the standard prints it.
        aql: String,
    },
    /// A table file (built in or given by the user) that does not have the
    /// tables' shape.
    #[error("{file}{}: {reason}", place(*line, column))]
    TableFile {
        /// The file's name.
        file: String,
        /// The line (counted from 1), where the fault has one.
        line: Option<u64>,
        /// The column's name (its header), where the fault has one.
        column: Option<String>,
        /// What is wrong and how to put it right.
        reason: String,
    },
    /// A list of defect classes that cannot be read.
    #[error("{0}")]
    Classes(String),
    /// An input that is not valid (lot size, quality, risk, counts).
    #[error(transparent)]
    Input(#[from] InputError),
}

/// `, line 12, column 1.0` for a table file's fault.
fn place(line: Option<u64>, column: &Option<String>) -> String {
    let mut s = String::new();
    if let Some(l) = line {
        s.push_str(&format!(", line {l}"));
    }
    if let Some(c) = column {
        s.push_str(&format!(", column '{c}'"));
    }
    s
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_table_fault_names_file_line_and_column() {
        let e = StandardError::TableFile {
            file: "mine.csv".into(),
            line: Some(12),
            column: Some("1.0".into()),
            reason: "'3' is not a plan".into(),
        };
        assert_eq!(
            e.to_string(),
            "mine.csv, line 12, column '1.0': '3' is not a plan"
        );
    }
}
