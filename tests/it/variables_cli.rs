//! The command-line contract of variables plans: design flags and JSON
//! keys, evaluate, verify, and judging a lot from its measurements.

use crate::common;
use common::lotsman;

use predicates::prelude::*;
use serde_json::Value;

const UPPER_UNKNOWN: &[&str] = &[
    "design",
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
];

/// A solved sigma-unknown upper-limit source in a temporary folder.
fn solved_source(dir: &tempfile::TempDir) -> std::path::PathBuf {
    let path = dir.path().join("v.yaml");
    lotsman()
        .args(UPPER_UNKNOWN)
        .args(["--output", path.to_str().unwrap()])
        .assert()
        .success();
    path
}

#[test]
fn design_json_has_the_variables_object_and_the_attributes_comparison() {
    let out = lotsman()
        .args(UPPER_UNKNOWN)
        .args(["--format", "json"])
        .assert()
        .success()
        .get_output()
        .stdout
        .clone();
    let v: Value = serde_json::from_slice(&out).unwrap();
    assert_eq!(v["scheme"], "variables");
    let var = &v["variables"];
    for key in ["n", "k", "k_range", "sigma", "limit"] {
        assert!(var.get(key).is_some(), "missing variables.{key}");
    }
    assert_eq!(var["sigma"], "unknown");
    assert_eq!(var["limit"], "upper");
    let (n, k) = (var["n"].as_u64().unwrap(), var["k"].as_f64().unwrap());
    let range = var["k_range"].as_array().unwrap();
    assert!(range[0].as_f64().unwrap() < k && k < range[1].as_f64().unwrap());
    let attributes = v["attributes_plan"]["n"].as_u64().unwrap();
    assert_eq!(
        v["sample_saved"].as_i64().unwrap(),
        attributes as i64 - n as i64
    );
    assert!(v["large_sample_n"].as_f64().unwrap() > 1.0);
    assert!(v["producer"]["achieved_risk"].as_f64().unwrap() <= 0.05);
}

#[test]
fn two_limits_report_m_and_its_range() {
    let out = lotsman()
        .args([
            "design",
            "--scheme",
            "variables",
            "--sigma",
            "known",
            "--sigma-value",
            "0.01",
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
            "--format",
            "json",
        ])
        .assert()
        .success()
        .get_output()
        .stdout
        .clone();
    let v: Value = serde_json::from_slice(&out).unwrap();
    let m = v["variables"]["m"].as_f64().unwrap();
    let range = v["variables"]["m_range"].as_array().unwrap();
    assert!(range[0].as_f64().unwrap() < m && m < range[1].as_f64().unwrap());
    assert!(v["variables"]["k"].is_null());
}

#[test]
fn variables_flags_are_checked_and_named() {
    let cases: &[(&[&str], &str)] = &[
        (
            &["--scheme", "variables", "--limit", "upper", "--upper", "1"],
            "--sigma",
        ),
        (
            &[
                "--scheme",
                "variables",
                "--sigma",
                "known",
                "--limit",
                "upper",
                "--upper",
                "1",
            ],
            "--sigma-value",
        ),
        (
            &[
                "--scheme",
                "variables",
                "--sigma",
                "unknown",
                "--limit",
                "upper",
            ],
            "--upper",
        ),
        (
            &[
                "--scheme",
                "variables",
                "--sigma",
                "unknown",
                "--limit",
                "upper",
                "--upper",
                "1",
                "--lower",
                "0",
            ],
            "--limit both",
        ),
        (
            &[
                "--scheme",
                "variables",
                "--sigma",
                "unknown",
                "--limit",
                "both",
                "--upper",
                "1",
                "--lower",
                "2",
            ],
            "must be below",
        ),
        (
            &[
                "--scheme",
                "variables",
                "--sigma",
                "unknown",
                "--limit",
                "upper",
                "--upper",
                "1",
                "--model",
                "poisson",
            ],
            "poisson",
        ),
        (
            &["--scheme", "single", "--sigma", "unknown"],
            "variables plans",
        ),
        (
            &[
                "--scheme",
                "variables",
                "--sigma",
                "known",
                "--sigma-value",
                "0.1",
                "--limit",
                "both",
                "--lower",
                "0",
                "--upper",
                "0.4",
            ],
            "too close",
        ),
    ];
    for (args, fragment) in cases {
        lotsman()
            .args(["design", "--aql", "1%", "--rql", "6%"])
            .args(*args)
            .assert()
            .code(2)
            .stderr(predicate::str::contains(*fragment));
    }
}

