//! The design and negotiation screen: the two risk points, the model, the
//! scheme, a cost of inspection and a process quality in a form; the plan,
//! its risks, its OC chart, the inspection at the process quality, the
//! nearby plans, what one step of each input does, the trade-off map
//! around the points ([`super::design_map`], loaded on its own) and the
//! report of `lotsman design` below it. The form's fields become the
//! arguments of `lotsman design` and take the same path to a plan
//! ([`from_flags`]), so the page parses, refuses and answers as the
//! command does.

use std::collections::HashMap;

use askama::Template;
use axum::Extension;
use axum::extract::Query;
use axum::extract::rejection::QueryRejection;
use axum::http::StatusCode;
use axum::response::{IntoResponse, Response};
use clap::ValueEnum;
use lotsman::{
    ChartKind, Format, InputError, ModelKind, Short, bare_fraction_note, chart_svg, format_quality,
    format_significant,
};

use crate::cli::design::{
    DescriptionFlags, DesignArgs, DesignFormat, SchemeArg, StepFlags, VariablesFlags,
};
use crate::cli::groups::{FormatFlag, ModelFlags, OutputFlags, RiskFlags};
use crate::cli::values::ModelArg;
use crate::commands::design::{Designed, from_flags};
use crate::out::report_bytes;
use crate::serve::guard::queried;
use crate::serve::page::{Refusal, render};
use crate::serve::session::Session;

use super::design_map::MAP_SIZE;
use super::negotiate::{AtProcess, Tables};

/// The size of the OC chart, mm (it scales to the page's width).
const CHART_SIZE: (f64, f64) = (160.0, 100.0);

/// The fields of the design form as typed.
#[derive(Clone, Debug)]
pub struct DesignFields {
    pub aql: String,
    pub alpha: String,
    pub rql: String,
    pub beta: String,
    /// Empty for the command's default (binomial, or hypergeometric with
    /// a lot size).
    pub model: String,
    pub lot_size: String,
    pub scheme: String,
    /// The cost of inspecting one unit, empty for none.
    pub cost: String,
    /// The process quality at which the inspection is costed, empty for
    /// the AQL.
    pub process: String,
    /// The number of AQL and of RQL values of the trade-off map.
    pub map: String,
}

impl DesignFields {
    /// The fields of a query or a form; a field left out or left empty
    /// takes the command's default.
    pub fn of(fields: &HashMap<String, String>) -> Self {
        let text = |key: &str, default: &str| {
            fields
                .get(key)
                .map(|v| v.trim())
                .filter(|v| !v.is_empty())
                .unwrap_or(default)
                .to_string()
        };
        DesignFields {
            aql: text("aql", ""),
            alpha: text("alpha", "0.05"),
            rql: text("rql", ""),
            beta: text("beta", "0.10"),
            model: text("model", ""),
            lot_size: text("lot_size", ""),
            scheme: text("scheme", "single"),
            cost: text("cost", ""),
            process: text("process", ""),
            map: text("map", MAP_SIZE),
        }
    }

    /// The fields as a query string, for a link to the same design (or
    /// its map): each field given, percent-encoded.
    pub fn query(&self) -> String {
        let encode = |text: &str| {
            text.bytes()
                .map(|b| match b {
                    b'A'..=b'Z' | b'a'..=b'z' | b'0'..=b'9' | b'-' | b'.' | b'_' | b'~' => {
                        (b as char).to_string()
                    }
                    _ => format!("%{b:02X}"),
                })
                .collect::<String>()
        };
        [
            ("aql", &self.aql),
            ("rql", &self.rql),
            ("alpha", &self.alpha),
            ("beta", &self.beta),
            ("model", &self.model),
            ("lot_size", &self.lot_size),
            ("scheme", &self.scheme),
            ("cost", &self.cost),
            ("process", &self.process),
            ("map", &self.map),
        ]
        .iter()
        .filter(|(_, v)| !v.is_empty())
        .map(|(k, v)| format!("{k}={}", encode(v)))
        .collect::<Vec<_>>()
        .join("&")
    }

    /// Whether a plan was asked for (an AQL or an RQL given), not only
    /// the empty form.
    pub fn asked(&self) -> bool {
        !self.aql.is_empty() || !self.rql.is_empty()
    }

