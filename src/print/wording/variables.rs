//! The variables sheet's wording: the plan box's lines, the inspector's
//! steps, the decision rule with the plan's numbers filled in, the result
//! lines, the chart's legend and the caution the rule adds.
//!
//! Formulas use the markup of [`Canvas::formula`](crate::print::canvas::Canvas::formula):
//! `_` starts a subscript (`Q_U`, `p̂_L`, `I_x`). The numbers are printed
//! as the source records them (the shortest decimal that reads back as the
//! same value), so that the sheet shows the limits and the constant the
//! plan uses, not a rounding of them.

use crate::design::SingleDesign;
use crate::numeric::{format_short, format_significant};
use crate::plan::{LimitKind, SigmaKind, Specification, VariablesPlan};

/// A number as recorded: the shortest decimal that reads back as `v`.
pub fn number(v: f64) -> String {
    format!("{v}")
}

/// A fraction as a percentage with the fewest significant digits (at
/// least 4) that read back as `m`.
pub fn percent(m: f64) -> String {
    (4..=15)
        .map(|d| format_significant(m * 100.0, d))
        .find(|s| {
            s.parse::<f64>()
                .is_ok_and(|v| (v / 100.0 - m).abs() <= 1e-12 * m.abs())
        })
        .map_or_else(|| format!("{}", m * 100.0), |s| format!("{s}%"))
}

/// `" mm"` for a unit, or nothing.
fn with_unit(unit: Option<&str>) -> String {
    unit.map_or_else(String::new, |u| format!(" {u}"))
}

/// The title block's scheme field.
pub fn scheme(sigma: SigmaKind) -> String {
    format!("variables, σ {}", sigma.name())
}

/// The plan box's heading.
pub fn plan_heading(spec: &Specification) -> &'static str {
    match spec.limit() {
        LimitKind::Both => "MEASURE n UNITS; ACCEPT UP TO M",
        _ => "MEASURE n UNITS; ACCEPT FROM k",
    }
}

/// The constant as the plan box shows it.
pub fn constant(plan: &VariablesPlan) -> String {
    match (plan.k(), plan.m()) {
        (Some(k), _) => format!("k = {}", number(k)),
        (_, Some(m)) => format!("M = {}", percent(m)),
        _ => String::new(),
    }
}

/// What the plan box says of sigma.
pub fn sigma_line(spec: &Specification, unit: Option<&str>) -> String {
    match spec.sigma() {
        Some(s) => format!(
            "σ = {}{}, known (stable process)",
            number(s),
            with_unit(unit)
        ),
        None => "σ estimated from each sample by s".to_string(),
    }
}

/// What the plan box says of the limits.
pub fn limits_line(spec: &Specification, unit: Option<&str>) -> String {
    let u = with_unit(unit);
    match (spec.lower(), spec.upper()) {
        (Some(l), Some(h)) => format!("Limits L = {}{u}, U = {}{u}", number(l), number(h)),
        (Some(l), None) => format!("Lower limit L = {}{u}", number(l)),
        (None, Some(h)) => format!("Upper limit U = {}{u}", number(h)),
        (None, None) => String::new(),
    }
}

/// The attributes single plan for the same points, and what measuring
/// saves against it.
pub fn comparison(attributes: Option<&SingleDesign>, n: u64) -> String {
    let Some(a) = attributes else {
        return "Counting instead: no attributes single plan within the caps meets these points."
            .to_string();
    };
    let head = format!(
        "Counting instead: attributes single plan n = {}, c = {} for the same points;",
        a.n, a.c
    );
    if a.n > n {
        let saved = a.n - n;
        format!(
            "{head} measuring saves {saved} units ({:.0}%).",
            100.0 * saved as f64 / a.n as f64
        )
    } else {
        format!("{head} measuring takes {} more units.", n - a.n)
    }
}

