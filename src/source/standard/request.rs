//! What a standard-indexed plan source asks for, validated
//! ([`StandardSourceRequest`]): from a source's keys
//! ([`PlanSource::standard_request`]), or from the flags of
//! `lotsman standard` into a new source ([`PlanSource::new_standard`]).

use crate::design::Scheme;
use crate::input::InputError;
use crate::model::{MAX_LOT_SIZE, Model, ModelKind, RiskPair, RiskPoint};
use crate::source::PlanSource;
use crate::source::PointSource;
use crate::standard::{Aql, ClassAql, ClassRule, InspectionLevel, Severity, UserTable};

use super::schema::{ClassSource, Edition, StandardSource, TableFileSource};

/// The producer's risk at the AQL that a two-point design compared with a
/// table plan keeps (contracts indexed by the AQL name none; 0.05 is
/// common practice, and the standard's plans give about that at the AQL).
pub const STANDARD_ALPHA: f64 = 0.05;

/// The most classes of defects a source may name.
pub const MAX_CLASSES: usize = 20;

/// The longest class name.
const MAX_NAME: usize = 40;

/// The most user tables a source may name: one per table of the standard
/// (Table I, nine master tables, Table VIII).
const MAX_TABLES: usize = 11;

/// A standard-indexed plan as a source records it, validated by
/// [`StandardSourceRequest::check`] (and by every constructor of a source
/// from it).
#[derive(Clone, Debug, PartialEq)]
pub struct StandardSourceRequest {
    /// The lot size, which gives the code letter (Table I).
    pub lot_size: u64,
    /// The inspection level.
    pub level: InspectionLevel,
    /// The classes of defects with their AQLs, in order; one class without
    /// a name for a single AQL.
    pub classes: Vec<ClassAql>,
    /// The severity of inspection in force.
    pub severity: Severity,
    /// The form of the table plans: single, double or multiple.
    pub form: Scheme,
    /// The model of the counts (a class whose AQL is above 10 is counted
    /// as nonconformities per 100 units, Poisson, whatever this is).
    pub model: ModelKind,
    /// Reduced inspection left out.
    pub no_reduced: bool,
    /// How classes whose arrows lead to different rows are sampled.
    pub class_rule: ClassRule,
    /// The consumer's point (RQL and beta) the table plans are compared
    /// with, if any; the two-point design keeps [`STANDARD_ALPHA`] at the
    /// AQL.
    pub consumer: Option<RiskPoint>,
    /// The user's own tables, each replacing one built-in table.
    pub tables: Vec<TableFileSource>,
}

impl TableFileSource {
    /// The record of `table`, read from the file at `file` (the path
    /// relative to the source's folder, as
    /// [`relative_table_path`](super::relative_table_path) gives it).
    pub fn for_user_table(file: String, table: &UserTable) -> TableFileSource {
        TableFileSource {
            file,
            sha256: table.sha256.clone(),
            severity: match table.slot {
                crate::standard::TableSlot::Master(severity, _) => Some(severity),
                _ => None,
            },
        }
    }
}

impl StandardSourceRequest {
    /// The model that counts `class`'s defects: Poisson for an AQL above
    /// 10 (nonconformities per 100 units only), the request's model
    /// otherwise, in the request's lot.
    ///
    /// # Errors
    /// [`InputError`] for a lot size out of range.
    pub fn class_model(&self, aql: Aql) -> Result<Model, InputError> {
        let kind = if aql.per_hundred_units_only() {
            ModelKind::Poisson
        } else {
            self.model
        };
        Model::new(kind, Some(self.lot_size))
    }

    /// The severities whose plans a source records: normal, tightened and,
    /// unless reduced inspection is left out, reduced.
    pub fn severities(&self) -> Vec<Severity> {
        Severity::ALL
            .into_iter()
            .filter(|&s| s != Severity::Reduced || !self.no_reduced)
            .collect()
    }

