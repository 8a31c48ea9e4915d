//! Loading a plan source: reading it within its size limit, parsing and
//! checking it, and turning it into a validated design request and the
//! plan it records.

use std::path::Path;

use super::error::{SourceError, not_solved};
use super::limits::MAX_SOURCE_BYTES;
use super::schema::{PlanSource, PointSource, SCHEMA_VERSION};
use super::yaml_words;
use crate::design::{DesignRequest, Scheme, SchemeOptions, VariablesRequest};
use crate::input::InputError;
use crate::model::Model;
use crate::model::{RiskPair, RiskPoint};
use crate::plan::{Specification, StagedPlan, VariablesPlan};

/// The deepest nesting of brackets (`[` and `{`) a source may have; a plan
/// source needs two at most. The YAML parser's work grows with the depth
/// times the length of the text, so a megabyte of nothing but brackets
/// would hold it for minutes; counting every bracket, quoted or in a
/// comment, costs one pass and refuses such a file at once.
pub const MAX_BRACKET_DEPTH: usize = 64;

impl PlanSource {
    /// Parses a source from YAML text. A leading byte-order mark, which
    /// some Windows editors write, is skipped.
    ///
    /// # Errors
    /// [`SourceError::Parse`], in plain words with the line (for a
    /// duplicated key, the line where it is given again), for malformed
    /// YAML, unknown, missing or duplicated keys and wrong types, and for
    /// brackets nested deeper than [`MAX_BRACKET_DEPTH`];
    /// [`SourceError::Invalid`] for a schema version other than
    /// [`SCHEMA_VERSION`] or invalid values (see [`PlanSource::request`]).
    pub fn from_yaml(text: &str, path: &Path) -> Result<Self, SourceError> {
        let parse = |message: String| SourceError::Parse {
            path: path.to_path_buf(),
            message,
        };
        let text = text.strip_prefix('\u{feff}').unwrap_or(text);
        let blank = |line: &str| line.trim().is_empty() || line.trim_start().starts_with('#');
        if text.lines().all(blank) {
            return Err(parse(
                "the file is empty (nothing but blank lines and comments); start from a template: lotsman new binomial".into(),
            ));
        }
        check_brackets(text).map_err(parse)?;
        let source: PlanSource = serde_yaml::from_str(text)
            .map_err(|e| parse(yaml_words::plain_yaml_error(&e, text, path)))?;
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
        let checked = if source.is_variables() {
            source.variables_request().map(drop)
        } else if source.is_rectifying() {
            source.rectifying_request().map(drop)
        } else if source.is_standard() {
            source.standard_request().map(drop)
        } else {
            source.request().map(drop)
        };
        checked.map_err(|e| SourceError::Invalid {
            path: path.to_path_buf(),
            source: e,
        })?;
        Ok(source)
    }

    /// Reads and parses a source file, refusing files above
    /// [`MAX_SOURCE_BYTES`] before reading them.
    ///
    /// # Errors
    /// As [`PlanSource::read_text`]; otherwise as [`PlanSource::from_yaml`].
    pub fn load(path: &Path) -> Result<Self, SourceError> {
        Self::from_yaml(&Self::read_text(path)?, path)
    }

    /// The text of the source file at `path`, read within
    /// [`MAX_SOURCE_BYTES`] ([`read_limited`](crate::read_limited)).
    ///
    /// # Errors
    /// [`SourceError::Io`] when the file cannot be read, is too large or is
    /// not UTF-8 text.
    pub fn read_text(path: &Path) -> Result<String, SourceError> {
        let io = |source| SourceError::Io {
            path: path.to_path_buf(),
            source,
        };
        let bytes = crate::fs::read_limited(path, MAX_SOURCE_BYTES, "a plan source").map_err(io)?;
        String::from_utf8(bytes).map_err(|e| {
            io(std::io::Error::new(
                std::io::ErrorKind::InvalidData,
                format!(
                    "the file is not UTF-8 text (byte {} is not); save it as UTF-8",
                    e.utf8_error().valid_up_to() + 1
                ),
            ))
        })
    }

