//! What the blocks of a sheet print from, gathered once from the source:
//! the facts every sheet shares ([`Common`]), and those of an attributes
//! sheet ([`Facts`]) and of a variables sheet ([`VariablesFacts`]).

use super::agreement::Agreement;
use super::chart::subject::Subject;
use super::metadata::source_hash;
use super::wording::sheet::{NOT_GIVEN, quality};
use super::wording::variables::scheme;
use crate::design::{SingleDesign, design_single};
use crate::input::InputError;
use crate::model::{Model, ModelKind};
use crate::plan::{StagedPlan, VariablesPlan};
use crate::report::words;
use crate::source::Error;
use crate::source::{PlanSource, RecordedPlan, variables_risks};

/// The most readings the variables sheet's table holds.
///
/// At most 48: four columns of twelve rows at the least row pitch (4.8
/// mm, tight but still a line to write a reading on) are what Letter
/// leaves above an OC chart of its least height, beside the right column
/// of a two-limit plan, whose rule takes the most room (checked for every
/// kind of plan on both papers by tests/sheet.rs). A4 would hold more,
/// but a sheet says the same on either paper. A larger sample is written
/// on a separate readings log; the sheet says so and keeps the result
/// lines.
pub const MAX_SHEET_READINGS: u64 = 48;

/// What the blocks every sheet shares (title block, risk table,
/// signatures, footer) print from, whatever the plan.
pub struct Common<'a> {
    /// The source.
    pub source: &'a PlanSource,
    /// Its recorded plan's record.
    pub recorded: &'a RecordedPlan,
    /// What the plan was agreed on, with what the printed plan achieves.
    pub agreement: Agreement,
    /// The statement of a discrepancy the audit found, on a sheet printed
    /// as recorded at the user's request.
    pub notice: Option<String>,
    /// The lot size, if the model has one.
    pub lot_size: Option<u64>,
    /// The title block's scheme field.
    pub scheme: String,
    /// Whether qualities are nonconformities per unit.
    pub per_unit: bool,
    /// The source text's hex SHA-256.
    pub hash: String,
    /// The source's file name, as the sheet prints it.
    pub file_name: &'a str,
}

impl<'a> Common<'a> {
    /// The shared facts of `source`, whose plan the caller has validated
    /// (so that a missing plan is reported in the plan's own words).
    ///
    /// # Errors
    /// [`InputError::Inconsistent`] when the source records no plan.
    pub fn new(
        source: &'a PlanSource,
        text: &str,
        file_name: &'a str,
        agreement: Agreement,
        model: &Model,
        scheme: String,
    ) -> Result<Self, InputError> {
        let recorded = source
            .plan
            .as_ref()
            .ok_or_else(|| InputError::Inconsistent("no plan".into()))?;
        Ok(Common {
            source,
            recorded,
            agreement,
            notice: None,
            lot_size: model.lot_size(),
            scheme,
            per_unit: model.kind() == ModelKind::Poisson,
            hash: source_hash(text),
            file_name,
        })
    }

    /// A quality as the sheet prints it (see [`quality`]).
    pub fn q(&self, v: f64) -> String {
        quality(v, self.per_unit)
    }
}

/// A field of the source, or a dash.
pub fn given(v: &Option<String>) -> String {
    v.clone().unwrap_or_else(|| NOT_GIVEN.to_string())
}

/// What the blocks of an attributes sheet (a plan designed from two risk
/// points, or a minimum-inspection plan) print from, gathered once.
pub struct Facts<'a> {
    /// What every sheet shares.
    pub common: Common<'a>,
    /// The model.
    pub model: Model,
    /// The recorded plan.
    pub plan: StagedPlan,
}

impl Facts<'_> {
    /// The qualities of the measures table: eight levels bracketing the
    /// two qualities of the agreement.
    pub fn default_qualities(&self) -> Vec<f64> {
        match &self.common.agreement {
            Agreement::Points { risks, .. } => {
                crate::plan::default_qualities(&self.plan, &self.model, Some(risks))
            }
            Agreement::Rectifying { request, .. } => request.default_qualities(&self.plan),
        }
    }

    /// The inspector's procedure: a rejected lot is screened under
    /// rectifying inspection, and returned or screened as agreed otherwise.
    pub fn steps(&self) -> Vec<String> {
        match self.common.agreement {
            Agreement::Points { .. } => words::plan_procedure(&self.plan, self.common.per_unit),
            Agreement::Rectifying { .. } => {
                words::rectifying_procedure(&self.plan, self.common.per_unit)
            }
        }
    }

    /// Whether the plan is a minimum-inspection plan.
    pub fn rectifying(&self) -> bool {
        matches!(self.common.agreement, Agreement::Rectifying { .. })
    }

    /// The plan as its charts see it.
    pub fn subject(&self) -> Subject<'_> {
        Subject {
            plan: &self.plan,
            model: &self.model,
            agreement: &self.common.agreement,
            per_unit: self.common.per_unit,
        }
    }
}

/// What the blocks of a variables sheet print from, gathered once.
pub struct VariablesFacts<'a> {
    /// What every sheet shares.
    pub common: Common<'a>,
    /// The recorded plan.
    pub plan: VariablesPlan,
    /// The model.
    pub model: Model,
    /// The unit of the measurements, if the source gives one.
    pub unit: Option<&'a str>,
    /// The attributes single plan for the same points, if one exists
    /// within the caps.
    pub attributes: Option<SingleDesign>,
    /// Whether the readings go on a separate log because the notice of an
    /// unconfirmed plan leaves their table no room.
    pub displaced: bool,
}

impl<'a> VariablesFacts<'a> {
    /// The facts of a variables `source` (parsed from `text`).
    ///
    /// # Errors
    /// [`Error`] for an invalid specification or a missing or invalid plan.
    pub fn gather(source: &'a PlanSource, text: &str, file_name: &'a str) -> Result<Self, Error> {
        let request = source.variables_request()?;
        let plan = source.recorded_variables_plan(&request)?;
        let scheme = scheme(request.spec().sigma_kind());
        let agreement = Agreement::Points {
            risks: *request.risks(),
            achieved: variables_risks(&plan, request.risks()),
        };
        let common = Common::new(source, text, file_name, agreement, request.model(), scheme)?;
        Ok(VariablesFacts {
            common,
            plan,
            model: *request.model(),
            unit: source.variables.as_ref().and_then(|v| v.unit.as_deref()),
            attributes: design_single(request.model(), request.risks()).ok(),
            displaced: false,
        })
    }

    /// Whether the readings go on a separate log.
    pub fn on_log(&self) -> bool {
        self.plan.n() > MAX_SHEET_READINGS || self.displaced
    }
}
