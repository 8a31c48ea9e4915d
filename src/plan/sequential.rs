//! The item-by-item plan of a sequential probability ratio test: two
//! parallel lines on the (items inspected, count found) chart, truncated at
//! a last item that decides every count.

use serde::{Deserialize, Serialize};

use super::limits::MAX_ITEMS;
use super::stage::Stage;
use crate::input::InputError;
use crate::model::{Model, ModelKind};

/// The acceptance and rejection lines of a sequential plan and its
/// truncation.
///
/// After `n` items with a cumulative count `d`:
///
/// ```text
/// accept   when d <= -h_accept + slope n     (acceptance number floor(slope n - h_accept))
/// reject   when d >=  h_reject + slope n     (rejection number ceil(slope n + h_reject))
/// continue otherwise, up to item `truncation`, where
/// accept   when d <= final_acceptance, reject otherwise.
/// ```
///
/// The numbers are formed in binary64 exactly as written, so every machine
/// derives the same table from the same recorded lines.
///
/// Source: A. Wald, *Sequential Analysis* (1947), ch. 5 (the test for a
/// proportion); the line form and the item table as in Montgomery,
/// *Introduction to Statistical Quality Control*, the section on sequential
/// sampling (from memory).
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SequentialLines {
    /// Intercept of the acceptance line (in counts, below the slope line).
    pub h_accept: f64,
    /// Intercept of the rejection line (in counts, above the slope line).
    pub h_reject: f64,
    /// Common slope of both lines (counts per item).
    pub slope: f64,
    /// The last item; there the plan decides every count.
    pub truncation: u64,
    /// Acceptance number at the truncation; a higher count rejects.
    pub final_acceptance: u64,
}

/// A run of consecutive items with the same acceptance and rejection
/// numbers: one row of the inspector's table.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
pub struct ItemRun {
    /// First item of the run.
    pub first: u64,
    /// Last item of the run.
    pub last: u64,
    /// Accept when the count is at most this (`None`: cannot accept yet).
    pub accept: Option<u64>,
    /// Reject when the count reaches this.
    pub reject: u64,
}

impl SequentialLines {
    /// Acceptance number after `n` items (before the truncation):
    /// `floor(slope n - h_accept)`, `None` while that is negative.
    pub fn acceptance_number(&self, n: u64) -> Option<u64> {
        let a = (self.slope * n as f64 - self.h_accept).floor();
        (a >= 0.0).then_some(a as u64)
    }

    /// Rejection number after `n` items (before the truncation):
    /// `ceil(slope n + h_reject)`.
    pub fn rejection_number(&self, n: u64) -> u64 {
        (self.slope * n as f64 + self.h_reject).ceil().max(1.0) as u64
    }

    /// The item stages: items `1..truncation` follow the lines, the
    /// truncation item accepts up to `final_acceptance`.
    pub fn stages(&self) -> Vec<Stage> {
        let mut stages: Vec<Stage> = (1..self.truncation)
            .map(|n| Stage {
                n,
                accept: self.acceptance_number(n),
                reject: self.rejection_number(n),
            })
            .collect();
        stages.push(Stage {
            n: self.truncation,
            accept: Some(self.final_acceptance),
            reject: self.final_acceptance + 1,
        });
        stages
    }

    /// The inspector's table: runs of items with the same numbers, the
    /// truncation item last.
    pub fn runs(&self) -> Vec<ItemRun> {
        let mut runs: Vec<ItemRun> = Vec::new();
        for s in self.stages() {
            match runs.last_mut() {
                Some(run)
                    if run.accept == s.accept
                        && run.reject == s.reject
                        && s.n < self.truncation =>
                {
                    run.last = s.n;
                }
                _ => runs.push(ItemRun {
                    first: s.n,
                    last: s.n,
                    accept: s.accept,
                    reject: s.reject,
                }),
            }
        }
        runs
    }

    /// Checks the lines for `model`.
    ///
    /// # Errors
    /// [`InputError`] when an intercept is not a positive finite number, the
    /// slope is not in `(0, 1)` (a fraction nonconforming; positive and
    /// finite for nonconformities per unit), the truncation is not in
    /// `1..=`[`MAX_ITEMS`] (and within the lot), or the final acceptance
    /// number lies outside the open counts of the truncation item.
    pub fn check(&self, model: &Model) -> Result<(), InputError> {
        for (name, h) in [("h_accept", self.h_accept), ("h_reject", self.h_reject)] {
            if !(h.is_finite() && h > 0.0) {
                return Err(InputError::out_of_range(
                    &format!("sequential {name}"),
                    h,
                    "a positive number of counts",
                ));
            }
        }
        let slope_ok = match model.kind() {
            ModelKind::Poisson => self.slope.is_finite() && self.slope > 0.0,
            _ => self.slope > 0.0 && self.slope < 1.0,
        };
        if !slope_ok {
            return Err(InputError::out_of_range(
                "sequential slope",
                self.slope,
                "above 0 (and below 1 for a fraction nonconforming)",
            ));
        }
        if self.truncation == 0 || self.truncation > MAX_ITEMS {
            return Err(InputError::out_of_range(
                "sequential truncation",
                self.truncation,
                &format!("1 to {MAX_ITEMS} items"),
            ));
        }
        model.check_sample("sequential truncation", self.truncation)?;
        let lowest = self.acceptance_number(self.truncation).unwrap_or(0);
        let highest = self.rejection_number(self.truncation).saturating_sub(1);
        if self.final_acceptance < lowest || self.final_acceptance > highest {
            return Err(InputError::out_of_range(
                "sequential final_acceptance",
                self.final_acceptance,
                &format!(
                    "{lowest} to {highest}, the counts the lines leave open at item {}",
                    self.truncation
                ),
            ));
        }
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_follow_the_lines_and_runs_group_them() {
        let lines = SequentialLines {
            h_accept: 1.2,
            h_reject: 1.5,
            slope: 0.25,
            truncation: 12,
            final_acceptance: 2,
        };
        // floor(0.25 n - 1.2): negative up to n = 4, 0 at n = 5..8.
        assert_eq!(lines.acceptance_number(4), None);
        assert_eq!(lines.acceptance_number(5), Some(0));
        assert_eq!(lines.acceptance_number(9), Some(1));
        // ceil(0.25 n + 1.5): 2 at n = 1..2, 3 at n = 3..6.
        assert_eq!(lines.rejection_number(2), 2);
        assert_eq!(lines.rejection_number(3), 3);
        let runs = lines.runs();
        assert_eq!(
            runs[0],
            ItemRun {
                first: 1,
                last: 2,
                accept: None,
                reject: 2
            }
        );
        let last = runs[runs.len() - 1];
        assert_eq!((last.first, last.accept, last.reject), (12, Some(2), 3));
        let covered: u64 = runs.iter().map(|r| r.last - r.first + 1).sum();
        assert_eq!(covered, 12);
    }
}
