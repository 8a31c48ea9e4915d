//! The plan sheet: page, text, determinism, layout and audit hash.

use std::path::Path;
use std::process::Command as Process;

use assert_cmd::Command;
use lotsman::{Paper, PlanSource, render_sheet, sheet_source_hash, source_hash};
use predicates::prelude::*;

const DEMO: &str = "plans/tpw-seal-visual.yaml";

fn demo_source() -> (String, PlanSource) {
    let text = std::fs::read_to_string(DEMO).unwrap();
    let source = PlanSource::from_yaml(&text, Path::new(DEMO)).unwrap();
    (text, source)
}

/// Page sizes in points from the PDF's MediaBox, read with lopdf.
fn page_sizes(pdf: &[u8]) -> Vec<(f64, f64)> {
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
fn pdf_text(pdf: &[u8]) -> String {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("s.pdf");
    std::fs::write(&path, pdf).unwrap();
    let out = Process::new("pdftotext")
        .args([path.to_str().unwrap(), "-"])
        .output()
        .expect("pdftotext (poppler-utils) is installed");
    String::from_utf8(out.stdout).unwrap()
}

#[test]
fn one_a4_page_or_one_letter_page() {
    let (text, source) = demo_source();
    let a4 = render_sheet(&text, &source, "s.yaml", Paper::A4).unwrap();
    let sizes = page_sizes(&a4.pdf);
    assert_eq!(sizes.len(), 1);
    assert!(
        (sizes[0].0 - 595.28).abs() < 0.5 && (sizes[0].1 - 841.89).abs() < 0.5,
        "{sizes:?}"
    );
    let letter = render_sheet(&text, &source, "s.yaml", Paper::Letter).unwrap();
    let sizes = page_sizes(&letter.pdf);
    assert!(
        (sizes[0].0 - 612.0).abs() < 0.5 && (sizes[0].1 - 792.0).abs() < 0.5,
        "{sizes:?}"
    );
}

#[test]
fn the_text_holds_the_plan_the_risk_points_and_the_source_hash() {
    let (text, source) = demo_source();
    let sheet = render_sheet(&text, &source, "tpw-seal-visual.yaml", Paper::A4).unwrap();
    let words = pdf_text(&sheet.pdf);
    for needle in [
        "n = 166",
        "Accept if ≤ 3 nonconforming units",
        "Reject if ≥ 4 nonconforming units",
        "0.6500%",
        "4.000%",
        "α ≤ 0.05",
        "β ≤ 0.1",
        "p₁",
        "TPW-RI-0412",
        "2026-11-16",
        "Sampling does not guarantee the quality of a lot",
        "lotsman sheet tpw-seal-visual.yaml",
        &source_hash(&text),
    ] {
        assert!(words.contains(needle), "missing {needle:?} in:\n{words}");
    }
    assert!(!words.contains('?'), "a '?' reached the page:\n{words}");
    assert_eq!(
        sheet_source_hash(&sheet.pdf).unwrap(),
        Some(source_hash(&text))
    );
}

#[test]
fn same_source_same_bytes_in_one_process_and_across_threads() {
    let (text, source) = demo_source();
    let first = render_sheet(&text, &source, "s.yaml", Paper::A4)
        .unwrap()
        .pdf;
    let again = render_sheet(&text, &source, "s.yaml", Paper::A4)
        .unwrap()
        .pdf;
    assert_eq!(first, again);
    let parallel: Vec<Vec<u8>> = std::thread::scope(|scope| {
        let handles: Vec<_> = (0..4)
            .map(|_| {
                scope.spawn(|| {
                    render_sheet(&text, &source, "s.yaml", Paper::A4)
                        .unwrap()
                        .pdf
                })
            })
            .collect();
        handles.into_iter().map(|h| h.join().unwrap()).collect()
    });
    assert!(parallel.iter().all(|p| *p == first));
}

#[test]
fn same_bytes_from_two_processes() {
    let dir = tempfile::tempdir().unwrap();
    let outs: Vec<Vec<u8>> = ["a.pdf", "b.pdf"]
        .iter()
        .map(|name| {
            let out = dir.path().join(name);
            Command::cargo_bin("lotsman")
                .unwrap()
                .args(["sheet", DEMO, "--output", out.to_str().unwrap()])
                .assert()
                .success();
            std::fs::read(out).unwrap()
        })
        .collect();
    assert_eq!(outs[0], outs[1]);
}

#[test]
fn a_long_title_wraps_or_shrinks_and_no_blocks_overlap() {
    let (text, mut source) = demo_source();
    source.title =
        "Receiving inspection of O-ring seals for the high-pressure circulation pumps of the \
        east and west assembly halls, visual check of every sealing surface under magnification"
            .to_string();
    for paper in [Paper::A4, Paper::Letter] {
        let sheet = render_sheet(&text, &source, "s.yaml", paper).unwrap();
        let (w, h) = match paper {
            Paper::A4 => (210.0, 297.0),
            Paper::Letter => (215.9, 279.4),
        };
        for (i, a) in sheet.regions.iter().enumerate() {
            assert!(
                a.x >= 0.0 && a.y >= 0.0 && a.x + a.w <= w && a.y + a.h <= h,
                "{} leaves the page",
                a.name
            );
            for b in &sheet.regions[i + 1..] {
                assert!(!a.overlaps(b), "{} overlaps {}", a.name, b.name);
            }
        }
    }
}

#[test]
fn text_that_cannot_fit_or_print_is_refused() {
    let (text, mut source) = demo_source();
    source.title = "very long title ".repeat(60);
    let err = render_sheet(&text, &source, "s.yaml", Paper::A4)
        .unwrap_err()
        .to_string();
    assert!(
        err.contains("cannot be laid out") && err.contains("title"),
        "{err}"
    );
    let (text, mut source) = demo_source();
    source.item = Some("Seal 漢".to_string());
    let err = render_sheet(&text, &source, "s.yaml", Paper::A4)
        .unwrap_err()
        .to_string();
    assert!(err.contains("U+6F22"), "{err}");
}

#[test]
fn verify_checks_a_sheet_against_its_source() {
    let dir = tempfile::tempdir().unwrap();
    let pdf = dir.path().join("seal.pdf");
    let pdf_s = pdf.to_str().unwrap();
    Command::cargo_bin("lotsman")
        .unwrap()
        .args(["sheet", DEMO, "--output", pdf_s])
        .assert()
        .success();
    Command::cargo_bin("lotsman")
        .unwrap()
        .args(["verify", DEMO, "--sheet", pdf_s])
        .assert()
        .success();
    Command::cargo_bin("lotsman")
        .unwrap()
        .args(["verify", "plans/tpw-cover-fit.yaml", "--sheet", pdf_s])
        .assert()
        .code(1)
        .stdout(predicate::str::contains("source SHA-256"));
}

#[test]
fn a_failed_run_leaves_no_pdf_and_keeps_an_existing_one() {
    let dir = tempfile::tempdir().unwrap();
    let missing = dir.path().join("no-such-folder").join("x.pdf");
    Command::cargo_bin("lotsman")
        .unwrap()
        .args(["sheet", DEMO, "--output", missing.to_str().unwrap()])
        .assert()
        .code(2);
    assert!(!missing.exists());
    // A source without a plan cannot be printed; the existing PDF stays.
    let unsolved = dir.path().join("unsolved.yaml");
    let text = std::fs::read_to_string(DEMO).unwrap();
    std::fs::write(&unsolved, &text[..text.find("plan:").unwrap()]).unwrap();
    let existing = dir.path().join("unsolved.pdf");
    std::fs::write(&existing, b"the previous sheet").unwrap();
    Command::cargo_bin("lotsman")
        .unwrap()
        .args(["sheet", unsolved.to_str().unwrap()])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("records no plan"));
    assert_eq!(std::fs::read(&existing).unwrap(), b"the previous sheet");
    let leftovers: Vec<_> = std::fs::read_dir(dir.path())
        .unwrap()
        .filter_map(|e| e.ok())
        .filter(|e| e.file_name().to_string_lossy().ends_with(".tmp"))
        .collect();
    assert!(leftovers.is_empty());
}
