//! Minimum-inspection double plans: the double plan with the smallest
//! `ATI(p̄)` that gives the consumer the requested protection.
//!
//! # The family searched
//!
//! Dodge and Romig's form: draw `n1` units and accept at `d1 <= c1`,
//! reject at `d1 > c2`; otherwise draw `n2` more and accept at a cumulative
//! count of at most `c2` (so `r1 = c2 + 1`), with `c1 < c2` and every `n1`,
//! `n2` within the lot. The two-point double designer's wider family
//! (`c1 + 2 <= r1 <= c2 + 1`) costs about `c2 / 2` times as much to search;
//! in the cases tried while building this designer its best plans reject
//! so rarely on the first sample at the qualities that matter that the
//! narrower form found the same ATI (to 1e-12). Dodge and Romig also fixed
//! how the two samples share the consumer's risk; those side rules are not
//! recalled well enough here to impose, and are not imposed.
//!
//! # Method
//!
//! With `S = a1 (N - n1) + a2 (N - n1 - n2)` the units a lot saves against
//! 100% inspection (`a_j` the chance of acceptance at stage `j`),
//! `ATI = N - S` and `AOQ(p) = p S(p) / N`. As the module
//! [`rectifying`](super) shows, `S`, `Pa` and `AOQ` fall as `n1` or
//! `n2` grows, so the shared sweep ([`double_sweep`](crate::design::double_sweep))
//! applies as it is:
//!
//! * for fixed `(c1, r1, c2)` and `n1` only the smallest `n2` that gives
//!   the protection can be best, and it does not grow with `n1`;
//! * `Pa >= P(d1 <= c1)` and `AOQ(p) >= P(d1 <= c1) p (N - n1) / N`, so
//!   `n1` is at least the single plan `(n1, c1)`'s `n_min(c1)`;
//! * every lot inspects at least `n1` units, so `n1` stays below the best
//!   ATI found, and before any is found, below the best single plan's ATI
//!   (a double plan that inspects more on average is not worth its second
//!   sample);
//! * `ATI(n1, n2) >= ATI(n1, n2_lowest)`, so an `n1` whose smallest second
//!   sample already inspects too much is passed over without searching
//!   `n2`.
//!
//! For an AOQL the test of each `n2` needs the plan's AOQL (the maximum
//! over all qualities, [`curve_maximum`]). It first tries the quality where
//! the previous test peaked: an AOQ above the limit there settles the test
//! at one evaluation.
//!
//! Two cheap bounds pass over most `n1` without a test: the first stage
//! alone gives `ATI >= N - a1 (N - n1) - P(c1 < d1 <= c2) (N - n1 - n2)`
//! (a lot that goes on is at best accepted), and `ATI(n1, n2)` is at least
//! its value at the smallest `n2` still possible.
//!
//! **Limit:** the final acceptance number `c2` runs up from 1 and stops
//! three values after the last one that improved the best plan, and not
//! before the best single plan's `c` plus three; the reference script's
//! exhaustive search over a wider box checks that rule. Like the two-point
//! double designer, it serves requests whose best single plan has
//! `c <= 25` ([`MAX_DOUBLE_SINGLE_C`]); its work, `n (c + 3)^3` steps with
//! `n` the best single plan's ATI (the sweep's reach), ten times that for
//! an AOQL, whose every test scans the AOQ curve, is estimated before it
//! starts and held to the work budget.
//!
//! # Ties
//!
//! ATIs within `1e-12` (relative) are ties, won by the smaller `n1 + n2`,
//! then the smaller `(c2, c1, r1, n1)`.

use std::collections::HashMap;
use std::ops::RangeInclusive;
use std::sync::Mutex;

use super::design::{RectifyingPlan, RectifyingRow};
use super::request::Protection;
use super::single::SingleSearch;
use crate::design::DesignError;
use crate::design::double_first::Counts;
use crate::design::double_sweep::{Candidate, DoubleProblem, FirstStage, Numbers, search};
use crate::design::limits::MAX_DOUBLE_SINGLE_C;
use crate::design::work::rectifying_double_work;
use crate::model::Model;
use crate::model::rows::Rows;
use crate::plan::{StagedPlan, curve_maximum};

