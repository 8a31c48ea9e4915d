//! The words every output shares: what a plan counts, the inspector's
//! procedure and the cautions. One text, so that the terminal, the demo and
//! the sheet can never tell an inspector two different things.

/// What the count is of: nonconforming units, or nonconformities for the
/// Poisson model.
pub fn counted(per_unit: bool) -> &'static str {
    if per_unit {
        "nonconformities"
    } else {
        "nonconforming units"
    }
}

/// The inspector's procedure for the single plan `(n, c)`, one step per
/// item.
pub fn procedure(n: u64, c: u64, per_unit: bool) -> [String; 4] {
    let what = counted(per_unit);
    [
        format!(
            "1. Draw {n} units at random from the whole lot (every unit equally likely to be drawn)."
        ),
        format!("2. Inspect every unit drawn for the characteristic and count the {what}."),
        format!(
            "3. If the count is {c} or fewer, accept the lot. If it is {} or more, reject the lot.",
            c + 1
        ),
        "4. A rejected lot is returned or screened 100%, as the supply agreement says; \
         record the count and the decision."
            .to_string(),
    ]
}

/// The cautions that go with every plan.
pub const CAUTION: &str = "Sampling does not guarantee the quality of a lot: an accepted lot can still contain \
    nonconforming units, at the rates the OC curve shows. Critical and safety characteristics follow the \
    applicable contract, regulation and licensed practice, which this plan does not replace.";
