//! The plan sheet: page, text, determinism, layout and audit hash.

use crate::common;
use common::{page_sizes, pdf_lines, pdf_text};

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
            "record",
            "approval",
            "footer"
        ]
    );
}

// Variables plans: n measurements judged by k (one limit) or M (two).

use lotsman::{
    LimitKind, Model, ModelKind, RiskPair, RiskPoint, SigmaKind, Specification, VariablesRequest,
    design_single, solve_variables,
};
use std::sync::OnceLock;

/// The most readings the sheet's table holds (src/print/facts.rs).
const SHEET_READINGS: u64 = 48;

/// One variables source of the tests: its file name, YAML text and the
/// source read back from it.
struct Variables {
    name: &'static str,
    text: String,
    source: PlanSource,
}

/// A variables source for the specification, at p1 = 1% (alpha 0.05) and
/// `p2` (beta 0.10), binomial comparison plan, unit mm, designed and read
/// back from its YAML.
fn variables_source(
    name: &'static str,
    spec: (SigmaKind, Option<f64>, LimitKind, Option<f64>, Option<f64>),
    p2: f64,
) -> Variables {
    let model = Model::new(ModelKind::Binomial, None).unwrap();
    let risks = RiskPair::new(
        RiskPoint {
            quality: 0.01,
            risk: 0.05,
        },
        RiskPoint {
            quality: p2,
            risk: 0.10,
        },
        &model,
    )
    .unwrap();
    let spec = Specification::new(spec.0, spec.1, spec.2, spec.3, spec.4).unwrap();
    let request = VariablesRequest::new(spec, risks, model).unwrap();
    let solution = solve_variables(&request).unwrap();
    let mut source =
        PlanSource::new_variables("Bearing seat diameter", &request, Some("mm".into()));
    source.id = Some("TPW-RI-0520".into());
    source.item = Some("Pump shaft 4410-07".into());
    source.prepared_by = Some("J. Okafor".into());
    source.record_variables(&solution);
    let text = source.to_yaml();
    let source = PlanSource::from_yaml(&text, Path::new(name)).unwrap();
    Variables { name, text, source }
}

/// The five variables sources, designed once for all the tests (the
/// two-limit plan with s takes a while in a debug build).
fn variables() -> &'static [Variables] {
    static SOURCES: OnceLock<Vec<Variables>> = OnceLock::new();
    SOURCES.get_or_init(|| {
        use LimitKind::{Both, Lower, Upper};
        use SigmaKind::{Known, Unknown};
        vec![
            variables_source(
                "upper-s.yaml",
                (Unknown, None, Upper, None, Some(12.05)),
                0.06,
            ),
            variables_source(
                "lower-sigma.yaml",
                (Known, Some(0.02), Lower, Some(11.95), None),
                0.06,
            ),
            variables_source(
                "both-sigma.yaml",
                (Known, Some(0.012), Both, Some(11.95), Some(12.05)),
                0.06,
            ),
            variables_source(
                "both-s.yaml",
                (Unknown, None, Both, Some(11.95), Some(12.05)),
                0.06,
            ),
            // Tight points: a sample too large for the readings table.
            variables_source(
                "large-s.yaml",
                (Unknown, None, Upper, None, Some(12.05)),
                0.025,
            ),
        ]
    })
}

fn variables_named(name: &str) -> &'static Variables {
    variables().iter().find(|v| v.name == name).unwrap()
}

/// The recorded plan's n and constant.
fn recorded(v: &Variables) -> (u64, Option<f64>, Option<f64>) {
    let r = v.source.plan.as_ref().unwrap().variables.unwrap();
    (r.n, r.k, r.m)
}

/// The readings table's row numbers: on each printed line,
/// the run of whole numbers it starts with (a row of the table, one number
/// per column), 0 left out (the chart's axis).
fn reading_rows(lines: &[String]) -> Vec<Vec<u64>> {
    lines
        .iter()
        .map(|l| {
            l.split(' ')
                .map_while(|t| t.parse::<u64>().ok())
                .filter(|&v| v > 0)
                .collect::<Vec<u64>>()
        })
        .filter(|run| !run.is_empty())
        .collect()
}

