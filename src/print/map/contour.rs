//! Contour lines by marching squares: the field is known at the points of
//! a lattice (the grid's cell centres), and a contour of a level crosses an
//! edge of the lattice where the level lies between the edge's two values,
//! at the point found by linear interpolation between them. Each square of
//! four neighbouring points contributes up to two segments; segments that
//! share an edge are joined into paths.
//!
//! A square with a missing corner (a cell with no plan) contributes
//! nothing, so a contour ends at the border of the cells without a plan
//! instead of being invented across them. A saddle (two opposite corners
//! above the level, two below) is resolved by the mean of the four corners,
//! the value bilinear interpolation gives the square's centre.
//!
//! W. E. Lorensen and H. E. Cline, "Marching cubes: a high resolution 3D
//! surface construction algorithm", Computer Graphics 21(4), 1987, gives
//! the method in three dimensions; this is its two-dimensional case.

use std::collections::HashMap;

/// A path of a contour: points `(x, y)` in the lattice's coordinates.
pub type Path = Vec<(f64, f64)>;

/// A lattice of values: `z[i * xs.len() + j]` at `(xs[j], ys[i])`, `None`
/// where the field is not defined.
pub struct Lattice<'a> {
    /// The column coordinates, increasing.
    pub xs: &'a [f64],
    /// The row coordinates, increasing.
    pub ys: &'a [f64],
    /// The values, row by row.
    pub z: &'a [Option<f64>],
}

/// An edge of the lattice: from point `(i, j)` to its right neighbour
/// (`up == false`) or its upper neighbour (`up == true`).
#[derive(Clone, Copy, PartialEq, Eq, Hash)]
struct Edge {
    i: usize,
    j: usize,
    up: bool,
}

