//! Integer threshold search on exact probabilities.
//!
//! The designers ask, for a fixed acceptance number, for the first sample
//! size at which a monotone condition on an exact tail probability turns
//! true. Evaluations are the cost, so the search starts from an
//! approximation's guess, grows a bracket geometrically around it, then
//! narrows it by regula falsi on a smooth score (the log of the probability
//! against the log of its limit, nearly linear in `n`) with a bisection step
//! whenever an interpolation fails to halve the bracket. Each interpolated
//! point is followed by a probe of its neighbour, which ends most searches
//! two or three evaluations after the bracket is found.

/// Smallest `n` in `lo..=hi` for which `test(n).0` holds, or `None` when it
/// does not hold at `hi`.
///
/// `test(n)` returns the condition and a score that is positive where the
/// condition fails and at most zero where it holds, nonincreasing in `n`
/// (used only to interpolate; NaN and infinities are tolerated). The
/// condition must be monotone: false up to some `n`, true from there on.
pub(crate) fn first_true(
    lo: u64,
    hi: u64,
    guess: u64,
    mut test: impl FnMut(u64) -> (bool, f64),
) -> Option<u64> {
    if lo > hi {
        return None;
    }
    let guess = guess.clamp(lo, hi);
    let (ok, score) = test(guess);
    // Bracket: condition false at `a` (or a = lo - 1), true at `b`.
    let (mut a, mut fa, mut b, mut fb);
    let mut step = (guess / 200).max(1);
    if ok {
        b = guess;
        fb = score;
        loop {
            if b == lo {
                return Some(lo);
            }
            let x = b.saturating_sub(step).max(lo);
            let (ok, s) = test(x);
            if ok {
                b = x;
                fb = s;
                step = step.saturating_mul(4);
            } else {
                a = x;
                fa = s;
                break;
            }
        }
    } else {
        a = guess;
        fa = score;
        loop {
            if a == hi {
                return None;
            }
            let x = a.saturating_add(step).min(hi);
            let (ok, s) = test(x);
            if ok {
                b = x;
                fb = s;
                break;
            }
            a = x;
            fa = s;
            step = step.saturating_mul(4);
        }
    }
    let mut bisect = false;
    while b - a > 1 {
        let width = b - a;
        let x = if !bisect && fa.is_finite() && fb.is_finite() && fa > fb {
            let t = fa / (fa - fb);
            (a as f64 + t * width as f64).ceil() as u64
        } else {
            a + width / 2
        };
        let x = x.clamp(a + 1, b - 1);
        let (ok, s) = test(x);
        if ok {
            b = x;
            fb = s;
            if b - a > 1 {
                let (ok_left, s_left) = test(b - 1);
                if ok_left {
                    b -= 1;
                    fb = s_left;
                } else {
                    return Some(b);
                }
            }
        } else {
            a = x;
            fa = s;
            if b - a > 1 {
                let (ok_right, s_right) = test(a + 1);
                if ok_right {
                    return Some(a + 1);
                }
                a += 1;
                fa = s_right;
            }
        }
        bisect = 2 * (b - a) > width;
    }
    Some(b)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finds_the_threshold_from_any_guess() {
        for threshold in [1u64, 2, 17, 1000, 123_456, 9_999_999] {
            for guess in [
                1u64,
                threshold / 2 + 1,
                threshold,
                threshold + 3,
                10_000_000,
            ] {
                let mut calls = 0;
                let found = first_true(1, 10_000_000, guess, |n| {
                    calls += 1;
                    (n >= threshold, threshold as f64 - n as f64 - 0.5)
                });
                assert_eq!(found, Some(threshold), "guess {guess}");
                assert!(
                    calls < 80,
                    "threshold {threshold}, guess {guess}: {calls} calls"
                );
            }
        }
    }

    #[test]
    fn reports_a_condition_that_never_holds() {
        assert_eq!(first_true(1, 100, 50, |_| (false, 1.0)), None);
        assert_eq!(first_true(5, 4, 5, |_| (true, 0.0)), None);
        assert_eq!(first_true(5, 100, 50, |_| (true, -1.0)), Some(5));
    }
}