/// Every reading 1..=n has its numbered row, once, and the rows run down
/// `columns` columns.
fn assert_readings_table(lines: &[String], n: u64, columns: usize) {
    let rows = reading_rows(lines);
    let mut numbers: Vec<u64> = rows.iter().flatten().copied().collect();
    numbers.sort_unstable();
    assert_eq!(
        numbers,
        (1..=n).collect::<Vec<u64>>(),
        "row numbers of the readings table in:\n{}",
        lines.join("\n")
    );
    let per_column = n.div_ceil(columns as u64);
    assert_eq!(rows[0].len(), columns, "{rows:?}");
    let want: Vec<u64> = (0..columns as u64).map(|j| 1 + j * per_column).collect();
    assert_eq!(rows[0], want, "the first row reads across the columns");
}

#[test]
fn variables_sheets_fit_one_page_of_either_size_without_overlaps() {
    for v in variables() {
        for paper in [Paper::A4, Paper::Letter] {
            let sheet = render_sheet(&v.text, &v.source, v.name, paper)
                .unwrap_or_else(|e| panic!("{} {paper:?}: {e}", v.name));
            assert_eq!(page_sizes(&sheet.pdf).len(), 1, "{}", v.name);
            assert_laid_out(&sheet, paper);
            let names: Vec<&str> = sheet.regions.iter().map(|r| r.name.as_str()).collect();
            assert_eq!(
                names,
                [
                    "title block",
                    "plan",
                    "risks",
                    "decision rule",
                    "results",
                    "signatures",
                    "readings",
                    "OC chart",
                    "footer"
                ],
                "{}",
                v.name
            );
            let words = pdf_text(&sheet.pdf);
            assert!(!words.contains('?'), "a '?' reached the page:\n{words}");
            assert_eq!(
                sheet_source_hash(&sheet.pdf).unwrap(),
                Some(source_hash(&v.text)),
                "{}",
                v.name
            );
        }
    }
}

#[test]
fn the_one_limit_sheet_with_s_holds_the_plan_the_rule_and_every_reading_row() {
    let v = variables_named("upper-s.yaml");
    // The plan the brief's example gives for these points.
    assert_eq!(recorded(v), (42, Some(1.901), None));
    let model = Model::new(ModelKind::Binomial, None).unwrap();
    let risks = v.source.variables_request().unwrap();
    let counting = design_single(&model, risks.risks()).unwrap();
    for paper in [Paper::A4, Paper::Letter] {
        let sheet = render_sheet(&v.text, &v.source, v.name, paper).unwrap();
        let words = pdf_text(&sheet.pdf);
        let page = folded(&words);
        for needle in [
            "n = 42",
            "k = 1.901",
            "σ estimated from each sample by s",
            "Upper limit U = 12.05 mm",
            &format!("n = {}, c = {} for the same points", counting.n, counting.c),
            &format!("measuring saves {} units", counting.n - 42),
            "QU = (U − x̄) / s = (12.05 − x̄) / s",
            "Accept the lot when QU ≥ k = 1.901",
            "Reject the lot when QU < 1.901",
            "1. Draw 42 units at random from the whole lot",
            "x̄ = Σx / 42 and the standard deviation s (divisor 41)",
            "accept the lot if it is 1.901 or more, otherwise reject it",
            "READINGS (mm)",
            "Lot no.",
            "Gauge",
            "Σx =",
            "x̄ =",
            "s =",
            "QU =",
            "accept",
            "reject",
            "Inspected by",
            "lotsman judge upper-s.yaml --measurements READINGS.csv",
            "Operating characteristic (OC) curve",
            "this plan (n = 42, k = 1.901)",
            &format!("counting instead: n = {}, c = {}", counting.n, counting.c),
            "p₁ = 1.000%",
            "p₂ = 6.000%",
            "α ≤ 0.05",
            "β ≤ 0.1",
            "variables, σ unknown",
            "Sampling does not guarantee the quality of a lot",
            "Critical and safety characteristics follow the applicable contract, regulation and licensed practice",
            "The rule assumes that a lot's measurements are normally distributed",
            "Prepared by",
            "Approved by",
            "J. Okafor",
            &source_hash(&v.text),
        ] {
            assert!(
                page.contains(needle),
                "{paper:?}: missing {needle:?} in:\n{words}"
            );
        }
        assert_readings_table(&pdf_lines(&sheet.pdf), 42, 4);
    }
}

