//! The labels of a panel's contour lines: each on its line where its box
//! stays inside the plot, apart from the other labels and crossed by no
//! other line; and the lines themselves, simplified below the width they
//! are drawn at.

use super::contour::Path;
use super::field::value_label;
use super::style::{DIGIT_HEIGHT, LABEL};
use crate::print::canvas::Canvas;
use crate::print::draw::{Face, grey};
use crate::print::geometry::{Corners, MM_PER_PT, segment_hits};

/// Contour labels: padding of the white box around the digits (mm), the
/// least gap between two labels, and the least distance along one line
/// between two of its labels.
const PAD_X: f64 = 0.9;

const PAD_Y: f64 = 0.8;

const LABEL_GAP: f64 = 2.0;

const LABEL_SPACING: f64 = 100.0;

/// Where along a line its labels are tried, as fractions of its length:
/// the middle first, then outwards.
const FRACTIONS: [f64; 9] = [0.5, 0.38, 0.62, 0.26, 0.74, 0.15, 0.85, 0.07, 0.93];

/// Simplification tolerance of the drawn lines, mm: far below the width of
/// the line.
pub const SIMPLIFY: f64 = 0.05;

/// The labels of every level: for each path of a level, longest first,
/// the positions along it (the middle first, then outwards, at least
/// [`LABEL_SPACING`] apart along the line) where a label's box stays
/// inside the plot, keeps [`LABEL_GAP`] from every label placed before it
/// and is crossed by no other line. A line with no such position, or
/// shorter than three labels, goes unlabelled: a missing label is better
/// than a crowded one. Returns the boxes per level.
pub fn place_labels(
    c: &Canvas,
    levels: &[f64],
    on_page: &[Vec<Path>],
    drawn: &[Vec<Path>],
    (left, bottom, right, top): Corners,
) -> Vec<Vec<Corners>> {
    let bounds: Vec<Vec<Corners>> = drawn
        .iter()
        .map(|paths| paths.iter().map(|p| bounding_box(p)).collect())
        .collect();
    let crossed_by_another = |r: Corners, level: usize, path: usize| {
        drawn.iter().enumerate().any(|(li, paths)| {
            paths.iter().enumerate().any(|(k, pts)| {
                let b = bounds[li][k];
                (li, k) != (level, path)
                    && b.0 <= r.2
                    && r.0 <= b.2
                    && b.1 <= r.3
                    && r.1 <= b.3
                    && pts.windows(2).any(|s| segment_hits(s[0], s[1], r))
            })
        })
    };
    let mut placed: Vec<Corners> = Vec::new();
    let mut out = Vec::with_capacity(levels.len());
    let bh = DIGIT_HEIGHT * LABEL * MM_PER_PT + 2.0 * PAD_Y;
    for (li, &level) in levels.iter().enumerate() {
        let bw = c.width(&value_label(level), Face::Bold, LABEL) + 2.0 * PAD_X;
        let lengths: Vec<Vec<f64>> = on_page[li].iter().map(|p| cumulative(p)).collect();
        let mut order: Vec<usize> = (0..on_page[li].len()).collect();
        order.sort_by(|&a, &b| {
            let total = |k: usize| lengths[k].last().copied().unwrap_or(0.0);
            total(b).total_cmp(&total(a))
        });
        let mut boxes = Vec::new();
        for k in order {
            let total = lengths[k].last().copied().unwrap_or(0.0);
            if total < 3.0 * bw {
                continue;
            }
            let mut along: Vec<f64> = Vec::new();
            for f in FRACTIONS {
                let s = f * total;
                if along.iter().any(|&a| (a - s).abs() < LABEL_SPACING) {
                    continue;
                }
                let (px, py) = point_along(&on_page[li][k], &lengths[k], s);
                let r = (px - bw / 2.0, py - bh / 2.0, px + bw / 2.0, py + bh / 2.0);
                let inside = r.0 >= left + 0.6
                    && r.2 <= right - 0.6
                    && r.1 >= bottom + 0.6
                    && r.3 <= top - 0.6;
                let apart = placed.iter().all(|o| {
                    r.0 > o.2 + LABEL_GAP
                        || o.0 > r.2 + LABEL_GAP
                        || r.1 > o.3 + LABEL_GAP
                        || o.1 > r.3 + LABEL_GAP
                });
                let grown = (r.0 - 0.3, r.1 - 0.3, r.2 + 0.3, r.3 + 0.3);
                if inside && apart && !crossed_by_another(grown, li, k) {
                    placed.push(r);
                    boxes.push(r);
                    along.push(s);
                }
            }
        }
        out.push(boxes);
    }
    out
}

