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
//! tails, not on `p` alone. The plan is held to two configurations, the
//! ends of that family:
//! - *one-sided*: all of `p` beyond one limit, the other tail vanishing;
//!   then `p_hat <= M` is `Q >= k_M` with `k_M` from
//!   [`statistic_for_fraction`](super::estimate::statistic_for_fraction),
//!   and `Pa` is the one-limit noncentral t formula;
//! - *centred*: the mean at the midpoint and `p/2` in each tail; `Pa` is a
//!   one-dimensional integral over `s` of the normal probability of the
//!   accepted interval of `xbar`, by adaptive Gauss–Kronrod quadrature.
//!
//! Known limitation: intermediate splits are not always between the two
//! (the reference script's `split_check`, tests/data/README.md: by about
//! 1e-6 at n = 43, up to 4e-4 at n <= 18), and at n = 3 the accepted
//! means can form two intervals. Holding the plan to the worst split is
//! the open fix.

use std::fmt;

use serde::{Deserialize, Serialize};

use super::estimate::{fraction_beyond_known, fraction_beyond_unknown, statistic_for_fraction};
use super::limits::MAX_VARIABLES_SAMPLE;
use crate::input::InputError;
use crate::model::NoncentralT;
use crate::model::noncentral_t::ScaleDensity;
use crate::model::normal;
use crate::numeric::{brent, integrate};

/// Whether the process standard deviation is known or estimated from each
/// sample.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum SigmaKind {
    /// Known from a stable process record: the statistic divides by sigma.
    Known,
    /// Estimated: the statistic divides by the sample standard deviation.
    Unknown,
}

impl SigmaKind {
    /// The name used on the command line, in YAML and in JSON.
    pub fn name(self) -> &'static str {
        match self {
            SigmaKind::Known => "known",
            SigmaKind::Unknown => "unknown",
        }
    }
}

/// Which specification limits the characteristic has.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum LimitKind {
    /// A lower limit `L` only.
    Lower,
    /// An upper limit `U` only.
    Upper,
    /// Both `L` and `U`.
    Both,
}

impl LimitKind {
    /// The name used on the command line, in YAML and in JSON.
    pub fn name(self) -> &'static str {
        match self {
            LimitKind::Lower => "lower",
            LimitKind::Upper => "upper",
            LimitKind::Both => "both",
        }
    }
}

/// The measured characteristic's specification: its limits and what is
/// known of its standard deviation. Valid means: the limits the kind needs
/// are given and finite (and no others), `L < U`, and a known sigma is a
/// finite positive number.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Specification {
    sigma: Option<f64>,
    limit: LimitKind,
    lower: Option<f64>,
    upper: Option<f64>,
}

impl Specification {
    /// Validates a specification.
    ///
    /// # Errors
    /// [`InputError`] naming the missing, misplaced or out-of-range value.
    pub fn new(
        sigma: SigmaKind,
        sigma_value: Option<f64>,
        limit: LimitKind,
        lower: Option<f64>,
        upper: Option<f64>,
    ) -> Result<Self, InputError> {
        let sigma = match (sigma, sigma_value) {
            (SigmaKind::Known, Some(v)) if v.is_finite() && v > 0.0 => Some(v),
            (SigmaKind::Known, Some(v)) => {
                return Err(InputError::out_of_range(
                    "sigma value (--sigma-value)",
                    v,
                    "a finite number above 0, in the unit of the measurements",
                ));
            }
            (SigmaKind::Known, None) => {
                return Err(InputError::Inconsistent(
                    "sigma known needs its value: give --sigma-value S (sigma_value in the plan source)"
                        .to_string(),
                ));
            }
            (SigmaKind::Unknown, Some(_)) => {
                return Err(InputError::Inconsistent(
                    "sigma unknown is estimated from each sample; drop --sigma-value (sigma_value), or use sigma known"
                        .to_string(),
                ));
            }
            (SigmaKind::Unknown, None) => None,
        };
        let need = |name: &str, value: Option<f64>, wanted: bool| -> Result<(), InputError> {
            match (value, wanted) {
                (Some(v), true) if v.is_finite() => Ok(()),
                (Some(v), true) => Err(InputError::out_of_range(name, v, "a finite number")),
                (None, true) => Err(InputError::Inconsistent(format!(
                    "the {} limit needs its value: give {name}",
                    limit.name()
                ))),
                (Some(_), false) => Err(InputError::Inconsistent(format!(
                    "{name} was given, but the limit is {}; use --limit both for two limits",
                    limit.name()
                ))),
                (None, false) => Ok(()),
            }
        };
        need(
            "--lower L (lower)",
            lower,
            matches!(limit, LimitKind::Lower | LimitKind::Both),
        )?;
        need(
            "--upper U (upper)",
            upper,
            matches!(limit, LimitKind::Upper | LimitKind::Both),
        )?;
        if let (Some(l), Some(u)) = (lower, upper)
            && l >= u
        {
            return Err(InputError::Inconsistent(format!(
                "the lower limit {l} must be below the upper limit {u}"
            )));
        }
        Ok(Specification {
            sigma,
            limit,
            lower,
            upper,
        })
    }

