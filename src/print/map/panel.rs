//! One panel of the map: the cells coloured on the log ramp, the cells
//! without a plan in grey or hatched, the contour lines with their labels,
//! the axes and the colour bar. The numbers come in as a
//! [`Field`](super::field::Field); this file only places and draws them,
//! and says where it put them ([`MapPanel`]).

use super::bar::{bar_labels, colour_bar};
use super::cells::cells;
use super::contour::{Lattice, Path};
use super::field::{LogScale, MapQuantity, levels, value_label};
use super::labels::{SIMPLIFY, draw_box_text, draw_label, place_labels, simplify};
use super::plot::{AxisMap, Panel, bordered, bordered_values, edges, ticks};
use super::style::{
    AXIS, BAR_GAP, BAR_W, BOTTOM_ROOM, DIGIT_HEIGHT, TICK, TICK_LEN, TITLE, TOP_ROOM, agreed_ring,
    contour_strokes,
};
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey};
use crate::print::geometry::{MM_PER_PT, Rect, Region};
use crate::print::text::Shrink;
use crate::print::wording::map as text;

/// What one panel of a map shows and where it put its contours.
#[derive(Clone, Debug)]
pub struct MapPanel {
    /// The quantity the colours and the contours are of.
    pub quantity: MapQuantity,
    /// The plotting area on the page, mm from the bottom-left corner.
    pub plot: Region,
    /// The smallest and largest value over the cells with a plan.
    pub range: Option<(f64, f64)>,
    /// The contour levels, lowest first.
    pub contours: Vec<MapContour>,
}

/// One contour level of a panel.
#[derive(Clone, Debug)]
pub struct MapContour {
    /// The value the line joins.
    pub level: f64,
    /// The label printed on the line.
    pub label: String,
    /// The line's paths as `(RQL, AQL)` points: a path crosses between two
    /// neighbouring cells where the level lies between their values, at
    /// the point interpolated on the log scale between the cells' centres,
    /// and runs on from the outer cells' centres to the plot's edges.
    pub paths: Vec<Vec<(f64, f64)>>,
    /// Where the level's labels are (none when no place had room).
    pub labels: Vec<ContourLabel>,
}

/// A contour label: its centre on the line, and its box on the page.
#[derive(Clone, Debug)]
pub struct ContourLabel {
    /// The label's centre as `(RQL, AQL)`.
    pub at: (f64, f64),
    /// The white box that carries it, mm from the page's bottom-left corner.
    pub page: Region,
}

/// Draws panel `p` in `area`,
/// claimed as `name`, and returns what it placed.
pub fn draw(c: &mut Canvas, name: &str, area: Rect, p: &Panel) -> MapPanel {
    let (x, y, w, h) = (area.x, area.y, area.w, area.h);
    c.claim(name, area);
    let range = p.field.range();
    let scale = range.map(|(lo, hi)| LogScale::new(lo, hi));
    let levels = range.map_or_else(Vec::new, |(lo, hi)| levels(lo, hi));
    let (bottom, top) = (y + BOTTOM_ROOM, y + h - TOP_ROOM);
    let (row_edges, col_edges) = (edges(p.aql), edges(p.rql));
    let ys_lo_hi = (row_edges[0], row_edges[row_edges.len() - 1]);
    let y_ticks = ticks(c, ys_lo_hi.0, ys_lo_hi.1, top - bottom, p.per_unit, false);
    let y_tick_w = y_ticks
        .iter()
        .map(|(_, l)| c.width(l, Face::Regular, TICK))
        .fold(0.0, f64::max);
    let left = x + y_tick_w + TICK_LEN + 1.0;
    let ys = AxisMap {
        lo: ys_lo_hi.0,
        hi: ys_lo_hi.1,
        p0: bottom,
        p1: top,
    };
    let bar_labels = bar_labels(range, scale, &levels, bottom, top);
    let bar_label_w = bar_labels
        .iter()
        .map(|(_, l, face, size)| c.width(l, *face, *size))
        .fold(0.0, f64::max);
    let right = x + w - (BAR_GAP + BAR_W + TICK_LEN + 0.8 + bar_label_w);
    let xs = AxisMap {
        lo: col_edges[0],
        hi: col_edges[col_edges.len() - 1],
        p0: left,
        p1: right,
    };
    if right - left < 30.0 || top - bottom < 30.0 {
        c.fault(format!("{name}: the plot has no room (under 30 mm)"));
    }
    cells(c, p, &xs, &ys, &col_edges, &row_edges, scale);
    let (lattice_xs, lattice_ys) = (bordered(p.rql, &col_edges), bordered(p.aql, &row_edges));
    let logs = bordered_values(&p.field.logs(), p.rql.len());
    let lattice = Lattice {
        xs: &lattice_xs,
        ys: &lattice_ys,
        z: &logs,
    };
    // Each level's paths in data coordinates, on the page, and as drawn.
    let traced: Vec<Vec<Path>> = levels.iter().map(|l| lattice.trace(l.ln())).collect();
    let on_page: Vec<Vec<Path>> = traced
        .iter()
        .map(|paths| {
            paths
                .iter()
                .map(|path| {
                    path.iter()
                        .map(|&(a, b)| (xs.page(a), ys.page(b)))
                        .collect()
                })
                .collect()
        })
        .collect();
    let drawn: Vec<Vec<Path>> = on_page
        .iter()
        .map(|paths| paths.iter().map(|path| simplify(path, SIMPLIFY)).collect())
        .collect();
    let all: Vec<Path> = drawn.iter().flatten().cloned().collect();
    contour_strokes(c, &all);
    let plot = (left, bottom, right, top);
    let labels = place_labels(c, &levels, &on_page, &drawn, plot);
    for (level, boxes) in levels.iter().zip(&labels) {
        let text = value_label(*level);
        for r in boxes {
            draw_label(c, &text, *r);
        }
    }
    if let Some((rql, aql)) = p.agreed
        && (xs.lo..=xs.hi).contains(&rql)
        && (ys.lo..=ys.hi).contains(&aql)
    {
        agreed_ring(c, xs.page(rql), ys.page(aql));
    }
    if range.is_none() {
        let tw = c.width(text::NO_CELL, Face::Bold, AXIS);
        let (cx, cy) = ((left + right) / 2.0, (bottom + top) / 2.0);
        draw_box_text(
            c,
            text::NO_CELL,
            Face::Bold,
            AXIS,
            (cx - tw / 2.0 - 2.0, cy - 3.0, cx + tw / 2.0 + 2.0, cy + 3.0),
        );
    }
    axes(c, name, p, &xs, &ys, &y_ticks, area);
    colour_bar(
        c,
        (p.quantity, scale),
        (&levels, &bar_labels),
        Rect::new(right + BAR_GAP, bottom, BAR_W, top - bottom),
    );
    let contours = levels
        .iter()
        .zip(traced)
        .zip(labels)
        .map(|((&level, paths), boxes)| MapContour {
            level,
            label: value_label(level),
            paths,
            labels: boxes
                .iter()
                .map(|&(x0, y0, x1, y1)| ContourLabel {
                    at: (xs.data((x0 + x1) / 2.0), ys.data((y0 + y1) / 2.0)),
                    page: Region {
                        name: format!("{name}: contour label {}", value_label(level)),
                        x: x0,
                        y: y0,
                        w: x1 - x0,
                        h: y1 - y0,
                    },
                })
                .collect(),
        })
        .collect();
    MapPanel {
        quantity: p.quantity,
        plot: Region {
            name: format!("{name}: plot"),
            x: left,
            y: bottom,
            w: right - left,
            h: top - bottom,
        },
        range,
        contours,
    }
}

