//! The choices that several commands offer (`--model`, `--criterion`,
//! `--scheme single|double`, `--format table|json|csv`, `--paper`), each
//! with its library value.

use clap::ValueEnum;
use lotsman::{Criterion, Format, ModelKind, Paper, Scheme, SchemeOptions};

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum ModelArg {
    Binomial,
    Hypergeometric,
    Poisson,
}

impl From<ModelArg> for ModelKind {
    fn from(arg: ModelArg) -> Self {
        match arg {
            ModelArg::Binomial => ModelKind::Binomial,
            ModelArg::Hypergeometric => ModelKind::Hypergeometric,
            ModelArg::Poisson => ModelKind::Poisson,
        }
    }
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum CriterionArg {
    /// ASN at the AQL
    #[value(name = "asn-aql")]
    Aql,
    /// ASN at the RQL
    #[value(name = "asn-rql")]
    Rql,
    /// Largest ASN over all qualities (double plans)
    #[value(name = "asn-max")]
    Max,
}

/// The criterion of `--criterion`, or the default.
pub fn criterion_of(arg: Option<CriterionArg>) -> Criterion {
    match arg {
        None => SchemeOptions::default().criterion,
        Some(CriterionArg::Aql) => Criterion::AsnAql,
        Some(CriterionArg::Rql) => Criterion::AsnRql,
        Some(CriterionArg::Max) => Criterion::AsnMax,
    }
}

/// The schemes of the grid and of minimum-inspection plans.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum SingleOrDoubleArg {
    Single,
    Double,
}

impl From<SingleOrDoubleArg> for Scheme {
    fn from(arg: SingleOrDoubleArg) -> Self {
        match arg {
            SingleOrDoubleArg::Single => Scheme::Single,
            SingleOrDoubleArg::Double => Scheme::Double,
        }
    }
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum ReportFormatArg {
    Table,
    Json,
    Csv,
}

impl From<ReportFormatArg> for Format {
    fn from(arg: ReportFormatArg) -> Self {
        match arg {
            ReportFormatArg::Table => Format::Table,
            ReportFormatArg::Json => Format::Json,
            ReportFormatArg::Csv => Format::Csv,
        }
    }
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum PaperArg {
    A4,
    Letter,
}

impl From<PaperArg> for Paper {
    fn from(arg: PaperArg) -> Self {
        match arg {
            PaperArg::A4 => Paper::A4,
            PaperArg::Letter => Paper::Letter,
        }
    }
}