    /// The arguments `lotsman design` would get from these fields, as
    /// its flags: `--aql`, `--rql`, `--alpha`, `--beta`, `--model`,
    /// `--lot-size`, `--scheme`, with the title and document fields
    /// given.
    pub fn args(
        &self,
        title: Option<String>,
        description: DescriptionFlags,
    ) -> Result<DesignArgs, InputError> {
        let model = match self.model.as_str() {
            "" => None,
            text => Some(ModelArg::from_str(text, true).map_err(|_| {
                InputError::unparsable("--model", text, "binomial, hypergeometric or poisson")
            })?),
        };
        let scheme = SchemeArg::from_str(&self.scheme, true).map_err(|_| {
            InputError::unparsable(
                "--scheme",
                &self.scheme,
                "single, double, multiple or sequential",
            )
        })?;
        if scheme == SchemeArg::Variables {
            return Err(InputError::Inconsistent(
                "this page designs attributes plans (single, double, multiple, sequential); design a variables plan with: lotsman design --scheme variables".to_string(),
            ));
        }
        let given = |t: &str| Some(t.to_string()).filter(|t| !t.is_empty());
        Ok(DesignArgs {
            source: None,
            risks: RiskFlags {
                aql: given(&self.aql),
                alpha: self.alpha.clone(),
                rql: given(&self.rql),
                beta: self.beta.clone(),
            },
            model: ModelFlags {
                model,
                lot_size: given(&self.lot_size),
            },
            scheme,
            criterion: None,
            second_ratio: None,
            stage_count: None,
            variables: VariablesFlags {
                sigma: None,
                limit: None,
                sigma_value: None,
                lower: None,
                upper: None,
                unit: None,
            },
            title,
            description,
            steps: StepFlags {
                step_aql: None,
                step_alpha: None,
                step_rql: None,
                step_beta: None,
            },
            format: FormatFlag {
                format: DesignFormat::Table,
            },
            output: OutputFlags {
                output: None,
                force: false,
            },
            in_place: false,
        })
    }

    /// The notes `lotsman design` gives on stderr for a quality typed
    /// as a bare fraction where a percent was likely meant.
    fn notes(&self) -> Vec<String> {
        if self.model.eq_ignore_ascii_case("poisson") {
            return Vec::new();
        }
        [("--aql", &self.aql), ("--rql", &self.rql)]
            .into_iter()
            .filter_map(|(flag, text)| bare_fraction_note(flag, text))
            .collect()
    }
}

/// The plan designed from `fields`, titled and described as given: the
/// path of `lotsman design`, run off the server's request threads.
pub async fn design(
    fields: DesignFields,
    title: Option<String>,
    description: DescriptionFlags,
) -> Result<Designed, Refusal> {
    let args = fields.args(title, description)?;
    tokio::task::spawn_blocking(move || from_flags(&args))
        .await
        .map_err(|_| Refusal::failed("the design stopped before it finished; send the form again"))?
        .map_err(Refusal::from)
}

/// One stage of the plan as the page lists it.
struct StageRow {
    stage: usize,
    sample: u64,
    cumulative: u64,
    accept: String,
    reject: u64,
}

/// One risk point as the page lists it.
struct PointRow {
    point: &'static str,
    quality: String,
    agreed: String,
    achieved: String,
}

/// What the page shows of a designed plan.
struct Shown {
    headline: String,
    described: String,
    stages: Vec<StageRow>,
    points: Vec<PointRow>,
    chart: String,
    at_process: Option<AtProcess>,
    tables: Tables,
    map_query: String,
    report: String,
}

/// An SVG document as an HTML page inlines it: without the XML
/// declaration.
pub fn inline_svg(svg: String) -> String {
    match svg.find("<svg") {
        Some(at) => svg[at..].to_string(),
        None => svg,
    }
}

/// The plan in one line, as the report's first line gives it: `n = 110,
/// c = 3 (reject at 4)` for a single plan, the number of stages for the
/// others.
pub fn headline(designed: &Designed) -> String {
    let plan = &designed.solution.design.plan;
    match plan.as_single() {
        Some((n, c)) => format!("n = {n}, c = {c} (reject at {})", c + 1),
        None => format!("{} stages (cumulative counts)", plan.stages().len()),
    }
}

