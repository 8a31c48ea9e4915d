//! Several `judge --record` processes appending to one ledger at once
//! lose no row and break no chain: the file lock serialises them.

use std::process::Command;

use crate::ledger_fixture::{standard_source, verify};

#[test]
fn parallel_appends_keep_every_row_and_the_chain() {
    let dir = tempfile::tempdir().unwrap();
    standard_source(dir.path(), &["--aql", "1.0"]);
    let bin = assert_cmd::cargo::cargo_bin("lotsman");
    // All sixteen start before any is waited for.
    let spawned: Vec<_> = (0..16)
        .map(|i| {
            Command::new(&bin)
                .current_dir(dir.path())
                .args(["judge", "s.yaml", "--found", "0", "--record", "log.csv"])
                .args(["--lot", &format!("P{i}"), "--date", "2024-03-15"])
                .stdout(std::process::Stdio::null())
                .stderr(std::process::Stdio::null())
                .spawn()
                .unwrap()
        })
        .collect();
    for mut child in spawned {
        assert!(child.wait().unwrap().success());
    }
    let log = std::fs::read_to_string(dir.path().join("log.csv")).unwrap();
    assert_eq!(log.lines().count(), 17, "the header and 16 lots");
    for i in 0..16 {
        assert!(log.contains(&format!(",P{i},")), "lot P{i} missing");
    }
    let (code, out) = verify(dir.path(), &["s.yaml"]);
    assert_eq!(code, 0, "{out}");
}
