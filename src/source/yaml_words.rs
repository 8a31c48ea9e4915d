//! What the YAML reader reports about a plan source, said in plain words.
//!
//! serde_yaml speaks of types (`invalid type: sequence, expected struct
//! PlanSource`, `expected u64`, ``unknown variant `Single` ``) and of its
//! scanner's states. A quality engineer needs what the file must hold,
//! where, and how to fix it: `line 5: lot_size must be a whole number such
//! as 3000 (digits only, no thousands separator), not 12.5`. This module
//! reads serde_yaml's message (its wording is fixed by the locked version,
//! and the refusal suite pins every class) and says it again.
//!
//! serde_yaml reports an error as `PATH: MESSAGE at line L column C`, the
//! path (`producer.quality`, `plan.stages[1].n`) left out at the top
//! level, and scanner errors as `MESSAGE at line L column C, while
//! CONTEXT at line ...`.

use std::path::Path;

use super::keys::repeated_keys;
use super::verify::stage_field;

/// The keys of a plan source, in the order of the schema.
const SOURCE_KEYS: &str = "schema:, title:, scheme:, model:, producer:, consumer:, ...";

/// serde_yaml's error `e` for `text` (read from `path`), in plain words,
/// starting with the line when one is known.
pub(crate) fn plain_yaml_error(e: &serde_yaml::Error, text: &str, path: &Path) -> String {
    let full = e.to_string();
    let line = e.location().map(|l| l.line());
    let (field, core) = split_path(&full);
    let core = cut_location(core);
    let said = say(field, core, text, path, line);
    let line = match said.line {
        Line::Reported => line,
        Line::At(l) => Some(l),
        Line::Whole => None,
    };
    match line {
        Some(l) => format!("line {l}: {}", said.text),
        None => said.text,
    }
}

/// A message and the line it is about.
struct Said {
    line: Line,
    text: String,
}

/// The line a message is about.
enum Line {
    /// serde_yaml's location.
    Reported,
    /// A line the message found (a repeated key, a tab).
    At(usize),
    /// None: the message is about the whole file (a key it lacks).
    Whole,
}

impl From<String> for Said {
    fn from(text: String) -> Self {
        Said {
            line: Line::Reported,
            text,
        }
    }
}

/// The field path at the start of serde_yaml's message, if any, and the
/// rest.
fn split_path(message: &str) -> (Option<&str>, &str) {
    if let Some((head, rest)) = message.split_once(": ") {
        let pathlike = !head.is_empty()
            && head
                .chars()
                .all(|ch| ch.is_ascii_lowercase() || ch.is_ascii_digit() || "_.[]".contains(ch));
        if pathlike {
            return (Some(head), rest);
        }
    }
    (None, message)
}

/// `message` without serde_yaml's ` at line L column C` and what follows.
fn cut_location(message: &str) -> &str {
    [" at line ", " at position "]
        .iter()
        .filter_map(|m| message.find(m))
        .min()
        .map_or(message, |at| &message[..at])
}

/// The field as a reader names it: `lot_size`, `producer.quality`, and a
/// stage of the recorded plan counted from one, `stage 2 n`.
fn field_name(path: &str) -> String {
    let Some(rest) = path.strip_prefix("plan.stages[") else {
        return path.to_string();
    };
    let Some((index, key)) = rest.split_once(']') else {
        return path.to_string();
    };
    match index.parse::<usize>() {
        Ok(i) => match key.strip_prefix('.') {
            Some(key) => format!("{} of the recorded plan", stage_field(i, key)),
            None => format!("stage {} of the recorded plan", i + 1),
        },
        Err(_) => path.to_string(),
    }
}

/// The names quoted in backticks in `list` (`` `a`, `b` or `c` ``).
fn backticked(list: &str) -> Vec<&str> {
    list.split('`').skip(1).step_by(2).collect()
}

/// The closest of `names` to `given`: the same word in another case, or
/// one within a small edit distance (Jaro-Winkler, from the strsim crate,
/// which clap uses for the same purpose).
fn closest<'a>(given: &str, names: &[&'a str]) -> Option<&'a str> {
    if let Some(same) = names.iter().find(|n| n.eq_ignore_ascii_case(given)) {
        return Some(same);
    }
    names
        .iter()
        .map(|n| (strsim::jaro_winkler(given, n), *n))
        .filter(|(score, _)| *score > 0.8)
        .max_by(|a, b| a.0.total_cmp(&b.0))
        .map(|(_, n)| n)
}

