//! Likelihood models for the count found in a sample.
//!
//! Three models, one file each: [binomial](self::binomial) (fraction
//! nonconforming, an infinite lot or sampling with replacement),
//! [hypergeometric](self::hypergeometric) (a finite lot, sampling without
//! replacement) and [Poisson](self::poisson) (nonconformities per unit, and
//! the usual approximation to the binomial). All three share the
//! saddle-point log-probabilities of [`saddle`](self::saddle) and the tail
//! summation of [`tail`](self::tail).
//!
//! Why not statrs' regularized incomplete beta and gamma functions: their
//! prefactor `exp(a ln x + b ln(1 - x) - ln B(a, b))` subtracts log-gammas of
//! size `n ln n`, which at `n = 10^7` costs about `3e-8` of relative accuracy,
//! thirty times the `1e-9` this crate promises. The tail sums here cost
//! `O(c)` at most and stay within about `1e-13` (the reference suite, tests/reference/).

mod binomial;
mod hypergeometric;
mod interval;
pub(crate) mod noncentral_t;
pub(crate) mod normal;
mod one_unit;
mod poisson;
mod risk;
pub(crate) mod rows;
mod saddle;
mod tail;
mod window;

use std::fmt;

use serde::{Deserialize, Serialize};

use crate::input::InputError;
use crate::numeric::Quantity;
use binomial::Binomial;
use hypergeometric::Hypergeometric;
pub use hypergeometric::nonconforming_in_lot;
pub use interval::{Interval, clopper_pearson, poisson_rate_interval};
pub use noncentral_t::NoncentralT;
pub(crate) use one_unit::OneUnit;
use poisson::Poisson;
pub use risk::{RiskPair, RiskPoint, check_quality};
pub(crate) use risk::{check_risk, check_risks};
pub use tail::Tails;
pub(crate) use tail::at_most_one;
use tail::{Terms, tails};
pub(crate) use window::Window;
use window::window;

/// Which likelihood model turns a quality into a count distribution.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum ModelKind {
    /// Fraction nonconforming `p`; count in `n` units is `Binomial(n, p)`.
    Binomial,
    /// Finite lot of `N` units holding `D = round(p N)` nonconforming ones;
    /// count in `n` units drawn without replacement is hypergeometric.
    Hypergeometric,
    /// Nonconformities per unit `p`; count in `n` units is `Poisson(n p)`.
    Poisson,
}

impl ModelKind {
    /// The name used on the command line, in YAML and in JSON.
    pub fn name(self) -> &'static str {
        match self {
            ModelKind::Binomial => "binomial",
            ModelKind::Hypergeometric => "hypergeometric",
            ModelKind::Poisson => "poisson",
        }
    }

    /// What the quality means under this model, for reports.
    pub fn quality_meaning(self) -> &'static str {
        match self {
            ModelKind::Poisson => "nonconformities per unit",
            _ => "fraction nonconforming",
        }
    }

    /// The unit of qualities, AOQ and AOQL in JSON reports: `fraction`
    /// (0.01 is 1% nonconforming) or `per_unit` (nonconformities per unit;
    /// per 100 units is 100 times the number).
    pub fn quality_unit(self) -> &'static str {
        match self {
            ModelKind::Poisson => "per_unit",
            _ => "fraction",
        }
    }
}

