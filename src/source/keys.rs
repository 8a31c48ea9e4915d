//! Where a key of a plan source is given twice.
//!
//! serde_yaml reports a duplicated field by name, and at the top level
//! without a line, so a source edited by hand (two `title:` lines two
//! screens apart) leaves its reader searching. This scan of the block
//! mappings finds the line of each repetition to add to that message.

/// One block mapping open at the current line: the column of its keys and
/// the keys given so far.
struct Mapping<'a> {
    indent: usize,
    keys: Vec<&'a str>,
}

/// Every key that repeats one given earlier in the same block mapping, as
/// (1-based line, key), in the order of the text.
///
/// Only block style is followed, the style the tool writes and its
/// templates use: `key: value` lines, nested by indentation, and list items
/// (`- key: value`), each of which opens a mapping of its own. Block
/// scalars (`notes: |`) are skipped; flow collections and quoted keys are
/// not looked into. The scan only adds a line to serde_yaml's refusal, so
/// a style it does not follow costs the line, never a wrong refusal.
pub(crate) fn repeated_keys(text: &str) -> Vec<(usize, &str)> {
    let mut open: Vec<Mapping> = Vec::new();
    // The column of the key whose block scalar is being skipped.
    let mut scalar_of: Option<usize> = None;
    let mut repeated = Vec::new();
    for (i, line) in text.lines().enumerate() {
        let body = line.trim_start_matches(' ');
        let mut indent = line.len() - body.len();
        let body = body.trim_end();
        if body.is_empty() || body.starts_with('#') {
            continue;
        }
        if let Some(column) = scalar_of {
            if indent > column {
                continue;
            }
            scalar_of = None;
        }
        let (body, item) = match body.strip_prefix("- ") {
            Some(rest) => {
                let rest_body = rest.trim_start_matches(' ');
                indent += 2 + rest.len() - rest_body.len();
                (rest_body, true)
            }
            None => (body, false),
        };
        let Some((key, value)) = plain_key(body) else {
            continue;
        };
        // Close the mappings this line is outside of; a list item also
        // closes the previous item's mapping at its own column.
        while open
            .last()
            .is_some_and(|m| m.indent > indent || (item && m.indent == indent))
        {
            open.pop();
        }
        match open.last_mut() {
            Some(m) if m.indent == indent => {
                if m.keys.contains(&key) {
                    repeated.push((i + 1, key));
                } else {
                    m.keys.push(key);
                }
            }
            _ => open.push(Mapping {
                indent,
                keys: vec![key],
            }),
        }
        if value.starts_with('|') || value.starts_with('>') {
            scalar_of = Some(indent);
        }
    }
    repeated
}

/// The plain key of a `key: value` (or `key:`) line and its value, trimmed.
fn plain_key(body: &str) -> Option<(&str, &str)> {
    let end = body.find(':')?;
    let (key, rest) = (&body[..end], &body[end + 1..]);
    let plain = !key.is_empty()
        && key
            .chars()
            .all(|ch| ch.is_ascii_alphanumeric() || ch == '_' || ch == '-');
    let separated = rest.is_empty() || rest.starts_with(' ');
    (plain && separated).then(|| (key, rest.trim()))
}

#[cfg(test)]
mod tests {
    use super::repeated_keys;

    #[test]
    fn a_repeated_top_level_key_is_found_on_its_second_line() {
        let text = "schema: 1\ntitle: a\nscheme: single\n\ntitle: b\n";
        assert_eq!(repeated_keys(text), vec![(5, "title")]);
    }

    #[test]
    fn nested_mappings_and_list_items_keep_their_own_keys() {
        // `quality` and `risk` under two parents, `n` in two list items:
        // no repetition; then `risk` twice under `consumer`.
        let text = "\
producer:
  quality: 0.01
  risk: 0.05
consumer:
  quality: 0.06
  risk: 0.1
plan:
  stages:
  - n: 36
    accept: 2
  -   n: 72
      accept: 5
consumer2:
  risk: 0.1
  # risk: 0.2
  risk: 0.2
";
        assert_eq!(repeated_keys(text), vec![(16, "risk")]);
    }

    #[test]
    fn block_scalars_and_values_with_colons_are_not_keys() {
        let text = "\
notes: |
  title: this is prose
  title: and so is this
title: x
url: 'http://a.example:80'
time: 12:30
";
        assert!(repeated_keys(text).is_empty());
        let repeated = format!("{text}notes: again\n");
        assert_eq!(repeated_keys(&repeated), vec![(7, "notes")]);
    }
}
