//! A plan source's OC chart on its own, as its sheet draws it, with the
//! two points it is held to and the risks its recorded plan runs there:
//! for a screen that lists plan sources beside their verification.
//!
//! The chart and the risks come from the sheet's own facts (an
//! attributes, minimum-inspection or variables plan from
//! [`SheetFacts`], a standard-indexed source from its
//! [`StandardFacts`]), so the page shows what the printed sheet shows.

use std::path::Path;

use super::agreement::Agreement;
use super::canvas::Canvas;
use super::chart::oc::oc_chart;
use super::chart::standalone::check_size;
use super::chart::standard_oc::standard_oc_chart;
use super::chart::subject::Subject;
use super::chart::variables_oc::{VariablesSubject, variables_oc_chart};
use super::fonts::Fonts;
use super::geometry::Rect;
use super::sheet::SheetFacts;
use super::standard_source::standard_source_facts;
use super::svg::SvgPage;
use crate::design::Protection;
use crate::input::InputError;
use crate::numeric::Short;
use crate::plan::acceptance_probability;
use crate::source::{Error, PlanSource};

/// One point a plan is held to, and the risk its recorded plan runs
/// there.
#[derive(Clone, Debug, PartialEq)]
pub struct RiskAt {
    /// The point, in words: `Producer (AQL)`, `Consumer (RQL)`,
    /// `Process average`, `LTPD`.
    pub point: String,
    /// Its quality: a fraction nonconforming, or nonconformities per unit.
    pub quality: f64,
    /// The risk agreed there, in words (`alpha 0.05`), when the source
    /// agrees one.
    pub agreed: Option<String>,
    /// The risk the recorded plan runs there: `1 - Pa` at the producer's
    /// point (a lot of that quality rejected), `Pa` at the consumer's (a
    /// lot of that quality accepted).
    pub achieved: f64,
}

/// What [`source_oc_svg`] draws and computes.
#[derive(Clone, Debug, PartialEq)]
pub struct SourceOc {
    /// The OC chart, a standalone SVG document.
    pub svg: String,
    /// Whether qualities are nonconformities per unit.
    pub per_unit: bool,
    /// The two points, in the order producer, consumer.
    pub points: Vec<RiskAt>,
    /// For a standard-indexed source, the class charted (the first one
    /// sampled), as the sheet charts it.
    pub class: Option<String>,
}

