//! Variables plans: a sample of `n` measurements of a normal
//! characteristic, judged against one or two specification limits.
//!
//! # The rules
//!
//! One limit (the *k* method). With `Q_U = (U - xbar) / sigma` against an
//! upper limit (or `Q_L = (xbar - L) / sigma` against a lower one; `s`
//! replaces `sigma` when it is estimated), accept when `Q >= k`. This is
//! the likelihood-ratio region of the normal model for the mean.
//!
//! Two limits (the *M* method). Estimate the lot's fraction nonconforming
//! by the minimum-variance unbiased estimators of [`estimate`](super::estimate),
//! `p_hat = p_hat_L + p_hat_U`, and accept when `p_hat <= M`.
//!
//! # Operating characteristic
//!
//! A lot of quality `p` (fraction beyond a limit) has its mean `z_p`
//! standard deviations inside the limit, `z_p = Phi^-1(1 - p)`.
//!
//! ```text
//! sigma known, one limit:    Pa(p) = Phi(sqrt(n) (z_p - k))
//! sigma unknown, one limit:  Pa(p) = P(T'(n - 1, z_p sqrt(n)) >= k sqrt(n))
//! ```
//!
//! with `T'` noncentral t ([`NoncentralT`]); both exact (see e.g.
//! D. C. Montgomery, *Introduction to Statistical Quality Control*, the
//! chapter on acceptance sampling by variables, from memory).
//!
//! Two limits, sigma known: `p` fixes the mean up to its mirror image about
//! the midpoint, the accepted means `xbar` form an interval `|xbar - mid|
//! <= h sigma` about the midpoint, and `Pa` is the exact normal probability
//! of that interval.
//!
//! Two limits, sigma unknown: `Pa` depends on how `p` splits between the
//! tails, not on `p` alone. The plan is held to the worst split: the
//! producer's risk is the largest rejection probability over splits at
//! the AQL, the consumer's the largest `Pa` over splits at the RQL
//! ([`split_oc`](super::split_oc)). The end with all of `p` beyond one limit
//! is the one-limit noncentral t formula with the equivalent `k_M` from
//! [`statistic_for_fraction`](super::estimate::statistic_for_fraction).
//!
//! Known limitation: at n = 3 the accepted means can form two intervals;
//! the OC there takes them as one (off by up to about 2e-4).

use std::fmt;
use std::sync::Arc;

use super::estimate::{fraction_beyond_known, statistic_for_fraction};
use super::limits::MAX_VARIABLES_SAMPLE;
use super::specification::{LimitKind, Specification};
use super::split_oc::{HalfWidths, Worst, WorstSplit, pa_at_split, worst_split, worst_split_near};
use crate::input::InputError;
use crate::model::NoncentralT;
use crate::model::normal;
use crate::numeric::brent;

/// A variables plan: sample size and acceptance constant (`k` for one
/// limit, `M` for two) for a specification. It exists only if valid: `n`
/// within `smallest_sample ..= 10^4`, `k` finite with `|k| <= 40`, `M`
/// strictly between 0 and 1/2.
#[derive(Clone, Debug, PartialEq)]
pub struct VariablesPlan {
    spec: Specification,
    n: u64,
    constant: f64,
    /// Two limits: sigma known, the half-width `h` of the accepted
    /// interval of `(xbar - mid) / sigma` (`None`: nothing is accepted);
    /// sigma unknown, the equivalent one-sided `k_M`.
    derived: Option<f64>,
    /// Two limits, sigma unknown: the accepted half-width of the sample
    /// mean as a function of `s`, shared by every split and quality.
    half_widths: Option<Arc<HalfWidths>>,
}

impl VariablesPlan {
    /// Validates a plan.
    ///
    /// # Errors
    /// [`InputError::OutOfRange`] for `n`, `k` or `M`.
    pub fn new(spec: Specification, n: u64, constant: f64) -> Result<Self, InputError> {
        let least = spec.smallest_sample();
        if !(least..=MAX_VARIABLES_SAMPLE).contains(&n) {
            return Err(InputError::out_of_range(
                "sample size n",
                n,
                &format!("{least} to {MAX_VARIABLES_SAMPLE} for this specification"),
            ));
        }
        let two = spec.limit() == LimitKind::Both;
        if two && !(constant > 0.0 && constant < 0.5) {
            return Err(InputError::out_of_range(
                "maximum allowable fraction M",
                constant,
                "between 0 and 0.5 (exclusive)",
            ));
        }
        let k_valid = constant.is_finite() && constant.abs() <= 40.0;
        if !two && !k_valid {
            return Err(InputError::out_of_range(
                "acceptance constant k",
                constant,
                "a finite number from -40 to 40",
            ));
        }
        let derived = match (two, spec.half_width()) {
            (false, _) => None,
            (true, Some(d)) => accepted_half_width(d, n, constant),
            (true, None) => Some(statistic_for_fraction(constant, n, false)),
        };
        let half_widths =
            (two && spec.sigma().is_none()).then(|| Arc::new(HalfWidths::new(n, constant)));
        Ok(VariablesPlan {
            spec,
            n,
            constant,
            derived,
            half_widths,
        })
    }

