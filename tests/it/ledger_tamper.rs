//! A ledger changed after it was written is caught by `verify`, naming
//! the row (seq and line) and the column: an edited count, a deleted row,
//! two rows swapped, a torn last line. A torn line also stops the next
//! `judge --record`.

use std::fs;
use std::path::Path;

use crate::common::lotsman;
use crate::ledger_fixture::{record, standard_source, verify};

/// A ledger of five lots in `dir`, verified clean.
fn five_lots(dir: &Path) -> Vec<String> {
    standard_source(dir, &["--aql", "1.0"]);
    for (i, k) in [0, 2, 4, 1, 0].iter().enumerate() {
        record(
            dir,
            "s.yaml",
            &format!("L{}", i + 1),
            &[&k.to_string()],
            &[],
        );
    }
    assert_eq!(verify(dir, &["s.yaml"]).0, 0);
    fs::read_to_string(dir.join("log.csv"))
        .unwrap()
        .lines()
        .map(str::to_string)
        .collect()
}

fn write(dir: &Path, lines: &[String], end: &str) {
    fs::write(dir.join("log.csv"), lines.join("\n") + end).unwrap();
}

#[test]
fn an_edited_count_is_caught() {
    let dir = tempfile::tempdir().unwrap();
    let mut lines = five_lots(dir.path());
    // Lot 3 (line 4) rejected on 4 found: edit the count to 3.
    lines[3] = lines[3].replace(",125,4,reject,", ",125,3,reject,");
    write(dir.path(), &lines, "\n");
    let (code, out) = verify(dir.path(), &["s.yaml"]);
    assert_eq!(code, 1);
    assert!(out.contains("line 4 (seq 3), hash:"), "{out}");
    assert!(out.contains("line 4 (seq 3), decision:"), "{out}");
}

#[test]
fn a_deleted_row_is_caught() {
    let dir = tempfile::tempdir().unwrap();
    let mut lines = five_lots(dir.path());
    lines.remove(2);
    write(dir.path(), &lines, "\n");
    let (code, out) = verify(dir.path(), &[]);
    assert_eq!(code, 1);
    assert!(out.contains("line 3 (seq 3), seq:"), "{out}");
}

#[test]
fn reordered_rows_are_caught() {
    let dir = tempfile::tempdir().unwrap();
    let mut lines = five_lots(dir.path());
    lines.swap(2, 3);
    write(dir.path(), &lines, "\n");
    let (code, out) = verify(dir.path(), &[]);
    assert_eq!(code, 1);
    assert!(out.contains("line 3 (seq 3), seq:"), "{out}");
    assert!(out.contains("line 4 (seq 2), seq:"), "{out}");
}

#[test]
fn a_torn_last_line_is_reported_and_not_extended() {
    let dir = tempfile::tempdir().unwrap();
    let mut lines = five_lots(dir.path());
    let last = lines.pop().unwrap();
    lines.push(last[..last.len() / 2].to_string());
    write(dir.path(), &lines, "");
    let (code, out) = verify(dir.path(), &["s.yaml"]);
    assert_eq!(code, 1);
    assert!(
        out.contains("line 6, format: the last line is torn"),
        "{out}"
    );
    let before = fs::read(dir.path().join("log.csv")).unwrap();
    let err = lotsman()
        .current_dir(dir.path())
        .args([
            "judge", "s.yaml", "--found", "0", "--lot", "L6", "--record", "log.csv",
        ])
        .assert()
        .code(2)
        .get_output()
        .stderr
        .clone();
    let text = String::from_utf8(err).unwrap();
    assert!(
        text.contains("line 6") && text.contains("torn") && text.contains("verify"),
        "{text}"
    );
    assert_eq!(
        fs::read(dir.path().join("log.csv")).unwrap(),
        before,
        "nothing appended"
    );
}

#[test]
fn a_plan_revision_not_given_is_caught() {
    let dir = tempfile::tempdir().unwrap();
    five_lots(dir.path());
    fs::copy(dir.path().join("s.yaml"), dir.path().join("old.yaml")).unwrap();
    let text = fs::read_to_string(dir.path().join("old.yaml")).unwrap();
    fs::write(dir.path().join("old.yaml"), text + "# revision B\n").unwrap();
    let (code, out) = verify(dir.path(), &["old.yaml"]);
    assert_eq!(code, 1);
    assert!(out.contains("line 2 (seq 1), plan_sha256:"), "{out}");
}

#[test]
fn a_blank_line_is_refused_with_its_line_and_windows_line_ends_still_verify() {
    let dir = tempfile::tempdir().unwrap();
    let mut lines = five_lots(dir.path());
    // Saved again with CR LF line ends (as some editors do): the rows and
    // their hashes are unchanged.
    let crlf = lines.join("\r\n") + "\r\n";
    fs::write(dir.path().join("log.csv"), crlf).unwrap();
    assert_eq!(verify(dir.path(), &["s.yaml"]).0, 0);
    // A blank line between rows 2 and 3 is no row: refused, never skipped.
    lines.insert(3, String::new());
    write(dir.path(), &lines, "\n");
    let err = lotsman()
        .current_dir(dir.path())
        .args(["verify", "log.csv", "--plan", "s.yaml"])
        .assert()
        .code(2)
        .get_output()
        .stderr
        .clone();
    let text = String::from_utf8(err).unwrap();
    assert!(text.contains("line 4"), "{text}");
}
