//! The charts of a comparison: the OC, AOQ or ASN curve of every plan on
//! one chart, each in its own line ([`COMPARED`]), the AQL and the RQL as
//! dashed guides, and a legend under the plot naming each line.

use super::axes::{Axes, frame};
use super::plot::Plot;
use super::scale::{nice_ceiling, plain_tick, quality_tick};
use crate::input::InputError;
use crate::numeric::{Quantity, Short, check};
use crate::plan::{Comparison, evaluate, quality_at_pa};
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey};
use crate::print::geometry::Rect;
use crate::print::palette::{COMPARED, CurveStyle};
use crate::print::wording::compare as words;
use crate::print::wording::sheet;
use crate::source::Error;

/// Steps of each curve along the quality axis.
const STEPS: usize = 240;

/// The legend's type size and line pitch, mm.
const LEGEND_SIZE: f64 = 6.5;
const LEGEND_PITCH: f64 = 3.3;

/// The length of a legend's line sample, mm.
const SAMPLE: f64 = 7.0;

/// Which measure a chart draws.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Measure {
    /// The probability of acceptance.
    Oc,
    /// The average outgoing quality.
    Aoq,
    /// The average sample number.
    Asn,
}

/// One point of a plan's curves: quality, Pa, AOQ, ASN.
type Point4 = (f64, f64, f64, f64);

/// The quality axis and every plan's curves on it, computed once for the
/// three charts.
pub struct CompareCurves {
    /// The end of the quality axis.
    pub x_max: f64,
    /// Per plan, its points.
    pub plans: Vec<Vec<Point4>>,
}

impl CompareCurves {
    /// The curves of the plans of `comparison`: 241 even steps up to where
    /// the last plan's Pa has fallen to 0.02 (or 1.2 times the RQL if that
    /// is further), each plan evaluated with [`evaluate`] (so within the
    /// work budget).
    ///
    /// # Errors
    /// [`InputError`] when a plan's curve passes the work budget;
    /// [`Error::Numerical`] for a measure out of its range.
    pub fn new(comparison: &Comparison) -> Result<Self, Error> {
        let rql = comparison.risks.consumer().quality;
        let reach = comparison
            .rows
            .iter()
            .map(|r| quality_at_pa(&r.compared.plan, &r.compared.model, 0.02))
            .fold(rql * 1.2, f64::max);
        let mut x_max = nice_ceiling(reach);
        if !comparison.per_unit {
            x_max = x_max.min(1.0);
        }
        let top = if comparison.per_unit {
            x_max
        } else {
            x_max.min(1.0 - 1e-9)
        };
        let qualities: Vec<f64> = (0..=STEPS)
            .map(|i| (x_max * i as f64 / STEPS as f64).clamp(x_max * 1e-6, top))
            .collect();
        let mut plans = Vec::with_capacity(comparison.rows.len());
        for row in &comparison.rows {
            let c = &row.compared;
            let evaluation = evaluate(&c.plan, &c.model, &qualities)
                .map_err(|e| InputError::Inconsistent(format!("the curves of {}: {e}", c.label)))?;
            let quality = Quantity::quality(c.model.kind());
            let mut points = Vec::with_capacity(qualities.len());
            for m in &evaluation.points {
                let at = Short(m.quality);
                check(Quantity::Probability, format_args!("Pa at {at}"), m.pa)?;
                check(quality, format_args!("AOQ at {at}"), m.aoq)?;
                check(Quantity::Amount, format_args!("ASN at {at}"), m.asn)?;
                points.push((m.quality, m.pa, m.aoq, m.asn));
            }
            plans.push(points);
        }
        Ok(CompareCurves { x_max, plans })
    }

    /// The curve of `measure` of plan `i`, as `(quality, value)` points.
    fn of(&self, i: usize, measure: Measure) -> Vec<(f64, f64)> {
        self.plans[i]
            .iter()
            .map(|&(p, pa, aoq, asn)| match measure {
                Measure::Oc => (p, pa),
                Measure::Aoq => (p, aoq),
                Measure::Asn => (p, asn),
            })
            .collect()
    }

    /// The top of the y axis of `measure`'s chart.
    fn y_max(&self, measure: Measure) -> f64 {
        let largest = |f: fn(&Point4) -> f64| {
            self.plans
                .iter()
                .flatten()
                .map(f)
                .fold(f64::MIN_POSITIVE, f64::max)
        };
        match measure {
            Measure::Oc => 1.0,
            Measure::Aoq => nice_ceiling(largest(|p| p.2) * 1.25),
            Measure::Asn => nice_ceiling(largest(|p| p.3) * 1.15),
        }
    }
}

/// The height of the legend of a comparison of `plans` plans, mm.
pub fn legend_height(plans: usize) -> f64 {
    LEGEND_PITCH * (plans + 1) as f64 + 1.4
}

