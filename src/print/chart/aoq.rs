//! The AOQ chart of an attributes plan: the average outgoing quality
//! under rectifying inspection against lot quality, with its maximum, the
//! AOQL, marked.

use super::axes::Axes;
use super::curve_chart::{Chart, draw};
use super::marks::Mark;
use super::scale::{nice_ceiling, quality_tick};
use super::subject::{Curves, Subject};
use crate::plan::aoql;
use crate::print::canvas::Canvas;
use crate::print::geometry::Rect;
use crate::print::wording::sheet;

/// The AOQ curve of `s` in `area`, with the AOQL marked.
pub fn aoq_chart(c: &mut Canvas, s: &Subject, curves: &Curves, area: Rect) {
    let limit = aoql(s.plan, s.model);
    let aoq = curves.of(|pt| pt.aoq);
    let axis = quality_tick(s.per_unit);
    let marks = [Mark {
        x: limit.quality,
        y: limit.value,
        label: format!("AOQL = {}", s.q(limit.value)),
        stacked: None,
    }];
    draw(
        c,
        "AOQ chart",
        area,
        &Chart {
            axes: Axes {
                title: sheet::AOQ_TITLE,
                x_label: sheet::quality_axis(s.per_unit),
                y_label: sheet::AOQ_AXIS,
                x_max: curves.x_max,
                y_max: nice_ceiling(limit.value * 1.25),
                x_tick: &axis,
                y_tick: &axis,
                x_step: None,
                y_step: None,
            },
            curve: &aoq,
            marks: &marks,
            guide: None,
        },
    );
}