#[test]
fn the_one_limit_sheet_with_sigma_known_divides_by_sigma() {
    let v = variables_named("lower-sigma.yaml");
    let (n, k, _) = recorded(v);
    let k = k.unwrap().to_string();
    let sheet = render_sheet(&v.text, &v.source, v.name, Paper::A4).unwrap();
    let words = pdf_text(&sheet.pdf);
    let page = folded(&words);
    for needle in [
        format!("n = {n}"),
        format!("k = {k}"),
        "σ = 0.02 mm, known".to_string(),
        "Lower limit L = 11.95 mm".to_string(),
        "QL = (x̄ − L) / σ = (x̄ − 11.95) / 0.02".to_string(),
        format!("Accept the lot when QL ≥ k = {k}"),
        "compare it with σ = 0.02 mm".to_string(),
        "variables, σ known".to_string(),
        "normally distributed with the stated σ".to_string(),
    ] {
        assert!(page.contains(&needle), "missing {needle:?} in:\n{words}");
    }
    assert!(
        !page.contains("QU"),
        "an upper statistic on a lower-limit sheet"
    );
    assert_readings_table(
        &pdf_lines(&sheet.pdf),
        n,
        reading_rows(&pdf_lines(&sheet.pdf))[0].len(),
    );
}

#[test]
fn the_two_limit_sheets_give_the_estimators_with_their_numbers() {
    let known = variables_named("both-sigma.yaml");
    let (n, _, m) = recorded(known);
    let factor = format!("{:.4}", (n as f64 / (n as f64 - 1.0)).sqrt());
    let m = lotsman::format_quality(m.unwrap(), false);
    let sheet = render_sheet(&known.text, &known.source, known.name, Paper::Letter).unwrap();
    let words = pdf_text(&sheet.pdf);
    let page = folded(&words);
    for needle in [
        format!("M = {m}"),
        "Limits L = 11.95 mm, U = 12.05 mm".to_string(),
        "QU = (12.05 − x̄) / 0.012".to_string(),
        "QL = (x̄ − 11.95) / 0.012".to_string(),
        format!("p̂U = 1 − Φ({factor}·QU)"),
        format!("p̂L = 1 − Φ({factor}·QL)"),
        format!("Accept the lot when p̂L + p̂U ≤ M = {m}"),
        "NORM.S.DIST".to_string(),
        "p̂ = p̂L + p̂U =".to_string(),
    ] {
        assert!(page.contains(&needle), "missing {needle:?} in:\n{words}");
    }
    assert_readings_table(
        &pdf_lines(&sheet.pdf),
        n,
        reading_rows(&pdf_lines(&sheet.pdf))[0].len(),
    );

    let estimated = variables_named("both-s.yaml");
    assert_eq!(recorded(estimated), (43, None, Some(0.02648)));
    for paper in [Paper::A4, Paper::Letter] {
        let sheet =
            render_sheet(&estimated.text, &estimated.source, estimated.name, paper).unwrap();
        let words = pdf_text(&sheet.pdf);
        let page = folded(&words);
        for needle in [
            "n = 43",
            "M = 2.648%",
            "QU = (12.05 − x̄) / s",
            "QL = (x̄ − 11.95) / s",
            // a = n/2 - 1 = 20.5; sqrt(43) / (2 * 42) = 0.078065
            "p̂U = Ix(20.5, 20.5), x = 0.5 − 0.078065·QU",
            "p̂L = Ix(20.5, 20.5), x = 0.5 − 0.078065·QL",
            "BETA.DIST(x, 20.5, 20.5, TRUE)",
            "Accept the lot when p̂L + p̂U ≤ M = 2.648%",
            "Reject the lot when p̂L + p̂U > 2.648%",
            "accept the lot if their sum is 2.648% or less",
            "this plan, all beyond one limit",
            "this plan, mean centred",
        ] {
            assert!(
                page.contains(needle),
                "{paper:?}: missing {needle:?} in:\n{words}"
            );
        }
        assert_readings_table(&pdf_lines(&sheet.pdf), 43, 4);
    }
}

#[test]
fn a_sample_beyond_the_table_goes_on_a_readings_log_and_keeps_the_result_lines() {
    let v = variables_named("large-s.yaml");
    let (n, _, _) = recorded(v);
    assert!(
        n > SHEET_READINGS,
        "n = {n} fits the table; tighten the points"
    );
    for paper in [Paper::A4, Paper::Letter] {
        let sheet = render_sheet(&v.text, &v.source, v.name, paper).unwrap();
        let words = pdf_text(&sheet.pdf);
        let page = folded(&words);
        for needle in [
            format!(
                "This plan takes {n} readings, more than the {SHEET_READINGS} this sheet has rows for"
            ),
            format!("readings log numbered 1 to {n}"),
            "the results and the decision are still entered on this sheet".to_string(),
            "Σx =".to_string(),
            "QU =".to_string(),
            "Inspected by".to_string(),
            format!("n = {n}"),
        ] {
            assert!(
                page.contains(&needle),
                "{paper:?}: missing {needle:?} in:\n{words}"
            );
        }
        assert!(
            reading_rows(&pdf_lines(&sheet.pdf)).is_empty(),
            "{paper:?}: a readings table was printed"
        );
    }
}

