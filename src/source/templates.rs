//! The commented plan-source templates of `templates/`, embedded in the
//! binary so that `lotsman new KIND` works anywhere, and the check for
//! their placeholder texts left in a source.
//!
//! Every text a template leaves for the user to fill in is a phrase in
//! angle brackets, `<part name, part number, drawing revision>`: one
//! marker for all templates, which [`placeholders`] finds wherever it is
//! left, whole or in part (`Incoming inspection of <part>, seals`).

use crate::source::PlanSource;

/// `(kind, text)` of every template.
pub const TEMPLATES: &[(&str, &str)] = &[
    ("binomial", include_str!("../../templates/binomial.yaml")),
    (
        "hypergeometric",
        include_str!("../../templates/hypergeometric.yaml"),
    ),
    ("poisson", include_str!("../../templates/poisson.yaml")),
    ("double", include_str!("../../templates/double.yaml")),
    ("multiple", include_str!("../../templates/multiple.yaml")),
    (
        "sequential",
        include_str!("../../templates/sequential.yaml"),
    ),
    ("variables", include_str!("../../templates/variables.yaml")),
    (
        "rectifying",
        include_str!("../../templates/rectifying.yaml"),
    ),
    ("standard", include_str!("../../templates/standard.yaml")),
];

/// The template of `kind`, or `None` for an unknown kind.
pub fn template(kind: &str) -> Option<&'static str> {
    TEMPLATES
        .iter()
        .find(|(k, _)| k.eq_ignore_ascii_case(kind))
        .map(|(_, t)| *t)
}

/// The names of all templates, for messages.
pub fn template_kinds() -> Vec<&'static str> {
    TEMPLATES.iter().map(|(k, _)| *k).collect()
}

/// A field of a plan source that still holds a template's placeholder.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Placeholder {
    /// The field's YAML key, e.g. `item`.
    pub field: &'static str,
    /// The placeholder found in it, with its brackets.
    pub text: String,
}

impl std::fmt::Display for Placeholder {
    /// `item still holds the template's placeholder <...>; fill it in`.
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(
            f,
            "{} still holds the template's placeholder {}; fill it in before the sheet is signed",
            self.field, self.text
        )
    }
}

/// The fields of `source` that still hold a placeholder of the templates,
/// in the order of the source.
///
/// ```
/// use lotsman::{PlanSource, placeholders, template};
/// let path = std::path::Path::new("binomial.yaml");
/// let mut source = PlanSource::from_yaml(template("binomial").unwrap(), path).unwrap();
/// let found: Vec<&str> = placeholders(&source).iter().map(|p| p.field).collect();
/// assert_eq!(found, ["title", "id", "item", "characteristic", "prepared_by", "approved_by", "notes"]);
/// source.item = Some("Seal 20 x 2 mm, TPW-4410".into());
/// assert_eq!(placeholders(&source).len(), 6);
/// ```
pub fn placeholders(source: &PlanSource) -> Vec<Placeholder> {
    let fields = [
        ("title", Some(&source.title)),
        ("id", source.id.as_ref()),
        ("revision", source.revision.as_ref()),
        ("item", source.item.as_ref()),
        ("characteristic", source.characteristic.as_ref()),
        ("prepared_by", source.prepared_by.as_ref()),
        ("approved_by", source.approved_by.as_ref()),
        ("notes", source.notes.as_ref()),
    ];
    fields
        .into_iter()
        .filter_map(|(field, value)| {
            let text = marked(value?)?;
            // A long one is cut, for a warning on one line.
            let text = if text.chars().count() > 60 {
                format!("{}…>", text.chars().take(57).collect::<String>().trim_end())
            } else {
                text.to_string()
            };
            Some(Placeholder { field, text })
        })
        .collect()
}

/// The first placeholder phrase in `text`: a `<` directly before a letter,
/// up to the next `>` directly after a letter or digit, with no bracket
/// between (so that `d < 5 mm and > 2 mm` is not one).
fn marked(text: &str) -> Option<&str> {
    let mut rest = text;
    let mut offset = 0;
    while let Some(open) = rest.find('<') {
        let after = &rest[open + 1..];
        let starts_word = after.chars().next().is_some_and(char::is_alphabetic);
        if let Some(close) = after.find(['<', '>'])
            && starts_word
            && after[close..].starts_with('>')
            && after[..close]
                .chars()
                .last()
                .is_some_and(char::is_alphanumeric)
        {
            let start = offset + open;
            return Some(&text[start..start + close + 2]);
        }
        offset += open + 1;
        rest = after;
    }
    None
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_bracketed_phrase_is_a_placeholder_and_a_comparison_is_not() {
        assert_eq!(marked("<name, function>"), Some("<name, function>"));
        assert_eq!(
            marked("Incoming inspection of <part>, seals"),
            Some("<part>")
        );
        assert_eq!(marked("Ra < 1.6 µm and > 0.4 µm"), None);
        assert_eq!(marked("d<5 mm or d>7 mm"), None);
        assert_eq!(marked("< part>"), None);
        assert_eq!(marked("R. Odumbe, supplier quality engineer"), None);
    }

    #[test]
    fn every_template_field_left_as_it_is_is_found() {
        for (kind, text) in TEMPLATES {
            let source = PlanSource::from_yaml(text, std::path::Path::new(kind)).unwrap();
            let found: Vec<&str> = placeholders(&source).iter().map(|p| p.field).collect();
            assert_eq!(
                found,
                [
                    "title",
                    "id",
                    "item",
                    "characteristic",
                    "prepared_by",
                    "approved_by",
                    "notes"
                ],
                "{kind}"
            );
        }
    }
}
