//! The OC chart of a standard-indexed plan: for one class, the curves of
//! its table plans at normal, tightened and reduced inspection, and the
//! long-run curve of the whole switching scheme when it has been
//! computed, with the AQL as a dashed guide and a legend naming each
//! curve's plan.

use super::axes::{Axes, frame};
use super::legend::{LegendEntry, legend};
use super::plot::Plot;
use super::scale::{plain_tick, quality_tick};
use crate::numeric::{Quantity, Short, check};
use crate::plan::measures;
use crate::print::canvas::Canvas;
use crate::print::draw::{Colour, Face, grey, rgb};
use crate::print::geometry::Rect;
use crate::print::palette::{ACCEPT, PLAN, REJECT};
use crate::print::standard_facts::{SchemeCurve, StandardFacts};
use crate::print::wording::sheet;
use crate::print::wording::standard as words;
use crate::source::Error;
use crate::standard::Severity;

/// Points on each plan's curve.
const CURVE_POINTS: usize = 240;

/// How a severity's curve is drawn: colour and dash.
fn style(s: Severity) -> (Colour, Option<f32>) {
    match s {
        Severity::Normal => (PLAN, None),
        Severity::Tightened => (REJECT, Some(2.4)),
        Severity::Reduced => (ACCEPT, Some(0.9)),
    }
}

/// The scheme's curve: colour and width.
const SCHEME_COLOUR: Colour = rgb(0.42, 0.16, 0.5);
const SCHEME_WIDTH: f64 = 1.7;

/// The OC chart of the class `k` of `f` in `area`.
///
/// # Errors
/// [`Error`] when a plan does not fit the class's model, or a point of a
/// curve (the scheme's included) is out of its range: it stops the sheet
/// rather than bend a curve.
pub fn standard_oc_chart(
    c: &mut Canvas,
    f: &StandardFacts,
    k: usize,
    area: Rect,
) -> Result<(), Error> {
    let cl = &f.classes[k];
    let model = cl.model;
    let plans = f.staged(k)?;
    let aql = cl.aql.quality();
    let x_max = f.chart_reach(k)?;
    let mut curves = Vec::new();
    for (s, _, staged) in &plans {
        let curve: Vec<(f64, f64)> = (0..=CURVE_POINTS)
            .map(|i| (x_max * i as f64 / CURVE_POINTS as f64).max(x_max * 1e-6))
            .map(|p| (p, measures(staged, &model, p).pa))
            .collect();
        for &(p, pa) in &curve {
            check(
                Quantity::Probability,
                format_args!("Pa at quality {} on the {s} OC curve", Short(p)),
                pa,
            )?;
        }
        curves.push(curve);
    }
    let scheme: Vec<(f64, f64)> = match &f.scheme_oc {
        SchemeCurve::Drawn(points) => {
            for &(p, pa) in points {
                check(
                    Quantity::quality(model.kind()),
                    format_args!("a quality of the switching scheme's OC curve"),
                    p,
                )?;
                check(
                    Quantity::Probability,
                    format_args!(
                        "Pa at quality {} on the switching scheme's OC curve",
                        Short(p)
                    ),
                    pa,
                )?;
            }
            points
                .iter()
                .copied()
                .filter(|&(p, _)| p <= x_max)
                .collect()
        }
        SchemeCurve::Refused(_) => Vec::new(),
    };
    let per_unit = cl.per_unit();
    let axis = quality_tick(per_unit);
    let long = words::oc_title(cl, false);
    let title = if c.width(&long, Face::Bold, 8.0) <= area.w {
        long
    } else {
        words::oc_title(cl, true)
    };
    let plot = Plot::new(area, x_max, 1.0);
    frame(
        c,
        "OC chart",
        &plot,
        &Axes {
            title: &title,
            x_label: sheet::quality_axis(per_unit),
            y_label: sheet::OC_AXIS,
            x_max,
            y_max: 1.0,
            x_tick: &axis,
            y_tick: &plain_tick,
            x_step: None,
            y_step: None,
        },
    );
    let x = plot.sx(aql);
    c.line(
        &[(x, plot.bottom), (x, plot.top)],
        0.5,
        grey(0.45),
        Some(2.0),
    );
    let mut entries = Vec::new();
    for ((s, p, _), curve) in plans.iter().zip(&curves) {
        let (colour, dash) = style(*s);
        let width = if *s == f.severity { 1.6 } else { 1.0 };
        plot.curve(c, curve, width, colour, dash);
        entries.push(LegendEntry {
            label: words::curve_label(*s, p, *s == f.severity),
            color: colour,
            thickness: width,
            dash,
            block: false,
        });
    }
    if !scheme.is_empty() {
        plot.curve(c, &scheme, SCHEME_WIDTH, SCHEME_COLOUR, None);
        entries.push(LegendEntry {
            label: words::SCHEME_CURVE.to_string(),
            color: SCHEME_COLOUR,
            thickness: SCHEME_WIDTH,
            dash: None,
            block: false,
        });
    }
    entries.push(LegendEntry {
        label: words::aql_guide(&sheet::quality(aql, per_unit)),
        color: grey(0.45),
        thickness: 0.5,
        dash: Some(2.0),
        block: false,
    });
    let mut all: Vec<&[(f64, f64)]> = curves.iter().map(Vec::as_slice).collect();
    if !scheme.is_empty() {
        all.push(&scheme);
    }
    let guide = [(aql, 0.0), (aql, 1.0)];
    all.push(&guide);
    legend(c, &plot, "OC chart", &entries, &all);
    Ok(())
}
