//! One lot's result as the switching rules read it.

use serde::Serialize;

use super::error::SwitchingError;

/// How a lot ended, as the switching rules read it (MIL-STD-105E 4.7,
/// 4.10).
///
/// - `accepted`: the lot was accepted;
/// - `count`: nonconforming units (or nonconformities) found over all
///   samples inspected: with double or multiple sampling every sample
///   counts (105E 4.7.3 b);
/// - `units`: the units inspected over all samples;
/// - `between`: on reduced inspection, the lot was accepted although its
///   count lay above the acceptance number and below the rejection number
///   (105E 4.10.1.4): normal inspection returns from the next lot;
/// - `resubmitted`: a lot rejected earlier and offered again; the switching
///   rules count original inspection only (105E 4.7), so it changes
///   nothing.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Serialize)]
pub struct LotResult {
    accepted: bool,
    count: u64,
    units: u64,
    between: bool,
    resubmitted: bool,
}

impl LotResult {
    fn checked(
        accepted: bool,
        count: u64,
        units: u64,
        between: bool,
    ) -> Result<Self, SwitchingError> {
        if units == 0 {
            return Err(SwitchingError::OutOfRange {
                what: "the units inspected in a lot",
                value: units.to_string(),
                range: "at least 1".into(),
            });
        }
        Ok(LotResult {
            accepted,
            count,
            units,
            between,
            resubmitted: false,
        })
    }

    /// An accepted lot: `count` found in `units` inspected.
    ///
    /// ```
    /// use lotsman::LotResult;
    /// let lot = LotResult::accepted(2, 125).unwrap();
    /// assert!(lot.is_accepted() && !lot.is_between());
    /// assert!(LotResult::accepted(0, 0).is_err());
    /// ```
    ///
    /// # Errors
    /// [`SwitchingError::OutOfRange`] when `units` is 0.
    pub fn accepted(count: u64, units: u64) -> Result<Self, SwitchingError> {
        Self::checked(true, count, units, false)
    }

    /// A lot accepted on reduced inspection with its count between the
    /// acceptance and rejection numbers (105E 4.10.1.4).
    ///
    /// # Errors
    /// [`SwitchingError::OutOfRange`] when `units` is 0.
    pub fn accepted_between(count: u64, units: u64) -> Result<Self, SwitchingError> {
        Self::checked(true, count, units, true)
    }

    /// A lot not accepted on original inspection.
    ///
    /// # Errors
    /// [`SwitchingError::OutOfRange`] when `units` is 0.
    pub fn rejected(count: u64, units: u64) -> Result<Self, SwitchingError> {
        Self::checked(false, count, units, false)
    }

    /// The same result for a resubmitted lot, which the rules ignore.
    #[must_use]
    pub fn resubmitted(self) -> Self {
        LotResult {
            resubmitted: true,
            ..self
        }
    }

    /// Whether the lot was accepted.
    pub fn is_accepted(&self) -> bool {
        self.accepted
    }

    /// Whether an accepted reduced lot's count lay between Ac and Re.
    pub fn is_between(&self) -> bool {
        self.between
    }

    /// Whether the lot was resubmitted.
    pub fn is_resubmitted(&self) -> bool {
        self.resubmitted
    }

    /// The count found over all samples inspected.
    pub fn count(&self) -> u64 {
        self.count
    }

    /// The units inspected over all samples.
    pub fn units(&self) -> u64 {
        self.units
    }
}