/// The inspector's steps. `on_log`: the readings go on a separate log.
pub fn procedure(plan: &VariablesPlan, unit: Option<&str>, on_log: bool) -> Vec<String> {
    let n = plan.n();
    let spec = plan.spec();
    let unit_in = unit.map_or_else(String::new, |u| format!(" in {u}"));
    let record = if on_log {
        format!("on a readings log numbered 1 to {n}")
    } else {
        "in the next numbered row of the table".to_string()
    };
    let spread = match spec.sigma() {
        None => format!("the standard deviation s (divisor {})", n - 1),
        Some(s) => format!(
            "s (divisor {}; compare it with σ = {}{})",
            n - 1,
            number(s),
            with_unit(unit)
        ),
    };
    let decide = match (plan.k(), plan.m()) {
        (Some(k), _) => format!(
            "4. Work out the statistic of the decision rule: accept the lot if it is {} or more, otherwise reject it.",
            number(k)
        ),
        (_, Some(m)) => format!(
            "4. Estimate the fractions beyond the limits by the decision rule: accept the lot if their sum is {} or less, otherwise reject it.",
            percent(m)
        ),
        _ => String::new(),
    };
    vec![
        format!("1. Draw {n} units at random from the whole lot, every unit equally likely to be drawn."),
        format!(
            "2. Measure each unit with the gauge and resolution that the inspection instruction names; write each reading{unit_in} {record}, leaving none out."
        ),
        format!("3. Work out Σx, the mean x̄ = Σx / {n} and {spread}."),
        decide,
        "5. Readings that do not look normal (an outlier, a heap at a limit): refer the lot to quality engineering.".to_string(),
        "6. Return or screen a rejected lot 100%, as the supply agreement says; file the readings with this sheet.".to_string(),
    ]
}

/// A line of the decision rule.
pub enum RuleLine {
    /// A formula, on one line.
    Formula(String),
    /// Two formulas: side by side when they fit, else one under the other.
    Pair(String, String),
    /// The acceptance or the rejection condition.
    Accept(String),
    Reject(String),
    /// A note in small type, wrapped.
    Note(String),
}

/// The decision rule with the plan's numbers.
pub fn rule(plan: &VariablesPlan) -> Vec<RuleLine> {
    let spec = plan.spec();
    let n = plan.n();
    let by = match spec.sigma() {
        Some(s) => number(s),
        None => "s".to_string(),
    };
    let by_name = if spec.sigma().is_some() { "σ" } else { "s" };
    let upper = |spelled: bool| {
        spec.upper().map(|u| {
            let general = if spelled {
                format!("(U − x̄) / {by_name} = ")
            } else {
                String::new()
            };
            format!("Q_U = {general}({} − x̄) / {by}", number(u))
        })
    };
    let lower = |spelled: bool| {
        spec.lower().map(|l| {
            let general = if spelled {
                format!("(x̄ − L) / {by_name} = ")
            } else {
                String::new()
            };
            format!("Q_L = {general}(x̄ − {}) / {by}", number(l))
        })
    };
    let mut lines = Vec::new();
    match (plan.k(), plan.m()) {
        (Some(k), _) => {
            let q = if spec.limit() == LimitKind::Upper {
                "Q_U"
            } else {
                "Q_L"
            };
            lines.extend(upper(true).or(lower(true)).map(RuleLine::Formula));
            lines.push(RuleLine::Accept(format!(
                "Accept the lot when {q} ≥ k = {}",
                number(k)
            )));
            lines.push(RuleLine::Reject(format!(
                "Reject the lot when {q} < {}",
                number(k)
            )));
        }
        (_, Some(m)) => {
            lines.push(RuleLine::Pair(
                upper(false).unwrap_or_default(),
                lower(false).unwrap_or_default(),
            ));
            let nf = n as f64;
            match spec.sigma() {
                None => {
                    let a = format_short(nf / 2.0 - 1.0, 6);
                    let coefficient = format_significant(nf.sqrt() / (2.0 * (nf - 1.0)), 5);
                    lines.push(RuleLine::Formula(format!(
                        "p̂_U = I_x({a}, {a}),  x = 0.5 − {coefficient}·Q_U"
                    )));
                    lines.push(RuleLine::Formula(format!(
                        "p̂_L = I_x({a}, {a}),  x = 0.5 − {coefficient}·Q_L"
                    )));
                    lines.push(RuleLine::Note(format!(
                        "Each x is held within 0 to 1. I is the regularised incomplete beta function: in a spreadsheet, BETA.DIST(x, {a}, {a}, TRUE)."
                    )));
                }
                Some(_) => {
                    let v = format_significant((nf / (nf - 1.0)).sqrt(), 5);
                    lines.push(RuleLine::Pair(
                        format!("p̂_U = 1 − Φ({v}·Q_U)"),
                        format!("p̂_L = 1 − Φ({v}·Q_L)"),
                    ));
                    lines.push(RuleLine::Note(
                        "Φ is the standard normal distribution function: in a spreadsheet, NORM.S.DIST(z, TRUE)."
                            .to_string(),
                    ));
                }
            }
            lines.push(RuleLine::Accept(format!(
                "Accept the lot when p̂_L + p̂_U ≤ M = {}",
                percent(m)
            )));
            lines.push(RuleLine::Reject(format!(
                "Reject the lot when p̂_L + p̂_U > {}",
                percent(m)
            )));
        }
        _ => {}
    }
    lines
}

