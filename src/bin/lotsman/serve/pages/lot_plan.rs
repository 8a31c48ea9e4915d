//! The plan in force for a lot at the receiving dock: the plan source
//! read and audited as `judge` reads it, the severity the ledger's history
//! requires (the replay `judge --record` uses), n, Ac and Re of every
//! stage, and the units to draw, seeded from the lot ID and the source's
//! SHA-256 as `draw --plan` seeds them.

use std::path::PathBuf;

use lotsman::{
    Audited, DrawRequest, Error, InputError, KnownPlan, Ledger, MAX_LOT_SIZE, PlanSource,
    SeedSource, Severity, Stage, draw, draw_seed, format_significant, nested_parts, parse_count,
    replay,
};

use crate::commands::judge::budget;
use crate::serve::workspace::Workspace;

/// The fields of the inspection form as typed.
#[derive(Clone, Debug, Default)]
pub struct LotFields {
    /// The plan source, relative to the workspace.
    pub plan: String,
    /// The ledger, relative to the workspace (empty: beside the plan).
    pub ledger: String,
    pub lot: String,
    /// Empty for the source's lot size.
    pub lot_size: String,
}

impl LotFields {
    /// The fields of a query or a form.
    pub fn of(fields: &std::collections::HashMap<String, String>) -> Self {
        let text = |key: &str| {
            fields
                .get(key)
                .map(|v| v.trim().to_string())
                .unwrap_or_default()
        };
        LotFields {
            plan: text("plan"),
            ledger: text("ledger"),
            lot: text("lot"),
            lot_size: text("lot_size"),
        }
    }

    /// The ledger's name: as given, or beside the plan, `PLAN-ledger.csv`;
    /// empty while no plan is chosen.
    pub fn ledger_name(&self) -> String {
        if !self.ledger.is_empty() || self.plan.is_empty() {
            return self.ledger.clone();
        }
        let stem = self
            .plan
            .strip_suffix(".yaml")
            .or_else(|| self.plan.strip_suffix(".yml"))
            .unwrap_or(&self.plan);
        format!("{stem}-ledger.csv")
    }
}

/// How the lot's counts are entered.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Entry {
    /// One count per stage, in each stage's new units.
    Stages,
    /// Item by item: the units inspected so far and the count in them.
    Items,
    /// One count per class, per stage (`K` or `K,K,..`).
    Classes,
    /// The readings of a variables plan.
    Readings,
}

/// One stage of a plan as the page lists it.
pub struct StageRow {
    pub stage: usize,
    pub sample: u64,
    pub cumulative: u64,
    pub accept: String,
    pub reject: u64,
}

/// A class's plan (one, unnamed, for a plan without classes).
pub struct ClassRows {
    /// The class's name and AQL; empty for a plan without classes.
    pub label: String,
    /// The class's name as `--found NAME=K` gives it (none for a plan
    /// without named classes).
    pub name: Option<String>,
    /// The form field of its counts.
    pub field: String,
    /// Every unit is to be inspected for this class.
    pub inspect_all: bool,
    pub stages: Vec<StageRow>,
}

/// The units to draw, stage by stage.
pub struct DrawShown {
    pub seed: u64,
    pub stages: Vec<DrawStage>,
}

/// One stage's units (or one item's unit).
pub struct DrawStage {
    pub label: String,
    pub positions: String,
}

/// The plan in force for the next lot.
pub struct InForce {
    pub plan_path: PathBuf,
    pub ledger_path: PathBuf,
    pub ledger_shown: String,
    pub title: String,
    pub entry: Entry,
    /// The severity the ledger requires (standard-indexed sources).
    pub severity: Option<Severity>,
    /// Why no lot can be judged: inspection is discontinued.
    pub discontinued: Option<String>,
    pub code_letter: Option<String>,
    pub classes: Vec<ClassRows>,
    /// A variables plan: its n and constant, in words.
    pub variables: Option<String>,
    /// A variables plan's rule, as its report and sheet give it: what to
    /// compute from the readings and when to accept.
    pub rule: Vec<String>,
    /// The lot size used: the one given, or the source's.
    pub lot_size: Option<u64>,
    /// A lot size other than the one the source was made for, in words.
    pub lot_note: Option<String>,
    /// The units to draw, or why they are not shown.
    pub draw: Result<DrawShown, String>,
    /// The ledger's rows so far.
    pub rows: usize,
}

