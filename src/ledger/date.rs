//! The date of a lot, written `YYYY-MM-DD` (ISO 8601), and today's date.

use std::fmt;
use std::time::{SystemTime, UNIX_EPOCH};

/// A calendar date (proleptic Gregorian), checked when read.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub struct LotDate {
    year: u16,
    month: u8,
    day: u8,
}

impl LotDate {
    /// Reads `YYYY-MM-DD`, a real date from year 1900 to 9999.
    ///
    /// ```
    /// use lotsman::LotDate;
    /// assert_eq!(LotDate::parse("2024-02-29").unwrap().to_string(), "2024-02-29");
    /// assert!(LotDate::parse("2023-02-29").is_err());
    /// assert!(LotDate::parse("2024-2-1").is_err());
    /// ```
    ///
    /// # Errors
    /// A message naming the text and the form a date takes.
    pub fn parse(text: &str) -> Result<LotDate, String> {
        let bad = || format!("'{text}' is not a date written YYYY-MM-DD (e.g. 2024-03-15)");
        let b = text.as_bytes();
        if b.len() != 10 || b[4] != b'-' || b[7] != b'-' {
            return Err(bad());
        }
        let digits = |s: &str| {
            s.bytes()
                .all(|c| c.is_ascii_digit())
                .then(|| s.parse::<u16>().ok())
                .flatten()
        };
        let (Some(year), Some(month), Some(day)) =
            (digits(&text[..4]), digits(&text[5..7]), digits(&text[8..]))
        else {
            return Err(bad());
        };
        let (Ok(month), Ok(day)) = (u8::try_from(month), u8::try_from(day)) else {
            return Err(bad());
        };
        if year < 1900 {
            return Err(format!("'{text}': the year must be 1900 to 9999"));
        }
        if !(1..=12).contains(&month) {
            return Err(format!("'{text}': the month must be 01 to 12"));
        }
        if day < 1 || day > days_in(year, month) {
            return Err(format!(
                "'{text}' is not a calendar date: month {month:02} of {year} has days 01 to {}",
                days_in(year, month)
            ));
        }
        Ok(LotDate { year, month, day })
    }

    /// Today's date in UTC, from the system clock.
    ///
    /// # Errors
    /// A message when the clock is before 1970 or past 9999.
    pub fn today() -> Result<LotDate, String> {
        let seconds = SystemTime::now()
            .duration_since(UNIX_EPOCH)
            .map_err(|_| "the system clock is before 1970; give the date with --date".to_string())?
            .as_secs();
        Self::from_days(seconds / 86_400)
            .ok_or_else(|| "the system clock is past 9999; give the date with --date".to_string())
    }

    /// The date `days` days after 1970-01-01: the civil-from-days
    /// algorithm of H. Hinnant, "chrono-Compatible Low-Level Date
    /// Algorithms" (2013), for days after the epoch.
    fn from_days(days: u64) -> Option<LotDate> {
        let z = days + 719_468;
        let era = z / 146_097;
        let doe = z - era * 146_097;
        let yoe = (doe - doe / 1460 + doe / 36_524 - doe / 146_096) / 365;
        let doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
        let mp = (5 * doy + 2) / 153;
        let day = doy - (153 * mp + 2) / 5 + 1;
        let month = if mp < 10 { mp + 3 } else { mp - 9 };
        let year = yoe + era * 400 + u64::from(month <= 2);
        Some(LotDate {
            year: u16::try_from(year).ok().filter(|&y| y <= 9999)?,
            month: u8::try_from(month).ok()?,
            day: u8::try_from(day).ok()?,
        })
    }
}

fn days_in(year: u16, month: u8) -> u8 {
    match month {
        2 if (year.is_multiple_of(4) && !year.is_multiple_of(100)) || year.is_multiple_of(400) => {
            29
        }
        2 => 28,
        4 | 6 | 9 | 11 => 30,
        _ => 31,
    }
}

impl fmt::Display for LotDate {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{:04}-{:02}-{:02}", self.year, self.month, self.day)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn days_since_the_epoch() {
        // Dates checked with Python: datetime.date(1970,1,1) + timedelta(days=d).
        for (days, text) in [
            (0, "1970-01-01"),
            (11_016, "2000-02-29"),
            (19_797, "2024-03-15"),
        ] {
            assert_eq!(LotDate::from_days(days).unwrap().to_string(), text);
        }
    }
}