#[test]
fn the_table_holds_48_readings_on_either_paper_and_no_more() {
    for name in [
        "upper-s.yaml",
        "lower-sigma.yaml",
        "both-sigma.yaml",
        "both-s.yaml",
    ] {
        let v = variables_named(name);
        for (n, table) in [(SHEET_READINGS, true), (SHEET_READINGS + 1, false)] {
            let mut source = v.source.clone();
            source.plan.as_mut().unwrap().variables.as_mut().unwrap().n = n;
            let text = source.to_yaml();
            for paper in [Paper::A4, Paper::Letter] {
                let sheet = render_sheet(&text, &source, name, paper)
                    .unwrap_or_else(|e| panic!("{name} n = {n} {paper:?}: {e}"));
                assert_laid_out(&sheet, paper);
                let lines = pdf_lines(&sheet.pdf);
                if table {
                    assert_readings_table(&lines, n, 4);
                } else {
                    assert!(reading_rows(&lines).is_empty(), "{name} n = {n} {paper:?}");
                    assert!(folded(&pdf_text(&sheet.pdf)).contains("separate readings log"));
                }
            }
        }
    }
}

#[test]
fn variables_sheets_are_deterministic_and_the_cli_writes_them() {
    let v = variables_named("upper-s.yaml");
    let a = render_sheet(&v.text, &v.source, v.name, Paper::A4).unwrap();
    let b = render_sheet(&v.text, &v.source, v.name, Paper::A4).unwrap();
    assert_eq!(a.pdf, b.pdf);
    let dir = tempfile::tempdir().unwrap();
    let yaml = dir.path().join(v.name);
    std::fs::write(&yaml, &v.text).unwrap();
    let pdf = dir.path().join("upper-s.pdf");
    Command::cargo_bin("lotsman")
        .unwrap()
        .args([
            "sheet",
            yaml.to_str().unwrap(),
            "--output",
            pdf.to_str().unwrap(),
        ])
        .assert()
        .success();
    assert_eq!(std::fs::read(&pdf).unwrap(), a.pdf);
}

/// Issue 14, item 14: a file name with characters the sheet font lacks
/// does not block the sheet. The footer names the source as one shell
/// word, a '?' standing for each such character, so that its command
/// regenerates the sheet when run as printed in the source's folder.
#[test]
fn a_file_name_the_font_cannot_draw_prints_a_safe_form_that_still_works() {
    let dir = tempfile::tempdir().unwrap();
    let source = dir.path().join("Prüf 漢字 seal's.yaml");
    std::fs::copy(DEMO, &source).unwrap();
    let pdf = source.with_extension("pdf");
    Command::cargo_bin("lotsman")
        .unwrap()
        .arg("sheet")
        .arg(&source)
        .assert()
        .success();
    let first = std::fs::read(&pdf).unwrap();
    let text = pdf_text(&first)
        .split_whitespace()
        .collect::<Vec<_>>()
        .join(" ");
    let command = "lotsman sheet 'Prüf '??' seal'\\''s.yaml' --force";
    assert!(
        text.contains(&format!("Regenerate with: {command}")),
        "{text}"
    );
    // The printed command, run as printed in the source's folder, prints
    // the same bytes again over the sheet it regenerates.
    let binary = assert_cmd::cargo::cargo_bin("lotsman");
    let ran = Process::new("bash")
        .arg("-c")
        .arg(format!(
            "lotsman() {{ '{}' \"$@\"; }}; {command}",
            binary.display()
        ))
        .current_dir(dir.path())
        // '?' stands for one character in a UTF-8 shell, as users' shells
        // are; in the C locale it would stand for one byte.
        .env("LC_ALL", "C.UTF-8")
        .output()
        .unwrap();
    assert!(
        ran.status.success(),
        "{}",
        String::from_utf8_lossy(&ran.stderr)
    );
    assert_eq!(std::fs::read(&pdf).unwrap(), first);
}

