//! Two limits, sigma unknown: the OC at any split of the lot's fraction
//! nonconforming between the two tails, and the worst split.
//!
//! # The accepted region in specification units
//!
//! Measure in units where the limits sit at `-1` and `1` (the midpoint at
//! 0, half the tolerance as the unit). A sample with mean `xbar` and
//! standard deviation `s` is accepted when `p_hat_L + p_hat_U <= M`, with
//! `Q_U = (1 - xbar) / s` and `Q_L = (1 + xbar) / s`. For `n >= 4` the
//! estimate is even in `xbar` and rises with `|xbar|`, so the accepted
//! means form the interval `|xbar| <= H(s)`, and `H` depends on `n` and
//! `M` only, not on the process:
//!
//! ```text
//! s <= s*:       H(s) = 1 - k_M s                  (p_hat_L = 0 at the edge)
//! s* < s < s_e:  F(1/2 - (1 - H) r) + F(1/2 - (1 + H) r) = M
//! s >= s_e:      nothing is accepted
//! ```
//!
//! with `F = I(.; n/2 - 1, n/2 - 1)`, `r = sqrt(n) / (2 (n - 1) s)`,
//! `k_M` the one-sided statistic of `M`, `s* = 2 / (k_M + (n - 1) /
//! sqrt(n))` (where `Q_L` at the edge reaches the end of the estimator's
//! range) and `s_e = 1 / k_{M/2}` (where the centred sample's estimate
//! reaches `M`). [`HalfWidths`] tabulates `H` once per plan.
//!
//! # The OC at a split
//!
//! A process with a share `w` of its fraction `p` beyond the lower limit
//! has `z_L = Phi^-1(1 - w p)`, `z_U = Phi^-1(1 - (1 - w) p)`, hence, in
//! specification units, `sigma = 2 / (z_L + z_U)` and mean
//! `mu = sigma (z_L - z_U) / 2`. With `S = s / sigma` distributed as
//! `chi_{n-1} / sqrt(n - 1)` and `xbar` independent of it,
//!
//! ```text
//! Pa(p, w) = ∫ f_S(t) [Phi(sqrt(n) (H(sigma t) - mu) / sigma)
//!                     - Phi(sqrt(n) (-H(sigma t) - mu) / sigma)] dt
//! ```
//!
//! (the sampling law of `(xbar, s)` for a normal sample, e.g. Montgomery's
//! chapter on acceptance sampling by variables, from memory). `w` and
//! `1 - w` give the same `Pa` by symmetry; `w = 1/2` is the centred
//! process and `w -> 0` the one-sided one, whose `Pa` is the noncentral t
//! formula of [`VariablesPlan::pa`](super::VariablesPlan::pa).
//!
//! # The worst split
//!
//! `Pa(p, w)` is not monotone in `w` in general (an interior split can be
//! worse than both ends, by up to about `4e-4` at `n <= 18`), so the worst
//! split is found by a coarse scan of `w` in `(0, 1/2]` followed by a
//! golden-section search between the scanned neighbours of the worst point.

use serde::Serialize;
use statrs::function::beta::beta_reg;
use statrs::function::gamma::ln_gamma;

use super::estimate::statistic_for_fraction;
use crate::model::noncentral_t::ScaleDensity;
use crate::model::normal;
use crate::numeric::integrate;

/// Chebyshev points (second kind) at which `H` is tabulated between `s*`
/// and `s_e`. In the variable `u` of [`HalfWidths`], `H` is analytic near
/// `[0, 1]`, but for large `n` the onset of `p_hat_L` is steep (the beta
/// estimator nears a normal tail): 33 points leave errors of `4e-12` in
/// the estimate at `n = 43` but `1e-9` at `n = 1299`, 65 points leave
/// rounding (checked against the edge equation in the tests). Samples up
/// to [`FEW_NODES_UP_TO`] take the smaller table, half the cost.
const NODES: usize = 65;
const FEW_NODES: usize = 33;
const FEW_NODES_UP_TO: u64 = 60;