/// The plot's frame, its ticks and tick labels, the axis labels and the
/// panel's title, with a fault for any that leaves the panel.
fn axes(
    c: &mut Canvas,
    name: &str,
    p: &Panel,
    xs: &AxisMap,
    ys: &AxisMap,
    y_ticks: &[(f64, String)],
    area: Rect,
) {
    let (x, y, w, h) = (area.x, area.y, area.w, area.h);
    let (left, bottom, right, top) = (xs.p0, ys.p0, xs.p1, ys.p1);
    let x_ticks = ticks(c, xs.lo, xs.hi, right - left, p.per_unit, true);
    let mut marks: Vec<Path> = Vec::new();
    for (v, label) in &x_ticks {
        let px = xs.page(*v);
        marks.push(vec![(px, bottom), (px, bottom - TICK_LEN)]);
        let lw = c.width(label, Face::Regular, TICK);
        c.text(
            px - lw / 2.0,
            bottom - TICK_LEN - 3.4,
            label,
            Face::Regular,
            TICK,
            grey(0.1),
        );
    }
    for (v, label) in y_ticks {
        let py = ys.page(*v);
        marks.push(vec![(left - TICK_LEN, py), (left, py)]);
        c.text_right(
            left - TICK_LEN - 0.6,
            py - DIGIT_HEIGHT * TICK * MM_PER_PT / 2.0,
            label,
            Face::Regular,
            TICK,
            grey(0.1),
        );
    }
    c.polylines(&marks, 0.6, grey(0.0));
    c.rect_stroke(
        Rect::new(left, bottom, right - left, top - bottom),
        0.7,
        grey(0.0),
    );
    let x_label = text::rql_axis(p.per_unit);
    let xw = c.width(x_label, Face::Regular, AXIS);
    c.text(
        (left + right - xw) / 2.0,
        y + 1.5,
        x_label,
        Face::Regular,
        AXIS,
        grey(0.0),
    );
    if xw > w {
        c.fault(format!("{name}: '{x_label}' is wider than the panel"));
    }
    let y_label = text::aql_axis(p.per_unit);
    c.text(x, top + 2.6, y_label, Face::Regular, AXIS, grey(0.0));
    let bar_title_x = right + BAR_GAP;
    if x + c.width(y_label, Face::Regular, AXIS) + 3.0 > bar_title_x {
        c.fault(format!(
            "{name}: '{y_label}' runs into the colour bar's title"
        ));
    }
    let fit = c.fit(
        &p.title,
        Face::Bold,
        w,
        TITLE * MM_PER_PT * 1.3,
        Shrink::new(TITLE, 7.5),
    );
    if !fit.fits {
        c.overflow(format!("{name}: '{}'", p.title));
    }
    c.text(x, y + h - 4.0, &p.title, Face::Bold, fit.size, grey(0.0));
}