impl fmt::Display for ModelKind {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

/// The largest rate of nonconformities per unit (Poisson) accepted: the
/// largest double over 100, rounded down to `1.7e306`, so that the rate
/// per 100 units is a finite number.
pub const MAX_RATE: f64 = 1.7e306;

/// The largest lot size accepted: `10^12` units, far beyond any real lot and
/// well inside the range where `f64` holds every whole number exactly.
pub const MAX_LOT_SIZE: u64 = 1_000_000_000_000;

/// A validated model: its kind and, where known, the lot size.
///
/// The lot size is required by the hypergeometric model and optional for the
/// other two, where it serves only the rectifying measures (AOQ with the
/// `(N - n) / N` factor, ATI).
///
/// # Example
/// ```
/// use lotsman::{Model, ModelKind};
/// let m = Model::new(ModelKind::Binomial, None).unwrap();
/// let pa = m.tails(89, 2, 0.01, 0, 0).cdf;
/// assert!((pa - 0.9397).abs() < 5e-5); // Montgomery's n = 89, c = 2 (from memory)
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Model {
    kind: ModelKind,
    lot_size: Option<u64>,
}

impl Model {
    /// Builds a model.
    ///
    /// # Errors
    /// [`InputError::LotSizeMissing`] for a hypergeometric model without a
    /// lot size; [`InputError::OutOfRange`] for a lot size of 0 or above
    /// [`MAX_LOT_SIZE`].
    pub fn new(kind: ModelKind, lot_size: Option<u64>) -> Result<Self, InputError> {
        if let Some(n) = lot_size
            && (n == 0 || n > MAX_LOT_SIZE)
        {
            return Err(InputError::out_of_range("lot size", n, "1 to 10^12 units"));
        }
        if kind == ModelKind::Hypergeometric && lot_size.is_none() {
            return Err(InputError::LotSizeMissing);
        }
        Ok(Model { kind, lot_size })
    }

    /// The model kind.
    pub fn kind(&self) -> ModelKind {
        self.kind
    }

    /// The lot size, when known.
    pub fn lot_size(&self) -> Option<u64> {
        self.lot_size
    }

    /// The model in words for messages: "binomial model", or
    /// "hypergeometric model, lot of 2000" when the lot size is known.
    pub fn described(&self) -> String {
        match self.lot_size {
            Some(lot) => format!("{} model, lot of {lot}", self.kind),
            None => format!("{} model", self.kind),
        }
    }

    /// The largest sample the model allows: the lot size whenever one is
    /// known, whatever the model (no sample is larger than its lot);
    /// otherwise unbounded.
    pub fn max_sample(&self) -> u64 {
        self.lot_size.unwrap_or(u64::MAX)
    }

    /// The same model without its lot size, for the binomial and Poisson
    /// models, whose probabilities do not depend on it (a designer searches
    /// on it to learn the sample the points need, then holds that sample
    /// to the lot with [`Model::fit_in_lot`]); the hypergeometric model as
    /// it is.
    pub(crate) fn without_lot(&self) -> Model {
        match self.kind {
            ModelKind::Hypergeometric => *self,
            kind => Model {
                kind,
                lot_size: None,
            },
        }
    }

    /// Checks that a sample of `n` units, named `what` (e.g. "stage 2
    /// cumulative sample size"), fits the lot: whenever a lot size is
    /// known, under every model, a sample cannot take more units than the
    /// lot holds. This is the one place the rule lives; plans given by hand,
    /// recorded in a source or built by a designer all pass through it.
    ///
    /// # Errors
    /// [`InputError::Inconsistent`] naming `what`, `n` and the lot size,
    /// and what to do instead.
    ///
    /// # Example
    /// ```
    /// use lotsman::{Model, ModelKind};
    /// let m = Model::new(ModelKind::Binomial, Some(30)).unwrap();
    /// assert!(m.check_sample("stage 1 cumulative sample size", 30).is_ok());
    /// let e = m.check_sample("stage 1 cumulative sample size", 110).unwrap_err();
    /// assert!(e.to_string().contains("110 exceeds the lot size 30"));
    /// ```
    pub fn check_sample(&self, what: impl fmt::Display, n: u64) -> Result<(), InputError> {
        match self.lot_size {
            Some(lot) if n > lot => Err(InputError::Inconsistent(format!(
                "{what} {n} exceeds the lot size {lot}: a sample cannot be larger than its lot; inspect all {lot} units (100%), or give a plan whose samples fit the lot"
            ))),
            _ => Ok(()),
        }
    }

