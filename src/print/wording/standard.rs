//! The wording of a standard-indexed plan's sheet: headings, the plan
//! table's heads and cells, the inspector's procedure for the severity in
//! force, the switching rules in plain words with the sections of
//! MIL-STD-105E they come from, and the notes on how each plan was read.
//! Our own words throughout; the terms (code letter, inspection level,
//! normal, tightened and reduced inspection, limit number) are the
//! standard's.

use crate::draw::nested_parts;
use crate::print::standard_facts::{ReducedLimit, SchemeCurve, StandardClassFacts, StandardFacts};
use crate::standard::{ClassRule, LimitNumber, MIN_WINDOW_LOTS, Severity, StandardAnswer};

/// The severity as the sheet heads it.
pub fn severity_head(s: Severity) -> &'static str {
    match s {
        Severity::Normal => "NORMAL",
        Severity::Tightened => "TIGHTENED",
        Severity::Reduced => "REDUCED",
    }
}

/// The mark of the severity in force beside its head.
pub const IN_FORCE: &str = "IN FORCE";

/// The plan box's heading.
pub const PLANS_HEADING: &str = "TABLE PLANS OF MIL-STD-105E FOR THIS LOT";

/// The code letter's label.
pub const CODE_LETTER: &str = "Code letter";

/// How the code letter was found.
pub fn letter_found(lot_size: u64, level: &str, scheme: &str) -> String {
    let kind = if level.starts_with('S') {
        "special"
    } else {
        "general"
    };
    format!(
        "for a lot of {lot_size} units at {kind} inspection level {level} (Table I); {scheme} sampling"
    )
}

/// The plan table's first two heads, and the heads of each severity's
/// columns: the row the plan was read at, the sample (units in all at a
/// stage), and the acceptance and rejection numbers.
pub const CLASS_HEAD: &str = "Class";
pub const AQL_HEAD: &str = "AQL";
pub const GROUP_HEADS: [&str; 4] = ["Letter", "n", "Ac", "Re"];

/// The cell of a class that inspects every unit.
pub const EVERY_UNIT: &str = "inspect every unit";

/// Marks in the plan table, explained in the notes.
pub const MEMORY_MARK: &str = "†";
pub const SINGLE_MARK: &str = "*";
pub const DOUBLE_MARK: &str = "++";

/// The note under the plan table.
pub fn table_note(staged: bool, reduced_gap: bool) -> String {
    let mut note = String::from(
        "Ac: accept the lot for the class at a count at or below it; Re: reject at or above it.",
    );
    if staged {
        note.push_str(" n is the units in all (cumulative) at each stage; counts are cumulative; — : the stage cannot accept.");
    }
    if reduced_gap {
        note.push_str(" Reduced: a final count above Ac and below Re accepts the lot, and the next lot goes back to normal inspection (4.10.1.4).");
    }
    note
}

/// The procedure's heading.
pub fn procedure_heading(s: Severity) -> String {
    format!("INSPECTOR'S PROCEDURE ON {} INSPECTION", severity_head(s))
}

/// What a class counts.
fn counted(c: &StandardClassFacts) -> &'static str {
    crate::report::words::counted(c.per_unit())
}

/// `a, b and c`.
pub fn listed(items: &[String]) -> String {
    match items {
        [] => String::new(),
        [one] => one.clone(),
        [rest @ .., last] => format!("{} and {last}", rest.join(", ")),
    }
}

/// The draw of classes whose plans take different samples: one nested
/// draw ([`nested_parts`]), each part at random from the units not drawn
/// before, and each class counting in the parts it is named in; with
/// `staged` plans, a part for a later stage is drawn only when that
/// stage is reached.
fn nested_draw(
    sampled: &[(&StandardClassFacts, &crate::standard::StandardPlan)],
    staged: bool,
) -> String {
    let classes: Vec<(String, Vec<u64>)> = sampled
        .iter()
        .map(|(c, p)| {
            (
                c.name.clone(),
                p.stages.stages().iter().map(|s| s.n).collect(),
            )
        })
        .collect();
    let parts = nested_parts(&classes);
    let each: Vec<String> = parts
        .iter()
        .map(|p| format!("units {} to {} for {}", p.from, p.to, p.who()))
        .collect();
    format!(
        "Draw the sample in {} parts, each at random from the units of the lot not drawn before (every unit equally likely): {}. Each class counts only in the units of the parts it is named in{}.",
        parts.len(),
        each.join("; "),
        if staged {
            "; a part for a later stage is drawn only when that stage is reached"
        } else {
            ""
        }
    )
}