/// Relative tolerance of the integral over `s`: `Pa` is then good to about
/// `1e-10`, well inside the `1e-8` floor on the risks this OC vouches for.
const PA_TOL: f64 = 1e-10;

/// Which end of the OC over splits is wanted.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Worst {
    /// The producer's side: the split with the smallest `Pa` at the AQL.
    Lowest,
    /// The consumer's side: the split with the largest `Pa` at the RQL.
    Highest,
}

/// A split of the lot's fraction nonconforming and the plan's `Pa` there.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct WorstSplit {
    /// The share of the fraction beyond the lower limit, in `[0, 1/2]`
    /// (the mirror image `1 - share` gives the same `Pa`): 0 is all of it
    /// beyond one limit, 1/2 the centred process.
    pub share: f64,
    /// `Pa` at that split.
    pub pa: f64,
}

/// The half-width `H(s)` of the accepted interval of the sample mean, in
/// specification units, tabulated for one `(n, M)`.
///
/// Between `s*` and `s_e` the table is taken in `u in [0, 1]` with
/// `s = s* + (s_e - s*) u^2 (3 - 2 u)`: the map's flat ends turn the
/// `(s - s*)^(n/2 - 1)` onset of `p_hat_L` and the `(s_e - s)^(1/2)` fall
/// of `H` at the top into smooth functions of `u`.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct HalfWidths {
    k_m: f64,
    s_star: f64,
    s_end: f64,
    /// Chebyshev coefficients of `H` in `x = 1 - 2u`, the first `count`
    /// used.
    coefficients: [f64; NODES],
    count: usize,
}

impl HalfWidths {
    /// The table for a sample of `n >= 4` and `0 < m < 1/2`.
    pub(crate) fn new(n: u64, m: f64) -> Self {
        let nf = n as f64;
        let k_m = statistic_for_fraction(m, n, false);
        let q_end = (nf - 1.0) / nf.sqrt();
        let s_end = 1.0 / statistic_for_fraction(0.5 * m, n, false);
        let s_star = (2.0 / (k_m + q_end)).min(s_end);
        // cos(pi i / (N - 1)) for i < 2 (N - 1): the nodes and the cosine
        // transform's kernel, cos(pi j k / (N - 1)) = cosines[j k mod 2(N - 1)].
        let count = if n <= FEW_NODES_UP_TO {
            FEW_NODES
        } else {
            NODES
        };
        let period = 2 * (count - 1);
        let cosines: Vec<f64> = (0..period)
            .map(|i| (std::f64::consts::PI * i as f64 / (count - 1) as f64).cos())
            .collect();
        let edge = Edge::new(n, m);
        // Node j sits at x_j = cos(pi j / (N - 1)), u_j = (1 - x_j) / 2: from
        // s* (j = 0, where the closed form holds) to s_e (H = 0).
        let mut values = [0.0; NODES];
        values[0] = 1.0 - k_m * s_star;
        // Each root starts from the previous node's ratio H^2 / top^2, which
        // moves slowly along s (it is 1 while p_hat_L is negligible).
        let mut ratio = 1.0;
        for (j, value) in values.iter_mut().enumerate().take(count - 1).skip(1) {
            let u = 0.5 * (1.0 - cosines[j]);
            let s = s_star + (s_end - s_star) * u * u * (3.0 - 2.0 * u);
            let top = (1.0 - k_m * s).powi(2);
            let eta = edge.solve(s, top, ratio * top);
            ratio = eta / top;
            *value = eta.sqrt();
        }
        // c_k = 2/(N - 1) sum'' f_j cos(pi j k / (N - 1)), the end terms
        // halved, and c_0, c_{N-1} halved again for the plain sum of
        // c_k T_k (the interpolant at the Chebyshev extrema; L. N.
        // Trefethen, *Approximation Theory and Approximation Practice*,
        // SIAM 2013, chapter 3).
        let mut coefficients = [0.0; NODES];
        for (k, c) in coefficients.iter_mut().enumerate().take(count) {
            let mut sum = 0.0;
            for (j, value) in values.iter().enumerate().take(count) {
                let end = if j == 0 || j == count - 1 { 0.5 } else { 1.0 };
                sum += end * value * cosines[(j * k) % period];
            }
            let end = if k == 0 || k == count - 1 { 0.5 } else { 1.0 };
            *c = end * 2.0 * sum / (count - 1) as f64;
        }
        HalfWidths {
            k_m,
            s_star,
            s_end,
            coefficients,
            count,
        }
    }

