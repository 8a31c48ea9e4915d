//! The work of the commands on plan sources, from the estimates of their
//! parts: one plan source under `verify`, `evaluate`, `sheet` or `judge`,
//! and a batch of them; and the checks that refuse a command before it
//! starts.

use std::path::Path;

use super::schema::PlanSource;
use super::text::SourceText;
use crate::budget::{OverBudget, TIME_BUDGET, Work, duration};
use crate::design::{design_work, variables_design_work};
use crate::plan::{
    evaluation_advice, evaluation_advice_for, evaluation_work, most_variables_qualities,
    variables_evaluation_work, walk_parts,
};

/// What a command does with a plan source.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum SourceJob {
    /// Re-solve it and compare (`verify`).
    Verify,
    /// Audit it and print its sheet (`sheet`).
    Sheet,
    /// Audit it and decide a lot by its plan (`judge`).
    Judge,
    /// Evaluate its recorded plan at `points` qualities (`None`: the
    /// default ones), with the per-stage distribution when `decided_at`.
    Evaluate {
        /// The qualities asked for.
        points: Option<usize>,
        /// Whether the per-stage distribution is asked for.
        decided_at: bool,
    },
}

/// OC walks with the curtailed sample number a sheet takes: the 241
/// points of its curves and the OC table's qualities.
const SHEET_CURTAILED_WALKS: f64 = 250.0;

/// OC walks without it: the table's AOQL and indifference searches, the
/// sheet's own largest ASN and AOQL searches, the quality axis and the
/// audit's two risks.
const SHEET_WALKS: f64 = 600.0;

/// Seconds to lay out and write a sheet's PDF, whatever its plan: about
/// 3 ms since the font programs are deflated once per process (the sheet
/// of a single Poisson plan of 36 units took 3.8 ms of processor time, its
/// audit included; 4 December 2026).
const SHEET_LAYOUT: f64 = 0.003;

/// Seconds per class of a standard-indexed source for the table lookups
/// and the small OC walks of its plans: about half a millisecond each
/// (verifying the demo's source of three classes took 1.5 ms more than a
/// single plan's).
const STANDARD_CLASS: f64 = 5.0e-4;

/// Seconds the sheet of a standard-indexed source takes: the assessment,
/// the layout and the PDF (the demo's three classes, scheme curve
/// included, took 0.13 s of processor time in a release build). The
/// scheme curve checks its own estimate
/// ([`ClassScheme::work`](crate::ClassScheme::work)) against the budget
/// before it is drawn, and the sheet notes it instead when it is beyond.
const STANDARD_SHEET: f64 = 0.13;

/// The qualities an evaluation takes when none are asked for.
const DEFAULT_POINTS: usize = 10;

/// The work of `job` on `source`; a source whose request or recorded plan
/// is invalid is refused at once and costs nothing.
pub fn source_work(source: &PlanSource, job: SourceJob) -> Work {
    if source.is_standard() {
        let classes = source
            .standard_request()
            .map_or(0, |r| r.request.classes().len()) as f64;
        let lookups = Work::time(STANDARD_CLASS * classes);
        return match job {
            SourceJob::Sheet => lookups.and(Work::time(STANDARD_SHEET)),
            SourceJob::Evaluate { points, .. } => {
                Work::time(STANDARD_CLASS * classes * points.unwrap_or(DEFAULT_POINTS) as f64)
            }
            SourceJob::Verify | SourceJob::Judge => lookups,
        };
    }
    if source.is_variables() {
        let Ok(request) = source.variables_request() else {
            return Work::default();
        };
        let spec = request.spec();
        let design = variables_design_work(spec, request.risks());
        return match job {
            SourceJob::Verify | SourceJob::Judge => design,
            SourceJob::Sheet => design
                .and(variables_evaluation_work(spec, 241))
                .and(Work::time(SHEET_LAYOUT)),
            // The audit re-solves the source before the evaluation.
            SourceJob::Evaluate { points, .. } => design.and(variables_evaluation_work(
                spec,
                points.unwrap_or(DEFAULT_POINTS),
            )),
        };
    }
    let Ok(request) = source.request() else {
        return Work::default();
    };
    let recorded = || source.recorded_plan(&request.model).ok();
    match job {
        SourceJob::Verify | SourceJob::Judge => design_work(&request, None),
        SourceJob::Sheet => {
            let render = recorded().map_or(Work::default(), |plan| {
                let (outcomes, curtailed) = walk_parts(&plan, &request.model);
                Work::time(
                    (SHEET_WALKS + SHEET_CURTAILED_WALKS) * outcomes
                        + SHEET_CURTAILED_WALKS * curtailed
                        + SHEET_LAYOUT,
                )
            });
            design_work(&request, None).and(render)
        }
        // The audit re-solves the source before the evaluation.
        SourceJob::Evaluate { points, decided_at } => {
            design_work(&request, None).and(recorded().map_or(Work::default(), |plan| {
                evaluation_work(
                    &plan,
                    &request.model,
                    points.unwrap_or(DEFAULT_POINTS),
                    decided_at,
                )
            }))
        }
    }
}