/// The inspector's procedure at the severity in force, one step per item.
pub fn procedure(f: &StandardFacts) -> Vec<String> {
    let s = f.severity;
    let plans: Vec<(&StandardClassFacts, &StandardAnswer)> = f
        .classes
        .iter()
        .filter_map(|c| c.at(s).map(|a| (c, a)))
        .collect();
    let sampled: Vec<_> = plans
        .iter()
        .filter_map(|(c, a)| a.plan().map(|p| (*c, p)))
        .collect();
    let every: Vec<String> = plans
        .iter()
        .filter(|(_, a)| a.plan().is_none())
        .map(|(c, _)| c.name.clone())
        .collect();
    let mut steps = Vec::new();
    let staged = sampled.iter().any(|(_, p)| p.stages.stages().len() > 1);
    let most = sampled
        .iter()
        .map(|(_, p)| p.sample_size())
        .max()
        .unwrap_or(0);
    let first = sampled
        .iter()
        .map(|(_, p)| p.stages.stages()[0].n)
        .max()
        .unwrap_or(0);
    let same = sampled
        .windows(2)
        .all(|w| w[0].1.stages.stages() == w[1].1.stages.stages());
    if !sampled.is_empty() {
        let draw = if !same {
            nested_draw(&sampled, staged)
        } else if staged {
            format!(
                "Draw {first} units at random from the whole lot (every unit equally likely) for stage 1; at each later stage draw that stage's new units from the rest of the lot, up to {most} in all."
            )
        } else {
            format!(
                "Draw {most} units at random from the whole lot (every unit equally likely to be drawn)."
            )
        };
        steps.push(draw);
        let mixed =
            sampled.iter().any(|(c, _)| c.per_unit()) && sampled.iter().any(|(c, _)| !c.per_unit());
        let what = if mixed {
            "nonconforming units (nonconformities for a class above AQL 10)"
        } else {
            counted(sampled[0].0)
        };
        steps.push(format!(
            "Inspect every unit drawn for every class and count the {what} of each class apart. A nonconforming unit counts once, in the most serious class it has a nonconformity of; nonconformities count each in its own class."
        ));
        steps.push(if staged {
            format!(
                "After each stage compare each class's cumulative count with its Ac and Re at that stage in the {} columns: at or below Ac the class accepts, at or above Re it rejects, otherwise draw the next stage. One class rejecting rejects the lot; the lot is accepted when every class has accepted.",
                s.name()
            )
        } else {
            format!(
                "Compare each class's count with its Ac and Re in the {} columns: at or below Ac the class accepts, at or above Re it rejects. One class rejecting rejects the lot; the lot is accepted only when every class accepts.",
                s.name()
            )
        });
        if s == Severity::Reduced {
            steps.push("On reduced inspection a final count above Ac and below Re accepts the lot, and the next lot is inspected on normal inspection (4.10.1.4).".to_string());
        }
    }
    if !every.is_empty() {
        steps.push(format!(
            "{}: inspect every unit of the lot for this class, since the table's sample reaches the lot of {} (the 100 percent rule of the master tables); the contract says what is done with the nonconforming units found.",
            capitalised(&listed(&every)),
            f.lot_size
        ));
    }
    steps.push(
        "Record each class's counts and the decision in the lot record. A rejected lot is returned or screened 100%, as the supply agreement says; the switching rules then set the next lot's severity, class by class."
            .to_string(),
    );
    steps
        .into_iter()
        .enumerate()
        .map(|(i, s)| format!("{}. {s}", i + 1))
        .collect()
}

/// `text` with its first letter in capitals.
fn capitalised(text: &str) -> String {
    let mut chars = text.chars();
    match chars.next() {
        Some(first) => first.to_uppercase().chain(chars).collect(),
        None => String::new(),
    }
}

/// The switching rules' heading.
pub const SWITCHING_HEADING: &str = "SWITCHING RULES (MIL-STD-105E 4.7, 4.8)";

/// The rules' preamble.
pub const SWITCHING_PREAMBLE: &str = "Kept for each class apart, on original inspection only: a resubmitted lot does not count. Inspection starts on normal.";