    /// The number of nonconforming units `D = round(p N)` that a lot of
    /// quality `p` holds under the hypergeometric model
    /// ([`nonconforming_in_lot`]); `None` for the other two models, whose
    /// quality is a process's and not a whole number of units.
    pub fn nonconforming_in_lot(&self, p: f64) -> Option<u64> {
        match (self.kind, self.lot_size) {
            (ModelKind::Hypergeometric, Some(lot)) => Some(nonconforming_in_lot(p, lot)),
            _ => None,
        }
    }

    /// The quality every measure is computed at when the asked quality is
    /// `p`: the lot's own quality `D / N` under the hypergeometric model (a
    /// finite lot holds a whole number of nonconforming units), `p` itself
    /// under the other two.
    ///
    /// Pa, AOQ, ATI and ASN all take it, so that two qualities that mean
    /// the same lot (the same `D`) get the same figures, and no AOQ exceeds
    /// the AOQL, which is the largest AOQ over the lot qualities `D / N`.
    ///
    /// # Example
    /// ```
    /// use lotsman::{Model, ModelKind};
    /// let m = Model::new(ModelKind::Hypergeometric, Some(300)).unwrap();
    /// assert_eq!(m.nonconforming_in_lot(0.0065), Some(2));
    /// assert_eq!(m.lot_quality(0.0065), 2.0 / 300.0);
    /// ```
    pub fn lot_quality(&self, p: f64) -> f64 {
        match (self.nonconforming_in_lot(p), self.lot_size) {
            (Some(d), Some(lot)) => d as f64 / lot as f64,
            _ => p,
        }
    }

    /// Whether `p` is a quality this model can take: `0 < p < 1` for a
    /// fraction nonconforming; for nonconformities per unit `p > 0` up to
    /// [`MAX_RATE`], so that the rate per 100 units, which reports print
    /// beside it, is a number too.
    pub fn accepts_quality(&self, p: f64) -> bool {
        match self.kind {
            ModelKind::Poisson => p > 0.0 && p <= MAX_RATE,
            _ => p > 0.0 && p < 1.0,
        }
    }

    /// The valid qualities of this model, in words, for refusals.
    pub(crate) fn quality_range(&self) -> &'static str {
        match self.kind {
            ModelKind::Poisson => {
                "above 0 (nonconformities per unit) and at most 1.7e306, so that the rate per 100 units is a number"
            }
            _ => "between 0 and 1 (exclusive), e.g. 0.01 or 1%",
        }
    }

    /// The tails `P(X <= c)` and `P(X > c)` of the count `X` found in the
    /// next `m` units, after `drawn` units holding `found` nonconforming
    /// ones have already been taken (the hypergeometric model draws the next
    /// units from what is left of the lot; the other two forget the past).
    ///
    /// For a single sample call it with `drawn = found = 0`.
    pub fn tails(&self, m: u64, c: u64, p: f64, drawn: u64, found: u64) -> Tails {
        match self.count(m, p, drawn, found) {
            Count::Binomial(d) => tails(&d, c),
            Count::Poisson(d) => tails(&d, c),
            Count::Hypergeometric(d) => tails(&d, c),
            Count::Impossible => Tails::ALL_BELOW,
            Count::Endless => Tails::ALL_ABOVE,
        }
    }

    /// `P(X = k)` for the same count as [`Model::tails`].
    pub fn pmf(&self, m: u64, k: u64, p: f64, drawn: u64, found: u64) -> f64 {
        match self.count(m, p, drawn, found) {
            Count::Binomial(d) => d.ln_pmf(k).exp(),
            Count::Poisson(d) => d.ln_pmf(k).exp(),
            Count::Hypergeometric(d) => d.ln_pmf(k).exp(),
            Count::Impossible => f64::from(u8::from(k == 0)),
            Count::Endless => 0.0,
        }
    }

    /// Whether the count in the next units is independent of what earlier
    /// units held (binomial and Poisson: a process; hypergeometric: a lot
    /// that the earlier draws depleted).
    pub(crate) fn forgets_the_past(&self) -> bool {
        self.kind != ModelKind::Hypergeometric
    }

