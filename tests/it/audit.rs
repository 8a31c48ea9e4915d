//! Audit safety: a sheet is printed only from a recorded plan that a
//! re-solve confirms and that meets its recorded risk points (or, at the
//! user's request, with the discrepancy stated on the page); `verify` names
//! every field of every scheme that differs; and the YAML the tool writes
//! loads and saves back to the same bytes.

use crate::common;
use common::{lotsman, page_sizes, pdf_text, stdout_of};

use std::path::{Path, PathBuf};

use lotsman::{
    DEMO_PLANS, Paper, PlanSource, TEMPLATES, Verdict, audit, render_sheet_noting, verify,
};
use predicates::prelude::*;

const SEAL: &str = "plans/tpw-seal-visual.yaml";
const DOUBLE: &str = "plans/tpw-impeller-porosity.yaml";
const SEQUENTIAL: &str = "plans/tpw-sleeve-hardness.yaml";
const VARIABLES: &str = "plans/tpw-cover-thickness.yaml";
const MULTIPLE: &str = "tests/data/sheet-multiple-seven.yaml";

/// The demo source at `from` with `edits` (each `(old, new)` replaced
/// once) written to `name` in `dir`.
fn edited(dir: &Path, name: &str, from: &str, edits: &[(&str, &str)]) -> PathBuf {
    let mut text = std::fs::read_to_string(from).unwrap();
    for (old, new) in edits {
        assert!(text.contains(old), "{from} has no {old:?}");
        text = text.replacen(old, new, 1);
    }
    let path = dir.join(name);
    std::fs::write(&path, text).unwrap();
    path
}

/// A two-limit variables source with sigma known (M method), designed by
/// the command line into `dir`.
fn two_limit(dir: &Path) -> PathBuf {
    let path = dir.join("both.yaml");
    lotsman()
        .args([
            "design",
            "--scheme",
            "variables",
            "--sigma",
            "known",
            "--sigma-value",
            "0.012",
            "--limit",
            "both",
            "--lower",
            "11.95",
            "--upper",
            "12.05",
            "--aql",
            "1%",
            "--rql",
            "6%",
            "--output",
        ])
        .arg(&path)
        .assert()
        .success();
    path
}

/// A hand-edited source of each kind, with the field and values the
/// refusal must name.
fn edited_sources(dir: &Path) -> Vec<(PathBuf, String)> {
    let both = two_limit(dir);
    let text = std::fs::read_to_string(&both).unwrap();
    let m = text
        .lines()
        .find_map(|l| l.trim().strip_prefix("m: "))
        .unwrap()
        .to_string();
    vec![
        (
            edited(dir, "single.yaml", SEAL, &[("n: 166", "n: 150")]),
            "stage 1 n: recorded 150, re-solved 166".into(),
        ),
        (
            edited(dir, "double.yaml", DOUBLE, &[("n: 131", "n: 120")]),
            "stage 2 n: recorded 120, re-solved 131".into(),
        ),
        (
            edited(
                dir,
                "sequential.yaml",
                SEQUENTIAL,
                &[("truncation: 165", "truncation: 170")],
            ),
            "plan.sequential.truncation: recorded 170, re-solved 165".into(),
        ),
        (
            edited(dir, "variables.yaml", VARIABLES, &[("k: 1.901", "k: 1.7")]),
            "plan.variables.k: recorded 1.7, re-solved 1.901".into(),
        ),
        (
            edited(
                dir,
                "two-limit.yaml",
                both.to_str().unwrap(),
                &[(&format!("m: {m}"), "m: 0.05")],
            ),
            format!("plan.variables.m: recorded 0.05, re-solved {m}"),
        ),
    ]
}

#[test]
fn sheet_refuses_a_plan_a_re_solve_does_not_confirm_naming_the_field() {
    let dir = tempfile::tempdir().unwrap();
    for (source, field) in edited_sources(dir.path()) {
        let pdf = source.with_extension("pdf");
        let out = lotsman().arg("sheet").arg(&source).assert().code(2);
        let stderr = String::from_utf8(out.get_output().stderr.clone()).unwrap();
        assert_eq!(stderr.lines().count(), 1, "{stderr}");
        assert!(
            stderr.starts_with(&format!(
                "lotsman: error: {}: recorded plan differs from a re-solve: {field}",
                source.display()
            )) && stderr.contains("--accept-recorded"),
            "{stderr}"
        );
        assert!(!pdf.exists(), "{}", pdf.display());
    }
}