/// The plan in force for the lot of `fields`.
pub fn in_force(workspace: &Workspace, fields: &LotFields) -> Result<InForce, Error> {
    let plan_path = workspace.file(&fields.plan)?;
    let ledger_shown = fields.ledger_name();
    let ledger_path = workspace.file(&ledger_shown)?;
    if ledger_path == plan_path {
        return Err(InputError::Inconsistent(
            "the ledger and the plan source are one file; give the ledger a name of its own, as PLAN-ledger.csv".to_string(),
        )
        .into());
    }
    let audited = Audited::load_checked(&plan_path, false, budget(&plan_path))?;
    // The text `judge --record` hashes, so that the draw's seed is the one
    // `--seed-from-lot` records.
    let text = PlanSource::read_text(&plan_path)?;
    let known = KnownPlan::from_source(&plan_path, &text, &audited.source)?;
    let ledger = if ledger_path.exists() {
        Ledger::read(&ledger_path)?
    } else {
        Ledger::parse(&ledger_path, &[])?
    };
    let lot_size = match fields.lot_size.as_str() {
        "" => audited.source.lot_size,
        text => Some(parse_count("lot size (--lot-size)", text, MAX_LOT_SIZE)?),
    };
    let mut shown = InForce {
        plan_path,
        ledger_path,
        ledger_shown,
        title: audited.source.title.clone(),
        entry: Entry::Stages,
        severity: None,
        discontinued: None,
        code_letter: None,
        classes: Vec::new(),
        variables: None,
        rule: Vec::new(),
        lot_size,
        lot_note: other_size(audited.source.lot_size, lot_size),
        draw: Err(String::new()),
        rows: ledger.rows.len(),
    };
    let sizes = if known.rules().is_some() {
        standard(&mut shown, &known, &ledger)
    } else if let Some(plan) = known.variables_plan() {
        shown.entry = Entry::Readings;
        let constant = match (plan.k(), plan.m()) {
            (Some(k), _) => format!("k = {}", format_significant(k, 4)),
            (None, Some(m)) => format!("M = {}", format_significant(m, 4)),
            (None, None) => String::new(),
        };
        shown.variables = Some(format!("n = {}, {constant}", plan.n()));
        shown.rule = lotsman::variables_rule(plan);
        Sizes::Stages(vec![plan.n()])
    } else if let Some((plan, _)) = known.counted_plan() {
        let items = plan.sequential_lines().is_some();
        shown.entry = if items { Entry::Items } else { Entry::Stages };
        shown.classes.push(ClassRows {
            label: String::new(),
            name: None,
            field: String::new(),
            inspect_all: false,
            stages: rows(plan.stages()),
        });
        if items {
            Sizes::Items(plan.max_sample())
        } else {
            Sizes::Stages(new_units(plan.stages()))
        }
    } else {
        Sizes::None
    };
    shown.draw = drawn(fields, lot_size, &known.sha256, sizes);
    Ok(shown)
}

/// The note on a lot of `given` units judged by a source made for lots
/// of `made` units: its plan (a standard-indexed source's code letter, a
/// hypergeometric model's lot) may not fit this lot.
fn other_size(made: Option<u64>, given: Option<u64>) -> Option<String> {
    match (made, given) {
        (Some(made), Some(given)) if made != given => Some(format!(
            "the plan source was made for lots of {made} units, and this lot has {given}: its plan may not be the one for this lot (the standard's code letter and a hypergeometric plan depend on the lot size); for lots of this size, use a plan source made for them"
        )),
        _ => None,
    }
}

/// What to draw.
enum Sizes {
    Stages(Vec<u64>),
    /// The nested draw of classes whose plans take different samples:
    /// each part's new units and who counts in them.
    Nested(Vec<(u64, String)>),
    Items(u64),
    /// Nothing: every unit is inspected, or no plan applies.
    None,
}

/// A standard-indexed source: the severity the ledger's history requires
/// and each class's plan at it. Classes whose plans take different
/// samples share one nested draw ([`nested`]): each class counts in the
/// first units of the draw, as many as its own plan takes, so no class
/// favours the front of a sorted list.
fn standard(shown: &mut InForce, known: &KnownPlan, ledger: &Ledger) -> Sizes {
    shown.entry = Entry::Classes;
    let state = replay(ledger, std::slice::from_ref(known))
        .state
        .unwrap_or_default();
    let Some(severity) = state.severity() else {
        shown.discontinued = Some(
            "inspection under the standard is discontinued: five lots were not accepted on tightened inspection (MIL-STD-105E 4.8). When the supplier's corrective action is accepted, judge the next lot with lotsman judge --record --corrective-action \"WHAT WAS DONE\": inspection resumes on tightened".to_string(),
        );
        return Sizes::None;
    };
    shown.severity = Some(severity);
    let Some(plans) = known.plans_at(severity) else {
        return Sizes::None;
    };
    shown.code_letter = Some(plans.code_letter.to_string());
    let mut cumulative: Vec<(String, Vec<u64>)> = Vec::new();
    for (i, class) in plans.classes.iter().enumerate() {
        let stages = class.answer.table_plan().stages.stages();
        let label = match &class.class.name {
            Some(name) => format!("{name} (AQL {})", class.class.aql),
            None => class.class.label(),
        };
        if class.answer.plan().is_some() {
            cumulative.push((label.clone(), stages.iter().map(|s| s.n).collect()));
        }
        shown.classes.push(ClassRows {
            label,
            name: class.class.name.clone(),
            field: format!("class_{}", i + 1),
            inspect_all: class.answer.plan().is_none(),
            stages: rows(stages),
        });
    }
    match cumulative.as_slice() {
        _ if plans.inspect_all() => Sizes::None,
        [] => Sizes::None,
        [(_, one)] => Sizes::Stages(new_units_of(one)),
        _ => Sizes::Nested(nested(&cumulative)),
    }
}