    /// The known sigma, or `None` when it is estimated.
    pub fn sigma(&self) -> Option<f64> {
        self.sigma
    }

    /// Known or unknown.
    pub fn sigma_kind(&self) -> SigmaKind {
        match self.sigma {
            Some(_) => SigmaKind::Known,
            None => SigmaKind::Unknown,
        }
    }

    /// Which limits.
    pub fn limit(&self) -> LimitKind {
        self.limit
    }

    /// The lower limit `L`.
    pub fn lower(&self) -> Option<f64> {
        self.lower
    }

    /// The upper limit `U`.
    pub fn upper(&self) -> Option<f64> {
        self.upper
    }

    /// Sigma known, two limits: half the tolerance in standard deviations,
    /// `D = (U - L) / (2 sigma)`.
    pub fn half_width(&self) -> Option<f64> {
        match (self.sigma, self.lower, self.upper) {
            (Some(s), Some(l), Some(u)) => Some((u - l) / (2.0 * s)),
            _ => None,
        }
    }

    /// The least fraction nonconforming a process can have under this
    /// specification: `2 Phi(-D)` with the mean centred, for two limits and
    /// a known sigma; 0 otherwise.
    pub fn lowest_quality(&self) -> f64 {
        self.half_width().map_or(0.0, |d| 2.0 * normal::cdf(-d))
    }

    /// The smallest sample the rule is defined for: 1 (one limit, sigma
    /// known), 2 (one limit with `s`, or two limits with sigma known: the
    /// estimator needs `n - 1 > 0`), 3 (two limits with `s`: the beta
    /// estimator needs `n/2 - 1 > 0`).
    pub fn smallest_sample(&self) -> u64 {
        match (self.limit, self.sigma) {
            (LimitKind::Both, None) => 3,
            (LimitKind::Both, Some(_)) | (_, None) => 2,
            (_, Some(_)) => 1,
        }
    }
}

