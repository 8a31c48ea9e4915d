//! Reading a table file's text: comma-separated values with `#` comment
//! lines, the shape every table file of `data/standard/` shares. The
//! records come with their line numbers, so that each fault can be named
//! by file, line and column.

use super::error::StandardError;

/// A table file read into its head comments, its header and its records.
pub(crate) struct CsvText {
    /// The file's name, for messages.
    pub file: String,
    /// The comment lines before the header, without their `#`.
    pub head: Vec<String>,
    /// The column names.
    pub header: Vec<String>,
    /// Each record with its line number (counted from 1).
    pub records: Vec<(u64, Vec<String>)>,
}

impl CsvText {
    /// Reads `text`; every record must have as many fields as the header.
    ///
    /// # Errors
    /// [`StandardError::TableFile`] for text that is not comma-separated
    /// values, a file without a header, or a record of the wrong length.
    pub fn read(file: &str, text: &str) -> Result<CsvText, StandardError> {
        let text = text.strip_prefix('\u{feff}').unwrap_or(text);
        let head = text
            .lines()
            .take_while(|l| l.trim_start().starts_with('#') || l.trim().is_empty())
            .filter_map(|l| l.trim_start().strip_prefix('#'))
            .map(|l| l.trim().to_string())
            .collect();
        let mut reader = csv::ReaderBuilder::new()
            .comment(Some(b'#'))
            .has_headers(false)
            .flexible(true)
            .trim(csv::Trim::All)
            .from_reader(text.as_bytes());
        let mut header: Option<Vec<String>> = None;
        let mut records = Vec::new();
        for result in reader.records() {
            let record = result.map_err(|e| StandardError::TableFile {
                file: file.to_string(),
                line: e.position().map(|p| line_at(text, p.byte())),
                column: None,
                reason: "this is not comma-separated text (look for an unclosed quote)".to_string(),
            })?;
            let line = record.position().map_or(0, |p| line_at(text, p.byte()));
            let fields: Vec<String> = record.iter().map(str::to_string).collect();
            if fields.iter().all(String::is_empty) {
                continue;
            }
            match &header {
                None => header = Some(fields),
                Some(h) if fields.len() != h.len() => {
                    return Err(StandardError::TableFile {
                        file: file.to_string(),
                        line: Some(line),
                        column: None,
                        reason: format!(
                            "the line has {} fields but the header has {}; every line needs one field per column (an empty field stays between its commas)",
                            fields.len(),
                            h.len()
                        ),
                    });
                }
                Some(_) => records.push((line, fields)),
            }
        }
        let Some(header) = header else {
            return Err(StandardError::TableFile {
                file: file.to_string(),
                line: None,
                column: None,
                reason: "the file holds no header line and no rows".to_string(),
            });
        };
        Ok(CsvText {
            file: file.to_string(),
            head,
            header,
            records,
        })
    }

    /// The fault at `line`, in the column `column` (an index into the
    /// header), for `reason`.
    pub fn fault(&self, line: u64, column: Option<usize>, reason: String) -> StandardError {
        StandardError::TableFile {
            file: self.file.clone(),
            line: Some(line),
            column: column.and_then(|c| self.header.get(c).cloned()),
            reason,
        }
    }

    /// The fault of the file as a whole (its header, its set of rows).
    pub fn file_fault(&self, reason: String) -> StandardError {
        StandardError::TableFile {
            file: self.file.clone(),
            line: None,
            column: None,
            reason,
        }
    }

    /// The first head comment, which names the table's source.
    pub fn source(&self) -> String {
        self.head.first().cloned().unwrap_or_default()
    }
}

/// The line (counted from 1) of the record the reader places at byte
/// `offset` of `text`. The reader's own line count, and its offset, may
/// stand on the blank or comment lines it skipped before the record: move
/// past them (a record's line never starts with `#`).
fn line_at(text: &str, offset: u64) -> u64 {
    let mut start = usize::try_from(offset).map_or(text.len(), |o| o.min(text.len()));
    while let Some(rest) = text.get(start..) {
        let line = rest.split('\n').next().unwrap_or("");
        let skipped = line.trim().is_empty() || line.trim_start().starts_with('#');
        if !skipped || line.len() == rest.len() {
            break;
        }
        start += line.len() + 1;
    }
    text.as_bytes()[..start]
        .iter()
        .filter(|&&b| b == b'\n')
        .count() as u64
        + 1
}

/// Reads a whole number field of a table file.
pub(crate) fn count(text: &str) -> Option<u64> {
    if text.is_empty() || !text.chars().all(|c| c.is_ascii_digit()) {
        return None;
    }
    text.parse().ok()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn comments_blank_lines_and_lines_are_kept_apart() {
        let t = CsvText::read("t.csv", "# source: x\n# more\na,b\n\n1,2\n# note\n3,4\n").unwrap();
        assert_eq!(t.head, vec!["source: x", "more"]);
        assert_eq!(t.header, vec!["a", "b"]);
        assert_eq!(t.records[0].0, 5);
        assert_eq!(t.records[1], (7, vec!["3".to_string(), "4".to_string()]));
    }

    #[test]
    fn a_short_line_is_named() {
        let e = CsvText::read("t.csv", "a,b\n1,2\n3\n").err().unwrap();
        assert_eq!(
            e.to_string(),
            "t.csv, line 3: the line has 1 fields but the header has 2; every line needs one field per column (an empty field stays between its commas)"
        );
        assert!(CsvText::read("t.csv", "# only\n").is_err());
    }
}
