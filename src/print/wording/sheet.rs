//! The sheet's own wording: headings, column heads, chart titles and axis
//! labels. The inspector's steps and the cautions are not here: they come
//! from [`crate::report::words`], which the terminal prints too.

use crate::numeric::{format_quality, format_short};

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

/// A quality as the sheet prints it: percent; for nonconformities per
/// unit the number per unit, with the number per 100 units in brackets
/// (`1.5 (150 per 100)`; heads and axes say "per unit").
pub fn quality(v: f64, per_unit: bool) -> String {
    if per_unit {
        return format!(
            "{} ({} per 100)",
            format_short(v, 4),
            format_short(100.0 * v, 4)
        );
    }
    format_quality(v, false)
}

/// The lot size of a model without one.
pub const NO_LOT_SIZE: &str = "not stated";

/// Heading of the notice on a sheet whose recorded plan the audit did not
/// confirm.
pub const NOTICE: &str = "PRINTED AS RECORDED AT THE USER'S REQUEST, NOT AS RE-SOLVED:";

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
        "Quality per unit"
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
pub const OC_TITLE_SHORT: &str = "OC curve";

pub const OC_AXIS: &str = "Probability of acceptance Pa";

/// The AOQ chart.
pub const AOQ_TITLE: &str = "Average outgoing quality (AOQ), rectifying inspection";
pub const AOQ_AXIS: &str = "AOQ";

/// Heading and column heads of the measures table.
pub const MEASURES: &str = "WHAT THE PLAN DOES AT OTHER QUALITIES";
pub const MEASURE_HEADS: [&str; 5] = ["Quality", "Pa", "AOQ", "ATI", "ASN"];

/// Heads of the measures table's columns of nonconformities: the quality
/// and the AOQ per unit and per 100 units.
pub const PER_UNIT: &str = "Per unit";
pub const PER_100_UNITS: &str = "Per 100 units";
pub const AOQ_PER_UNIT: &str = "AOQ per unit";
pub const AOQ_PER_100_UNITS: &str = "per 100 units";

/// Heads of the measures table's lot columns (hypergeometric model): the
/// nonconforming units a lot of the asked quality holds, and the lot
/// quality `D / N` every measure of the row is computed at.
pub const LOT_D: &str = "D in the lot";
pub const LOT_QUALITY: &str = "Lot quality D/N";

/// The signature block.
pub const PREPARED_BY: &str = "Prepared by";
pub const APPROVED_BY: &str = "Approved by";
pub const SIGNATURE: &str = "Signature";
pub const SIGNED_ON: &str = "Date";

/// The lot record of an attribute sheet: its heading and the labels of
/// the count fields (the lot number, decision, inspector and date share
/// the variables sheet's labels).
pub const RECORD: &str = "LOT RECORD";
pub const FOUND_AT_STAGE: &str = "Found at stage";
pub const DECIDED_AT_UNIT: &str = "Decided at unit";
pub const RUNNING_COUNT: &str = "running count";

/// The count field of a single plan: `Nonconforming units found`.
pub fn found(per_unit: bool) -> String {
    let what = crate::report::words::counted(per_unit);
    let mut chars = what.chars();
    let first = chars.next().map(|ch| ch.to_uppercase().to_string());
    format!("{}{} found", first.unwrap_or_default(), chars.as_str())
}

/// Heading of a staged plan's stage table.
pub fn stages_heading(scheme: &str, stages: usize, max_units: u64) -> String {
    format!(
        "{} SAMPLING: {stages} STAGES, UP TO {max_units} UNITS",
        scheme.to_uppercase()
    )
}

/// Column heads of the stage table, two lines each.
pub const STAGE_HEADS: [[&str; 2]; 5] = [
    ["", "Stage"],
    ["New", "units"],
    ["Units", "in all"],
    ["Accept if", "count ≤"],
    ["Reject if", "count ≥"],
];

/// Heading of an item-by-item plan's table.
pub fn items_heading(max_units: u64) -> String {
    format!("ITEM BY ITEM: UP TO {max_units} UNITS, ONE AT A TIME")
}

/// Column heads of the item table, two lines each.
pub const ITEM_HEADS: [[&str; 2]; 3] = [
    ["Units", "inspected"],
    ["Accept if", "count ≤"],
    ["Reject if", "count ≥"],
];

/// A run of units in the item table.
pub fn units(first: u64, last: u64) -> String {
    if first == last {
        first.to_string()
    } else {
        format!("{first} to {last}")
    }
}

/// A stage or unit at which the lot cannot be accepted.
pub const CANNOT_ACCEPT: &str = "—";

/// The note under a stage table.
pub fn stage_note(any_cannot_accept: bool) -> &'static str {
    if any_cannot_accept {
        "Counts are cumulative over all stages so far. — : this stage cannot accept the lot."
    } else {
        "Counts are cumulative over all stages so far."
    }
}

/// The note under an item table: the dash, and the lines the numbers come
/// from.
pub fn item_note(h_accept: f64, h_reject: f64, slope: f64) -> String {
    format!(
        "Counts are running totals; — : the lot cannot be accepted yet. The numbers are the lines          d = {slope:.5} n − {h_accept:.4} (accept, rounded down) and d = {slope:.5} n + {h_reject:.4}          (reject, rounded up) after n units."
    )
}

/// The ASN chart.
pub const ASN_TITLE: &str = "Average sample number (ASN)";
pub const ASN_AXIS: &str = "Units inspected per lot, on average";

/// The single plan's sample size as a reference on the ASN chart.
pub fn single_reference(n: u64) -> String {
    format!("single plan: n = {n}")
}

/// The ASN at the producer's point, in two parts (one line or two).
pub fn asn_at_p1(asn: f64) -> [String; 2] {
    [format!("ASN = {asn:.1}"), "at p₁".to_string()]
}

/// The largest ASN and where it occurs, in two parts.
pub fn largest_asn(asn: f64, quality: &str) -> [String; 2] {
    [format!("largest {asn:.1}"), format!("at {quality}")]
}

/// The decision chart of an item-by-item plan.
pub const DECISION_TITLE: &str = "Decision chart";
pub const DECISION_X: &str = "Units inspected n";
pub fn decision_y(per_unit: bool) -> String {
    format!(
        "Running count d of {}",
        crate::report::words::counted(per_unit)
    )
}

/// The zones of the decision chart.
pub const REJECT_ZONE: &str = "REJECT";
pub const ACCEPT_ZONE: &str = "ACCEPT";
pub const CONTINUE_ZONE: &str = "GO ON";

/// The truncation on the decision chart.
pub fn truncation(n: u64, accept: u64) -> String {
    format!("at unit {n}: accept if ≤ {accept}")
}
