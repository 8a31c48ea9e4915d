//! Parsing of the numbers a user types: qualities and risks as a fraction
//! (`0.01`) or a percent (`1%`), ranges `LO:HI:COUNT` and lists `p,p,...`.

use crate::input::InputError;
use crate::numeric::round_significant;

/// Parses a fraction written as a decimal (`0.015`, `1.5e-2`) or a percent
/// (`1.5%`). Rejects NaN, infinities and anything else that is not a plain
/// finite number; the caller checks the range.
///
/// # Errors
/// [`InputError::Unparsable`] naming `parameter`.
///
/// # Example
/// ```
/// assert_eq!(lotsman::parse_fraction("--aql", "1.5%").unwrap(), 0.015);
/// assert_eq!(lotsman::parse_fraction("--aql", "0.015").unwrap(), 0.015);
/// assert!(lotsman::parse_fraction("--aql", "1%%").is_err());
/// ```
pub fn parse_fraction(parameter: &str, text: &str) -> Result<f64, InputError> {
    let bad = || InputError::unparsable(parameter, text, "a fraction (0.01) or a percent (1%)");
    let t = text.trim();
    let (digits, scale) = match t.strip_suffix('%') {
        Some(rest) => (rest.trim_end(), 100.0),
        None => (t, 1.0),
    };
    if digits.is_empty()
        || !digits
            .chars()
            .all(|ch| ch.is_ascii_digit() || matches!(ch, '.' | 'e' | 'E' | '+' | '-'))
    {
        return Err(bad());
    }
    let value: f64 = digits.parse().map_err(|_| bad())?;
    if !value.is_finite() {
        return Err(bad());
    }
    // Dividing by 100 would turn 1.1% into 0.011000000000000001; parsing the
    // shifted decimal keeps the value the user wrote.
    let value = if scale == 100.0 {
        shift_percent(digits).ok_or_else(bad)?
    } else {
        value
    };
    refuse_underflow(parameter, t, value)
}

/// `value` as read from `text`, unless `text` writes a number other than
/// zero that binary64 rounds to zero (`1e-400`): such a value would
/// otherwise be reported, and refused, as a 0 the user never wrote.
fn refuse_underflow(parameter: &str, text: &str, value: f64) -> Result<f64, InputError> {
    let mantissa = text.split(['e', 'E']).next().unwrap_or("");
    if value == 0.0 && mantissa.chars().any(|ch| matches!(ch, '1'..='9')) {
        return Err(InputError::out_of_range(
            parameter,
            text,
            "a number that double precision can hold: it rounds to 0 (the smallest positive value is about 4.9e-324)",
        ));
    }
    Ok(value)
}

/// Parses a plain finite number (`2`, `0.5`, `1e1`), for ratios.
///
/// # Errors
/// [`InputError::Unparsable`] naming `parameter` for anything else.
pub fn parse_number(parameter: &str, text: &str) -> Result<f64, InputError> {
    let t = text.trim();
    match t.parse::<f64>() {
        Ok(v) if v.is_finite() && !t.is_empty() => refuse_underflow(parameter, t, v),
        _ => Err(InputError::unparsable(
            parameter,
            text,
            "a number, e.g. 2 or 0.5",
        )),
    }
}

/// `digits` (a decimal number) divided by 100, parsed from the shifted text so
/// that the result is the double nearest to the decimal the user meant.
fn shift_percent(digits: &str) -> Option<f64> {
    let shifted = format!("{digits}e-2");
    let (mantissa, exponent) = match digits.find(['e', 'E']) {
        Some(i) => (&digits[..i], digits[i + 1..].parse::<i32>().ok()? - 2),
        None => return shifted.parse().ok(),
    };
    format!("{mantissa}e{exponent}").parse().ok()
}

/// Parses a whole number of units (a lot size, a sample size, a count).
///
/// # Errors
/// [`InputError::Unparsable`] for anything but decimal digits;
/// [`InputError::OutOfRange`] above `max`.
///
/// # Example
/// ```
/// assert_eq!(lotsman::parse_count("--lot-size", "2500", 1_000_000).unwrap(), 2500);
/// assert!(lotsman::parse_count("--lot-size", "2.5e3", 1_000_000).is_err());
/// ```
pub fn parse_count(parameter: &str, text: &str, max: u64) -> Result<u64, InputError> {
    let t = text.trim();
    if t.is_empty() || !t.chars().all(|ch| ch.is_ascii_digit()) {
        return Err(InputError::unparsable(parameter, text, "a whole number"));
    }
    match t.parse::<u64>() {
        Ok(v) if v <= max => Ok(v),
        _ => Err(InputError::out_of_range(
            parameter,
            t,
            &format!("at most {max}"),
        )),
    }
}

