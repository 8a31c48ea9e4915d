//! `judge` on a standard-indexed source (issue 16, item 3): each class
//! decided by its own plan (105E Table II-A and III-A at code letter K,
//! lot of 1500 at level II), the lot accepted only when every class
//! accepts, "continue" while a class needs its next stage; a missing or
//! unknown class is refused with the names of the classes.

use std::fs;
use std::path::Path;

use crate::common;
use common::lotsman;

use serde_json::Value;

/// A source of `standard` with `args`, written in `dir` as `s.yaml`.
fn source(dir: &Path, args: &[&str]) {
    lotsman()
        .current_dir(dir)
        .args(["standard", "--lot-size", "1500", "--level", "II"])
        .args(args)
        .args(["--output", "s.yaml"])
        .assert()
        .success();
}

/// The JSON of `judge s.yaml` with `found`, run in `dir`.
fn judged(dir: &Path, found: &[&str]) -> Value {
    let mut cmd = lotsman();
    cmd.current_dir(dir)
        .args(["judge", "s.yaml", "--format", "json"]);
    for f in found {
        cmd.args(["--found", f]);
    }
    let out = cmd.assert().success().get_output().stdout.clone();
    serde_json::from_slice(&out).unwrap()
}

/// Exit 2 with a message holding every needle.
fn refused(dir: &Path, found: &[&str], needles: &[&str]) {
    let mut cmd = lotsman();
    cmd.current_dir(dir).args(["judge", "s.yaml"]);
    for f in found {
        cmd.args(["--found", f]);
    }
    let err = cmd.assert().code(2).get_output().stderr.clone();
    let text = String::from_utf8(err).unwrap();
    for n in needles {
        assert!(text.contains(n), "{n:?} not in {text}");
    }
}

const CLASSES: &[&str] = &[
    "--aql",
    "critical=0.065",
    "--aql",
    "major=1.0",
    "--aql",
    "minor=4.0",
];

#[test]
fn every_class_is_judged_by_its_own_plan_and_the_lot_by_all() {
    let dir = tempfile::tempdir().unwrap();
    source(dir.path(), CLASSES);
    // Table II-A: critical L (200, Ac 0), major K (125, Ac 3), minor K
    // (125, Ac 10).
    let v = judged(dir.path(), &["critical=0", "major=3", "minor=10"]);
    assert_eq!(v["decision"], "accept");
    let v = judged(dir.path(), &["critical=0", "major=4", "minor=0"]);
    assert_eq!(v["decision"], "reject");
    assert_eq!(v["classes"][1]["decision"], "reject");
    assert_eq!(v["classes"][0]["decision"], "accept");
    // Names are read without regard to case, in any order.
    let v = judged(dir.path(), &["MINOR=11", "major=0", "critical=0"]);
    assert_eq!(v["classes"][2]["decision"], "reject");
}

#[test]
fn a_class_that_needs_its_second_stage_keeps_the_lot_open() {
    let dir = tempfile::tempdir().unwrap();
    source(
        dir.path(),
        &[
            "--aql",
            "major=1.0",
            "--aql",
            "minor=4.0",
            "--scheme",
            "double",
        ],
    );
    // Table III-A at K, 1.0: 80 (Ac 1, Re 4), 160 (Ac 4, Re 5).
    let v = judged(dir.path(), &["major=2", "minor=0"]);
    assert_eq!(v["decision"], "continue");
    assert_eq!(v["classes"][0]["next_units"], 80);
    let v = judged(dir.path(), &["major=2,2", "minor=0"]);
    assert_eq!(v["decision"], "accept");
    let v = judged(dir.path(), &["major=2,3", "minor=0"]);
    assert_eq!(v["decision"], "reject");
}

#[test]
fn one_aql_takes_bare_counts() {
    let dir = tempfile::tempdir().unwrap();
    source(dir.path(), &["--aql", "1.0"]);
    assert_eq!(judged(dir.path(), &["3"])["decision"], "accept");
    assert_eq!(judged(dir.path(), &["4"])["decision"], "reject");
}

#[test]
fn a_missing_or_unknown_class_is_refused_with_the_classes_names() {
    let dir = tempfile::tempdir().unwrap();
    source(dir.path(), CLASSES);
    refused(
        dir.path(),
        &["major=1", "minor=0"],
        &["critical", "--found critical=K"],
    );
    refused(
        dir.path(),
        &["cosmetic=1"],
        &["'cosmetic'", "critical, major, minor"],
    );
    refused(dir.path(), &["1"], &["critical, major, minor"]);
    let text = fs::read_to_string(dir.path().join("s.yaml")).unwrap();
    assert!(text.contains("name: critical"));
}