#[test]
fn sheet_refuses_a_plan_that_no_longer_meets_its_recorded_points() {
    // The consumer's quality moved from 4% to 3% by hand: n = 166, c = 3
    // accepts a lot at 3% far more often than one time in ten.
    let dir = tempfile::tempdir().unwrap();
    let source = edited(
        dir.path(),
        "tighter.yaml",
        SEAL,
        &[("consumer:\n  quality: 0.04", "consumer:\n  quality: 0.03")],
    );
    lotsman()
        .arg("sheet")
        .arg(&source)
        .assert()
        .code(2)
        .stderr(predicate::str::contains(
            "the recorded plan does not meet the consumer's point: beta at 3.000% is 0.2",
        ))
        .stderr(predicate::str::contains("above the agreed 0.1"));
    let found = audit(&PlanSource::load(&source).unwrap(), &source)
        .unwrap()
        .discrepancy
        .unwrap();
    assert_eq!(found.unmet.len(), 1);
    assert!(found.unmet[0].achieved > 0.2, "{:?}", found.unmet);
}

#[test]
fn a_plan_that_verifies_is_printed_without_a_notice() {
    for path in [SEAL, DOUBLE, SEQUENTIAL, VARIABLES, MULTIPLE] {
        let source = PlanSource::load(Path::new(path)).unwrap();
        assert_eq!(
            audit(&source, Path::new(path)).unwrap().discrepancy,
            None,
            "{path}"
        );
    }
    let dir = tempfile::tempdir().unwrap();
    let pdf = dir.path().join("seal.pdf");
    lotsman()
        .args(["sheet", SEAL, "--output"])
        .arg(&pdf)
        .assert()
        .success()
        .stderr(format!("lotsman: wrote sheet {}\n", pdf.display()));
    let words = pdf_text(&std::fs::read(&pdf).unwrap());
    assert!(!words.contains("PRINTED AS RECORDED"), "{words}");
    assert!(!words.contains("--accept-recorded"), "{words}");
}

/// The text of a PDF with its runs of white space folded, so that a
/// wrapped notice reads as one line.
fn folded_text(pdf: &[u8]) -> String {
    pdf_text(pdf)
        .split_whitespace()
        .collect::<Vec<_>>()
        .join(" ")
}

#[test]
fn accept_recorded_prints_the_discrepancy_on_the_sheet_and_says_so() {
    let dir = tempfile::tempdir().unwrap();
    for (source, field) in edited_sources(dir.path()) {
        let pdf = source.with_extension("pdf");
        lotsman()
            .arg("sheet")
            .arg(&source)
            .arg("--accept-recorded")
            .assert()
            .success()
            .stderr(predicate::str::starts_with(format!(
                "lotsman: warning: {}: recorded plan differs from a re-solve: {field}",
                source.display()
            )))
            .stderr(predicate::str::contains(
                "printed as recorded (--accept-recorded)",
            ));
        let words = folded_text(&std::fs::read(&pdf).unwrap());
        let name = source.file_name().unwrap().to_str().unwrap();
        for needle in [
            "PRINTED AS RECORDED AT THE USER'S REQUEST, NOT AS RE-SOLVED:",
            &format!("Recorded plan differs from a re-solve: {field}"),
            &format!("Regenerate with: lotsman sheet {name} --force --accept-recorded"),
        ] {
            assert!(words.contains(needle), "{name}: no {needle:?} in:\n{words}");
        }
        assert!(!words.contains('?'), "{name}: a '?' reached the page");
    }
}