/// `; did you mean X?` when one of `names` is close to `given`.
fn did_you_mean(given: &str, names: &[&str]) -> String {
    closest(given, names).map_or(String::new(), |n| format!("; did you mean {n}?"))
}

/// A found value as serde_yaml describes it, in words: `sequence` is a
/// list, `string "x"` the text 'x', `floating point `12.5`` 12.5.
fn found_words(found: &str) -> String {
    let inner = |s: &str| {
        s.split_once('`')
            .and_then(|(_, r)| r.rsplit_once('`'))
            .map(|(v, _)| v.to_string())
    };
    if found == "sequence" {
        "a list".into()
    } else if found == "map" {
        "a mapping of keys".into()
    } else if found == "unit value" {
        "nothing".into()
    } else if let Some(text) = found.strip_prefix("string ") {
        let text = text.trim_matches('"');
        let short: String = text.chars().take(40).collect();
        let more = if text.chars().count() > 40 { "..." } else { "" };
        format!("the text '{short}{more}'")
    } else if let Some(v) = inner(found) {
        v
    } else {
        found.to_string()
    }
}

/// What a value of the type serde_yaml `expected` must be, in words, for
/// the field `field`.
fn expected_words(expected: &str, field: &str, found: &str) -> String {
    let key = field.rsplit(['.', ' ']).next().unwrap_or(field);
    let example = match key {
        "schema" => "1",
        "lot_size" => "3000",
        "stage_count" => "3",
        "truncation" | "final_acceptance" | "accept" | "reject" => "4",
        _ => "50",
    };
    let integer = found.starts_with("integer");
    match expected {
        "u64" | "u32" if integer => format!(
            "a whole number from 0 to {}",
            if expected == "u64" {
                u64::MAX.to_string()
            } else {
                u32::MAX.to_string()
            }
        ),
        "u64" | "u32" => {
            format!("a whole number such as {example} (digits only, no thousands separator)")
        }
        "f64" => "a number such as 0.5 (with a decimal point)".into(),
        "a string" => "text (in quotes if it would otherwise read as a number or a list)".into(),
        "a sequence" => "a list (one line for each item, starting with '- ')".into(),
        "a boolean" => "true or false".into(),
        e if e.starts_with("a fraction") => {
            "a fraction such as 0.01 or a percent such as \"1%\"".into()
        }
        "struct PointSource" => format!(
            "a mapping of quality: and risk:, each on its own line, indented below {field}:"
        ),
        e if e.starts_with("struct ") || e.starts_with("a map") => {
            "a mapping of keys, each on its own line below it and indented".into()
        }
        other => other.to_string(),
    }
}

/// The message for one class of serde_yaml error.
fn say(path: Option<&str>, core: &str, text: &str, file: &Path, line: Option<usize>) -> Said {
    let field = path.map(field_name);
    let subject = field.clone().unwrap_or_else(|| "the source".into());
    if let Some(rest) = core
        .strip_prefix("invalid type: ")
        .or_else(|| core.strip_prefix("invalid value: "))
    {
        let (found, expected) = rest.split_once(", expected ").unwrap_or((rest, ""));
        if path.is_none() && expected.starts_with("struct PlanSource") {
            return format!(
                "a plan source is a YAML mapping of keys ({SOURCE_KEYS}, each at the start of a line); this file is {}; start from a template: lotsman new binomial",
                found_words(found)
            )
            .into();
        }
        return format!(
            "{subject} must be {}, not {}",
            expected_words(expected, &subject, found),
            found_words(found)
        )
        .into();
    }
    if let Some(rest) = core.strip_prefix("unknown variant `") {
        let (given, list) = rest.split_once('`').unwrap_or((rest, ""));
        let names = backticked(list);
        return format!(
            "{subject} must be one of {}, not '{given}'{}",
            names.join(", "),
            did_you_mean(given, &names)
        )
        .into();
    }
    if let Some(rest) = core.strip_prefix("unknown field `") {
        let (given, list) = rest.split_once('`').unwrap_or((rest, ""));
        let names = backticked(list);
        let place = match &field {
            Some(f) => format!("under {f}"),
            None => "of a plan source".into(),
        };
        // The nearest key when one is near, else every key there is.
        let hint = match closest(given, &names) {
            Some(n) => format!("; did you mean {n}?"),
            None if names.is_empty() => String::new(),
            None => format!("; the keys there are {}", names.join(", ")),
        };
        return format!("'{given}' is not a key {place}{hint}").into();
    }
    if let Some(rest) = core.strip_prefix("missing field `") {
        let key = rest.split('`').next().unwrap_or(rest);
        return Said {
            line: if path.is_none() {
                Line::Whole
            } else {
                Line::Reported
            },
            text: missing(field.as_deref(), key, file),
        };
    }
    if let Some(rest) = core.strip_prefix("duplicate field `") {
        let key = rest.split('`').next().unwrap_or(rest);
        let again = repeated_keys(text)
            .into_iter()
            .find(|&(_, k)| k == key)
            .map(|(l, _)| l);
        let within = field.map_or(String::new(), |f| format!(" under {f}"));
        return Said {
            line: again.map_or(Line::Reported, Line::At),
            text: format!("{key}: is given twice{within}, and a key may appear once; keep one"),
        };
    }
    match (path, core.strip_prefix("value ")) {
        // The reader of qualities and risks names the value `value`.
        (Some(_), Some(rest)) => format!("{subject} {rest}").into(),
        (Some(_), None) => format!("{subject}: {core}").into(),
        (None, _) => scanner(core, text, line),
    }
}

