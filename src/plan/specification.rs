//! The measured characteristic's specification for a variables plan: its
//! limits and what is known of the process standard deviation.

use serde::{Deserialize, Serialize};

use crate::input::InputError;
use crate::model::normal;

/// Whether the process standard deviation is known or estimated from each
/// sample.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum SigmaKind {
    /// Known from a stable process record: the statistic divides by sigma.
    Known,
    /// Estimated: the statistic divides by the sample standard deviation.
    Unknown,
}

impl SigmaKind {
    /// The name used on the command line, in YAML and in JSON.
    pub fn name(self) -> &'static str {
        match self {
            SigmaKind::Known => "known",
            SigmaKind::Unknown => "unknown",
        }
    }
}

/// Which specification limits the characteristic has.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum LimitKind {
    /// A lower limit `L` only.
    Lower,
    /// An upper limit `U` only.
    Upper,
    /// Both `L` and `U`.
    Both,
}

impl LimitKind {
    /// The name used on the command line, in YAML and in JSON.
    pub fn name(self) -> &'static str {
        match self {
            LimitKind::Lower => "lower",
            LimitKind::Upper => "upper",
            LimitKind::Both => "both",
        }
    }
}

/// The measured characteristic's specification: its limits and what is
/// known of its standard deviation. Valid means: the limits the kind needs
/// are given and finite (and no others), `L < U`, and a known sigma is a
/// finite positive number.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Specification {
    sigma: Option<f64>,
    limit: LimitKind,
    lower: Option<f64>,
    upper: Option<f64>,
}

impl Specification {
    /// Validates a specification.
    ///
    /// # Errors
    /// [`InputError`] naming the missing, misplaced or out-of-range value.
    pub fn new(
        sigma: SigmaKind,
        sigma_value: Option<f64>,
        limit: LimitKind,
        lower: Option<f64>,
        upper: Option<f64>,
    ) -> Result<Self, InputError> {
        let sigma = match (sigma, sigma_value) {
            (SigmaKind::Known, Some(v)) if v.is_finite() && v > 0.0 => Some(v),
            (SigmaKind::Known, Some(v)) => {
                return Err(InputError::out_of_range(
                    "sigma value (--sigma-value)",
                    v,
                    "a finite number above 0, in the unit of the measurements",
                ));
            }
            (SigmaKind::Known, None) => {
                return Err(InputError::Inconsistent(
                    "sigma known needs its value: give --sigma-value S (sigma_value in the plan source)"
                        .to_string(),
                ));
            }
            (SigmaKind::Unknown, Some(_)) => {
                return Err(InputError::Inconsistent(
                    "sigma unknown is estimated from each sample; drop --sigma-value (sigma_value), or use sigma known"
                        .to_string(),
                ));
            }
            (SigmaKind::Unknown, None) => None,
        };
        let need = |name: &str, value: Option<f64>, wanted: bool| -> Result<(), InputError> {
            match (value, wanted) {
                (Some(v), true) if v.is_finite() => Ok(()),
                (Some(v), true) => Err(InputError::out_of_range(name, v, "a finite number")),
                (None, true) => Err(InputError::Inconsistent(format!(
                    "the {} limit needs its value: give {name}",
                    limit.name()
                ))),
                (Some(_), false) => Err(InputError::Inconsistent(format!(
                    "{name} was given, but the limit is {}; use --limit both for two limits",
                    limit.name()
                ))),
                (None, false) => Ok(()),
            }
        };
        need(
            "--lower L (lower)",
            lower,
            matches!(limit, LimitKind::Lower | LimitKind::Both),
        )?;
        need(
            "--upper U (upper)",
            upper,
            matches!(limit, LimitKind::Upper | LimitKind::Both),
        )?;
        if let (Some(l), Some(u)) = (lower, upper)
            && l >= u
        {
            return Err(InputError::Inconsistent(format!(
                "the lower limit {l} must be below the upper limit {u}"
            )));
        }
        Ok(Specification {
            sigma,
            limit,
            lower,
            upper,
        })
    }

    /// The known sigma, or `None` when it is estimated.
    pub fn sigma(&self) -> Option<f64> {
        self.sigma
    }

    /// Known or unknown.
    pub fn sigma_kind(&self) -> SigmaKind {
        match self.sigma {
            Some(_) => SigmaKind::Known,
            None => SigmaKind::Unknown,
        }
    }

    /// Which limits.
    pub fn limit(&self) -> LimitKind {
        self.limit
    }

    /// The lower limit `L`.
    pub fn lower(&self) -> Option<f64> {
        self.lower
    }

    /// The upper limit `U`.
    pub fn upper(&self) -> Option<f64> {
        self.upper
    }

    /// Sigma known, two limits: half the tolerance in standard deviations,
    /// `D = (U - L) / (2 sigma)`.
    pub fn half_width(&self) -> Option<f64> {
        match (self.sigma, self.lower, self.upper) {
            (Some(s), Some(l), Some(u)) => Some((u - l) / (2.0 * s)),
            _ => None,
        }
    }

    /// The least fraction nonconforming a process can have under this
    /// specification: `2 Phi(-D)` with the mean centred, for two limits and
    /// a known sigma; 0 otherwise.
    pub fn lowest_quality(&self) -> f64 {
        self.half_width().map_or(0.0, |d| 2.0 * normal::cdf(-d))
    }

    /// The smallest sample the rule is defined for: 1 (one limit, sigma
    /// known), 2 (one limit with `s`, or two limits with sigma known: the
    /// estimator needs `n - 1 > 0`), 3 (two limits with `s`: the beta
    /// estimator needs `n/2 - 1 > 0`).
    pub fn smallest_sample(&self) -> u64 {
        match (self.limit, self.sigma) {
            (LimitKind::Both, None) => 3,
            (LimitKind::Both, Some(_)) | (_, None) => 2,
            (_, Some(_)) => 1,
        }
    }
}