    /// `s_e`: beyond it nothing is accepted.
    pub(crate) fn s_end(&self) -> f64 {
        self.s_end
    }

    /// `H(s)`, by the closed form below `s*` and the Chebyshev series in
    /// `u` above it, summed by Clenshaw's recurrence.
    pub(crate) fn at(&self, s: f64) -> f64 {
        if s <= self.s_star {
            return 1.0 - self.k_m * s;
        }
        if s >= self.s_end {
            return 0.0;
        }
        // The inverse of x = u^2 (3 - 2u) on [0, 1], in closed form.
        let x = ((s - self.s_star) / (self.s_end - self.s_star)).min(1.0);
        let u = 0.5 - ((1.0 - 2.0 * x).asin() / 3.0).sin();
        let t = 1.0 - 2.0 * u;
        let (mut b1, mut b2) = (0.0, 0.0);
        for c in self.coefficients[1..self.count].iter().rev() {
            let b0 = c + 2.0 * t * b1 - b2;
            b2 = b1;
            b1 = b0;
        }
        (self.coefficients[0] + t * b1 - b2).max(0.0)
    }
}

/// The edge equation `F(y_U) + F(y_L) = M` of one `(n, M)`.
struct Edge {
    m: f64,
    a: f64,
    ln_beta: f64,
    r_scale: f64,
}

impl Edge {
    fn new(n: u64, m: f64) -> Self {
        let nf = n as f64;
        let a = 0.5 * nf - 1.0;
        Edge {
            m,
            a,
            ln_beta: 2.0 * ln_gamma(a) - ln_gamma(2.0 * a),
            r_scale: nf.sqrt() / (2.0 * (nf - 1.0)),
        }
    }

    /// The Beta(a, a) density, 0 outside `(0, 1)`.
    fn density(&self, y: f64) -> f64 {
        if y <= 0.0 || y >= 1.0 {
            return 0.0;
        }
        ((self.a - 1.0) * (y * (1.0 - y)).ln() - self.ln_beta).exp()
    }

    /// `eta = H(s)^2`, the root in `[0, top]` of `g(h) = F(y_U) + F(y_L) -
    /// M`, by Newton's method in `eta` from `start`: `g` is even in `h`, so
    /// it is smooth in `h^2` where `H` itself falls like a square root.
    /// Each step keeps a sign-change bracket and bisects when Newton leaves
    /// it, so it cannot diverge.
    fn solve(&self, s: f64, top: f64, start: f64) -> f64 {
        let r = self.r_scale / s;
        let estimate = |h: f64| -> (f64, f64, f64) {
            let (yu, yl) = (0.5 - (1.0 - h) * r, 0.5 - (1.0 + h) * r);
            let lower = if yl > 0.0 {
                beta_reg(self.a, self.a, yl.min(1.0))
            } else {
                0.0
            };
            (
                beta_reg(self.a, self.a, yu.clamp(0.0, 1.0)) + lower - self.m,
                yu,
                yl,
            )
        };
        // While p_hat_L at the upper estimate's own root `top` is below
        // rounding of M, the closed form is the root.
        let h_top = top.sqrt();
        if estimate(h_top).0.abs() <= 1e-16 * self.m {
            return top;
        }
        let (mut lo, mut hi) = (0.0, top);
        let mut eta = start.clamp(0.0, top);
        for _ in 0..100 {
            let h = eta.sqrt();
            let (g, yu, yl) = estimate(h);
            if g == 0.0 {
                return eta;
            }
            if g < 0.0 {
                lo = eta;
            } else {
                hi = eta;
            }
            let slope = r * (self.density(yu) - self.density(yl)) / (2.0 * h.max(1e-300));
            let newton = eta - g / slope;
            let inside = newton.is_finite() && newton > lo && newton < hi;
            // Newton converges quadratically: after a step of 1e-8
            // (relative) the next iterate is good to rounding.
            if inside && (newton - eta).abs() <= 1e-8 * eta {
                return newton;
            }
            let next = if inside { newton } else { 0.5 * (lo + hi) };
            if hi - lo <= 1e-15 * hi {
                return next;
            }
            eta = next;
        }
        eta
    }
}