    /// The specification.
    pub fn spec(&self) -> &Specification {
        &self.spec
    }

    /// Sample size.
    pub fn n(&self) -> u64 {
        self.n
    }

    /// One limit: the acceptance constant `k`.
    pub fn k(&self) -> Option<f64> {
        (self.spec.limit() != LimitKind::Both).then_some(self.constant)
    }

    /// Two limits: the maximum allowable fraction `M`.
    pub fn m(&self) -> Option<f64> {
        (self.spec.limit() == LimitKind::Both).then_some(self.constant)
    }

    /// Two limits, sigma unknown: the one-sided statistic `k_M` at which
    /// the estimate equals `M`.
    pub fn one_sided_k(&self) -> Option<f64> {
        match (self.spec.limit(), self.spec.sigma()) {
            (LimitKind::Both, None) => self.derived,
            _ => None,
        }
    }

    /// `Pa(p)`: the OC at quality `p`, `lowest_quality < p < 1`. For two
    /// limits with sigma unknown this is the one-sided end, all of `p`
    /// beyond one limit; see [`VariablesPlan::pa_at_split`] for the other
    /// splits and [`VariablesPlan::worst_split`] for the worst.
    pub fn pa(&self, p: f64) -> f64 {
        let nf = self.n as f64;
        let z = normal::upper_quantile(p);
        match (self.spec.limit(), self.spec.sigma(), self.spec.half_width()) {
            (LimitKind::Both, Some(_), Some(d)) => match self.derived {
                None => 0.0,
                Some(h) => {
                    let y = mean_offset(d, p);
                    let root = nf.sqrt();
                    (normal::cdf(root * (h - y)) - normal::cdf(-root * (h + y))).max(0.0)
                }
            },
            (LimitKind::Both, None, _) => {
                let k = self.derived.unwrap_or(f64::INFINITY);
                NoncentralT::new(self.n - 1, z * nf.sqrt()).sf(k * nf.sqrt())
            }
            (_, Some(_), _) => normal::cdf(nf.sqrt() * (z - self.constant)),
            (_, None, _) => {
                NoncentralT::new(self.n - 1, z * nf.sqrt()).sf(self.constant * nf.sqrt())
            }
        }
    }

    /// `1 - Pa(p)`, the probability of rejection, from the rejection tails
    /// themselves rather than as `1 -` the OC: where `Pa` rounds to 1 (a
    /// producer's risk of `5e-17` or `1e-30`) it keeps its digits. For two
    /// limits with sigma unknown this is the one-sided end, as
    /// [`VariablesPlan::pa`].
    ///
    /// ```text
    /// sigma known, one limit:    Phi(-sqrt(n) (z_p - k))
    /// sigma unknown, one limit:  P(T'(n - 1, z_p sqrt(n)) < k sqrt(n))
    /// sigma known, two limits:   Phi(-sqrt(n) (h - y)) + Phi(-sqrt(n) (h + y))
    /// ```
    pub fn reject(&self, p: f64) -> f64 {
        let nf = self.n as f64;
        let z = normal::upper_quantile(p);
        match (self.spec.limit(), self.spec.sigma(), self.spec.half_width()) {
            (LimitKind::Both, Some(_), Some(d)) => match self.derived {
                None => 1.0,
                Some(h) => {
                    let y = mean_offset(d, p);
                    let root = nf.sqrt();
                    (normal::cdf(-root * (h - y)) + normal::cdf(-root * (h + y))).min(1.0)
                }
            },
            (LimitKind::Both, None, _) => {
                let k = self.derived.unwrap_or(f64::INFINITY);
                NoncentralT::new(self.n - 1, z * nf.sqrt()).cdf(k * nf.sqrt())
            }
            (_, Some(_), _) => normal::sf(nf.sqrt() * (z - self.constant)),
            (_, None, _) => {
                NoncentralT::new(self.n - 1, z * nf.sqrt()).cdf(self.constant * nf.sqrt())
            }
        }
    }

    /// The producer's and consumer's risks the plan achieves at the
    /// qualities `p1` and `p2`: the larger probability of rejection at
    /// `p1` and the larger `Pa` at `p2` over the splits of the lot's
    /// fraction between the limits, each from its own tail
    /// ([`VariablesPlan::reject`]).
    pub fn achieved_risks(&self, p1: f64, p2: f64) -> (f64, f64) {
        self.achieved_risks_and_splits(p1, p2).0
    }

    /// [`VariablesPlan::achieved_risks`] with, for two limits and sigma
    /// unknown, the splits where they are reached (producer's, then
    /// consumer's).
    pub fn achieved_risks_and_splits(
        &self,
        p1: f64,
        p2: f64,
    ) -> ((f64, f64), Option<(WorstSplit, WorstSplit)>) {
        match (
            self.worst_split(p1, Worst::Lowest),
            self.worst_split(p2, Worst::Highest),
        ) {
            (Some(low), Some(high)) => {
                // The one-sided end from its own tail, which keeps the
                // digits of a risk that 1 - Pa would lose.
                let producer = if low.share == 0.0 {
                    self.reject(p1)
                } else {
                    1.0 - low.pa
                };
                ((producer, high.pa), Some((low, high)))
            }
            _ => ((self.reject(p1), self.pa(p2)), None),
        }
    }

