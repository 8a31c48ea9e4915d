//! The hash chain: each row's `hash` is the SHA-256 of the previous row's
//! hash and this row's fields, so an edited, deleted or moved row breaks
//! every hash after it.
//!
//! # The canonical encoding
//!
//! ```text
//! hash = SHA-256( enc(prev_hash) || enc(format) || enc(seq) || ... || enc(resubmitted) )
//! enc(s) = decimal byte length of s, ':', the UTF-8 bytes of s, ','
//! ```
//!
//! The fields are taken in column order ([`COLUMNS`](super::COLUMNS)), each
//! as the text written in its CSV cell (after the CSV quoting is undone),
//! from `format` to `resubmitted`; `prev_hash` comes first, and `hash`
//! itself is left out. The length prefix (a netstring) keeps the encoding
//! unambiguous: no two lists of fields give the same bytes. The hash is
//! written as 64 lower-case hexadecimal digits. The first row's
//! `prev_hash` is [`GENESIS`].

use sha2::{Digest, Sha256};

/// The `prev_hash` of the first row: 64 zeros.
pub const GENESIS: &str = "0000000000000000000000000000000000000000000000000000000000000000";

/// The hash of a row whose previous hash is `prev_hash` and whose fields,
/// from `format` to `resubmitted` in column order, are `fields`.
///
/// ```
/// use lotsman::{GENESIS, chain_hash};
/// let h = chain_hash(GENESIS, &["a", "b"]);
/// assert_eq!(h.len(), 64);
/// assert_ne!(h, chain_hash(GENESIS, &["ab", ""]));
/// ```
pub fn chain_hash(prev_hash: &str, fields: &[&str]) -> String {
    let mut hasher = Sha256::new();
    for field in std::iter::once(prev_hash).chain(fields.iter().copied()) {
        // The length in decimal, written without an allocation.
        let mut digits = [0u8; 20];
        let mut at = digits.len();
        let mut len = field.len();
        loop {
            at -= 1;
            digits[at] = b'0' + (len % 10) as u8;
            len /= 10;
            if len == 0 {
                break;
            }
        }
        hasher.update(&digits[at..]);
        hasher.update(b":");
        hasher.update(field.as_bytes());
        hasher.update(b",");
    }
    let digest = hasher.finalize();
    let mut text = String::with_capacity(64);
    for b in digest.iter() {
        text.push(char::from(HEX[usize::from(b >> 4)]));
        text.push(char::from(HEX[usize::from(b & 0x0f)]));
    }
    text
}

const HEX: &[u8; 16] = b"0123456789abcdef";

/// Whether `text` is written as a hash: 64 lower-case hexadecimal digits.
pub(crate) fn is_hash(text: &str) -> bool {
    // A range test per byte: a search of HEX per byte took a fifth of a
    // replay's time (benches/ledger.rs).
    text.len() == 64 && text.bytes().all(|b| matches!(b, b'0'..=b'9' | b'a'..=b'f'))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn netstring_encoding_separates_fields() {
        // Field boundaries matter: "ab","" and "a","b" differ.
        assert_ne!(
            chain_hash(GENESIS, &["ab", ""]),
            chain_hash(GENESIS, &["a", "b"])
        );
        // SHA-256 of "64:000...0,1:x,", computed outside the project with
        // Python's hashlib: sha256(b"64:" + b"0"*64 + b",1:x,").
        assert_eq!(
            chain_hash(GENESIS, &["x"]),
            "51ccce8ce6839e510794d4f164cada68fcd334fc0e414cb183c79c7284f1792f"
        );
    }
}
