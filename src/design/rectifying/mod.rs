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

mod double;

use serde::Serialize;

use self::double::design_double_rectifying;
use super::bracket::aoql_factor;
use super::double_sweep::TIE;
use super::request::Scheme;
use super::search::first_true;
use super::single::{smallest_sample, smallest_sample_with_pa_at_most};
use crate::budget::minimum_work;
use crate::design::DesignError;
use crate::input::InputError;
use crate::model::{MAX_LOT_SIZE, Model, ModelKind, nonconforming_in_lot};
use crate::model::{RiskPair, RiskPoint, check_quality, check_risk};
use crate::plan::{
    Aoql, MAX_ACCEPTANCE_NUMBER, MAX_SAMPLE_SIZE, StagedPlan, acceptance_probability, aoql,
    default_qualities, measures, quality_at_pa,
};

/// The largest acceptance number the scan reaches for an AOQL: each step
/// is an exact threshold search on the AOQL, whose every evaluation scans
/// the AOQ curve, so the scan costs about the square of the acceptance
/// numbers; at `2000` it takes about 10 s on two cores. (An LTPD scan runs
/// to [`MAX_ACCEPTANCE_NUMBER`].)
pub const MAX_AOQL_ACCEPTANCE_NUMBER: u64 = 2_000;

/// The probability of acceptance at which a plan designed for an AOQL
/// reports its LTPD (the consumer's risk of Dodge and Romig's tables).
pub const AOQL_PLAN_LTPD_RISK: f64 = 0.10;

/// What the consumer is protected by.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Protection {
    /// A lot at the LTPD `quality` is accepted with probability at most
    /// `risk` (the consumer's risk beta): `Pa(p_t) <= beta`.
    Ltpd(RiskPoint),
    /// The average outgoing quality never exceeds this limit:
    /// `max_p AOQ(p) <= L`.
    Aoql(f64),
}

impl Protection {
    /// `ltpd` or `aoql`, as in reports.
    pub fn name(&self) -> &'static str {
        match self {
            Protection::Ltpd(_) => "ltpd",
            Protection::Aoql(_) => "aoql",
        }
    }

    /// The quality the process average must stay below: the LTPD or the
    /// AOQL.
    pub fn quality(&self) -> f64 {
        match *self {
            Protection::Ltpd(point) => point.quality,
            Protection::Aoql(limit) => limit,
        }
    }
}

/// A validated minimum-inspection request: a model with its lot size, the
/// process average, the protection and the scheme.
///
/// Valid means: the model has a lot size of at least 2 units (any of the
/// three models; hypergeometric is the natural one, since `N` is known);
/// the process average and the protection's quality are qualities of the
/// model; the process average lies below the LTPD or the AOQL; beta lies in
/// `(0, 1)`; for the hypergeometric model the LTPD means at least one
/// nonconforming unit in the lot; the scheme is single or double.
///
/// # Example
/// ```
/// use lotsman::{Model, ModelKind, Protection, RectifyingRequest, RiskPoint, Scheme};
/// let model = Model::new(ModelKind::Hypergeometric, Some(5000)).unwrap();
/// let ltpd = Protection::Ltpd(RiskPoint { quality: 0.01, risk: 0.10 });
/// assert!(RectifyingRequest::new(model, 0.0025, ltpd, Scheme::Single).is_ok());
/// // a process average at or above the LTPD is refused
/// assert!(RectifyingRequest::new(model, 0.01, ltpd, Scheme::Single).is_err());
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct RectifyingRequest {
    model: Model,
    lot_size: u64,
    process_average: f64,
    protection: Protection,
    scheme: Scheme,
}

