//! A minimum-inspection plan kept as a plan source (`scheme: rectifying`,
//! issue 14, item 15): `rectify --output` writes it, it loads and saves to
//! the same bytes, `verify` re-solves it and names what differs, `audit`
//! (before sheet, judge, evaluate) refuses an edited one, and `judge` and
//! `evaluate` use its plan. The plans are the ones tests/rectify_cli.rs
//! checks against the exhaustive scipy search
//! (tests/data/minimum_reference.json): n = 766, c = 4 for a lot of 5000 at
//! a process average of 0.25% with an LTPD of 1%.

use crate::common;
use common::{json_of, lotsman, stdout_of};

use std::path::{Path, PathBuf};

use lotsman::{PlanSource, Verdict, audit, verify};
use predicates::prelude::*;

/// The LTPD request of the reference row, single, as `rectify` flags.
const LTPD: [&str; 6] = [
    "--lot-size",
    "5000",
    "--process-average",
    "0.25%",
    "--ltpd",
    "1%",
];

/// An AOQL request, double.
const AOQL_DOUBLE: [&str; 8] = [
    "--lot-size",
    "5000",
    "--process-average",
    "0.25%",
    "--aoql",
    "1%",
    "--scheme",
    "double",
];

/// `rectify` with `args --output dir/name`; the path written.
fn written(dir: &Path, name: &str, args: &[&str]) -> PathBuf {
    let path = dir.join(name);
    lotsman()
        .arg("rectify")
        .args(args)
        .arg("--output")
        .arg(&path)
        .assert()
        .success()
        .stderr(format!("lotsman: wrote plan source {}\n", path.display()));
    path
}

/// The source at `path` with `old` replaced by `new` once, written to
/// `name` beside it.
fn edited(path: &Path, name: &str, old: &str, new: &str) -> PathBuf {
    let text = std::fs::read_to_string(path).unwrap();
    assert!(text.contains(old), "no {old:?} in:\n{text}");
    let out = path.with_file_name(name);
    std::fs::write(&out, text.replacen(old, new, 1)).unwrap();
    out
}

#[test]
fn rectify_output_writes_a_source_that_round_trips_and_verifies() {
    let dir = tempfile::tempdir().unwrap();
    let poisson = ["--model", "poisson", "--title", "Paint runs per housing"];
    let cases = [
        ("ltpd.yaml", [&LTPD[..], &[]].concat()),
        ("aoql-double.yaml", AOQL_DOUBLE.to_vec()),
        ("poisson.yaml", [&LTPD[..], &poisson[..]].concat()),
    ];
    for (name, args) in cases {
        let path = written(dir.path(), name, &args);
        let text = std::fs::read_to_string(&path).unwrap();
        let source = PlanSource::from_yaml(&text, &path).unwrap();
        assert_eq!(source.to_yaml(), text, "{name} round trip");
        assert_eq!(verify(&source).unwrap(), Verdict::Match, "{name}");
        assert_eq!(audit(&source, &path).unwrap().discrepancy, None, "{name}");
        lotsman()
            .arg("verify")
            .arg(&path)
            .assert()
            .success()
            .stdout("1 match, 0 mismatch, 0 invalid\n");
        // The figures recorded are the report's own (which JSON gives to 16
        // significant digits).
        let report = json_of(&[&["rectify"], &args[..], &["--format", "json"]].concat());
        let plan = source.plan.as_ref().unwrap();
        let close = |a: Option<f64>, b: Option<f64>| match (a, b) {
            (Some(a), Some(b)) => (a - b).abs() <= 1e-14 * b.abs(),
            (a, b) => a == b,
        };
        assert!(close(plan.ati, report["plan"]["ati"].as_f64()), "{name}");
        assert!(
            close(plan.aoql, report["plan"]["aoql"]["value"].as_f64()),
            "{name}"
        );
        assert!(
            close(plan.consumer_risk, report["plan"]["pa_at_ltpd"].as_f64()),
            "{name}"
        );
        assert_eq!(plan.producer_risk, None);
    }
    let text = std::fs::read_to_string(dir.path().join("ltpd.yaml")).unwrap();
    for needle in [
        "scheme: rectifying\nrectifying:\n  form: single\n  process_average: 0.0025\n  ltpd: 0.01\n  beta: 0.1\nmodel: hypergeometric\nlot_size: 5000\n",
        "  - n: 766\n    accept: 4\n    reject: 5\n",
    ] {
        assert!(text.contains(needle), "{needle:?} in:\n{text}");
    }
    assert!(!text.contains("producer"), "{text}");
}

