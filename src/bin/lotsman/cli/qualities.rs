//! The quality flags of every command (`--aql`, `--rql`, `--at`,
//! `--range`, the grid's axes, `--process-average`, `--ltpd`, `--aoql`),
//! parsed in one place, so that a quality typed as a bare fraction where a
//! percent was likely meant (`--aql 0.5` for half a percent) gets the same
//! note on stderr whichever command it is given to. The plan is still
//! given, for the quality as read.

use lotsman::{
    InputError, ModelKind, QualityRange, bare_fraction_note, escape_controls, parse_fraction,
    parse_fraction_list,
};

use crate::out::say;

/// Parses qualities for one model.
pub struct Qualities {
    /// Whether qualities are fractions nonconforming (binomial,
    /// hypergeometric), for which a bare value above a fifth gets a note;
    /// a rate per unit (Poisson) of 0.5 is ordinary and gets none.
    fractions: bool,
}

impl Qualities {
    /// The parser for qualities of a model of `kind`.
    pub fn of(kind: ModelKind) -> Self {
        Qualities {
            fractions: kind != ModelKind::Poisson,
        }
    }

    /// The parser for qualities of models of these kinds (the sources of
    /// a batch): the note is given when any of them counts fractions.
    pub fn of_any(kinds: impl IntoIterator<Item = ModelKind>) -> Self {
        Qualities {
            fractions: kinds.into_iter().any(|k| k != ModelKind::Poisson),
        }
    }

    /// One quality, `0.01` or `1%`.
    pub fn one(&self, flag: &str, text: &str) -> Result<f64, InputError> {
        let value = parse_fraction(flag, text)?;
        self.note(flag, text);
        Ok(value)
    }

    /// A list `p,p,..`.
    pub fn list(&self, flag: &str, text: &str) -> Result<Vec<f64>, InputError> {
        let values = parse_fraction_list(flag, text)?;
        self.note(flag, text);
        Ok(values)
    }

    /// The points of a range `LO:HI:COUNT`.
    pub fn range(&self, flag: &str, text: &str) -> Result<Vec<f64>, InputError> {
        let points = QualityRange::parse(flag, text)?.points();
        self.note(flag, text);
        Ok(points)
    }

    /// One grid axis: `LO:HI:COUNT` or a list `p,p,..`.
    pub fn axis(&self, flag: &str, text: &str) -> Result<Vec<f64>, InputError> {
        if text.contains(':') {
            self.range(flag, text)
        } else {
            self.list(flag, text)
        }
    }

    /// The note on stderr for bare fractions above a fifth, if any.
    fn note(&self, flag: &str, text: &str) {
        if let Some(note) = bare_fraction_note(flag, text).filter(|_| self.fractions) {
            say(format_args!("note: {}", escape_controls(&note)));
        }
    }
}
