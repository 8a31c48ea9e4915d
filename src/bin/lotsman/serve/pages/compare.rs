//! The comparison screen: two to six plans (plan sources of the
//! workspace, a standard-indexed one by the normal plan of its first
//! class, or plans typed as stages) at one pair of risk points. The form's
//! fields become the arguments of `lotsman compare` and take its path
//! ([`compared`]), so the table, the refusals and the page of charts are
//! the command's; the table downloads as the command's CSV.

use std::path::PathBuf;

use askama::Template;
use axum::extract::rejection::QueryRejection;
use axum::extract::{Query, State};
use axum::response::{IntoResponse, Response};
use lotsman::{
    CompareReport, Error, Format, HistoryFormat, InputError, format_quality, format_significant,
    render_comparison,
};

use crate::cli::compare::CompareArgs;
use crate::cli::groups::{FormatFlag, ModelFlags, OutputFlags};
use crate::cli::values::{ModelArg, ReportFormatArg};
use crate::commands::compare::{Compared, compared};
use crate::out::report_bytes;
use crate::serve::guard::queried_pairs;
use crate::serve::page::{Refusal, download, off_thread, render, shown_outcome};
use crate::serve::state::AppState;
use crate::serve::workspace::Workspace;

/// The fields of the comparison form as sent: the sources ticked (a
/// field each, `source`), the plans typed as stages (one per line of
/// `stages`), the risk points, and the model and lot of the typed plans.
#[derive(Clone, Debug, Default)]
pub struct CompareFields {
    pub sources: Vec<String>,
    pub stages: String,
    pub aql: String,
    pub alpha: String,
    pub rql: String,
    pub beta: String,
    pub model: String,
    pub lot_size: String,
}

impl CompareFields {
    fn of(pairs: Vec<(String, String)>) -> Self {
        let mut f = CompareFields::default();
        for (key, value) in pairs {
            let value = value.trim().to_string();
            match key.as_str() {
                "source" if !value.is_empty() => f.sources.push(value),
                "stages" => f.stages = value,
                "aql" => f.aql = value,
                "alpha" => f.alpha = value,
                "rql" => f.rql = value,
                "beta" => f.beta = value,
                "model" => f.model = value,
                "lot_size" => f.lot_size = value,
                _ => {}
            }
        }
        f
    }

    /// The typed plans, one per line, blank lines skipped.
    fn typed(&self) -> Vec<String> {
        self.stages
            .lines()
            .map(str::trim)
            .filter(|l| !l.is_empty())
            .map(str::to_string)
            .collect()
    }

    /// Whether a comparison was asked for (a plan ticked or typed).
    fn asked(&self) -> bool {
        !self.sources.is_empty() || !self.typed().is_empty()
    }

    /// The arguments `lotsman compare` would get from these fields.
    fn args(&self) -> Result<CompareArgs, InputError> {
        let given = |t: &str| Some(t.to_string()).filter(|t| !t.is_empty());
        let model = match self.model.as_str() {
            "" => None,
            text => Some(
                <ModelArg as clap::ValueEnum>::from_str(text, true).map_err(|_| {
                    InputError::unparsable("--model", text, "binomial, hypergeometric or poisson")
                })?,
            ),
        };
        // The points come from the first source when the AQL and RQL are
        // left empty, as on the command line; half given is refused there.
        Ok(CompareArgs {
            sources: Vec::new(),
            stage: self.typed(),
            model: ModelFlags {
                model,
                lot_size: given(&self.lot_size),
            },
            aql: given(&self.aql),
            rql: given(&self.rql),
            alpha: given(&self.alpha),
            beta: given(&self.beta),
            accept_recorded: false,
            output: OutputFlags {
                output: None,
                force: false,
            },
            report: FormatFlag {
                format: ReportFormatArg::Table,
            },
        })
    }

    /// The query string that asks for the same comparison, for the CSV
    /// link.
    fn query(&self) -> String {
        let mut pairs: Vec<(&str, &str)> = self
            .sources
            .iter()
            .map(|s| ("source", s.as_str()))
            .collect();
        for (key, value) in [
            ("stages", &self.stages),
            ("aql", &self.aql),
            ("alpha", &self.alpha),
            ("rql", &self.rql),
            ("beta", &self.beta),
            ("model", &self.model),
            ("lot_size", &self.lot_size),
        ] {
            if !value.is_empty() {
                pairs.push((key, value));
            }
        }
        serde_urlencoded::to_string(pairs).unwrap_or_default()
    }
}

/// The comparison the fields ask for, with the sources found in the
/// workspace; half given risk points are refused as the command does.
fn comparison(workspace: &Workspace, fields: &CompareFields) -> Result<Compared, Error> {
    if fields.aql.is_empty() != fields.rql.is_empty() {
        return Err(InputError::Inconsistent(
            "give both the AQL and the RQL, or neither (the points of the first plan source are then used)".to_string(),
        )
        .into());
    }
    let args = fields.args()?;
    let paths: Vec<PathBuf> = fields
        .sources
        .iter()
        .map(|name| workspace.file(name))
        .collect::<Result<_, _>>()?;
    let refs: Vec<&std::path::Path> = paths.iter().map(PathBuf::as_path).collect();
    let mut made = compared(&args, &refs)?;
    // The sources come first, in the order ticked: each is labelled by
    // its name in the workspace, as the page lists it, not by the full
    // path the server reads it from.
    for (i, name) in fields.sources.iter().enumerate() {
        made.comparison.rows[i].compared.label = name.clone();
        made.report.plans[i].label = name.clone();
    }
    made.report.points_from = workspace.relative_words(&made.report.points_from);
    Ok(made)
}