#[test]
fn the_template_solves_with_design_and_verifies() {
    let dir = tempfile::tempdir().unwrap();
    let template = dir.path().join("r.yaml");
    std::fs::write(&template, stdout_of(&["new", "rectifying"])).unwrap();
    let solved = dir.path().join("r-solved.yaml");
    let out = lotsman()
        .arg("design")
        .arg(&template)
        .arg("--output")
        .arg(&solved)
        .assert()
        .success();
    let table = String::from_utf8(out.get_output().stdout.clone()).unwrap();
    assert!(table.contains("PLAN  n = 766, c = 4"), "{table}");
    let text = std::fs::read_to_string(&solved).unwrap();
    assert_eq!(
        PlanSource::from_yaml(&text, &solved).unwrap().to_yaml(),
        text
    );
    lotsman().arg("verify").arg(&solved).assert().success();
}

/// `design --in-place` records the plan in the source it read, as
/// `--output` does in another file: it once said "re-solved" and left the
/// template without its plan.
#[test]
fn the_template_solves_in_place() {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("r.yaml");
    std::fs::write(&path, stdout_of(&["new", "rectifying"])).unwrap();
    lotsman()
        .arg("design")
        .arg(&path)
        .arg("--in-place")
        .assert()
        .success();
    let text = std::fs::read_to_string(&path).unwrap();
    assert!(text.contains("plan:\n  stages:\n  - n: 766\n"), "{text}");
    lotsman().arg("verify").arg(&path).assert().success();
}

#[test]
fn verify_names_what_differs_in_an_edited_rectifying_source() {
    let dir = tempfile::tempdir().unwrap();
    let ltpd = written(dir.path(), "ltpd.yaml", &LTPD);
    let double = written(dir.path(), "double.yaml", &AOQL_DOUBLE);
    let ati = PlanSource::load(&ltpd).unwrap().plan.unwrap().ati.unwrap();
    let cases = [
        (
            edited(&ltpd, "n.yaml", "n: 766", "n: 700"),
            "stage 1 n: recorded 700, re-solved 766",
        ),
        (
            edited(&ltpd, "ati.yaml", &format!("ati: {ati}"), "ati: 900"),
            "plan.ati: recorded 900, re-solved",
        ),
        (
            edited(
                &ltpd,
                "average.yaml",
                "process_average: 0.0025",
                "process_average: 0.004",
            ),
            "stage 1 n: recorded 766, re-solved",
        ),
        (
            edited(&double, "double-n.yaml", "n: 363", "n: 340"),
            "stage 2 n: recorded 340, re-solved 363",
        ),
    ];
    for (path, field) in cases {
        let out = lotsman().arg("verify").arg(&path).assert().code(1);
        let stdout = String::from_utf8(out.get_output().stdout.clone()).unwrap();
        assert!(
            stdout.starts_with(&format!("mismatch  {}: {field}", path.display())),
            "{stdout}"
        );
    }
}

