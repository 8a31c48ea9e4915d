//! How numbers are written: in messages ([`Short`]), in a report's
//! sentences and cells ([`format_quality`], [`format_quality_cell`]), and
//! to a number of significant digits ([`format_significant`]). Every layer
//! that words a number writes it through these, so a quality reads the
//! same in a refusal, a report and on a sheet.

use std::fmt;

/// A number as messages write it: the shortest decimal that reads back as
/// the same double, in scientific form below `1e-6` and from `1e15` on,
/// so that a subnormal quality (`1e-310`) is not written with three
/// hundred zeros.
#[derive(Clone, Copy, Debug)]
pub struct Short(pub f64);

impl fmt::Display for Short {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let x = self.0;
        if x != 0.0 && x.is_finite() && !(1e-6..1e15).contains(&x.abs()) {
            write!(f, "{x:e}")
        } else {
            write!(f, "{x}")
        }
    }
}

/// A quality as a report's sentences print it: a fraction nonconforming
/// in percent with four significant digits (`1.000%`, `0.06500%`);
/// nonconformities per unit per unit and per 100 units, the unit contracts
/// often state (`1.5 per unit (150 per 100 units)`).
///
/// # Example
/// ```
/// use lotsman::format_quality;
/// assert_eq!(format_quality(0.0065, false), "0.6500%");
/// assert_eq!(format_quality(1.5, true), "1.5 per unit (150 per 100 units)");
/// ```
pub fn format_quality(q: f64, per_unit: bool) -> String {
    if per_unit {
        return format!(
            "{} per unit ({} per 100 units)",
            format_short(q, 4),
            format_short(100.0 * q, 4)
        );
    }
    format!("{}%", format_significant(q * 100.0, 4))
}

/// A quality in a table cell, four significant digits: a fraction in
/// percent as [`format_quality`] prints it; nonconformities per unit as
/// `1.500 (150.0)`, per unit and, in brackets, per 100 units, under a
/// column head that names both (`Quality per unit (per 100 units)`).
pub fn format_quality_cell(q: f64, per_unit: bool) -> String {
    if per_unit {
        return format!(
            "{} ({})",
            format_significant(q, 4),
            format_significant(100.0 * q, 4)
        );
    }
    format_quality(q, false)
}

/// [`format_significant`] without trailing zeros: `1.5`, not `1.500`;
/// `9`, not `9.00000`; an exponent is kept as it is (`1e-10` stays, and
/// `1.500e-10` becomes `1.5e-10`).
pub fn format_short(x: f64, digits: usize) -> String {
    let s = format_significant(x, digits);
    let (mantissa, exponent) = s.split_at(s.find('e').unwrap_or(s.len()));
    let mantissa = if mantissa.contains('.') {
        mantissa.trim_end_matches('0').trim_end_matches('.')
    } else {
        mantissa
    };
    format!("{mantissa}{exponent}")
}

/// `x` with `digits` significant digits, without exponent for the sizes
/// reports meet.
pub fn format_significant(x: f64, digits: usize) -> String {
    if x == 0.0 || !x.is_finite() {
        return format!("{x}");
    }
    let magnitude = x.abs().log10().floor() as i64;
    let decimals = (digits as i64 - 1 - magnitude).max(0) as usize;
    // Tiny and huge values in scientific form: a subnormal quality of
    // 1e-310 or a rate of 1e300 per unit in a few characters, not hundreds.
    if !(-6..15).contains(&magnitude) {
        return format!("{:.*e}", digits - 1, x);
    }
    format!("{x:.decimals$}")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn tiny_and_huge_numbers_print_short() {
        assert_eq!(Short(1e-310).to_string(), "1e-310");
        assert_eq!(Short(0.05).to_string(), "0.05");
        assert_eq!(Short(1.5e20).to_string(), "1.5e20");
        assert_eq!(Short(f64::NAN).to_string(), "NaN");
        assert_eq!(Short(0.0).to_string(), "0");
    }
}
