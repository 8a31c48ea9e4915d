//! A chart of an attributes plan on its own, as a standalone SVG
//! document: the OC, AOQ, ASN or decision chart the sheet prints, drawn
//! by the same code through the SVG backend, for a web page to inline.

use super::aoq::aoq_chart;
use super::asn::asn_chart;
use super::decision::decision_chart;
use super::oc::oc_chart;
use super::subject::Subject;
use crate::input::InputError;
use crate::model::RiskPair;
use crate::model::{Model, ModelKind};
use crate::plan::StagedPlan;
use crate::print::agreement::Agreement;
use crate::print::canvas::Canvas;
use crate::print::fonts::Fonts;
use crate::print::geometry::Rect;
use crate::print::page::MIN_CHART_H;
use crate::print::svg::SvgPage;
use crate::source::Error;

/// The least width of a chart, mm: the sheet's narrowest chart (an
/// item-by-item plan's OC and ASN charts on Letter) is 52 mm wide.
pub const MIN_CHART_W: f64 = 50.0;

/// The largest width or height of a chart, mm.
pub const MAX_CHART_SIZE: f64 = 1000.0;

/// The charts of an attributes plan.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum ChartKind {
    /// The operating characteristic: the probability of acceptance
    /// against lot quality, with the risk points and the indifference
    /// quality marked.
    Oc,
    /// The average outgoing quality under rectifying inspection against
    /// lot quality, with the AOQL marked.
    Aoq,
    /// The average sample number against lot quality, with the single
    /// plan's sample size for the same points as a reference.
    Asn,
    /// The decision chart of an item-by-item (sequential) plan: units
    /// inspected across, running count up, the accept, go-on and reject
    /// zones.
    Decision,
}

impl ChartKind {
    /// The chart's name, as messages give it.
    pub fn name(self) -> &'static str {
        match self {
            ChartKind::Oc => "OC chart",
            ChartKind::Aoq => "AOQ chart",
            ChartKind::Asn => "ASN chart",
            ChartKind::Decision => "decision chart",
        }
    }
}

/// Refuses a chart `size` = (width, height) mm that is not from
/// [`MIN_CHART_W`] (width) or [`MIN_CHART_H`] (height) to
/// [`MAX_CHART_SIZE`], naming the chart `name`.
pub(crate) fn check_size(name: &str, size: (f64, f64)) -> Result<(), InputError> {
    let (w, h) = size;
    for (what, v, least) in [("width", w, MIN_CHART_W), ("height", h, MIN_CHART_H)] {
        if !(least..=MAX_CHART_SIZE).contains(&v) {
            return Err(InputError::out_of_range(
                &format!("{name} {what} (mm)"),
                v,
                &format!("{least} to {MAX_CHART_SIZE}"),
            ));
        }
    }
    Ok(())
}

/// The `kind` chart of `plan` under `model`, agreed on the risk points
/// `risks`, as a standalone SVG document `size` = (width, height) mm
/// large: the chart the plan's sheet prints, drawn by the same code, with
/// the points marked at the probability of acceptance the plan achieves
/// there. Text is set in DejaVu Sans (the sheet's face; a viewer without
/// it substitutes a sans-serif face).
///
/// # Errors
/// [`InputError`] when a size is not a number from 50 to 1000 mm, when
/// a decision chart is asked of a plan that is not item by item, or when
/// the chart cannot be laid out at that size (a label with no room, a
/// title wider than the chart); a numerical error when a point of a
/// curve is out of its range.
///
/// # Example
/// ```
/// use lotsman::{ChartKind, Model, ModelKind, RiskPair, RiskPoint, chart_svg, design_single};
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// let risks = RiskPair::new(
///     RiskPoint { quality: 0.01, risk: 0.05 },
///     RiskPoint { quality: 0.06, risk: 0.10 },
///     &model,
/// ).unwrap();
/// let plan = design_single(&model, &risks).unwrap().plan;
/// let svg = chart_svg(ChartKind::Oc, &plan, &model, &risks, (120.0, 80.0)).unwrap();
/// assert!(svg.contains("<svg") && svg.contains("Probability of acceptance"));
/// ```
pub fn chart_svg(
    kind: ChartKind,
    plan: &StagedPlan,
    model: &Model,
    risks: &RiskPair,
    size: (f64, f64),
) -> Result<String, Error> {
    check_size(kind.name(), size)?;
    let (w, h) = size;
    let agreement = Agreement::points(plan, model, *risks);
    let subject = Subject {
        plan,
        model,
        agreement: &agreement,
        per_unit: model.kind() == ModelKind::Poisson,
    };
    let fonts = Fonts::embedded()?;
    let mut page = SvgPage::new(size);
    let mut c = Canvas::new(&mut page, &fonts);
    let area = Rect::new(0.0, 0.0, w, h);
    match kind {
        ChartKind::Decision => {
            let lines = plan.sequential_lines().ok_or_else(|| {
                let stages = plan.stages().len();
                let this = match stages {
                    1 => "a single plan".to_string(),
                    k => format!("a plan of {k} stages"),
                };
                InputError::Inconsistent(format!(
                    "a decision chart is drawn for an item-by-item (sequential) plan, and this is {this}; its OC, AOQ and ASN charts can be drawn"
                ))
            })?;
            decision_chart(&mut c, lines, subject.per_unit, area);
        }
        _ => {
            let curves = subject.curves()?;
            let draw = match kind {
                ChartKind::Aoq => aoq_chart,
                ChartKind::Asn => asn_chart,
                _ => oc_chart,
            };
            draw(&mut c, &subject, &curves, area);
        }
    }
    let laid = c.finish(w, h);
    if !laid.is_clean() {
        let problems: Vec<String> = laid.overflows.into_iter().chain(laid.faults).collect();
        return Err(InputError::Inconsistent(format!(
            "the {} cannot be drawn at {w} x {h} mm: {}; give it more room",
            kind.name(),
            problems.join("; ")
        ))
        .into());
    }
    Ok(page.finish(kind.name()))
}
