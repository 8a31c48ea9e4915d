//! Minimum-inspection plans as plan sources (`scheme: rectifying`): the
//! request a source describes, the recording of a design, and the checks
//! of the figures a recorded plan carries.
//!
//! ```yaml
//! scheme: rectifying
//! rectifying:
//!   form: single              # or double
//!   process_average: 0.0025
//!   ltpd: 0.01                # with beta; or aoql: 0.01 alone
//!   beta: 0.1
//! model: hypergeometric
//! lot_size: 5000
//! plan:                       # written by the tool
//!   stages: [...]
//!   consumer_risk: 0.0975     # Pa at the LTPD (LTPD protection only)
//!   ati: 927.3                # at the process average
//!   aoql: 0.00196
//!   solved_by: lotsman 0.1.0
//! ```
//!
//! A minimum-inspection plan has no producer's point: the producer is
//! represented by the process average, at which the plan inspects the
//! fewest units on average; the consumer by the protection. So `producer`
//! and `consumer` are absent, and so is the recorded producer's risk.

use super::record::tool_version;
use super::schema::{PlanSource, RecordedPlan, RectifyingSource};
use crate::design::{Protection, RectifyingDesign, RectifyingRequest, Scheme};
use crate::input::InputError;
use crate::model::Model;
use crate::model::RiskPoint;

/// The consumer's risk at the LTPD when a source gives none, as `rectify`
/// takes it without `--beta`.
pub const DEFAULT_LTPD_BETA: f64 = 0.10;

impl PlanSource {
    /// Whether the source describes a minimum-inspection plan.
    pub fn is_rectifying(&self) -> bool {
        self.scheme == Scheme::Rectifying
    }

    /// The validated minimum-inspection request of a `scheme: rectifying`
    /// source: its `rectifying` section, model and lot size.
    ///
    /// ```
    /// use lotsman::{PlanSource, template};
    /// let text = template("rectifying").unwrap();
    /// let source = PlanSource::from_yaml(text, std::path::Path::new("r.yaml")).unwrap();
    /// let request = source.rectifying_request().unwrap();
    /// assert_eq!(request.lot_size(), 5000);
    /// ```
    ///
    /// # Errors
    /// [`InputError`] for a source of another scheme, a missing
    /// `rectifying` section or lot size, no protection or two, a setting
    /// that belongs to plans designed from two risk points (`producer`,
    /// `consumer`, `criterion`, ...), or values [`RectifyingRequest::new`]
    /// refuses.
    pub fn rectifying_request(&self) -> Result<RectifyingRequest, InputError> {
        if !self.is_rectifying() {
            return Err(InputError::Inconsistent(format!(
                "the source '{}' is a {} plan designed from two risk points, not a minimum-inspection plan (scheme: rectifying)",
                self.title, self.scheme
            )));
        }
        self.check_document()?;
        let Some(r) = self.rectifying else {
            return Err(InputError::Inconsistent(
                "scheme: rectifying needs a 'rectifying' section: form, process_average, and ltpd (with beta) or aoql (see: lotsman new rectifying)".to_string(),
            ));
        };
        for (field, given) in [
            ("producer", self.producer.is_some()),
            ("consumer", self.consumer.is_some()),
            ("criterion", self.criterion.is_some()),
            ("second_ratio", self.second_ratio.is_some()),
            ("stage_count", self.stage_count.is_some()),
            ("variables", self.variables.is_some()),
            ("standard", self.standard.is_some()),
        ] {
            if given {
                return Err(InputError::Inconsistent(format!(
                    "'{field}' does not belong to a minimum-inspection plan (scheme: rectifying), whose protection is rectifying: ltpd or aoql; remove it"
                )));
            }
        }
        if !matches!(r.form, Scheme::Single | Scheme::Double) {
            return Err(InputError::out_of_range(
                "rectifying.form",
                r.form,
                "single or double",
            ));
        }
        if self.lot_size.is_none() {
            return Err(InputError::Inconsistent(
                "a minimum-inspection plan needs lot_size: the units in a lot, which a rejected lot has screened".to_string(),
            ));
        }
        let protection = match (r.ltpd, r.aoql, r.beta) {
            (Some(quality), None, beta) => Protection::Ltpd(RiskPoint {
                quality,
                risk: beta.unwrap_or(DEFAULT_LTPD_BETA),
            }),
            (None, Some(limit), None) => Protection::Aoql(limit),
            (None, Some(_), Some(_)) => {
                return Err(InputError::Inconsistent(
                    "rectifying.beta goes with an LTPD, and this source protects by an AOQL; remove beta".to_string(),
                ));
            }
            (Some(_), Some(_), _) => {
                return Err(InputError::Inconsistent(
                    "give one protection in 'rectifying': ltpd (with beta) or aoql, not both"
                        .to_string(),
                ));
            }
            (None, None, _) => {
                return Err(InputError::Inconsistent(
                    "give the protection in 'rectifying': ltpd: P (with beta: B) or aoql: L"
                        .to_string(),
                ));
            }
        };
        let model = Model::new(self.model, self.lot_size)?;
        RectifyingRequest::new(model, r.process_average, protection, r.form)
    }