/// A class's limit number, as the rule to reduced inspection gives it.
fn limit(name: &str, l: &ReducedLimit) -> String {
    let number = match l.number {
        LimitNumber::Number(n) => n.to_string(),
        LimitNumber::TooFewUnits => "* (too few units: count more lots)".to_string(),
        LimitNumber::NotPrinted => "none printed".to_string(),
    };
    let mark = if l.from_memory { MEMORY_MARK } else { "" };
    let over = if l.lots == MIN_WINDOW_LOTS {
        String::new()
    } else {
        format!(" over {} lots", l.lots)
    };
    format!("{name} {number}{mark} at {} units{over}", l.units)
}

/// The switching rules in plain words, each with its label and section:
/// `(label, rule)`.
pub fn switching_rules(f: &StandardFacts) -> Vec<(String, String)> {
    let mut rules = vec![
        (
            "Normal → tightened (4.7.1):".to_string(),
            "when 2 lots are not accepted within at most 5 consecutive lots.".to_string(),
        ),
        (
            "Tightened → normal (4.7.2):".to_string(),
            "when 5 consecutive lots are accepted.".to_string(),
        ),
    ];
    if f.has_reduced() {
        let staged = f.classes.iter().any(|c| {
            c.at(Severity::Normal)
                .and_then(StandardAnswer::plan)
                .is_some_and(|p| p.stages.stages().len() > 1)
        });
        let limits: Vec<String> = f
            .classes
            .iter()
            .filter_map(|c| c.limit.as_ref().map(|l| limit(&c.name, l)))
            .collect();
        let numbers = match (limits.is_empty(), staged) {
            (true, _) => String::new(),
            (false, false) => format!(" (Table VIII: {})", listed(&limits)),
            (false, true) => format!(
                " (Table VIII at ten first samples: {}; read it again at the units the lots gave)",
                listed(&limits)
            ),
        };
        rules.push((
            "Normal → reduced (4.7.3):".to_string(),
            format!(
                "only when all hold: the last 10 lots on normal inspection were accepted; their counts total at most the limit number{numbers}; production is at a steady rate; the responsible authority approves."
            ),
        ));
        rules.push((
            "Reduced → normal (4.7.4):".to_string(),
            "when any occurs: a lot is not accepted; a lot is accepted with a final count above Ac and below Re; production becomes irregular or is delayed; other conditions call for normal inspection.".to_string(),
        ));
    } else {
        rules.push((
            "Reduced inspection:".to_string(),
            "not used under this plan.".to_string(),
        ));
    }
    rules.push((
        "Discontinue (4.8):".to_string(),
        "when the lots not accepted in one unbroken run on tightened inspection reach 5, stop accepting under the standard until the supplier has corrected the cause; then resume on tightened inspection.".to_string(),
    ));
    rules
}

/// The notes' heading.
pub const NOTES_HEADING: &str = "HOW THE PLANS WERE READ";

/// `critical at normal (L), tightened (M) and reduced (L)`: a class and
/// the severities of `items`, each with what follows it in brackets.
fn at_severities(name: &str, items: &[(Severity, String)]) -> String {
    let each: Vec<String> = items
        .iter()
        .map(|(s, what)| {
            if what.is_empty() {
                s.name().to_string()
            } else {
                format!("{} ({what})", s.name())
            }
        })
        .collect();
    format!("{name} at {}", listed(&each))
}

/// For each class, the severities whose answer `pick` says something
/// about, worded by [`at_severities`].
fn per_class(f: &StandardFacts, pick: impl Fn(&StandardAnswer) -> Option<String>) -> Vec<String> {
    f.classes
        .iter()
        .filter_map(|c| {
            let items: Vec<(Severity, String)> = f
                .severities()
                .into_iter()
                .filter_map(|s| c.at(s).and_then(&pick).map(|w| (s, w)))
                .collect();
            (!items.is_empty()).then(|| at_severities(&c.name, &items))
        })
        .collect()
}