/// One plan's row as the page lists it.
struct Row {
    label: String,
    model: String,
    plan: String,
    pa_aql: String,
    producer: String,
    consumer: String,
    aoql: String,
    asn_aql: String,
    asn_rql: String,
    meets: String,
}

/// What the page shows of a comparison.
struct Shown {
    heading: String,
    /// The one model and lot of every plan; `None` when they differ, and
    /// each row says its own.
    model: Option<String>,
    rows: Vec<Row>,
    page: String,
    csv_query: String,
}

impl Shown {
    fn of(made: &Compared, fields: &CompareFields) -> Result<Self, Error> {
        let report: &CompareReport = &made.report;
        let per_unit = made.comparison.per_unit;
        let rows = report
            .plans
            .iter()
            .map(|p| Row {
                label: match &p.note {
                    Some(note) => format!("{} ({note})", p.label),
                    None => p.label.clone(),
                },
                model: p.model_and_lot(),
                plan: p
                    .stages
                    .iter()
                    .map(ToString::to_string)
                    .collect::<Vec<_>>()
                    .join(" + "),
                pa_aql: format_significant(p.pa_at_aql, 4),
                producer: format_significant(p.producer_risk, 4),
                consumer: format_significant(p.consumer_risk, 4),
                aoql: format!(
                    "{} at {}",
                    format_quality(p.aoql, per_unit),
                    format_quality(p.aoql_quality, per_unit)
                ),
                asn_aql: format_significant(p.asn_at_aql, 4),
                asn_rql: format_significant(p.asn_at_rql, 4),
                meets: match (p.meets_alpha, p.meets_beta) {
                    (true, true) => "both".to_string(),
                    (true, false) => "alpha only".to_string(),
                    (false, true) => "beta only".to_string(),
                    (false, false) => "neither".to_string(),
                },
            })
            .collect();
        let bytes = render_comparison(&made.comparison, report, &made.title, HistoryFormat::Svg)?;
        let svg = String::from_utf8_lossy(&bytes);
        // Inline in HTML, the SVG needs no XML declaration.
        let page = svg[svg.find("<svg").unwrap_or(0)..].to_string();
        Ok(Shown {
            heading: made.title.clone(),
            model: report.shared_model(),
            rows,
            page,
            csv_query: fields.query(),
        })
    }
}

/// A plan source of the workspace, for the ticks.
struct Choice {
    value: String,
    ticked: bool,
}

#[derive(Template)]
#[template(path = "serve/compare.html")]
struct ComparePage {
    title: &'static str,
    f: CompareFields,
    sources: Vec<Choice>,
    error: Option<String>,
    result: Option<Shown>,
}

/// `GET /compare?source=A.yaml&source=B.yaml&stages=...`.
pub async fn show(
    State(state): State<AppState>,
    query: Result<Query<Vec<(String, String)>>, QueryRejection>,
) -> Response {
    let pairs = match queried_pairs(query) {
        Ok(pairs) => pairs,
        Err(r) => return r.into_response(),
    };
    let fields = CompareFields::of(pairs);
    let outcome = if fields.asked() {
        let (worker, asked) = (state.clone(), fields.clone());
        Some(
            off_thread("the comparison", move || {
                let made = comparison(worker.workspace(), &asked)?;
                Shown::of(&made, &asked)
            })
            .await,
        )
    } else {
        None
    };
    let (status, result, error) = shown_outcome(outcome, state.workspace());
    let page = ComparePage {
        title: "Compare plans",
        sources: state
            .workspace()
            .files(&["yaml", "yml"])
            .into_iter()
            .map(|value| Choice {
                ticked: fields.sources.contains(&value),
                value,
            })
            .collect(),
        f: fields,
        error,
        result,
    };
    render(status, &page)
}

/// `GET /compare.csv?...`: the table of the same comparison as `lotsman
/// compare --format csv` prints it, as a download.
pub async fn csv(
    State(state): State<AppState>,
    query: Result<Query<Vec<(String, String)>>, QueryRejection>,
) -> Response {
    let pairs = match queried_pairs(query) {
        Ok(pairs) => pairs,
        Err(r) => return r.into_response(),
    };
    let fields = CompareFields::of(pairs);
    if !fields.asked() {
        return Refusal::bad("tick or type two to six plans on the comparison page first")
            .into_response();
    }
    let worker = state.clone();
    let made = off_thread("the comparison", move || {
        comparison(worker.workspace(), &fields)
            .and_then(|made| report_bytes(&made.report, Format::Csv))
    })
    .await;
    match made {
        Ok(bytes) => download("text/csv; charset=utf-8", "comparison.csv", bytes),
        Err(r) => r.relative_to(state.workspace()).into_response(),
    }
}
