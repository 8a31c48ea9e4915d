//! The embedded font programs, deflated once per process.
//!
//! Every PDF this tool writes embeds the same two font programs
//! ([`fonts`](super::fonts)), about 80 kB together, and lopdf's
//! `Document::compress` deflates every stream at its best level on every
//! save: half the time of a batch of sheets went to deflating these same
//! bytes again. Here each program is deflated once per process, by the
//! very call the document's compression makes (`lopdf::Stream::compress`),
//! and put in place of the program before the document's other streams are
//! compressed, in the state that call leaves a stream (`/Filter
//! /FlateDecode` added, then `/Length` set to the deflated size). The
//! compression then passes these streams by, as it passes any stream that
//! has a filter already, so a sheet's bytes are the same as before.

use std::sync::OnceLock;

use lopdf::{Dictionary, Document, Object, Stream};

use super::fonts::PROGRAMS;

/// Each embedded program's deflated bytes, `None` where lopdf's rule
/// (deflate only when it saves more than 19 bytes) would leave it plain.
fn deflated() -> &'static [Option<Vec<u8>>; 2] {
    static DEFLATED: OnceLock<[Option<Vec<u8>>; 2]> = OnceLock::new();
    DEFLATED.get_or_init(|| {
        PROGRAMS.map(|program| {
            let mut stream = Stream::new(Dictionary::new(), program.to_vec());
            // A write into memory cannot fail; were it to, the program
            // stays plain and the document's compression deflates it.
            stream.compress().ok()?;
            stream.dict.get(b"Filter").is_ok().then_some(stream.content)
        })
    })
}

/// Puts the deflated form in place of every plain stream of `doc` that is
/// one of the embedded font programs, as `Stream::compress` would.
pub(crate) fn deflate_font_programs(doc: &mut Document) {
    let deflated = deflated();
    for object in doc.objects.values_mut() {
        let Object::Stream(stream) = object else {
            continue;
        };
        if !stream.allows_compression || stream.dict.get(b"Filter").is_ok() {
            continue;
        }
        let found = PROGRAMS
            .iter()
            .zip(deflated)
            .find(|(program, _)| stream.content.as_slice() == **program);
        if let Some((_, Some(content))) = found {
            stream.dict.set("Filter", "FlateDecode");
            stream.set_content(content.clone());
        }
    }
}
