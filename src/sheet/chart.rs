//! Vector line charts: axes with tick labels, gridlines, one curve, and
//! labelled markers. Kept apart from the numbers: the caller hands in the
//! points already computed.

use super::canvas::{Canvas, Face, grey, rgb};

/// One labelled point on a chart.
pub struct Mark {
    pub x: f64,
    pub y: f64,
    pub label: String,
}

/// What to draw.
pub struct Chart<'a> {
    pub title: &'a str,
    pub x_label: &'a str,
    pub y_label: &'a str,
    pub x_max: f64,
    pub y_max: f64,
    /// Format a tick value on each axis, given the tick step.
    pub x_tick: &'a dyn Fn(f64, f64) -> String,
    pub y_tick: &'a dyn Fn(f64, f64) -> String,
    pub curve: &'a [(f64, f64)],
    pub marks: &'a [Mark],
    /// A vertical dashed guide with its label (e.g. the indifference quality).
    pub guide: Option<(f64, String)>,
}

/// A "nice" tick step for a range: 1, 2 or 5 times a power of ten giving
/// four to eight intervals.
pub fn nice_step(range: f64) -> f64 {
    let raw = range / 5.0;
    let magnitude = 10f64.powf(raw.log10().floor());
    let m = raw / magnitude;
    let nice = if m < 1.5 {
        1.0
    } else if m < 3.0 {
        2.0
    } else if m < 7.0 {
        5.0
    } else {
        10.0
    };
    nice * magnitude
}

/// Rounds an axis end up to a whole number of nice steps.
pub fn nice_ceiling(v: f64) -> f64 {
    let step = nice_step(v);
    (v / step).ceil() * step
}

/// Draws `chart` in the box `(x, y, w, h)` (mm, bottom-left corner).
pub fn draw(c: &mut Canvas, name: &str, x: f64, y: f64, w: f64, h: f64, chart: &Chart) {
    c.claim(name, x, y, w, h);
    let (left, bottom, right, top) = (x + 13.0, y + 11.0, x + w - 3.0, y + h - 12.0);
    let (pw, ph) = (right - left, top - bottom);
    let sx = |v: f64| left + v / chart.x_max * pw;
    let sy = |v: f64| bottom + v / chart.y_max * ph;
    c.text(x, y + h - 3.5, chart.title, Face::Bold, 8.0, grey(0.0));
    // Gridlines and ticks.
    let xs = nice_step(chart.x_max);
    let ys = nice_step(chart.y_max);
    let mut v = 0.0;
    while v <= chart.x_max * (1.0 + 1e-9) {
        c.line(&[(sx(v), bottom), (sx(v), top)], 0.3, grey(0.85), None);
        let label = (chart.x_tick)(v, xs);
        let lw = c.width(&label, Face::Regular, 6.5);
        c.text(
            sx(v) - lw / 2.0,
            bottom - 3.5,
            &label,
            Face::Regular,
            6.5,
            grey(0.2),
        );
        v += xs;
    }
    let mut v = 0.0;
    while v <= chart.y_max * (1.0 + 1e-9) {
        c.line(&[(left, sy(v)), (right, sy(v))], 0.3, grey(0.85), None);
        c.text_right(
            left - 1.2,
            sy(v) - 0.9,
            &(chart.y_tick)(v, ys),
            Face::Regular,
            6.5,
            grey(0.2),
        );
        v += ys;
    }
    c.line(
        &[(left, top), (left, bottom), (right, bottom)],
        0.7,
        grey(0.0),
        None,
    );
    let xl = c.width(chart.x_label, Face::Regular, 7.0);
    c.text(
        left + (pw - xl) / 2.0,
        y + 1.5,
        chart.x_label,
        Face::Regular,
        7.0,
        grey(0.0),
    );
    c.text(x, top + 3.0, chart.y_label, Face::Regular, 7.0, grey(0.0));
    if let Some((gx, label)) = &chart.guide {
        c.line(
            &[(sx(*gx), bottom), (sx(*gx), top)],
            0.5,
            grey(0.45),
            Some(2.0),
        );
        // Left of the line near the axis, where a falling curve leaves room.
        let lw = c.width(label, Face::Regular, 6.5);
        let lx = if sx(*gx) - 1.0 - lw >= left {
            sx(*gx) - 1.0 - lw
        } else {
            sx(*gx) + 1.0
        };
        c.text(lx, bottom + 2.0, label, Face::Regular, 6.5, grey(0.3));
    }
    let pts: Vec<(f64, f64)> = chart
        .curve
        .iter()
        .map(|&(a, b)| (sx(a), sy(b.min(chart.y_max))))
        .collect();
    c.line(&pts, 1.3, rgb(0.05, 0.25, 0.55), None);
    for m in chart.marks {
        let (mx, my) = (sx(m.x), sy(m.y));
        c.marker(mx, my, 1.3, rgb(0.75, 0.2, 0.1));
        let lw = c.width(&m.label, Face::Regular, 6.5);
        // The first of right-above, left-above, right-below, left-below that
        // stays inside the plot and clear of the dashed guide.
        let guide_x = chart.guide.as_ref().map(|(g, _)| sx(*g));
        let candidates = [
            (mx + 2.0, my + 1.2),
            (mx - 2.0 - lw, my + 1.2),
            (mx + 2.0, my - 3.6),
            (mx - 2.0 - lw, my - 3.6),
        ];
        let fits = |&(lx, ly): &(f64, f64)| {
            lx >= left
                && lx + lw <= right
                && ly >= bottom + 0.5
                && ly + 2.5 <= top
                && guide_x.is_none_or(|g| g < lx - 0.5 || g > lx + lw + 0.5)
        };
        let (lx, ly) = candidates
            .iter()
            .copied()
            .find(fits)
            .unwrap_or(candidates[0]);
        c.text(lx, ly, &m.label, Face::Regular, 6.5, rgb(0.55, 0.1, 0.05));
    }
}

/// A tick label with as many decimals as the step needs; `scale` turns a
/// fraction into percent (100) or leaves it (1), `suffix` follows.
pub fn tick_label(v: f64, step: f64, scale: f64, suffix: &str) -> String {
    if v == 0.0 {
        return "0".to_string();
    }
    let decimals = (-(step * scale).log10().floor()).max(0.0) as usize;
    format!("{:.*}{suffix}", decimals, v * scale)
}
