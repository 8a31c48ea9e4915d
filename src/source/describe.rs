//! What a plan is for, as `design` takes it from its flags: the document
//! fields of a plan source (identifier, revision, date, item,
//! characteristic, who prepared and who approved it), so that a sheet
//! printed straight from a design is ready to sign.

use super::load::check_date;
use super::schema::PlanSource;
use crate::input::InputError;

/// The document fields of a plan source, each under the YAML key of the
/// same name; `None` leaves a field as it is.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct Description {
    /// Plan identifier (document number), `id`.
    pub id: Option<String>,
    /// Revision, `revision`.
    pub revision: Option<String>,
    /// Date of the revision, `YYYY-MM-DD`, `date`.
    pub date: Option<String>,
    /// The item inspected, `item`.
    pub item: Option<String>,
    /// The characteristic inspected, `characteristic`.
    pub characteristic: Option<String>,
    /// Who prepared the plan, `prepared_by`.
    pub prepared_by: Option<String>,
    /// Who approved it, `approved_by`.
    pub approved_by: Option<String>,
}

impl PlanSource {
    /// Records `description` in the source, each text checked first; the
    /// flag names of `design` (`--id`, `--prepared-by`, ...) name a text
    /// in the messages.
    ///
    /// ```
    /// use lotsman::{Description, PlanSource};
    /// let mut source = PlanSource::load(std::path::Path::new("plans/tpw-cover-fit.yaml")).unwrap();
    /// let bad = Description { date: Some("2026-02-30".into()), ..Description::default() };
    /// assert!(source.describe(bad).unwrap_err().to_string().contains("--date"));
    /// let good = Description { revision: Some("D".into()), ..Description::default() };
    /// source.describe(good).unwrap();
    /// assert_eq!(source.revision.as_deref(), Some("D"));
    /// ```
    ///
    /// # Errors
    /// [`InputError`] for an empty text, a text with a control character
    /// (a tab, a line break), or a date that is not a `YYYY-MM-DD` date of
    /// the calendar; nothing is recorded then.
    pub fn describe(&mut self, description: Description) -> Result<(), InputError> {
        let Description {
            id,
            revision,
            date,
            item,
            characteristic,
            prepared_by,
            approved_by,
        } = description;
        let fields = [
            ("--id", id, &mut self.id),
            ("--revision", revision, &mut self.revision),
            ("--date", date, &mut self.date),
            ("--item", item, &mut self.item),
            ("--characteristic", characteristic, &mut self.characteristic),
            ("--prepared-by", prepared_by, &mut self.prepared_by),
            ("--approved-by", approved_by, &mut self.approved_by),
        ];
        let mut checked = Vec::new();
        for (flag, value, slot) in fields {
            if let Some(text) = value {
                check_text(flag, &text)?;
                if flag == "--date" {
                    check_date(flag, &text)?;
                }
                checked.push((slot, text));
            }
        }
        for (slot, text) in checked {
            *slot = Some(text);
        }
        Ok(())
    }
}

/// A document field's text: not blank, and on one line of printable
/// characters (the sheet prints it as a paragraph).
fn check_text(flag: &str, text: &str) -> Result<(), InputError> {
    if text.trim().is_empty() {
        return Err(InputError::out_of_range(
            flag,
            "''",
            "a text, not empty (leave the flag out to leave the field out)",
        ));
    }
    if let Some(ch) = text.chars().find(|ch| ch.is_control()) {
        return Err(InputError::Inconsistent(format!(
            "{flag} holds a control character (U+{:04X}); give the text on one line, without tabs",
            ch as u32
        )));
    }
    Ok(())
}