impl Shown {
    fn of(designed: &Designed, fields: &DesignFields) -> Result<Self, Refusal> {
        let (request, design) = (&designed.request, &designed.solution.design);
        let mut previous = 0;
        let stages = design
            .plan
            .stages()
            .iter()
            .enumerate()
            .map(|(i, s)| {
                let row = StageRow {
                    stage: i + 1,
                    sample: s.n - previous,
                    cumulative: s.n,
                    accept: s.accept.map_or("-".to_string(), |a| a.to_string()),
                    reject: s.reject,
                };
                previous = s.n;
                row
            })
            .collect();
        let per_unit = request.model.kind() == ModelKind::Poisson;
        let (p, c) = (request.risks.producer(), request.risks.consumer());
        let points = vec![
            PointRow {
                point: "Producer (AQL)",
                quality: format_quality(p.quality, per_unit),
                agreed: format!("alpha {}", Short(p.risk)),
                achieved: format_significant(design.producer_risk, 4),
            },
            PointRow {
                point: "Consumer (RQL)",
                quality: format_quality(c.quality, per_unit),
                agreed: format!("beta {}", Short(c.risk)),
                achieved: format_significant(design.consumer_risk, 4),
            },
        ];
        let svg = chart_svg(
            ChartKind::Oc,
            &design.plan,
            &request.model,
            &request.risks,
            CHART_SIZE,
        )
        .map_err(Refusal::from)?;
        let report = report_bytes(&designed.report, Format::Table).map_err(Refusal::from)?;
        Ok(Shown {
            headline: headline(designed),
            described: format!("{} plan, {}", request.scheme, request.model.described()),
            stages,
            points,
            chart: inline_svg(svg),
            at_process: AtProcess::of(fields, designed)?,
            tables: Tables::of(&designed.report),
            map_query: fields.query(),
            report: String::from_utf8_lossy(&report).into_owned(),
        })
    }
}

/// A choice of a select field.
struct Choice {
    value: &'static str,
    label: &'static str,
    selected: bool,
}

fn choices(options: &[(&'static str, &'static str)], chosen: &str) -> Vec<Choice> {
    options
        .iter()
        .map(|&(value, label)| Choice {
            value,
            label,
            selected: value.eq_ignore_ascii_case(chosen),
        })
        .collect()
}

#[derive(Template)]
#[template(path = "serve/design.html")]
struct DesignPage {
    title: &'static str,
    f: DesignFields,
    models: Vec<Choice>,
    schemes: Vec<Choice>,
    notes: Vec<String>,
    error: Option<String>,
    result: Option<Shown>,
    csrf: String,
}

/// `GET /design`: the form, and the plan when the risk points are given.
pub async fn show(
    Extension(session): Extension<Session>,
    query: Result<Query<HashMap<String, String>>, QueryRejection>,
) -> Response {
    let fields = match queried(query) {
        Ok(f) => DesignFields::of(&f),
        Err(r) => return r.into_response(),
    };
    let outcome = if fields.asked() {
        Some(
            design(fields.clone(), None, DescriptionFlags::default())
                .await
                .and_then(|d| Shown::of(&d, &fields)),
        )
    } else {
        None
    };
    let (status, result, error) = match outcome {
        None => (StatusCode::OK, None, None),
        Some(Ok(shown)) => (StatusCode::OK, Some(shown), None),
        Some(Err(r)) => (r.status(), None, Some(r.message().to_string())),
    };
    let page = DesignPage {
        title: "Design and negotiate a plan",
        models: choices(
            &[
                ("", "binomial (hypergeometric with a lot size)"),
                ("binomial", "binomial"),
                ("hypergeometric", "hypergeometric"),
                ("poisson", "Poisson (nonconformities per unit)"),
            ],
            &fields.model,
        ),
        schemes: choices(
            &[
                ("single", "single"),
                ("double", "double"),
                ("multiple", "multiple"),
                ("sequential", "sequential (item by item)"),
            ],
            &fields.scheme,
        ),
        notes: fields.notes(),
        f: fields,
        error,
        result,
        csrf: session.csrf,
    };
    render(status, &page)
}