/// `Pa(p, w)` of the module docs for the plan of `n` with the table `h`,
/// `w` the share of `p` beyond the lower limit.
pub(crate) fn pa_at_split(h: &HalfWidths, n: u64, p: f64, share: f64) -> f64 {
    let z_lower = normal::upper_quantile(share * p);
    let z_upper = normal::upper_quantile((1.0 - share) * p);
    if z_lower + z_upper <= 0.0 {
        // Beyond the limits on both sides at once: no such normal process
        // for p this high; the estimate then always exceeds M < 1/2.
        return 0.0;
    }
    let sigma = 2.0 / (z_lower + z_upper);
    let mu = 0.5 * sigma * (z_lower - z_upper);
    let scale = (n as f64).sqrt() / sigma;
    let density = ScaleDensity::new(n - 1);
    let accepted = |t: f64| -> f64 {
        let half = h.at(sigma * t);
        if half <= 0.0 {
            return 0.0;
        }
        let inside = normal::cdf(scale * (half - mu)) - normal::cdf(-scale * (half + mu));
        density.pdf(t) * inside.max(0.0)
    };
    let (lo, hi) = density.bulk();
    let t_end = h.s_end() / sigma;
    if t_end <= lo {
        return 0.0;
    }
    if t_end >= hi {
        return integrate(accepted, lo, hi, 4, PA_TOL).clamp(0.0, 1.0);
    }
    // Near t_end the half-width falls like sqrt(t_end - t): in v with
    // t = t_end - v^2 the integrand is smooth.
    let top = (t_end - lo).sqrt();
    integrate(|v| 2.0 * v * accepted(t_end - v * v), 0.0, top, 4, PA_TOL).clamp(0.0, 1.0)
}

/// Shares scanned before the refinement: dense towards 0, where the
/// lower tail's quantile changes fastest with the share.
const SCAN: [f64; 9] = [0.5, 0.4, 0.3, 0.2, 0.1, 0.05, 0.02, 0.008, 0.002];

/// Golden-section steps after the scan: each keeps 0.618 of the bracket,
/// so 14 steps narrow a bracket of at most 0.1 to below 1e-4. At an
/// interior worst split `Pa` is flat in the share, so the error left in
/// `Pa` is of the order of the bracket squared times its curvature, far
/// below the quadrature's `1e-10`.
const GOLDEN_STEPS: usize = 14;

/// Half-width of the bracket about a known worst share, and the golden
/// steps that narrow it to below 1e-3 (see [`worst_split_near`]).
const NEAR: f64 = 0.04;
const NEAR_STEPS: usize = 9;

/// The worst split in `(0, 1/2]` of `pa(share)`: a scan of [`SCAN`], then
/// a golden-section search between the scanned neighbours of the worst.
pub(crate) fn worst_split(pa: impl Fn(f64) -> f64, worst: Worst) -> WorstSplit {
    let badness = Badness::new(pa, worst);
    let scanned: Vec<f64> = SCAN.iter().map(|&w| badness.at(w)).collect();
    let best = scanned
        .iter()
        .enumerate()
        .max_by(|x, y| x.1.total_cmp(y.1))
        .map_or(0, |(i, _)| i);
    let a = SCAN.get(best + 1).copied().unwrap_or(0.0);
    let b = if best > 0 { SCAN[best - 1] } else { 0.5 };
    badness.golden(a, b, GOLDEN_STEPS, (SCAN[best], scanned[best]))
}