    /// `P(X = k)` for `k` in `lo..=hi` and the tails on either side, for the
    /// same count as [`Model::tails`].
    pub(crate) fn window(
        &self,
        m: u64,
        lo: u64,
        hi: u64,
        p: f64,
        drawn: u64,
        found: u64,
    ) -> Window {
        match self.count(m, p, drawn, found) {
            Count::Binomial(d) => window(&d, lo, hi),
            Count::Poisson(d) => window(&d, lo, hi),
            Count::Hypergeometric(d) => window(&d, lo, hi),
            Count::Impossible => Window::at_zero(),
            Count::Endless => Window::beyond_every_count(),
        }
    }

    /// Expected number of units inspected in a stage of `m` units under
    /// fully curtailed inspection (stop as soon as the decision is
    /// certain), for a lot entering it `reject_left` nonconforming units
    /// short of rejection and `accept_left` above the count that still
    /// accepts (`None`: the stage cannot accept); the earlier stages drew
    /// `drawn` units holding `found`.
    ///
    /// Binomial and hypergeometric: closed forms in two tails
    /// (`binomial::curtailed_stage_mean`,
    /// `hypergeometric::curtailed_stage_mean`). Poisson: only rejection can
    /// be certain early (`poisson::curtailed_stage_mean`). `None` only for
    /// a hypergeometric state that the earlier draws cannot produce.
    pub(crate) fn curtailed_stage_units(
        &self,
        m: u64,
        accept_left: Option<u64>,
        reject_left: u64,
        p: f64,
        drawn: u64,
        found: u64,
    ) -> Option<f64> {
        match self.kind {
            ModelKind::Binomial => Some(binomial::curtailed_stage_mean(
                m,
                accept_left,
                reject_left,
                p,
            )),
            ModelKind::Poisson => Some(poisson::curtailed_stage_mean(m, reject_left, p)),
            ModelKind::Hypergeometric => {
                let lot = self.lot_size?;
                let bad = nonconforming_in_lot(p, lot);
                let (left, bad_left) = (lot.checked_sub(drawn)?, bad.checked_sub(found)?);
                (bad_left <= left && m <= left).then(|| {
                    hypergeometric::curtailed_stage_mean(
                        left,
                        bad_left,
                        m,
                        accept_left,
                        reject_left,
                    )
                })
            }
        }
    }

    fn count(&self, m: u64, p: f64, drawn: u64, found: u64) -> Count {
        match self.kind {
            ModelKind::Binomial => Count::Binomial(Binomial::new(m, p)),
            ModelKind::Poisson => match m as f64 * p {
                // A mean beyond the largest double: every count is exceeded.
                lambda if lambda.is_infinite() => Count::Endless,
                lambda => Count::Poisson(Poisson::new(lambda)),
            },
            ModelKind::Hypergeometric => {
                let lot = self.lot_size.unwrap_or(u64::MAX);
                let bad = nonconforming_in_lot(p, lot);
                match (lot.checked_sub(drawn), bad.checked_sub(found)) {
                    (Some(left), Some(bad_left)) if bad_left <= left && m <= left => {
                        Count::Hypergeometric(Hypergeometric::new(left, bad_left, m))
                    }
                    // A state the earlier draws cannot produce; it carries
                    // probability zero in every caller.
                    _ => Count::Impossible,
                }
            }
        }
    }
}

enum Count {
    Binomial(Binomial),
    Poisson(Poisson),
    Hypergeometric(Hypergeometric),
    Impossible,
    /// A Poisson count whose mean overflows: above every cut.
    Endless,
}

/// A quality's kind follows the model; it is told here, beside the model,
/// so that the numeric guards need know nothing of models.
impl Quantity {
    /// The kind of a quality (and of an AOQ and AOQL) under `model`: a
    /// rate for the Poisson model, a fraction otherwise.
    pub fn quality(model: ModelKind) -> Self {
        match model {
            ModelKind::Poisson => Quantity::Rate,
            ModelKind::Binomial | ModelKind::Hypergeometric => Quantity::Fraction,
        }
    }
}
