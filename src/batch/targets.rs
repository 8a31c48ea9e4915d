//! Where each sheet of a batch goes, and the refusal of a sheet that would
//! replace another sheet of the same run.

use std::collections::HashMap;
use std::fs;
use std::path::{Path, PathBuf};

use super::SourceFile;
use crate::batch::BatchError;

/// The PDF of `source`: beside it with the extension `.pdf`, or with
/// `output_dir` in the folder, below it at the path the source had below
/// the folder it was found in (a file named directly goes straight into
/// `output_dir`).
///
/// ```
/// use std::path::{Path, PathBuf};
/// use lotsman::{SourceFile, sheet_target};
/// let found = SourceFile { path: "plans/east/seal.yaml".into(), below: Some("east/seal.yaml".into()) };
/// assert_eq!(sheet_target(&found, None), PathBuf::from("plans/east/seal.pdf"));
/// assert_eq!(sheet_target(&found, Some(Path::new("out"))), PathBuf::from("out/east/seal.pdf"));
/// let named = SourceFile { path: "plans/east/seal.yaml".into(), below: None };
/// assert_eq!(sheet_target(&named, Some(Path::new("out"))), PathBuf::from("out/seal.pdf"));
/// ```
pub fn sheet_target(source: &SourceFile, output_dir: Option<&Path>) -> PathBuf {
    match output_dir {
        None => source.path.with_extension("pdf"),
        Some(dir) => {
            let name = match &source.below {
                Some(below) => below.clone(),
                None => PathBuf::from(source.path.file_name().unwrap_or_default()),
            };
            dir.join(name).with_extension("pdf")
        }
    }
}

/// Each source of a batch with its PDF (see [`sheet_target`]), in order.
/// An invalid entry stays invalid. When a later source would write the
/// PDF of an earlier one (`a.yaml` and `a.yml` in one folder, or two files
/// of the same name sent to one `output_dir`), the earlier keeps it and the
/// later one becomes [`BatchError::SheetCollision`]: a run never replaces
/// a sheet it wrote itself.
///
/// Two targets are the same when they name the same file once links and
/// `.`/`..` are resolved as far as the folders exist; a file system that
/// ignores case is not taken into account.
pub fn sheet_targets(
    found: Vec<Result<SourceFile, BatchError>>,
    output_dir: Option<&Path>,
) -> Vec<Result<(SourceFile, PathBuf), BatchError>> {
    let mut owners: HashMap<PathBuf, PathBuf> = HashMap::new();
    found
        .into_iter()
        .map(|entry| {
            let source = entry?;
            let target = sheet_target(&source, output_dir);
            if let Some(first) = owners.get(&resolved(&target)) {
                return Err(BatchError::SheetCollision {
                    path: source.path,
                    target,
                    first: first.clone(),
                });
            }
            owners.insert(resolved(&target), source.path.clone());
            Ok((source, target))
        })
        .collect()
}

/// `path` with its deepest existing folder resolved (links, `.` and `..`)
/// and the rest appended; the path itself when nothing of it exists.
fn resolved(path: &Path) -> PathBuf {
    let mut rest = Vec::new();
    let mut cur = path;
    loop {
        let probe = if cur.as_os_str().is_empty() {
            Path::new(".")
        } else {
            cur
        };
        if let Ok(real) = fs::canonicalize(probe) {
            return rest.iter().rev().fold(real, |acc, name| acc.join(name));
        }
        match (cur.parent(), cur.file_name()) {
            (Some(parent), Some(name)) => {
                rest.push(name);
                cur = parent;
            }
            _ => return path.to_path_buf(),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::batch::expand_paths;
    use crate::batch::paths::tests::touch;

    #[test]
    fn nested_sources_of_one_name_keep_apart_in_the_output_folder() {
        let dir = tempfile::tempdir().unwrap();
        touch(
            dir.path(),
            &["in/a.yaml", "in/east/a.yaml", "in/west/a.yaml"],
        );
        let out = dir.path().join("out");
        let targets = sheet_targets(expand_paths(&[dir.path().join("in")]), Some(&out));
        let got: Vec<PathBuf> = targets.into_iter().map(|t| t.unwrap().1).collect();
        assert_eq!(
            got,
            [
                out.join("a.pdf"),
                out.join("east/a.pdf"),
                out.join("west/a.pdf")
            ]
        );
    }

    #[test]
    fn a_second_source_for_one_pdf_is_refused_and_the_first_keeps_it() {
        let dir = tempfile::tempdir().unwrap();
        touch(
            dir.path(),
            &["east/a.yaml", "west/a.yaml", "x.yaml", "x.yml"],
        );
        let out = dir.path().join("out");
        let named = [
            dir.path().join("east/a.yaml"),
            dir.path().join("west/a.yaml"),
        ];
        let targets = sheet_targets(expand_paths(&named), Some(&out));
        assert_eq!(targets[0].as_ref().unwrap().1, out.join("a.pdf"));
        let refused = targets[1].as_ref().unwrap_err();
        assert!(matches!(
            refused,
            BatchError::SheetCollision { first, .. } if first == &named[0]
        ));
        assert!(refused.to_string().contains("west/a.yaml"));
        // Beside the sources, x.yaml and x.yml would both be x.pdf.
        let beside = sheet_targets(
            expand_paths(&[dir.path().join("x.yaml"), dir.path().join("x.yml")]),
            None,
        );
        assert!(beside[0].is_ok());
        assert!(matches!(beside[1], Err(BatchError::SheetCollision { .. })));
    }

    #[test]
    fn targets_spelled_differently_are_the_same_file() {
        let dir = tempfile::tempdir().unwrap();
        touch(dir.path(), &["a/p.yaml", "b/p.yaml"]);
        let out = dir.path().join("out");
        let other_spelling = dir.path().join("a").join("..").join("out");
        let first = sheet_targets(expand_paths(&[dir.path().join("a/p.yaml")]), Some(&out));
        let key = resolved(&first[0].as_ref().unwrap().1);
        let second = sheet_target(
            &SourceFile {
                path: dir.path().join("b/p.yaml"),
                below: None,
            },
            Some(&other_spelling),
        );
        assert_ne!(second, first[0].as_ref().unwrap().1);
        assert_eq!(resolved(&second), key);
    }

    #[test]
    fn invalid_entries_stay_invalid_in_place() {
        let dir = tempfile::tempdir().unwrap();
        touch(dir.path(), &["a.yaml"]);
        let paths = [dir.path().join("gone.yaml"), dir.path().join("a.yaml")];
        let targets = sheet_targets(expand_paths(&paths), None);
        assert!(matches!(targets[0], Err(BatchError::Missing { .. })));
        assert_eq!(targets[1].as_ref().unwrap().1, dir.path().join("a.pdf"));
    }
}
