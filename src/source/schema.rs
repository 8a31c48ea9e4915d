//! The plan source, schema version 1.
//!
//! A plan source is the YAML file from which anyone can re-solve and
//! re-print a plan. It holds what was agreed (the two risk points, the model
//! and lot size), what the plan is for (title, item, characteristic, notes,
//! identifier, revision, date, names) and, once solved, the plan with the
//! risks it achieves and the tool version that solved it.
//!
//! Unknown fields are refused with their name, line and column: a typing
//! mistake must not silently drop an agreed value.

use serde::{Deserialize, Deserializer, Serialize};

use crate::design::{Criterion, Scheme};
use crate::model::ModelKind;
use crate::plan::{LimitKind, SequentialLines, SigmaKind, Stage};

/// The schema version this tool reads and writes.
pub const SCHEMA_VERSION: u32 = 1;

/// A plan source as stored.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PlanSource {
    /// Schema version; must be [`SCHEMA_VERSION`].
    pub schema: u32,
    /// Plan title.
    pub title: String,
    /// Plan identifier (document number).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub id: Option<String>,
    /// Revision of the plan document.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub revision: Option<String>,
    /// Date of the revision, `YYYY-MM-DD`.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub date: Option<String>,
    /// The item inspected (part name and number).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub item: Option<String>,
    /// The characteristic inspected and what counts as nonconforming.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub characteristic: Option<String>,
    /// Who prepared the plan.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub prepared_by: Option<String>,
    /// Who approved it.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub approved_by: Option<String>,
    /// Free notes on the scenario and the agreement.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub notes: Option<String>,
    /// Sampling scheme.
    pub scheme: Scheme,
    /// Double and multiple plans: what the designer minimises
    /// (default `asn-aql`).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub criterion: Option<Criterion>,
    /// Double plans: fix the second sample at this multiple of the first.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub second_ratio: Option<f64>,
    /// Multiple plans: the number of equal stages, 2 to 7 (default 7).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub stage_count: Option<u32>,
    /// Variables plans: the measured characteristic's specification.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub variables: Option<VariablesSource>,
    /// Likelihood model (for a variables plan: the attributes model of the
    /// comparison plan).
    pub model: ModelKind,
    /// Lot size `N`, required by the hypergeometric model.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub lot_size: Option<u64>,
    /// The producer's point: AQL and alpha.
    pub producer: PointSource,
    /// The consumer's point: RQL and beta.
    pub consumer: PointSource,
    /// The solved plan, written by the tool.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub plan: Option<RecordedPlan>,
}

/// A risk point as stored: numbers as fractions (`0.01`) or percent strings
/// (`"1%"`); the tool writes fractions.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PointSource {
    /// Quality (fraction nonconforming, or nonconformities per unit).
    #[serde(deserialize_with = "fraction")]
    pub quality: f64,
    /// Risk (alpha for the producer, beta for the consumer).
    #[serde(deserialize_with = "fraction")]
    pub risk: f64,
}

/// The solved plan as recorded in a source: its stages, or for a
/// sequential plan its lines (the item stages follow from them).
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RecordedPlan {
    /// The stages, cumulative (empty for a sequential plan).
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub stages: Vec<Stage>,
    /// The lines and truncation of a sequential plan.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub sequential: Option<SequentialLines>,
    /// The sample size and acceptance constant of a variables plan.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub variables: Option<RecordedVariables>,
    /// Achieved producer's risk `1 - Pa(p1)`.
    pub producer_risk: f64,
    /// Achieved consumer's risk `Pa(p2)`.
    pub consumer_risk: f64,
    /// Tool and version that solved it, e.g. `lotsman 0.1.0`.
    pub solved_by: String,
}

/// The specification of a variables plan as stored.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct VariablesSource {
    /// Whether sigma is known or estimated by `s`.
    pub sigma: SigmaKind,
    /// The known sigma, in the unit of the measurements.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub sigma_value: Option<f64>,
    /// Which specification limits.
    pub limit: LimitKind,
    /// The lower limit `L`.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub lower: Option<f64>,
    /// The upper limit `U`.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub upper: Option<f64>,
    /// The unit of the measurements, e.g. `mm`, for the sheet.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub unit: Option<String>,
}

/// A solved variables plan as recorded: `n` with `k` (one limit) or `m`
/// (two limits).
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RecordedVariables {
    /// Sample size.
    pub n: u64,
    /// One limit: the acceptance constant.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub k: Option<f64>,
    /// Two limits: the maximum allowable fraction nonconforming.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub m: Option<f64>,
}

/// A quality or risk as written in the source: a plain number (`0.01`) or a
/// percent string (`"1%"`), both read by
/// [`parse_fraction`](crate::parse_fraction) from the scalar's own text
/// (serde_yaml hands any scalar to a string visitor), so that `1e-400` is
/// refused as written rather than read as 0. Asking for the text also means
/// that a value is never buffered: a sequence or mapping (an alias of one
/// included) is refused at its first event instead of being expanded.
fn fraction<'de, D: Deserializer<'de>>(d: D) -> Result<f64, D::Error> {
    struct Fraction;
    impl serde::de::Visitor<'_> for Fraction {
        type Value = f64;
        fn expecting(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
            f.write_str("a fraction (0.01) or a percent (\"1%\")")
        }
        fn visit_str<E: serde::de::Error>(self, text: &str) -> Result<f64, E> {
            crate::quantity::parse_fraction("value", text).map_err(E::custom)
        }
    }
    d.deserialize_str(Fraction)
}