/// The parts of one nested draw for classes of the cumulative sample
/// sizes given ([`nested_parts`]), each with its label: `Every class —
/// units 1 to 125 of the draw (125 units)`, then `Critical (AQL 0.065)
/// only — units 126 to 200 of the draw (75 more)`.
fn nested(classes: &[(String, Vec<u64>)]) -> Vec<(u64, String)> {
    nested_parts(classes)
        .into_iter()
        .map(|part| {
            let who = part.who();
            let mut who = who.chars();
            let first = who.next().map(|c| c.to_uppercase().to_string());
            let more = if part.from == 1 { "units" } else { "more" };
            let label = format!(
                "{}{} \u{2014} units {} to {} of the draw ({} {more})",
                first.unwrap_or_default(),
                who.as_str(),
                part.from,
                part.to,
                part.units()
            );
            (part.units(), label)
        })
        .collect()
}

/// The units each stage adds, from the cumulative sizes.
fn new_units_of(cumulative: &[u64]) -> Vec<u64> {
    let mut previous = 0;
    cumulative
        .iter()
        .map(|&n| {
            let added = n - previous;
            previous = n;
            added
        })
        .collect()
}

/// The units each stage adds.
fn new_units(stages: &[Stage]) -> Vec<u64> {
    new_units_of(&stages.iter().map(|s| s.n).collect::<Vec<_>>())
}

/// The stages as the page lists them.
fn rows(stages: &[Stage]) -> Vec<StageRow> {
    stages
        .iter()
        .zip(new_units(stages))
        .enumerate()
        .map(|(i, (s, sample))| StageRow {
            stage: i + 1,
            sample,
            cumulative: s.n,
            accept: s.accept.map_or("-".to_string(), |a| a.to_string()),
            reject: s.reject,
        })
        .collect()
}

/// The draw of `draw --lot ID --lot-size N --plan PLAN.yaml` with the
/// plan's stage sizes (or `--items` for an item-by-item plan); the
/// reason in words when there is none.
fn drawn(
    fields: &LotFields,
    lot_size: Option<u64>,
    sha256: &str,
    sizes: Sizes,
) -> Result<DrawShown, String> {
    let Some(lot_size) = lot_size else {
        return Err("give the lot size to see the units to draw".to_string());
    };
    if fields.lot.is_empty() {
        return Err("give the lot ID to see the units to draw".to_string());
    }
    let seed = draw_seed(Some(sha256), &fields.lot);
    let source = SeedSource::PlanAndLot {
        plan_sha256: sha256.to_string(),
    };
    let mut labels = None;
    let request = match sizes {
        Sizes::Stages(sizes) => {
            DrawRequest::staged(&fields.lot, lot_size, &sizes, None, seed, source)
        }
        Sizes::Nested(parts) => {
            let sizes: Vec<u64> = parts.iter().map(|p| p.0).collect();
            labels = Some(parts.into_iter().map(|p| p.1).collect::<Vec<_>>());
            DrawRequest::staged(&fields.lot, lot_size, &sizes, None, seed, source)
        }
        Sizes::Items(k) => DrawRequest::items(&fields.lot, lot_size, k, seed, source),
        Sizes::None => {
            return Err("nothing to draw: inspect every unit of the lot".to_string());
        }
    }
    .map_err(|e| Error::from(e).to_string())?;
    let items = matches!(request.kind(), lotsman::DrawKind::Items(_));
    let drawn = draw(&request);
    let joined = |positions: &[u64]| {
        positions
            .iter()
            .map(u64::to_string)
            .collect::<Vec<_>>()
            .join(", ")
    };
    let stages = if items {
        vec![DrawStage {
            label: format!("{} items, one at a time, in this order", drawn.stages.len()),
            positions: joined(&drawn.stages.concat()),
        }]
    } else {
        let count = drawn.stages.len();
        drawn
            .stages
            .iter()
            .enumerate()
            .map(|(i, positions)| DrawStage {
                label: if let Some(said) = labels.as_ref().and_then(|l| l.get(i)) {
                    said.clone()
                } else if count == 1 {
                    format!("{} units", positions.len())
                } else {
                    format!("stage {}: {} units", i + 1, positions.len())
                },
                positions: joined(positions),
            })
            .collect()
    };
    Ok(DrawShown { seed, stages })
}
