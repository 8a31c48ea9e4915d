//! Reading a file that a user names, within a size limit: a file larger
//! than the limit is refused by its size before a byte is read, and one
//! that yields more bytes than its size said (a device such as
//! `/dev/zero`, a file that grows) is refused once the limit is passed, so
//! that no input can make the tool read without end.

use std::io::Read;
use std::path::Path;

/// The bytes of the file at `path`, which may hold at most `max` bytes;
/// `what` names the kind of file in the message (`"a plan source"`).
///
/// # Errors
/// The I/O error of opening or reading the file, or an error saying that
/// the file holds more than `max` bytes.
///
/// # Example
/// ```
/// let bytes = lotsman::read_limited(std::path::Path::new("plans/tpw-cover-fit.yaml"), 1 << 20, "a plan source").unwrap();
/// assert!(bytes.starts_with(b"# lotsman plan source"));
/// let e = lotsman::read_limited(std::path::Path::new("plans/tpw-cover-fit.yaml"), 10, "a plan source").unwrap_err();
/// assert!(e.to_string().contains("a plan source may have at most 10"));
/// ```
pub fn read_limited(path: &Path, max: u64, what: &str) -> std::io::Result<Vec<u8>> {
    let too_large = |size: String| {
        std::io::Error::other(format!(
            "the file has {size} bytes; {what} may have at most {max}"
        ))
    };
    let file = std::fs::File::open(path)?;
    let size = file.metadata()?.len();
    if size > max {
        return Err(too_large(size.to_string()));
    }
    let mut bytes = Vec::new();
    file.take(max.saturating_add(1)).read_to_end(&mut bytes)?;
    if bytes.len() as u64 > max {
        return Err(too_large(format!("more than {max}")));
    }
    Ok(bytes)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A device that never ends is refused after the limit, not read on.
    #[test]
    fn an_endless_file_is_refused_at_the_limit() {
        let zero = Path::new("/dev/zero");
        if !zero.exists() {
            eprintln!("no /dev/zero on this system: the endless-file check is skipped");
            return;
        }
        let e = read_limited(zero, 4096, "a test file").unwrap_err();
        assert!(e.to_string().contains("more than 4096 bytes"), "{e}");
    }
}