impl RectifyingRequest {
    /// Validates the request.
    ///
    /// # Errors
    /// [`InputError::OutOfRange`] naming the lot size, process average,
    /// LTPD, beta or AOQL that is out of range, or the scheme;
    /// [`InputError::Inconsistent`] for a model without a lot size, a
    /// process average at or above the protection's quality, or an LTPD that
    /// means no nonconforming unit in the lot.
    pub fn new(
        model: Model,
        process_average: f64,
        protection: Protection,
        scheme: Scheme,
    ) -> Result<Self, InputError> {
        let lot_size = model.lot_size().ok_or(InputError::Inconsistent(
            "a minimum-inspection plan needs the lot size: give --lot-size N".to_string(),
        ))?;
        if lot_size < 2 {
            return Err(InputError::out_of_range(
                "lot size",
                lot_size,
                &format!("2 to {MAX_LOT_SIZE} units"),
            ));
        }
        let quality = protection.quality();
        let (label, flag) = match protection {
            Protection::Ltpd(_) => ("LTPD", "LTPD (--ltpd)"),
            Protection::Aoql(_) => ("AOQL", "AOQL (--aoql)"),
        };
        check_quality(
            &model,
            "process average (--process-average)",
            process_average,
        )?;
        check_quality(&model, flag, quality)?;
        if let Protection::Ltpd(point) = protection {
            check_risk("beta (consumer's risk at the LTPD, --beta)", point.risk)?;
            if model.kind() == ModelKind::Hypergeometric
                && nonconforming_in_lot(point.quality, lot_size) == 0
            {
                return Err(InputError::Inconsistent(format!(
                    "an LTPD of {} means no nonconforming unit in a lot of {lot_size} (D = round(p N) = 0), so no plan can reject such a lot; raise the LTPD to at least {}",
                    point.quality,
                    0.5 / lot_size as f64
                )));
            }
        }
        if process_average >= quality {
            return Err(InputError::Inconsistent(format!(
                "the process average {process_average} must be below the {label} {quality}: a process that runs at or above it needs improving or 100% inspection, not a sampling plan"
            )));
        }
        if !matches!(scheme, Scheme::Single | Scheme::Double) {
            return Err(InputError::out_of_range(
                "scheme (--scheme)",
                scheme,
                "single or double",
            ));
        }
        Ok(RectifyingRequest {
            model,
            lot_size,
            process_average,
            protection,
            scheme,
        })
    }

    /// The model, with the lot size.
    pub fn model(&self) -> &Model {
        &self.model
    }

    /// The lot size `N`.
    pub fn lot_size(&self) -> u64 {
        self.lot_size
    }

    /// The process average `p̄`.
    pub fn process_average(&self) -> f64 {
        self.process_average
    }

    /// The protection.
    pub fn protection(&self) -> Protection {
        self.protection
    }

    /// Single or double.
    pub fn scheme(&self) -> Scheme {
        self.scheme
    }

    /// The consumer's risk at which the design's LTPD is read: beta for an
    /// LTPD protection, [`AOQL_PLAN_LTPD_RISK`] for an AOQL one.
    pub fn ltpd_risk(&self) -> f64 {
        match self.protection {
            Protection::Ltpd(point) => point.risk,
            Protection::Aoql(_) => AOQL_PLAN_LTPD_RISK,
        }
    }

    /// The qualities at which `plan` is evaluated by default: the eight
    /// levels that bracket the process average and the LTPD (the agreed
    /// one, or for an AOQL protection the plan's own, where `Pa` falls to
    /// [`AOQL_PLAN_LTPD_RISK`]), as [`default_qualities`] brackets two risk
    /// points.
    pub fn default_qualities(&self, plan: &StagedPlan) -> Vec<f64> {
        let upper = match self.protection {
            Protection::Ltpd(point) => point.quality,
            Protection::Aoql(_) => quality_at_pa(plan, &self.model, self.ltpd_risk()),
        };
        // Only the qualities of the pair are used; its risks are the
        // nominal 0.05 and 0.10 of any valid pair.
        let pair = RiskPair::new(
            RiskPoint {
                quality: self.process_average,
                risk: 0.05,
            },
            RiskPoint {
                quality: upper,
                risk: 0.10,
            },
            &self.model,
        );
        default_qualities(plan, &self.model, pair.ok().as_ref())
    }
}

/// For one acceptance number, the only single plan that can be best.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct RectifyingRow {
    /// Acceptance number.
    pub c: u64,
    /// `n_min(c)`: the smallest sample that gives the protection with this
    /// `c`, `None` when no sample within the lot does.
    pub n_min: Option<u64>,
    /// `ATI(p̄)` of `(n_min, c)`.
    pub ati: Option<f64>,
}

/// A sampling plan with what it does under rectifying inspection.
#[derive(Clone, Debug, PartialEq)]
pub struct RectifyingPlan {
    /// The plan.
    pub plan: StagedPlan,
    /// `Pa(p̄)`.
    pub pa: f64,
    /// `ATI(p̄)`, units inspected per lot on average.
    pub ati: f64,
    /// `ASN(p̄)`, units sampled per lot on average (before screening).
    pub asn: f64,
    /// The AOQL and the quality where the AOQ reaches it.
    pub aoql: Aoql,
    /// The LTPD: the quality at which `Pa` falls to the request's
    /// [`ltpd_risk`](RectifyingRequest::ltpd_risk) (for a finite lot the
    /// smallest lot quality `D / N` at or below it).
    pub ltpd: f64,
    /// For an LTPD protection, `Pa` at the agreed LTPD (the consumer's risk
    /// achieved).
    pub pa_at_ltpd: Option<f64>,
}

