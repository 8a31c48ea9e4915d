//! The counts of one lot as a ledger cell: the count `found` in each
//! stage's new units, or the units inspected, per class of defects where
//! the plan has several.
//!
//! # The cell's text
//!
//! - One count list, for a plan without named classes: the numbers of the
//!   stages in order, separated by commas: `2`, `1,3`.
//! - Named classes: `NAME=LIST` per class, in the plan's order, separated
//!   by semicolons: `critical=0;major=1,3;minor=2`. This is the text of
//!   `judge --found`, one `--found` per class.
//!
//! Numbers are whole and written without signs, spaces or leading zeros;
//! a name is letters, digits, `-` and `_`. Anything else is refused, so
//! one text reads one way only.

use std::fmt;

/// Counts per class (named, or one unnamed class) and per stage.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Tally {
    classes: Vec<(Option<String>, Vec<u64>)>,
}

impl Tally {
    /// One unnamed class with the counts of each stage.
    pub fn single(counts: Vec<u64>) -> Tally {
        Tally {
            classes: vec![(None, counts)],
        }
    }

    /// Named classes, each with the counts of each stage.
    pub fn named(classes: Vec<(String, Vec<u64>)>) -> Tally {
        Tally {
            classes: classes.into_iter().map(|(n, c)| (Some(n), c)).collect(),
        }
    }

    /// The classes: name (none for a plan without classes) and counts.
    pub fn classes(&self) -> &[(Option<String>, Vec<u64>)] {
        &self.classes
    }

    /// The counts of each class, in order, without the names.
    pub fn counts(&self) -> Vec<Vec<u64>> {
        self.classes.iter().map(|(_, c)| c.clone()).collect()
    }

    /// The texts `judge --found` takes for these counts: `NAME=K,K` per
    /// class, or the bare counts.
    pub fn found_args(&self) -> Vec<String> {
        self.classes
            .iter()
            .map(|(name, counts)| {
                let list = join(counts);
                name.as_ref()
                    .map_or(list.clone(), |n| format!("{n}={list}"))
            })
            .collect()
    }

    /// Reads a cell, strictly (see the module doc).
    ///
    /// ```
    /// use lotsman::Tally;
    /// let t = Tally::parse("major=1,3;minor=0").unwrap();
    /// assert_eq!(t.counts(), vec![vec![1, 3], vec![0]]);
    /// assert_eq!(t.to_string(), "major=1,3;minor=0");
    /// assert!(Tally::parse("1, 3").is_err());
    /// assert!(Tally::parse("major=01").is_err());
    /// ```
    ///
    /// # Errors
    /// A message saying what the cell holds that it may not.
    pub fn parse(text: &str) -> Result<Tally, String> {
        if text.is_empty() {
            return Err(
                "the cell is empty; it takes counts such as 2, 1,3 or major=1,3;minor=0".into(),
            );
        }
        if !text.contains('=') {
            return Ok(Tally::single(list(text)?));
        }
        let mut classes = Vec::new();
        for part in text.split(';') {
            let Some((name, counts)) = part.split_once('=') else {
                return Err(format!(
                    "'{part}' names no class; write every class as NAME=K, separated by semicolons"
                ));
            };
            if name.is_empty()
                || !name
                    .bytes()
                    .all(|b| b.is_ascii_alphanumeric() || b == b'-' || b == b'_')
            {
                return Err(format!(
                    "'{name}' is not a class name (letters, digits, - and _ only)"
                ));
            }
            if classes.iter().any(|(n, _): &(String, _)| n == name) {
                return Err(format!("the class '{name}' is written twice"));
            }
            classes.push((name.to_string(), list(counts)?));
        }
        Ok(Tally::named(classes))
    }
}

/// The counts of one class, separated by commas.
fn list(text: &str) -> Result<Vec<u64>, String> {
    text.split(',')
        .map(|k| {
            let canonical = !k.is_empty()
                && k.bytes().all(|b| b.is_ascii_digit())
                && (k == "0" || !k.starts_with('0'));
            k.parse::<u64>()
                .ok()
                .filter(|_| canonical)
                .ok_or_else(|| {
                    format!(
                        "'{k}' is not a whole number written plainly (digits only, no sign, space or leading zero)"
                    )
                })
        })
        .collect()
}

fn join(counts: &[u64]) -> String {
    counts
        .iter()
        .map(u64::to_string)
        .collect::<Vec<_>>()
        .join(",")
}

impl fmt::Display for Tally {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let parts: Vec<String> = self
            .classes
            .iter()
            .map(|(name, counts)| match name {
                Some(n) => format!("{n}={}", join(counts)),
                None => join(counts),
            })
            .collect();
        f.write_str(&parts.join(";"))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reads_what_it_writes_and_refuses_the_rest() {
        for text in ["0", "1,3", "major=1,3;minor=0", "a_b-1=7"] {
            assert_eq!(Tally::parse(text).unwrap().to_string(), text);
        }
        for bad in [
            "",
            "1,,3",
            "-1",
            "+2",
            " 2",
            "1;2",
            "major=1;major=2",
            "=1",
            "m=1;2",
        ] {
            assert!(Tally::parse(bad).is_err(), "{bad}");
        }
    }
}