    /// Whether the source describes a variables plan.
    pub fn is_variables(&self) -> bool {
        self.scheme == Scheme::Variables
    }

    /// The validated model of a source whose plan is staged: an attributes
    /// plan designed from two risk points, or a minimum-inspection plan.
    ///
    /// # Errors
    /// As [`PlanSource::request`] and [`PlanSource::rectifying_request`].
    pub fn staged_model(&self) -> Result<Model, InputError> {
        if self.is_rectifying() {
            Ok(*self.rectifying_request()?.model())
        } else {
            Ok(self.request()?.model)
        }
    }

    /// The validated design request of an attributes source.
    ///
    /// # Errors
    /// [`InputError`] for an invalid model, lot size, risk point or date,
    /// or a variables source (see [`PlanSource::variables_request`]).
    pub fn request(&self) -> Result<DesignRequest, InputError> {
        if self.is_variables() {
            return Err(InputError::Inconsistent(format!(
                "the source '{}' is a variables plan, decided from measurements (judge --measurements FILE.csv), not from counts",
                self.title
            )));
        }
        if self.is_rectifying() {
            return Err(InputError::Inconsistent(format!(
                "the source '{}' is a minimum-inspection plan (scheme: rectifying), designed from a process average and a protection, not from two risk points",
                self.title
            )));
        }
        if self.is_standard() {
            return Err(InputError::Inconsistent(format!(
                "the source '{}' is a standard-indexed plan (scheme: standard), read from the standard's tables by its AQL, not designed from two risk points",
                self.title
            )));
        }
        if self.variables.is_some() {
            return Err(InputError::Inconsistent(format!(
                "'variables' applies to variables plans only, and this source's scheme is {}",
                self.scheme
            )));
        }
        self.refuse_rectifying_section()?;
        self.refuse_standard_section()?;
        let (model, risks) = self.model_and_risks()?;
        let options = self.scheme_options()?;
        Ok(DesignRequest {
            scheme: self.scheme,
            options,
            model,
            risks,
        })
    }

    /// The validated request of a variables source.
    ///
    /// # Errors
    /// [`InputError`] for an invalid specification, model, risk point or
    /// date, attribute settings on a variables plan, or an attributes
    /// source.
    pub fn variables_request(&self) -> Result<VariablesRequest, InputError> {
        if !self.is_variables() {
            return Err(InputError::Inconsistent(format!(
                "the source '{}' is a {} attributes plan, decided from counts (judge --found K), not from measurements",
                self.title, self.scheme
            )));
        }
        let Some(v) = self.variables.as_ref() else {
            return Err(InputError::Inconsistent(format!(
                "the source '{}' needs scheme: variables and a 'variables' section (sigma, limit, lower/upper)",
                self.title
            )));
        };
        for (field, given) in [
            ("criterion", self.criterion.is_some()),
            ("second_ratio", self.second_ratio.is_some()),
            ("stage_count", self.stage_count.is_some()),
        ] {
            if given {
                return Err(InputError::Inconsistent(format!(
                    "'{field}' is an attributes setting; a variables plan does not take it"
                )));
            }
        }
        self.refuse_rectifying_section()?;
        self.refuse_standard_section()?;
        let spec = Specification::new(v.sigma, v.sigma_value, v.limit, v.lower, v.upper)?;
        let (model, risks) = self.model_and_risks()?;
        VariablesRequest::new(spec, risks, model)
    }

    /// The checked date and title every source has.
    pub(super) fn check_document(&self) -> Result<(), InputError> {
        if let Some(date) = &self.date {
            check_date("date", date)?;
        }
        if self.title.trim().is_empty() {
            return Err(InputError::out_of_range("title", "''", "a non-empty text"));
        }
        Ok(())
    }