/// A contour label: its value in bold on a white box that interrupts the
/// line.
pub fn draw_label(c: &mut Canvas, text: &str, r: Corners) {
    draw_box_text(c, text, Face::Bold, LABEL, r);
}

/// `text` centred in a white box `r`.
pub fn draw_box_text(c: &mut Canvas, text: &str, face: Face, size: f64, r: Corners) {
    c.fill_rects(&[r], grey(1.0));
    let tw = c.width(text, face, size);
    let baseline = (r.1 + r.3) / 2.0 - DIGIT_HEIGHT * size * MM_PER_PT / 2.0;
    c.text(
        (r.0 + r.2 - tw) / 2.0,
        baseline,
        text,
        face,
        size,
        grey(0.05),
    );
}

/// The smallest rectangle holding `path`.
fn bounding_box(path: &[(f64, f64)]) -> Corners {
    path.iter().fold(
        (
            f64::INFINITY,
            f64::INFINITY,
            f64::NEG_INFINITY,
            f64::NEG_INFINITY,
        ),
        |(a, b, c, d), &(x, y)| (a.min(x), b.min(y), c.max(x), d.max(y)),
    )
}

/// The length along `path` to each of its points.
fn cumulative(path: &[(f64, f64)]) -> Vec<f64> {
    let mut out = Vec::with_capacity(path.len());
    let mut total = 0.0;
    for (k, p) in path.iter().enumerate() {
        if k > 0 {
            let q = path[k - 1];
            total += (p.0 - q.0).hypot(p.1 - q.1);
        }
        out.push(total);
    }
    out
}

/// The point `s` mm along `path`, whose cumulative lengths are `lengths`.
fn point_along(path: &[(f64, f64)], lengths: &[f64], s: f64) -> (f64, f64) {
    let k = lengths.partition_point(|&l| l < s).clamp(1, path.len() - 1);
    let (a, b) = (path[k - 1], path[k]);
    let seg = lengths[k] - lengths[k - 1];
    let t = if seg > 0.0 {
        ((s - lengths[k - 1]) / seg).clamp(0.0, 1.0)
    } else {
        0.0
    };
    (a.0 + t * (b.0 - a.0), a.1 + t * (b.1 - a.1))
}

