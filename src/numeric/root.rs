//! Bracketed root finding: Brent's method (R. P. Brent, *Algorithms for
//! Minimization without Derivatives*, Prentice-Hall 1973, chapter 4), which
//! keeps a sign change at every step and so never leaves the bracket.

/// Most iterations of Brent's method; it converges superlinearly on the
/// smooth monotone functions of this crate in about ten.
const MAX_ITERATIONS: usize = 200;

/// A root of `f` in `[a, b]`, where `f(a)` and `f(b)` differ in sign (or
/// one is zero), to an absolute width of `tol`. Returns `None` without a
/// sign change.
pub(crate) fn brent(mut f: impl FnMut(f64) -> f64, a: f64, b: f64, tol: f64) -> Option<f64> {
    let (mut a, mut b) = (a, b);
    let (mut fa, mut fb) = (f(a), f(b));
    if fa == 0.0 {
        return Some(a);
    }
    if fb == 0.0 {
        return Some(b);
    }
    if fa.signum() == fb.signum() || fa.is_nan() || fb.is_nan() {
        return None;
    }
    let (mut c, mut fc) = (a, fa);
    let (mut d, mut e) = (b - a, b - a);
    for _ in 0..MAX_ITERATIONS {
        if fb.signum() == fc.signum() {
            c = a;
            fc = fa;
            d = b - a;
            e = d;
        }
        if fc.abs() < fb.abs() {
            a = b;
            b = c;
            c = a;
            fa = fb;
            fb = fc;
            fc = fa;
        }
        let tol1 = 2.0 * f64::EPSILON * b.abs() + 0.5 * tol;
        let m = 0.5 * (c - b);
        if m.abs() <= tol1 || fb == 0.0 {
            return Some(b);
        }
        if e.abs() >= tol1 && fa.abs() > fb.abs() {
            // Inverse quadratic interpolation, or the secant step when only
            // two points are distinct.
            let s = fb / fa;
            let (mut p, mut q);
            if a == c {
                p = 2.0 * m * s;
                q = 1.0 - s;
            } else {
                let qa = fa / fc;
                let r = fb / fc;
                p = s * (2.0 * m * qa * (qa - r) - (b - a) * (r - 1.0));
                q = (qa - 1.0) * (r - 1.0) * (s - 1.0);
            }
            if p > 0.0 {
                q = -q;
            } else {
                p = -p;
            }
            if 2.0 * p < (3.0 * m * q - (tol1 * q).abs()).min((e * q).abs()) {
                e = d;
                d = p / q;
            } else {
                d = m;
                e = m;
            }
        } else {
            d = m;
            e = m;
        }
        a = b;
        fa = fb;
        b += if d.abs() > tol1 { d } else { tol1.copysign(m) };
        fb = f(b);
    }
    Some(b)
}

/// Widens `[lo, hi]` geometrically (each side by `step`, doubling, at most
/// 60 times, `lo` never below `floor`) until `f(lo)` and `f(hi)` differ in
/// sign; `f` is increasing.
pub(crate) fn expand_bracket(
    mut f: impl FnMut(f64) -> f64,
    mut lo: f64,
    mut hi: f64,
    floor: f64,
) -> Option<(f64, f64)> {
    let mut step = (hi - lo).max(1e-3);
    for _ in 0..60 {
        let (flo, fhi) = (f(lo), f(hi));
        if flo <= 0.0 && fhi >= 0.0 {
            return Some((lo, hi));
        }
        if flo > 0.0 {
            lo = (lo - step).max(floor);
        }
        if fhi < 0.0 {
            hi += step;
        }
        step *= 2.0;
    }
    None
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The root of x^3 - 2 is the cube root of 2 (closed form).
    #[test]
    fn cube_root() {
        let r = brent(|x| x * x * x - 2.0, 0.0, 2.0, 1e-15).unwrap_or(f64::NAN);
        assert!((r - 2f64.cbrt()).abs() < 1e-14);
        assert_eq!(brent(|x| x * x + 1.0, -1.0, 1.0, 1e-12), None);
        let (lo, hi) =
            expand_bracket(|x| x - 100.0, 0.0, 1.0, f64::NEG_INFINITY).unwrap_or((0.0, 0.0));
        assert!(lo <= 100.0 && hi >= 100.0);
    }
}
