//! Plan sources: the versioned YAML from which a plan is re-solved and
//! re-printed. Loading, validation into a design request, recording a
//! solution, saving, and verification.

mod schema;
mod verify;

use std::path::Path;

pub use schema::{PlanSource, PointSource, RecordedPlan, SCHEMA_VERSION};
pub use verify::{Difference, Verdict, verify};

use crate::design::{DesignRequest, Scheme, SchemeOptions, Solution};
use crate::error::{InputError, SourceError};
use crate::model::Model;
use crate::plan::StagedPlan;
use crate::risk::{RiskPair, RiskPoint};

/// The largest plan source read: 1 MiB, refused by size before parsing.
pub const MAX_SOURCE_BYTES: u64 = 1 << 20;

/// The first line of every source the tool writes.
const HEADER: &str = "# lotsman plan source. Edit the inputs, then re-solve with: lotsman design THIS-FILE --output THIS-FILE.new\n";

/// The tool and version recorded as `solved_by`.
pub fn tool_version() -> String {
    format!("lotsman {}", env!("CARGO_PKG_VERSION"))
}

impl PlanSource {
    /// Parses a source from YAML text.
    ///
    /// # Errors
    /// [`SourceError::Parse`] with serde_yaml's message (field, line and
    /// column) for malformed YAML, unknown or duplicated fields and wrong
    /// types; [`SourceError::Invalid`] for a schema version other than
    /// [`SCHEMA_VERSION`] or invalid values (see [`PlanSource::request`]).
    pub fn from_yaml(text: &str, path: &Path) -> Result<Self, SourceError> {
        let parse = |message: String| SourceError::Parse {
            path: path.to_path_buf(),
            message,
        };
        if text.trim().is_empty() {
            return Err(parse(
                "the file is empty; start from a template: lotsman new binomial".into(),
            ));
        }
        let source: PlanSource = serde_yaml::from_str(text).map_err(|e| parse(e.to_string()))?;
        if source.schema != SCHEMA_VERSION {
            return Err(SourceError::Invalid {
                path: path.to_path_buf(),
                source: InputError::out_of_range(
                    "schema",
                    source.schema,
                    &format!(
                        "{SCHEMA_VERSION} (the version this tool reads; a newer file needs a newer lotsman)"
                    ),
                ),
            });
        }
        source.request().map_err(|e| SourceError::Invalid {
            path: path.to_path_buf(),
            source: e,
        })?;
        Ok(source)
    }

    /// Reads and parses a source file, refusing files above
    /// [`MAX_SOURCE_BYTES`] before reading them.
    ///
    /// # Errors
    /// [`SourceError::Io`] when the file cannot be read or is too large;
    /// otherwise as [`PlanSource::from_yaml`].
    pub fn load(path: &Path) -> Result<Self, SourceError> {
        let io = |source| SourceError::Io {
            path: path.to_path_buf(),
            source,
        };
        let size = std::fs::metadata(path).map_err(io)?.len();
        if size > MAX_SOURCE_BYTES {
            return Err(io(std::io::Error::other(format!(
                "the file has {size} bytes; a plan source may have at most {MAX_SOURCE_BYTES}"
            ))));
        }
        let text = std::fs::read_to_string(path).map_err(io)?;
        Self::from_yaml(&text, path)
    }

    /// Loads a source that must record a plan, with its request and its
    /// validated plan: what `evaluate FILE` and `judge FILE` start from.
    ///
    /// # Errors
    /// As [`PlanSource::load`]; [`SourceError::Invalid`] when the source
    /// records no plan or an invalid one.
    pub fn load_with_plan(path: &Path) -> Result<(Self, DesignRequest, StagedPlan), SourceError> {
        let source = Self::load(path)?;
        let invalid = |e| SourceError::Invalid {
            path: path.to_path_buf(),
            source: e,
        };
        let request = source.request().map_err(invalid)?;
        let plan = source.recorded_plan(&request.model).map_err(invalid)?;
        Ok((source, request, plan))
    }

    /// The validated design request the source describes.
    ///
    /// # Errors
    /// [`InputError`] for an invalid model, lot size, risk point or date.
    pub fn request(&self) -> Result<DesignRequest, InputError> {
        if let Some(date) = &self.date {
            check_date(date)?;
        }
        if self.title.trim().is_empty() {
            return Err(InputError::out_of_range("title", "''", "a non-empty text"));
        }
        let model = Model::new(self.model, self.lot_size)?;
        let risks = RiskPair::new(
            RiskPoint {
                quality: self.producer.quality,
                risk: self.producer.risk,
            },
            RiskPoint {
                quality: self.consumer.quality,
                risk: self.consumer.risk,
            },
            &model,
        )?;
        let options = self.scheme_options()?;
        Ok(DesignRequest {
            scheme: self.scheme,
            options,
            model,
            risks,
        })
    }

