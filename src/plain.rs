//! Text that is safe and plain for a user's terminal: control characters
//! escaped, file names written as the shell takes them back, and what the
//! operating system reports said in words.
//!
//! A file name, a YAML value or a CSV cell can hold any character. Echoed
//! raw, an escape sequence recolours or clears the terminal, a carriage
//! return hides the start of a message, and a right-to-left override makes
//! text read backwards; so every message shows such characters escaped
//! (`\x1B`, `\n`, `\u202E`), in the notation that a shell's `$'...'`
//! quoting reads back.

use std::borrow::Cow;
use std::path::Path;

/// Whether `ch` must not reach a terminal raw: the C0 and C1 controls and
/// DEL (Unicode category Cc), and the invisible marks that reorder the
/// text around them (the bidirectional embeddings, overrides and isolates,
/// and the directional marks).
pub fn is_unsafe_char(ch: char) -> bool {
    ch.is_control()
        || matches!(
            ch,
            '\u{061c}' | '\u{200e}' | '\u{200f}' | '\u{202a}'..='\u{202e}' | '\u{2066}'..='\u{2069}'
        )
}

/// The escape of one unsafe character: `\n`, `\r`, `\t`, `\x1B` for the
/// other ASCII controls, `\u202E` above ASCII.
fn escape_char(ch: char, out: &mut String) {
    match ch {
        '\n' => out.push_str("\\n"),
        '\r' => out.push_str("\\r"),
        '\t' => out.push_str("\\t"),
        c if (c as u32) < 0x80 => out.push_str(&format!("\\x{:02X}", c as u32)),
        c => out.push_str(&format!("\\u{:04X}", c as u32)),
    }
}

/// `text` with every character of [`is_unsafe_char`] escaped, so that it
/// shows as written and stays on one line.
///
/// ```
/// use lotsman::escape_controls;
/// assert_eq!(escape_controls("plan.yaml"), "plan.yaml");
/// assert_eq!(escape_controls("a\u{1b}[2Jb\ttab\n"), "a\\x1B[2Jb\\ttab\\n");
/// assert_eq!(escape_controls("x\u{202e}y"), "x\\u202Ey");
/// ```
pub fn escape_controls(text: &str) -> Cow<'_, str> {
    if !text.chars().any(is_unsafe_char) {
        return Cow::Borrowed(text);
    }
    let mut out = String::with_capacity(text.len() + 8);
    for ch in text.chars() {
        if is_unsafe_char(ch) {
            escape_char(ch, &mut out);
        } else {
            out.push(ch);
        }
    }
    Cow::Owned(out)
}

/// Whether `ch` needs no quoting in a POSIX shell word.
fn plain_shell_char(ch: char) -> bool {
    ch.is_ascii_alphanumeric() || "%+,-./:=@_".contains(ch)
}

/// `text` as one shell word: as it is when it holds only plain characters,
/// else in single quotes, and in `$'...'` with escapes (bash, zsh, ksh)
/// when it holds a control character, so that advice such as `lotsman
/// design 'my plan.yaml' --in-place` works when pasted as printed.
///
/// ```
/// use lotsman::shell_word;
/// assert_eq!(shell_word("plans/fit.yaml"), "plans/fit.yaml");
/// assert_eq!(shell_word("my plan.yaml"), "'my plan.yaml'");
/// assert_eq!(shell_word("it's.yaml"), "'it'\\''s.yaml'");
/// assert_eq!(shell_word("a\nb.yaml"), "$'a\\nb.yaml'");
/// ```
pub fn shell_word(text: &str) -> String {
    if !text.is_empty() && text.chars().all(plain_shell_char) {
        return text.to_string();
    }
    if text.chars().any(is_unsafe_char) {
        let mut out = String::from("$'");
        for ch in text.chars() {
            match ch {
                '\'' => out.push_str("\\'"),
                '\\' => out.push_str("\\\\"),
                c if is_unsafe_char(c) => escape_char(c, &mut out),
                c => out.push(c),
            }
        }
        out.push('\'');
        return out;
    }
    format!("'{}'", text.replace('\'', "'\\''"))
}

/// [`shell_word`] of a path; a relative path that starts with `-`, which
/// would be read as an option, is written `./-x.yaml`. (A name that is not
/// UTF-8 is shown with the replacement character, which the shell cannot
/// take back; such names are rare enough that the advice may then need
/// retyping.)
///
/// ```
/// use lotsman::shell_path;
/// assert_eq!(shell_path(std::path::Path::new("-x.yaml")), "./-x.yaml");
/// ```
pub fn shell_path(path: &Path) -> String {
    let text = path.to_string_lossy();
    if text.starts_with('-') {
        shell_word(&format!("./{text}"))
    } else {
        shell_word(&text)
    }
}