#[test]
fn the_notice_fits_both_papers_without_overlaps_for_every_kind_of_plan() {
    let dir = tempfile::tempdir().unwrap();
    let mut sources = edited_sources(dir.path());
    sources.push((
        edited(
            dir.path(),
            "multiple.yaml",
            MULTIPLE,
            &[("accept: 0\n    reject: 3", "accept: 0\n    reject: 4")],
        ),
        "stage 2 reject: recorded 4, re-solved 3".into(),
    ));
    // Seven differing fields and an unmet point: the notice lists two and
    // counts the rest.
    sources.push((
        edited(
            dir.path(),
            "sequential-lines.yaml",
            SEQUENTIAL,
            &[
                ("h_accept: 1.408904715928249", "h_accept: 1.5"),
                ("h_reject: 1.8088541001243719", "h_reject: 1.9"),
                ("slope: 0.03595780690796235", "slope: 0.036"),
                ("truncation: 165", "truncation: 160"),
                ("final_acceptance: 5", "final_acceptance: 4"),
                ("producer_risk: 0.03955758828518037", "producer_risk: 0.04"),
                ("consumer_risk: 0.09999818504082597", "consumer_risk: 0.09"),
            ],
        ),
        "and 5 more fields (listed by: lotsman verify s.yaml)".into(),
    ));
    for (path, needle) in &sources {
        let text = std::fs::read_to_string(path).unwrap();
        let source = PlanSource::from_yaml(&text, path).unwrap();
        let found = audit(&source, path).unwrap().discrepancy.unwrap();
        for (paper, size) in [(Paper::A4, (210.0, 297.0)), (Paper::Letter, (215.9, 279.4))] {
            let sheet = render_sheet_noting(&text, &source, "s.yaml", paper, &found)
                .unwrap_or_else(|e| panic!("{} {paper:?}: {e}", path.display()));
            assert_eq!(page_sizes(&sheet.pdf).len(), 1);
            let notice = sheet
                .regions
                .iter()
                .find(|r| r.name == "notice")
                .unwrap_or_else(|| panic!("{}: no notice", path.display()));
            assert!(notice.h >= 8.0, "{notice:?}");
            for (i, a) in sheet.regions.iter().enumerate() {
                assert!(
                    a.x >= 0.0 && a.y >= 0.0 && a.x + a.w <= size.0 && a.y + a.h <= size.1,
                    "{} leaves the page",
                    a.name
                );
                for b in &sheet.regions[i + 1..] {
                    assert!(!a.overlaps(b), "{} overlaps {}", a.name, b.name);
                }
            }
            assert!(
                folded_text(&sheet.pdf).contains(needle.as_str()),
                "{}",
                path.display()
            );
        }
    }
}

#[test]
fn the_risk_table_gives_what_the_printed_plan_achieves() {
    // n = 150 instead of 166: the recorded consumer's risk (0.0979) belongs
    // to the old plan; the sheet prints the edited plan's 0.146.
    let dir = tempfile::tempdir().unwrap();
    let source = edited(dir.path(), "single.yaml", SEAL, &[("n: 166", "n: 150")]);
    lotsman()
        .arg("sheet")
        .arg(&source)
        .arg("--accept-recorded")
        .assert()
        .success();
    let words = folded_text(&std::fs::read(source.with_extension("pdf")).unwrap());
    assert!(words.contains("β = 0.146 (Pa = 0.1458)"), "{words}");
    assert!(!words.contains("β = 0.0979"), "{words}");
}

