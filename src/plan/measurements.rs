//! Judging a lot from its measurements under a variables plan: reading the
//! readings, the sample statistics, the decision, and the checks of the
//! model the decision rests on.
//!
//! Normality: the Anderson–Darling statistic with mean and standard
//! deviation estimated from the sample (T. W. Anderson and D. A. Darling,
//! *JASA* 49, 1954),
//!
//! ```text
//! A^2  = -n - (1/n) sum_i (2i - 1) [ln Phi(z_(i)) + ln(1 - Phi(z_(n+1-i)))],
//!        z = (x - xbar) / s
//! A*^2 = A^2 (1 + 0.75/n + 2.25/n^2)
//! ```
//!
//! and its p-value from the formulas of R. B. D'Agostino and M. A.
//! Stephens, *Goodness-of-Fit Techniques*, Marcel Dekker 1986, Table 4.9
//! (from memory; checked against the reference script). Sigma known: the
//! sample variance is also tested against the stated sigma by the
//! chi-square test `(n - 1) s^2 / sigma^2 ~ chi2(n - 1)`, two-sided.

use serde::Serialize;
use statrs::distribution::{ChiSquared, ContinuousCDF};

use super::statistics_decision::{StatisticsDecision, decide_from_statistics};
use super::variables::VariablesPlan;
use crate::input::InputError;
use crate::model::normal;

/// Below this p-value the readings contradict the normal model.
pub const NORMALITY_LEVEL: f64 = 0.05;

/// Below this p-value the sample's spread contradicts the known sigma.
pub const SIGMA_LEVEL: f64 = 0.01;

/// The Anderson–Darling test of normality.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct AndersonDarling {
    /// `A^2`.
    pub a2: f64,
    /// `A*^2`, corrected for the sample size.
    pub a2_star: f64,
    /// The p-value of `A*^2`.
    pub p_value: f64,
}

/// The Anderson–Darling test of `values` (at least 3, not all equal).
pub fn anderson_darling(values: &[f64]) -> AndersonDarling {
    let (mean, s) = mean_and_sd(values);
    let mut z: Vec<f64> = values.iter().map(|x| (x - mean) / s).collect();
    z.sort_by(f64::total_cmp);
    let n = z.len();
    let nf = n as f64;
    let sum: f64 = (0..n)
        .map(|i| (2 * i + 1) as f64 * (normal::ln_cdf(z[i]) + normal::ln_cdf(-z[n - 1 - i])))
        .sum();
    let a2 = -nf - sum / nf;
    let a = a2 * (1.0 + 0.75 / nf + 2.25 / (nf * nf));
    let p_value = if a >= 0.6 {
        (1.2937 - 5.709 * a + 0.0186 * a * a).exp()
    } else if a >= 0.34 {
        (0.9177 - 4.279 * a - 1.38 * a * a).exp()
    } else if a >= 0.2 {
        1.0 - (-8.318 + 42.796 * a - 59.938 * a * a).exp()
    } else {
        1.0 - (-13.436 + 101.14 * a - 223.73 * a * a).exp()
    };
    AndersonDarling {
        a2,
        a2_star: a,
        p_value: p_value.clamp(0.0, 1.0),
    }
}

/// The mean and the standard deviation with the `n - 1` divisor
/// (two-pass, so that a large common offset costs no digits).
pub fn mean_and_sd(values: &[f64]) -> (f64, f64) {
    let n = values.len() as f64;
    let mean = values.iter().sum::<f64>() / n;
    let ss: f64 = values.iter().map(|x| (x - mean) * (x - mean)).sum();
    (mean, (ss / (n - 1.0)).sqrt())
}

