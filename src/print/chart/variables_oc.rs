//! The OC chart of a variables plan: the plan's curve (for two limits
//! with sigma estimated, both configurations: all beyond one limit, and
//! the mean centred), the attributes single plan for the same points for
//! comparison, the risk points, the legend; for two limits with sigma
//! known, the qualities the process cannot reach shaded.

use super::axes::{Axes, frame};
use super::legend::{LegendEntry, legend};
use super::marks::{Keep, marks};
use super::oc::oc_title;
use super::plot::Plot;
use super::scale::{nice_ceiling, plain_tick, quality_tick};
use crate::design::SingleDesign;
use crate::model::Model;
use crate::numeric::{NumericalError, Quantity, Short, check};
use crate::plan::{VariablesPlan, measures, quality_at_pa};
use crate::print::agreement::Agreement;
use crate::print::canvas::Canvas;
use crate::print::draw::{grey, rgb};
use crate::print::geometry::Rect;
use crate::print::palette::PLAN;
use crate::print::wording::sheet;
use crate::print::wording::variables as words;

/// A variables plan as its OC chart sees it.
pub struct VariablesSubject<'a> {
    /// The plan.
    pub plan: &'a VariablesPlan,
    /// The model of the attributes plan compared.
    pub model: &'a Model,
    /// The attributes single plan for the same points, if any.
    pub attributes: Option<&'a SingleDesign>,
    /// The risk points and what the plan achieves there.
    pub agreement: &'a Agreement,
    /// Whether qualities are nonconformities per unit.
    pub per_unit: bool,
}

/// Points on each curve against quality.
const CURVE_POINTS: usize = 240;

/// The centred configuration costs a quadrature per point: fewer points,
/// which its smooth curve does not need more of.
const CENTRED_POINTS: usize = 80;

/// The quality in `(lo, 1/2]` at which a falling OC `pa` reaches `target`,
/// by bisection (1/2 when it is still above there).
fn quality_where(pa: impl Fn(f64) -> f64, lo: f64, target: f64) -> f64 {
    let (mut a, mut b) = (lo, 0.5);
    if pa(b) >= target {
        return b;
    }
    // To 2^-30 of the range: far finer than the axis, rounded up to a
    // nice number, needs.
    for _ in 0..30 {
        let m = 0.5 * (a + b);
        if pa(m) > target {
            a = m;
        } else {
            b = m;
        }
    }
    0.5 * (a + b)
}

