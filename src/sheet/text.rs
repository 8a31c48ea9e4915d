//! The sheet's own wording: headings, column heads, chart titles and axis
//! labels. The inspector's steps and the cautions are not here: they come
//! from [`crate::report::words`], which the terminal prints too.

/// The line above the title.
pub const KICKER: &str = "INCOMING INSPECTION PLAN";

/// Labels of the title block's fields.
pub const ITEM: &str = "Item";
pub const CHARACTERISTIC: &str = "Characteristic";
pub const PLAN_ID: &str = "Plan ID";
pub const REVISION: &str = "Revision";
pub const DATE: &str = "Date";
pub const LOT_SIZE: &str = "Lot size";
pub const SCHEME: &str = "Scheme";

/// A field the source leaves empty.
pub const NOT_GIVEN: &str = "—";

/// The lot size of a model without one.
pub const NO_LOT_SIZE: &str = "not stated";

/// Heading of the single plan's sample size.
pub const SAMPLE_SIZE: &str = "SAMPLE SIZE";

/// Heading of the procedure.
pub const PROCEDURE: &str = "INSPECTOR'S PROCEDURE";

/// Heading of the risk table.
pub const RISKS: &str = "AGREED RISK POINTS AND WHAT THIS PLAN ACHIEVES";

/// Column heads of the risk table.
pub fn risk_heads(per_unit: bool) -> [&'static str; 4] {
    [
        "Risk point",
        quality_head(per_unit),
        "Agreed",
        "Achieved by this plan",
    ]
}

/// Row names of the risk table.
pub const PRODUCER_POINT: &str = "Producer's point (AQL, p₁)";
pub const CONSUMER_POINT: &str = "Consumer's point (RQL, p₂)";

/// The head of a column of qualities.
pub fn quality_head(per_unit: bool) -> &'static str {
    if per_unit {
        "Quality (per unit)"
    } else {
        "Quality"
    }
}

/// The quality axis of every chart against quality.
pub fn quality_axis(per_unit: bool) -> &'static str {
    if per_unit {
        "Lot quality (nonconformities per unit)"
    } else {
        "Lot quality (% nonconforming)"
    }
}

/// The OC chart.
pub const OC_TITLE: &str = "Operating characteristic (OC) curve";
pub const OC_AXIS: &str = "Probability of acceptance Pa";

/// The AOQ chart.
pub const AOQ_TITLE: &str = "Average outgoing quality (AOQ), rectifying inspection";
pub const AOQ_AXIS: &str = "AOQ";

/// Heading and column heads of the measures table.
pub const MEASURES: &str = "WHAT THE PLAN DOES AT OTHER QUALITIES";
pub const MEASURE_HEADS: [&str; 5] = ["Quality", "Pa", "AOQ", "ATI", "ASN"];

/// The signature block.
pub const PREPARED_BY: &str = "Prepared by";
pub const APPROVED_BY: &str = "Approved by";
pub const SIGNATURE: &str = "Signature";
pub const SIGNED_ON: &str = "Date";