/// Reads measurements from CSV text (with the csv crate): one value per
/// row, or, with `column`, the named column of a file whose first row is
/// a header. What spreadsheets write is accepted: a byte-order mark,
/// Windows (`\r\n`) and old Macintosh (`\r`) line ends, quoted cells,
/// blank lines before the first row and after the last. Without `column`,
/// a first row that is not a number is taken as the header of a
/// one-column file.
///
/// A file that would be misread is refused, never decided on: rows are
/// named by their line in the file, counted from 1.
///
/// ```
/// use lotsman::parse_measurements;
/// assert_eq!(parse_measurements("bore\n12.01\n12.03\n", None), Ok(vec![12.01, 12.03]));
/// let e = parse_measurements("plate,bore\n1,12.01\n2,12,03\n", Some("bore")).unwrap_err();
/// assert!(e.to_string().starts_with("row 3 of the measurements has 3 cells"));
/// ```
///
/// # Errors
/// [`InputError`] naming the row (and column) of a blank or non-numeric
/// cell; a row with more cells than the header (decimal commas read as
/// separators); a file that separates its values with semicolons or tabs;
/// a missing column; a file of several columns without `column`; or
/// commas used as decimal marks.
pub fn parse_measurements(text: &str, column: Option<&str>) -> Result<Vec<f64>, InputError> {
    let rows = csv_rows(text)?;
    if let Some((line, cells)) = rows
        .iter()
        .find(|(_, cells)| cells.iter().any(|c| c.contains([';', '\t'])))
    {
        let separator = if cells.iter().any(|c| c.contains(';')) {
            "';'"
        } else {
            "tabs"
        };
        return Err(InputError::Inconsistent(format!(
            "this file separates its values with {separator} (row {line}: '{}'), and a measurements file is comma-separated with decimal points; save it from the spreadsheet as CSV with commas and decimal points, or give one value per row",
            cells.join(",")
        )));
    }
    let Some((_, first)) = rows.first() else {
        return Err(InputError::Inconsistent(
            "the measurements file is empty".to_string(),
        ));
    };
    let is_number = |c: &str| c.parse::<f64>().is_ok();
    let (index, skip, width) = match column {
        Some(name) => {
            let index = first.iter().position(|h| h == name).ok_or_else(|| {
                InputError::Inconsistent(format!(
                    "the measurements file has no column '{name}'; its header row is: {}",
                    first.join(", ")
                ))
            })?;
            (index, 1, first.len())
        }
        None => {
            if first.len() > 1 {
                let hint = if first
                    .iter()
                    .all(|c| c.chars().all(|ch| ch.is_ascii_digit() || ch == '-'))
                {
                    " (if commas are decimal marks, write the decimals with points)"
                } else {
                    ""
                };
                return Err(InputError::Inconsistent(format!(
                    "row {} of the measurements has {} cells; give one value per row, or name the column with --column{hint}",
                    rows[0].0,
                    first.len()
                )));
            }
            (0, usize::from(!is_number(&first[0])), 1)
        }
    };
    let mut values = Vec::new();
    for (line, cells) in rows.iter().skip(skip) {
        if cells.len() > width {
            let shown = cells.join(",");
            return Err(InputError::Inconsistent(match column {
                None => format!(
                    "row {line} of the measurements has {} cells ('{shown}'); give one value per row (if commas are decimal marks, write the decimals with points)",
                    cells.len()
                ),
                Some(_) => format!(
                    "row {line} of the measurements has {} cells and the header row {width} ('{shown}'): a comma inside a value (a decimal comma, as in 9,950) splits it in two; save the file with decimal points (9.950), or put each such value in quotes",
                    cells.len()
                ),
            }));
        }
        let cell = cells.get(index).map_or("", String::as_str);
        if cell.is_empty() {
            return Err(InputError::Inconsistent(format!(
                "row {line} of the measurements is blank; every unit of the sample needs its reading"
            )));
        }
        match cell.parse::<f64>() {
            Ok(v) if v.is_finite() => values.push(v),
            _ => {
                return Err(InputError::unparsable(
                    &format!("measurement in row {line}"),
                    cell,
                    "a number written with a decimal point, e.g. 12.031",
                ));
            }
        }
    }
    Ok(values)
}