/// What the operating system reported, in words, with the `(os error N)`
/// of its standard message left out: the kinds a user meets (a missing
/// file, a denied permission, a folder where a file was expected, a full
/// disk, a reader that went away) in the tool's own words, any other in
/// the system's words. An error the crate made itself keeps its message.
///
/// ```
/// use std::io::{Error, ErrorKind};
/// use lotsman::io_reason;
/// assert_eq!(io_reason(&Error::from_raw_os_error(2)), "does not exist");
/// assert_eq!(io_reason(&Error::other("the file has 9 bytes")), "the file has 9 bytes");
/// ```
pub fn io_reason(e: &std::io::Error) -> String {
    use std::io::ErrorKind;
    if e.raw_os_error().is_none() && e.get_ref().is_some() {
        return e.to_string();
    }
    match e.kind() {
        ErrorKind::NotFound => "does not exist".into(),
        ErrorKind::PermissionDenied => "cannot be opened: permission denied".into(),
        ErrorKind::IsADirectory => "is a folder, not a file".into(),
        ErrorKind::NotADirectory => {
            "cannot be reached: a part of its path is a file, not a folder".into()
        }
        ErrorKind::StorageFull => "cannot be written: the disk is full".into(),
        ErrorKind::ReadOnlyFilesystem => "cannot be written: the disk is read-only".into(),
        ErrorKind::BrokenPipe => "was closed by the program reading it".into(),
        _ => {
            let text = e.to_string();
            let text = match text.rfind(" (os error ") {
                Some(at) => &text[..at],
                None => &text,
            };
            let mut chars = text.chars();
            match chars.next() {
                Some(first) => {
                    format!("cannot be used: {}{}", first.to_lowercase(), chars.as_str())
                }
                None => "cannot be used".into(),
            }
        }
    }
}

/// `path` and what the operating system reported about it, as one phrase:
/// `plans/x.yaml does not exist`, `plans is a folder, not a file`; an
/// error the crate made itself follows the path after a colon.
///
/// ```
/// use lotsman::io_message;
/// let e = std::io::Error::from_raw_os_error(2);
/// assert_eq!(io_message(std::path::Path::new("x.yaml"), &e), "x.yaml does not exist");
/// ```
pub fn io_message(path: &Path, e: &std::io::Error) -> String {
    let own = e.raw_os_error().is_none() && e.get_ref().is_some();
    let separator = if own { ": " } else { " " };
    format!("{}{separator}{}", path.display(), io_reason(e))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_control_character_is_escaped_and_the_rest_kept() {
        for code in (0u32..0x20).chain(0x7f..0xa0) {
            let ch = char::from_u32(code).unwrap();
            let shown = escape_controls(&format!("a{ch}b")).into_owned();
            assert!(!shown.chars().any(is_unsafe_char), "{code:#x}: {shown:?}");
            assert!(shown.starts_with('a') && shown.ends_with('b'));
        }
        assert_eq!(escape_controls("Prüfplan µm ±0,5"), "Prüfplan µm ±0,5");
        assert_eq!(escape_controls("\u{7f}\u{85}"), "\\x7F\\u0085");
    }

    #[test]
    fn a_shell_word_reads_back_as_the_text() {
        // Checked by handing each word to sh -c 'printf %s WORD' where a
        // shell is at hand: the word must print the text itself.
        let Ok(sh) = std::process::Command::new("bash")
            .arg("-c")
            .arg("true")
            .status()
        else {
            return;
        };
        assert!(sh.success());
        for text in [
            "plain.yaml",
            "my plan.yaml",
            "it's.yaml",
            "$HOME.yaml",
            "a*b?.yaml",
            "tab\there.yaml",
            "esc\u{1b}[31m.yaml",
            "back\\slash 'q'.yaml",
            "Prüfplan.yaml",
        ] {
            let out = std::process::Command::new("bash")
                .arg("-c")
                .arg(format!("printf %s {}", shell_word(text)))
                .output()
                .unwrap();
            assert_eq!(
                String::from_utf8(out.stdout).unwrap(),
                text,
                "{}",
                shell_word(text)
            );
        }
    }

    #[test]
    fn system_errors_lose_their_code() {
        let e = std::io::Error::from_raw_os_error(5);
        let reason = io_reason(&e);
        assert!(!reason.contains("os error"), "{reason}");
        assert!(reason.starts_with("cannot be used: "), "{reason}");
        let denied = std::io::Error::from_raw_os_error(13);
        assert_eq!(
            io_message(Path::new("a.yaml"), &denied),
            "a.yaml cannot be opened: permission denied"
        );
    }
}