/// The rows of blank result fields, each a list of labels (formula markup).
pub fn result_rows(plan: &VariablesPlan) -> Vec<Vec<&'static str>> {
    let spec = plan.spec();
    let mut rows = vec![vec!["Σx", "x̄", "s"]];
    match spec.limit() {
        LimitKind::Upper => rows.push(vec!["Q_U"]),
        LimitKind::Lower => rows.push(vec!["Q_L"]),
        LimitKind::Both => {
            rows.push(vec!["Q_U", "p̂_U"]);
            rows.push(vec!["Q_L", "p̂_L"]);
            rows.push(vec!["p̂ = p̂_L + p̂_U"]);
        }
    }
    rows
}

/// Headings of the right column's blocks.
pub const RULE_HEADING: &str = "DECISION RULE";
/// Beside the rule's heading: the command that works it out (its full form
/// is in the footer, [`judge_command`]).
pub const JUDGE_TOO: &str = "lotsman judge works it out too";

/// The provenance line's continuation: how to judge a lot from a file of
/// its readings.
pub fn judge_command(file_name: &str) -> String {
    format!(
        "; judge a lot from its readings, with a normality test: lotsman judge {file_name} --measurements READINGS.csv"
    )
}
pub const RESULTS_HEADING: &str = "RESULTS";
pub const DECISION: &str = "Decision";
pub const ACCEPT_BOX: &str = "accept";
pub const REJECT_BOX: &str = "reject";
pub const INSPECTED_BY: &str = "Inspected by";
pub const INSPECTED_ON: &str = "Date";

/// The readings block.
pub fn readings_heading(unit: Option<&str>) -> String {
    match unit {
        Some(u) => format!("READINGS ({u})"),
        None => "READINGS".to_string(),
    }
}
pub const LOT_NUMBER: &str = "Lot no.";
pub const GAUGE: &str = "Gauge";
pub const READING_HEADS: [&str; 2] = ["No.", "Reading"];

/// What the readings block says when the sample is larger than the table
/// the sheet holds.
pub fn readings_elsewhere(n: u64, cap: u64) -> String {
    format!(
        "This plan takes {n} readings, more than the {cap} this sheet has rows for. Write them on a separate readings log numbered 1 to {n}, with the lot number, and keep it with this sheet; the results and the decision are still entered on this sheet."
    )
}

/// The note in place of the readings table when the notice of an
/// unconfirmed plan leaves it no room.
pub fn readings_displaced(n: u64) -> String {
    format!(
        "The notice above leaves this page no room for the table of {n} readings. Write them on a separate readings log numbered 1 to {n}, with the lot number, and keep it with this sheet; the results and the decision are still entered on this sheet."
    )
}

/// The caution the variables rule adds to the common one.
pub fn assumption(sigma: SigmaKind) -> &'static str {
    match sigma {
        SigmaKind::Unknown => {
            "The rule assumes that a lot's measurements are normally distributed; if they are not, its risks do not hold."
        }
        SigmaKind::Known => {
            "The rule assumes that a lot's measurements are normally distributed with the stated σ (a stable process spread); if they are not, its risks do not hold."
        }
    }
}

/// Legend labels of the OC chart.
pub fn variables_curve(plan: &VariablesPlan) -> String {
    format!("this plan ({})", plan_numbers(plan))
}
pub const ONE_SIDED_CURVE: &str = "this plan, all beyond one limit";
pub const CENTRED_CURVE: &str = "this plan, mean centred";
pub fn attributes_curve(a: &SingleDesign) -> String {
    format!("counting instead: n = {}, c = {}", a.n, a.c)
}
pub fn unreachable_zone(lowest: f64, sigma: f64) -> String {
    format!(
        "below {}%: not possible with σ = {}",
        format_significant(lowest * 100.0, 2),
        number(sigma)
    )
}

fn plan_numbers(plan: &VariablesPlan) -> String {
    format!("n = {}, {}", plan.n(), constant(plan))
}