/// `verify --sheet` on `pdf` (bytes written to a file) against `source`:
/// the exit code and stdout.
fn verify_sheet(source: &str, pdf: &[u8], extra: &[&str]) -> (i32, String) {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("sheet.pdf");
    std::fs::write(&path, pdf).unwrap();
    let out = Command::cargo_bin("lotsman")
        .unwrap()
        .args(["verify", source, "--sheet", path.to_str().unwrap()])
        .args(extra)
        .output()
        .unwrap();
    (
        out.status.code().unwrap(),
        String::from_utf8(out.stdout).unwrap(),
    )
}

#[test]
fn verify_passes_a_genuine_sheet_on_either_paper_and_catches_forged_ones() {
    let dir = tempfile::tempdir().unwrap();
    let text = std::fs::read_to_string(DEMO).unwrap();
    let hash = source_hash(&text);
    let version = format!("lotsman {}", env!("CARGO_PKG_VERSION"));
    for (paper, letter) in [("a4", false), ("letter", true)] {
        let genuine = dir.path().join(format!("seal-{paper}.pdf"));
        Command::cargo_bin("lotsman")
            .unwrap()
            .args(["sheet", DEMO, "--paper", paper, "--output"])
            .arg(&genuine)
            .assert()
            .success();
        let genuine = std::fs::read(&genuine).unwrap();
        assert_eq!(verify_sheet(DEMO, &genuine, &[]).0, 0, "{paper}");

        // A PDF made by hand that carries the source's hash.
        let forged = common::hand_made_sheet(&hash, letter);
        assert!(forged.len() < 1000, "{} bytes", forged.len());
        assert_eq!(sheet_source_hash(&forged).unwrap(), Some(hash.clone()));
        // Another plan's real sheet, its subject swapped for this hash.
        let other = dir.path().join(format!("fit-{paper}.pdf"));
        Command::cargo_bin("lotsman")
            .unwrap()
            .args([
                "sheet",
                "plans/tpw-cover-fit.yaml",
                "--paper",
                paper,
                "--output",
            ])
            .arg(&other)
            .assert()
            .success();
        let swapped = common::with_info(
            &std::fs::read(&other).unwrap(),
            "Subject",
            &format!("{}{hash}", lotsman::HASH_PREFIX),
        );
        // The genuine sheet with its bytes touched: one more space in the
        // title of its metadata.
        let touched = common::with_info(&genuine, "Title", &format!("{} ", source_title()));
        for (what, pdf) in [
            ("hand-made", &forged),
            ("subject swapped", &swapped),
            ("touched", &touched),
        ] {
            let (code, out) = verify_sheet(DEMO, pdf, &[]);
            assert_eq!(code, 1, "{paper} {what}: {out}");
            assert!(
                out.contains("the sheet does not come from this source (or this tool version)")
                    && out.contains(&format!("the sheet says it was made by {version}")),
                "{paper} {what}: {out}"
            );
        }
    }
}

/// The demo source's title, as its sheet's metadata holds it.
fn source_title() -> String {
    demo_source().1.title
}

#[test]
fn verify_names_the_tool_version_a_foreign_sheet_says_it_came_from() {
    let dir = tempfile::tempdir().unwrap();
    let pdf = dir.path().join("seal.pdf");
    Command::cargo_bin("lotsman")
        .unwrap()
        .args(["sheet", DEMO, "--output"])
        .arg(&pdf)
        .assert()
        .success();
    let older = common::with_info(&std::fs::read(&pdf).unwrap(), "Creator", "lotsman 0.0.9");
    let (code, out) = verify_sheet(DEMO, &older, &["--format", "json"]);
    assert_eq!(code, 1, "{out}");
    let value: serde_json::Value = serde_json::from_str(&out).unwrap();
    let message = value["results"][0]["message"].as_str().unwrap();
    assert!(
        message.contains("the sheet does not come from this source (or this tool version)")
            && message.contains(&format!(
                "the sheet says it was made by lotsman 0.0.9; this is lotsman {}",
                env!("CARGO_PKG_VERSION")
            )),
        "{message}"
    );
    assert_eq!(value["results"][0]["status"], "mismatch");
}

