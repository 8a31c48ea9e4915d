//! Property tests of issue 14's promises: what the YAML reader refuses is
//! said in plain words (never serde's), what is echoed is escaped, and a
//! measurements file is read exactly or refused, never misread.

use lotsman::{PlanSource, escape_controls, is_unsafe_char, parse_measurements};
use proptest::prelude::*;

/// serde's, serde_yaml's and the system's wording, which a message must
/// have said in words instead.
const LIBRARY_WORDS: [&str; 13] = [
    "invalid type",
    "invalid value",
    "expected struct",
    "unknown variant",
    "unknown field",
    "missing field",
    "duplicate field",
    "u64",
    "u32",
    "f64",
    "`",
    "os error",
    "while scanning",
];

/// Values a hand-edited source may hold where another belongs.
const TOKENS: [&str; 22] = [
    "",
    "[1, 2]",
    "{a: 1}",
    "'text'",
    "-5",
    "1e999",
    "3,000",
    "12.5",
    "yes",
    "~",
    "*x",
    "&a b",
    "\"open",
    "Single",
    "POISSON",
    "2026-13-01",
    "- 1",
    "0x10",
    "!!binary aGk=",
    "|",
    "1%%",
    ".nan",
];

/// One edit of a valid source, as a hand or a bad export makes it.
#[derive(Clone, Debug)]
enum Edit {
    /// The value on line `line` (modulo the count) becomes a token.
    Value(usize, usize),
    /// The key on line `line` gets a character more.
    Key(usize, char),
    /// Line `line` is removed.
    Drop(usize),
    /// Line `line` is given twice.
    Twice(usize),
    /// Line `line` starts with a tab.
    Tab(usize),
    /// The text ends after `at` bytes (on a character boundary).
    Cut(usize),
    /// The whole file is a token.
    Whole(usize),
}

fn edit_strategy() -> impl Strategy<Value = Edit> {
    prop_oneof![
        (0usize..64, 0..TOKENS.len()).prop_map(|(l, t)| Edit::Value(l, t)),
        (
            0usize..64,
            prop::sample::select(vec!['s', 'X', '-', '_', ' '])
        )
            .prop_map(|(l, c)| Edit::Key(l, c)),
        (0usize..64).prop_map(Edit::Drop),
        (0usize..64).prop_map(Edit::Twice),
        (0usize..64).prop_map(Edit::Tab),
        (0usize..4000).prop_map(Edit::Cut),
        (0..TOKENS.len()).prop_map(Edit::Whole),
    ]
}

/// `text` after `edits`.
fn edited(text: &str, edits: &[Edit]) -> String {
    let mut lines: Vec<String> = text.lines().map(str::to_string).collect();
    for edit in edits {
        if lines.is_empty() {
            lines.push(String::new());
        }
        let n = lines.len();
        match *edit {
            Edit::Value(l, t) => {
                let line = &mut lines[l % n];
                if let Some((key, _)) = line.split_once(": ") {
                    *line = format!("{key}: {}", TOKENS[t]);
                }
            }
            Edit::Key(l, c) => {
                let line = &mut lines[l % n];
                if let Some(at) = line.find(':') {
                    line.insert(at, c);
                }
            }
            Edit::Drop(l) => {
                if lines.len() > 1 {
                    lines.remove(l % n);
                }
            }
            Edit::Twice(l) => {
                let line = lines[l % n].clone();
                lines.insert(l % n, line);
            }
            Edit::Tab(l) => lines[l % n].insert(0, '\t'),
            Edit::Cut(at) => {
                let joined = lines.join("\n");
                let mut at = at.min(joined.len());
                while !joined.is_char_boundary(at) {
                    at -= 1;
                }
                lines = joined[..at].lines().map(str::to_string).collect();
            }
            Edit::Whole(t) => lines = vec![TOKENS[t].to_string()],
        }
    }
    lines.join("\n") + "\n"
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(512))]

    /// Whatever a hand does to a source, a refusal is one line in plain
    /// words: no serde type names, no backticks, no scanner states.
    #[test]
    fn the_yaml_readers_refusals_are_plain_words(
        which in 0usize..3,
        edits in prop::collection::vec(edit_strategy(), 1..4),
    ) {
        let file = ["plans/tpw-seal-visual.yaml", "plans/tpw-sleeve-hardness.yaml", "plans/tpw-cover-thickness.yaml"][which];
        let text = edited(&std::fs::read_to_string(file).unwrap(), &edits);
        if let Err(e) = PlanSource::from_yaml(&text, std::path::Path::new("s.yaml")) {
            let message = e.to_string();
            for word in LIBRARY_WORDS {
                prop_assert!(!message.contains(word), "{message:?} has '{word}'\n{text}");
            }
            prop_assert!(!message.contains('\n'), "{message:?}");
        }
    }

    /// Escaping leaves no character that acts on a terminal, and leaves a
    /// text without one as it was.
    #[test]
    fn escaped_text_holds_no_control_character(text in any::<String>()) {
        let shown = escape_controls(&text);
        prop_assert!(!shown.chars().any(is_unsafe_char));
        if !text.chars().any(is_unsafe_char) {
            prop_assert_eq!(shown.as_ref(), text.as_str());
        }
    }

    /// Readings written in any of the line ends spreadsheets use, with or
    /// without a byte-order mark and quotes, are read back exactly.
    #[test]
    fn readings_are_read_back_exactly(
        values in prop::collection::vec(-1000.0f64..1000.0, 2..50),
        end in prop::sample::select(vec!["\n", "\r\n", "\r"]),
        bom in any::<bool>(),
        quoted in any::<bool>(),
    ) {
        let mut text = String::from(if bom { "\u{feff}" } else { "" });
        text.push_str(&format!("unit,reading{end}"));
        for (i, v) in values.iter().enumerate() {
            let cell = if quoted { format!("\"{v}\"") } else { v.to_string() };
            text.push_str(&format!("{},{cell}{end}", i + 1));
        }
        prop_assert_eq!(parse_measurements(&text, Some("reading")), Ok(values));
    }

    /// A reading written with a decimal comma under a named column is
    /// refused with its line, never read as its whole part.
    #[test]
    fn a_decimal_comma_under_a_column_is_refused_with_its_row(
        values in prop::collection::vec(0.001f64..100.0, 2..50),
        pick in any::<prop::sample::Index>(),
    ) {
        let bad = pick.index(values.len());
        let mut text = String::from("unit,reading\n");
        for (i, v) in values.iter().enumerate() {
            let cell = format!("{v:.3}");
            let cell = if i == bad { cell.replace('.', ",") } else { cell };
            text.push_str(&format!("{},{cell}\n", i + 1));
        }
        let e = parse_measurements(&text, Some("reading")).unwrap_err().to_string();
        let row = format!("row {} of the measurements has 3 cells", bad + 2);
        prop_assert!(e.starts_with(&row), "{}", e);
    }
}