/// The rows of a CSV text as (line in the file, trimmed cells), read by
/// the csv crate; a blank line between rows is refused with its line.
///
/// The line ends are made `\n` first, and blank lines are looked for
/// before the csv crate reads the text: it reads `\r` alone as a line end
/// but counts lines by `\n`, and it skips empty lines, counting them into
/// the next row's line, so that a blank line between two readings (a
/// reading missing from the sample) would pass unseen and shift the line
/// of every row after it.
fn csv_rows(text: &str) -> Result<Vec<(u64, Vec<String>)>, InputError> {
    let text = text.strip_prefix('\u{feff}').unwrap_or(text);
    let text = text.replace("\r\n", "\n").replace('\r', "\n");
    let lines: Vec<&str> = text.split('\n').collect();
    let blank = |l: &str| l.trim().is_empty();
    let leading = lines.iter().take_while(|l| blank(l)).count();
    let last = lines.iter().rposition(|l| !blank(l)).unwrap_or(0);
    if let Some(gap) = (leading..last).find(|&i| blank(lines[i])) {
        return Err(InputError::Inconsistent(format!(
            "row {} of the measurements is blank; every unit of the sample needs its reading",
            gap + 1
        )));
    }
    let mut reader = csv::ReaderBuilder::new()
        .has_headers(false)
        .flexible(true)
        .trim(csv::Trim::All)
        .from_reader(text.as_bytes());
    let mut rows: Vec<(u64, Vec<String>)> = Vec::new();
    let mut record = csv::StringRecord::new();
    loop {
        let more = reader.read_record(&mut record).map_err(|e| {
            let line = e.position().map_or(0, |p| p.line());
            InputError::Inconsistent(format!(
                "row {line} of the measurements cannot be read as comma-separated values; save the file again as CSV"
            ))
        })?;
        if !more {
            break;
        }
        // The csv crate gives a row the line where its reading started,
        // which for the first row is before the blank lines it skipped.
        let line = if rows.is_empty() {
            leading as u64 + 1
        } else {
            record.position().map_or(0, |p| p.line())
        };
        rows.push((line, record.iter().map(str::to_string).collect()));
    }
    // Rows of nothing but empty cells at the end (",," from a spreadsheet)
    // are no readings.
    while rows
        .last()
        .is_some_and(|(_, cells)| cells.iter().all(|c| c.is_empty()))
    {
        rows.pop();
    }
    Ok(rows)
}

/// The judgement of a lot from its measurements.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct MeasurementJudgement {
    /// Number of readings.
    pub n: u64,
    /// Sample mean.
    pub mean: f64,
    /// Sample standard deviation (`n - 1` divisor).
    pub s: f64,
    /// What the statistics decide: the quality statistics, the estimate,
    /// the decision and its rule (flattened into the same JSON keys).
    #[serde(flatten)]
    pub decided: StatisticsDecision,
    /// The normality test (at least 3 distinct readings).
    pub normality: Option<AndersonDarling>,
    /// Sigma known: the p-value of the chi-square test of `s` against it.
    pub sigma_p_value: Option<f64>,
    /// What the inspector must read before relying on the decision.
    pub warnings: Vec<String>,
}

