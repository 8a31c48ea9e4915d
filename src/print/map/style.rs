//! The map's look: type sizes read across a meeting room, the room
//! around a plot, the contour line (a dark line on a white casing), and
//! how a cell without a plan is filled and hatched, with the key's
//! samples of both.

use super::contour::Path;
use super::field::Gap;
use crate::print::canvas::Canvas;
use crate::print::draw::{Colour as Color, grey};
use crate::print::geometry::{Corners, Rect};

/// Type sizes, points: large enough to read across a meeting room.
pub const TITLE: f64 = 10.5;

pub const AXIS: f64 = 9.0;

pub const TICK: f64 = 8.0;

pub const LABEL: f64 = 9.0;

/// Height of the digits of DejaVu Sans, as a fraction of the type size.
pub const DIGIT_HEIGHT: f64 = 0.73;

/// Room above the plot (title and the AQL axis label) and below it (tick
/// labels and the RQL axis label), mm.
pub const TOP_ROOM: f64 = 12.0;

pub const BOTTOM_ROOM: f64 = 12.5;

/// The colour bar: gap from the plot, width, tick length (mm).
pub const BAR_GAP: f64 = 5.0;

pub const BAR_W: f64 = 6.0;

pub const TICK_LEN: f64 = 1.2;

/// How far a cell's rectangle reaches into its neighbour, mm, so that the
/// anti-aliasing of a viewer shows no hairline seams between cells.
pub const SEAM: f64 = 0.12;

/// Spacing of the hatching of cells without a plan, mm across the plot.
const HATCH: f64 = 2.0;

/// The fill of a cell without a plan: light grey where the AQL is not
/// below the RQL (nothing to negotiate there), dark grey where the answer
/// is 100% inspection (the points need more units than the lot holds),
/// white under hatching for the other reasons.
pub fn gap_fill(g: Gap) -> Color {
    match g {
        Gap::NotBelow => grey(0.78),
        Gap::WholeLot => grey(0.45),
        Gap::BeyondCap | Gap::NoPlan => grey(1.0),
    }
}

/// The hatching of a reason: rising lines for points too close, falling
/// ones when no plan meets both points, none for an AQL not below the RQL.
pub fn hatch_direction(g: Gap) -> Option<f64> {
    match g {
        Gap::NotBelow | Gap::WholeLot => None,
        Gap::BeyondCap => Some(1.0),
        Gap::NoPlan => Some(-1.0),
    }
}

/// Hatching lines at 45 degrees over the rectangle `r`, rising
/// (`dir > 0`) or falling, on a lattice fixed to the rectangle's corner.
pub fn hatch_lines(r: Corners, dir: f64) -> Vec<Path> {
    let (x0, y0, x1, y1) = r;
    let h = y1 - y0;
    let count = ((x1 - x0 + h) / HATCH).ceil() as usize + 1;
    (0..count)
        .map(|k| {
            let sx = x0 - h + k as f64 * HATCH;
            if dir > 0.0 {
                vec![(sx, y0), (sx + h, y1)]
            } else {
                vec![(sx, y1), (sx + h, y0)]
            }
        })
        .collect()
}

/// A sample of a reason's look in the box `r`, for the key.
pub fn gap_swatch(c: &mut Canvas, g: Gap, r: Corners) {
    c.fill_rects(&[r], gap_fill(g));
    if let Some(dir) = hatch_direction(g) {
        let lines = hatch_lines(r, dir);
        c.clipped(&[r], |c| c.polylines(&lines, 0.5, grey(0.4)));
    }
    c.rect_stroke(Rect::new(r.0, r.1, r.2 - r.0, r.3 - r.1), 0.3, grey(0.5));
}

/// A sample of a contour line from `(x, y)`, `w` mm long, for the key.
pub fn contour_swatch(c: &mut Canvas, x: f64, y: f64, w: f64) {
    contour_strokes(c, &[vec![(x, y), (x + w, y)]]);
}

/// Radius of the ring that marks the agreed risk points, mm.
pub const AGREED_RING: f64 = 2.2;

/// The ring that marks the agreed risk points, centred at `(x, y)`: a dark
/// circle on a white casing, to read on every colour of the ramp.
pub fn agreed_ring(c: &mut Canvas, x: f64, y: f64) {
    let ring: Path = (0..=32)
        .map(|k| {
            let t = std::f64::consts::TAU * k as f64 / 32.0;
            (x + AGREED_RING * t.cos(), y + AGREED_RING * t.sin())
        })
        .collect();
    let ring = [ring];
    c.polylines(&ring, 2.4, grey(1.0));
    c.polylines(&ring, 1.0, grey(0.0));
}

/// Contour lines: a white casing under a dark line, so that they read on
/// the palest and the darkest colours alike.
pub fn contour_strokes(c: &mut Canvas, paths: &[Path]) {
    c.polylines(paths, 2.8, grey(1.0));
    c.polylines(paths, 1.1, grey(0.05));
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn hatching_covers_the_rectangle() {
        // Every point of the rectangle's bottom edge lies within one
        // spacing of a rising line.
        let r = (10.0, 20.0, 30.0, 25.0);
        let lines = hatch_lines(r, 1.0);
        let starts: Vec<f64> = lines.iter().map(|l| l[0].0).collect();
        for k in 0..=200 {
            let x = 10.0 + 20.0 * k as f64 / 200.0;
            assert!(starts.iter().any(|&s| (s - x).abs() <= HATCH), "{x}");
        }
        // A rising line climbs the rectangle's height over the same width.
        assert_eq!(lines[0][1].0 - lines[0][0].0, 5.0);
    }
}
