//! The words every output shares: what a plan counts, the inspector's
//! procedure and the cautions. One text, so that the terminal, the demo and
//! the sheet can never tell an inspector two different things.

use crate::plan::StagedPlan;

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
    single_steps(n, c, per_unit, DISPOSITION)
}

/// The single plan's four steps, the last one `disposition`.
fn single_steps(n: u64, c: u64, per_unit: bool, disposition: &str) -> [String; 4] {
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
        format!("4. {disposition}"),
    ]
}

/// The last step of a procedure: what happens to a rejected lot.
const DISPOSITION: &str = "A rejected lot is returned or screened 100%, as the supply agreement says; \
     record the counts and the decision.";

/// The last step of a procedure under rectifying inspection, which the
/// ATI and AOQ of a minimum-inspection plan assume.
pub const RECTIFYING_DISPOSITION: &str = "Rectifying inspection: screen every rejected lot 100% \
     and replace the nonconforming units found (the ATI and AOQ below assume it); record the \
     counts and the decision.";

/// The inspector's procedure for any staged plan, one step per item: the
/// single plan's four steps, or the steps of a staged or an item-by-item
/// plan (whose numbers are in the stage table or the item table beside
/// them).
pub fn plan_procedure(plan: &StagedPlan, per_unit: bool) -> Vec<String> {
    steps(plan, per_unit, DISPOSITION)
}

/// [`plan_procedure`] for a plan under rectifying inspection: the last
/// step screens every rejected lot ([`RECTIFYING_DISPOSITION`]) instead of
/// leaving the choice to the supply agreement.
pub fn rectifying_procedure(plan: &StagedPlan, per_unit: bool) -> Vec<String> {
    steps(plan, per_unit, RECTIFYING_DISPOSITION)
}

/// The steps of any staged plan, the last one `disposition`.
fn steps(plan: &StagedPlan, per_unit: bool, disposition: &str) -> Vec<String> {
    let what = counted(per_unit);
    if let Some((n, c)) = plan.as_single() {
        return single_steps(n, c, per_unit, disposition).to_vec();
    }
    let stages = plan.stages();
    let last = stages[stages.len() - 1];
    let close = format!(
        "accept if the count is {} or fewer, reject it otherwise.",
        last.accept.unwrap_or(0)
    );
    if plan.sequential_lines().is_some() {
        return vec![
            format!(
                "1. Draw units at random from the whole lot, one at a time (every unit equally likely), up to {} units.",
                last.n
            ),
            format!("2. Inspect each unit as it is drawn and keep a running count of the {what}."),
            "3. After each unit, find the number of units inspected in the table: accept the lot as soon as \
             the count is at or below the acceptance number, reject it as soon as the count reaches the \
             rejection number; otherwise inspect the next unit."
                .to_string(),
            format!("4. At unit {} the lot is decided: {close}", last.n),
            format!("5. {disposition}"),
        ];
    }
    vec![
        format!(
            "1. Draw {} units at random from the whole lot for stage 1; at each later stage draw that stage's new units at random from the rest of the lot.",
            stages[0].n
        ),
        format!(
            "2. Inspect every unit drawn and keep the cumulative count of the {what} over all stages so far."
        ),
        "3. After each stage, compare the cumulative count with that stage's numbers in the table: accept \
         the lot at or below the acceptance number, reject it at or above the rejection number, otherwise \
         go on to the next stage."
            .to_string(),
        format!(
            "4. At stage {} ({} units in all) the lot is decided: {close}",
            stages.len(),
            last.n
        ),
        format!("5. {disposition}"),
    ]
}

/// The cautions that go with every plan.
pub const CAUTION: &str = "Sampling does not guarantee the quality of a lot: an accepted lot can still contain \
    nonconforming units, at the rates the OC curve shows. Critical and safety characteristics follow the \
    applicable contract, regulation and licensed practice, which this plan does not replace.";
