//! Minimum-inspection plans for rectifying inspection: the plan that
//! minimises the average total inspection at the process average, subject
//! to a protection the consumer needs (the method of H. F. Dodge and
//! H. G. Romig, *Sampling Inspection Tables: Single and Double Sampling*,
//! 2nd ed., Wiley, 1959; cited from memory).
//!
//! # The problem
//!
//! Under rectifying inspection every rejected lot is screened 100% and the
//! nonconforming units found are replaced. A lot of `N` units at quality
//! `p` then costs on average
//!
//! ```text
//! ATI(p) = n + (1 - Pa(p)) (N - n)                  (single plan)
//! ATI(p) = a1 n1 + a2 (n1 + n2) + (1 - Pa(p)) N     (double plan)
//! ```
//!
//! units of inspection (`a_j` the chance of acceptance at stage `j`), and
//! lets through `AOQ(p) = sum_j a_j p (N - n_j) / N` nonconforming units per
//! unit. Given the lot size and the process average `p̄` (the supplier's
//! usual quality), the designer finds the plan with the smallest `ATI(p̄)`
//! that gives the consumer one of two protections ([`Protection`]):
//!
//! * **LTPD**: a lot at the lot tolerance percent defective `p_t` is
//!   accepted with probability at most `beta`: `Pa(p_t) <= beta`;
//! * **AOQL**: the average outgoing quality never exceeds `L`:
//!   `max_p AOQ(p) <= L`.
//!
//! # Why the search is exact
//!
//! Write `S = sum_j a_j (N - n_j)`, the units a lot saves against 100%
//! inspection; then `ATI = N - S` and `AOQ = p S / N`. Inspect the units in
//! one random order and compare a plan with the same plan on one more unit
//! (in `n`, `n1` or `n2`), lot by lot: a lot the larger plan accepts, the
//! smaller one accepts too, at the same stage or earlier, and so leaves at
//! least as many units uninspected. So `S` falls, and `Pa`, `AOQ(p)` at
//! every `p`, and with it the AOQL, fall as any sample grows, while the ATI
//! grows. Hence, for a single plan with a fixed acceptance number `c`:
//!
//! * the protection holds from some `n_min(c)` on, and no smaller `n`;
//! * the ATI grows with `n`, so `n_min(c)` is the only candidate for `c`;
//! * `Pa` rises with `c`, so `n_min(c)` does not fall as `c` rises;
//! * every lot inspects at least `n` units, so `ATI >= n`: once
//!   `n_min(c)` reaches the best ATI found (100% inspection, `N`, before
//!   any plan), no larger `c` can do better, and the scan over `c` stops.
//!
//! Each `n_min(c)` is an exact threshold search on the model's own
//! probabilities ([`first_true`]): for the LTPD the consumer-side search
//! the two-point designer uses, for the AOQL one on the exact AOQL
//! ([`aoql`]), started from Dodge and Romig's approximation
//! `AOQL ≈ y_c / n (1 - n / N)`, where `y_c = max_x x P(Poisson(x) <= c)`.
//! No `n` is scanned one by one.
//!
//! Double plans take Dodge and Romig's form (the first sample rejects only
//! beyond the final acceptance number, `r1 = c2 + 1`) and are searched with
//! the two-point double designer's sweep
//! ([`double_sweep`](super::double_sweep)); see
//! [`double`](self::double).
//!
//! # Ties and 100% inspection
//!
//! ATIs within `1e-12` (relative) are ties, won by the smaller acceptance
//! number (whose sample is no larger). A plan is chosen over 100%
//! inspection only when it saves more than `1e-12 N` units per lot;
//! otherwise, or when no plan gives the protection within the lot, the
//! answer is to inspect every unit, and the design says so.

mod design;
mod double;
pub(super) mod request;
mod single;

pub use self::design::{RectifyingDesign, RectifyingPlan, RectifyingRow};
pub use self::request::{AOQL_PLAN_LTPD_RISK, Protection, RectifyingRequest};

use self::double::design_double_rectifying;
use self::single::{Scan, SingleSearch};
use super::request::Scheme;
use super::work::rectifying_work;
use crate::design::DesignError;
use crate::plan::StagedPlan;

/// Designs the plan of `request`'s scheme that minimises the average total
/// inspection at the process average while giving the consumer the
/// requested protection (Dodge and Romig's minimum-inspection plans; see
/// the module documentation for the method and why it is exact).
///
/// ```text
/// minimise ATI(p̄) = n + (1 - Pa(p̄)) (N - n)
/// subject to Pa(p_t) <= beta    or    max_p AOQ(p) <= L
/// ```
///
/// # Errors
/// [`DesignError::NoRectifyingPlan`] when the scan over acceptance numbers
/// passes [`MAX_ACCEPTANCE_NUMBER`](crate::MAX_ACCEPTANCE_NUMBER)
/// ([`MAX_AOQL_ACCEPTANCE_NUMBER`](crate::MAX_AOQL_ACCEPTANCE_NUMBER) for an
/// AOQL), when the protection needs a sample above
/// [`MAX_SAMPLE_SIZE`](crate::MAX_SAMPLE_SIZE) in a
/// larger lot (so that whether sampling beats 100% inspection is not
/// known), when a double request's best single plan has an acceptance
/// number above [`MAX_DOUBLE_SINGLE_C`](crate::MAX_DOUBLE_SINGLE_C),
/// or when no double plan has a smaller ATI than the best single plan;
/// [`DesignError::OverBudget`] when the scan's or the double search's
/// estimated work ([`rectifying_work`](crate::rectifying_work)) passes the
/// budget.
///
/// # Example
/// ```
/// use lotsman::{design_rectifying, Model, ModelKind, Protection, RectifyingRequest, RiskPoint, Scheme};
/// let model = Model::new(ModelKind::Hypergeometric, Some(5000)).unwrap();
/// let ltpd = Protection::Ltpd(RiskPoint { quality: 0.01, risk: 0.10 });
/// let request = RectifyingRequest::new(model, 0.0025, ltpd, Scheme::Single).unwrap();
/// let d = design_rectifying(&request).unwrap();
/// let chosen = d.plan.unwrap();
/// // an exhaustive scipy search agrees (tests/data/minimum_reference.json)
/// assert_eq!(chosen.plan.as_single(), Some((766, 4)));
/// assert!(chosen.pa_at_ltpd.unwrap() <= 0.10);
/// assert!(chosen.ati < 930.0);
/// ```
pub fn design_rectifying(request: &RectifyingRequest) -> Result<RectifyingDesign, DesignError> {
    rectifying_work(request).check(
        &format!(
            "the scan over acceptance numbers in a lot of {}",
            request.lot_size()
        ),
        "give a smaller lot, or a process average further below the protection's quality",
    )?;
    let search = SingleSearch::new(request);
    let Scan { rows, best } = search.scan()?;
    let single = best
        .map(|(n, c)| RectifyingPlan::new(StagedPlan::single_checked_by_designer(n, c), request));
    match request.scheme() {
        Scheme::Double => {
            let start = best.map_or(rows.last().map_or(0, |r| r.c), |(_, c)| c);
            let plan = design_double_rectifying(&search, &rows, single.as_ref(), start)?;
            Ok(RectifyingDesign {
                request: *request,
                plan,
                single,
                rows,
            })
        }
        _ => Ok(RectifyingDesign {
            request: *request,
            plan: single,
            single: None,
            rows,
        }),
    }
}
