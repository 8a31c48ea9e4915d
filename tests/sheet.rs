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

// Staged plans: double, multiple and item by item (sequential).

const DOUBLE: &str = "plans/tpw-impeller-porosity.yaml";
const SEQUENTIAL: &str = "plans/tpw-sleeve-hardness.yaml";
const MULTIPLE: &str = "tests/data/sheet-multiple-seven.yaml";
const LONG_SEQUENTIAL: &str = "tests/data/sheet-sequential-long.yaml";

fn source_at(path: &str) -> (String, PlanSource) {
    let text = std::fs::read_to_string(path).unwrap();
    let source = PlanSource::from_yaml(&text, Path::new(path)).unwrap();
    (text, source)
}

/// The text of a PDF by `pdftotext -layout`, one line per printed line,
/// each with its runs of spaces folded to one: a table row reads as its
/// cells in order.
fn pdf_lines(pdf: &[u8]) -> Vec<String> {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("s.pdf");
    std::fs::write(&path, pdf).unwrap();
    let out = Process::new("pdftotext")
        .args(["-layout", path.to_str().unwrap(), "-"])
        .output()
        .expect("pdftotext (poppler-utils) is installed");
    String::from_utf8(out.stdout)
        .unwrap()
        .lines()
        .map(|l| l.split_whitespace().collect::<Vec<_>>().join(" "))
        .collect()
}

/// All the text with every run of white space folded to one space, so that
/// a wrapped paragraph reads as written.
fn folded(text: &str) -> String {
    text.split_whitespace().collect::<Vec<_>>().join(" ")
}