#[test]
fn a_batch_sheet_refuses_unconfirmed_sources_or_prints_them_with_the_notice() {
    let dir = tempfile::tempdir().unwrap();
    let root = dir.path().join("plans");
    std::fs::create_dir(&root).unwrap();
    std::fs::copy(SEAL, root.join("a-good.yaml")).unwrap();
    edited(&root, "b-single.yaml", SEAL, &[("n: 166", "n: 150")]);
    edited(
        &root,
        "c-variables.yaml",
        VARIABLES,
        &[("k: 1.901", "k: 1.7")],
    );
    let r = root.to_str().unwrap();
    let out = lotsman().args(["sheet", r]).assert().code(2);
    let printed = String::from_utf8(out.get_output().stdout.clone()).unwrap();
    let lines: Vec<&str> = printed.lines().collect();
    assert_eq!(lines.len(), 3, "{printed}");
    for (line, name, field) in [
        (
            lines[0],
            "b-single.yaml",
            "stage 1 n: recorded 150, re-solved 166",
        ),
        (
            lines[1],
            "c-variables.yaml",
            "plan.variables.k: recorded 1.7, re-solved 1.901",
        ),
    ] {
        let head = format!(
            "invalid   {}: recorded plan differs from a re-solve: {field}",
            root.join(name).display()
        );
        assert!(line.starts_with(&head), "{line}");
    }
    assert_eq!(lines[2], "1 written, 2 invalid");
    assert!(root.join("a-good.pdf").is_file());
    assert!(!root.join("b-single.pdf").exists() && !root.join("c-variables.pdf").exists());

    std::fs::remove_file(root.join("a-good.pdf")).unwrap();
    let out = lotsman()
        .args(["sheet", r, "--accept-recorded"])
        .assert()
        .success()
        .stdout("3 written, 0 invalid\n");
    let stderr = String::from_utf8(out.get_output().stderr.clone()).unwrap();
    let warned: Vec<&str> = stderr.lines().collect();
    assert_eq!(warned.len(), 2, "{stderr}");
    assert!(warned[0].contains("b-single.yaml") && warned[1].contains("c-variables.yaml"));
    for (name, notice) in [("a-good", false), ("b-single", true), ("c-variables", true)] {
        let words = folded_text(&std::fs::read(root.join(format!("{name}.pdf"))).unwrap());
        assert_eq!(words.contains("PRINTED AS RECORDED"), notice, "{name}");
    }
}

/// Verifies `source` after `edit` and returns the differing fields.
fn differing_fields(path: &Path, edit: impl FnOnce(&mut PlanSource)) -> Vec<String> {
    let mut source = PlanSource::load(path).unwrap();
    edit(&mut source);
    match verify(&source).unwrap() {
        Verdict::Match => Vec::new(),
        Verdict::Mismatch(d) => d.into_iter().map(|d| d.field).collect(),
    }
}

#[test]
fn verify_names_every_field_of_every_scheme() {
    let dir = tempfile::tempdir().unwrap();
    let both = two_limit(dir.path());
    type Edit = Box<dyn FnOnce(&mut PlanSource)>;
    let cases: Vec<(&Path, &str, Edit)> = vec![
        (
            Path::new(SEAL),
            "stage 1 n",
            Box::new(|s| s.plan.as_mut().unwrap().stages[0].n += 1),
        ),
        (
            Path::new(SEAL),
            "stage 1 accept",
            Box::new(|s| s.plan.as_mut().unwrap().stages[0].accept = Some(2)),
        ),
        (
            Path::new(SEAL),
            "stage 1 reject",
            Box::new(|s| s.plan.as_mut().unwrap().stages[0].reject = 5),
        ),
        (
            Path::new(DOUBLE),
            "stage 2 accept",
            Box::new(|s| s.plan.as_mut().unwrap().stages[1].accept = Some(2)),
        ),
        (
            Path::new(MULTIPLE),
            "number of stages",
            Box::new(|s| {
                s.plan.as_mut().unwrap().stages.pop();
            }),
        ),
        (
            Path::new(SEQUENTIAL),
            "plan.sequential.h_accept",
            Box::new(|s| {
                s.plan
                    .as_mut()
                    .unwrap()
                    .sequential
                    .as_mut()
                    .unwrap()
                    .h_accept += 1e-12
            }),
        ),
        (
            Path::new(SEQUENTIAL),
            "plan.sequential.h_reject",
            Box::new(|s| {
                s.plan
                    .as_mut()
                    .unwrap()
                    .sequential
                    .as_mut()
                    .unwrap()
                    .h_reject += 0.1
            }),
        ),
        (
            Path::new(SEQUENTIAL),
            "plan.sequential.slope",
            Box::new(|s| s.plan.as_mut().unwrap().sequential.as_mut().unwrap().slope *= 1.01),
        ),
        (
            Path::new(SEQUENTIAL),
            "plan.sequential.truncation",
            Box::new(|s| {
                s.plan
                    .as_mut()
                    .unwrap()
                    .sequential
                    .as_mut()
                    .unwrap()
                    .truncation += 1
            }),
        ),
        (
            Path::new(SEQUENTIAL),
            "plan.sequential.final_acceptance",
            Box::new(|s| {
                s.plan
                    .as_mut()
                    .unwrap()
                    .sequential
                    .as_mut()
                    .unwrap()
                    .final_acceptance -= 1
            }),
        ),
        (
            Path::new(SEQUENTIAL),
            "plan",
            Box::new(|s| {
                let p = s.plan.as_mut().unwrap();
                p.sequential = None;
                p.stages = vec![lotsman::Stage {
                    n: 165,
                    accept: Some(5),
                    reject: 6,
                }];
            }),
        ),
        (
            Path::new(VARIABLES),
            "plan.variables.n",
            Box::new(|s| s.plan.as_mut().unwrap().variables.as_mut().unwrap().n += 1),
        ),
        (
            Path::new(VARIABLES),
            "plan.variables.k",
            Box::new(|s| s.plan.as_mut().unwrap().variables.as_mut().unwrap().k = Some(1.9)),
        ),
        (
            &both,
            "plan.variables.m",
            Box::new(|s| s.plan.as_mut().unwrap().variables.as_mut().unwrap().m = Some(0.04)),
        ),
        (
            Path::new(SEAL),
            "plan.producer_risk",
            Box::new(|s| *s.plan.as_mut().unwrap().producer_risk.as_mut().unwrap() *= 1.0 + 1e-8),
        ),
        (
            Path::new(VARIABLES),
            "plan.consumer_risk",
            Box::new(|s| s.plan.as_mut().unwrap().consumer_risk = Some(f64::NAN)),
        ),
        (
            Path::new(DOUBLE),
            "plan.producer_risk",
            Box::new(|s| s.plan.as_mut().unwrap().producer_risk = Some(f64::INFINITY)),
        ),
    ];
    for (path, field, edit) in cases {
        let fields = differing_fields(path, edit);
        assert_eq!(fields, [field], "{}", path.display());
    }
    // A source without a plan is not solved yet: an error, not a field
    // that differs.
    let mut unsolved = PlanSource::load(Path::new(SEAL)).unwrap();
    unsolved.plan = None;
    assert!(matches!(
        verify(&unsolved),
        Err(lotsman::Error::Input(lotsman::InputError::NotSolved { .. }))
    ));
    // Within the tolerance a recorded risk still matches.
    let fields = differing_fields(Path::new(SEAL), |s| {
        *s.plan.as_mut().unwrap().producer_risk.as_mut().unwrap() *= 1.0 + 1e-12
    });
    assert!(fields.is_empty(), "{fields:?}");
}

