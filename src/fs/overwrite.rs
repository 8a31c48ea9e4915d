//! The overwrite rules of outputs: an output never replaces the input it
//! was made from; any other existing file is replaced only when asked
//! ([`Overwrite`](super::Overwrite), applied by the atomic writer).

use std::path::Path;

use crate::input::InputError;
use crate::plain::shell_path;

/// The overwrite rule of an output beside its input: an output never
/// replaces the source that was read, even with `--force`; `in_place`
/// adds to the refusal the flag that does (`design --in-place`).
///
/// ```
/// use lotsman::refuse_overwriting_input;
/// let dir = tempfile::tempdir().unwrap();
/// let source = dir.path().join("seal.yaml");
/// std::fs::write(&source, "title: x\n").unwrap();
/// assert!(refuse_overwriting_input(&source, Some(&source), true).is_err());
/// assert!(refuse_overwriting_input(&dir.path().join("new.yaml"), Some(&source), true).is_ok());
/// ```
///
/// # Errors
/// [`InputError::Inconsistent`] when `target` and `input` name one file
/// ([`same_file`]).
pub fn refuse_overwriting_input(
    target: &Path,
    input: Option<&Path>,
    in_place: bool,
) -> Result<(), InputError> {
    let Some(input) = input else { return Ok(()) };
    if same_file(target, input) {
        let advice = if in_place {
            format!(
                ", or re-solve it in place with: lotsman design {} --in-place",
                shell_path(input)
            )
        } else {
            String::new()
        };
        return Err(InputError::Inconsistent(format!(
            "the output {} is the plan source being read; write to a new file and compare before replacing it{advice}",
            target.display()
        )));
    }
    Ok(())
}

/// Whether two paths name one existing file: through links, and on Unix
/// through another hard link too (the same device and inode).
pub fn same_file(a: &Path, b: &Path) -> bool {
    #[cfg(unix)]
    {
        use std::os::unix::fs::MetadataExt;
        match (std::fs::metadata(a), std::fs::metadata(b)) {
            (Ok(x), Ok(y)) => x.dev() == y.dev() && x.ino() == y.ino(),
            _ => false,
        }
    }
    #[cfg(not(unix))]
    {
        match (std::fs::canonicalize(a), std::fs::canonicalize(b)) {
            (Ok(x), Ok(y)) => x == y,
            _ => false,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_hard_link_is_the_same_file_and_a_copy_is_not() {
        let dir = tempfile::tempdir().unwrap();
        let source = dir.path().join("seal.yaml");
        std::fs::write(&source, "title: x\n").unwrap();
        let link = dir.path().join("link.yaml");
        std::fs::hard_link(&source, &link).unwrap();
        let copy = dir.path().join("copy.yaml");
        std::fs::copy(&source, &copy).unwrap();
        assert!(same_file(&source, &link));
        assert!(!same_file(&source, &copy));
        assert!(!same_file(&source, &dir.path().join("missing.yaml")));
        let e = refuse_overwriting_input(&link, Some(&source), false).unwrap_err();
        assert!(!e.to_string().contains("--in-place"), "{e}");
        let e = refuse_overwriting_input(&link, Some(&source), true).unwrap_err();
        assert!(e.to_string().contains("--in-place"), "{e}");
        assert!(refuse_overwriting_input(&link, None, true).is_ok());
    }
}