/// The notes on how the plans were read: arrows followed, a single or
/// double plan used for a mark of the table, cells entered from memory,
/// classes whose sample reaches the lot, and the user's tables. Each is
/// `(mark, text)`.
pub fn notes(f: &StandardFacts) -> Vec<(String, String)> {
    let k = f.code_letter;
    let largest_sample_rule = f.rule == ClassRule::LargestSample;
    let mut notes = Vec::new();
    let moved = per_class(f, |a| {
        let p = a.table_plan();
        (p.plan_letter != k).then(|| p.plan_letter.to_string())
    });
    if !moved.is_empty() {
        let why = if largest_sample_rule {
            format!(
                "The plan stands at another row than code letter {k}: where its cell is an arrow, the first plan below (↓) or above (↑) in its column, or the row of the largest sample among the classes, as the responsible authority may allow; the sample size is that row's: "
            )
        } else {
            format!(
                "The cell at code letter {k} is an arrow: the plan is the first one below (↓) or above (↑) in its column, at the letter shown, with that row's sample size: "
            )
        };
        notes.push(("↓ ↑".to_string(), format!("{why}{}.", moved.join("; "))));
    }
    for (scheme, mark) in [
        (crate::design::Scheme::Single, SINGLE_MARK),
        (crate::design::Scheme::Double, DOUBLE_MARK),
    ] {
        let used = per_class(f, |a| {
            let p = a.table_plan();
            (p.table_scheme == scheme && p.scheme != scheme).then(String::new)
        });
        if !used.is_empty() {
            notes.push((
                mark.to_string(),
                format!(
                    "The {} table has '{mark}' there: the {} plan of the same letter and AQL is used (the standard also allows the plan below, where there is one): {}.",
                    f.scheme.name(),
                    scheme.name(),
                    used.join("; ")
                ),
            ));
        }
    }
    let mut memory = per_class(f, |a| a.table_plan().from_memory.then(String::new));
    if f.classes
        .iter()
        .any(|c| c.limit.is_some_and(|l| l.from_memory))
    {
        memory.push("Table VIII's limit numbers".to_string());
    }
    if !memory.is_empty() {
        notes.push((
            MEMORY_MARK.to_string(),
            format!(
                "Entered from memory of the printed standard, not read from a copy: {}. Check these against a copy of MIL-STD-105E, or give your own table, before relying on them.",
                memory.join("; ")
            ),
        ));
    }
    let every = per_class(f, |a| match a {
        StandardAnswer::InspectAll(all) => Some(format!(
            "{}, n = {}",
            all.plan.plan_letter,
            all.plan.sample_size()
        )),
        StandardAnswer::Sample(_) => None,
    });
    if !every.is_empty() {
        notes.push((
            "100%".to_string(),
            format!(
                "The table's sample reaches the lot of {} units, so every unit is inspected (the 100 percent rule of the master tables): {}.",
                f.lot_size,
                every.join("; ")
            ),
        ));
    }
    if !f.user_tables.is_empty() {
        notes.push((
            "User".to_string(),
            format!(
                "Tables given in place of the built-in ones: {}.",
                f.user_tables.join("; ")
            ),
        ));
    }
    if let SchemeCurve::Refused(why) = &f.scheme_oc {
        notes.push((
            "Scheme".to_string(),
            format!("The switching scheme's long-run OC is not drawn on the chart: {why}."),
        ));
    }
    notes
}

/// The lot record's labels: the severity a lot was inspected on, and the
/// counts found.
pub const INSPECTION: &str = "Inspection";
pub const FOUND: &str = "Found:";

/// A class at a severity that inspects every unit, in the true-risk
/// table.
pub const EVERY_UNIT_SHORT: &str = "every unit";

/// The true-risk table's heading: the plans in force at `severity`,
/// under the `model` (its name in capitals).
pub fn true_risks_heading(severity: Severity, model: &str) -> String {
    format!(
        "WHAT THE PLANS IN FORCE ({}) REALLY GIVE: EXACT OC, {model} MODEL",
        severity.name().to_uppercase()
    )
}

