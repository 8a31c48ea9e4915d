//! The standard's acceptable quality levels: the 26 column heads of its
//! master tables (MIL-STD-105E, Tables II to IV and VIII).
//!
//! An AQL is a number per 100 units. Up to 10 it is read either as percent
//! nonconforming or as nonconformities per 100 units; above 10 only as
//! nonconformities per 100 units (105E, 4.2 and the tables' column heads),
//! so the count is Poisson there.

use std::fmt;
use std::str::FromStr;

use serde::{Serialize, Serializer};

use super::error::StandardError;
use crate::model::ModelKind;

/// The standard's AQL values as it prints them, in column order.
pub const AQL_VALUES: [&str; 26] = [
    "0.010", "0.015", "0.025", "0.040", "0.065", "0.10", "0.15", "0.25", "0.40", "0.65", "1.0",
    "1.5", "2.5", "4.0", "6.5", "10", "15", "25", "40", "65", "100", "150", "250", "400", "650",
    "1000",
];

/// Index of the last AQL that may be percent nonconforming (10).
const LAST_PERCENT: usize = 15;

/// One of the standard's 26 AQL values.
///
/// # Example
/// ```
/// use lotsman::{Aql, ModelKind};
/// let aql: Aql = "1.0".parse().unwrap();
/// assert_eq!(aql.quality(), 0.01);
/// assert_eq!("1".parse::<Aql>().unwrap(), aql);
/// assert!("1.2".parse::<Aql>().is_err());
/// assert!("15".parse::<Aql>().unwrap().check_model(ModelKind::Binomial).is_err());
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub struct Aql {
    column: u8,
}

impl Aql {
    /// Every AQL of the standard, smallest first.
    pub fn all() -> impl Iterator<Item = Aql> {
        (0..AQL_VALUES.len() as u8).map(|column| Aql { column })
    }

    /// The AQL of a column of the master tables (0 is 0.010), if any.
    pub fn from_column(column: usize) -> Option<Aql> {
        (column < AQL_VALUES.len()).then_some(Aql {
            column: column as u8,
        })
    }

    /// Parses an AQL: one of the standard's values, written as the
    /// standard prints it or as the same number otherwise (`1`, `0.01`,
    /// `1.0%`).
    ///
    /// # Errors
    /// [`StandardError::Aql`] for any other text or value.
    pub fn parse(text: &str) -> Result<Aql, StandardError> {
        let bad = || StandardError::Aql {
            given: text.to_string(),
        };
        let t = text.trim();
        let t = t.strip_suffix('%').map_or(t, str::trim_end);
        if t.is_empty() || !t.chars().all(|c| c.is_ascii_digit() || c == '.') {
            return Err(bad());
        }
        let value: f64 = t.parse().map_err(|_| bad())?;
        // The values are decimals of at most three places: compare the
        // doubles nearest to each, which are equal exactly when the
        // decimals are.
        Aql::all()
            .find(|a| a.label().parse::<f64>().ok() == Some(value))
            .ok_or_else(bad)
    }

    /// The column of the master tables (0 for 0.010, 25 for 1000).
    pub fn column(self) -> usize {
        usize::from(self.column)
    }

    /// The value as the standard prints it (`0.65`, `1.0`, `10`).
    pub fn label(self) -> &'static str {
        AQL_VALUES[self.column()]
    }

    /// The value per 100 units (`1.0` for AQL 1.0).
    pub fn per_hundred(self) -> f64 {
        self.label().parse().unwrap_or(f64::NAN)
    }

    /// The quality of the AQL in lotsman's units: the fraction
    /// nonconforming (binomial, hypergeometric) or the nonconformities per
    /// unit (Poisson), both the value divided by 100 (AQL 1.0 is 0.01).
    /// Parsed from the shifted decimal, so the result is the double
    /// nearest to the exact hundredth.
    pub fn quality(self) -> f64 {
        format!("{}e-2", self.label()).parse().unwrap_or(f64::NAN)
    }

    /// Whether the AQL is above 10, where the standard reads it as
    /// nonconformities per 100 units only.
    pub fn per_hundred_units_only(self) -> bool {
        self.column() > LAST_PERCENT
    }

    /// Checks that `kind` can carry this AQL: above 10 only the Poisson
    /// model (nonconformities per unit) can.
    ///
    /// # Errors
    /// [`StandardError::AqlNeedsPoisson`] for an AQL above 10 with the
    /// binomial or hypergeometric model.
    pub fn check_model(self, kind: ModelKind) -> Result<(), StandardError> {
        if self.per_hundred_units_only() && kind != ModelKind::Poisson {
            return Err(StandardError::AqlNeedsPoisson {
                aql: self.label().to_string(),
                model: kind.name().to_string(),
            });
        }
        Ok(())
    }
}

impl fmt::Display for Aql {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.label())
    }
}

impl FromStr for Aql {
    type Err = StandardError;

    fn from_str(s: &str) -> Result<Self, Self::Err> {
        Aql::parse(s)
    }
}

impl Serialize for Aql {
    /// As the standard prints it, a string (`"1.0"`), so that no digit is
    /// lost or added.
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.serialize_str(self.label())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_value_parses_back_to_its_own_column() {
        for a in Aql::all() {
            assert_eq!(Aql::parse(a.label()).unwrap(), a);
        }
        assert_eq!(Aql::parse("0.01").unwrap().label(), "0.010");
        assert_eq!(Aql::parse(" 4 ").unwrap().label(), "4.0");
        assert_eq!(Aql::parse("6.5%").unwrap().label(), "6.5");
    }

    #[test]
    fn values_outside_the_series_are_refused() {
        for bad in [
            "",
            "0",
            "1.2",
            "-1",
            "1e0",
            "2000",
            "abc",
            "0.0100001",
            "nan",
        ] {
            assert!(Aql::parse(bad).is_err(), "{bad}");
        }
    }

    #[test]
    fn quality_is_the_value_per_unit() {
        assert_eq!(Aql::parse("0.65").unwrap().quality(), 0.0065);
        assert_eq!(Aql::parse("1000").unwrap().quality(), 10.0);
        assert_eq!(Aql::parse("0.010").unwrap().quality(), 0.0001);
    }

    #[test]
    fn above_ten_only_poisson() {
        let ten = Aql::parse("10").unwrap();
        let fifteen = Aql::parse("15").unwrap();
        assert!(ten.check_model(ModelKind::Binomial).is_ok());
        assert!(fifteen.check_model(ModelKind::Poisson).is_ok());
        let e = fifteen.check_model(ModelKind::Hypergeometric).unwrap_err();
        assert!(e.to_string().contains("use the poisson model"), "{e}");
    }
}
