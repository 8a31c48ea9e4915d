//! The sheet of a standard-indexed plan source (`scheme: standard`): its
//! document fields and the tables' plans for the index it records, as
//! [`StandardFacts`], so that `sheet`, the demo and a batch print it like
//! any other source.
//!
//! The sheet prints the plans the tables give for the recorded index.
//! The `sheet` command audits the source first (the recorded plans must
//! be the tables' plans), so they are the recorded ones; a source whose
//! recorded plans differ is never printed "as recorded", since the page
//! would show the tables' numbers under a notice about other numbers.

use std::path::Path;

use super::metadata::source_hash;
use super::standard_facts::{SheetDocument, StandardFacts};
use crate::input::InputError;
use crate::source::{Error, PlanSource};
use crate::standard::assess;

/// The facts of the standard-indexed `source` (parsed from `text`), read
/// from the file `file_name` as the sheet prints it; a table of the
/// user's own is read beside that file.
///
/// # Errors
/// [`Error`] when the source's index is invalid, a table of the user's
/// own is missing or has changed, or the tables give no plan.
pub(crate) fn standard_source_facts(
    source: &PlanSource,
    text: &str,
    file_name: &str,
) -> Result<StandardFacts, Error> {
    let request = source.standard_request()?;
    let tables = source.standard_tables(Path::new(file_name))?;
    let assessment = assess(&request.request, &tables, None, request.consumer)?;
    let document = SheetDocument {
        title: source.title.clone(),
        item: source.item.clone(),
        characteristic: source.characteristic.clone(),
        id: source.id.clone(),
        revision: source.revision.clone(),
        date: source.date.clone(),
        prepared_by: source.prepared_by.clone(),
        approved_by: source.approved_by.clone(),
        file_name: file_name.to_string(),
        source_sha256: source_hash(text),
        regenerate: format!("lotsman sheet {file_name} --force"),
    };
    Ok(StandardFacts::from_assessment(
        document,
        &assessment,
        &tables,
    )?)
}

/// The refusal of a standard-indexed source whose recorded plans the
/// audit does not confirm.
pub(crate) fn not_as_recorded(source: &PlanSource) -> Error {
    InputError::Inconsistent(format!(
        "the source '{}' is standard-indexed and its recorded plans differ from the tables' (see lotsman verify); its sheet prints the tables' plans, so record them first with: lotsman design FILE --in-place",
        source.title
    ))
    .into()
}
