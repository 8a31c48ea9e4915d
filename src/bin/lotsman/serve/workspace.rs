//! The workspace: the one folder whose files the pages read and write.
//! A file name in a request is taken relative to it, and refused when it
//! could lead out of it: an absolute path, a `..`, or a link (of the file
//! or of a folder on its way) that resolves outside.

use std::path::{Component, Path, PathBuf};

use lotsman::{InputError, escape_controls, io_reason};

/// How many folders down [`Workspace::files`] looks.
pub const LIST_DEPTH: usize = 3;

/// The most files [`Workspace::files`] lists.
pub const LIST_MOST: usize = 500;

/// The workspace folder, resolved once at start (links followed), so
/// that every file is compared with the real folder.
#[derive(Debug)]
pub struct Workspace {
    root: PathBuf,
}

impl Workspace {
    /// The workspace at `dir`, which must be a folder.
    pub fn open(dir: &Path) -> Result<Self, InputError> {
        let shown = escape_controls(&dir.to_string_lossy()).into_owned();
        let root = dir.canonicalize().map_err(|e| {
            InputError::Inconsistent(format!(
                "the workspace {shown} {}; give a folder with --workspace DIR",
                io_reason(&e)
            ))
        })?;
        if !root.is_dir() {
            return Err(InputError::Inconsistent(format!(
                "the workspace {shown} is a file, not a folder; give a folder with --workspace DIR"
            )));
        }
        Ok(Workspace { root })
    }

    /// The folder, resolved.
    pub fn root(&self) -> &Path {
        &self.root
    }

    /// The path of the file `name` (a name relative to the workspace, as
    /// `plans/cover-fit.yaml`) in a folder that exists, refused when it
    /// leads outside the workspace.
    pub fn file(&self, name: &str) -> Result<PathBuf, InputError> {
        let shown = escape_controls(name).into_owned();
        let refuse = |why: &str| {
            InputError::Inconsistent(format!(
                "the file name '{shown}' {why}; give a name inside the workspace, as cover-fit.yaml or plans/cover-fit.yaml"
            ))
        };
        if name.trim().is_empty() {
            return Err(InputError::Inconsistent(
                "give a file name, as cover-fit.yaml or plans/cover-fit.yaml (a name inside the workspace)".to_string(),
            ));
        }
        if name.chars().any(char::is_control) {
            return Err(refuse("holds a control character"));
        }
        let path = Path::new(name);
        let mut relative = PathBuf::new();
        for part in path.components() {
            match part {
                Component::Normal(p) => relative.push(p),
                Component::CurDir => {}
                Component::ParentDir => return Err(refuse("goes up a folder with '..'")),
                Component::RootDir | Component::Prefix(_) => {
                    return Err(refuse("is an absolute path"));
                }
            }
        }
        if relative.file_name().is_none() {
            return Err(refuse("names no file"));
        }
        let target = self.root.join(&relative);
        let parent = target.parent().unwrap_or(&self.root);
        let real_parent = parent.canonicalize().map_err(|e| {
            refuse(&format!(
                "is in a folder that {}",
                io_reason(&e).replace(
                    "does not exist",
                    "does not exist (the page makes no folders)"
                )
            ))
        })?;
        if !real_parent.starts_with(&self.root) {
            return Err(refuse(
                "is in a folder linked to a place outside the workspace",
            ));
        }
        if let Ok(meta) = target.symlink_metadata()
            && meta.file_type().is_symlink()
        {
            match target.canonicalize() {
                Ok(real) if real.starts_with(&self.root) => {}
                Ok(_) => return Err(refuse("is a link to a file outside the workspace")),
                Err(_) => return Err(refuse("is a link to a file that does not exist")),
            }
        }
        Ok(target)
    }

    /// The workspace's files whose names end in one of `extensions`
    /// (lower case, without the dot), as the pages name them: relative,
    /// sorted, from the workspace and the folders below it down to
    /// [`LIST_DEPTH`], at most [`LIST_MOST`]. Hidden files and folders,
    /// and links, are left out.
    pub fn files(&self, extensions: &[&str]) -> Vec<String> {
        let mut found = Vec::new();
        let mut folders = vec![(self.root.clone(), 0)];
        while let Some((folder, depth)) = folders.pop() {
            let Ok(entries) = std::fs::read_dir(&folder) else {
                continue;
            };
            for entry in entries.flatten() {
                let name = entry.file_name();
                if name.to_string_lossy().starts_with('.') {
                    continue;
                }
                let Ok(kind) = entry.file_type() else {
                    continue;
                };
                let path = entry.path();
                if kind.is_dir() && depth < LIST_DEPTH {
                    folders.push((path, depth + 1));
                } else if kind.is_file()
                    && path.extension().is_some_and(|e| {
                        extensions.contains(&e.to_string_lossy().to_ascii_lowercase().as_str())
                    })
                    && found.len() < LIST_MOST
                {
                    found.push(self.shown(&path));
                }
            }
        }
        found.sort();
        found
    }

    /// A message with the workspace's own paths made relative, as the
    /// pages name files.
    pub fn relative_words(&self, message: &str) -> String {
        let root = format!("{}{}", self.root.display(), std::path::MAIN_SEPARATOR);
        message.replace(&root, "")
    }

    /// `path` as the pages show it: relative to the workspace.
    pub fn shown(&self, path: &Path) -> String {
        let relative = path.strip_prefix(&self.root).unwrap_or(path);
        escape_controls(&relative.to_string_lossy()).into_owned()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn workspace() -> (tempfile::TempDir, Workspace) {
        let dir = tempfile::tempdir().unwrap();
        let ws = Workspace::open(dir.path()).unwrap();
        (dir, ws)
    }

    #[test]
    fn a_plain_name_is_inside() {
        let (_dir, ws) = workspace();
        let path = ws.file("./cover-fit.yaml").unwrap();
        assert_eq!(path, ws.root().join("cover-fit.yaml"));
        assert_eq!(ws.shown(&path), "cover-fit.yaml");
    }

    #[test]
    fn files_are_listed_by_extension_without_hidden_ones() {
        let (dir, ws) = workspace();
        std::fs::create_dir(dir.path().join("plans")).unwrap();
        std::fs::create_dir(dir.path().join(".hidden")).unwrap();
        for name in [
            "b.yaml",
            "plans/a.YML",
            "log.csv",
            ".hidden/c.yaml",
            "notes.txt",
        ] {
            std::fs::write(dir.path().join(name), "x").unwrap();
        }
        assert_eq!(ws.files(&["yaml", "yml"]), ["b.yaml", "plans/a.YML"]);
        assert_eq!(ws.files(&["csv"]), ["log.csv"]);
    }

    #[test]
    fn names_that_leave_are_refused_in_words() {
        let (_dir, ws) = workspace();
        for (name, why) in [
            ("../x.yaml", "goes up a folder"),
            ("a/../../x.yaml", "goes up a folder"),
            ("/etc/x.yaml", "absolute path"),
            ("", "give a file name"),
            ("x\n.yaml", "control character"),
            ("missing/x.yaml", "does not exist"),
        ] {
            let e = ws.file(name).unwrap_err().to_string();
            assert!(e.contains(why), "{name:?}: {e}");
        }
    }
}