/// Every block on the page and apart from every other.
fn assert_laid_out(sheet: &lotsman::Sheet, paper: Paper) {
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

/// The procedure the terminal prints, step by step, is on the sheet.
fn assert_procedure(words: &str, source: &PlanSource) {
    let model = source.request().unwrap().model;
    let plan = source.recorded_plan(&model).unwrap();
    let per_unit = model.kind() == lotsman::ModelKind::Poisson;
    let page = folded(words);
    for step in lotsman::words::plan_procedure(&plan, per_unit) {
        assert!(
            page.contains(&folded(&step)),
            "missing step {step:?} in:\n{page}"
        );
    }
}

#[test]
fn staged_sheets_fit_one_page_of_either_size_without_overlaps() {
    for path in [DOUBLE, SEQUENTIAL, MULTIPLE] {
        let (text, source) = source_at(path);
        for paper in [Paper::A4, Paper::Letter] {
            let sheet = render_sheet(&text, &source, "s.yaml", paper)
                .unwrap_or_else(|e| panic!("{path} {paper:?}: {e}"));
            assert_eq!(page_sizes(&sheet.pdf).len(), 1, "{path}");
            assert_laid_out(&sheet, paper);
            let names: Vec<&str> = sheet.regions.iter().map(|r| r.name.as_str()).collect();
            for block in ["title block", "plan", "risks", "OC chart", "ASN chart"] {
                assert!(names.contains(&block), "{path}: no {block} in {names:?}");
            }
            assert_eq!(
                names.contains(&"decision chart"),
                path == SEQUENTIAL,
                "{path}: {names:?}"
            );
            let words = pdf_text(&sheet.pdf);
            assert!(!words.contains('?'), "a '?' reached the page:\n{words}");
        }
    }
}

#[test]
fn the_double_sheet_holds_the_stage_table_and_the_procedure() {
    let (text, source) = source_at(DOUBLE);
    let sheet = render_sheet(&text, &source, "tpw-impeller-porosity.yaml", Paper::A4).unwrap();
    let lines = pdf_lines(&sheet.pdf);
    let words = pdf_text(&sheet.pdf);
    // Stage, new units, units in all, accept at most, reject at least.
    for row in ["1 42 42 0 3", "2 89 131 3 4"] {
        assert!(
            lines.iter().any(|l| l.starts_with(row)),
            "no stage row {row:?} in:\n{}",
            lines.join("\n")
        );
    }
    for needle in [
        "DOUBLE SAMPLING: 2 STAGES, UP TO 131 UNITS",
        "Average sample number (ASN)",
        "single plan: n = 110",
        "α ≤ 0.05",
        "Sampling does not guarantee the quality of a lot",
        &source_hash(&text),
    ] {
        assert!(words.contains(needle), "missing {needle:?} in:\n{words}");
    }
    assert_procedure(&words, &source);
}

#[test]
fn the_multiple_sheet_lists_all_seven_stages() {
    let (text, source) = source_at(MULTIPLE);
    let model = source.request().unwrap().model;
    let plan = source.recorded_plan(&model).unwrap();
    assert_eq!(plan.stages().len(), 7);
    for paper in [Paper::A4, Paper::Letter] {
        let sheet = render_sheet(&text, &source, "m.yaml", paper).unwrap();
        let lines = pdf_lines(&sheet.pdf);
        let mut drawn = 0;
        for (i, s) in plan.stages().iter().enumerate() {
            let accept = s.accept.map_or("—".to_string(), |a| a.to_string());
            let row = format!("{} {} {} {accept} {}", i + 1, s.n - drawn, s.n, s.reject);
            drawn = s.n;
            assert!(
                lines.iter().any(|l| l.starts_with(&row)),
                "{paper:?}: no stage row {row:?} in:\n{}",
                lines.join("\n")
            );
        }
        let words = pdf_text(&sheet.pdf);
        assert!(words.contains("MULTIPLE SAMPLING: 7 STAGES, UP TO 154 UNITS"));
        assert!(folded(&words).contains("— : this stage cannot accept the lot"));
        assert_procedure(&words, &source);
    }
}

/// The rows `units accept reject` of an item table, from the library.
fn item_rows(source: &PlanSource) -> Vec<String> {
    let model = source.request().unwrap().model;
    let plan = source.recorded_plan(&model).unwrap();
    plan.sequential_lines()
        .unwrap()
        .runs()
        .iter()
        .map(|r| {
            let units = if r.first == r.last {
                r.first.to_string()
            } else {
                format!("{} to {}", r.first, r.last)
            };
            let accept = r.accept.map_or("—".to_string(), |a| a.to_string());
            format!("{units} {accept} {}", r.reject)
        })
        .collect()
}

#[test]
fn the_sequential_sheet_holds_every_row_of_the_item_table_the_lines_and_the_procedure() {
    let (text, source) = source_at(SEQUENTIAL);
    let rows = item_rows(&source);
    assert_eq!(rows.len(), 13);
    assert_eq!(rows[0], "1 to 5 — 2");
    assert_eq!(rows[12], "165 5 6");
    for paper in [Paper::A4, Paper::Letter] {
        let sheet = render_sheet(&text, &source, "tpw-sleeve-hardness.yaml", paper).unwrap();
        let lines = pdf_lines(&sheet.pdf);
        for row in &rows {
            assert!(
                lines.iter().any(|l| l.contains(row.as_str())),
                "{paper:?}: no item row {row:?} in:\n{}",
                lines.join("\n")
            );
        }
        let words = pdf_text(&sheet.pdf);
        for needle in [
            "ITEM BY ITEM: UP TO 165 UNITS",
            "Decision chart",
            "at unit 165: accept if ≤ 5",
            "Units inspected n",
            "d = 0.03596 n − 1.4089",
            "d = 0.03596 n + 1.8089",
            "single plan: n = 113",
            "REJECT",
        ] {
            assert!(words.contains(needle), "missing {needle:?} in:\n{words}");
        }
        assert_procedure(&words, &source);
    }
}

#[test]
fn a_long_item_table_goes_into_columns_or_the_sheet_is_refused() {
    let (text, source) = source_at(LONG_SEQUENTIAL);
    let rows = item_rows(&source);
    assert_eq!(rows.len(), 33);
    // A4: every row, in two columns (so some lines hold two rows).
    let sheet = render_sheet(&text, &source, "long.yaml", Paper::A4).unwrap();
    assert_laid_out(&sheet, Paper::A4);
    let lines = pdf_lines(&sheet.pdf);
    for row in &rows {
        assert!(
            lines.iter().any(|l| l.contains(row.as_str())),
            "no item row {row:?} in:\n{}",
            lines.join("\n")
        );
    }
    assert!(
        lines
            .iter()
            .any(|l| l.starts_with(&rows[0]) && l.contains(rows[17].as_str())),
        "the table is not in two columns:\n{}",
        lines.join("\n")
    );
    // Letter is too short for it: refused, never cut short.
    let err = render_sheet(&text, &source, "long.yaml", Paper::Letter)
        .unwrap_err()
        .to_string();
    assert!(
        err.contains("cannot be laid out")
            && err.contains("item table (33 rows")
            && err.contains("try --paper a4"),
        "{err}"
    );
}

#[test]
fn staged_sheets_are_deterministic() {
    for path in [DOUBLE, SEQUENTIAL] {
        let (text, source) = source_at(path);
        let a = render_sheet(&text, &source, "s.yaml", Paper::A4).unwrap();
        let b = render_sheet(&text, &source, "s.yaml", Paper::A4).unwrap();
        assert_eq!(a.pdf, b.pdf, "{path}");
    }
}

#[test]
fn the_single_sheet_keeps_its_own_layout() {
    let (text, source) = demo_source();
    let sheet = render_sheet(&text, &source, "tpw-seal-visual.yaml", Paper::A4).unwrap();
    let words = pdf_text(&sheet.pdf);
    for needle in [
        "SAMPLE SIZE",
        "Operating characteristic (OC) curve",
        "Average outgoing quality (AOQ), rectifying inspection",
        "AOQL = 1.170%",
        "INSPECTOR'S PROCEDURE",
        "WHAT THE PLAN DOES AT OTHER QUALITIES",
    ] {
        assert!(words.contains(needle), "missing {needle:?} in:\n{words}");
    }
    for staged_only in [
        "SAMPLING:",
        "ITEM BY ITEM",
        "Average sample number",
        "Decision chart",
    ] {
        assert!(
            !words.contains(staged_only),
            "{staged_only:?} on a single sheet"
        );
    }
    assert_procedure(&words, &source);
    let names: Vec<&str> = sheet.regions.iter().map(|r| r.name.as_str()).collect();
    assert_eq!(
        names,
        [
            "title block",
            "plan",
            "risks",
            "OC chart",
            "AOQ chart",
            "measures",
            "signatures",
            "footer"
        ]
    );
}
