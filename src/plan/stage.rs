//! One stage of an attribute plan, on cumulative figures, and its
//! notation `N:AC:RE`.

use std::fmt;

use serde::{Deserialize, Serialize};

use crate::input::InputError;
use crate::numeric::parse_count;

/// One stage of a staged plan, on cumulative figures.
///
/// After `n` units in all have been inspected, the cumulative count `d` of
/// nonconforming units (or nonconformities) decides: accept when
/// `d <= accept`, reject when `d >= reject`, otherwise go on to the next
/// stage. `accept = None` means the stage cannot accept (only reject or go
/// on).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Stage {
    /// Cumulative sample size after this stage.
    pub n: u64,
    /// Acceptance number on the cumulative count, if the stage can accept.
    pub accept: Option<u64>,
    /// Rejection number on the cumulative count.
    pub reject: u64,
}

impl fmt::Display for Stage {
    /// `N:AC:RE`, the notation of `evaluate --stage`; `-` for a stage that
    /// cannot accept.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self.accept {
            Some(a) => write!(f, "{}:{}:{}", self.n, a, self.reject),
            None => write!(f, "{}:-:{}", self.n, self.reject),
        }
    }
}

/// Parses a stage `N:AC:RE` (cumulative sample size, acceptance number or
/// `-` for none, rejection number), the notation of `evaluate --stage`.
///
/// # Errors
/// [`InputError::Unparsable`] for a malformed text.
pub fn parse_stage(text: &str) -> Result<Stage, InputError> {
    let bad = || {
        InputError::unparsable(
            "--stage",
            text,
            "N:AC:RE, for example 50:1:4 (AC may be '-')",
        )
    };
    let parts: Vec<&str> = text.split(':').collect();
    let [n, ac, re] = parts.as_slice() else {
        return Err(bad());
    };
    let n = parse_count("--stage sample size", n, u64::MAX).map_err(|_| bad())?;
    let accept = match ac.trim() {
        "-" => None,
        a => Some(parse_count("--stage acceptance number", a, u64::MAX).map_err(|_| bad())?),
    };
    let reject = parse_count("--stage rejection number", re, u64::MAX).map_err(|_| bad())?;
    Ok(Stage { n, accept, reject })
}
