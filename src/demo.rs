//! The demo: the whole job on the plan sources of an invented scenario
//! (Tarnwick Pump Works receiving parts from its suppliers; every company,
//! part and person in it is made up).
//!
//! For each embedded source in `plans/`: verify the recorded plan against a
//! fresh solve, evaluate it at the qualities that bracket its risk points,
//! and write the source, its OC table (CSV) and its plan sheet (PDF) into
//! the output folder.

use std::path::Path;

use crate::batch::evaluate_standard;
use crate::budget::Work;
use crate::demo_ledger::{DEMO_LEDGER_FILES, DEMO_LOTS, demo_ledger};
use crate::fs::normalise_folder;
use crate::fs::{Overwrite, write_set};
use crate::input::InputError;
use crate::plan::{
    Decision, aoql, default_qualities, evaluate, evaluate_variables, judge_measurements,
    parse_measurements, variables_qualities,
};
use crate::report::{DemoRow, EvaluationReport, Report, VariablesEvaluationReport};
use crate::source::{Error, SourceError};
use crate::source::{PlanSource, Verdict, verify};
use crate::source::{SourceJob, source_work};

/// `(file name, text)` of every demo plan source.
pub const DEMO_PLANS: &[(&str, &str)] = &[
    (
        "tpw-seal-visual.yaml",
        include_str!("../plans/tpw-seal-visual.yaml"),
    ),
    (
        "tpw-cover-fit.yaml",
        include_str!("../plans/tpw-cover-fit.yaml"),
    ),
    (
        "tpw-housing-finish.yaml",
        include_str!("../plans/tpw-housing-finish.yaml"),
    ),
    (
        "tpw-impeller-porosity.yaml",
        include_str!("../plans/tpw-impeller-porosity.yaml"),
    ),
    (
        "tpw-sleeve-hardness.yaml",
        include_str!("../plans/tpw-sleeve-hardness.yaml"),
    ),
    (
        "tpw-cover-thickness.yaml",
        include_str!("../plans/tpw-cover-thickness.yaml"),
    ),
    (
        "tpw-packing-ring.yaml",
        include_str!("../plans/tpw-packing-ring.yaml"),
    ),
    (
        "tpw-seal-face-classes.yaml",
        include_str!("../plans/tpw-seal-face-classes.yaml"),
    ),
];

/// The readings of one lot of cover plates (invented), judged by the
/// demo against `tpw-cover-thickness.yaml`: `(file name, text, column)`.
pub const DEMO_READINGS: (&str, &str, &str) = (
    "tpw-cover-thickness-readings.csv",
    include_str!("../plans/tpw-cover-thickness-readings.csv"),
    "thickness_mm",
);

/// Runs the demo into `dir` (created if missing, from the path with its
/// `..` steps taken out where they can be: [`normalise_folder`]). Every
/// file is made before the first is written, and the set is written as one
/// ([`write_set`]): a failure (a full disk) leaves the folder as it was;
/// with [`Overwrite::Refuse`] the demo writes nothing when any of its
/// files exists already.
///
/// # Errors
/// [`Error`] when a demo source does not load (a build defect), a file
/// exists and `overwrite` refuses ([`SourceError::Exists`], naming the
/// first), or a file cannot be written.
pub fn run_demo(dir: &Path, overwrite: Overwrite) -> Result<Vec<DemoRow>, Error> {
    check_demo()?;
    let dir = &normalise_folder(dir);
    if dir.exists() && !dir.is_dir() {
        return Err(SourceError::Io {
            path: dir.clone(),
            source: std::io::Error::new(
                std::io::ErrorKind::NotADirectory,
                "this is a file; give --output-dir a folder",
            ),
        }
        .into());
    }
    let mut rows = Vec::new();
    let mut files = Vec::new();
    for (name, text) in DEMO_PLANS {
        let source = PlanSource::from_yaml(text, Path::new(name))?;
        let verified = verify(&source)? == Verdict::Match;
        let (mut row, csv) = if source.is_standard() {
            standard_row(&source, name)?
        } else if source.is_variables() {
            variables_row(&source, name)?
        } else {
            attributes_row(&source, name)?
        };
        let sheet = crate::print::render_sheet(text, &source, name, crate::print::Paper::A4)?;
        let mut mine = vec![
            (name.to_string(), source.to_yaml().into_bytes()),
            (name.replace(".yaml", "-oc.csv"), csv),
            (name.replace(".yaml", ".pdf"), sheet.pdf),
        ];
        if source.is_standard() {
            let ledger = demo_ledger(&source, text, name)?;
            mine.push((DEMO_LOTS.0.to_string(), DEMO_LOTS.1.as_bytes().to_vec()));
            for (file, bytes) in DEMO_LEDGER_FILES.iter().zip(ledger) {
                mine.push((file.to_string(), bytes));
            }
        }
        let (readings_name, readings, _) = DEMO_READINGS;
        if row.judged.is_some() {
            mine.push((readings_name.to_string(), readings.as_bytes().to_vec()));
        }
        row.verified = verified;
        row.written = mine.iter().map(|(file, _)| dir.join(file)).collect();
        files.extend(mine);
        rows.push(row);
    }
    write_set(dir, &files, overwrite)?;
    Ok(rows)
}