    /// Refuses a `rectifying` section on a source of another scheme.
    pub(super) fn refuse_rectifying_section(&self) -> Result<(), InputError> {
        if self.rectifying.is_some() {
            return Err(InputError::Inconsistent(format!(
                "'rectifying' applies to minimum-inspection plans (scheme: rectifying) only, and this source's scheme is {}",
                self.scheme
            )));
        }
        Ok(())
    }

    /// Checks that `recorded` carries the figures of this source's kind of
    /// plan, and no others: the producer's and consumer's risks for a plan
    /// designed from two risk points; for a minimum-inspection plan the ATI,
    /// the AOQL and, with an LTPD, `Pa` there as the consumer's risk.
    pub(super) fn check_recorded_figures(&self, recorded: &RecordedPlan) -> Result<(), InputError> {
        let missing = |key: &str| {
            InputError::Inconsistent(format!(
                "the recorded plan gives no {key}; lotsman writes it when it solves the source (lotsman design SOURCE --in-place)"
            ))
        };
        let misplaced = |key: &str, kind: &str| {
            InputError::Inconsistent(format!(
                "plan.{key} belongs to {kind}, and this source's scheme is {}; remove it",
                self.scheme
            ))
        };
        if recorded.code_letter.is_some() || !recorded.classes.is_empty() {
            return Err(misplaced(
                if recorded.classes.is_empty() {
                    "code_letter"
                } else {
                    "classes"
                },
                "standard-indexed plans",
            ));
        }
        if !self.is_rectifying() {
            recorded
                .producer_risk
                .ok_or_else(|| missing("producer_risk"))?;
            recorded
                .consumer_risk
                .ok_or_else(|| missing("consumer_risk"))?;
            for (key, given) in [("ati", recorded.ati), ("aoql", recorded.aoql)] {
                if given.is_some() {
                    return Err(misplaced(key, "minimum-inspection plans"));
                }
            }
            return Ok(());
        }
        if recorded.producer_risk.is_some() {
            return Err(misplaced(
                "producer_risk",
                "plans designed from two risk points",
            ));
        }
        recorded.ati.ok_or_else(|| missing("ati"))?;
        recorded.aoql.ok_or_else(|| missing("aoql"))?;
        let ltpd = self.rectifying.is_some_and(|r| r.ltpd.is_some());
        match (ltpd, recorded.consumer_risk) {
            (true, None) => Err(missing("consumer_risk (Pa at the LTPD)")),
            (false, Some(_)) => Err(misplaced("consumer_risk", "plans protected by an LTPD")),
            _ => Ok(()),
        }
    }

    /// A new minimum-inspection source for `request`, with the given title
    /// and nothing else filled in.
    pub fn new_rectifying(title: &str, request: &RectifyingRequest) -> Self {
        let (ltpd, beta, aoql) = match request.protection() {
            Protection::Ltpd(point) => (Some(point.quality), Some(point.risk), None),
            Protection::Aoql(limit) => (None, None, Some(limit)),
        };
        let mut source = PlanSource::bare(
            title,
            Scheme::Rectifying,
            request.model().kind(),
            Some(request.lot_size()),
        );
        source.rectifying = Some(RectifyingSource {
            form: request.scheme(),
            process_average: request.process_average(),
            ltpd,
            beta,
            aoql,
        });
        source
    }

    /// Records `design`'s plan with its figures, solved by this tool
    /// version.
    ///
    /// # Errors
    /// [`InputError::Inconsistent`] when the design's answer is to inspect
    /// every unit: there is no sampling plan to record.
    pub fn record_rectifying(&mut self, design: &RectifyingDesign) -> Result<(), InputError> {
        let Some(chosen) = &design.plan else {
            return Err(InputError::Inconsistent(format!(
                "the minimum-inspection answer is to inspect every unit of the lot of {}, so there is no sampling plan to record in a plan source",
                design.request.lot_size()
            )));
        };
        self.plan = Some(RecordedPlan {
            stages: chosen.plan.stages().to_vec(),
            sequential: None,
            variables: None,
            code_letter: None,
            classes: Vec::new(),
            producer_risk: None,
            consumer_risk: chosen.pa_at_ltpd,
            ati: Some(chosen.ati),
            aoql: Some(chosen.aoql.value),
            solved_by: tool_version(),
        });
        Ok(())
    }
}