#[test]
fn an_edited_rectifying_source_is_refused_by_sheet_judge_and_evaluate() {
    let dir = tempfile::tempdir().unwrap();
    let ltpd = written(dir.path(), "ltpd.yaml", &LTPD);
    let aoql = written(
        dir.path(),
        "aoql.yaml",
        &[
            "--lot-size",
            "5000",
            "--process-average",
            "0.25%",
            "--aoql",
            "1%",
        ],
    );
    // n cut by hand: differs from a re-solve and accepts a lot at the
    // LTPD more often than the agreed beta.
    let cut = edited(&ltpd, "cut.yaml", "n: 766", "n: 600");
    // The agreed AOQL lowered by hand: the recorded plan's AOQL is above it.
    let aoql_text = std::fs::read_to_string(&aoql).unwrap();
    assert!(aoql_text.contains("  aoql: 0.01\n"), "{aoql_text}");
    let lowered = dir.path().join("lowered.yaml");
    std::fs::write(
        &lowered,
        aoql_text.replacen("  aoql: 0.01\n", "  aoql: 0.005\n", 1),
    )
    .unwrap();
    let cases = [
        (
            &cut,
            "recorded plan differs from a re-solve: stage 1 n: recorded 600, re-solved 766",
            "the recorded plan does not meet the consumer's point: beta at 1.000% is",
        ),
        (
            &lowered,
            "recorded plan differs from a re-solve: stage 1 n",
            "the recorded plan does not meet the consumer's protection: its AOQL is",
        ),
    ];
    for (path, field, unmet) in cases {
        let p = path.to_str().unwrap();
        for args in [
            vec!["sheet", p],
            vec!["judge", p, "--found", "1"],
            vec!["evaluate", p],
        ] {
            let out = lotsman().args(&args).assert().code(2);
            let stderr = String::from_utf8(out.get_output().stderr.clone()).unwrap();
            assert!(
                stderr.starts_with(&format!("lotsman: error: {p}: {field}"))
                    && stderr.contains(unmet)
                    && stderr.contains("--accept-recorded"),
                "{args:?}: {stderr}"
            );
        }
        lotsman()
            .args(["sheet", p, "--accept-recorded"])
            .assert()
            .success()
            .stderr(predicate::str::contains(unmet));
    }
}

#[test]
fn judge_and_evaluate_use_the_recorded_plan() {
    let dir = tempfile::tempdir().unwrap();
    let single = written(dir.path(), "single.yaml", &LTPD);
    let double = written(dir.path(), "double.yaml", &AOQL_DOUBLE);
    let (s, d) = (single.to_str().unwrap(), double.to_str().unwrap());
    let verdict = |args: &[&str]| stdout_of(args).lines().next().unwrap_or("").to_string();
    assert_eq!(verdict(&["judge", s, "--found", "4"]), "ACCEPT the lot");
    assert_eq!(verdict(&["judge", s, "--found", "5"]), "REJECT the lot");
    // Double: 38 units, then 325 more; accept at 0, reject at 5.
    assert_eq!(verdict(&["judge", d, "--found", "0"]), "ACCEPT the lot");
    assert_eq!(
        verdict(&["judge", d, "--found", "2"]),
        "GO ON to the next stage"
    );
    assert_eq!(
        verdict(&["judge", d, "--found", "2", "--found", "3"]),
        "REJECT the lot"
    );
    // Evaluate: at the process average the ATI is the recorded one, and
    // the default qualities bracket the process average and the LTPD.
    let ati = PlanSource::load(&single)
        .unwrap()
        .plan
        .unwrap()
        .ati
        .unwrap();
    let v = json_of(&["evaluate", s, "--at", "0.25%", "--format", "json"]);
    let at = v["points"][0]["ati"].as_f64().unwrap();
    assert!((at - ati).abs() < 1e-9 * ati, "{at} against {ati}");
    let v = json_of(&["evaluate", s, "--format", "json"]);
    let qualities: Vec<f64> = v["points"]
        .as_array()
        .unwrap()
        .iter()
        .map(|p| p["quality"].as_f64().unwrap())
        .collect();
    assert_eq!(qualities.len(), 8, "{qualities:?}");
    assert!(
        qualities.contains(&0.0025) && qualities.contains(&0.01),
        "{qualities:?}"
    );
}