    /// Two limits, sigma unknown: `Pa(p)` with the share `share` of `p`
    /// beyond the lower limit (`0 < share < 1`), by the integral of
    /// `src/plan/split_oc.rs`. `None` for the other plans, whose OC
    /// depends on `p` alone.
    pub fn pa_at_split(&self, p: f64, share: f64) -> Option<f64> {
        self.half_widths
            .as_ref()
            .map(|h| pa_at_split(h, self.n, p, share))
    }

    /// Two limits, sigma unknown: `Pa(p)` with the mean centred between the
    /// limits and `p/2` beyond each (the split 1/2).
    pub fn pa_centred(&self, p: f64) -> Option<f64> {
        self.pa_at_split(p, 0.5)
    }

    /// Two limits, sigma unknown: the split of `p` with the smallest
    /// ([`Worst::Lowest`]) or largest ([`Worst::Highest`]) `Pa`, the
    /// one-sided end (share 0) included. `None` for the other plans.
    pub fn worst_split(&self, p: f64, worst: Worst) -> Option<WorstSplit> {
        let inside = self.worst_inside(p, worst)?;
        let one = self.pa(p);
        let one_worse = match worst {
            Worst::Lowest => one <= inside.pa,
            Worst::Highest => one >= inside.pa,
        };
        Some(if one_worse {
            WorstSplit {
                share: 0.0,
                pa: one,
            }
        } else {
            inside
        })
    }

    /// The worst split strictly inside `(0, 1/2]`, the one-sided end left
    /// out (the designer takes that end from the noncentral t quantiles).
    pub(crate) fn worst_inside(&self, p: f64, worst: Worst) -> Option<WorstSplit> {
        let h = self.half_widths.as_ref()?;
        Some(worst_split(|w| pa_at_split(h, self.n, p, w), worst))
    }

    /// [`VariablesPlan::worst_inside`] searched only near the share
    /// `around`, a worst split found at a nearby plan.
    pub(crate) fn worst_near(&self, p: f64, worst: Worst, around: f64) -> Option<WorstSplit> {
        let h = self.half_widths.as_ref()?;
        Some(worst_split_near(
            |w| pa_at_split(h, self.n, p, w),
            worst,
            around,
        ))
    }

    /// The smaller and larger `Pa` over the splits of `p` (equal for
    /// every plan but two limits with sigma unknown).
    pub fn pa_bounds(&self, p: f64) -> (f64, f64) {
        match (
            self.worst_split(p, Worst::Lowest),
            self.worst_split(p, Worst::Highest),
        ) {
            (Some(low), Some(high)) => (low.pa, high.pa),
            _ => (self.pa(p), self.pa(p)),
        }
    }
}

impl fmt::Display for VariablesPlan {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match (self.k(), self.m()) {
            (Some(k), _) => write!(f, "n = {}, k = {}", self.n, k)?,
            (_, Some(m)) => write!(f, "n = {}, M = {}", self.n, m)?,
            _ => write!(f, "n = {}", self.n)?,
        }
        write!(
            f,
            " (sigma {}, {} limit{})",
            self.spec.sigma_kind().name(),
            self.spec.limit().name(),
            if self.spec.limit() == LimitKind::Both {
                "s"
            } else {
                ""
            }
        )
    }
}

/// Sigma known, two limits of half-width `d` (in sigmas): the half-width
/// `h` of the accepted interval of `(xbar - mid) / sigma`, where the
/// estimate `Phi(-v (d - y)) + Phi(-v (d + y))`, `v = sqrt(n / (n - 1))`,
/// reaches `m`. The estimate rises with `|y|`; `None` when even a centred
/// mean gives more than `m`.
fn accepted_half_width(d: f64, n: u64, m: f64) -> Option<f64> {
    let estimate = |y: f64| fraction_beyond_known(d - y, n) + fraction_beyond_known(d + y, n);
    if estimate(0.0) > m {
        return None;
    }
    // At y = d the upper estimate alone is 1/2 > m.
    brent(|y| estimate(y) - m, 0.0, d, 1e-14 * (1.0 + d))
}

/// Sigma known, two limits of half-width `d`: the offset `y >= 0` of the
/// mean from the midpoint, in sigmas, of a lot of quality `p`:
/// `Phi(-(d - y)) + Phi(-(d + y)) = p`. A `p` at or below the centred
/// process's fraction gives 0.
fn mean_offset(d: f64, p: f64) -> f64 {
    let fraction = |y: f64| normal::cdf(y - d) + normal::cdf(-y - d);
    if fraction(0.0) >= p {
        return 0.0;
    }
    brent(|y| fraction(y) - p, 0.0, d + 40.0, 1e-14 * (1.0 + d)).unwrap_or(0.0)
}