#[test]
fn a_variables_source_evaluates_verifies_and_catches_an_edited_constant() {
    let dir = tempfile::tempdir().unwrap();
    let path = solved_source(&dir);
    lotsman()
        .args(["evaluate", path.to_str().unwrap(), "--at", "1%,6%"])
        .assert()
        .success()
        .stdout(predicate::str::contains("AOQL").and(predicate::str::contains("6.000%")));
    lotsman()
        .args(["verify", path.to_str().unwrap()])
        .assert()
        .success();
    let text = std::fs::read_to_string(&path).unwrap();
    let edited = text.replace("k: 1.901", "k: 1.7");
    assert_ne!(text, edited);
    std::fs::write(&path, edited).unwrap();
    lotsman()
        .args(["verify", path.to_str().unwrap()])
        .assert()
        .code(1)
        .stdout(predicate::str::contains("plan.variables.k"));
}

/// `count` readings around `centre`, spread evenly over +-2 s (normal
/// scores), one per row.
fn readings(count: usize, centre: f64, spread: f64) -> String {
    (0..count)
        .map(|i| {
            let u = (i as f64 + 0.5) / count as f64;
            // A logistic stand-in for the normal scores is close enough
            // for a sample that must look normal to the test.
            let z = (u / (1.0 - u)).ln() / 1.7;
            format!("{:.4}\n", centre + spread * z)
        })
        .collect()
}

#[test]
fn judging_measurements_decides_and_refuses_bad_files() {
    let dir = tempfile::tempdir().unwrap();
    let path = solved_source(&dir);
    let n: usize = {
        let text = std::fs::read_to_string(&path).unwrap();
        let line = text
            .lines()
            .find(|l| l.trim_start().starts_with("n: "))
            .unwrap();
        line.trim_start()[3..].trim().parse().unwrap()
    };
    let csv = dir.path().join("m.csv");
    let judge = |content: String| {
        std::fs::write(&csv, content).unwrap();
        let mut c = lotsman();
        c.args([
            "judge",
            path.to_str().unwrap(),
            "--measurements",
            csv.to_str().unwrap(),
        ]);
        c
    };
    judge(readings(n, 12.0, 0.01)).assert().success().stdout(
        predicate::str::contains("ACCEPT the lot")
            .and(predicate::str::contains("Anderson-Darling")),
    );
    judge(readings(n, 12.04, 0.01))
        .assert()
        .success()
        .stdout(predicate::str::contains("REJECT the lot"));
    // A skewed sample: every reading but a few at the bottom.
    let skewed: String = (0..n)
        .map(|i| format!("{:.4}\n", 11.9 + 0.001 * ((i * i) as f64 / n as f64)))
        .collect();
    judge(skewed)
        .assert()
        .success()
        .stdout(predicate::str::contains("CONTRADICT THE NORMAL MODEL"));
    let cases: Vec<(String, &str)> = vec![
        (readings(n - 1, 12.0, 0.01), "measure exactly n units"),
        ("12.01\n".to_string(), "at least 2"),
        (
            format!("12.01\nabc\n{}", readings(n - 2, 12.0, 0.01)),
            "row 2",
        ),
        ("12,01\n12,02\n".to_string(), "decimal"),
        (format!("12.01\n\n{}", readings(n - 2, 12.0, 0.01)), "blank"),
    ];
    for (content, fragment) in cases {
        judge(content)
            .assert()
            .code(2)
            .stderr(predicate::str::contains(fragment));
    }
    std::fs::write(
        &csv,
        format!(
            "unit,bore\n{}",
            readings(n, 12.0, 0.01)
                .lines()
                .enumerate()
                .map(|(i, l)| format!("{i},{l}\n"))
                .collect::<String>()
        ),
    )
    .unwrap();
    lotsman()
        .args([
            "judge",
            path.to_str().unwrap(),
            "--measurements",
            csv.to_str().unwrap(),
            "--column",
            "bore",
            "--format",
            "json",
        ])
        .assert()
        .success()
        .stdout(predicate::str::contains("\"decision\": \"accept\""));
}

#[test]
fn the_variables_template_solves() {
    let dir = tempfile::tempdir().unwrap();
    let t = dir.path().join("t.yaml");
    let out = lotsman()
        .args(["new", "variables"])
        .assert()
        .success()
        .get_output()
        .stdout
        .clone();
    std::fs::write(&t, out).unwrap();
    lotsman()
        .args(["design", t.to_str().unwrap()])
        .assert()
        .success()
        .stdout(predicate::str::contains("k = "));
}