/// The minimum-inspection problem for the shared double sweep.
struct DoubleRectifying<'a> {
    single: &'a SingleSearch<'a>,
    /// `n_min(c)` of the single plans, from the single scan and filled in
    /// as the sweep asks for more.
    n_min: Mutex<HashMap<u64, Option<u64>>>,
    /// The best single plan's ATI, or the lot size.
    initial: f64,
    /// The counts at the process average and the LTPD, computed once for
    /// the search.
    rows: Rows,
}

impl DoubleRectifying<'_> {
    fn lot(&self) -> f64 {
        self.single.request.lot_size() as f64
    }

    /// `S(p)`, the units a lot at quality `p` saves against 100%
    /// inspection, from the first stage at `p`:
    /// `a1 (N - n1) + a2 (N - n1 - n2) = Pa (N - n1 - n2) + a1 n2`.
    fn saving(&self, source: Counts<'_>, first: &FirstStage, n1: u64, n2: u64, p: f64) -> f64 {
        let pa = first.outcome(source, n1, n2, p).0;
        pa * (self.lot() - (n1 + n2) as f64) + first.accept * n2 as f64
    }

    fn ati(&self, k: Numbers, n1: u64, n2: u64) -> f64 {
        let p = self.single.request.process_average();
        let stored = Counts::Stored(&self.rows);
        let first = FirstStage::new(stored, n1, k, p);
        self.lot() - self.saving(stored, &first, n1, n2, p)
    }

    fn aoq(&self, k: Numbers, n1: u64, n2: u64, p: f64) -> f64 {
        // The AOQ curve's qualities are asked once each: not stored.
        let once = Counts::Once(self.model());
        let first = FirstStage::new(once, n1, k, p);
        p * self.saving(once, &first, n1, n2, p) / self.lot()
    }
}

impl DoubleProblem for DoubleRectifying<'_> {
    /// LTPD: the first stage at the LTPD. AOQL: nothing (each test scans
    /// every quality).
    type First = Option<FirstStage>;
    /// AOQL: the quality where the last test's AOQ peaked.
    type Memo = Option<f64>;

    fn model(&self) -> &Model {
        self.single.request.model()
    }

    fn limit(&self) -> u64 {
        self.single.limit
    }

    /// From the single plan's `n_min(c1)` up; the sweep stops below the
    /// best ATI.
    fn first_sample_range(&self, k: Numbers) -> Option<(u64, u64)> {
        // Dodge and Romig's first stage always accepts at d1 <= c1.
        let c1 = k.c1?;
        // A panic elsewhere cannot leave a half-written entry: take the map
        // as it is.
        let cache = || self.n_min.lock().unwrap_or_else(|e| e.into_inner());
        let known = cache().get(&c1).copied();
        let lo = match known {
            Some(n) => n?,
            None => {
                let n = self.single.n_min(c1);
                cache().insert(c1, n);
                n?
            }
        };
        Some((lo, self.limit() - 1))
    }

    fn first(&self, n1: u64, k: Numbers) -> Option<FirstStage> {
        match self.single.request.protection() {
            Protection::Ltpd(point) => Some(FirstStage::new(
                Counts::Stored(&self.rows),
                n1,
                k,
                point.quality,
            )),
            Protection::Aoql(_) => None,
        }
    }

    fn holds(
        &self,
        first: &Option<FirstStage>,
        memo: &mut Option<f64>,
        k: Numbers,
        n1: u64,
        n2: u64,
    ) -> bool {
        match self.single.request.protection() {
            Protection::Ltpd(point) => first.as_ref().is_some_and(|f| {
                f.outcome(Counts::Stored(&self.rows), n1, n2, point.quality)
                    .0
                    <= point.risk
            }),
            Protection::Aoql(limit) => {
                if let Some(q) = *memo
                    && self.aoq(k, n1, n2, q) > limit
                {
                    return false;
                }
                let plan = StagedPlan::double_checked_by_designer(n1, k.c1, k.r1, n2, k.c2);
                let (quality, value) =
                    curve_maximum(&plan, self.model(), |p| self.aoq(k, n1, n2, p));
                *memo = Some(quality);
                value <= limit
            }
        }
    }

    /// Dodge and Romig's form: the first sample rejects only beyond `c2`.
    fn first_rejections(&self, _c1: Option<u64>, c2: u64) -> RangeInclusive<u64> {
        c2 + 1..=c2 + 1
    }

    /// `ATI(n1, n2) >= ATI(n1, lo2)`; but first the bound that needs only
    /// the first stage, a lot going on to the second sample being accepted
    /// there at best: `ATI >= N - a1 (N - n1) - P(c1 < d1 < r1) (N - n1 - lo2)`.
    fn beyond(&self, k: Numbers, n1: u64, lo2: u64, bound: f64) -> bool {
        let p = self.single.request.process_average();
        let stored = Counts::Stored(&self.rows);
        let first = FirstStage::new(stored, n1, k, p);
        let lot = self.lot();
        let rest = lot - n1 as f64;
        let quick = lot - first.accept * rest - first.second_sample() * (rest - lo2 as f64);
        if quick > bound {
            return true;
        }
        lot - self.saving(stored, &first, n1, lo2, p) > bound
    }

    fn score(
        &self,
        _first: &Option<FirstStage>,
        k: Numbers,
        n1: u64,
        n2: u64,
        bound: f64,
    ) -> Option<Candidate> {
        let value = self.ati(k, n1, n2);
        (value <= bound).then_some(Candidate {
            n1,
            n2,
            numbers: k,
            value,
            margin: 0.0,
        })
    }

    fn initial_bound(&self) -> f64 {
        self.initial
    }
}

