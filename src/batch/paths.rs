//! From the paths on a command line to the plan sources of a batch.
//!
//! Rules, in the order they apply:
//!
//! - A path that is not a folder is taken as it is, whatever its name: the
//!   user named it, so it is read (and reported if it is not a source).
//! - A folder is searched through all its subfolders for files whose name
//!   ends in `.yaml` or `.yml` (in any case). Entries whose name starts
//!   with `.` are skipped, files and folders alike, so editor back-ups,
//!   version-control folders and the tool's own temporary files are left
//!   alone. Symbolic links are followed; a link back to a folder already
//!   searched is not searched again, so a loop ends.
//! - The files of one folder come sorted by their path below it, compared
//!   name by name (so `a/z.yaml` comes before `a-b.yaml`), which does not
//!   depend on the order the file system lists them in.
//! - A missing path, a folder with no source, and a folder that cannot be
//!   listed each become one invalid entry, in the place the source would
//!   have had.
//! - The same file reached twice (named twice, named and found in a folder,
//!   or through a link) is kept once, at its first place.

use std::collections::HashSet;
use std::fs;
use std::path::{Path, PathBuf};

use crate::batch::BatchError;

/// One plan source of a batch.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct SourceFile {
    /// The file to read: the path as given, or the folder as given joined
    /// with the file's path below it.
    pub path: PathBuf,
    /// For a file found in a folder, its path below that folder (which
    /// `sheet --output-dir` repeats); `None` for a file named directly.
    pub below: Option<PathBuf>,
}

/// The plan sources that `paths` name, in order, with an invalid entry for
/// each path or folder that yields none (see the module documentation for
/// the rules).
///
/// ```
/// use lotsman::expand_paths;
/// let dir = tempfile::tempdir().unwrap();
/// std::fs::create_dir(dir.path().join("sub")).unwrap();
/// for name in ["b.yaml", "a.yml", "sub/c.yaml", "notes.txt", ".hidden.yaml"] {
///     std::fs::write(dir.path().join(name), "").unwrap();
/// }
/// let found = expand_paths(&[dir.path().to_path_buf()]);
/// let names: Vec<_> = found
///     .iter()
///     .map(|f| f.as_ref().unwrap().below.clone().unwrap())
///     .collect();
/// assert_eq!(names, ["a.yml", "b.yaml", "sub/c.yaml"].map(std::path::PathBuf::from));
/// ```
pub fn expand_paths(paths: &[PathBuf]) -> Vec<Result<SourceFile, BatchError>> {
    let mut seen = HashSet::new();
    let mut out = Vec::new();
    for path in paths {
        let entries = match fs::metadata(path) {
            Err(e) => vec![Err(BatchError::Missing {
                path: path.clone(),
                source: e,
            })],
            Ok(meta) if meta.is_dir() => expand_folder(path),
            Ok(_) => vec![Ok(SourceFile {
                path: path.clone(),
                below: None,
            })],
        };
        for entry in entries {
            let key = match &entry {
                Ok(file) => fs::canonicalize(&file.path).unwrap_or_else(|_| file.path.clone()),
                Err(e) => e.path().to_path_buf(),
            };
            if seen.insert(key) {
                out.push(entry);
            }
        }
    }
    out
}

/// The sources below `root`, sorted, or the one entry that says why there
/// are none.
fn expand_folder(root: &Path) -> Vec<Result<SourceFile, BatchError>> {
    let mut found = Vec::new();
    walk(root, Path::new(""), &mut HashSet::new(), &mut found);
    if found.is_empty() {
        return vec![Err(BatchError::EmptyFolder {
            path: root.to_path_buf(),
        })];
    }
    found.sort_by(|a, b| a.0.cmp(&b.0));
    found
        .into_iter()
        .map(|(below, entry)| {
            entry.map(|()| SourceFile {
                path: root.join(&below),
                below: Some(below),
            })
        })
        .collect()
}