    /// Checks the request: a lot size of 1 to 10^12; 1 to
    /// [`MAX_CLASSES`] classes, a class without a name only alone, names of
    /// 1 to 40 printable characters without `,` or `=` (the count of a
    /// class is given as `NAME=K`), each name once (regardless of case);
    /// the form single, double or multiple; reduced inspection in force
    /// only when it is not left out; the consumer's point a quality of the
    /// model above every class's AQL, with beta in (0, 1) and
    /// `STANDARD_ALPHA + beta < 1`; the table files named once each, by a
    /// relative path, with a SHA-256 of 64 hex digits.
    ///
    /// # Errors
    /// [`InputError`] naming the key and what it must hold.
    pub fn check(&self) -> Result<(), InputError> {
        if self.lot_size == 0 || self.lot_size > MAX_LOT_SIZE {
            return Err(InputError::out_of_range(
                "lot_size",
                self.lot_size,
                "1 to 10^12 units (the lot whose code letter Table I gives)",
            ));
        }
        self.check_classes()?;
        if !matches!(
            self.form,
            Scheme::Single | Scheme::Double | Scheme::Multiple
        ) {
            return Err(InputError::out_of_range(
                "standard.form",
                self.form,
                "single, double or multiple (the standard's tables hold these)",
            ));
        }
        if self.no_reduced && self.severity == Severity::Reduced {
            return Err(InputError::Inconsistent(
                "standard.severity is reduced, and standard.no_reduced leaves reduced inspection out: give severity normal or tightened, or remove no_reduced".to_string(),
            ));
        }
        if let Some(point) = self.consumer {
            for c in &self.classes {
                let model = self.class_model(c.aql)?;
                let producer = RiskPoint {
                    quality: c.aql.quality(),
                    risk: STANDARD_ALPHA,
                };
                RiskPair::new(producer, point, &model).map_err(|e| match e {
                    InputError::Inconsistent(_) if point.quality <= producer.quality => {
                        InputError::Inconsistent(format!(
                            "the consumer's quality (RQL) {} must be above the AQL of every class, and class {} has AQL {} ({}); give a higher RQL, or leave the consumer's point out",
                            point.quality,
                            c.label(),
                            c.aql,
                            producer.quality
                        ))
                    }
                    other => other,
                })?;
            }
        }
        self.check_tables()
    }

    fn check_classes(&self) -> Result<(), InputError> {
        let classes = &self.classes;
        if classes.is_empty() {
            return Err(InputError::Inconsistent(
                "the standard section gives no AQL: give aql: (one AQL, e.g. aql: 1.0) or classes: (a name and an AQL for each class of defects)".to_string(),
            ));
        }
        if classes.len() > MAX_CLASSES {
            return Err(InputError::out_of_range(
                "the number of classes",
                classes.len(),
                &format!("1 to {MAX_CLASSES}"),
            ));
        }
        if classes.len() > 1 && classes.iter().any(|c| c.name.is_none()) {
            return Err(InputError::Inconsistent(
                "with several AQLs, name each one's class (critical, major, minor ...)".to_string(),
            ));
        }
        for (i, c) in classes.iter().enumerate() {
            let Some(name) = &c.name else { continue };
            if name.trim() != name
                || name.is_empty()
                || name.chars().count() > MAX_NAME
                || name
                    .chars()
                    .any(|ch| ch.is_control() || ch == ',' || ch == '=')
            {
                return Err(InputError::unparsable(
                    &format!("the name of class {}", i + 1),
                    &name.escape_debug().to_string(),
                    &format!(
                        "a name of 1 to {MAX_NAME} characters without commas, '=' or spaces at its ends, e.g. major"
                    ),
                ));
            }
            let lower = name.to_lowercase();
            if classes[..i]
                .iter()
                .any(|d| d.name.as_ref().is_some_and(|n| n.to_lowercase() == lower))
            {
                return Err(InputError::Inconsistent(format!(
                    "the class '{name}' is named twice: give each class once"
                )));
            }
        }
        Ok(())
    }

