//! What a standard-indexed plan source asks for, validated
//! ([`StandardSourceRequest`]): the index as `lotsman standard` checks it
//! ([`StandardRequest`]), with the consumer's point and the user tables
//! the source names; read from a source's keys
//! ([`PlanSource::standard_request`]), or made into a new source
//! ([`PlanSource::new_standard`], [`PlanSource::from_assessment`]).

use crate::design::Scheme;
use crate::input::InputError;
use crate::model::{Model, ModelKind, RiskPair, RiskPoint};
use crate::source::PlanSource;
use crate::source::PointSource;
use crate::standard::{
    ClassAql, ClassRule, ConsumerPoint, StandardError, StandardIndex, StandardRequest, TableSlot,
    UserTable, parse_classes,
};

use super::schema::{ClassSource, Edition, StandardSource, TableFileSource};

/// The producer's risk at the AQL that the two-point design compared with
/// a source's table plans keeps: a source records no producer's risk (the
/// AQL is its index, and the standard states none); 0.05 is common
/// practice, and the default of `lotsman standard --alpha`.
pub const STANDARD_ALPHA: f64 = 0.05;

/// The most classes of defects a source may name.
pub const MAX_CLASSES: usize = 20;

/// The most user tables a source may name: one per table of the standard
/// (Table I, nine master tables, Table VIII).
const MAX_TABLES: usize = 11;

/// A standard-indexed plan as a source records it, validated by
/// [`StandardSourceRequest::new`].
#[derive(Clone, Debug, PartialEq)]
pub struct StandardSourceRequest {
    /// The index and model, as `lotsman standard` checks them.
    pub request: StandardRequest,
    /// The consumer's point (RQL and beta) the table plans are held
    /// against, if any, with [`STANDARD_ALPHA`] for the two-point design.
    pub consumer: Option<ConsumerPoint>,
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
                TableSlot::Master(severity, _) => Some(severity),
                _ => None,
            },
        }
    }
}

/// A refusal of the standard's tables as an input error of the source.
pub(crate) fn plain(e: StandardError) -> InputError {
    match e {
        StandardError::Input(e) => e,
        other => InputError::Inconsistent(other.to_string()),
    }
}

impl StandardSourceRequest {
    /// Checks the parts a source adds to `request`: at most
    /// [`MAX_CLASSES`] classes, names without `=` (the count of a class is
    /// given as `NAME=K`); the consumer's point a quality of the model
    /// above every class's AQL, with beta in (0, 1) and
    /// `STANDARD_ALPHA + beta < 1`; the table files named once each, by a
    /// relative path, with a SHA-256 of 64 hex digits.
    ///
    /// # Errors
    /// [`InputError`] naming the key and what it must hold.
    pub fn new(
        request: StandardRequest,
        consumer: Option<ConsumerPoint>,
        tables: Vec<TableFileSource>,
    ) -> Result<Self, InputError> {
        let made = StandardSourceRequest {
            request,
            consumer,
            tables,
        };
        made.check_classes()?;
        made.check_consumer()?;
        made.check_tables()?;
        Ok(made)
    }

    fn check_classes(&self) -> Result<(), InputError> {
        let classes = self.request.classes();
        if classes.len() > MAX_CLASSES {
            return Err(InputError::out_of_range(
                "the number of classes",
                classes.len(),
                &format!("1 to {MAX_CLASSES}"),
            ));
        }
        for (i, c) in classes.iter().enumerate() {
            if let Some(name) = &c.name
                && (name.contains('=') || name.trim() != name)
            {
                return Err(InputError::unparsable(
                    &format!("the name of class {}", i + 1),
                    &name.escape_debug().to_string(),
                    "a name without '=' or spaces at its ends, e.g. major (a count is given as --found major=K)",
                ));
            }
        }
        Ok(())
    }