/// The OC chart of the plan `source` records (parsed from `text`, read
/// at `path`), as its sheet draws it, as a standalone SVG document
/// `size` = (width, height) mm large; with the two points the plan is
/// held to and the risks it runs there. A standard-indexed source gives
/// the curves of its first class sampled (normal, tightened, reduced) and
/// the true risks of that class's plan in force; without an agreed RQL,
/// its second point is where the plan accepts with probability 0.10.
///
/// This draws the recorded plan as it is: it does not re-solve the
/// source ([`verify_text`](crate::verify_text) does).
///
/// # Errors
/// [`Error`] when the source records no plan, its plan is invalid, a
/// size is out of range or the chart cannot be laid out at that size;
/// [`InputError::Inconsistent`] for a standard-indexed source whose
/// every class inspects every unit (there is no curve).
///
/// # Example
/// ```
/// use lotsman::{PlanSource, source_oc_svg};
/// let path = std::path::Path::new("plans/tpw-cover-fit.yaml");
/// let text = std::fs::read_to_string(path).unwrap();
/// let source = PlanSource::from_yaml(&text, path).unwrap();
/// let oc = source_oc_svg(&source, &text, path, (160.0, 100.0)).unwrap();
/// assert!(oc.svg.contains("<svg"));
/// assert_eq!(oc.points[0].point, "Producer (AQL)");
/// // n = 62, c = 2 from a lot of 400 at 1% (4 units) and 8% (32 units);
/// // scipy.stats: 1 - hypergeom.cdf(2, 400, 4, 62) = 0.0126968,
/// // hypergeom.cdf(2, 400, 32, 62) = 0.0978949.
/// assert!((oc.points[0].achieved - 0.0126968).abs() < 1e-6);
/// assert!((oc.points[1].achieved - 0.0978949).abs() < 1e-6);
/// ```
pub fn source_oc_svg(
    source: &PlanSource,
    text: &str,
    path: &Path,
    size: (f64, f64),
) -> Result<SourceOc, Error> {
    check_size("OC chart", size)?;
    let (w, h) = size;
    let area = Rect::new(0.0, 0.0, w, h);
    let fonts = Fonts::embedded()?;
    let mut page = SvgPage::new(size);
    let mut c = Canvas::new(&mut page, &fonts);
    let name = path.to_string_lossy();
    let (per_unit, points, class) = if source.is_standard() {
        let facts = standard_source_facts(source, text, &name)?;
        let k = facts.chart_class().ok_or_else(|| {
            InputError::Inconsistent(
                "every class of this source inspects every unit (100 percent inspection): there is no OC curve to draw".to_string(),
            )
        })?;
        standard_oc_chart(&mut c, &facts, k, area)?;
        let cl = &facts.classes[k];
        let mut points = Vec::new();
        if let Some(r) = &cl.risks {
            points.push(RiskAt {
                point: "Producer (AQL)".to_string(),
                quality: r.aql_quality,
                agreed: None,
                achieved: r.producer_risk,
            });
            points.push(match &r.consumer {
                Some(at) => RiskAt {
                    point: "Consumer (RQL)".to_string(),
                    quality: at.point.rql,
                    agreed: Some(format!("beta {}", Short(at.point.beta))),
                    achieved: at.consumer_risk,
                },
                None => RiskAt {
                    point: "Pa = 0.10 (no RQL agreed)".to_string(),
                    quality: r.quality_at_pa_10,
                    agreed: None,
                    achieved: 0.10,
                },
            });
        }
        (cl.per_unit(), points, Some(cl.name.clone()))
    } else {
        let facts = SheetFacts::gather(source, text, &name, None)?;
        match &facts {
            SheetFacts::Attributes(f) => {
                let subject = Subject {
                    plan: &f.plan,
                    model: &f.model,
                    agreement: &f.common.agreement,
                    per_unit: f.common.per_unit,
                };
                let curves = subject.curves()?;
                oc_chart(&mut c, &subject, &curves, area);
            }
            SheetFacts::Variables(f) => {
                let subject = VariablesSubject {
                    plan: &f.plan,
                    model: &f.model,
                    attributes: f.attributes.as_ref(),
                    agreement: &f.common.agreement,
                    per_unit: f.common.per_unit,
                };
                variables_oc_chart(&mut c, &subject, area)?;
            }
        }
        let common = facts.common();
        (common.per_unit, agreed_points(&common.agreement), None)
    };
    let laid = c.finish(w, h);
    if !laid.is_clean() {
        let problems: Vec<String> = laid.overflows.into_iter().chain(laid.faults).collect();
        return Err(InputError::Inconsistent(format!(
            "the OC chart cannot be drawn at {w} x {h} mm: {}; give it more room",
            problems.join("; ")
        ))
        .into());
    }
    Ok(SourceOc {
        svg: page.finish("OC chart"),
        per_unit,
        points,
        class,
    })
}

/// The two points of an agreement, with what the plan runs there.
fn agreed_points(agreement: &Agreement) -> Vec<RiskAt> {
    match agreement {
        Agreement::Points { risks, achieved } => {
            let (p, c) = (risks.producer(), risks.consumer());
            vec![
                RiskAt {
                    point: "Producer (AQL)".to_string(),
                    quality: p.quality,
                    agreed: Some(format!("alpha {}", Short(p.risk))),
                    achieved: achieved.0,
                },
                RiskAt {
                    point: "Consumer (RQL)".to_string(),
                    quality: c.quality,
                    agreed: Some(format!("beta {}", Short(c.risk))),
                    achieved: achieved.1,
                },
            ]
        }
        Agreement::Rectifying { request, figures } => {
            let (average, ltpd) = agreement.qualities();
            let agreed = match request.protection() {
                Protection::Ltpd(point) => Some(format!("beta {}", Short(point.risk))),
                Protection::Aoql(_) => None,
            };
            vec![
                RiskAt {
                    point: "Process average".to_string(),
                    quality: average,
                    agreed: None,
                    achieved: 1.0 - figures.pa,
                },
                RiskAt {
                    point: "LTPD".to_string(),
                    quality: ltpd,
                    agreed,
                    achieved: acceptance_probability(&figures.plan, request.model(), ltpd),
                },
            ]
        }
    }
}