/// Appends the sources of the folder `root/below` and of its subfolders,
/// each with its path below `root`; a folder that cannot be listed is
/// appended as an error at its own place.
fn walk(
    root: &Path,
    below: &Path,
    searched: &mut HashSet<PathBuf>,
    found: &mut Vec<(PathBuf, Result<(), BatchError>)>,
) {
    let folder = root.join(below);
    if let Ok(real) = fs::canonicalize(&folder)
        && !searched.insert(real)
    {
        return;
    }
    let unlistable = |source| {
        (
            below.to_path_buf(),
            Err(BatchError::Unlistable {
                path: folder.clone(),
                source,
            }),
        )
    };
    let entries = match fs::read_dir(&folder) {
        Ok(entries) => entries,
        Err(e) => return found.push(unlistable(e)),
    };
    for entry in entries {
        let entry = match entry {
            Ok(entry) => entry,
            Err(e) => {
                found.push(unlistable(e));
                continue;
            }
        };
        let name = entry.file_name();
        if name.as_encoded_bytes().starts_with(b".") {
            continue;
        }
        let relative = below.join(&name);
        // A link is judged by what it points to; a broken link with a
        // source's name is kept, so that reading it reports the break.
        let is_folder = match entry.file_type() {
            Ok(t) if t.is_symlink() => fs::metadata(entry.path()).is_ok_and(|m| m.is_dir()),
            Ok(t) => t.is_dir(),
            Err(_) => false,
        };
        if is_folder {
            walk(root, &relative, searched, found);
        } else if is_source_name(Path::new(&name)) {
            found.push((relative, Ok(())));
        }
    }
}

/// Whether a file name ends in `.yaml` or `.yml`, in any case.
fn is_source_name(name: &Path) -> bool {
    name.extension()
        .and_then(|e| e.to_str())
        .is_some_and(|e| e.eq_ignore_ascii_case("yaml") || e.eq_ignore_ascii_case("yml"))
}

#[cfg(test)]
pub(crate) mod tests {
    use super::*;

    /// Empty files at `names` below `root`, with their folders.
    pub(crate) fn touch(root: &Path, names: &[&str]) {
        for name in names {
            let path = root.join(name);
            fs::create_dir_all(path.parent().unwrap()).unwrap();
            fs::write(path, "").unwrap();
        }
    }

    /// The paths of the found sources, as text, and the errors' paths
    /// marked `!`.
    fn listed(found: &[Result<SourceFile, BatchError>]) -> Vec<String> {
        found
            .iter()
            .map(|f| match f {
                Ok(s) => s.path.display().to_string(),
                Err(e) => format!("!{}", e.path().display()),
            })
            .collect()
    }

    #[test]
    fn a_folder_gives_its_sources_through_subfolders_sorted_name_by_name() {
        let dir = tempfile::tempdir().unwrap();
        let root = dir.path();
        touch(
            root,
            &[
                "z.yaml",
                "a-b.yaml",
                "a/z.yaml",
                "a/b/c.YML",
                "m.yml",
                "readme.md",
                "plan.yaml.bak",
            ],
        );
        let found = expand_paths(&[root.to_path_buf()]);
        let below: Vec<PathBuf> = found
            .iter()
            .map(|f| f.as_ref().unwrap().below.clone().unwrap())
            .collect();
        let want: Vec<PathBuf> = ["a/b/c.YML", "a/z.yaml", "a-b.yaml", "m.yml", "z.yaml"]
            .iter()
            .map(PathBuf::from)
            .collect();
        assert_eq!(below, want);
        assert_eq!(found[0].as_ref().unwrap().path, root.join("a/b/c.YML"));
    }

    #[test]
    fn hidden_files_and_folders_are_skipped() {
        let dir = tempfile::tempdir().unwrap();
        touch(
            dir.path(),
            &[
                ".draft.yaml",
                ".git/x.yaml",
                "keep/.old/y.yaml",
                "keep/k.yaml",
            ],
        );
        let found = expand_paths(&[dir.path().to_path_buf()]);
        assert_eq!(
            listed(&found),
            [dir.path().join("keep/k.yaml").display().to_string()]
        );
    }

