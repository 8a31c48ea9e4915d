//! What keeps a recorded plan from being confirmed: the fields in which it
//! differs from a re-solve ([`verify`](super::verify)), and the agreed
//! points it no longer meets ([`audit`](super::audit)).

use std::fmt;

use serde::Serialize;

use crate::numeric::{format_quality, format_significant};

/// One field whose recorded value differs from the re-solved one.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Difference {
    /// The field, e.g. `stage 1 n` (stages counted from 1) or
    /// `plan.producer_risk`.
    pub field: String,
    /// As recorded in the source.
    pub recorded: String,
    /// As re-solved now.
    pub resolved: String,
}

impl std::fmt::Display for Difference {
    /// `FIELD: recorded X, re-solved Y`.
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(
            f,
            "{}: recorded {}, re-solved {}",
            self.field, self.recorded, self.resolved
        )
    }
}

/// Why a recorded plan is not confirmed: the fields in which it differs
/// from a re-solve, and the risk points it no longer meets. At least one of
/// the two lists is not empty.
///
/// Displayed, it is one line: `recorded plan differs from a re-solve:
/// stage 1 n: recorded 150, re-solved 166; ...`, then each unmet point.
#[derive(Clone, Debug, PartialEq)]
pub struct Discrepancy {
    /// The fields that differ, as [`verify`](crate::verify) names them.
    pub differences: Vec<Difference>,
    /// The agreed risk points the recorded plan does not meet.
    pub unmet: Vec<UnmetPoint>,
}

/// An agreed risk point, or a minimum-inspection plan's protection, that a
/// recorded plan does not meet.
#[derive(Clone, Debug, PartialEq)]
pub struct UnmetPoint {
    /// `producer's` or `consumer's`.
    pub party: &'static str,
    /// The point's quality, as reports print it (`4.000%`); for an AOQL
    /// protection, the agreed AOQL.
    pub quality: String,
    /// `alpha`, `beta`, or `AOQL` for an AOQL protection.
    pub risk_name: &'static str,
    /// The agreed largest risk (or AOQL).
    pub agreed: f64,
    /// The risk (or AOQL) the recorded plan achieves.
    pub achieved: f64,
    /// Whether qualities are nonconformities per unit (Poisson model), for
    /// an AOQL printed as a quality.
    pub per_unit: bool,
}

impl fmt::Display for UnmetPoint {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if self.risk_name == "AOQL" {
            return write!(
                f,
                "the recorded plan does not meet the consumer's protection: its AOQL is {}, above the agreed {}",
                format_quality(self.achieved, self.per_unit),
                self.quality
            );
        }
        write!(
            f,
            "the recorded plan does not meet the {} point: {} at {} is {}, above the agreed {}",
            self.party,
            self.risk_name,
            self.quality,
            format_significant(self.achieved, 4),
            self.agreed
        )
    }
}

impl Discrepancy {
    /// The discrepancy in one line, with at most `fields` of the differing
    /// fields and the number of the others (a sheet has room for a few;
    /// `verify` lists them all, and the line says how to run it on
    /// `source`, a file name as the shell takes it).
    ///
    /// ```
    /// use lotsman::{Difference, Discrepancy};
    /// let field = |name: &str| Difference {
    ///     field: name.into(),
    ///     recorded: "1".into(),
    ///     resolved: "2".into(),
    /// };
    /// let d = Discrepancy {
    ///     differences: vec![field("plan.sequential.slope"), field("plan.sequential.truncation")],
    ///     unmet: Vec::new(),
    /// };
    /// assert_eq!(
    ///     d.brief(1, "sleeve.yaml"),
    ///     "recorded plan differs from a re-solve: plan.sequential.slope: recorded 1, re-solved 2; and 1 more field (listed by: lotsman verify sleeve.yaml)"
    /// );
    /// assert_eq!(d.brief(2, "sleeve.yaml"), d.to_string());
    /// ```
    pub fn brief(&self, fields: usize, source: &str) -> String {
        let mut parts = Vec::new();
        if !self.differences.is_empty() {
            let mut shown: Vec<String> = self
                .differences
                .iter()
                .take(fields)
                .map(|d| d.to_string())
                .collect();
            match self.differences.len().saturating_sub(fields) {
                0 => {}
                1 => shown.push(format!(
                    "and 1 more field (listed by: lotsman verify {source})"
                )),
                more => shown.push(format!(
                    "and {more} more fields (listed by: lotsman verify {source})"
                )),
            }
            parts.push(format!(
                "recorded plan differs from a re-solve: {}",
                shown.join("; ")
            ));
        }
        parts.extend(self.unmet.iter().map(|u| u.to_string()));
        parts.join("; ")
    }
}

impl fmt::Display for Discrepancy {
    /// Every differing field, then every unmet point.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}", self.brief(usize::MAX, ""))
    }
}
