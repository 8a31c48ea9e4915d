//! Computed values read back as the short decimals they stand for.

/// `x` rounded to `digits` significant decimal digits (1 to 17), by
/// printing it in scientific notation and reading it back: the nearest
/// binary64 to that decimal. `0.06 - 0.01` rounded to 12 digits is the
/// 0.05 a user means, not 0.049999999999999996; with 15 digits the binary
/// noise of a sum of a few terms goes and nothing else moves (at most
/// `5e-16` relative). Values that are not finite come back as they are.
pub(crate) fn round_significant(x: f64, digits: usize) -> f64 {
    let decimals = digits.clamp(1, 17) - 1;
    format!("{x:.decimals$e}").parse().unwrap_or(x)
}

#[cfg(test)]
mod tests {
    use super::round_significant;

    #[test]
    fn sums_come_back_as_the_decimals_they_stand_for() {
        assert_eq!(round_significant(0.06 - 0.01, 12), 0.05);
        assert_eq!(round_significant(0.005 + 0.005, 15), 0.01);
        assert_eq!(round_significant(2.0 * 1e-7, 12), 2e-7);
        assert_eq!(round_significant(123.456, 2), 120.0);
        assert!(round_significant(f64::NAN, 12).is_nan());
        assert_eq!(round_significant(f64::INFINITY, 12), f64::INFINITY);
    }
}
