//! The map's wording: the kicker, the fields of the title block, the way
//! to read the map, the panels' titles, the key and the footer. The
//! cautions come from [`crate::report::words`], as on every output.

use crate::design::{Criterion, Scheme};
use crate::model::ModelKind;
use crate::numeric::Short;
use crate::numeric::format_short;

use crate::print::map::field::{Gap, MapQuantity};

/// The line above the title.
pub const KICKER: &str =
    "TRADE-OFF MAP OF RISK POINTS  ·  A NEGOTIATION AID, NOT AN INSPECTION PLAN";

/// A quality as the map prints it, with at most four significant digits
/// and no trailing zeros: percent, or for the Poisson model per unit with
/// the number per 100 units in brackets (`0.5 (50 per 100)`), as the sheet
/// prints it.
pub fn quality(q: f64, per_unit: bool) -> String {
    if per_unit {
        return format!(
            "{} ({} per 100)",
            format_short(q, 4),
            format_short(100.0 * q, 4)
        );
    }
    format!("{}%", format_short(q * 100.0, 4))
}

/// A risk or a cost as given: the shortest decimal that reads back as it.
pub fn number(v: f64) -> String {
    Short(v).to_string()
}

/// The scheme field.
pub fn scheme(scheme: Scheme, criterion: Criterion) -> String {
    match scheme {
        Scheme::Double => format!(
            "double sampling, {}",
            match criterion {
                Criterion::AsnAql => "least ASN at the AQL",
                Criterion::AsnRql => "least ASN at the RQL",
                Criterion::AsnMax => "least largest ASN",
            }
        ),
        _ => "single sampling".to_string(),
    }
}

/// The model field.
pub fn model(kind: ModelKind) -> String {
    format!("{}, {}", kind.name(), kind.quality_meaning())
}

/// The lot size field.
pub fn lot_size(lot: Option<u64>) -> String {
    lot.map_or_else(
        || crate::print::wording::sheet::NO_LOT_SIZE.to_string(),
        |n| format!("{n} units"),
    )
}

/// The risks field.
pub fn risks(alpha: f64, beta: f64) -> String {
    format!(
        "α = {} at the AQL, β = {} at the RQL",
        number(alpha),
        number(beta)
    )
}

/// An axis field: its range and its number of values.
pub fn range(values: &[f64], per_unit: bool) -> String {
    format!(
        "{} to {}, {} values",
        quality(values[0], per_unit),
        quality(values[values.len() - 1], per_unit),
        values.len()
    )
}

/// The labels of the title block's fields.
pub const SCHEME: &str = "SCHEME";
pub const MODEL: &str = "MODEL";
pub const LOT_SIZE: &str = "LOT SIZE";
pub const RISKS: &str = "RISKS, THE SAME IN EVERY CELL";
pub const AQL_ROWS: &str = "AQL (ROWS, UPWARDS)";
pub const RQL_COLUMNS: &str = "RQL (COLUMNS, TO THE RIGHT)";
pub const COST_PER_UNIT: &str = "COST PER UNIT INSPECTED";
pub const PROCESS_QUALITY: &str = "EXPECTED PROCESS QUALITY p̄";

/// How to read the map.
pub fn how_to_read(scheme: Scheme) -> &'static str {
    match scheme {
        Scheme::Double => {
            "Each cell is the double plan the designer chooses for that AQL (row) and RQL (column): \
             accepted with probability at least 1 − α at the AQL and at most β at the RQL. Its colour \
             is the average sample number at the AQL; lines join equal values. A higher RQL (right) or \
             a lower AQL (down) asks less of the plan, so it usually costs less."
        }
        _ => {
            "Each cell is the smallest single plan that meets both points at that AQL (row) and RQL \
             (column): accepted with probability at least 1 − α at the AQL and at most β at the RQL. \
             Its colour is the sample size n; lines join equal sample sizes. Moving right (a higher \
             RQL) or down (a lower AQL) never makes the plan larger."
        }
    }
}

/// The axis labels.
pub fn rql_axis(per_unit: bool) -> &'static str {
    if per_unit {
        "Consumer's quality, RQL (nonconformities per unit)"
    } else {
        "Consumer's quality, RQL (% nonconforming)"
    }
}

pub fn aql_axis(per_unit: bool) -> &'static str {
    if per_unit {
        "Producer's quality, AQL (nonconformities per unit)"
    } else {
        "Producer's quality, AQL (% nonconforming)"
    }
}

/// A panel's title.
pub fn panel_title(quantity: MapQuantity, process: &str) -> String {
    match quantity {
        MapQuantity::SampleSize => "Sample size n of the single plan".to_string(),
        MapQuantity::AsnAtAql => {
            "Average sample number (ASN) at the AQL of the double plan".to_string()
        }
        MapQuantity::CostPerLot => format!("Expected inspection cost per lot at p̄ = {process}"),
    }
}

/// A colour bar's title.
pub fn bar_title(quantity: MapQuantity) -> &'static str {
    match quantity {
        MapQuantity::SampleSize => "n",
        MapQuantity::AsnAtAql => "ASN",
        MapQuantity::CostPerLot => "cost",
    }
}

/// The key's entry for the contour lines.
pub const CONTOUR_KEY: &str = "Line of equal value, labelled with it; colours on a log scale, light for few units, dark for many";

/// The key's entry for the ring on the agreed risk points.
pub const AGREED_KEY: &str = "The agreed risk points (AQL, RQL)";

/// The key's entry of a double scheme.
pub const ASN_KEY: &str =
    "Double plans: the colour is the ASN at the AQL; a lot that needs the second sample takes more";

/// The cost panel's note under the key.
pub fn cost_key(per_unit_cost: f64, process: &str) -> String {
    format!(
        "Cost per lot = {} per unit inspected × ATI at p̄ = {process} (rejected lots screened 100%), in the currency of the cost per unit",
        number(per_unit_cost)
    )
}

/// The key's entry for each reason a cell has no plan.
pub fn gap(g: Gap) -> &'static str {
    match g {
        Gap::NotBelow => "No plan: the AQL is not below the RQL",
        Gap::BeyondCap => "No plan: the points are too close for the designer's limits",
        Gap::NoPlan => "No plan meets both points (for example, the lot is too small)",
        Gap::WholeLot => "100% inspection: the points need a larger sample than the lot",
    }
}

/// The text in the plot when no cell has a plan.
pub const NO_CELL: &str = "No cell of the grid has a plan";

/// The footer's first sentence.
pub const NOT_A_PLAN: &str = "This map is a negotiation aid, not a plan: once both sides agree on the \
     points, design and record the plan with lotsman design --aql P1 --rql P2 … --output FILE.yaml \
     and inspect by its sheet.";

/// The provenance line.
pub fn provenance(tool: &str, hash: &str, command: Option<&str>) -> String {
    match command {
        Some(cmd) => format!("Generated by {tool} (inputs SHA-256 {hash}). Regenerate with: {cmd}"),
        None => format!(
            "Generated by {tool} from the request in the title block (inputs SHA-256 {hash})."
        ),
    }
}