#[test]
fn rectify_output_keeps_the_write_rules() {
    let dir = tempfile::tempdir().unwrap();
    let path = written(dir.path(), "r.yaml", &LTPD);
    let before = std::fs::read(&path).unwrap();
    // An existing file is replaced only with --force.
    lotsman()
        .arg("rectify")
        .args(AOQL_DOUBLE)
        .arg("--output")
        .arg(&path)
        .assert()
        .code(2)
        .stderr(predicate::str::contains("already exists; give --force"));
    assert_eq!(std::fs::read(&path).unwrap(), before);
    lotsman()
        .arg("rectify")
        .args(AOQL_DOUBLE)
        .arg("--output")
        .arg(&path)
        .arg("--force")
        .assert()
        .success();
    assert!(
        std::fs::read_to_string(&path)
            .unwrap()
            .contains("form: double")
    );
    // 100% inspection is no sampling plan to record: nothing is written.
    let full = dir.path().join("full.yaml");
    lotsman()
        .args([
            "rectify",
            "--lot-size",
            "50",
            "--process-average",
            "0.5%",
            "--ltpd",
            "2%",
            "--model",
            "binomial",
            "--output",
        ])
        .arg(&full)
        .assert()
        .code(2)
        .stderr(predicate::str::contains(
            "the minimum-inspection answer is to inspect every unit of the lot of 50",
        ));
    assert!(!full.exists());
    // A PDF name gets no YAML.
    let pdf = dir.path().join("r.pdf");
    lotsman()
        .arg("rectify")
        .args(LTPD)
        .arg("--output")
        .arg(&pdf)
        .assert()
        .code(2)
        .stderr(predicate::str::contains("lotsman sheet FILE.yaml"));
    assert!(!pdf.exists());
}

/// `status` holds a ledger of a minimum-inspection plan against the
/// process average it was designed for, 0.25%, and its LTPD (it once
/// compared with nothing and never warned). Clopper–Pearson intervals
/// (scipy `beta.ppf`): LTPD 1%, n = 766, 4 + 5 found: 0.269% to 1.112%,
/// above 0.25% and reaching the LTPD; AOQL 1%, n = 134, 2 + 3 found:
/// 0.608% to 4.30%, above 0.25%, with no LTPD to reach.
#[test]
fn status_compares_the_process_average_with_the_design() {
    for (protection, counts, rql, warnings) in [
        ("ltpd: 1%\n  beta: 0.10", ["4", "5"], Some(0.01), 2),
        ("aoql: 1%", ["2", "3"], None, 1),
    ] {
        let dir = tempfile::tempdir().unwrap();
        let text = stdout_of(&["new", "rectifying"]).replace(
            "ltpd: 1%                               # a lot this bad is accepted with probability at most beta\n  beta: 0.10",
            protection,
        );
        std::fs::write(dir.path().join("r.yaml"), text).unwrap();
        let run = |args: &[&str]| {
            let out = lotsman()
                .current_dir(dir.path())
                .args(args)
                .output()
                .unwrap();
            assert!(out.status.success(), "{args:?}: {out:?}");
            String::from_utf8(out.stdout).unwrap()
        };
        run(&["design", "r.yaml", "--in-place"]);
        for (lot, k) in ["L1", "L2"].into_iter().zip(counts) {
            run(&[
                "judge", "r.yaml", "--record", "log.csv", "--lot", lot, "--found", k,
            ]);
        }
        let status: serde_json::Value = serde_json::from_str(&run(&[
            "status", "log.csv", "--plan", "r.yaml", "--format", "json",
        ]))
        .unwrap();
        let pa = &status["process_average"];
        assert_eq!(pa["design_average"].as_f64(), Some(0.0025));
        assert_eq!(pa["rql"].as_f64(), rql);
        let w = status["warnings"].as_array().unwrap();
        assert_eq!(w.len(), warnings, "{w:?}");
        assert!(
            w[0].as_str()
                .unwrap()
                .contains("above the one the plan was designed for")
        );
    }
}
