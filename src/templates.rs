//! The commented plan-source templates of `templates/`, embedded in the
//! binary so that `lotsman new KIND` works anywhere.

/// `(kind, text)` of every template.
pub const TEMPLATES: &[(&str, &str)] = &[
    ("binomial", include_str!("../templates/binomial.yaml")),
    (
        "hypergeometric",
        include_str!("../templates/hypergeometric.yaml"),
    ),
    ("poisson", include_str!("../templates/poisson.yaml")),
    ("double", include_str!("../templates/double.yaml")),
    ("multiple", include_str!("../templates/multiple.yaml")),
    ("sequential", include_str!("../templates/sequential.yaml")),
    ("variables", include_str!("../templates/variables.yaml")),
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