/// The chart of `measure` for every plan of `comparison` in `area`: the
/// plot above, its legend below, inside the area.
pub fn compare_chart(
    c: &mut Canvas,
    comparison: &Comparison,
    curves: &CompareCurves,
    measure: Measure,
    area: Rect,
) {
    let per_unit = comparison.per_unit;
    let (title, y_label, name) = match measure {
        Measure::Oc => (words::OC_TITLE, sheet::OC_AXIS, "OC chart"),
        Measure::Aoq => (words::AOQ_TITLE, sheet::AOQ_AXIS, "AOQ chart"),
        Measure::Asn => (words::ASN_TITLE, sheet::ASN_AXIS, "ASN chart"),
    };
    let (key, chart) = area.split_bottom(legend_height(comparison.rows.len()), 1.0);
    let y_max = curves.y_max(measure);
    let axis = quality_tick(per_unit);
    let plot = Plot::new(chart, curves.x_max, y_max);
    let y_tick: &dyn Fn(f64, f64) -> String = match measure {
        Measure::Aoq => &axis,
        Measure::Oc | Measure::Asn => &plain_tick,
    };
    frame(
        c,
        name,
        &plot,
        &Axes {
            title,
            x_label: sheet::quality_axis(per_unit),
            y_label,
            x_max: curves.x_max,
            y_max,
            x_tick: &axis,
            y_tick,
            x_step: None,
            y_step: None,
        },
    );
    let (aql, rql) = (
        comparison.risks.producer().quality,
        comparison.risks.consumer().quality,
    );
    guides(c, &plot, aql, rql);
    for (i, style) in (0..comparison.rows.len()).zip(COMPARED) {
        plot.curve(
            c,
            &curves.of(i, measure),
            style.width,
            style.colour,
            style.dash,
        );
    }
    legend(c, comparison, &format!("{name}'s legend"), key);
}

/// The AQL and the RQL as dashed grey lines across the plot, each named
/// just above the plot's top edge, below the y axis's label: the AQL's
/// name left of its line, the RQL's right of its line, where they keep
/// apart.
fn guides(c: &mut Canvas, plot: &Plot, aql: f64, rql: f64) {
    let size = 5.5;
    let y = plot.top + 0.6;
    for (q, label, left) in [(aql, words::AQL, true), (rql, words::RQL, false)] {
        let x = plot.sx(q);
        c.line(
            &[(x, plot.bottom), (x, plot.top)],
            0.5,
            grey(0.45),
            Some(2.0),
        );
        let w = c.width(label, Face::Regular, size);
        let lx = if (left && x - 0.6 - w >= plot.left) || x + 0.6 + w > plot.right {
            x - 0.6 - w
        } else {
            x + 0.6
        };
        c.text(lx, y, label, Face::Regular, size, grey(0.3));
    }
}

/// The legend in `area`: a sample of each plan's line with its label,
/// then the guides'. A label too wide for the area loses its start, so
/// that a file name keeps its end.
fn legend(c: &mut Canvas, comparison: &Comparison, name: &str, area: Rect) {
    c.claim(name, area);
    let per_unit = comparison.per_unit;
    let room = area.w - SAMPLE - 2.5;
    let mut entries: Vec<(String, CurveStyle)> = comparison
        .rows
        .iter()
        .zip(COMPARED)
        .map(|(r, style)| (r.compared.label.clone(), style))
        .collect();
    entries.push((
        words::guides(
            &sheet::quality(comparison.risks.producer().quality, per_unit),
            &sheet::quality(comparison.risks.consumer().quality, per_unit),
        ),
        CurveStyle {
            colour: grey(0.45),
            width: 0.5,
            dash: Some(2.0),
        },
    ));
    for (i, (label, style)) in entries.iter().enumerate() {
        let base = area.top() - LEGEND_PITCH * (i as f64 + 1.0) + 0.4;
        let mid = base + 0.8;
        c.line(
            &[(area.x + 1.0, mid), (area.x + 1.0 + SAMPLE, mid)],
            style.width,
            style.colour,
            style.dash,
        );
        let shown = fitted(c, label, room);
        c.text(
            area.x + SAMPLE + 2.5,
            base,
            &shown,
            Face::Regular,
            LEGEND_SIZE,
            grey(0.1),
        );
    }
}

/// `label`, or its end after an ellipsis, within `room` mm at the
/// legend's size.
pub fn fitted(c: &Canvas, label: &str, room: f64) -> String {
    if c.width(label, Face::Regular, LEGEND_SIZE) <= room {
        return label.to_string();
    }
    let chars: Vec<char> = label.chars().collect();
    (1..chars.len())
        .map(|skip| format!("…{}", chars[skip..].iter().collect::<String>()))
        .find(|s| c.width(s, Face::Regular, LEGEND_SIZE) <= room)
        .unwrap_or_else(|| "…".to_string())
}