/// A variables plan: sample size and acceptance constant (`k` for one
/// limit, `M` for two) for a specification. It exists only if valid: `n`
/// within `smallest_sample ..= 10^4`, `k` finite with `|k| <= 40`, `M`
/// strictly between 0 and 1/2.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct VariablesPlan {
    spec: Specification,
    n: u64,
    constant: f64,
    /// Two limits: sigma known, the half-width `h` of the accepted
    /// interval of `(xbar - mid) / sigma` (`None`: nothing is accepted);
    /// sigma unknown, the equivalent one-sided `k_M`.
    derived: Option<f64>,
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
        let two = spec.limit == LimitKind::Both;
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
        Ok(VariablesPlan {
            spec,
            n,
            constant,
            derived,
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
        (self.spec.limit != LimitKind::Both).then_some(self.constant)
    }

    /// Two limits: the maximum allowable fraction `M`.
    pub fn m(&self) -> Option<f64> {
        (self.spec.limit == LimitKind::Both).then_some(self.constant)
    }

    /// Two limits, sigma unknown: the one-sided statistic `k_M` at which
    /// the estimate equals `M`.
    pub fn one_sided_k(&self) -> Option<f64> {
        match (self.spec.limit, self.spec.sigma) {
            (LimitKind::Both, None) => self.derived,
            _ => None,
        }
    }

    /// `Pa(p)`: the OC at quality `p`, `lowest_quality < p < 1`. For two
    /// limits with sigma unknown this is the one-sided configuration; see
    /// [`VariablesPlan::pa_centred`] for the other.
    pub fn pa(&self, p: f64) -> f64 {
        let nf = self.n as f64;
        let z = normal::upper_quantile(p);
        match (self.spec.limit, self.spec.sigma, self.spec.half_width()) {
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
    /// limits with sigma unknown this is the one-sided configuration, as
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
        match (self.spec.limit, self.spec.sigma, self.spec.half_width()) {
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
    /// `p1` and the larger `Pa` at `p2` over the configurations the plan
    /// is held to, each from its own tail ([`VariablesPlan::reject`]).
    pub fn achieved_risks(&self, p1: f64, p2: f64) -> (f64, f64) {
        let producer = match self.pa_centred(p1) {
            Some(centred) => self.reject(p1).max(1.0 - centred),
            None => self.reject(p1),
        };
        (producer, self.pa_bounds(p2).1)
    }

    /// Two limits, sigma unknown: `Pa(p)` with the mean centred between the
    /// limits and `p/2` beyond each. `None` for the other plans, whose OC
    /// depends on `p` alone.
    pub fn pa_centred(&self, p: f64) -> Option<f64> {
        (self.spec.limit == LimitKind::Both && self.spec.sigma.is_none())
            .then(|| centred_acceptance(self.n, self.constant, p))
    }

    /// The smaller and larger `Pa` over the configurations the plan is
    /// held to (equal for every plan but two limits with sigma unknown).
    pub fn pa_bounds(&self, p: f64) -> (f64, f64) {
        let pa = self.pa(p);
        match self.pa_centred(p) {
            Some(c) => (pa.min(c), pa.max(c)),
            None => (pa, pa),
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
            self.spec.limit.name(),
            if self.spec.limit == LimitKind::Both {
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

/// Two limits, sigma unknown, mean centred, `p/2` in each tail: with
/// sigma = 1 and the limits at `-D, D`, `D = z_{p/2}`,
///
/// ```text
/// Pa = ∫ f_S(s) [Phi(sqrt(n) h(s)) - Phi(-sqrt(n) h(s))] ds
/// ```
///
/// where `|xbar| <= h(s)` is where `p_hat_U + p_hat_L <= M` for a sample
/// with `s`. The estimate at `xbar = 0` reaches `M` at
/// `s_max = D / k_{M/2}`; beyond it nothing is accepted. Near `s_max`,
/// `h ~ sqrt(s_max - s)`, so the integral is taken in `u` with
/// `s = s_max - u^2`, where the integrand is smooth.
fn centred_acceptance(n: u64, m: f64, p: f64) -> f64 {
    let d = normal::upper_quantile(0.5 * p);
    let root_n = (n as f64).sqrt();
    let density = ScaleDensity::new(n - 1);
    let (lo, hi) = density.bulk();
    let s_max = d / statistic_for_fraction(0.5 * m, n, false);
    if s_max <= lo {
        return 0.0;
    }
    let accepted = |s: f64| -> f64 {
        let estimate = |y: f64| {
            fraction_beyond_unknown((d - y) / s, n) + fraction_beyond_unknown((d + y) / s, n)
        };
        let h = if estimate(0.0) > m {
            0.0
        } else {
            brent(|y| estimate(y) - m, 0.0, d, 1e-13 * (1.0 + d)).unwrap_or(0.0)
        };
        density.pdf(s) * (1.0 - 2.0 * normal::cdf(-root_n * h))
    };
    if s_max >= hi {
        return integrate(accepted, lo, hi, 4, 1e-10).clamp(0.0, 1.0);
    }
    let top = (s_max - lo).sqrt();
    integrate(|u| 2.0 * u * accepted(s_max - u * u), 0.0, top, 4, 1e-10).clamp(0.0, 1.0)
}