    #[test]
    fn a_file_named_directly_is_taken_whatever_its_name() {
        let dir = tempfile::tempdir().unwrap();
        touch(dir.path(), &["plan.txt", ".hidden.yaml"]);
        let paths = [dir.path().join("plan.txt"), dir.path().join(".hidden.yaml")];
        let found = expand_paths(&paths);
        assert_eq!(found.len(), 2);
        for (f, p) in found.iter().zip(&paths) {
            assert_eq!(
                f.as_ref().unwrap(),
                &SourceFile {
                    path: p.clone(),
                    below: None
                }
            );
        }
    }

    #[test]
    fn missing_paths_and_empty_folders_are_invalid_entries_in_their_place() {
        let dir = tempfile::tempdir().unwrap();
        touch(
            dir.path(),
            &["full/a.yaml", "only-text/notes.txt", "b.yaml"],
        );
        fs::create_dir(dir.path().join("empty")).unwrap();
        let paths = [
            dir.path().join("full"),
            dir.path().join("missing.yaml"),
            dir.path().join("empty"),
            dir.path().join("only-text"),
            dir.path().join("b.yaml"),
        ];
        let found = expand_paths(&paths);
        assert_eq!(found.len(), 5);
        assert!(found[0].is_ok() && found[4].is_ok());
        assert!(matches!(found[1], Err(BatchError::Missing { .. })));
        assert!(matches!(found[2], Err(BatchError::EmptyFolder { .. })));
        assert!(matches!(found[3], Err(BatchError::EmptyFolder { .. })));
        let message = found[2].as_ref().unwrap_err().to_string();
        assert!(message.contains("empty") && message.contains(".yaml or .yml"));
        let message = found[1].as_ref().unwrap_err().to_string();
        assert!(message.contains("missing.yaml") && message.contains("FILE.yaml"));
    }

    #[test]
    fn the_same_file_twice_is_kept_once_at_its_first_place() {
        let dir = tempfile::tempdir().unwrap();
        touch(dir.path(), &["a.yaml", "b.yaml"]);
        let a = dir.path().join("a.yaml");
        let spelled_otherwise = dir.path().join(".").join("a.yaml");
        let paths = [
            a.clone(),
            dir.path().to_path_buf(),
            spelled_otherwise,
            dir.path().to_path_buf(),
            dir.path().join("gone.yaml"),
            dir.path().join("gone.yaml"),
        ];
        let found = expand_paths(&paths);
        assert_eq!(
            listed(&found),
            [
                a.display().to_string(),
                dir.path().join("b.yaml").display().to_string(),
                format!("!{}", dir.path().join("gone.yaml").display()),
            ]
        );
        assert_eq!(
            found[0].as_ref().unwrap().below,
            None,
            "the first place wins"
        );
    }

    #[cfg(unix)]
    #[test]
    fn links_are_followed_and_a_loop_ends() {
        let dir = tempfile::tempdir().unwrap();
        touch(dir.path(), &["real/a.yaml"]);
        std::os::unix::fs::symlink(dir.path().join("real"), dir.path().join("real/loop")).unwrap();
        std::os::unix::fs::symlink(dir.path().join("real/a.yaml"), dir.path().join("link.yaml"))
            .unwrap();
        std::os::unix::fs::symlink(dir.path().join("nowhere"), dir.path().join("broken.yaml"))
            .unwrap();
        let found = expand_paths(&[dir.path().to_path_buf()]);
        // broken.yaml is kept (reading it will say why); link.yaml is
        // real/a.yaml again; real/loop/ leads back into real/.
        assert_eq!(
            listed(&found),
            [
                dir.path().join("broken.yaml").display().to_string(),
                dir.path().join("link.yaml").display().to_string(),
            ]
        );
    }
}
