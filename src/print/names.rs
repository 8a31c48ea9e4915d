//! How a sheet names its source: in its commands ("Regenerate with: lotsman
//! sheet NAME") and in the notice of a plan printed as recorded.

use super::draw::Face;
use super::fonts::Fonts;
use crate::plain::{is_unsafe_char, shell_word};
use crate::source::Discrepancy;

/// The notice that states `discrepancy`, with at most `fields` of the
/// differing fields, on the sheet of `file_name` (as the sheet prints it).
pub(super) fn notice_of(discrepancy: &Discrepancy, file_name: &str, fields: usize) -> String {
    let found = discrepancy.brief(fields, file_name);
    let mut chars = found.chars();
    let first = chars.next().map(|ch| ch.to_uppercase().to_string());
    format!("{}{}.", first.unwrap_or_default(), chars.as_str())
}

/// `file_name` as the sheet prints it, in its commands: one shell word,
/// quoted where the shell needs it, and with each character the sheet
/// font cannot draw (or a control character) written as an unquoted `?`,
/// the shell's wildcard for one character, so that a name in another
/// script neither blocks the sheet nor breaks its commands.
pub(super) fn printed_name(file_name: &str, fonts: &Fonts) -> String {
    let drawable = |ch: char| !is_unsafe_char(ch) && fonts.has_glyph(Face::Regular, ch);
    if file_name.chars().all(drawable) {
        return shell_word(file_name);
    }
    let mut out = String::new();
    let mut run = String::new();
    for ch in file_name.chars() {
        if drawable(ch) {
            run.push(ch);
        } else {
            if !run.is_empty() {
                out.push_str(&shell_word(&run));
                run.clear();
            }
            out.push('?');
        }
    }
    if !run.is_empty() {
        out.push_str(&shell_word(&run));
    }
    out
}
