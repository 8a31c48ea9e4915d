//! What a minimum-inspection design is asked for: the protection and the
//! validated request.

use serde::Serialize;

use crate::design::Scheme;
use crate::input::InputError;
use crate::model::{MAX_LOT_SIZE, Model, ModelKind, nonconforming_in_lot};
use crate::model::{RiskPair, RiskPoint, check_quality, check_risk};
use crate::plan::{StagedPlan, default_qualities, quality_at_pa};

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