    fn check_tables(&self) -> Result<(), InputError> {
        if self.tables.len() > MAX_TABLES {
            return Err(InputError::out_of_range(
                "the number of user tables",
                self.tables.len(),
                &format!("0 to {MAX_TABLES}, one per table of the standard"),
            ));
        }
        for (i, t) in self.tables.iter().enumerate() {
            let key = format!("standard.tables item {} file", i + 1);
            let f = &t.file;
            if f.trim().is_empty() || f.chars().any(char::is_control) {
                return Err(InputError::unparsable(
                    &key,
                    &f.escape_debug().to_string(),
                    "the path of a table file, relative to the source's folder",
                ));
            }
            let absolute =
                f.starts_with('/') || f.starts_with('\\') || f.as_bytes().get(1) == Some(&b':');
            if absolute {
                return Err(InputError::unparsable(
                    &key,
                    f,
                    "a path relative to the source's folder (e.g. tables/my-2a.csv), so that the source and its table move together",
                ));
            }
            if t.sha256.len() != 64
                || !t
                    .sha256
                    .chars()
                    .all(|c| c.is_ascii_digit() || ('a'..='f').contains(&c))
            {
                return Err(InputError::unparsable(
                    &format!("standard.tables item {} sha256", i + 1),
                    &t.sha256.escape_debug().to_string(),
                    "the file's SHA-256: 64 lower-case hex digits (sha256sum prints it)",
                ));
            }
            if self.tables[..i].iter().any(|u| u.file == t.file) {
                return Err(InputError::Inconsistent(format!(
                    "the table file {f} is named twice under standard.tables: name it once"
                )));
            }
        }
        Ok(())
    }
}

impl PlanSource {
    /// Whether the source describes a standard-indexed plan.
    pub fn is_standard(&self) -> bool {
        self.scheme == Scheme::Standard
    }

    /// The validated request of a `scheme: standard` source: its
    /// `standard` section, model, lot size and consumer's point.
    ///
    /// ```
    /// use lotsman::{PlanSource, template};
    /// let text = template("standard").unwrap();
    /// let source = PlanSource::from_yaml(text, std::path::Path::new("s.yaml")).unwrap();
    /// let request = source.standard_request().unwrap();
    /// assert_eq!(request.classes.len(), 3);
    /// assert_eq!(request.lot_size, 1500);
    /// ```
    ///
    /// # Errors
    /// [`InputError`] for a source of another scheme, a missing `standard`
    /// section or lot size, both or neither of `aql` and `classes`, a key
    /// that belongs to plans designed from two risk points (`producer`,
    /// `criterion`, ...), or what [`StandardSourceRequest::check`]
    /// refuses.
    pub fn standard_request(&self) -> Result<StandardSourceRequest, InputError> {
        if !self.is_standard() {
            return Err(InputError::Inconsistent(format!(
                "the source '{}' is a {} plan, not a standard-indexed plan (scheme: standard)",
                self.title, self.scheme
            )));
        }
        self.check_document()?;
        let Some(s) = &self.standard else {
            return Err(InputError::Inconsistent(
                "scheme: standard needs a 'standard' section: edition, level, aql (or classes), severity and form (see: lotsman new standard)".to_string(),
            ));
        };
        for (field, given) in [
            ("producer", self.producer.is_some()),
            ("criterion", self.criterion.is_some()),
            ("second_ratio", self.second_ratio.is_some()),
            ("stage_count", self.stage_count.is_some()),
            ("variables", self.variables.is_some()),
            ("rectifying", self.rectifying.is_some()),
        ] {
            if given {
                let why = if field == "producer" {
                    "its AQL is standard.aql (or each class's aql), and the standard's plans state no producer's risk"
                } else {
                    "its plans are read from the standard's tables"
                };
                return Err(InputError::Inconsistent(format!(
                    "'{field}' does not belong to a standard-indexed plan (scheme: standard): {why}; remove it"
                )));
            }
        }
        let Some(lot_size) = self.lot_size else {
            return Err(InputError::Inconsistent(
                "a standard-indexed plan needs lot_size: the units in a lot, which give the code letter (Table I)".to_string(),
            ));
        };
        let classes = match (s.aql, s.classes.as_slice()) {
            (Some(aql), []) => vec![ClassAql { name: None, aql }],
            (None, []) => Vec::new(),
            (None, classes) => classes
                .iter()
                .map(|c| ClassAql {
                    name: Some(c.name.clone()),
                    aql: c.aql,
                })
                .collect(),
            (Some(_), _) => {
                return Err(InputError::Inconsistent(
                    "the standard section gives both aql: and classes:; give one AQL with aql:, or a name and an AQL for each class under classes:".to_string(),
                ));
            }
        };
        let request = StandardSourceRequest {
            lot_size,
            level: s.level,
            classes,
            severity: s.severity,
            form: s.form,
            model: self.model,
            no_reduced: s.no_reduced,
            class_rule: s.class_rule.unwrap_or_default(),
            consumer: self.consumer.map(|p| RiskPoint {
                quality: p.quality,
                risk: p.risk,
            }),
            tables: s.tables.clone(),
        };
        request.check()?;
        Ok(request)
    }