/// Load and save: the bytes the tool wrote come back unchanged.
fn assert_round_trip(text: &str, what: &str) {
    let source = PlanSource::from_yaml(text, Path::new(what)).unwrap();
    assert_eq!(source.to_yaml(), text, "{what} does not round-trip");
}

#[test]
fn every_demo_plan_round_trips_and_re_solves_to_the_same_bytes() {
    let dir = tempfile::tempdir().unwrap();
    for (name, text) in DEMO_PLANS {
        assert_round_trip(text, name);
        let path = dir.path().join(name);
        std::fs::write(&path, text).unwrap();
        let again = stdout_of(&["design", "--format", "yaml", &path.to_string_lossy()]);
        assert_eq!(again, *text, "{name}");
    }
}

/// Solves `source` into `out` with `design --output`, checks that the file
/// round-trips and that solving it again writes the same bytes.
fn assert_written_source_round_trips(source: &Path, out: &Path) {
    lotsman()
        .arg("design")
        .arg(source)
        .arg("--output")
        .arg(out)
        .assert()
        .success();
    check_written(out);
}

/// The source the tool wrote at `path` round-trips, and re-solving it
/// writes the same bytes.
fn check_written(path: &Path) {
    let text = std::fs::read_to_string(path).unwrap();
    assert_round_trip(&text, &path.display().to_string());
    let again = path.with_extension("again.yaml");
    lotsman()
        .arg("design")
        .arg(path)
        .arg("--output")
        .arg(&again)
        .assert()
        .success();
    assert_eq!(
        std::fs::read_to_string(&again).unwrap(),
        text,
        "{} re-solved",
        path.display()
    );
}