/// Judges a lot from `values` under `plan`; `aql` (the producer's
/// quality) is used to warn when the sample's spread alone would put a
/// centred process beyond it.
///
/// # Errors
/// [`InputError`] when the count differs from the plan's `n`, there are
/// fewer than 2 values, every value is the same (no spread to measure), or
/// the values are too large for their mean and spread to be computed.
pub fn judge_measurements(
    plan: &VariablesPlan,
    values: &[f64],
    aql: f64,
) -> Result<MeasurementJudgement, InputError> {
    let n = values.len() as u64;
    if n < 2 {
        return Err(InputError::out_of_range(
            "number of measurements",
            n,
            "at least 2: a standard deviation needs two readings",
        ));
    }
    if n != plan.n() {
        return Err(InputError::Inconsistent(format!(
            "the file holds {n} measurements and the plan's sample is n = {}; measure exactly n units",
            plan.n()
        )));
    }
    // Equal readings are tested as such: their computed s is rounding
    // noise (42 readings of 5.9 give s = 9e-16), not a spread.
    if values.iter().all(|&v| v == values[0]) {
        return Err(InputError::Inconsistent(
            "every measurement is the same, so the sample shows no spread: the gauge's resolution is too coarse for a variables plan".to_string(),
        ));
    }
    let (mean, s) = mean_and_sd(values);
    if !(mean.is_finite() && s.is_finite()) {
        let largest = values.iter().fold(0.0f64, |m, v| m.max(v.abs()));
        return Err(InputError::out_of_range(
            "largest measurement (absolute value)",
            format!("{largest:e}"),
            "small enough for the mean and standard deviation to be computed (below about 1e150); check the file's unit",
        ));
    }
    let spec = plan.spec();
    let decided = decide_from_statistics(plan, n, mean, s);
    let mut warnings = Vec::new();
    let normality = (n >= 3).then(|| anderson_darling(values));
    match normality {
        Some(ad) if ad.p_value < NORMALITY_LEVEL => warnings.push(format!(
            "THE READINGS CONTRADICT THE NORMAL MODEL (Anderson-Darling A*^2 = {:.3}, p = {:.4} < {NORMALITY_LEVEL}). The variables decision rests on normality: do not rely on it; investigate the process or judge the lot by attributes.",
            ad.a2_star, ad.p_value
        )),
        _ => {}
    }
    if n < 8 {
        warnings.push(format!(
            "with {n} readings the normality test can detect only gross departures; normality rests on the process record"
        ));
    }
    let sigma_p_value = spec.sigma().and_then(|sigma| {
        let df = (n - 1) as f64;
        let chi = ChiSquared::new(df).ok()?;
        let x = df * s * s / (sigma * sigma);
        Some((2.0 * chi.cdf(x).min(chi.sf(x))).min(1.0))
    });
    if let (Some(p), Some(sigma)) = (sigma_p_value, spec.sigma())
        && p < SIGMA_LEVEL
    {
        warnings.push(format!(
            "THE SAMPLE'S SPREAD CONTRADICTS THE KNOWN SIGMA (s = {s:.6} against sigma = {sigma}, chi-square p = {p:.4} < {SIGMA_LEVEL}). The plan assumes sigma is known; check the process before relying on the decision."
        ));
    }
    if let (Some(l), Some(u)) = (spec.lower(), spec.upper()) {
        let best = 2.0 * normal::cdf(-(u - l) / (2.0 * s));
        if best > aql {
            warnings.push(format!(
                "the sample's spread is so large that even a centred process would have {:.3}% beyond the limits, above the AQL {:.3}%",
                100.0 * best,
                100.0 * aql
            ));
        }
    }
    Ok(MeasurementJudgement {
        n,
        mean,
        s,
        decided,
        normality,
        sigma_p_value,
        warnings,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A BOM, Windows line ends and a header are read; a comma decimal
    /// mark, a blank row and text are refused with their row.
    #[test]
    fn reading_the_file() {
        let v = parse_measurements("\u{feff}bore\r\n12.01\r\n12.03\r\n\r\n", None);
        assert_eq!(v, Ok(vec![12.01, 12.03]));
        let named = parse_measurements("unit,bore\n1,12.01\n2,12.02\n", Some("bore"));
        assert_eq!(named, Ok(vec![12.01, 12.02]));
        let comma = parse_measurements("12,01\n12,03\n", None).unwrap_err();
        assert!(comma.to_string().contains("decimal"), "{comma}");
        let blank = parse_measurements("12.01\n\n12.03\n", None).unwrap_err();
        assert!(blank.to_string().contains("row 2"), "{blank}");
        let text = parse_measurements("12.01\nabc\n", None).unwrap_err();
        assert!(text.to_string().contains("row 2"), "{text}");
        let mac = parse_measurements("bore\r12.01\r12.03\r", None);
        assert_eq!(mac, Ok(vec![12.01, 12.03]));
        let blank = parse_measurements("12.01\r\r12.03\r", None).unwrap_err();
        assert!(blank.to_string().contains("row 2"), "{blank}");
        let quoted = parse_measurements("plate,bore\n1,\"12.01\"\n2,12.02\n", Some("bore"));
        assert_eq!(quoted, Ok(vec![12.01, 12.02]));
        let trailing = parse_measurements("12.01\n12.02\n\n\n", None);
        assert_eq!(trailing, Ok(vec![12.01, 12.02]));
        let late = parse_measurements("\n\nbore\n12.01\nx\n", None).unwrap_err();
        assert!(late.to_string().contains("row 5 = 'x'"), "{late}");
    }

    /// A decimal comma under a named column splits a reading in two: the
    /// row is refused, never read as its first part.
    #[test]
    fn decimal_commas_under_a_column_are_refused_with_their_row() {
        let e = parse_measurements("plate,bore\n1,9.95\n2,9,950\n", Some("bore")).unwrap_err();
        let e = e.to_string();
        assert!(
            e.starts_with("row 3 of the measurements has 3 cells and the header row 2 ('2,9,950')"),
            "{e}"
        );
        assert!(e.contains("save the file with decimal points"), "{e}");
        let quoted = parse_measurements("plate,bore\n1,\"9,950\"\n", Some("bore")).unwrap_err();
        assert!(
            quoted
                .to_string()
                .contains("is not a number written with a decimal point")
        );
    }

    #[test]
    fn semicolons_and_tabs_are_named_as_the_separator() {
        for (text, sep) in [
            ("plate;bore\n1;9,95\n", "';'"),
            ("plate\tbore\n1\t9.95\n", "tabs"),
        ] {
            for column in [None, Some("bore")] {
                let e = parse_measurements(text, column).unwrap_err().to_string();
                assert!(
                    e.starts_with(&format!(
                        "this file separates its values with {sep} (row 1:"
                    )),
                    "{e}"
                );
            }
        }
    }
}