#[test]
fn a_sheet_printed_as_recorded_or_from_a_renamed_source_still_verifies_as_its_sheet() {
    let dir = tempfile::tempdir().unwrap();
    let edited = dir.path().join("edited.yaml");
    let text = std::fs::read_to_string(DEMO).unwrap();
    std::fs::write(&edited, text.replacen("n: 166", "n: 150", 1)).unwrap();
    Command::cargo_bin("lotsman")
        .unwrap()
        .arg("sheet")
        .arg(&edited)
        .args(["--accept-recorded", "--paper", "letter"])
        .assert()
        .success();
    let pdf = std::fs::read(edited.with_extension("pdf")).unwrap();
    // The source itself mismatches (n edited); the sheet is its sheet.
    let (code, out) = verify_sheet(edited.to_str().unwrap(), &pdf, &[]);
    assert_eq!(code, 1, "{out}");
    assert!(out.contains("recorded 150, re-solved 166"), "{out}");
    assert!(!out.contains("does not come from"), "{out}");
    // The footer names the file printed from; a copy under another name
    // is still the source of that sheet.
    let renamed = dir.path().join("renamed.yaml");
    std::fs::copy(DEMO, &renamed).unwrap();
    let genuine = dir.path().join("g.pdf");
    Command::cargo_bin("lotsman")
        .unwrap()
        .args(["sheet", DEMO, "--output"])
        .arg(&genuine)
        .assert()
        .success();
    let (code, out) = verify_sheet(
        renamed.to_str().unwrap(),
        &std::fs::read(&genuine).unwrap(),
        &[],
    );
    assert_eq!(code, 0, "{out}");
}

#[test]
fn verify_passes_the_genuine_sheet_of_every_kind_of_plan() {
    let dir = tempfile::tempdir().unwrap();
    for source in [
        DOUBLE,
        SEQUENTIAL,
        MULTIPLE,
        "plans/tpw-cover-thickness.yaml",
    ] {
        let pdf = dir.path().join("s.pdf");
        Command::cargo_bin("lotsman")
            .unwrap()
            .args(["sheet", source, "--force", "--output"])
            .arg(&pdf)
            .assert()
            .success();
        let (code, out) = verify_sheet(source, &std::fs::read(&pdf).unwrap(), &[]);
        assert_eq!(code, 0, "{source}: {out}");
    }
}

// A sheet ready to sign: the lot record, the document fields from
// `design`, the placeholders left, a long characteristic (issue 14,
// item 16).

const SEAL: &str = DEMO;
const HOUSING: &str = "plans/tpw-housing-finish.yaml";

#[test]
fn every_attribute_sheet_has_a_lot_record_beside_the_measures_on_either_paper() {
    let cases = [
        (SEAL, "Nonconforming units found"),
        (HOUSING, "Nonconformities found"),
        (DOUBLE, "Found at stage"),
        (MULTIPLE, "Found at stage"),
        (SEQUENTIAL, "Decided at unit"),
    ];
    for (path, count_field) in cases {
        let (text, source) = source_at(path);
        for paper in [Paper::A4, Paper::Letter] {
            let sheet = render_sheet(&text, &source, "s.yaml", paper)
                .unwrap_or_else(|e| panic!("{path} {paper:?}: {e}"));
            assert_laid_out(&sheet, paper);
            let block = |name: &str| {
                sheet
                    .regions
                    .iter()
                    .find(|r| r.name == name)
                    .unwrap_or_else(|| panic!("{path} {paper:?}: no {name}"))
                    .clone()
            };
            let (record, approval, measures) =
                (block("record"), block("approval"), block("measures"));
            // The record stands beside the measures table, over the
            // approval, and the two fill the table's height.
            assert!(record.x > measures.x + measures.w, "{path} {paper:?}");
            assert!(record.y > approval.y, "{path} {paper:?}");
            assert!(
                ((record.y + record.h) - (measures.y + measures.h)).abs() < 1e-6
                    && (approval.y - measures.y).abs() < 1e-6,
                "{path} {paper:?}"
            );
            let words = folded(&pdf_text(&sheet.pdf));
            for needle in [
                "LOT RECORD",
                "Lot no.",
                count_field,
                "Decision",
                "accept",
                "reject",
                "Inspected by",
                "Prepared by",
                "Approved by",
                "Signature",
            ] {
                assert!(
                    words.contains(needle),
                    "{path} {paper:?}: no {needle:?} in {words}"
                );
            }
        }
    }
    // An item-by-item plan records the unit that decided the lot and the
    // running count there: the figures judge --inspected --found takes.
    let (text, source) = source_at(SEQUENTIAL);
    let sheet = render_sheet(&text, &source, "s.yaml", Paper::A4).unwrap();
    let words = folded(&pdf_text(&sheet.pdf));
    assert!(words.contains("Decided at unit") && words.contains("running count"));
    assert!(!words.contains("Found at stage"), "{words}");
}