/// Parses a comma-separated list of fractions.
///
/// # Errors
/// [`InputError::Unparsable`] for an empty list or a bad element.
pub fn parse_fraction_list(parameter: &str, text: &str) -> Result<Vec<f64>, InputError> {
    if text.trim().is_empty() {
        return Err(InputError::unparsable(
            parameter,
            text,
            "a list of qualities such as 1%,2%,5%",
        ));
    }
    text.split(',')
        .map(|part| parse_fraction(parameter, part))
        .collect()
}

/// The largest bare fraction taken as meant: above it, a quality written
/// without a percent sign for a fraction-nonconforming model is more
/// likely a percent typed without its sign (`--aql 0.5` for half a
/// percent) than a lot one fifth nonconforming, which acceptance sampling
/// rarely plans for. Common practice, not a standard's figure.
pub const BARE_FRACTION_NOTE_ABOVE: f64 = 0.2;

/// The note for the qualities of `flag` given as `text` (one quality, a
/// list `p,p,..` or a range `LO:HI:COUNT`) that are written without a
/// percent sign and lie above [`BARE_FRACTION_NOTE_ABOVE`] (and below 1,
/// where they are refused anyway): how they were read, and how to write
/// the percents. `None` when there are none. The caller gives the note
/// for fraction-nonconforming models only (a rate per unit of 0.5 is
/// ordinary), and the qualities are still used as read.
///
/// ```
/// use lotsman::bare_fraction_note;
/// assert_eq!(
///     bare_fraction_note("--aql", "0.5").unwrap(),
///     "--aql 0.5 was read as 50%; for 0.5 percent write 0.5%"
/// );
/// assert_eq!(
///     bare_fraction_note("--range", "0.3:0.8:5").unwrap(),
///     "--range 0.3:0.8:5 was read as 30% to 80%; for percents write 0.3%:0.8%:5"
/// );
/// assert_eq!(bare_fraction_note("--aql", "0.5%"), None);
/// assert_eq!(bare_fraction_note("--aql", "0.01"), None);
/// ```
pub fn bare_fraction_note(flag: &str, text: &str) -> Option<String> {
    let bare = |token: &str| {
        let t = token.trim();
        !t.ends_with('%')
            && t.parse::<f64>()
                .is_ok_and(|v| v > BARE_FRACTION_NOTE_ABOVE && v < 1.0)
    };
    let range = text.contains(':');
    let separator = if range { ':' } else { ',' };
    let tokens: Vec<&str> = text.split(separator).collect();
    // A range's third part is its count, not a quality.
    let qualities = if range {
        tokens.len().min(2)
    } else {
        tokens.len()
    };
    let flagged: Vec<usize> = (0..qualities).filter(|&i| bare(tokens[i])).collect();
    if flagged.is_empty() {
        return None;
    }
    let percent = |token: &str| {
        let v: f64 = token.trim().parse().unwrap_or(f64::NAN);
        format!("{}%", round_significant(100.0 * v, 12))
    };
    let read: Vec<String> = flagged.iter().map(|&i| percent(tokens[i])).collect();
    let read = read.join(if range { " to " } else { ", " });
    let fixed: Vec<String> = tokens
        .iter()
        .enumerate()
        .map(|(i, t)| {
            if flagged.contains(&i) {
                format!("{}%", t.trim())
            } else {
                t.to_string()
            }
        })
        .collect();
    let fixed = fixed.join(&separator.to_string());
    let what = match flagged.as_slice() {
        [one] if tokens.len() == 1 => format!("{} percent", tokens[*one].trim()),
        _ => "percents".to_string(),
    };
    Some(format!(
        "{flag} {} was read as {read}; for {what} write {fixed}",
        text.trim()
    ))
}

/// A range of qualities `LO:HI:COUNT`, evenly spaced, ends included.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct QualityRange {
    /// First quality.
    pub lo: f64,
    /// Last quality.
    pub hi: f64,
    /// Number of points, at least 2.
    pub count: usize,
}

/// The most points one range may ask for.
pub const MAX_RANGE_POINTS: usize = 100_000;

