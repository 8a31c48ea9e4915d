//! Writing the sheet of one source of a batch, or of one named on its
//! own, where [`sheet_targets`](super::sheet_targets) placed it.

use std::path::Path;

use crate::fs::refuse_overwriting_input;
use crate::print::{SheetNotes, SheetOptions, write_sheet_text};
use crate::source::{Error, SourceError, SourceText};

/// Writes the sheet of the source read as `source` to `target`
/// ([`write_sheet_text`]), never over the source itself; with
/// `make_folders` (the target lies in an output folder, below which a
/// source found in a folder keeps its subfolders) the target's folders are
/// created first. Returns what the sheet states or still holds, for the
/// warnings.
///
/// ```
/// use lotsman::{Overwrite, Paper, SheetOptions, SourceText, write_source_sheet};
/// let dir = tempfile::tempdir().unwrap();
/// let source = SourceText::read(std::path::Path::new("plans/tpw-seal-visual.yaml")).unwrap();
/// let options = SheetOptions { paper: Paper::A4, accept_recorded: false, overwrite: Overwrite::Refuse };
/// let target = dir.path().join("east/seal.pdf");
/// write_source_sheet(&source, &target, &options, true).unwrap();
/// assert!(target.exists());
/// ```
///
/// # Errors
/// [`Error::Input`] when `target` is the source file; [`SourceError::Io`]
/// when a folder cannot be created; otherwise as [`write_sheet_text`].
pub fn write_source_sheet(
    source: &SourceText,
    target: &Path,
    options: &SheetOptions,
    make_folders: bool,
) -> Result<SheetNotes, Error> {
    refuse_overwriting_input(target, Some(&source.path), false)?;
    if make_folders && let Some(folder) = target.parent() {
        std::fs::create_dir_all(folder).map_err(|e| SourceError::Io {
            path: folder.to_path_buf(),
            source: e,
        })?;
    }
    write_sheet_text(source, target, options)
}
