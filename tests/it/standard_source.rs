//! Standard-indexed plan sources (issue 16, item 6): `standard --output`
//! writes a source that `verify` confirms, a changed number or a changed
//! user table is named, `evaluate` gives the OC of the plans in force and
//! `new standard` gives a template that verifies once recorded. Plans are
//! MIL-STD-105E's (Tables I, II-A, III-A); probabilities are checked
//! against scipy.stats, named beside each value.

use std::fs;
use std::path::Path;

use crate::common;
use common::lotsman;

use serde_json::Value;

/// Writes the source of `standard` with `args` to `file` in `dir`.
fn write(dir: &Path, file: &str, args: &[&str]) {
    lotsman()
        .current_dir(dir)
        .arg("standard")
        .args(args)
        .args(["--output", file])
        .assert()
        .success();
}

/// `(exit code, stdout, stderr)` of `lotsman args` run in `dir`.
fn run(dir: &Path, args: &[&str]) -> (i32, String, String) {
    let out = lotsman().current_dir(dir).args(args).output().unwrap();
    (
        out.status.code().unwrap(),
        String::from_utf8(out.stdout).unwrap(),
        String::from_utf8(out.stderr).unwrap(),
    )
}

const CLASSES: &[&str] = &[
    "--lot-size",
    "1500",
    "--level",
    "II",
    "--aql",
    "major=1.0",
    "--aql",
    "minor=4.0",
    "--scheme",
    "double",
    "--rql",
    "5%",
    "--title",
    "Hinge covers",
];

#[test]
fn a_written_source_records_the_index_and_every_severitys_plans_and_verifies() {
    let dir = tempfile::tempdir().unwrap();
    write(dir.path(), "covers.yaml", CLASSES);
    let text = fs::read_to_string(dir.path().join("covers.yaml")).unwrap();
    for key in [
        "scheme: standard",
        "edition: MIL-STD-105E",
        "level: II",
        "name: major",
        "severity: normal",
        "form: double",
        "lot_size: 1500",
        "quality: 0.05",
        // Table I: 1500 units at level II is code letter K.
        "code_letter: K",
    ] {
        assert!(text.contains(key), "{key} not in {text}");
    }
    let (code, out, _) = run(dir.path(), &["verify", "covers.yaml"]);
    assert_eq!(code, 0, "{out}");
    assert!(out.contains("1 match, 0 mismatch"), "{out}");
    // Refuses to replace it without --force, and replaces it with.
    let (code, _, err) = run(
        dir.path(),
        &[&["standard"], CLASSES, &["--output", "covers.yaml"]].concat(),
    );
    assert_eq!(code, 2);
    assert!(err.contains("give --force"), "{err}");
    let (code, _, _) = run(
        dir.path(),
        &[
            &["standard"],
            CLASSES,
            &["--output", "covers.yaml", "--force"],
        ]
        .concat(),
    );
    assert_eq!(code, 0);
}

#[test]
fn a_changed_number_is_a_mismatch_named_by_class_severity_and_stage() {
    let dir = tempfile::tempdir().unwrap();
    write(
        dir.path(),
        "one.yaml",
        &["--lot-size", "1500", "--level", "II", "--aql", "1.0"],
    );
    let path = dir.path().join("one.yaml");
    let text = fs::read_to_string(&path).unwrap();
    // 105E Table II-A, K at 1.0 on normal inspection: n 125, Ac 3, Re 4.
    assert!(
        text.contains("n: 125\n        accept: 3\n        reject: 4"),
        "{text}"
    );
    let edited = text.replacen(
        "n: 125\n        accept: 3\n        reject: 4",
        "n: 125\n        accept: 2\n        reject: 3",
        1,
    );
    fs::write(&path, edited).unwrap();
    let (code, out, _) = run(dir.path(), &["verify", "one.yaml", "--format", "json"]);
    assert_eq!(code, 1, "{out}");
    let v: Value = serde_json::from_str(&out).unwrap();
    let d = &v["results"][0]["differences"][0];
    assert_eq!(d["field"], "AQL 1.0, normal, stage 1 accept");
    assert_eq!(d["recorded"], "2");
    assert_eq!(d["resolved"], "3");
    assert_eq!(
        v["results"][0]["differences"][1]["field"],
        "AQL 1.0, normal, stage 1 reject"
    );
}

