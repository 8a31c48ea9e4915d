//! The folders a command creates for its outputs, taken from the path as
//! written: `--output-dir x/../y/../z` creates `z`, never `x` or `y`.

use std::path::{Component, Path, PathBuf};

/// `path` with each `..` that follows a folder of its own taken out
/// together with that folder, where this changes nothing about the place
/// meant: when the folder does not exist (creating it only to leave it
/// would leave an empty folder behind), or is a real folder (whose `..` is
/// the folder holding it). A `..` after a link is kept, since the system
/// goes up from where the link points; so are leading `..`, and `.`
/// components are dropped.
///
/// ```
/// use std::path::{Path, PathBuf};
/// use lotsman::normalise_folder;
/// assert_eq!(normalise_folder(Path::new("x/../y/../z")), PathBuf::from("z"));
/// assert_eq!(normalise_folder(Path::new("../sheets/./2026")), PathBuf::from("../sheets/2026"));
/// assert_eq!(normalise_folder(Path::new("/..")), PathBuf::from("/"));
/// assert_eq!(normalise_folder(Path::new("x/..")), PathBuf::from("."));
/// ```
pub fn normalise_folder(path: &Path) -> PathBuf {
    let mut out = PathBuf::new();
    for component in path.components() {
        match component {
            Component::CurDir => {}
            Component::ParentDir => match out.components().next_back() {
                Some(Component::Normal(_)) if !is_link(&out) => {
                    out.pop();
                }
                Some(Component::RootDir | Component::Prefix(_)) => {}
                _ => out.push(".."),
            },
            other => out.push(other.as_os_str()),
        }
    }
    if out.as_os_str().is_empty() {
        out.push(".");
    }
    out
}

fn is_link(path: &Path) -> bool {
    std::fs::symlink_metadata(path).is_ok_and(|m| m.file_type().is_symlink())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[cfg(unix)]
    #[test]
    fn a_parent_step_after_a_link_is_left_to_the_system() {
        let dir = tempfile::tempdir().unwrap();
        let real = dir.path().join("real/deep");
        std::fs::create_dir_all(&real).unwrap();
        let link = dir.path().join("link");
        std::os::unix::fs::symlink(&real, &link).unwrap();
        assert_eq!(normalise_folder(&link.join("../out")), link.join("../out"));
        assert_eq!(
            normalise_folder(&dir.path().join("real/../out")),
            dir.path().join("out")
        );
    }
}
