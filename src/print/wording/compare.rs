//! The wording of the comparison page (`lotsman compare --output`): its
//! charts' titles, the risk points' guides, the table's heads and the
//! caution.

/// The charts' titles.
pub const OC_TITLE: &str = "Operating characteristic (OC)";
pub const AOQ_TITLE: &str = "Average outgoing quality (AOQ)";
pub const ASN_TITLE: &str = "Average sample number (ASN)";

/// The guides' short labels at the top of each chart.
pub const AQL: &str = "AQL";
pub const RQL: &str = "RQL";

/// The legend's entry for the two guides.
pub fn guides(aql: &str, rql: &str) -> String {
    format!("AQL {aql} and RQL {rql}")
}

/// The heading of the table.
pub const TABLE: &str = "TRUE RISKS AT THE AQL AND THE RQL";

/// The table's column heads, after the plan's.
pub const HEADS: [&str; 9] = [
    "n",
    "Pa at AQL",
    "Producer's risk",
    "Consumer's risk",
    "AOQL",
    "ASN at AQL",
    "ASN at RQL",
    "Meets alpha",
    "Meets beta",
];

/// The AOQL's head for plans that count nonconformities per unit.
pub const AOQL_PER_UNIT: &str = "AOQL per unit (per 100)";

/// The line under the table: what the risks are held against.
pub fn points(aql: &str, alpha: f64, rql: &str, beta: f64, from: &str) -> String {
    format!(
        "Producer's risk 1 - Pa at AQL {aql}, held to alpha {alpha}; consumer's risk Pa at RQL {rql}, held to beta {beta}; the points from {from}."
    )
}

/// The note on a staged plan's n.
pub const STAGED_N: &str =
    "A plan of several stages has no one sample size: its n is the ASN at the AQL.";

/// The caution at the foot of the page.
pub const CAUTION: &str = "Sampling does not guarantee the quality of any lot. The plan to use is the one both parties agree; these figures show what each would do.";
