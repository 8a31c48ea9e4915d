//! Vector charts drawn through the backend trait, the same for the PDF
//! sheet and for SVG: the OC, AOQ, ASN and decision charts of an
//! attributes plan and the OC chart of a variables plan. Each is kept
//! apart from the numbers: the plan's curves are computed once
//! ([`subject`]) and handed in.

pub(crate) mod aoq;
pub(crate) mod asn;
pub(crate) mod axes;
pub(crate) mod compare;
pub(crate) mod curve_chart;
pub(crate) mod decision;
pub(crate) mod guides;
pub(crate) mod history;
pub(crate) mod legend;
pub(crate) mod marks;
pub(crate) mod oc;
pub(crate) mod plot;
pub(crate) mod scale;
pub(crate) mod standalone;
pub(crate) mod standard_oc;
pub(crate) mod subject;
pub(crate) mod variables_oc;

pub use standalone::{ChartKind, chart_svg};