#[test]
fn a_sheet_straight_from_design_is_ready_to_sign() {
    let dir = tempfile::tempdir().unwrap();
    let source = dir.path().join("seal.yaml");
    let fields = [
        ("--id", "id", "TPW-RI-0520"),
        ("--revision", "revision", "B"),
        ("--date", "date", "2026-03-04"),
        (
            "--item",
            "item",
            "O-ring 20 x 2 mm, FKM 75, part TPW-4410 rev. A",
        ),
        (
            "--characteristic",
            "characteristic",
            "Surface defects under 4x magnification per TPW visual standard VS-07",
        ),
        (
            "--prepared-by",
            "prepared_by",
            "R. Odumbe, supplier quality engineer",
        ),
        (
            "--approved-by",
            "approved_by",
            "H. Vasquez-Lind, quality manager",
        ),
    ];
    let mut args = vec![
        "design",
        "--aql",
        "0.65%",
        "--rql",
        "4%",
        "--title",
        "O-ring seals, visual",
    ];
    for (flag, _, value) in &fields {
        args.extend([*flag, *value]);
    }
    Command::cargo_bin("lotsman")
        .unwrap()
        .args(&args)
        .arg("--output")
        .arg(&source)
        .assert()
        .success();
    let loaded = PlanSource::load(&source).unwrap();
    let yaml = std::fs::read_to_string(&source).unwrap();
    for (_, key, value) in &fields {
        assert!(
            yaml.contains(&format!("\n{key}: {value}\n")),
            "{key} in:\n{yaml}"
        );
    }
    assert_eq!(loaded.prepared_by.as_deref(), Some(fields[5].2));
    // The sheet prints without a warning and carries every field.
    let pdf = dir.path().join("seal.pdf");
    Command::cargo_bin("lotsman")
        .unwrap()
        .arg("sheet")
        .arg(&source)
        .assert()
        .success()
        .stderr(format!("lotsman: wrote sheet {}\n", pdf.display()));
    let words = folded(&pdf_text(&std::fs::read(&pdf).unwrap()));
    for (_, _, value) in &fields {
        assert!(words.contains(value), "no {value:?} in {words}");
    }
    // A variables design takes them too.
    let out = Command::cargo_bin("lotsman")
        .unwrap()
        .args([
            "design",
            "--scheme",
            "variables",
            "--sigma",
            "unknown",
            "--limit",
            "lower",
            "--lower",
            "5.8",
            "--aql",
            "1%",
            "--rql",
            "6%",
            "--id",
            "TPW-RI-0521",
            "--date",
            "2026-03-05",
            "--format",
            "yaml",
        ])
        .assert()
        .success();
    let yaml = String::from_utf8(out.get_output().stdout.clone()).unwrap();
    assert!(
        yaml.contains("\nid: TPW-RI-0521\n") && yaml.contains("\ndate: 2026-03-05\n"),
        "{yaml}"
    );
}

#[test]
fn a_sheet_warns_of_each_placeholder_a_template_left() {
    let dir = tempfile::tempdir().unwrap();
    for kind in ["binomial", "sequential", "variables"] {
        let template = dir.path().join(format!("{kind}.yaml"));
        let out = Command::cargo_bin("lotsman")
            .unwrap()
            .args(["new", kind])
            .output()
            .unwrap();
        // The user fills in the item and leaves the rest.
        let text = String::from_utf8(out.stdout).unwrap().replace(
            "<part name, part number, drawing revision>",
            "Seal 20 x 2 mm, TPW-4410",
        );
        std::fs::write(&template, text).unwrap();
        let solved = dir.path().join(format!("{kind}-solved.yaml"));
        Command::cargo_bin("lotsman")
            .unwrap()
            .arg("design")
            .arg(&template)
            .arg("--output")
            .arg(&solved)
            .assert()
            .success();
        let out = Command::cargo_bin("lotsman")
            .unwrap()
            .arg("sheet")
            .arg(&solved)
            .assert()
            .success();
        let stderr = String::from_utf8(out.get_output().stderr.clone()).unwrap();
        let warned: Vec<&str> = stderr
            .lines()
            .filter(|l| l.starts_with("lotsman: warning: "))
            .collect();
        let fields = [
            "title",
            "id",
            "characteristic",
            "prepared_by",
            "approved_by",
            "notes",
        ];
        assert_eq!(warned.len(), fields.len(), "{kind}: {stderr}");
        for (line, field) in warned.iter().zip(fields) {
            assert!(
                line.starts_with(&format!(
                    "lotsman: warning: {}: {field} still holds the template's placeholder <",
                    solved.display()
                )),
                "{kind}: {line}"
            );
        }
    }
    // The demo plans, filled in, print without one.
    Command::cargo_bin("lotsman")
        .unwrap()
        .args(["sheet", SEAL, "--output"])
        .arg(dir.path().join("seal.pdf"))
        .assert()
        .success()
        .stderr(predicate::str::contains("warning").not());
}

