//! The OC chart of an attributes plan: the probability of acceptance
//! against lot quality, with the two agreed points marked at the Pa the
//! plan achieves there and the indifference quality (Pa = 0.5) as a
//! dashed guide.

use super::axes::Axes;
use super::curve_chart::{Chart, draw};
use super::scale::{plain_tick, quality_tick};
use super::subject::{Curves, Subject};
use crate::plan::quality_at_pa;
use crate::print::canvas::Canvas;
use crate::print::draw::Face;
use crate::print::geometry::Rect;
use crate::print::wording::sheet;

/// The OC chart's title, short when the long one is wider than `w` mm.
pub fn oc_title(c: &Canvas, w: f64) -> &'static str {
    if c.width(sheet::OC_TITLE, Face::Bold, 8.0) <= w {
        sheet::OC_TITLE
    } else {
        sheet::OC_TITLE_SHORT
    }
}

/// The OC curve of `s` in `area`, with both points of the agreement
/// marked and the indifference quality.
pub fn oc_chart(c: &mut Canvas, s: &Subject, curves: &Curves, area: Rect) {
    let indifference = quality_at_pa(s.plan, s.model, 0.5);
    let oc = curves.of(|pt| pt.pa);
    let axis = quality_tick(s.per_unit);
    let marks = s.agreement.marks(s.per_unit);
    draw(
        c,
        "OC chart",
        area,
        &Chart {
            axes: Axes {
                title: oc_title(c, area.w),
                x_label: sheet::quality_axis(s.per_unit),
                y_label: sheet::OC_AXIS,
                x_max: curves.x_max,
                y_max: 1.0,
                x_tick: &axis,
                y_tick: &plain_tick,
                x_step: None,
                y_step: None,
            },
            curve: &oc,
            marks: &marks,
            guide: Some((indifference, format!("Pa = 0.5 at {}", s.q(indifference)))),
        },
    );
}