/// The worst split near a share `around` found before (at a nearby `M` or
/// `n`, where the worst split moves little): a golden-section search on
/// `around -+ NEAR`, kept inside `(0, 1/2]`.
pub(crate) fn worst_split_near(pa: impl Fn(f64) -> f64, worst: Worst, around: f64) -> WorstSplit {
    let badness = Badness::new(pa, worst);
    let (a, b) = ((around - NEAR).max(0.0), (around + NEAR).min(0.5));
    let start = (around, badness.at(around));
    badness.golden(a, b, NEAR_STEPS, start)
}

/// `Pa` signed so that larger is worse, on either side.
struct Badness<F> {
    pa: F,
    sign: f64,
}

impl<F: Fn(f64) -> f64> Badness<F> {
    fn new(pa: F, worst: Worst) -> Self {
        let sign = match worst {
            Worst::Lowest => -1.0,
            Worst::Highest => 1.0,
        };
        Badness { pa, sign }
    }

    fn at(&self, w: f64) -> f64 {
        self.sign * (self.pa)(w)
    }

    /// Golden-section search for the largest badness on `[a, b]`, `steps`
    /// narrowings; the worst of its last points and `known` (a share and
    /// its badness already evaluated) is returned.
    fn golden(&self, mut a: f64, mut b: f64, steps: usize, known: (f64, f64)) -> WorstSplit {
        let ratio = 0.5 * (5f64.sqrt() - 1.0);
        let mut c = b - ratio * (b - a);
        let mut d = a + ratio * (b - a);
        let (mut fc, mut fd) = (self.at(c), self.at(d));
        for _ in 0..steps {
            if fc >= fd {
                b = d;
                d = c;
                fd = fc;
                c = b - ratio * (b - a);
                fc = self.at(c);
            } else {
                a = c;
                c = d;
                fc = fd;
                d = a + ratio * (b - a);
                fd = self.at(d);
            }
        }
        let (share, badness) = [(c, fc), (d, fd)]
            .into_iter()
            .fold(known, |best, x| if x.1 > best.1 { x } else { best });
        WorstSplit {
            share,
            pa: self.sign * badness,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::plan::estimate::fraction_beyond_unknown;

    /// The interpolated half-width satisfies the edge equation it
    /// tabulates: the estimate at `xbar = H(s)` equals `M`, at points
    /// between the nodes, for a small and a large sample.
    #[test]
    fn half_width_meets_the_edge_equation() {
        for (n, m) in [
            (5, 0.08),
            (43, 0.0265),
            (410, 0.0146),
            (1299, 0.0125),
            (3651, 0.0003),
        ] {
            let table = HalfWidths::new(n, m);
            let (lo, hi) = (table.s_star, table.s_end);
            for i in 1..40 {
                let s = lo + (hi - lo) * (i as f64 - 0.37) / 40.0;
                let h = table.at(s);
                let estimate = fraction_beyond_unknown((1.0 - h) / s, n)
                    + fraction_beyond_unknown((1.0 + h) / s, n);
                let tol = if n <= FEW_NODES_UP_TO { 1e-11 } else { 1e-13 };
                assert!(
                    (estimate - m).abs() < tol,
                    "n = {n}, s = {s}: estimate {estimate} against {m}"
                );
            }
        }
    }

    /// At a share near 0 `Pa` approaches the one-sided noncentral t value
    /// (the other tail vanishing), computed by a different method.
    #[test]
    fn ends_of_the_split() {
        let (n, m, p) = (43, 0.0265, 0.03);
        let table = HalfWidths::new(n, m);
        let one = crate::plan::VariablesPlan::new(
            crate::plan::Specification::new(
                crate::plan::SigmaKind::Unknown,
                None,
                crate::plan::LimitKind::Both,
                Some(-1.0),
                Some(1.0),
            )
            .unwrap(),
            n,
            m,
        )
        .unwrap()
        .pa(p);
        let near = pa_at_split(&table, n, p, 1e-12);
        assert!((near - one).abs() < 1e-6, "{near} against {one}");
    }
}