#[test]
fn a_user_table_is_recorded_by_hash_and_a_changed_one_is_refused_with_the_fix() {
    let dir = tempfile::tempdir().unwrap();
    let builtin = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/data/standard/mil-std-105e/table-2a-single-normal.csv"
    );
    fs::create_dir(dir.path().join("tables")).unwrap();
    fs::copy(builtin, dir.path().join("tables/2a.csv")).unwrap();
    write(
        dir.path(),
        "own.yaml",
        &[
            "--lot-size",
            "1500",
            "--level",
            "II",
            "--aql",
            "1.0",
            "--table",
            "normal=tables/2a.csv",
        ],
    );
    let text = fs::read_to_string(dir.path().join("own.yaml")).unwrap();
    assert!(text.contains("file: tables/2a.csv"), "{text}");
    assert!(text.contains("sha256: "), "{text}");
    assert_eq!(run(dir.path(), &["verify", "own.yaml"]).0, 0);
    // A comment line appended changes the hash, not the plans.
    let mut table = fs::read_to_string(dir.path().join("tables/2a.csv")).unwrap();
    table.push('\n');
    fs::write(dir.path().join("tables/2a.csv"), table).unwrap();
    let (code, out, err) = run(dir.path(), &["verify", "own.yaml"]);
    assert_eq!(code, 2, "{out}{err}");
    let said = format!("{out}{err}");
    assert!(
        said.contains("the table has changed since the plans were recorded"),
        "{said}"
    );
    assert!(
        said.contains("lotsman design own.yaml --in-place"),
        "{said}"
    );
    // The advice works as written.
    assert_eq!(run(dir.path(), &["design", "own.yaml", "--in-place"]).0, 0);
    assert_eq!(run(dir.path(), &["verify", "own.yaml"]).0, 0);
}

#[test]
fn evaluate_gives_the_oc_of_each_class_plan_in_force() {
    let dir = tempfile::tempdir().unwrap();
    write(dir.path(), "covers.yaml", CLASSES);
    let (code, out, err) = run(
        dir.path(),
        &[
            "evaluate",
            "covers.yaml",
            "--at",
            "0.01,0.05",
            "--format",
            "json",
        ],
    );
    assert_eq!(code, 0, "{err}");
    let v: Value = serde_json::from_str(&out).unwrap();
    let major = &v["classes"][0];
    assert_eq!(major["class"], "major");
    // 105E Table III-A, K at 1.0: 80 (Ac 1, Re 4), 160 (Ac 4, Re 5).
    // scipy.stats: binom.cdf(1,80,p) + sum(binom.pmf(d,80,p) *
    // binom.cdf(4-d,80,p) for d in (2,3)).
    let pa: Vec<f64> = major["evaluation"]["points"]
        .as_array()
        .unwrap()
        .iter()
        .map(|p| p["pa"].as_f64().unwrap())
        .collect();
    assert!((pa[0] - 0.977_391_952_305_540_5).abs() < 1e-9, "{pa:?}");
    assert!((pa[1] - 0.136_417_702_096_363_78).abs() < 1e-9, "{pa:?}");
}

#[test]
fn the_template_verifies_once_its_plans_are_recorded() {
    let dir = tempfile::tempdir().unwrap();
    let (code, template, _) = run(dir.path(), &["new", "standard"]);
    assert_eq!(code, 0);
    fs::write(dir.path().join("t.yaml"), template).unwrap();
    let (code, out, err) = run(dir.path(), &["design", "t.yaml", "--in-place"]);
    assert_eq!(code, 0, "{out}{err}");
    // 105E Table II-A at code letter K: 0.065 points down to L (200, Ac 0).
    assert!(
        out.contains("critical   0.065   normal (in force)             L"),
        "{out}"
    );
    assert_eq!(run(dir.path(), &["verify", "t.yaml"]).0, 0);
}