#[test]
fn every_template_once_solved_round_trips() {
    let dir = tempfile::tempdir().unwrap();
    for (kind, text) in TEMPLATES {
        let template = dir.path().join(format!("{kind}.yaml"));
        std::fs::write(&template, text).unwrap();
        assert_written_source_round_trips(
            &template,
            &dir.path().join(format!("{kind}-solved.yaml")),
        );
    }
}

#[test]
fn sources_written_by_design_output_round_trip_for_every_scheme() {
    let dir = tempfile::tempdir().unwrap();
    let requests: &[(&str, &[&str])] = &[
        ("binomial", &["--aql", "1%", "--rql", "6%"]),
        (
            "hypergeometric",
            &[
                "--aql",
                "0.65%",
                "--rql",
                "4%",
                "--lot-size",
                "2000",
                "--title",
                "Seals, lot of 2000",
            ],
        ),
        (
            "poisson",
            &["--aql", "0.02", "--rql", "0.09", "--model", "poisson"],
        ),
        (
            "double",
            &[
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--scheme",
                "double",
                "--criterion",
                "asn-max",
            ],
        ),
        (
            "double-ratio",
            &[
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--scheme",
                "double",
                "--second-ratio",
                "2",
            ],
        ),
        (
            "multiple",
            &[
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--scheme",
                "multiple",
                "--stage-count",
                "4",
            ],
        ),
        (
            "sequential",
            &["--aql", "1.5%", "--rql", "7%", "--scheme", "sequential"],
        ),
        (
            "variables-known-lower",
            &[
                "--scheme",
                "variables",
                "--sigma",
                "known",
                "--sigma-value",
                "0.02",
                "--limit",
                "lower",
                "--lower",
                "11.95",
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--unit",
                "mm",
            ],
        ),
        (
            "variables-unknown-upper",
            &[
                "--scheme",
                "variables",
                "--sigma",
                "unknown",
                "--limit",
                "upper",
                "--upper",
                "12.05",
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--lot-size",
                "600",
            ],
        ),
        (
            "variables-unknown-both",
            &[
                "--scheme",
                "variables",
                "--sigma",
                "unknown",
                "--limit",
                "both",
                "--lower",
                "11.95",
                "--upper",
                "12.05",
                "--aql",
                "1%",
                "--rql",
                "6%",
            ],
        ),
    ];
    for (name, args) in requests {
        let out = dir.path().join(format!("{name}.yaml"));
        lotsman()
            .arg("design")
            .args(*args)
            .arg("--output")
            .arg(&out)
            .assert()
            .success();
        check_written(&out);
    }
    let two = two_limit(dir.path());
    check_written(&two);
}

/// The arguments that decide a lot of `source` by `judge`: a count for an
/// attributes plan; for a variables plan, a file of as many readings as
/// its sample (near 12, spread a little) written beside the source.
fn judge_args(source: &Path) -> Vec<String> {
    let loaded = PlanSource::load(source).unwrap();
    let mut args = vec!["judge".to_string(), source.display().to_string()];
    match loaded.plan.as_ref().and_then(|p| p.variables) {
        Some(v) => {
            let csv = source.with_extension("csv");
            let readings: String = (0..v.n)
                .map(|i| format!("{:.3}\n", 12.0 + 0.002 * (i % 7) as f64 - 0.006))
                .collect();
            std::fs::write(&csv, readings).unwrap();
            args.extend(["--measurements".into(), csv.display().to_string()]);
        }
        None => args.extend(["--found".into(), "0".into()]),
    }
    args
}

#[test]
fn judge_and_evaluate_refuse_a_plan_a_re_solve_does_not_confirm_naming_the_field() {
    let dir = tempfile::tempdir().unwrap();
    for (source, field) in edited_sources(dir.path()) {
        let evaluate = vec!["evaluate".to_string(), source.display().to_string()];
        for args in [judge_args(&source), evaluate] {
            let out = lotsman().args(&args).assert().code(2);
            let output = out.get_output();
            assert!(output.stdout.is_empty(), "{args:?}");
            let stderr = String::from_utf8(output.stderr.clone()).unwrap();
            assert_eq!(stderr.lines().count(), 1, "{stderr}");
            assert!(
                stderr.starts_with(&format!(
                    "lotsman: error: {}: recorded plan differs from a re-solve: {field}",
                    source.display()
                )) && stderr.contains("--accept-recorded"),
                "{args:?}: {stderr}"
            );
        }
    }
}

