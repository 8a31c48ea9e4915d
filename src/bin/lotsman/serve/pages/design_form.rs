//! The fields of the design form, shared by the screens that read them
//! (the design, its trade-off map, the save): as typed, as a query string,
//! as the arguments of `lotsman design`, and the plan they design by the
//! command's path ([`from_flags`]).

use std::collections::HashMap;

use clap::ValueEnum;
use lotsman::{InputError, bare_fraction_note};

use crate::cli::design::{
    DescriptionFlags, DesignArgs, DesignFormat, NearbyArg, SchemeArg, StepFlags, VariablesFlags,
};
use crate::cli::groups::{FormatFlag, ModelFlags, OutputFlags, RiskFlags};
use crate::cli::values::ModelArg;
use crate::commands::design::{Designed, from_flags};
use crate::serve::page::{Refusal, off_thread};

/// The values a side of the trade-off map, unless the form asks for
/// others.
pub const MAP_SIZE: &str = "7";

/// The fields of the design form as typed.
#[derive(Clone, Debug)]
pub struct DesignFields {
    pub aql: String,
    pub alpha: String,
    pub rql: String,
    pub beta: String,
    /// Empty for the command's default (binomial, or hypergeometric with
    /// a lot size).
    pub model: String,
    pub lot_size: String,
    pub scheme: String,
    /// The cost of inspecting one unit, empty for none.
    pub cost: String,
    /// The process quality at which the inspection is costed, empty for
    /// the AQL.
    pub process: String,
    /// The number of AQL and of RQL values of the trade-off map.
    pub map: String,
}

impl DesignFields {
    /// The fields of a query or a form; a field left out or left empty
    /// takes the command's default.
    pub fn of(fields: &HashMap<String, String>) -> Self {
        let text = |key: &str, default: &str| {
            fields
                .get(key)
                .map(|v| v.trim())
                .filter(|v| !v.is_empty())
                .unwrap_or(default)
                .to_string()
        };
        DesignFields {
            aql: text("aql", ""),
            alpha: text("alpha", "0.05"),
            rql: text("rql", ""),
            beta: text("beta", "0.10"),
            model: text("model", ""),
            lot_size: text("lot_size", ""),
            scheme: text("scheme", "single"),
            cost: text("cost", ""),
            process: text("process", ""),
            map: text("map", MAP_SIZE),
        }
    }

    /// The fields as a query string, for a link to the same design (or
    /// its map): each field given, percent-encoded.
    pub fn query(&self) -> String {
        let encode = |text: &str| {
            text.bytes()
                .map(|b| match b {
                    b'A'..=b'Z' | b'a'..=b'z' | b'0'..=b'9' | b'-' | b'.' | b'_' | b'~' => {
                        (b as char).to_string()
                    }
                    _ => format!("%{b:02X}"),
                })
                .collect::<String>()
        };
        [
            ("aql", &self.aql),
            ("rql", &self.rql),
            ("alpha", &self.alpha),
            ("beta", &self.beta),
            ("model", &self.model),
            ("lot_size", &self.lot_size),
            ("scheme", &self.scheme),
            ("cost", &self.cost),
            ("process", &self.process),
            ("map", &self.map),
        ]
        .iter()
        .filter(|(_, v)| !v.is_empty())
        .map(|(k, v)| format!("{k}={}", encode(v)))
        .collect::<Vec<_>>()
        .join("&")
    }

    /// Whether a plan was asked for (an AQL or an RQL given), not only
    /// the empty form.
    pub fn asked(&self) -> bool {
        !self.aql.is_empty() || !self.rql.is_empty()
    }

    /// The arguments `lotsman design` would get from these fields, as
    /// its flags: `--aql`, `--rql`, `--alpha`, `--beta`, `--model`,
    /// `--lot-size`, `--scheme`, with the title and document fields
    /// given.
    pub fn args(
        &self,
        title: Option<String>,
        description: DescriptionFlags,
    ) -> Result<DesignArgs, InputError> {
        let model = match self.model.as_str() {
            "" => None,
            text => Some(ModelArg::from_str(text, true).map_err(|_| {
                InputError::unparsable("--model", text, "binomial, hypergeometric or poisson")
            })?),
        };
        let scheme = SchemeArg::from_str(&self.scheme, true).map_err(|_| {
            InputError::unparsable(
                "--scheme",
                &self.scheme,
                "single, double, multiple or sequential",
            )
        })?;
        if scheme == SchemeArg::Variables {
            return Err(InputError::Inconsistent(
                "this page designs attributes plans (single, double, multiple, sequential); design a variables plan with: lotsman design --scheme variables".to_string(),
            ));
        }
        let given = |t: &str| Some(t.to_string()).filter(|t| !t.is_empty());
        Ok(DesignArgs {
            source: None,
            risks: RiskFlags {
                aql: given(&self.aql),
                alpha: self.alpha.clone(),
                rql: given(&self.rql),
                beta: self.beta.clone(),
            },
            model: ModelFlags {
                model,
                lot_size: given(&self.lot_size),
            },
            scheme,
            nearby: NearbyArg::Window,
            criterion: None,
            second_ratio: None,
            stage_count: None,
            variables: VariablesFlags {
                sigma: None,
                limit: None,
                sigma_value: None,
                lower: None,
                upper: None,
                unit: None,
            },
            title,
            description,
            steps: StepFlags {
                step_aql: None,
                step_alpha: None,
                step_rql: None,
                step_beta: None,
            },
            format: FormatFlag {
                format: DesignFormat::Table,
            },
            output: OutputFlags {
                output: None,
                force: false,
            },
            in_place: false,
        })
    }

    /// The notes `lotsman design` gives on stderr for a quality typed
    /// as a bare fraction where a percent was likely meant.
    pub fn notes(&self) -> Vec<String> {
        if self.model.eq_ignore_ascii_case("poisson") {
            return Vec::new();
        }
        [("--aql", &self.aql), ("--rql", &self.rql)]
            .into_iter()
            .filter_map(|(flag, text)| bare_fraction_note(flag, text))
            .collect()
    }
}

/// The plan designed from `fields`, titled and described as given: the
/// path of `lotsman design`, run off the server's request threads.
pub async fn design(
    fields: DesignFields,
    title: Option<String>,
    description: DescriptionFlags,
) -> Result<Designed, Refusal> {
    let args = fields.args(title, description)?;
    off_thread("the design", move || from_flags(&args)).await
}

/// An SVG document as an HTML page inlines it: without the XML
/// declaration.
pub fn inline_svg(svg: String) -> String {
    match svg.find("<svg") {
        Some(at) => svg[at..].to_string(),
        None => svg,
    }
}