    /// The checked date, title, model and risk points of a source designed
    /// from two risk points.
    fn model_and_risks(&self) -> Result<(Model, RiskPair), InputError> {
        self.check_document()?;
        let model = Model::new(self.model, self.lot_size)?;
        let point = |given: Option<PointSource>, key: &str, what: &str| {
            given.ok_or_else(|| {
                InputError::Inconsistent(format!(
                    "the source has no {key}: line; add {key}: with {what} indented below it; a {} plan is designed from both risk points (a complete source: lotsman new binomial)",
                    self.scheme
                ))
            })
        };
        let producer = point(
            self.producer,
            "producer",
            "quality: (the AQL) and risk: (alpha)",
        )?;
        let consumer = point(
            self.consumer,
            "consumer",
            "quality: (the RQL) and risk: (beta)",
        )?;
        let risks = RiskPair::new(
            RiskPoint {
                quality: producer.quality,
                risk: producer.risk,
            },
            RiskPoint {
                quality: consumer.quality,
                risk: consumer.risk,
            },
            &model,
        )?;
        Ok((model, risks))
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
        let recorded = self.plan.as_ref().ok_or_else(not_solved)?;
        if recorded.variables.is_some() {
            return Err(InputError::NotSolved {
                why: format!(
                    "the recorded plan is a variables plan (n and k or m), and this {} plan records stages",
                    self.scheme
                ),
            });
        }
        self.check_recorded_figures(recorded)?;
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

    /// The recorded variables plan, validated for the request's
    /// specification and lot.
    ///
    /// # Errors
    /// [`InputError`] when the source records no variables plan, gives `k`
    /// where `m` belongs (or the reverse), an invalid `n` or constant, or
    /// an `n` larger than the lot ([`Model::check_sample`]).
    pub fn recorded_variables_plan(
        &self,
        request: &VariablesRequest,
    ) -> Result<VariablesPlan, InputError> {
        let spec = request.spec();
        let plan = self.plan.as_ref().ok_or_else(not_solved)?;
        let recorded = plan
            .variables
            .filter(|_| plan.stages.is_empty() && plan.sequential.is_none())
            .ok_or_else(|| InputError::NotSolved {
                why: "the recorded plan is not a variables plan (plan: variables: with n, and k or m)"
                    .to_string(),
            })?;
        self.check_recorded_figures(plan)?;
        let two = spec.limit() == crate::plan::LimitKind::Both;
        let constant = match (recorded.k, recorded.m, two) {
            (Some(k), None, false) => k,
            (None, Some(m), true) => m,
            _ => {
                return Err(InputError::Inconsistent(format!(
                    "a plan for {} limit{} records {}",
                    spec.limit().name(),
                    if two { "s" } else { "" },
                    if two {
                        "m (the maximum allowable fraction), not k"
                    } else {
                        "k (the acceptance constant), not m"
                    }
                )));
            }
        };
        request
            .model()
            .check_sample("the recorded plan's sample size n", recorded.n)?;
        VariablesPlan::new(*spec, recorded.n, constant)
    }
}

/// Checks that brackets nest at most [`MAX_BRACKET_DEPTH`] deep, counting
/// every `[`, `{`, `]` and `}` of the text.
fn check_brackets(text: &str) -> Result<(), String> {
    let mut depth = 0usize;
    for (i, line) in text.lines().enumerate() {
        for ch in line.chars() {
            match ch {
                '[' | '{' => depth += 1,
                ']' | '}' => depth = depth.saturating_sub(1),
                _ => continue,
            }
            if depth > MAX_BRACKET_DEPTH {
                return Err(format!(
                    "brackets [ and {{ nest more than {MAX_BRACKET_DEPTH} deep at line {}; a plan source needs at most 2 (see: lotsman new binomial)",
                    i + 1
                ));
            }
        }
    }
    Ok(())
}

/// Checks a `YYYY-MM-DD` date of the Gregorian calendar, given as
/// `parameter` (named in the message).
pub(crate) fn check_date(parameter: &str, date: &str) -> Result<(), InputError> {
    let bad = || InputError::unparsable(parameter, date, "a date YYYY-MM-DD, e.g. 2026-11-30");
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