/// The OC chart: the variables plan (both configurations for two limits
/// with sigma estimated), the attributes plan for comparison, the risk
/// points, the legend; for two limits with sigma known, the qualities the
/// process cannot reach shaded.
pub fn variables_oc_chart(
    c: &mut Canvas,
    v: &VariablesSubject,
    area: Rect,
) -> Result<(), NumericalError> {
    let plan = v.plan;
    let upper = v.agreement.qualities().1;
    let lowest = plan.spec().lowest_quality();
    let start = lowest.max(1e-6);
    let centred = plan.pa_centred(0.5).is_some();
    let attributes = v.attributes.map(|a| &a.plan);
    // The axis from the one-sided curve: the centred one, which costs a
    // quadrature a point, runs close beside it.
    let mut reach = quality_where(|p| plan.pa(p), start, 0.02).max(upper * 1.2);
    if let Some(a) = attributes {
        reach = reach.max(quality_at_pa(a, v.model, 0.02));
    }
    let x_max = nice_ceiling(reach);
    let along = |count: usize| {
        (0..=count)
            .map(move |i| start + (x_max - start) * i as f64 / count as f64)
            .collect::<Vec<f64>>()
    };
    let variables: Vec<(f64, f64)> = along(CURVE_POINTS)
        .into_iter()
        .map(|p| (p, plan.pa(p)))
        .collect();
    let centred_curve: Vec<(f64, f64)> = if centred {
        along(CENTRED_POINTS)
            .into_iter()
            .map(|p| (p, plan.pa_centred(p).unwrap_or(0.0)))
            .collect()
    } else {
        Vec::new()
    };
    let attributes_curve: Vec<(f64, f64)> = attributes.map_or_else(Vec::new, |a| {
        (0..=CURVE_POINTS)
            .map(|i| (x_max * i as f64 / CURVE_POINTS as f64).max(x_max * 1e-6))
            .map(|p| (p, measures(a, v.model, p).pa))
            .collect()
    });
    // A point out of its range stops the sheet rather than bend a curve.
    for (name, curve) in [
        ("variables OC", &variables),
        ("variables OC, mean centred", &centred_curve),
        ("attributes OC", &attributes_curve),
    ] {
        for &(p, pa) in curve.iter() {
            check(
                Quantity::Probability,
                format_args!("Pa at quality {} on the {name} curve", Short(p)),
                pa,
            )?;
        }
    }
    let axis = quality_tick(false);
    // A little room above Pa = 1 for the producer's point's label, which
    // near the top of two close curves has no room below the axis's end.
    let y_max = 1.15;
    let plot = Plot::new(area, x_max, y_max);
    frame(
        c,
        "OC chart",
        &plot,
        &Axes {
            title: oc_title(c, area.w),
            x_label: sheet::quality_axis(false),
            y_label: sheet::OC_AXIS,
            x_max,
            y_max,
            x_tick: &axis,
            y_tick: &plain_tick,
            x_step: None,
            y_step: Some(0.2),
        },
    );
    let unreachable = grey(0.82);
    // The qualities below the centred process's, shaded where the shade
    // is wide enough to see.
    let shade = plot.sx(lowest) - plot.sx(0.0) >= 0.8;
    if shade {
        plot.zone(
            c,
            &[(0.0, 0.0), (lowest, 0.0), (lowest, y_max), (0.0, y_max)],
            unreachable,
        );
    }
    let attributes_colour = rgb(0.62, 0.38, 0.08);
    let centred_colour = rgb(0.0, 0.5, 0.45);
    let mut entries = Vec::new();
    if centred {
        entries.push(LegendEntry {
            label: words::ONE_SIDED_CURVE.to_string(),
            color: PLAN,
            thickness: 1.3,
            dash: None,
            block: false,
        });
        entries.push(LegendEntry {
            label: words::CENTRED_CURVE.to_string(),
            color: centred_colour,
            thickness: 1.3,
            dash: Some(0.9),
            block: false,
        });
    } else {
        entries.push(LegendEntry {
            label: words::variables_curve(plan),
            color: PLAN,
            thickness: 1.3,
            dash: None,
            block: false,
        });
    }
    if let Some(a) = v.attributes {
        entries.push(LegendEntry {
            label: words::attributes_curve(a),
            color: attributes_colour,
            thickness: 0.9,
            dash: Some(2.2),
            block: false,
        });
    }
    if let (true, Some(sigma)) = (shade, plan.spec().sigma()) {
        entries.push(LegendEntry {
            label: words::unreachable_zone(lowest, sigma),
            color: unreachable,
            thickness: 0.0,
            dash: None,
            block: true,
        });
    }
    if !attributes_curve.is_empty() {
        plot.curve(c, &attributes_curve, 0.9, attributes_colour, Some(2.2));
    }
    plot.curve(c, &variables, 1.3, PLAN, None);
    // Over the one-sided curve, which it runs close to: its dots show on it.
    if centred {
        plot.curve(c, &centred_curve, 1.3, centred_colour, Some(0.9));
    }
    let curves: Vec<&[(f64, f64)]> = [&variables, &centred_curve, &attributes_curve]
        .into_iter()
        .filter(|v| !v.is_empty())
        .map(|v| v.as_slice())
        .collect();
    let legend = legend(c, &plot, "OC chart", &entries, &curves);
    // The labels keep 0.45 mm clear of every curve, above and below: with
    // two or three curves close together a label that only just misses
    // one reads as if it sat on it.
    let clearance = 0.45 / (plot.top - plot.bottom) * y_max;
    let shifted: Vec<Vec<(f64, f64)>> = curves
        .iter()
        .flat_map(|pts| {
            [clearance, -clearance]
                .map(|d| pts.iter().map(|&(p, pa)| (p, (pa + d).max(0.0))).collect())
        })
        .collect();
    let mut avoid: Vec<&[(f64, f64)]> = curves.clone();
    avoid.extend(shifted.iter().map(|v| v.as_slice()));
    let keep = Keep {
        guide_x: None,
        guide_y: None,
        curves: &avoid,
        labels: &[legend],
    };
    marks(c, &plot, &v.agreement.marks(v.per_unit), &keep);
    Ok(())
}
