//! One cell of a master table (MIL-STD-105E, Tables II to IV), as the
//! table files write it, and what it means once a code letter's stage rows
//! are read together.
//!
//! In the files a cell is `Ac Re` (two whole numbers, `#` for Ac where a
//! stage of a multiple plan cannot accept), `↓` or `↑` (use the first
//! plan below or above), `*` (use the single plan, in the double and
//! multiple tables), `++` (use the double plan, in the multiple tables),
//! `?` (not transcribed) or empty (nothing printed).

use crate::plan::{MAX_ACCEPTANCE_NUMBER, Stage};

/// What a table says at one code letter and AQL.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum TableCell {
    /// A plan: its stages on cumulative sample sizes, with the acceptance
    /// and rejection numbers as the table prints them (`accept: None` is
    /// the multiple tables' `#`, no acceptance at that stage). On reduced
    /// inspection the last stage may leave a gap between them (105E,
    /// 4.10.1.4).
    Plan(Vec<Stage>),
    /// `↓`: use the first plan below, with its sample size.
    Down,
    /// `↑`: use the first plan above, with its sample size.
    Up,
    /// `*`: use the corresponding single plan.
    UseSingle,
    /// `++`: use the corresponding double plan.
    UseDouble,
    /// `?`: not transcribed; a lookup that reaches it is refused.
    NotTranscribed,
    /// Nothing printed.
    Blank,
}

impl TableCell {
    /// The cell as the files write it, for messages: `3 4`, `↓`, `*`, or
    /// a staged plan's stages joined by ` / `.
    pub fn text(&self) -> String {
        match self {
            TableCell::Plan(stages) => stages
                .iter()
                .map(|s| match s.accept {
                    Some(a) => format!("{a} {}", s.reject),
                    None => format!("# {}", s.reject),
                })
                .collect::<Vec<_>>()
                .join(" / "),
            TableCell::Down => "↓".to_string(),
            TableCell::Up => "↑".to_string(),
            TableCell::UseSingle => "*".to_string(),
            TableCell::UseDouble => "++".to_string(),
            TableCell::NotTranscribed => "?".to_string(),
            TableCell::Blank => String::new(),
        }
    }
}

/// One field of a stage row, before the rows of a code letter are joined.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) enum Token {
    /// `Ac Re`, with `None` for `#`.
    Numbers(Option<u64>, u64),
    /// Any other cell, the same on every stage row of a letter.
    Mark(Mark),
}

/// The cells other than numbers.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) enum Mark {
    Down,
    Up,
    UseSingle,
    UseDouble,
    NotTranscribed,
    Blank,
}

impl Mark {
    pub(crate) fn cell(self) -> TableCell {
        match self {
            Mark::Down => TableCell::Down,
            Mark::Up => TableCell::Up,
            Mark::UseSingle => TableCell::UseSingle,
            Mark::UseDouble => TableCell::UseDouble,
            Mark::NotTranscribed => TableCell::NotTranscribed,
            Mark::Blank => TableCell::Blank,
        }
    }
}

/// Reads one field; the error says, in plain words, what the field must
/// hold.
pub(crate) fn parse_token(text: &str) -> Result<Token, String> {
    let t = text.trim();
    let mark = match t {
        "↓" => Some(Mark::Down),
        "↑" => Some(Mark::Up),
        "*" => Some(Mark::UseSingle),
        "++" => Some(Mark::UseDouble),
        "?" => Some(Mark::NotTranscribed),
        "" => Some(Mark::Blank),
        _ => None,
    };
    if let Some(m) = mark {
        return Ok(Token::Mark(m));
    }
    let bad = || {
        format!(
            "'{t}' is not a cell of the tables: write the acceptance and rejection numbers as 'Ac Re' (for example '3 4', or '# 2' where a stage cannot accept), or one of ↓ ↑ * ++ ? as in the built-in tables"
        )
    };
    let parts: Vec<&str> = t.split_whitespace().collect();
    let [ac, re] = parts.as_slice() else {
        return Err(bad());
    };
    let number = |s: &str| -> Result<u64, String> {
        if s.is_empty() || !s.chars().all(|c| c.is_ascii_digit()) {
            return Err(bad());
        }
        match s.parse::<u64>() {
            Ok(v) if v <= MAX_ACCEPTANCE_NUMBER + 1 => Ok(v),
            _ => Err(format!(
                "'{t}': {s} is beyond the largest acceptance or rejection number a plan may have ({})",
                MAX_ACCEPTANCE_NUMBER + 1
            )),
        }
    };
    let accept = match *ac {
        "#" => None,
        a => Some(number(a)?),
    };
    let reject = number(re)?;
    if reject == 0 || accept.is_some_and(|a| a >= reject) {
        return Err(format!(
            "'{t}': the rejection number must be above the acceptance number (and at least 1)"
        ));
    }
    Ok(Token::Numbers(accept, reject))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn cells_read_as_the_files_write_them() {
        assert_eq!(parse_token("3 4"), Ok(Token::Numbers(Some(3), 4)));
        assert_eq!(parse_token(" # 2 "), Ok(Token::Numbers(None, 2)));
        assert_eq!(parse_token("↓"), Ok(Token::Mark(Mark::Down)));
        assert_eq!(parse_token("++"), Ok(Token::Mark(Mark::UseDouble)));
        assert_eq!(parse_token(""), Ok(Token::Mark(Mark::Blank)));
    }

    #[test]
    fn malformed_cells_say_what_a_cell_holds() {
        for bad in ["3", "3 4 5", "a b", "4 3", "3 3", "v", "-1 2", "# #"] {
            let e = parse_token(bad).unwrap_err();
            assert!(e.contains(bad.trim()), "{bad}: {e}");
        }
    }

    #[test]
    fn a_plan_prints_back_in_the_files_notation() {
        let cell = TableCell::Plan(vec![
            Stage {
                n: 32,
                accept: None,
                reject: 2,
            },
            Stage {
                n: 64,
                accept: Some(1),
                reject: 2,
            },
        ]);
        assert_eq!(cell.text(), "# 2 / 1 2");
    }
}
