//! The demo: the whole job on the plan sources of an invented scenario
//! (Tarnwick Pump Works receiving parts from its suppliers; every company,
//! part and person in it is made up).
//!
//! For each embedded source in `plans/`: verify the recorded plan against a
//! fresh solve, evaluate it at the qualities that bracket its risk points,
//! and write the source, its OC table (CSV) and its plan sheet (PDF) into
//! the output folder.

use std::path::{Path, PathBuf};

use crate::atomic::write_atomic;
use crate::error::{Error, SourceError};
use crate::plan::{aoql, default_qualities, evaluate};
use crate::report::{Csv, EvaluationReport, ReportFormat};
use crate::source::{PlanSource, Verdict, verify};

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
];

/// What the demo did with one plan.
#[derive(Clone, Debug, PartialEq)]
pub struct DemoRow {
    /// The source's file name.
    pub file: String,
    /// The source's title.
    pub title: String,
    /// The model name.
    pub model: crate::model::ModelKind,
    /// The recorded plan, as text.
    pub plan: String,
    /// Achieved producer's and consumer's risks.
    pub risks: (f64, f64),
    /// The AOQL, with its quality.
    pub aoql: (f64, f64),
    /// Whether the recorded plan equals a fresh solve.
    pub verified: bool,
    /// The files written.
    pub written: Vec<PathBuf>,
}

/// Runs the demo into `dir` (created if missing).
///
/// # Errors
/// [`Error`] when a demo source does not load (a build defect) or a file
/// cannot be written.
pub fn run_demo(dir: &Path) -> Result<Vec<DemoRow>, Error> {
    std::fs::create_dir_all(dir).map_err(|e| SourceError::Io {
        path: dir.to_path_buf(),
        source: e,
    })?;
    let mut rows = Vec::new();
    for (name, text) in DEMO_PLANS {
        let source = PlanSource::from_yaml(text, Path::new(name))?;
        let request = source.request()?;
        let verified = verify(&source)? == Verdict::Match;
        let recorded = source.recorded_plan(&request.model)?;
        let qualities = default_qualities(&recorded, &request.model, Some(&request.risks));
        let evaluation = evaluate(&recorded, &request.model, &qualities)?;
        let source_path = dir.join(name);
        let csv_path = dir.join(name.replace(".yaml", "-oc.csv"));
        let mut csv = Vec::new();
        Csv.evaluation(&mut csv, &EvaluationReport::from(&evaluation))?;
        let sheet_path = dir.join(name.replace(".yaml", ".pdf"));
        let sheet = crate::sheet::render_sheet(text, &source, name, crate::sheet::Paper::A4)?;
        for (path, bytes) in [
            (&source_path, source.to_yaml().into_bytes()),
            (&csv_path, csv),
            (&sheet_path, sheet.pdf),
        ] {
            write_atomic(path, &bytes).map_err(|e| SourceError::Io {
                path: path.clone(),
                source: e,
            })?;
        }
        let limit = aoql(&recorded, &request.model);
        let risks = source
            .plan
            .as_ref()
            .map_or((f64::NAN, f64::NAN), |p| (p.producer_risk, p.consumer_risk));
        rows.push(DemoRow {
            file: name.to_string(),
            title: source.title.clone(),
            model: request.model.kind(),
            plan: recorded.to_string(),
            risks,
            aoql: (limit.value, limit.quality),
            verified,
            written: vec![source_path, csv_path, sheet_path],
        });
    }
    Ok(rows)
}