/// `path` with the points dropped that lie within `tol` mm of the line
/// through the points kept on either side (Ramer-Douglas-Peucker).
pub fn simplify(path: &[(f64, f64)], tol: f64) -> Path {
    if path.len() <= 2 {
        return path.to_vec();
    }
    let mut keep = vec![false; path.len()];
    keep[0] = true;
    keep[path.len() - 1] = true;
    let mut stack = vec![(0, path.len() - 1)];
    while let Some((a, b)) = stack.pop() {
        let (pa, pb) = (path[a], path[b]);
        let (dx, dy) = (pb.0 - pa.0, pb.1 - pa.1);
        let len = dx.hypot(dy);
        let distance = |p: (f64, f64)| {
            if len == 0.0 {
                (p.0 - pa.0).hypot(p.1 - pa.1)
            } else {
                ((p.0 - pa.0) * dy - (p.1 - pa.1) * dx).abs() / len
            }
        };
        let far = (a + 1..b)
            .map(|k| (k, distance(path[k])))
            .max_by(|x, y| x.1.total_cmp(&y.1));
        if let Some((k, d)) = far
            && d > tol
        {
            keep[k] = true;
            stack.push((a, k));
            stack.push((k, b));
        }
    }
    path.iter()
        .zip(keep)
        .filter_map(|(&p, k)| k.then_some(p))
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Places the labels of `paths` (one path per level, levels 10, 20,
    /// ...) on a plot from (0, 0) to (200, 100) mm.
    fn labels_of(paths: &[Path]) -> Vec<Vec<Corners>> {
        let fonts = crate::print::fonts::Fonts::embedded().unwrap();
        let mut page = crate::print::draw::Recorder::default();
        let c = Canvas::new(&mut page, &fonts);
        let levels: Vec<f64> = (1..=paths.len()).map(|k| 10.0 * k as f64).collect();
        let per_level: Vec<Vec<Path>> = paths.iter().map(|p| vec![p.clone()]).collect();
        place_labels(
            &c,
            &levels,
            &per_level,
            &per_level,
            (0.0, 0.0, 200.0, 100.0),
        )
    }

    fn gap_between(a: Corners, b: Corners) -> f64 {
        let dx = (b.0 - a.2).max(a.0 - b.2).max(0.0);
        let dy = (b.1 - a.3).max(a.1 - b.3).max(0.0);
        dx.max(dy)
    }

    #[test]
    fn labels_of_close_lines_step_aside_to_keep_apart() {
        // Two lines 5 mm apart: both labels at the middle would come closer
        // than the gap, so the second moves along its line.
        let labels = labels_of(&[
            vec![(20.0, 40.0), (140.0, 40.0)],
            vec![(20.0, 45.0), (140.0, 45.0)],
        ]);
        assert_eq!(labels[0].len(), 1);
        assert_eq!(labels[1].len(), 1);
        assert!((labels[0][0].0 + labels[0][0].2) / 2.0 == 80.0);
        assert!(gap_between(labels[0][0], labels[1][0]) > LABEL_GAP);
    }

    #[test]
    fn a_label_crossed_by_another_line_or_leaving_the_plot_is_skipped() {
        // Lines 2 mm apart cross each other's labels wherever they go; a
        // line along the plot's bottom edge has no room for a box.
        let labels = labels_of(&[
            vec![(20.0, 60.0), (140.0, 60.0)],
            vec![(20.0, 62.0), (140.0, 62.0)],
            vec![(20.0, 0.5), (140.0, 0.5)],
        ]);
        assert!(labels.iter().all(Vec::is_empty), "{labels:?}");
    }

    #[test]
    fn a_short_line_goes_unlabelled_and_a_long_one_gets_spaced_labels() {
        let labels = labels_of(&[
            vec![(20.0, 20.0), (30.0, 20.0)],
            vec![(0.0, 60.0), (200.0, 60.0), (200.0, 0.0), (0.0, 0.0)],
        ]);
        assert!(labels[0].is_empty());
        // Along the 460 mm line, labels at least LABEL_SPACING apart.
        let long = &labels[1];
        assert!(long.len() >= 2, "{long:?}");
        for (i, a) in long.iter().enumerate() {
            for b in &long[i + 1..] {
                let (ca, cb) = ((a.0 + a.2) / 2.0, (b.0 + b.2) / 2.0);
                let (ya, yb) = ((a.1 + a.3) / 2.0, (b.1 + b.3) / 2.0);
                assert!((ca - cb).abs() + (ya - yb).abs() >= LABEL_SPACING - 1e-9);
            }
        }
    }

    #[test]
    fn simplifying_drops_only_points_near_the_line() {
        let path = vec![(0.0, 0.0), (1.0, 0.01), (2.0, 0.0), (3.0, 1.0)];
        assert_eq!(
            simplify(&path, 0.05),
            vec![(0.0, 0.0), (2.0, 0.0), (3.0, 1.0)]
        );
        assert_eq!(simplify(&path, 0.001), path);
    }

    #[test]
    fn a_point_along_a_path_is_measured_by_its_length() {
        let path = vec![(0.0, 0.0), (3.0, 0.0), (3.0, 4.0)];
        let lengths = cumulative(&path);
        assert_eq!(lengths, vec![0.0, 3.0, 7.0]);
        assert_eq!(point_along(&path, &lengths, 5.0), (3.0, 2.0));
        assert_eq!(point_along(&path, &lengths, 1.5), (1.5, 0.0));
    }
}