/// The double plan with the smallest `ATI(p̄)` for the request of
/// `single` (see the module documentation), given the single scan's rows,
/// the best single plan (`None`: 100% inspection beats every single plan)
/// and the acceptance number the search of `c2` starts from. `Ok(None)`
/// means 100% inspection.
///
/// # Errors
/// [`DesignError::NoRectifyingPlan`] when `start` passes
/// [`MAX_DOUBLE_SINGLE_C`], or when no double plan beats the best single
/// plan; [`DesignError::OverBudget`] when the search's estimated work
/// passes the budget.
pub(super) fn design_double_rectifying(
    single: &SingleSearch<'_>,
    rows: &[RectifyingRow],
    best_single: Option<&RectifyingPlan>,
    start: u64,
) -> Result<Option<RectifyingPlan>, DesignError> {
    if start > MAX_DOUBLE_SINGLE_C {
        return Err(DesignError::NoRectifyingPlan {
            reason: format!(
                "the double search around the single plan's acceptance number {start} is beyond the designer's limit of {MAX_DOUBLE_SINGLE_C}"
            ),
            suggestion: "use the single plan".to_string(),
        });
    }
    let request = single.request;
    // The sweep's first samples run up to the best single plan's ATI (the
    // lot, before any plan); each AOQL test scans the AOQ curve, about ten
    // times the work of a test at one quality.
    let reach = best_single
        .map_or(request.lot_size() as f64, |s| s.ati)
        .min(single.limit as f64);
    rectifying_double_work(request, reach, start).check(
        &format!(
            "the double search around the single plans up to n = {reach:.0} with acceptance number {start} ({} protection)",
            match request.protection() {
                Protection::Ltpd(_) => "LTPD",
                Protection::Aoql(_) => "AOQL",
            }
        ),
        "use the single plan (--scheme single)",
    )?;
    let problem = DoubleRectifying {
        single,
        n_min: Mutex::new(rows.iter().map(|r| (r.c, r.n_min)).collect()),
        initial: best_single.map_or(request.lot_size() as f64, |s| s.ati),
        rows: Rows::new(request.model()),
    };
    let Some(best) = search(&problem, start) else {
        return match best_single {
            None => Ok(None),
            Some(s) => Err(DesignError::NoRectifyingPlan {
                reason: format!(
                    "no double plan of Dodge and Romig's form has a smaller ATI at the process average than the single plan {} (ATI {:.1})",
                    s.plan, s.ati
                ),
                suggestion: "use the single plan".to_string(),
            }),
        };
    };
    let k = best.numbers;
    let plan = StagedPlan::double_checked_by_designer(best.n1, k.c1, k.r1, best.n2, k.c2);
    Ok(Some(RectifyingPlan::new(plan, request)))
}