    /// The scheme settings the source gives, checked against its scheme.
    ///
    /// # Errors
    /// [`InputError`] for a setting that does not belong to the scheme or
    /// is out of range (see [`SchemeOptions::check`]).
    pub fn scheme_options(&self) -> Result<SchemeOptions, InputError> {
        let misplaced = |field: &str, schemes: &str| {
            InputError::Inconsistent(format!(
                "'{field}' applies to {schemes} plans only, and this source's scheme is {}",
                self.scheme
            ))
        };
        if self.criterion.is_some() && !matches!(self.scheme, Scheme::Double | Scheme::Multiple) {
            return Err(misplaced("criterion", "double and multiple"));
        }
        if self.stage_count.is_some() && self.scheme != Scheme::Multiple {
            return Err(misplaced("stage_count", "multiple"));
        }
        let defaults = SchemeOptions::default();
        let options = SchemeOptions {
            criterion: self.criterion.unwrap_or(defaults.criterion),
            second_ratio: self.second_ratio,
            stages: self.stage_count.unwrap_or(defaults.stages),
        };
        options.check(self.scheme)?;
        Ok(options)
    }

    /// The recorded plan, validated for `model`.
    ///
    /// # Errors
    /// [`InputError::Inconsistent`] when the source records no plan, or
    /// [`InputError`] when the recorded stages are not a valid plan.
    pub fn recorded_plan(&self, model: &Model) -> Result<StagedPlan, InputError> {
        let recorded = self.plan.as_ref().ok_or_else(|| {
            InputError::Inconsistent(format!(
                "the source '{}' records no plan yet; solve it first with: lotsman design FILE --output FILE",
                self.title
            ))
        })?;
        match (&recorded.sequential, recorded.stages.is_empty()) {
            (Some(lines), true) => StagedPlan::sequential(*lines, model),
            (None, false) => StagedPlan::new(recorded.stages.clone(), model),
            (Some(_), false) => Err(InputError::Inconsistent(
                "the recorded plan gives both stages and sequential lines; a sequential plan records only its lines".to_string(),
            )),
            (None, true) => Err(InputError::Inconsistent(
                "the recorded plan has no stages".to_string(),
            )),
        }
    }

    /// A new source for `request`, with the given title and nothing else
    /// filled in.
    pub fn new(title: &str, request: &DesignRequest) -> Self {
        let (producer, consumer) = (request.risks.producer(), request.risks.consumer());
        PlanSource {
            schema: SCHEMA_VERSION,
            title: title.to_string(),
            id: None,
            revision: None,
            date: None,
            item: None,
            characteristic: None,
            prepared_by: None,
            approved_by: None,
            notes: None,
            scheme: request.scheme,
            criterion: matches!(request.scheme, Scheme::Double | Scheme::Multiple)
                .then_some(request.options.criterion),
            second_ratio: request.options.second_ratio,
            stage_count: (request.scheme == Scheme::Multiple).then_some(request.options.stages),
            model: request.model.kind(),
            lot_size: request.model.lot_size(),
            producer: PointSource {
                quality: producer.quality,
                risk: producer.risk,
            },
            consumer: PointSource {
                quality: consumer.quality,
                risk: consumer.risk,
            },
            plan: None,
        }
    }

    /// Records `solution` as the source's plan, solved by this tool version.
    pub fn record(&mut self, solution: &Solution) {
        let plan = &solution.design.plan;
        self.plan = Some(RecordedPlan {
            stages: match plan.sequential_lines() {
                Some(_) => Vec::new(),
                None => plan.stages().to_vec(),
            },
            sequential: plan.sequential_lines().copied(),
            producer_risk: solution.design.producer_risk,
            consumer_risk: solution.design.consumer_risk,
            solved_by: tool_version(),
        });
    }

    /// The source as YAML, with the tool's header line.
    pub fn to_yaml(&self) -> String {
        // Serialising plain structs of numbers and strings cannot fail.
        let body = serde_yaml::to_string(self).unwrap_or_default();
        format!("{HEADER}{body}")
    }
}

/// Checks a `YYYY-MM-DD` date of the Gregorian calendar.
fn check_date(date: &str) -> Result<(), InputError> {
    let bad = || InputError::unparsable("date", date, "a date YYYY-MM-DD, e.g. 2026-11-30");
    let parts: Vec<&str> = date.split('-').collect();
    let [y, m, d] = parts.as_slice() else {
        return Err(bad());
    };
    if y.len() != 4 || m.len() != 2 || d.len() != 2 {
        return Err(bad());
    }
    let (y, m, d): (u32, u32, u32) = (
        y.parse().map_err(|_| bad())?,
        m.parse().map_err(|_| bad())?,
        d.parse().map_err(|_| bad())?,
    );
    let leap = (y % 4 == 0 && y % 100 != 0) || y % 400 == 0;
    let days = match m {
        1 | 3 | 5 | 7 | 8 | 10 | 12 => 31,
        4 | 6 | 9 | 11 => 30,
        2 if leap => 29,
        2 => 28,
        _ => return Err(bad()),
    };
    if d == 0 || d > days {
        return Err(bad());
    }
    Ok(())
}
