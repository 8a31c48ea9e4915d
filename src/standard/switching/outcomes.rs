//! What one lot of a given quality does under one severity's plan: the
//! inputs of the scheme's long-run OC, which the caller computes from each
//! plan's exact OC.

use super::error::SwitchingError;
use crate::standard::Severity;

/// The tolerance within which outcome probabilities must add up.
const SUM_TOLERANCE: f64 = 1e-9;

/// One severity's per-lot outcomes at one quality.
///
/// - `accept`, `reject`: the chances that a lot is accepted or not (both
///   from the plan's tails, adding up to 1);
/// - `asn`: the expected units inspected per lot;
/// - `accepted_units`: the expected units inspected on a lot that is
///   accepted, times that chance (`sum_j a_j n_j` over the stages), for the
///   AOQ and the ATI under rectification;
/// - on normal inspection, `accepted_counts[x]`: the chance that a lot is
///   accepted with count `x` over all its samples, `x = 0 ..= Ac` (the
///   limit-number rule adds these counts);
/// - on reduced inspection, `between`: the chance that a lot is accepted
///   with its count between Ac and Re (105E 4.10.1.4).
#[derive(Clone, Debug, PartialEq)]
pub struct LotOutcomes {
    pub(crate) accept: f64,
    pub(crate) reject: f64,
    pub(crate) asn: f64,
    pub(crate) accepted_units: f64,
    pub(crate) accepted_counts: Vec<f64>,
    pub(crate) between: f64,
}

fn probability(what: &'static str, p: f64) -> Result<f64, SwitchingError> {
    if p.is_finite() && (0.0..=1.0).contains(&p) {
        Ok(p)
    } else {
        Err(SwitchingError::OutOfRange {
            what,
            value: p.to_string(),
            range: "a probability from 0 to 1".into(),
        })
    }
}

impl LotOutcomes {
    /// Outcomes with acceptance and rejection chances, ASN and the expected
    /// units inspected on accepted lots.
    ///
    /// ```
    /// use lotsman::{LotOutcomes, Severity};
    /// // A single plan n = 125, Ac 2, Re 3 at some quality.
    /// let t = LotOutcomes::new(Severity::Tightened, 0.9, 0.1, 125.0, 0.9 * 125.0).unwrap();
    /// assert!(LotOutcomes::new(Severity::Tightened, 0.9, 0.2, 125.0, 112.5).is_err());
    /// ```
    ///
    /// # Errors
    /// [`SwitchingError::OutOfRange`] for a probability outside 0 to 1, a
    /// negative or infinite number of units, or accepted units above the
    /// ASN; [`SwitchingError::NotADistribution`] when `accept + reject` is
    /// not 1.
    pub fn new(
        severity: Severity,
        accept: f64,
        reject: f64,
        asn: f64,
        accepted_units: f64,
    ) -> Result<Self, SwitchingError> {
        let accept = probability("the chance that a lot is accepted", accept)?;
        let reject = probability("the chance that a lot is not accepted", reject)?;
        if (accept + reject - 1.0).abs() > SUM_TOLERANCE {
            return Err(SwitchingError::NotADistribution {
                severity: severity.name(),
                reason: format!(
                    "accepted {accept} plus not accepted {reject} is {}, not 1",
                    accept + reject
                ),
            });
        }
        for (what, units) in [
            ("the average sample number", asn),
            ("the units inspected on accepted lots", accepted_units),
        ] {
            if !units.is_finite() || units < 0.0 {
                return Err(SwitchingError::OutOfRange {
                    what,
                    value: units.to_string(),
                    range: "a finite number of units, at least 0".into(),
                });
            }
        }
        if accepted_units > asn * (1.0 + SUM_TOLERANCE) {
            return Err(SwitchingError::OutOfRange {
                what: "the units inspected on accepted lots",
                value: accepted_units.to_string(),
                range: format!("at most the average sample number {asn}"),
            });
        }
        Ok(LotOutcomes {
            accept,
            reject,
            asn,
            accepted_units,
            accepted_counts: Vec::new(),
            between: 0.0,
        })
    }

    /// The chance of each count on an accepted lot (normal inspection),
    /// `counts[x]` for `x = 0 ..= Ac`.
    ///
    /// # Errors
    /// [`SwitchingError::OutOfRange`] for a count chance outside 0 to 1;
    /// [`SwitchingError::NotADistribution`] when they do not add up to the
    /// chance of acceptance.
    pub fn with_counts(self, counts: Vec<f64>) -> Result<Self, SwitchingError> {
        for &p in &counts {
            probability("the chance of a count on an accepted lot", p)?;
        }
        let total: f64 = counts.iter().sum();
        if (total - self.accept).abs() > SUM_TOLERANCE {
            return Err(SwitchingError::NotADistribution {
                severity: "normal",
                reason: format!(
                    "the chances of the counts on accepted lots add up to {total}, not to the chance of acceptance {}",
                    self.accept
                ),
            });
        }
        Ok(LotOutcomes {
            accepted_counts: counts,
            ..self
        })
    }

    /// The chance that a reduced lot is accepted with its count between Ac
    /// and Re (105E 4.10.1.4).
    ///
    /// # Errors
    /// [`SwitchingError::OutOfRange`] when it is not a probability at most
    /// the chance of acceptance.
    pub fn with_between(self, between: f64) -> Result<Self, SwitchingError> {
        let between = probability("the chance of a count between Ac and Re", between)?;
        if between > self.accept + SUM_TOLERANCE {
            return Err(SwitchingError::OutOfRange {
                what: "the chance of a count between Ac and Re",
                value: between.to_string(),
                range: format!("at most the chance of acceptance {}", self.accept),
            });
        }
        Ok(LotOutcomes { between, ..self })
    }

    /// The chance of acceptance.
    pub fn accept(&self) -> f64 {
        self.accept
    }

    /// The chance of non-acceptance.
    pub fn reject(&self) -> f64 {
        self.reject
    }
}
