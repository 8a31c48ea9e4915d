//! The contract's switching options: whether reduced inspection is in the
//! contract, whether its two judgement conditions are confirmed, and the
//! limit-number window of Table VIII.

use serde::Serialize;

use super::error::SwitchingError;

/// The fewest lots the limit-number rule may look at (105E 4.7.3 a).
pub const MIN_WINDOW_LOTS: u32 = 10;

/// The most lots the limit-number rule may look at here: Table VIII's note
/// allows more than ten lots where ten give too few units; no row needs
/// more than this.
pub const MAX_WINDOW_LOTS: u32 = 100;

/// The limit-number rule of 105E 4.7.3 b for one plan: the most recent
/// `lots` lots on normal inspection, all accepted, whose counts add up to at
/// most `limit`.
///
/// `lots` is ten, or more where Table VIII gives `*` for ten lots (its note
/// allows more lots, the most recent in an unbroken run on normal
/// inspection). `limit` is Table VIII's limit number for the units those
/// lots inspect and the plan's AQL.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Serialize)]
pub struct LimitWindow {
    lots: u32,
    limit: u32,
}

impl LimitWindow {
    /// A window of `lots` lots (10 to [`MAX_WINDOW_LOTS`]) with limit
    /// number `limit`.
    ///
    /// ```
    /// use lotsman::LimitWindow;
    /// let w = LimitWindow::new(10, 7).unwrap();
    /// assert_eq!((w.lots(), w.limit()), (10, 7));
    /// assert!(LimitWindow::new(9, 7).is_err());
    /// ```
    ///
    /// # Errors
    /// [`SwitchingError::OutOfRange`] when `lots` is outside 10 to 100.
    pub fn new(lots: u32, limit: u32) -> Result<Self, SwitchingError> {
        if !(MIN_WINDOW_LOTS..=MAX_WINDOW_LOTS).contains(&lots) {
            return Err(SwitchingError::OutOfRange {
                what: "the number of lots of the limit-number rule",
                value: lots.to_string(),
                range: format!("from {MIN_WINDOW_LOTS} (MIL-STD-105E 4.7.3) to {MAX_WINDOW_LOTS}"),
            });
        }
        Ok(LimitWindow { lots, limit })
    }

    /// The ten lots of 105E 4.7.3 with limit number `limit`.
    pub fn ten(limit: u32) -> Self {
        LimitWindow {
            lots: MIN_WINDOW_LOTS,
            limit,
        }
    }

    /// The number of lots the rule looks at.
    pub fn lots(&self) -> u32 {
        self.lots
    }

    /// The limit number: the largest total count of those lots.
    pub fn limit(&self) -> u32 {
        self.limit
    }
}

/// The switching rules as a contract applies them.
///
/// - `reduced`: reduced inspection is part of the contract (many contracts
///   leave it out: the CLI's `--no-reduced`);
/// - `confirmed`: the user confirms the two conditions of 105E 4.7.3 that no
///   count shows: production is at a steady rate, and the responsible
///   authority approves reduced inspection;
/// - `window`: the limit-number rule (Table VIII), or `None` where Table
///   VIII gives no limit number for the plan (`*` with no more lots taken):
///   reduced inspection cannot be reached.
///
/// Reduced inspection is reachable only when all three allow it
/// ([`SwitchingRules::reduced_reachable`]).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Serialize)]
pub struct SwitchingRules {
    reduced: bool,
    confirmed: bool,
    window: Option<LimitWindow>,
}

impl SwitchingRules {
    /// Rules with reduced inspection in the contract.
    ///
    /// ```
    /// use lotsman::{LimitWindow, SwitchingRules};
    /// let rules = SwitchingRules::new(true, Some(LimitWindow::ten(7)));
    /// assert!(rules.reduced_reachable());
    /// assert!(!SwitchingRules::new(false, Some(LimitWindow::ten(7))).reduced_reachable());
    /// ```
    pub fn new(confirmed: bool, window: Option<LimitWindow>) -> Self {
        SwitchingRules {
            reduced: true,
            confirmed,
            window,
        }
    }

    /// Rules without reduced inspection (`--no-reduced`): normal and
    /// tightened only.
    pub fn without_reduced() -> Self {
        SwitchingRules {
            reduced: false,
            confirmed: false,
            window: None,
        }
    }

    /// Whether reduced inspection is in the contract.
    pub fn reduced(&self) -> bool {
        self.reduced
    }

    /// Whether steady production and the authority's approval are
    /// confirmed.
    pub fn confirmed(&self) -> bool {
        self.confirmed
    }

    /// The limit-number window, where Table VIII gives one.
    pub fn window(&self) -> Option<LimitWindow> {
        self.window
    }

    /// The window when reduced inspection can be reached: in the contract,
    /// confirmed, and with a limit number.
    pub fn reachable_window(&self) -> Option<LimitWindow> {
        self.window.filter(|_| self.reduced && self.confirmed)
    }

    /// Whether a run of lots on normal inspection can lead to reduced
    /// inspection.
    pub fn reduced_reachable(&self) -> bool {
        self.reachable_window().is_some()
    }
}
