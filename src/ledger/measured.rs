//! The statistics a variables lot was decided from, as three ledger
//! cells: `mean` and `sd` of the readings (`n - 1` divisor), and
//! `data_sha256`, the SHA-256 of the measurements file as read.
//!
//! The mean and standard deviation decide the lot under the normal model
//! (they are sufficient: see
//! [`decide_from_statistics`](crate::decide_from_statistics)), so `verify`
//! decides the lot again from the row alone; the file's hash lets an
//! auditor who holds the file confirm the readings are the ones judged.
//!
//! Each number is written as the shortest decimal that reads back to the
//! same double (Rust's `{}` of an `f64`), so the replay uses exactly the
//! values the lot was judged with; any other text is refused.

use super::hash::is_hash;

/// The statistics of a variables lot.
#[derive(Clone, Debug, PartialEq)]
pub struct Measured {
    /// The readings' mean.
    pub mean: f64,
    /// The readings' standard deviation, `n - 1` divisor.
    pub sd: f64,
    /// The SHA-256 of the measurements file.
    pub data_sha256: String,
}

impl Measured {
    /// The `mean`, `sd` and `data_sha256` cells (empty for `None`).
    pub fn cells(measured: Option<&Measured>) -> [String; 3] {
        match measured {
            Some(m) => [m.mean.to_string(), m.sd.to_string(), m.data_sha256.clone()],
            None => Default::default(),
        }
    }

    /// Reads the three cells: all empty (an attributes lot) or all
    /// written as the ledger writes them.
    ///
    /// ```
    /// use lotsman::Measured;
    /// let h = "ab".repeat(32);
    /// let m = Measured::from_cells("12.03", "0.021", &h).unwrap().unwrap();
    /// assert_eq!((m.mean, m.sd), (12.03, 0.021));
    /// assert_eq!(Measured::from_cells("", "", ""), Ok(None));
    /// assert!(Measured::from_cells("12.030", "0.021", &h).is_err());
    /// assert!(Measured::from_cells("12.03", "0", &h).is_err());
    /// ```
    ///
    /// # Errors
    /// The column and what it takes.
    pub fn from_cells(
        mean: &str,
        sd: &str,
        data_sha256: &str,
    ) -> Result<Option<Measured>, (&'static str, String)> {
        if mean.is_empty() && sd.is_empty() && data_sha256.is_empty() {
            return Ok(None);
        }
        let mean = number("mean", mean)?;
        let sd = number("sd", sd)?;
        if sd <= 0.0 {
            return Err((
                "sd",
                format!(
                    "{sd} is not a standard deviation above 0 (a variables lot's readings have a spread)"
                ),
            ));
        }
        if !is_hash(data_sha256) {
            return Err((
                "data_sha256",
                format!(
                    "'{data_sha256}' is not a SHA-256 written as 64 lower-case hexadecimal digits"
                ),
            ));
        }
        Ok(Some(Measured {
            mean,
            sd,
            data_sha256: data_sha256.to_string(),
        }))
    }
}

/// A finite number written as the ledger writes it.
fn number(column: &'static str, text: &str) -> Result<f64, (&'static str, String)> {
    text.parse::<f64>()
        .ok()
        .filter(|v| v.is_finite() && v.to_string() == text)
        .ok_or_else(|| {
            (
                column,
                format!(
                    "'{text}' is not a number written as the ledger writes it (the shortest decimal of the value, e.g. 12.03; empty for an attributes lot)"
                ),
            )
        })
}
