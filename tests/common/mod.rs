//! What the cargo suite (tests/it) and the system suite (tests/system)
//! share: running the binary, a pair of risk points, and reading or making
//! a PDF. Each suite uses a subset of them.
#![allow(dead_code, unused_imports)]

pub mod pdf;

pub use pdf::{page_sizes, pdf_lines, pdf_text};

use assert_cmd::Command;
use lotsman::{Model, RiskPair, RiskPoint};
use serde_json::Value;

/// The risk points `(p1, alpha)` and `(p2, beta)` under `model`.
pub fn pair(model: &Model, p1: f64, alpha: f64, p2: f64, beta: f64) -> RiskPair {
    RiskPair::new(
        RiskPoint {
            quality: p1,
            risk: alpha,
        },
        RiskPoint {
            quality: p2,
            risk: beta,
        },
        model,
    )
    .unwrap()
}

/// The `lotsman` binary of this build.
pub fn lotsman() -> Command {
    Command::cargo_bin("lotsman").unwrap()
}

/// What a successful run with `args` prints on stdout.
pub fn stdout_of(args: &[&str]) -> String {
    let out = lotsman()
        .args(args)
        .assert()
        .success()
        .get_output()
        .stdout
        .clone();
    String::from_utf8(out).unwrap()
}

/// The message of a run of `command` with `args` that exits 2, checked to
/// contain every `needle`.
pub fn refused_message(command: &str, args: &[&str], needles: &[&str]) -> String {
    let out = lotsman()
        .arg(command)
        .args(args)
        .assert()
        .code(2)
        .get_output()
        .stderr
        .clone();
    let text = String::from_utf8(out).unwrap();
    for needle in needles {
        assert!(text.contains(needle), "{needle:?} not in {text}");
    }
    text
}

/// The JSON that a successful run with `args` prints.
pub fn json_of(args: &[&str]) -> Value {
    serde_json::from_str(&stdout_of(args)).unwrap()
}

/// A PDF made by hand, of some 700 bytes: one A4 (or Letter) page saying
/// `n = 166` and metadata that claims the source hash `hash` and this tool
/// as its creator. What a forger of a sheet would start from.
pub fn hand_made_sheet(hash: &str, letter: bool) -> Vec<u8> {
    use lopdf::{Document, Object, Stream, dictionary};
    let (w, h) = if letter {
        (612.0, 792.0)
    } else {
        (595.27563, 841.88983)
    };
    let mut doc = Document::with_version("1.7");
    let pages = doc.new_object_id();
    let font = doc.add_object(dictionary! {
        "Type" => "Font", "Subtype" => "Type1", "BaseFont" => "Helvetica",
    });
    let content = doc.add_object(Stream::new(
        dictionary! {},
        b"BT /F1 24 Tf 60 700 Td (n = 166   Accept if 3 or fewer) Tj ET".to_vec(),
    ));
    let page = doc.add_object(dictionary! {
        "Type" => "Page",
        "Parent" => pages,
        "MediaBox" => vec![0.into(), 0.into(), Object::Real(w), Object::Real(h)],
        "Resources" => dictionary! { "Font" => dictionary! { "F1" => font } },
        "Contents" => content,
    });
    doc.objects.insert(
        pages,
        Object::Dictionary(dictionary! {
            "Type" => "Pages", "Kids" => vec![page.into()], "Count" => 1,
        }),
    );
    let catalog = doc.add_object(dictionary! { "Type" => "Catalog", "Pages" => pages });
    let info = doc.add_object(dictionary! {
        "Subject" => Object::string_literal(format!("lotsman-source-sha256:{hash}")),
        "Creator" => Object::string_literal(format!("lotsman {}", env!("CARGO_PKG_VERSION"))),
    });
    doc.trailer.set("Root", catalog);
    doc.trailer.set("Info", info);
    let mut bytes = Vec::new();
    doc.save_to(&mut bytes).unwrap();
    bytes
}

/// `pdf` with the document information's `key` set to the text `value`
/// (the way anyone can edit a sheet's metadata).
pub fn with_info(pdf: &[u8], key: &str, value: &str) -> Vec<u8> {
    let mut doc = lopdf::Document::load_mem(pdf).unwrap();
    let info = doc.trailer.get(b"Info").unwrap().as_reference().unwrap();
    doc.get_dictionary_mut(info)
        .unwrap()
        .set(key, lopdf::Object::string_literal(value));
    let mut bytes = Vec::new();
    doc.save_to(&mut bytes).unwrap();
    bytes
}