    fn check_consumer(&self) -> Result<(), InputError> {
        let Some(point) = self.consumer else {
            return Ok(());
        };
        let model = self.request.model();
        let consumer = RiskPoint {
            quality: point.rql,
            risk: point.beta,
        };
        for c in self.request.classes() {
            let producer = RiskPoint {
                quality: c.aql.quality(),
                risk: point.alpha,
            };
            RiskPair::new(producer, consumer, model).map_err(|e| match e {
                InputError::Inconsistent(_) if consumer.quality <= producer.quality => {
                    InputError::Inconsistent(format!(
                        "the consumer's quality (RQL) {} must be above the AQL of every class, and class {} has AQL {} ({}); give a higher RQL, or leave the consumer's point out",
                        consumer.quality,
                        c.label(),
                        c.aql,
                        producer.quality
                    ))
                }
                other => other,
            })?;
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
    /// `standard` section, model, lot size and consumer's point, checked
    /// as `lotsman standard` checks its flags ([`StandardRequest::new`])
    /// and by [`StandardSourceRequest::new`].
    ///
    /// ```
    /// use lotsman::{PlanSource, template};
    /// let text = template("standard").unwrap();
    /// let source = PlanSource::from_yaml(text, std::path::Path::new("s.yaml")).unwrap();
    /// let request = source.standard_request().unwrap();
    /// assert_eq!(request.request.classes().len(), 3);
    /// assert_eq!(request.request.lot_size(), 1500);
    /// ```
    ///
    /// # Errors
    /// [`InputError`] for a source of another scheme, a missing `standard`
    /// section or lot size, both or neither of `aql` and `classes`, a key
    /// that belongs to plans designed from two risk points (`producer`,
    /// `criterion`, ...), or what the checks refuse.
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
        let texts: Vec<String> = match (s.aql, s.classes.as_slice()) {
            (Some(aql), []) => vec![aql.to_string()],
            (None, []) => {
                return Err(InputError::Inconsistent(
                    "the standard section gives no AQL: give aql: (one AQL, e.g. aql: 1.0) or classes: (a name and an AQL for each class of defects)".to_string(),
                ));
            }
            (None, classes) => classes
                .iter()
                .map(|c| format!("{}={}", c.name, c.aql))
                .collect(),
            (Some(_), _) => {
                return Err(InputError::Inconsistent(
                    "the standard section gives both aql: and classes:; give one AQL with aql:, or a name and an AQL for each class under classes:".to_string(),
                ));
            }
        };
        // A name with '=' or spaces at its ends would be read back as
        // another name: refused before the names are parsed.
        for (i, c) in s.classes.iter().enumerate() {
            if c.name.contains('=') || c.name.trim() != c.name {
                return Err(InputError::unparsable(
                    &format!("standard.classes item {} name", i + 1),
                    &c.name.escape_debug().to_string(),
                    "a name without '=' or spaces at its ends, e.g. major (a count is given as --found major=K)",
                ));
            }
        }
        let texts: Vec<&str> = texts.iter().map(String::as_str).collect();
        let classes = parse_classes(&texts).map_err(plain)?;
        let index = StandardIndex {
            lot_size,
            level: s.level,
            classes,
            severity: s.severity,
            scheme: s.form,
            reduced: !s.no_reduced,
            rule: s.class_rule.unwrap_or_default(),
        };
        let lot = (self.model == ModelKind::Hypergeometric).then_some(lot_size);
        let model = Model::new(self.model, lot)?;
        let request = StandardRequest::new(index, model).map_err(plain)?;
        let consumer = self.consumer.map(|p| ConsumerPoint {
            rql: p.quality,
            beta: p.risk,
            alpha: STANDARD_ALPHA,
        });
        StandardSourceRequest::new(request, consumer, s.tables.clone())
    }

    /// A new standard-indexed source for `request`, with the given title,
    /// not yet recorded ([`PlanSource::record_standard`] records its
    /// plans; [`PlanSource::from_assessment`] makes and records one from
    /// the answer of `lotsman standard`).
    ///
    /// ```
    /// use lotsman::{ClassRule, InspectionLevel, Model, ModelKind, PlanSource, Scheme, Severity,
    ///     StandardIndex, StandardRequest, StandardSourceRequest, Tables, parse_classes};
    /// let index = StandardIndex {
    ///     lot_size: 1500,
    ///     level: InspectionLevel::II,
    ///     classes: parse_classes(&["major=1.0", "minor=4.0"]).unwrap(),
    ///     severity: Severity::Normal,
    ///     scheme: Scheme::Single,
    ///     reduced: true,
    ///     rule: ClassRule::OwnPlans,
    /// };
    /// let model = Model::new(ModelKind::Binomial, None).unwrap();
    /// let request = StandardRequest::new(index, model).unwrap();
    /// let request = StandardSourceRequest::new(request, None, Vec::new()).unwrap();
    /// let mut source = PlanSource::new_standard("Covers", &request).unwrap();
    /// source.record_standard(Tables::builtin().unwrap()).unwrap();
    /// let plan = source.plan.as_ref().unwrap();
    /// assert_eq!(plan.code_letter.unwrap().to_string(), "K");
    /// // 105E Table II-A, code letter K, AQL 1.0: n 125, Ac 3, Re 4
    /// assert_eq!(plan.classes[0].normal.stages[0].n, 125);
    /// ```
    ///
    /// # Errors
    /// [`InputError`] for an empty title, or a request the source's
    /// reader would refuse.
    pub fn new_standard(
        title: &str,
        request: &StandardSourceRequest,
    ) -> Result<PlanSource, InputError> {
        let r = &request.request;
        let mut source = PlanSource::bare(
            title,
            Scheme::Standard,
            r.model().kind(),
            Some(r.lot_size()),
        );
        let classes = r.classes();
        let single = classes.len() == 1 && classes[0].name.is_none();
        source.standard = Some(StandardSource {
            edition: Edition::MilStd105E,
            level: r.level(),
            aql: single.then(|| classes[0].aql),
            classes: if single {
                Vec::new()
            } else {
                classes
                    .iter()
                    .map(|c: &ClassAql| ClassSource {
                        name: c.name.clone().unwrap_or_default(),
                        aql: c.aql,
                    })
                    .collect()
            },
            severity: r.severity(),
            form: r.scheme(),
            no_reduced: !r.reduced(),
            class_rule: (r.rule() != ClassRule::default()).then_some(r.rule()),
            tables: request.tables.clone(),
        });
        source.consumer = request.consumer.map(|p| PointSource {
            quality: p.rql,
            risk: p.beta,
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
