//! The demo's ledger: its invented lots follow the switching rules of
//! MIL-STD-105E (4.7.1: two lots not accepted within five consecutive
//! lots on normal inspection switch to tightened; 4.7.2: five accepted in
//! a row on tightened restore normal), and the ledger verifies.

use crate::common;
use common::lotsman;

#[test]
fn the_demo_ledger_switches_to_tightened_and_back_and_verifies() {
    let dir = tempfile::tempdir().unwrap();
    lotsman()
        .args(["demo", "--output-dir"])
        .arg(dir.path())
        .assert()
        .success();
    let ledger = dir.path().join("tpw-seal-face-ledger.csv");
    let plan = dir.path().join("tpw-seal-face-classes.yaml");
    let text = std::fs::read_to_string(&ledger).unwrap();
    let rows: Vec<Vec<&str>> = text
        .lines()
        .skip(1)
        .map(|l| l.split(',').collect())
        .collect();
    assert_eq!(rows.len(), 30);
    // Columns: seq (1), severity (8), decision (12).
    let severity = |seq: usize| rows[seq - 1][8];
    let decision = |seq: usize| rows[seq - 1][12];
    assert_eq!((decision(8), decision(11)), ("reject", "reject"));
    assert_eq!(severity(11), "normal");
    for seq in 12..=16 {
        assert_eq!(
            (severity(seq), decision(seq)),
            ("tightened", "accept"),
            "lot {seq}"
        );
    }
    assert_eq!(severity(17), "normal");
    lotsman()
        .arg("verify")
        .arg(&ledger)
        .arg("--plan")
        .arg(&plan)
        .assert()
        .success();
    let status = String::from_utf8(
        lotsman()
            .arg("status")
            .arg(&ledger)
            .arg("--plan")
            .arg(&plan)
            .assert()
            .success()
            .get_output()
            .stdout
            .clone(),
    )
    .unwrap();
    assert!(status.contains("Next lot: normal inspection"), "{status}");
}