/// `rectify ARGS --output DIR/NAME`: the source written.
fn rectifying_source(dir: &Path, name: &str, args: &[&str]) -> std::path::PathBuf {
    let path = dir.join(name);
    Command::cargo_bin("lotsman")
        .unwrap()
        .arg("rectify")
        .args(args)
        .arg("--output")
        .arg(&path)
        .assert()
        .success();
    path
}

#[test]
fn a_minimum_inspection_plan_prints_its_protection_procedure_and_ati() {
    let dir = tempfile::tempdir().unwrap();
    let lot = ["--lot-size", "5000", "--process-average", "0.25%"];
    let single = rectifying_source(
        dir.path(),
        "single.yaml",
        &[&lot[..], &["--ltpd", "1%"]].concat(),
    );
    let double = rectifying_source(
        dir.path(),
        "double.yaml",
        &[&lot[..], &["--aoql", "1%", "--scheme", "double"]].concat(),
    );
    let cases = [
        (
            &single,
            vec![
                "n = 766",
                "Accept if ≤ 4 nonconforming units",
                "Process average (p̄) 0.2500% least ATI ATI = 922.2 of 5000 (Pa = 0.9631)",
                "LTPD (consumer's protection) 1.000% β ≤ 0.1 β = 0.1000 (Pa = 0.1000)",
                "Nonconforming units found",
            ],
        ),
        (
            &double,
            vec![
                "DOUBLE SAMPLING: 2 STAGES, UP TO 363 UNITS",
                "AOQL (consumer's protection) 1.000% AOQ ≤ 1.000% AOQL = 0.9990% at 1.880%",
                "Found at stage",
            ],
        ),
    ];
    for (path, needles) in cases {
        let (text, source) = source_at(path.to_str().unwrap());
        let model = *source.rectifying_request().unwrap().model();
        let plan = source.recorded_plan(&model).unwrap();
        for paper in [Paper::A4, Paper::Letter] {
            let sheet = render_sheet(&text, &source, "r.yaml", paper)
                .unwrap_or_else(|e| panic!("{} {paper:?}: {e}", path.display()));
            assert_laid_out(&sheet, paper);
            let names: Vec<&str> = sheet.regions.iter().map(|r| r.name.as_str()).collect();
            for block in [
                "protection",
                "OC chart",
                "AOQ chart",
                "measures",
                "record",
                "approval",
            ] {
                assert!(names.contains(&block), "no {block} in {names:?}");
            }
            assert!(!names.contains(&"risks"), "{names:?}");
            let words = folded(&pdf_text(&sheet.pdf));
            let lines = pdf_lines(&sheet.pdf).join("\n");
            for needle in &needles {
                assert!(
                    words.contains(needle) || lines.contains(needle),
                    "{paper:?}: no {needle:?} in:\n{lines}"
                );
            }
            for needle in [
                "rectifying, ",
                "AGREED PROTECTION AND WHAT THIS PLAN ACHIEVES UNDER RECTIFYING INSPECTION (HYPERGEOMETRIC MODEL)",
                "p̄ = 0.2500%",
                "LTPD = ",
                "Sampling does not guarantee the quality of a lot",
            ] {
                assert!(
                    words.contains(needle),
                    "{paper:?}: no {needle:?} in {words}"
                );
            }
            // The rectifying procedure: a rejected lot is screened.
            for step in lotsman::words::rectifying_procedure(&plan, false) {
                assert!(
                    words.contains(&folded(&step)),
                    "no step {step:?} in {words}"
                );
            }
            assert!(!words.contains("returned or screened"), "{words}");
            assert!(!words.contains('?'), "a '?' reached the page:\n{words}");
        }
        // The command prints it, and verify knows its sheet.
        let pdf = path.with_extension("pdf");
        Command::cargo_bin("lotsman")
            .unwrap()
            .arg("sheet")
            .arg(path)
            .assert()
            .success();
        let (code, out) = verify_sheet(path.to_str().unwrap(), &std::fs::read(&pdf).unwrap(), &[]);
        assert_eq!(code, 0, "{out}");
    }
}