/// The true-risk table's heads, two lines each, without a consumer's
/// point.
pub fn risk_heads(per_unit: bool) -> [[&'static str; 2]; 6] {
    let q = if per_unit {
        "Per unit at"
    } else {
        "Quality at"
    };
    [
        ["", "Class"],
        ["Sample", "n"],
        ["Producer's risk", "1 − Pa at AQL"],
        [q, "Pa = 0.95"],
        [q, "Pa = 0.50"],
        [q, "Pa = 0.10"],
    ]
}

/// [`risk_heads`] with the consumer's risk at the RQL and the two-point
/// plan for the same points.
pub fn risk_heads_rql(per_unit: bool) -> [[&'static str; 2]; 8] {
    let [a, b, c, d, e, f] = risk_heads(per_unit);
    [
        a,
        b,
        c,
        d,
        e,
        f,
        ["Consumer's risk", "Pa at RQL"],
        ["Two-point plan", "same points"],
    ]
}

/// A probability in the true-risk table: three significant digits, and
/// below 0.001 only that it is (a figure like `7.66e-33` reads as noise
/// on a signed sheet, and no decision turns on its digits).
pub fn risk(p: f64) -> String {
    if p < 0.001 {
        "< 0.001".to_string()
    } else {
        crate::numeric::format_significant(p, 3)
    }
}

/// A class's two-point plan for its AQL at alpha and its consumer's
/// point, in a table cell: `n 105, Ac 2`, or the stages and largest
/// sample of a staged design.
pub fn two_point(k: &crate::standard::ConsumerRisk) -> String {
    match &k.design {
        Ok(d) => match d.design.plan.as_single() {
            Some((n, ac)) => format!("n {n}, Ac {ac}"),
            None => format!("{} stages, n up to {}", d.design.plan.stages().len(), d.n),
        },
        Err(_) => "none in the limits".to_string(),
    }
}

/// The line under the true-risk table with a consumer's `point`: what
/// the consumer's risk is judged against and what the two-point plan is.
pub fn consumer_caption(point: &crate::standard::ConsumerPoint, per_unit: bool) -> String {
    format!(
        "Consumer's point: RQL {} at β {}. Two-point plan: the designer's plan for it and α {} at the AQL; compare its n with the table plan's.",
        crate::print::wording::sheet::quality(point.rql, per_unit),
        point.beta,
        point.alpha
    )
}

/// The OC chart's title: which class it shows, short when the long one
/// is wider than the chart.
pub fn oc_title(cl: &StandardClassFacts, short: bool) -> String {
    let aql = format!("AQL {}", cl.aql.label());
    if cl.name == aql {
        // A single AQL given without a class name: the name is the AQL.
        format!("OC curves ({aql})")
    } else if short {
        format!("OC curves: {}", cl.name)
    } else {
        format!("OC curves of class {} (AQL {})", cl.name, cl.aql.label())
    }
}

/// A severity's curve in the OC chart's legend.
pub fn curve_label(s: Severity, plan: &crate::standard::StandardPlan, in_force: bool) -> String {
    let numbers = match plan.table_numbers.as_slice() {
        [t] => {
            let ac = t.accept.unwrap_or(0);
            if t.reject > ac + 1 {
                format!("n = {}, Ac {ac} Re {}", t.n, t.reject)
            } else {
                format!("n = {}, Ac {ac}", t.n)
            }
        }
        _ => format!(
            "{} stages, up to {}",
            plan.stages.stages().len(),
            plan.sample_size()
        ),
    };
    let force = if in_force { ", in force" } else { "" };
    format!("{} ({numbers}){force}", s.name())
}

/// What the chart's place says when every class inspects every unit.
pub const NO_CURVE: &str = "Every unit of the lot is inspected for every class at every severity: there is no OC curve to draw.";

/// The switching scheme's curve in the legend, and the AQL's guide.
pub const SCHEME_CURVE: &str = "switching scheme, long run";
pub fn aql_guide(label: &str) -> String {
    format!("AQL {label}")
}

/// The provenance line of the footer.
pub fn provenance(version: &str, file: &str, hash: &str, regenerate: &str) -> String {
    format!(
        "Generated by {version} from {file} (SHA-256 {hash}). Plans read from the tables of MIL-STD-105E (10 May 1989, public domain) and evaluated exactly. Regenerate with: {regenerate}"
    )
}

/// What page 2 of a sheet of two holds, as its heading line says.
pub const ENGINEERS_PAGE: &str = "PLANS AT EVERY SEVERITY, TRUE RISKS, OC CURVES, SWITCHING RULES";

/// The page's number on a sheet of several pages, as the footer leads
/// with it.
pub fn page_of(k: usize, of: usize) -> String {
    format!("Page {k} of {of}.")
}

/// The caution of the footer: the usual one, and what an AQL is not.
pub fn caution() -> String {
    format!(
        "{} The AQL indexes a scheme for a continuing series of lots; it is not a quality promised for any one lot.",
        crate::report::words::CAUTION
    )
}