#[test]
fn judge_and_evaluate_with_accept_recorded_state_the_discrepancy_in_every_format() {
    let dir = tempfile::tempdir().unwrap();
    for (source, field) in edited_sources(dir.path()) {
        let shown = source.display().to_string();
        let warning =
            format!("lotsman: warning: {shown}: recorded plan differs from a re-solve: {field}");
        // Text and table: the first line states it; stderr warns.
        let mut judge = judge_args(&source);
        judge.push("--accept-recorded".into());
        let evaluate = vec![
            "evaluate".to_string(),
            shown.clone(),
            "--accept-recorded".into(),
        ];
        for (args, head) in [
            (
                &judge,
                "DECIDED BY THE PLAN AS RECORDED (--accept-recorded): ",
            ),
            (&evaluate, "EVALUATED AS RECORDED (--accept-recorded): "),
        ] {
            let out = lotsman().args(args).assert().success();
            let stdout = String::from_utf8(out.get_output().stdout.clone()).unwrap();
            let stderr = String::from_utf8(out.get_output().stderr.clone()).unwrap();
            assert!(
                stdout.starts_with(&format!(
                    "{head}recorded plan differs from a re-solve: {field}"
                )),
                "{args:?}:\n{stdout}"
            );
            assert!(stderr.starts_with(&warning), "{args:?}: {stderr}");
            // JSON: the key holds the discrepancy.
            let mut json_args = args.clone();
            json_args.extend(["--format".into(), "json".into()]);
            let out = lotsman().args(&json_args).assert().success();
            let value: serde_json::Value =
                serde_json::from_slice(&out.get_output().stdout).unwrap();
            let accepted = value["accepted_recorded"].as_str().unwrap_or_default();
            assert!(
                accepted.starts_with(&format!("recorded plan differs from a re-solve: {field}")),
                "{json_args:?}: {value}"
            );
        }
    }
    // A confirmed plan carries no such line or key.
    let plain = stdout_of(&["evaluate", SEAL, "--format", "json", "--accept-recorded"]);
    assert!(!plain.contains("accepted_recorded"), "{plain}");
    let plain = stdout_of(&["judge", SEAL, "--found", "1", "--accept-recorded"]);
    assert!(plain.starts_with("ACCEPT the lot"), "{plain}");
}

#[test]
fn a_batch_evaluation_refuses_an_unconfirmed_source_or_states_its_discrepancy() {
    let dir = tempfile::tempdir().unwrap();
    let root = dir.path().join("plans");
    std::fs::create_dir(&root).unwrap();
    std::fs::copy(SEAL, root.join("a-good.yaml")).unwrap();
    edited(&root, "b-single.yaml", SEAL, &[("n: 166", "n: 150")]);
    let r = root.to_str().unwrap();
    let out = lotsman()
        .args(["evaluate", r, "--at", "1%"])
        .assert()
        .code(2);
    let stdout = String::from_utf8(out.get_output().stdout.clone()).unwrap();
    assert!(
        stdout.contains(&format!(
            "invalid   {}: recorded plan differs from a re-solve: ",
            root.join("b-single.yaml").display()
        )) && stdout.ends_with("1 evaluated, 1 invalid\n"),
        "{stdout}"
    );
    let out = lotsman()
        .args([
            "evaluate",
            r,
            "--at",
            "1%",
            "--format",
            "json",
            "--accept-recorded",
        ])
        .assert()
        .success();
    let value: serde_json::Value = serde_json::from_slice(&out.get_output().stdout).unwrap();
    let results = value["results"].as_array().unwrap();
    assert!(results[0]["evaluation"].get("accepted_recorded").is_none());
    let accepted = results[1]["evaluation"]["accepted_recorded"]
        .as_str()
        .unwrap();
    assert!(
        accepted.contains("recorded 150, re-solved 166"),
        "{accepted}"
    );
    let stderr = String::from_utf8(out.get_output().stderr.clone()).unwrap();
    assert!(stderr.contains("b-single.yaml: recorded plan differs") && !stderr.contains("a-good"));
}
