//! The severity of inspection: normal, tightened or reduced (MIL-STD-105E,
//! 4.6 and 4.7). Each severity has its own master tables; the switching
//! rules move a supplier between them lot by lot.

use std::fmt;
use std::str::FromStr;

use serde::Serialize;

use super::error::StandardError;

/// The severity of inspection in force for a lot.
///
/// # Example
/// ```
/// use lotsman::Severity;
/// assert_eq!("tightened".parse::<Severity>().unwrap(), Severity::Tightened);
/// assert!("strict".parse::<Severity>().is_err());
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Severity {
    /// Normal inspection, where a contract starts (105E, 4.6).
    Normal,
    /// Tightened inspection: larger acceptance-number steps against the
    /// producer, after poor lots (105E, 4.7.1).
    Tightened,
    /// Reduced inspection: smaller samples, after a good record (105E,
    /// 4.7.3); a count between Ac and Re accepts the lot but returns the
    /// next lot to normal inspection (105E, 4.10.1.4).
    Reduced,
}

impl Severity {
    /// Every severity, normal first.
    pub const ALL: [Severity; 3] = [Severity::Normal, Severity::Tightened, Severity::Reduced];

    /// The name used on the command line, in YAML and in JSON.
    pub fn name(self) -> &'static str {
        match self {
            Severity::Normal => "normal",
            Severity::Tightened => "tightened",
            Severity::Reduced => "reduced",
        }
    }

    /// Parses `normal`, `tightened` or `reduced` (any case).
    ///
    /// # Errors
    /// [`StandardError::Severity`] for anything else.
    pub fn parse(text: &str) -> Result<Severity, StandardError> {
        let t = text.trim().to_ascii_lowercase();
        Severity::ALL
            .into_iter()
            .find(|s| s.name() == t)
            .ok_or_else(|| StandardError::Severity {
                given: text.to_string(),
            })
    }
}

impl fmt::Display for Severity {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

impl FromStr for Severity {
    type Err = StandardError;

    fn from_str(s: &str) -> Result<Self, Self::Err> {
        Severity::parse(s)
    }
}