/// What `job` does, in words, for a refusal.
fn doing(job: SourceJob) -> &'static str {
    match job {
        SourceJob::Verify => "verifying",
        SourceJob::Judge => "judging a lot by",
        SourceJob::Sheet => "printing the sheets of",
        SourceJob::Evaluate { .. } => "evaluating",
    }
}

/// Checks `job` on the one source at `path` against the budget.
///
/// # Errors
/// [`OverBudget`] naming the source, the estimate and what to do.
pub fn check_source(source: &PlanSource, path: &Path, job: SourceJob) -> Result<(), OverBudget> {
    let work = source_work(source, job);
    if work.fits() {
        return Ok(());
    }
    let advice = match job {
        SourceJob::Evaluate { points, decided_at } => {
            evaluate_advice(source, points.unwrap_or(DEFAULT_POINTS), decided_at)
        }
        _ => "re-design it with points further apart, or as a single plan".to_string(),
    };
    work.check(&format!("{} {}", doing(job), path.display()), &advice)
        .map(|_| ())
}

/// How to bring the evaluation of `source`'s plan at `points` qualities
/// within the budget.
fn evaluate_advice(source: &PlanSource, points: usize, decided_at: bool) -> String {
    if source.is_variables() {
        return match source.variables_request() {
            Ok(request) => evaluation_advice_for(most_variables_qualities(request.spec()), false),
            Err(_) => String::new(),
        };
    }
    match source
        .request()
        .ok()
        .and_then(|r| Some((source.recorded_plan(&r.model).ok()?, r.model)))
    {
        Some((plan, model)) => evaluation_advice(&plan, &model, points, decided_at),
        None => String::new(),
    }
}

/// Checks `job` on every source at `paths`, run in parallel, against the
/// budget: the sum of their estimates over the threads that share them
/// (and never less than the heaviest alone); every result is kept until
/// the report is printed, so their memories add. A file that cannot be
/// read or parsed is reported in its place by the batch, and costs
/// nothing here.
///
/// # Errors
/// [`OverBudget`] naming the count, the estimate, and the heaviest source.
pub fn check_batch<'a>(
    paths: impl IntoIterator<Item = &'a Path>,
    job: SourceJob,
) -> Result<(), OverBudget> {
    let paths: Vec<&Path> = paths.into_iter().collect();
    let sources = paths
        .iter()
        .filter_map(|path| Some((*path, PlanSource::load(path).ok()?)));
    check_parsed(paths.len(), sources, job)
}

/// [`check_batch`] of sources already read, so that no file is read
/// twice: one item per source file of the batch, `None` for a file that
/// could not be read (it counts, and costs nothing). A text that does not
/// parse costs nothing either: the batch reports it in its place.
///
/// # Errors
/// As [`check_batch`].
pub fn check_texts<'a>(
    sources: impl IntoIterator<Item = Option<&'a SourceText>>,
    job: SourceJob,
) -> Result<(), OverBudget> {
    let sources: Vec<Option<&SourceText>> = sources.into_iter().collect();
    let parsed = sources
        .iter()
        .flatten()
        .filter_map(|read| Some((read.path.as_path(), read.parse().ok()?)));
    check_parsed(sources.len(), parsed, job)
}

/// The check of [`check_batch`] on the `count` source files of a batch,
/// of which `sources` parsed.
fn check_parsed<'a>(
    count: usize,
    mut sources: impl Iterator<Item = (&'a Path, PlanSource)>,
    job: SourceJob,
) -> Result<(), OverBudget> {
    if count == 1 {
        return match sources.next() {
            Some((path, source)) => check_source(&source, path, job),
            None => Ok(()),
        };
    }
    let mut total = Work::default();
    let mut heaviest: Option<(&Path, f64)> = None;
    for (path, source) in sources {
        let work = source_work(&source, job);
        total = total.and(work);
        if heaviest.is_none_or(|(_, s)| work.seconds > s) {
            heaviest = Some((path, work.seconds));
        }
    }
    let threads = rayon::current_num_threads().clamp(1, count.max(1)) as f64;
    let slowest = heaviest.map_or(0.0, |(_, s)| s);
    let work = Work {
        seconds: (total.seconds / threads).max(slowest),
        bytes: total.bytes,
    };
    let advice = match heaviest {
        Some((path, seconds)) if seconds > TIME_BUDGET => format!(
            "leave out {}, which alone would take about {}, or give fewer sources at a time",
            path.display(),
            duration(seconds)
        ),
        _ => "give fewer sources at a time".to_string(),
    };
    work.check(
        &format!(
            "{} {count} plan source{}",
            doing(job),
            if count == 1 { "" } else { "s" }
        ),
        &advice,
    )
    .map(|_| ())
}
