//! The workspace: the one folder whose files the pages read and write.
//! A file name in a request is taken relative to it, and refused when it
//! could lead out of it: an absolute path, a `..`, or a link (of the file
//! or of a folder on its way) that resolves outside.

use std::path::{Component, Path, PathBuf};

use lotsman::{InputError, escape_controls, io_reason};

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