impl Lattice<'_> {
    fn at(&self, i: usize, j: usize) -> Option<f64> {
        self.z[i * self.xs.len() + j]
    }

    /// Where the contour of `level` crosses `edge`, whose two values lie
    /// on either side of it (one at or above, one below).
    fn crossing(&self, edge: Edge, level: f64) -> (f64, f64) {
        let (i1, j1) = if edge.up {
            (edge.i + 1, edge.j)
        } else {
            (edge.i, edge.j + 1)
        };
        // Both ends are defined: only squares with four values are traced.
        let a = self.at(edge.i, edge.j).unwrap_or(level);
        let b = self.at(i1, j1).unwrap_or(level);
        let t = if a == b { 0.5 } else { (level - a) / (b - a) };
        let (x0, y0) = (self.xs[edge.j], self.ys[edge.i]);
        let (x1, y1) = (self.xs[j1], self.ys[i1]);
        (x0 + t * (x1 - x0), y0 + t * (y1 - y0))
    }

    /// The paths of the contour of `level`. A point belongs to the upper
    /// side when its value is at or above the level.
    pub fn trace(&self, level: f64) -> Vec<Path> {
        let (rows, cols) = (self.ys.len(), self.xs.len());
        let mut segments: Vec<[Edge; 2]> = Vec::new();
        for i in 0..rows.saturating_sub(1) {
            for j in 0..cols.saturating_sub(1) {
                let corners = [
                    self.at(i, j),
                    self.at(i, j + 1),
                    self.at(i + 1, j + 1),
                    self.at(i + 1, j),
                ];
                let [Some(a), Some(b), Some(c), Some(d)] = corners else {
                    continue;
                };
                let code = usize::from(a >= level)
                    | usize::from(b >= level) << 1
                    | usize::from(c >= level) << 2
                    | usize::from(d >= level) << 3;
                let bottom = Edge { i, j, up: false };
                let right = Edge {
                    i,
                    j: j + 1,
                    up: true,
                };
                let top = Edge {
                    i: i + 1,
                    j,
                    up: false,
                };
                let left = Edge { i, j, up: true };
                let centre_up = (a + b + c + d) / 4.0 >= level;
                // Each pair cuts off the corner (or the side) that differs
                // from the rest of the square.
                let pairs: &[[Edge; 2]] = match code {
                    0 | 15 => &[],
                    1 | 14 => &[[left, bottom]],
                    2 | 13 => &[[bottom, right]],
                    3 | 12 => &[[left, right]],
                    4 | 11 => &[[right, top]],
                    6 | 9 => &[[bottom, top]],
                    7 | 8 => &[[left, top]],
                    // Corners a and c up: joined through an upper centre,
                    // so the segments cut off b and d; else a and c.
                    5 if centre_up => &[[bottom, right], [top, left]],
                    5 => &[[left, bottom], [right, top]],
                    // Corners b and d up: the mirror image.
                    10 if centre_up => &[[left, bottom], [right, top]],
                    _ => &[[bottom, right], [top, left]],
                };
                segments.extend_from_slice(pairs);
            }
        }
        self.join(&segments, level)
    }

    /// Joins segments that share an edge into paths: open paths first,
    /// each from an end that no other segment continues, then closed ones.
    /// Segments are visited in the order they were found, so the paths are
    /// the same on every run.
    fn join(&self, segments: &[[Edge; 2]], level: f64) -> Vec<Path> {
        let mut at: HashMap<Edge, Vec<usize>> = HashMap::with_capacity(segments.len() * 2);
        for (k, s) in segments.iter().enumerate() {
            for e in s {
                at.entry(*e).or_default().push(k);
            }
        }
        let mut used = vec![false; segments.len()];
        let mut paths = Vec::new();
        let walk = |start: usize, from: Edge, used: &mut Vec<bool>| {
            let mut path = vec![self.crossing(from, level)];
            let (mut k, mut entry) = (start, from);
            loop {
                used[k] = true;
                let s = segments[k];
                let exit = if s[0] == entry { s[1] } else { s[0] };
                let p = self.crossing(exit, level);
                if path.last() != Some(&p) {
                    path.push(p);
                }
                let next = at[&exit].iter().copied().find(|&m| !used[m]);
                match next {
                    Some(m) => (k, entry) = (m, exit),
                    None => break,
                }
            }
            path
        };
        for k in 0..segments.len() {
            if used[k] {
                continue;
            }
            if let Some(&end) = segments[k].iter().find(|e| at[e].len() == 1) {
                paths.push(walk(k, end, &mut used));
            }
        }
        for k in 0..segments.len() {
            if !used[k] {
                paths.push(walk(k, segments[k][0], &mut used));
            }
        }
        paths
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn lattice_of<'a>(xs: &'a [f64], ys: &'a [f64], z: &'a [Option<f64>]) -> Lattice<'a> {
        Lattice { xs, ys, z }
    }

    #[test]
    fn a_plane_gives_one_straight_path_at_the_interpolated_place() {
        // z = x on a 4 x 3 lattice: the contour of 1.25 is the line x = 1.25.
        let xs = [0.0, 1.0, 2.0, 3.0];
        let ys = [0.0, 1.0, 2.0];
        let z: Vec<Option<f64>> = (0..3).flat_map(|_| xs.iter().map(|&x| Some(x))).collect();
        let paths = lattice_of(&xs, &ys, &z).trace(1.25);
        assert_eq!(paths.len(), 1);
        assert_eq!(paths[0].len(), 3);
        for &(x, _) in &paths[0] {
            assert!((x - 1.25).abs() < 1e-12, "{:?}", paths[0]);
        }
        let mut y: Vec<f64> = paths[0].iter().map(|p| p.1).collect();
        y.sort_by(f64::total_cmp);
        assert_eq!(y, vec![0.0, 1.0, 2.0]);
    }

    #[test]
    fn a_peak_gives_one_closed_path() {
        // A single high point in the middle of a 3 x 3 lattice.
        let xs = [0.0, 1.0, 2.0];
        let ys = [0.0, 1.0, 2.0];
        let mut z = vec![Some(0.0); 9];
        z[4] = Some(4.0);
        let paths = lattice_of(&xs, &ys, &z).trace(2.0);
        assert_eq!(paths.len(), 1);
        let p = &paths[0];
        // Four crossings halfway along the four edges from the peak, the
        // first repeated at the end.
        assert_eq!(p.len(), 5, "{p:?}");
        assert_eq!(p.first(), p.last());
        for &(x, y) in p {
            let d = (x - 1.0).abs() + (y - 1.0).abs();
            assert!((d - 0.5).abs() < 1e-12, "{p:?}");
        }
    }

    #[test]
    fn a_contour_stops_at_missing_values() {
        // z = x, with the middle column of the top row missing: the square
        // that holds it is skipped, so the path has two points, not three.
        let xs = [0.0, 1.0, 2.0];
        let ys = [0.0, 1.0, 2.0];
        let mut z: Vec<Option<f64>> = (0..3).flat_map(|_| xs.iter().map(|&x| Some(x))).collect();
        z[7] = None;
        let paths = lattice_of(&xs, &ys, &z).trace(0.5);
        assert_eq!(paths, vec![vec![(0.5, 0.0), (0.5, 1.0)]]);
    }

    #[test]
    fn a_saddle_follows_the_centre() {
        // Corners a (0,0) and c (1,1) high, b and d low.
        let xs = [0.0, 1.0];
        let ys = [0.0, 1.0];
        let high_centre = [Some(3.0), Some(0.0), Some(3.0), Some(0.0)];
        // Row-major: (0,0), (0,1), (1,0), (1,1) -> a, b, d, c.
        let z = [
            high_centre[0],
            high_centre[1],
            high_centre[3],
            high_centre[2],
        ];
        let paths = lattice_of(&xs, &ys, &z).trace(1.0);
        // Mean 1.5 >= 1: a and c joined, the paths cut off b (1,0) and d (0,1).
        assert_eq!(paths.len(), 2);
        let near = |p: &Path, corner: (f64, f64)| {
            p.iter()
                .all(|&(x, y)| (x - corner.0).abs() + (y - corner.1).abs() < 1.0)
        };
        assert!(paths.iter().any(|p| near(p, (1.0, 0.0))), "{paths:?}");
        assert!(paths.iter().any(|p| near(p, (0.0, 1.0))), "{paths:?}");
        let z_low = [Some(1.2), Some(0.0), Some(0.0), Some(1.2)];
        let paths = lattice_of(&xs, &ys, &z_low).trace(1.0);
        // Mean 0.6 < 1: the paths cut off a (0,0) and c (1,1).
        assert!(paths.iter().any(|p| near(p, (0.0, 0.0))), "{paths:?}");
        assert!(paths.iter().any(|p| near(p, (1.0, 1.0))), "{paths:?}");
    }
}
