//! What the test binaries share: loading a fixture, reading its rows and
//! the tolerance test; running the binary; reading a PDF's pages and text.
//! Each test binary uses a subset of them.
#![allow(dead_code)]

use assert_cmd::Command;
use lotsman::{Model, ModelKind, RiskPair, RiskPoint};
use serde_json::Value;

/// The fixture at `path` (relative to the repository root).
pub fn fixture(path: &str) -> Value {
    let text = std::fs::read_to_string(path).expect("fixture present");
    serde_json::from_str(&text).expect("fixture is JSON")
}

pub fn rows<'a>(v: &'a Value, key: &str) -> &'a Vec<Value> {
    v[key]
        .as_array()
        .unwrap_or_else(|| panic!("fixture has {key}"))
}

/// The model of a row: `model` and `lot_size`.
pub fn model(row: &Value) -> Model {
    let kind = match row["model"].as_str().unwrap() {
        "binomial" => ModelKind::Binomial,
        "hypergeometric" => ModelKind::Hypergeometric,
        "poisson" => ModelKind::Poisson,
        other => panic!("model {other}"),
    };
    Model::new(kind, row["lot_size"].as_u64()).unwrap()
}

pub fn u(row: &Value, key: &str) -> u64 {
    row[key]
        .as_u64()
        .unwrap_or_else(|| panic!("{key} in {row}"))
}

pub fn f(row: &Value, key: &str) -> f64 {
    row[key]
        .as_f64()
        .unwrap_or_else(|| panic!("{key} in {row}"))
}

/// Relative closeness; values below 1e-300 (where f64 turns subnormal) are
/// compared absolutely.
pub fn close(got: f64, want: f64, rel: f64) -> bool {
    if want.abs() < 1e-300 {
        return (got - want).abs() < 1e-300;
    }
    ((got - want) / want).abs() <= rel
}

/// The risk points `(p1, alpha)` and `(p2, beta)` of a row.
pub fn risks(row: &Value, m: &Model) -> RiskPair {
    pair(
        m,
        f(row, "p1"),
        f(row, "alpha"),
        f(row, "p2"),
        f(row, "beta"),
    )
}

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

/// The JSON that a successful run with `args` prints.
pub fn json_of(args: &[&str]) -> Value {
    serde_json::from_str(&stdout_of(args)).unwrap()
}

/// Page sizes in points from the PDF's MediaBox, read with lopdf.
pub fn page_sizes(pdf: &[u8]) -> Vec<(f64, f64)> {
    let doc = lopdf::Document::load_mem(pdf).unwrap();
    doc.get_pages()
        .values()
        .map(|&id| {
            let page = doc.get_dictionary(id).unwrap();
            let mb = page.get(b"MediaBox").unwrap().as_array().unwrap();
            let num = |o: &lopdf::Object| {
                o.as_float()
                    .map(f64::from)
                    .or_else(|_| o.as_i64().map(|v| v as f64))
                    .unwrap()
            };
            (num(&mb[2]) - num(&mb[0]), num(&mb[3]) - num(&mb[1]))
        })
        .collect()
}

/// The text of a PDF by pdftotext (poppler-utils, installed by .ci/run).
pub fn pdf_text(pdf: &[u8]) -> String {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("page.pdf");
    std::fs::write(&path, pdf).unwrap();
    let out = std::process::Command::new("pdftotext")
        .args([path.to_str().unwrap(), "-"])
        .output()
        .expect("pdftotext (poppler-utils) is installed");
    String::from_utf8(out.stdout).unwrap()
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
