//! The design and negotiation screen: the two risk points, the model, the
//! scheme, a cost of inspection and a process quality in a form; the plan,
//! its risks, its OC chart, the inspection at the process quality, the
//! nearby plans, what one step of each input does, the trade-off map
//! around the points ([`super::design_map`], loaded on its own) and the
//! report of `lotsman design` below it. The form's fields
//! ([`super::design_form`]) become the arguments of `lotsman design` and
//! take the same path to a plan, so the page parses, refuses and answers
//! as the command does.

use std::collections::HashMap;

use askama::Template;
use axum::Extension;
use axum::extract::Query;
use axum::extract::rejection::QueryRejection;
use axum::http::StatusCode;
use axum::response::{IntoResponse, Response};
use lotsman::{ChartKind, Format, ModelKind, Short, chart_svg, format_quality, format_significant};

use crate::cli::design::DescriptionFlags;
use crate::commands::design::Designed;
use crate::out::report_bytes;
use crate::serve::guard::queried;
use crate::serve::page::{Refusal, render};
use crate::serve::session::Session;

use super::design_form::{DesignFields, design, inline_svg};
use super::negotiate::{AtProcess, Tables};

/// The size of the OC chart, mm (it scales to the page's width).
const CHART_SIZE: (f64, f64) = (160.0, 100.0);

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
    /// Today's date (UTC), the save form's date unless changed; empty
    /// when the clock cannot say.
    today: String,
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
        today: lotsman::LotDate::today()
            .map(|d| d.to_string())
            .unwrap_or_default(),
    };
    render(status, &page)
}
