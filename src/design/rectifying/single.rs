//! The single plans of a minimum-inspection design: for each acceptance
//! number the smallest sample giving the protection, and the scan over
//! acceptance numbers that stops where no larger one can win (see the
//! [module documentation](super)).

use super::design::RectifyingRow;
use super::request::{Protection, RectifyingRequest};
use crate::design::DesignError;
use crate::design::bracket::aoql_factor;
use crate::design::double_sweep::TIE;
use crate::design::limits::MAX_AOQL_ACCEPTANCE_NUMBER;
use crate::design::search::first_true;
use crate::design::single::{smallest_sample, smallest_sample_with_pa_at_most};
use crate::plan::{MAX_ACCEPTANCE_NUMBER, MAX_SAMPLE_SIZE, StagedPlan, aoql};

/// What the scan over acceptance numbers found.
pub(crate) struct Scan {
    /// One row per acceptance number scanned.
    pub(crate) rows: Vec<RectifyingRow>,
    /// The best plan `(n, c)`, unless 100% inspection wins.
    pub(crate) best: Option<(u64, u64)>,
}

/// The exact searches of one request's single plans.
pub(crate) struct SingleSearch<'a> {
    pub(crate) request: &'a RectifyingRequest,
    /// The largest sample: the lot, within [`MAX_SAMPLE_SIZE`].
    pub(crate) limit: u64,
}

impl<'a> SingleSearch<'a> {
    pub(crate) fn new(request: &'a RectifyingRequest) -> Self {
        SingleSearch {
            request,
            limit: request.lot_size().min(MAX_SAMPLE_SIZE),
        }
    }

    /// `n_min(c)`: the smallest sample within the lot that gives the
    /// protection with acceptance number `c`.
    pub(crate) fn n_min(&self, c: u64) -> Option<u64> {
        let model = self.request.model();
        match self.request.protection() {
            Protection::Ltpd(point) => smallest_sample_with_pa_at_most(
                model,
                c,
                point.quality,
                point.risk,
                self.limit,
                None,
            ),
            Protection::Aoql(limit) => {
                let start = smallest_sample(model.kind(), c);
                let ln_limit = limit.ln();
                first_true(start, self.limit, self.aoql_guess(c, limit), |n| {
                    let value = aoql(&StagedPlan::single_checked_by_designer(n, c), model).value;
                    (value <= limit, value.ln() - ln_limit)
                })
            }
        }
    }

    /// Dodge and Romig's approximation `AOQL ≈ y_c / n (1 - n / N)`
    /// solved for `n` ([`aoql_factor`] gives `y_c`).
    fn aoql_guess(&self, c: u64, limit: f64) -> u64 {
        let y = aoql_factor(c);
        let n = y / (limit + y / self.request.lot_size() as f64);
        n.round().clamp(1.0, self.limit as f64) as u64
    }

    /// `ATI(p̄)` of the single plan `(n, c)`, as `N - Pa(p̄) (N - n)`.
    pub(crate) fn ati(&self, n: u64, c: u64) -> f64 {
        let r = self.request;
        let pa = r.model().tails(n, c, r.process_average(), 0, 0).cdf;
        r.lot_size() as f64 - pa * (r.lot_size() - n) as f64
    }

    /// The scan over `c` (see the module documentation).
    pub(crate) fn scan(&self) -> Result<Scan, DesignError> {
        let mut rows = Vec::new();
        let mut best = None;
        let mut best_ati = self.request.lot_size() as f64;
        let last = match self.request.protection() {
            Protection::Ltpd(_) => MAX_ACCEPTANCE_NUMBER,
            Protection::Aoql(_) => MAX_AOQL_ACCEPTANCE_NUMBER,
        };
        for c in 0..=last {
            let Some(n) = self.n_min(c) else {
                if self.limit < self.request.lot_size() && best_ati > self.limit as f64 {
                    // A sample between the designer's limit and the lot
                    // might give the protection, and save on 100%
                    // inspection: the answer is unknown, not 100%.
                    return Err(DesignError::NoRectifyingPlan {
                        reason: format!(
                            "with acceptance number {c} the protection needs a sample beyond the designer's limit of {MAX_SAMPLE_SIZE} units, and the lot has {}",
                            self.request.lot_size()
                        ),
                        suggestion: "give a process average and a protection further apart, or a smaller lot".to_string(),
                    });
                }
                // Pa rises with c: no larger c gives the protection either
                // (nor, for the unit-count models, can a sample within the
                // lot hold more than c units once c reaches it).
                rows.push(RectifyingRow {
                    c,
                    n_min: None,
                    ati: None,
                });
                return Ok(Scan { rows, best });
            };
            let ati = self.ati(n, c);
            rows.push(RectifyingRow {
                c,
                n_min: Some(n),
                ati: Some(ati),
            });
            if ati < best_ati * (1.0 - TIE) {
                best = Some((n, c));
                best_ati = ati;
            }
            if n as f64 >= best_ati {
                return Ok(Scan { rows, best });
            }
        }
        Err(DesignError::NoRectifyingPlan {
            reason: format!(
                "the scan over acceptance numbers passed the designer's limit of {last}{}",
                match self.request.protection() {
                    Protection::Ltpd(_) => "",
                    Protection::Aoql(_) => " for an AOQL",
                }
            ),
            suggestion:
                "give a smaller lot, or a process average further below the protection's quality"
                    .to_string(),
        })
    }
}