impl QualityRange {
    /// Parses `LO:HI:COUNT`, for example `0.5%:8%:50`.
    ///
    /// # Errors
    /// [`InputError`] for a malformed text, `LO >= HI` or a count outside
    /// `2..=100000`.
    pub fn parse(parameter: &str, text: &str) -> Result<Self, InputError> {
        let parts: Vec<&str> = text.split(':').collect();
        let [lo, hi, count] = parts.as_slice() else {
            return Err(InputError::unparsable(
                parameter,
                text,
                "LO:HI:COUNT, for example 0.5%:8%:50",
            ));
        };
        let lo = parse_fraction(parameter, lo)?;
        let hi = parse_fraction(parameter, hi)?;
        let count: usize = count.trim().parse().map_err(|_| {
            InputError::unparsable(parameter, text, "LO:HI:COUNT with a whole COUNT")
        })?;
        if !(2..=MAX_RANGE_POINTS).contains(&count) {
            return Err(InputError::out_of_range(
                &format!("{parameter} count"),
                count,
                "2 to 100000",
            ));
        }
        if lo >= hi {
            return Err(InputError::Inconsistent(format!(
                "{parameter}: LO = {lo} must be below HI = {hi}"
            )));
        }
        Ok(QualityRange { lo, hi, count })
    }

    /// The qualities of the range: `lo + i (hi - lo) / (count - 1)`, each
    /// rounded to 15 significant digits so that a range of short decimals
    /// gives the decimals the user meant (`0.5%:1.5%:3` gives 0.01, not
    /// 0.010000000000000002); the last point is `hi` itself.
    pub fn points(&self) -> Vec<f64> {
        let step = (self.hi - self.lo) / (self.count - 1) as f64;
        (0..self.count)
            .map(|i| {
                if i + 1 == self.count {
                    self.hi
                } else {
                    // 15 significant digits drop the binary noise of the
                    // sum (a few ulp) and move nothing else.
                    round_significant(self.lo + step * i as f64, 15)
                }
            })
            .collect()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn percents_parse_to_the_decimal_the_user_meant() {
        assert_eq!(parse_fraction("q", "1.1%").unwrap(), 0.011);
        assert_eq!(parse_fraction("q", "0.65%").unwrap(), 0.0065);
        assert_eq!(parse_fraction("q", "2.5e-1%").unwrap(), 0.0025);
        assert_eq!(parse_fraction("q", " 4 % ").unwrap(), 0.04);
    }

    #[test]
    fn rejects_what_is_not_a_plain_number() {
        for text in [
            "", "%", "1%%", "nan", "inf", "-inf", "0x10", "1,5", "one", "1e999",
        ] {
            assert!(parse_fraction("q", text).is_err(), "{text:?}");
        }
    }

    /// A written number that rounds to zero is refused as written; a zero
    /// stays a zero (for the range check to refuse with its own words).
    #[test]
    fn an_underflow_is_refused_as_written() {
        for text in ["1e-400", "1e-400%", "0.5e-330"] {
            let e = parse_fraction("--aql", text).unwrap_err();
            assert!(e.to_string().contains(&format!("= {text} ")), "{e}");
        }
        let e = parse_number("--sigma-value", "3e-999").unwrap_err();
        assert!(e.to_string().contains("rounds to 0"), "{e}");
        for text in ["0", "-0", "0.0e5", "0%"] {
            assert_eq!(parse_fraction("q", text).unwrap(), 0.0, "{text}");
        }
        assert!(parse_fraction("q", "1e-320").unwrap() > 0.0);
    }

    #[test]
    fn bare_fractions_above_a_fifth_get_a_note_and_the_rest_none() {
        assert_eq!(
            bare_fraction_note("--at", "1%,0.25, 0.8").unwrap(),
            "--at 1%,0.25, 0.8 was read as 25%, 80%; for percents write 1%,0.25%,0.8%"
        );
        // At the limit, at or above 1 (refused as out of range), text,
        // percents and a range's count: no note.
        for text in ["0.2", "1", "1.5", "abc", "50%", "0.01:0.1:300", ""] {
            assert_eq!(bare_fraction_note("--aql", text), None, "{text}");
        }
        assert_eq!(
            bare_fraction_note("--aql", "0.01:0.5:3").unwrap(),
            "--aql 0.01:0.5:3 was read as 50%; for percents write 0.01:0.5%:3"
        );
    }

    #[test]
    fn ranges_include_both_ends() {
        let r = QualityRange::parse("--range", "1%:5%:5").unwrap();
        assert_eq!(r.points(), vec![0.01, 0.02, 0.03, 0.04, 0.05]);
        let r = QualityRange::parse("--range", "0.5%:1.5%:3").unwrap();
        assert_eq!(r.points(), vec![0.005, 0.01, 0.015]);
        assert!(QualityRange::parse("--range", "5%:1%:5").is_err());
        assert!(QualityRange::parse("--range", "1%:5%:1").is_err());
        assert!(QualityRange::parse("--range", "1%:5%").is_err());
    }
}