/// The demo's work, estimated from its plans before it starts (verify,
/// evaluate at the default qualities and print the sheet of each): a
/// fraction of a second, held to the budget like every command's.
fn check_demo() -> Result<(), Error> {
    let mut work = Work::default();
    for (name, text) in DEMO_PLANS {
        let source = PlanSource::from_yaml(text, Path::new(name))?;
        for job in [
            SourceJob::Verify,
            SourceJob::Sheet,
            SourceJob::Evaluate {
                points: None,
                decided_at: false,
            },
        ] {
            work = work.and(source_work(&source, job));
        }
    }
    work.check(
        "the demo",
        "report this as a bug: the demo's plans are built in",
    )
    .map_err(InputError::from)?;
    Ok(())
}

/// The row and OC table of an attributes plan.
fn attributes_row(source: &PlanSource, name: &str) -> Result<(DemoRow, Vec<u8>), Error> {
    let request = source.request()?;
    let recorded = source.recorded_plan(&request.model)?;
    let qualities = default_qualities(&recorded, &request.model, Some(&request.risks));
    let evaluation = evaluate(&recorded, &request.model, &qualities)?;
    let mut csv = Vec::new();
    let report = EvaluationReport::from(&evaluation);
    report.check()?;
    report.write_csv(&mut csv)?;
    let limit = aoql(&recorded, &request.model);
    Ok((
        DemoRow {
            file: name.to_string(),
            title: source.title.clone(),
            model: request.model.kind(),
            plan: recorded.to_string(),
            risks: recorded_risks(source),
            aoql: (limit.value, limit.quality),
            verified: false,
            written: Vec::new(),
            judged: None,
        },
        csv,
    ))
}

/// The row and OC table of a standard-indexed plan: each class's plan in
/// force, the risks and AOQL of the first class's plan, and the OC of
/// every class's plan in the CSV.
fn standard_row(source: &PlanSource, name: &str) -> Result<(DemoRow, Vec<u8>), Error> {
    let request = source.standard_request()?;
    let plans = source.recorded_class_plans(None)?;
    let model = request.request.model();
    let mut csv = Vec::new();
    let report = evaluate_standard(source, &[], false, None)?;
    report.check()?;
    report.write_csv(&mut csv)?;
    let mut plan = format!("code letter {}", plans.code_letter);
    let mut limit = (f64::NAN, f64::NAN);
    for (i, class) in plans.classes.iter().enumerate() {
        match class.answer.plan() {
            Some(p) => {
                let staged = p.plan_for(model)?;
                plan.push_str(&format!("; {} {staged}", class.class.label()));
                if i == 0 {
                    let a = aoql(&staged, model);
                    limit = (a.value, a.quality);
                }
            }
            None => plan.push_str(&format!("; {} every unit", class.class.label())),
        }
    }
    Ok((
        DemoRow {
            file: name.to_string(),
            title: source.title.clone(),
            model: model.kind(),
            plan,
            // The first class's producer's risk at its AQL; the consumer's
            // risk only where the source agrees an RQL.
            risks: {
                let (alpha, beta) = source.standard_achieved()?;
                (alpha, request.consumer.map(|_| beta))
            },
            aoql: limit,
            verified: false,
            written: Vec::new(),
            judged: None,
        },
        csv,
    ))
}

/// The row and OC table of a variables plan, with its demo lot judged
/// when the demo has readings for it (they are written beside the source).
fn variables_row(source: &PlanSource, name: &str) -> Result<(DemoRow, Vec<u8>), Error> {
    let request = source.variables_request()?;
    let plan = source.recorded_variables_plan(&request)?;
    let qualities = variables_qualities(&plan, request.risks());
    let evaluation = evaluate_variables(&plan, request.model().lot_size(), &qualities)?;
    let mut csv = Vec::new();
    let report = VariablesEvaluationReport::from(&evaluation);
    report.check()?;
    report.write_csv(&mut csv)?;
    let (readings_name, readings, column) = DEMO_READINGS;
    let mut judged = None;
    if readings_name.starts_with(&name.replace(".yaml", "")) {
        let values = parse_measurements(readings, Some(column))?;
        let j = judge_measurements(&plan, &values, request.risks().producer().quality)?;
        let mut verdict = format!(
            "{} ({}; n = {}, mean {:.4}, s {:.4})",
            match j.decided.decision {
                Decision::Accept => "ACCEPT",
                _ => "REJECT",
            },
            j.decided.rule,
            j.n,
            j.mean,
            j.s
        );
        for w in &j.warnings {
            verdict.push_str(&format!("; WARNING: {w}"));
        }
        judged = Some(verdict);
    }
    Ok((
        DemoRow {
            file: name.to_string(),
            title: source.title.clone(),
            model: request.model().kind(),
            plan: plan.to_string(),
            risks: recorded_risks(source),
            aoql: (evaluation.aoql.value, evaluation.aoql.quality),
            verified: false,
            written: Vec::new(),
            judged,
        },
        csv,
    ))
}

fn recorded_risks(source: &PlanSource) -> (f64, Option<f64>) {
    source.plan.as_ref().map_or((f64::NAN, None), |p| {
        (p.producer_risk.unwrap_or(f64::NAN), p.consumer_risk)
    })
}