/// A key the source lacks: what it holds and where it goes.
fn missing(field: Option<&str>, key: &str, file: &Path) -> String {
    match field {
        None => {
            let what = match key {
                "schema" => "schema: 1 (the version of the layout)",
                "title" => "title: the plan's name",
                "scheme" => {
                    "scheme: single, double, multiple, sequential, variables, rectifying or standard"
                }
                "model" => "model: binomial, hypergeometric or poisson",
                "producer" => {
                    "producer: with quality: (the AQL) and risk: (alpha) indented below it"
                }
                "consumer" => {
                    "consumer: with quality: (the RQL) and risk: (beta) indented below it"
                }
                _ => "it",
            };
            format!(
                "the source has no {key}: line; add {what} (a complete source: lotsman new binomial)"
            )
        }
        Some("plan") | Some("plan.sequential") | Some("plan.variables") => format!(
            "the recorded plan has no {key}:; the plan: section is written by the tool: delete it and solve the source again with: lotsman design {} --in-place",
            crate::plain::shell_path(file)
        ),
        Some(f) if f.starts_with("plan.") => format!(
            "{f} has no {key}:; the plan: section is written by the tool: delete it and solve the source again with: lotsman design {} --in-place",
            crate::plain::shell_path(file)
        ),
        Some(f) => {
            let what = match key {
                "quality" if f == "producer" => " (the AQL, e.g. quality: 1%)",
                "quality" if f == "consumer" => " (the RQL, e.g. quality: 6%)",
                "risk" if f == "producer" => " (alpha, e.g. risk: 0.05)",
                "risk" if f == "consumer" => " (beta, e.g. risk: 0.10)",
                "sigma" => " (known or unknown)",
                "limit" => " (lower, upper or both)",
                _ => "",
            };
            format!("{f} has no {key}:{what}; add it, indented below {f}:")
        }
    }
}

/// The scanner's and parser's refusals: the text does not read as YAML.
fn scanner(core: &str, text: &str, line: Option<usize>) -> Said {
    // A tab in the indentation shows as several scanner errors; it is
    // named whatever the scanner made of it.
    let upto = line.unwrap_or(usize::MAX);
    let tab = text
        .lines()
        .enumerate()
        .take(upto)
        .find(|(_, l)| {
            l.chars()
                .take_while(|ch| ch.is_whitespace())
                .any(|ch| ch == '\t')
        })
        .map(|(i, _)| i + 1);
    if let Some(at) = tab {
        return Said {
            line: Line::At(at),
            text: "YAML indents with spaces, not tabs: replace the tab at the start of this line with spaces".into(),
        };
    }
    let text_of = |s: &str| -> Said { s.to_string().into() };
    if core.starts_with("mapping values are not allowed") {
        return text_of(
            "a 'key: value' here does not line up with the keys above it: check the indentation of this line (or put a value that holds ': ' in quotes)",
        );
    }
    if core.starts_with("did not find expected key") {
        return text_of("this line does not line up with the keys above it: check its indentation");
    }
    if core.starts_with("did not find expected ',' or") {
        return text_of(
            "a bracket [ or { opened above is not closed where the values end: close it, or write the values one per line",
        );
    }
    if core.starts_with("found unexpected end of stream") {
        return text_of(
            "the file ends inside a quoted text or a bracket: close the quote or bracket that is open",
        );
    }
    if core.starts_with("unknown anchor") {
        return text_of(
            "an alias (*name) names no anchor (&name) given before it; a plan source needs neither: write the value itself",
        );
    }
    if core.starts_with("control characters are not allowed") {
        let at = text
            .lines()
            .position(|l| l.chars().any(|ch| ch.is_control() && ch != '\t'))
            .map(|i| i + 1);
        return Said {
            line: at.map_or(Line::Reported, Line::At),
            text: "the text holds a control character, which a plan source may not: delete it (a plan source is plain text)".into(),
        };
    }
    if core.starts_with("deserializing from YAML containing more than one document") {
        return text_of(
            "the file holds more than one YAML document (a line '---' starts each); a plan source is one document: keep one",
        );
    }
    if core.contains("recursion limit exceeded") || core.contains("repetition limit exceeded") {
        return text_of(
            "the YAML nests or repeats values too deeply for a plan source (see: lotsman new binomial)",
        );
    }
    // Any other scanner refusal: said as the scanner says it, without its
    // internal state.
    let what = core.split(", while ").next().unwrap_or(core);
    format!("the text does not read as YAML here ({what}); compare it with a template: lotsman new binomial").into()
}