impl RectifyingPlan {
    /// `plan` with its measures for `request`, from the exact recursion.
    pub(crate) fn new(plan: StagedPlan, request: &RectifyingRequest) -> Self {
        let model = request.model();
        let at = measures(&plan, model, request.process_average);
        RectifyingPlan {
            pa: at.pa,
            // The request always has a lot size, so the ATI is always there.
            ati: at.ati.unwrap_or(f64::NAN),
            asn: at.asn,
            aoql: aoql(&plan, model),
            ltpd: quality_at_pa(&plan, model, request.ltpd_risk()),
            pa_at_ltpd: match request.protection {
                Protection::Ltpd(point) => {
                    Some(acceptance_probability(&plan, model, point.quality))
                }
                Protection::Aoql(_) => None,
            },
            plan,
        }
    }
}

/// A minimum-inspection design.
#[derive(Clone, Debug, PartialEq)]
pub struct RectifyingDesign {
    /// The request it answers.
    pub request: RectifyingRequest,
    /// The plan of the requested scheme with the smallest `ATI(p̄)`; `None`
    /// when 100% inspection is the best or the only answer.
    pub plan: Option<RectifyingPlan>,
    /// Double requests: the best single plan, for comparison (`None` when
    /// 100% inspection beats every single plan).
    pub single: Option<RectifyingPlan>,
    /// The single search, one row per acceptance number from 0 to the one
    /// at which the scan stopped.
    pub rows: Vec<RectifyingRow>,
}

/// What the scan over acceptance numbers found.
struct Scan {
    /// One row per acceptance number scanned.
    rows: Vec<RectifyingRow>,
    /// The best plan `(n, c)`, unless 100% inspection wins.
    best: Option<(u64, u64)>,
}

/// The exact searches of one request's single plans.
pub(super) struct SingleSearch<'a> {
    pub(super) request: &'a RectifyingRequest,
    /// The largest sample: the lot, within [`MAX_SAMPLE_SIZE`].
    pub(super) limit: u64,
}

impl<'a> SingleSearch<'a> {
    pub(super) fn new(request: &'a RectifyingRequest) -> Self {
        SingleSearch {
            request,
            limit: request.lot_size.min(MAX_SAMPLE_SIZE),
        }
    }

    /// `n_min(c)`: the smallest sample within the lot that gives the
    /// protection with acceptance number `c`.
    pub(super) fn n_min(&self, c: u64) -> Option<u64> {
        let model = self.request.model();
        match self.request.protection {
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
        let n = y / (limit + y / self.request.lot_size as f64);
        n.round().clamp(1.0, self.limit as f64) as u64
    }

    /// `ATI(p̄)` of the single plan `(n, c)`, as `N - Pa(p̄) (N - n)`.
    pub(super) fn ati(&self, n: u64, c: u64) -> f64 {
        let r = self.request;
        let pa = r.model.tails(n, c, r.process_average, 0, 0).cdf;
        r.lot_size as f64 - pa * (r.lot_size - n) as f64
    }

    /// The scan over `c` (see the module documentation).
    fn scan(&self) -> Result<Scan, DesignError> {
        let mut rows = Vec::new();
        let mut best = None;
        let mut best_ati = self.request.lot_size as f64;
        let last = match self.request.protection {
            Protection::Ltpd(_) => MAX_ACCEPTANCE_NUMBER,
            Protection::Aoql(_) => MAX_AOQL_ACCEPTANCE_NUMBER,
        };
        for c in 0..=last {
            let Some(n) = self.n_min(c) else {
                if self.limit < self.request.lot_size && best_ati > self.limit as f64 {
                    // A sample between the designer's limit and the lot
                    // might give the protection, and save on 100%
                    // inspection: the answer is unknown, not 100%.
                    return Err(DesignError::NoRectifyingPlan {
                        reason: format!(
                            "with acceptance number {c} the protection needs a sample beyond the designer's limit of {MAX_SAMPLE_SIZE} units, and the lot has {}",
                            self.request.lot_size
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
                match self.request.protection {
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
/// passes [`MAX_ACCEPTANCE_NUMBER`] ([`MAX_AOQL_ACCEPTANCE_NUMBER`] for an
/// AOQL), when the protection needs a sample above [`MAX_SAMPLE_SIZE`] in a
/// larger lot (so that whether sampling beats 100% inspection is not
/// known), when a double request's best single plan has an acceptance
/// number above [`MAX_DOUBLE_SINGLE_C`](super::double::MAX_DOUBLE_SINGLE_C),
/// or when no double plan has a smaller ATI than the best single plan;
/// [`DesignError::OverBudget`] when the scan's or the double search's
/// estimated work ([`minimum_work`](crate::minimum_work)) passes the
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
    minimum_work(request).check(
        &format!(
            "the scan over acceptance numbers in a lot of {}",
            request.lot_size
        ),
        "give a smaller lot, or a process average further below the protection's quality",
    )?;
    let search = SingleSearch::new(request);
    let Scan { rows, best } = search.scan()?;
    let single = best
        .map(|(n, c)| RectifyingPlan::new(StagedPlan::single_checked_by_designer(n, c), request));
    match request.scheme {
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