    /// A new standard-indexed source for `request`, with the given title,
    /// not yet recorded ([`PlanSource::record_standard`] records its
    /// plans).
    ///
    /// ```
    /// use lotsman::{ClassRule, InspectionLevel, ModelKind, PlanSource, Scheme, Severity,
    ///     StandardSourceRequest, Tables, parse_classes};
    /// let request = StandardSourceRequest {
    ///     lot_size: 1500,
    ///     level: InspectionLevel::II,
    ///     classes: parse_classes(&["major=1.0", "minor=4.0"]).unwrap(),
    ///     severity: Severity::Normal,
    ///     form: Scheme::Single,
    ///     model: ModelKind::Binomial,
    ///     no_reduced: false,
    ///     class_rule: ClassRule::OwnPlans,
    ///     consumer: None,
    ///     tables: Vec::new(),
    /// };
    /// let mut source = PlanSource::new_standard("Covers", &request).unwrap();
    /// source.record_standard(Tables::builtin().unwrap()).unwrap();
    /// let plan = source.plan.as_ref().unwrap();
    /// assert_eq!(plan.code_letter.unwrap().to_string(), "K");
    /// assert_eq!(plan.classes[0].normal.stages[0].n, 125);
    /// ```
    ///
    /// # Errors
    /// As [`StandardSourceRequest::check`]; an empty title.
    pub fn new_standard(
        title: &str,
        request: &StandardSourceRequest,
    ) -> Result<PlanSource, InputError> {
        request.check()?;
        let mut source = PlanSource::bare(
            title,
            Scheme::Standard,
            request.model,
            Some(request.lot_size),
        );
        let single = request.classes.len() == 1 && request.classes[0].name.is_none();
        source.standard = Some(StandardSource {
            edition: Edition::MilStd105E,
            level: request.level,
            aql: single.then(|| request.classes[0].aql),
            classes: if single {
                Vec::new()
            } else {
                request
                    .classes
                    .iter()
                    .map(|c| ClassSource {
                        name: c.name.clone().unwrap_or_default(),
                        aql: c.aql,
                    })
                    .collect()
            },
            severity: request.severity,
            form: request.form,
            no_reduced: request.no_reduced,
            class_rule: (request.class_rule != ClassRule::default()).then_some(request.class_rule),
            tables: request.tables.clone(),
        });
        source.consumer = request.consumer.map(|p| PointSource {
            quality: p.quality,
            risk: p.risk,
        });
        source.standard_request()?;
        Ok(source)
    }

    /// Refuses a `standard` section on a source of another scheme.
    pub(crate) fn refuse_standard_section(&self) -> Result<(), InputError> {
        if self.standard.is_some() {
            return Err(InputError::Inconsistent(format!(
                "'standard' applies to standard-indexed plans (scheme: standard) only, and this source's scheme is {}",
                self.scheme
            )));
        }
        Ok(())
    }
}
