//! What a sheet says of itself in its document information: the hash of
//! the source it was printed from (in the subject) and the source's file
//! name, for `verify --sheet`.

use sha2::{Digest, Sha256};

use super::pdf::text_string;

/// The marker that carries the source hash in the PDF's metadata (the
/// document subject), for `verify --sheet`.
pub const HASH_PREFIX: &str = "lotsman-source-sha256:";

/// The key of the sheet's document information that holds the file name
/// of the source it was printed from, as its footer prints it.
pub const SOURCE_NAME_KEY: &str = "LotsmanSourceName";

/// The hex SHA-256 of a source text.
pub fn source_hash(text: &str) -> String {
    Sha256::digest(text.as_bytes())
        .iter()
        .map(|b| format!("{b:02x}"))
        .collect()
}

/// The source hash recorded in a sheet's metadata, if any.
///
/// # Errors
/// The parse error when `pdf` is not a readable PDF.
pub fn sheet_source_hash(pdf: &[u8]) -> Result<Option<String>, String> {
    let doc = lopdf::Document::load_mem(pdf).map_err(|e| e.to_string())?;
    let info = doc
        .trailer
        .get(b"Info")
        .and_then(|o| o.as_reference())
        .map_err(|e| e.to_string())?;
    let dict = doc.get_dictionary(info).map_err(|e| e.to_string())?;
    let subject = match dict.get(b"Subject") {
        Ok(lopdf::Object::String(bytes, _)) => text_string(bytes),
        _ => return Ok(None),
    };
    Ok(subject.strip_prefix(HASH_PREFIX).map(str::to_string))
}
