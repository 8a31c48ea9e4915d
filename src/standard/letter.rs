//! Sample-size code letters and inspection levels (MIL-STD-105E, 4.9.1,
//! 4.9.2 and Table I).
//!
//! The letters run A to R without I and O; the tightened tables carry one
//! row more, S, reached only through an arrow. The inspection level sets
//! how the sample grows with the lot: the general levels I, II (the usual
//! one) and III, and the special levels S-1 to S-4 for small samples where
//! larger sampling risks can be borne.

use std::fmt;
use std::str::FromStr;

use serde::{Serialize, Serializer};

use super::error::StandardError;

/// The letters in the tables' order.
const LETTERS: [char; 17] = [
    'A', 'B', 'C', 'D', 'E', 'F', 'G', 'H', 'J', 'K', 'L', 'M', 'N', 'P', 'Q', 'R', 'S',
];

/// A sample-size code letter: a row of the master tables.
///
/// # Example
/// ```
/// use lotsman::CodeLetter;
/// let k: CodeLetter = "K".parse().unwrap();
/// assert_eq!(k.next().unwrap().to_string(), "L");
/// assert!("I".parse::<CodeLetter>().is_err());
/// ```
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub struct CodeLetter {
    row: u8,
}

impl CodeLetter {
    /// Every letter, A first (S, the tightened tables' extra row, last).
    pub fn all() -> impl Iterator<Item = CodeLetter> {
        (0..LETTERS.len() as u8).map(|row| CodeLetter { row })
    }

    /// The letter of a table row (0 is A), if any.
    pub fn from_row(row: usize) -> Option<CodeLetter> {
        (row < LETTERS.len()).then_some(CodeLetter { row: row as u8 })
    }

    /// Parses a letter (`K` or `k`).
    ///
    /// # Errors
    /// [`StandardError::CodeLetter`] for anything but one of the letters.
    pub fn parse(text: &str) -> Result<CodeLetter, StandardError> {
        let t = text.trim();
        let mut chars = t.chars();
        match (chars.next(), chars.next()) {
            (Some(c), None) => LETTERS
                .iter()
                .position(|&l| l == c.to_ascii_uppercase())
                .and_then(CodeLetter::from_row),
            _ => None,
        }
        .ok_or_else(|| StandardError::CodeLetter {
            given: text.to_string(),
        })
    }

    /// The row in the tables' order (A is 0).
    pub fn row(self) -> usize {
        usize::from(self.row)
    }

    /// The letter itself.
    pub fn letter(self) -> char {
        LETTERS[self.row()]
    }

    /// The next letter down the tables (K to L), if any.
    pub fn next(self) -> Option<CodeLetter> {
        CodeLetter::from_row(self.row() + 1)
    }
}

impl fmt::Display for CodeLetter {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}", self.letter())
    }
}

impl FromStr for CodeLetter {
    type Err = StandardError;

    fn from_str(s: &str) -> Result<Self, Self::Err> {
        CodeLetter::parse(s)
    }
}

impl Serialize for CodeLetter {
    /// The letter, a one-character string.
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.collect_str(self)
    }
}

/// An inspection level of Table I.
///
/// # Example
/// ```
/// use lotsman::InspectionLevel;
/// let level: InspectionLevel = "S-3".parse().unwrap();
/// assert_eq!(level.name(), "S-3");
/// assert!("IV".parse::<InspectionLevel>().is_err());
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum InspectionLevel {
    /// Special level S-1, the smallest samples.
    S1,
    /// Special level S-2.
    S2,
    /// Special level S-3.
    S3,
    /// Special level S-4.
    S4,
    /// General level I: smaller samples, less discrimination.
    I,
    /// General level II, the standard's usual level.
    II,
    /// General level III: larger samples, more discrimination.
    III,
}

impl InspectionLevel {
    /// Every level, in Table I's column order.
    pub const ALL: [InspectionLevel; 7] = [
        InspectionLevel::S1,
        InspectionLevel::S2,
        InspectionLevel::S3,
        InspectionLevel::S4,
        InspectionLevel::I,
        InspectionLevel::II,
        InspectionLevel::III,
    ];

    /// The level's name as Table I heads its column (`S-1`, `II`).
    pub fn name(self) -> &'static str {
        match self {
            InspectionLevel::S1 => "S-1",
            InspectionLevel::S2 => "S-2",
            InspectionLevel::S3 => "S-3",
            InspectionLevel::S4 => "S-4",
            InspectionLevel::I => "I",
            InspectionLevel::II => "II",
            InspectionLevel::III => "III",
        }
    }

    /// The level's column in Table I (S-1 is 0, III is 6).
    pub fn column(self) -> usize {
        InspectionLevel::ALL
            .iter()
            .position(|&l| l == self)
            .unwrap_or(0)
    }

    /// Parses a level: `I`, `II`, `III`, `S-1` to `S-4` (any case).
    ///
    /// # Errors
    /// [`StandardError::Level`] for anything else.
    pub fn parse(text: &str) -> Result<InspectionLevel, StandardError> {
        let t = text.trim().to_ascii_uppercase();
        InspectionLevel::ALL
            .into_iter()
            .find(|l| l.name() == t)
            .ok_or_else(|| StandardError::Level {
                given: text.to_string(),
            })
    }
}

impl fmt::Display for InspectionLevel {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

impl FromStr for InspectionLevel {
    type Err = StandardError;

    fn from_str(s: &str) -> Result<Self, Self::Err> {
        InspectionLevel::parse(s)
    }
}

impl Serialize for InspectionLevel {
    /// The level's name (`"II"`, `"S-3"`).
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.serialize_str(self.name())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn letters_skip_i_and_o() {
        let all: String = CodeLetter::all().map(|l| l.letter()).collect();
        assert_eq!(all, "ABCDEFGHJKLMNPQRS");
        for bad in ["I", "O", "T", "", "KK", "1"] {
            assert!(CodeLetter::parse(bad).is_err(), "{bad}");
        }
        assert_eq!(CodeLetter::parse("k").unwrap().to_string(), "K");
        assert_eq!(CodeLetter::parse("S").unwrap().next(), None);
    }

    #[test]
    fn levels_parse_by_name_only() {
        for level in InspectionLevel::ALL {
            assert_eq!(InspectionLevel::parse(level.name()).unwrap(), level);
        }
        assert_eq!(InspectionLevel::parse("s-2").unwrap(), InspectionLevel::S2);
        for bad in ["IV", "S1", "2", "", "S-5", "general"] {
            let e = InspectionLevel::parse(bad).unwrap_err();
            assert!(e.to_string().contains("I, II, III"), "{e}");
        }
    }
}
