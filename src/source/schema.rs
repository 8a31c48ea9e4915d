//! The plan source, schema version 1.
//!
//! A plan source is the YAML file from which anyone can re-solve and
//! re-print a plan. It holds what was agreed (the two risk points, the model
//! and lot size; for a minimum-inspection plan, `scheme: rectifying`, the
//! process average and the protection instead of the points), what the plan
//! is for (title, item, characteristic, notes, identifier, revision, date,
//! names) and, once solved, the plan with the figures it achieves and the
//! tool version that solved it.
//!
//! Unknown fields are refused with their name, line and column: a typing
//! mistake must not silently drop an agreed value.

use serde::{Deserialize, Deserializer, Serialize};

use super::standard::{RecordedClass, StandardSource, some_code_letter};
use crate::design::{Criterion, Scheme};
use crate::model::ModelKind;
use crate::plan::{LimitKind, SequentialLines, SigmaKind, Stage};
use crate::standard::CodeLetter;

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
    /// Minimum-inspection plans (`scheme: rectifying`): the plan's form,
    /// the process average and the protection.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub rectifying: Option<RectifyingSource>,
    /// Standard-indexed plans (`scheme: standard`): what the contract
    /// names (edition, inspection level, AQL or classes, severity, form).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub standard: Option<StandardSource>,
    /// Likelihood model (for a variables plan: the attributes model of the
    /// comparison plan).
    pub model: ModelKind,
    /// Lot size `N`, required by the hypergeometric model.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub lot_size: Option<u64>,
    /// The producer's point: AQL and alpha (every scheme but `rectifying`,
    /// which has none).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub producer: Option<PointSource>,
    /// The consumer's point: RQL and beta (every scheme but `rectifying`).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub consumer: Option<PointSource>,
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
    /// Standard-indexed plans: the lot's code letter (Table I).
    #[serde(
        default,
        skip_serializing_if = "Option::is_none",
        deserialize_with = "some_code_letter"
    )]
    pub code_letter: Option<CodeLetter>,
    /// Standard-indexed plans: each class's table plans, one per severity.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub classes: Vec<RecordedClass>,
    /// Achieved producer's risk `1 - Pa(p1)` (every scheme but
    /// `rectifying`).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub producer_risk: Option<f64>,
    /// Achieved consumer's risk `Pa(p2)`; for a minimum-inspection plan
    /// protected by an LTPD, `Pa` at the LTPD.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub consumer_risk: Option<f64>,
    /// Minimum-inspection plans: the average total inspection per lot at
    /// the process average.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub ati: Option<f64>,
    /// Minimum-inspection plans: the plan's AOQL under rectifying
    /// inspection.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub aoql: Option<f64>,
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

/// A minimum-inspection plan's request as stored (`scheme: rectifying`):
/// the plan's form, the supplier's process average, and the protection,
/// either an LTPD with the consumer's risk there or an AOQL. Qualities are
/// fractions (`0.0025`) or percent strings (`"0.25%"`).
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RectifyingSource {
    /// `single` or `double`.
    pub form: Scheme,
    /// The process average: the supplier's usual quality.
    #[serde(deserialize_with = "fraction")]
    pub process_average: f64,
    /// The LTPD: a lot this bad is accepted with probability at most
    /// `beta`.
    #[serde(
        default,
        deserialize_with = "some_fraction",
        skip_serializing_if = "Option::is_none"
    )]
    pub ltpd: Option<f64>,
    /// The consumer's risk at the LTPD (default 0.10).
    #[serde(
        default,
        deserialize_with = "some_fraction",
        skip_serializing_if = "Option::is_none"
    )]
    pub beta: Option<f64>,
    /// The AOQL: the average outgoing quality never exceeds it.
    #[serde(
        default,
        deserialize_with = "some_fraction",
        skip_serializing_if = "Option::is_none"
    )]
    pub aoql: Option<f64>,
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
            crate::numeric::parse_fraction("value", text).map_err(E::custom)
        }
    }
    d.deserialize_str(Fraction)
}

/// [`fraction`] for an optional field, which `#[serde(default)]` leaves
/// `None` when it is absent.
fn some_fraction<'de, D: Deserializer<'de>>(d: D) -> Result<Option<f64>, D::Error> {
    fraction(d).map(Some)
}
