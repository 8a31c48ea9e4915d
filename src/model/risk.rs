//! The two risk points that a sampling plan must honour.

use serde::{Deserialize, Serialize};

use crate::input::InputError;
use crate::model::Model;

/// One point of the OC curve that the plan is held to: at `quality`, the
/// probability of the unwanted decision may be at most `risk`.
///
/// For the producer's point the unwanted decision is rejection (the risk is
/// alpha, and the lot at the acceptable quality level must be accepted with
/// probability at least `1 - alpha`); for the consumer's point it is
/// acceptance (the risk is beta at the rejectable quality level).
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct RiskPoint {
    /// Fraction nonconforming (or nonconformities per unit for Poisson).
    pub quality: f64,
    /// The largest allowed probability of the unwanted decision.
    pub risk: f64,
}

/// The producer's point (AQL, alpha) and the consumer's point (RQL, beta),
/// validated together for one model.
///
/// Valid means: both qualities are qualities of the model
/// ([`Model::accepts_quality`]), `p1 < p2`, both risks lie in `(0, 1)`, and
/// `alpha + beta < 1` (otherwise a plan that accepts everything with
/// probability 1 - alpha, or a coin toss, already meets both and the design
/// says nothing).
///
/// # Example
/// ```
/// use lotsman::{Model, ModelKind, RiskPair, RiskPoint};
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// let pair = RiskPair::new(
///     RiskPoint { quality: 0.01, risk: 0.05 },
///     RiskPoint { quality: 0.06, risk: 0.10 },
///     &model,
/// ).unwrap();
/// assert_eq!(pair.producer().quality, 0.01);
/// assert!(RiskPair::new(pair.consumer(), pair.producer(), &model).is_err());
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct RiskPair {
    producer: RiskPoint,
    consumer: RiskPoint,
}

impl RiskPair {
    /// Validates the pair for `model`.
    ///
    /// # Errors
    /// [`InputError::OutOfRange`] naming the quality or risk that is out of
    /// range; [`InputError::Inconsistent`] when `p1 >= p2` or
    /// `alpha + beta >= 1`. (A finite lot too small to tell the two
    /// qualities apart is valid input; the designer explains why it has no
    /// plan.)
    pub fn new(
        producer: RiskPoint,
        consumer: RiskPoint,
        model: &Model,
    ) -> Result<Self, InputError> {
        check_quality(model, "producer's quality (AQL)", producer.quality)?;
        check_quality(model, "consumer's quality (RQL)", consumer.quality)?;
        check_risks(producer.risk, consumer.risk)?;
        if producer.quality >= consumer.quality {
            return Err(InputError::Inconsistent(format!(
                "the producer's quality (AQL) {} must be below the consumer's quality (RQL) {}",
                producer.quality, consumer.quality
            )));
        }
        Ok(RiskPair { producer, consumer })
    }

    /// The producer's point: quality p1 (AQL) and risk alpha.
    pub fn producer(&self) -> RiskPoint {
        self.producer
    }

    /// The consumer's point: quality p2 (RQL, LTPD) and risk beta.
    pub fn consumer(&self) -> RiskPoint {
        self.consumer
    }
}

/// Checks that `q` is a quality of `model` (see [`Model::accepts_quality`]),
/// in the words every command refuses one with.
///
/// # Errors
/// [`InputError::OutOfRange`] naming the quality as `name`.
///
/// # Example
/// ```
/// use lotsman::{Model, ModelKind, check_quality};
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// assert!(check_quality(&model, "process average", 0.01).is_ok());
/// assert!(check_quality(&model, "process average", 1.5).is_err());
/// ```
pub fn check_quality(model: &Model, name: &str, q: f64) -> Result<(), InputError> {
    if model.accepts_quality(q) {
        return Ok(());
    }
    Err(InputError::out_of_range(
        name,
        crate::numeric::Short(q),
        model.quality_range(),
    ))
}

/// Checks a pair of risks on their own: each in `(0, 1)` and
/// `alpha + beta < 1` (see [`RiskPair`]).
///
/// # Errors
/// [`InputError::OutOfRange`] naming the risk; [`InputError::Inconsistent`]
/// when `alpha + beta >= 1`.
pub(crate) fn check_risks(alpha: f64, beta: f64) -> Result<(), InputError> {
    check_risk("alpha (producer's risk)", alpha)?;
    check_risk("beta (consumer's risk)", beta)?;
    if alpha + beta >= 1.0 {
        return Err(InputError::Inconsistent(format!(
            "alpha + beta = {alpha} + {beta} must be below 1, or any plan (even accepting every lot with probability 1 - alpha) meets both points"
        )));
    }
    Ok(())
}

/// Checks that the risk `r` lies in `(0, 1)`.
///
/// # Errors
/// [`InputError::OutOfRange`] naming the risk as `name`.
pub(crate) fn check_risk(name: &str, r: f64) -> Result<(), InputError> {
    if r > 0.0 && r < 1.0 {
        return Ok(());
    }
    Err(InputError::out_of_range(
        name,
        r,
        "between 0 and 1 (exclusive), e.g. 0.05 or 5%",
    ))
}