#[cfg(test)]
mod tests {
    use super::*;

    /// serde_yaml's wording that must never reach a user.
    const SERDE_WORDS: [&str; 9] = [
        "invalid type",
        "invalid value",
        "expected struct",
        "unknown variant",
        "unknown field",
        "missing field",
        "duplicate field",
        "u64",
        "`",
    ];

    fn said(text: &str) -> String {
        let e = serde_yaml::from_str::<crate::PlanSource>(text).unwrap_err();
        plain_yaml_error(&e, text, Path::new("s.yaml"))
    }

    const BASE: &str = "schema: 1\ntitle: T\nscheme: single\nmodel: binomial\nproducer:\n  quality: 0.01\n  risk: 0.05\nconsumer:\n  quality: 0.06\n  risk: 0.1\n";

    #[test]
    fn each_class_is_said_in_words_with_its_line() {
        let cases = [
            (
                "- schema: 1\n- title: T\n",
                "a plan source is a YAML mapping of keys (schema:, title:, scheme:, model:, producer:, consumer:, ..., each at the start of a line); this file is a list",
            ),
            (
                "just a sentence\n",
                "this file is the text 'just a sentence'",
            ),
            (
                &BASE.replace("model: binomial", "model: hypergeometric\nlot_size: 12.5"),
                "line 5: lot_size must be a whole number such as 3000 (digits only, no thousands separator), not 12.5",
            ),
            (
                &BASE.replace("model: binomial", "model: hypergeometric\nlot_size: 3,000"),
                "lot_size must be a whole number such as 3000 (digits only, no thousands separator), not the text '3,000'",
            ),
            (
                &BASE.replace("scheme: single", "scheme: Single"),
                "line 3: scheme must be one of single, double, multiple, sequential, variables, rectifying, standard, not 'Single'; did you mean single?",
            ),
            (
                &BASE.replace("model:", "modell:"),
                "line 4: 'modell' is not a key of a plan source; did you mean model?",
            ),
            (
                &BASE.replace("  risk: 0.05\n", ""),
                "producer has no risk: (alpha, e.g. risk: 0.05); add it, indented below producer:",
            ),
            (
                "schema: 1\n\ttitle: T\n",
                "line 2: YAML indents with spaces, not tabs",
            ),
            (
                &BASE.replace("title: T", "title: T\ntitle: U"),
                "line 3: title: is given twice, and a key may appear once; keep one",
            ),
            (
                &format!(
                    "{BASE}plan:\n  stages:\n  - n: ten\n    accept: 1\n    reject: 2\n  producer_risk: 0.1\n  consumer_risk: 0.1\n  solved_by: hand\n"
                ),
                "line 13: stage 1 n of the recorded plan must be a whole number",
            ),
        ];
        for (text, want) in cases {
            let got = said(text);
            assert!(got.contains(want), "{got}\n  wanted {want}");
            for word in SERDE_WORDS {
                assert!(!got.contains(word), "{got} contains {word}");
            }
        }
    }

    #[test]
    fn the_nearest_name_is_offered() {
        let names = ["single", "double", "multiple", "sequential", "variables"];
        assert_eq!(closest("Single", &names), Some("single"));
        assert_eq!(closest("dubble", &names), Some("double"));
        assert_eq!(closest("zzz", &names), None);
    }
}
