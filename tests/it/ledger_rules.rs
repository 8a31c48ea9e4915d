//! The switching rules through `judge --record`, one test per rule,
//! written from the text of MIL-STD-105E (10 May 1989): the severity each
//! lot is judged at comes from the ledger's history. The plans are those
//! of code letter K at AQL 1.0 (Tables II-A, II-B, II-C): normal n = 125,
//! Ac 3, Re 4; tightened n = 125, Ac 2, Re 3; reduced n = 50, Ac 1, Re 4.

use crate::common::lotsman;
use crate::ledger_fixture::{record, standard_source, verify};

/// Records `lots` (the count found in each) and returns the severity each
/// was judged at.
fn severities(dir: &std::path::Path, first: usize, lots: &[u64]) -> Vec<String> {
    lots.iter()
        .enumerate()
        .map(|(i, k)| {
            let json = record(
                dir,
                "s.yaml",
                &format!("L{}", first + i),
                &[&k.to_string()],
                &[],
            );
            json["severity"].as_str().unwrap().to_string()
        })
        .collect()
}

/// 4.7.1: two lots out of five consecutive not accepted on normal
/// inspection: R A A A R puts the sixth lot on tightened inspection.
#[test]
fn two_rejections_in_five_lots_tighten() {
    let dir = tempfile::tempdir().unwrap();
    standard_source(dir.path(), &["--aql", "1.0"]);
    let got = severities(dir.path(), 1, &[4, 0, 0, 0, 4, 0]);
    assert_eq!(got[..5], ["normal"; 5]);
    assert_eq!(got[5], "tightened");
    assert_eq!(verify(dir.path(), &["s.yaml"]).0, 0);
}

/// 4.7.2: on tightened inspection, five consecutive lots accepted restore
/// normal inspection from the next lot.
#[test]
fn five_accepted_on_tightened_restore_normal() {
    let dir = tempfile::tempdir().unwrap();
    standard_source(dir.path(), &["--aql", "1.0"]);
    let got = severities(dir.path(), 1, &[4, 4, 0, 0, 0, 0, 0, 0]);
    assert_eq!(got[2..7], ["tightened"; 5]);
    assert_eq!(got[7], "normal");
}

/// 4.7.3 and 4.7.4 (a): ten lots on normal all accepted with no
/// nonconforming unit (0 is at most any limit number of Table VIII) give
/// reduced inspection; a lot not accepted on reduced returns the next lot
/// to normal inspection.
#[test]
fn a_rejection_on_reduced_restores_normal() {
    let dir = tempfile::tempdir().unwrap();
    standard_source(dir.path(), &["--aql", "1.0"]);
    let got = severities(dir.path(), 1, &[0; 10]);
    assert_eq!(got, ["normal"; 10]);
    let got = severities(dir.path(), 11, &[0, 4, 0]);
    assert_eq!(got, ["reduced", "reduced", "normal"]);
    assert_eq!(verify(dir.path(), &["s.yaml"]).0, 0);
}

/// 4.8: five lots not accepted on one spell of tightened inspection stop
/// inspection under the standard; the next lot is refused, not recorded,
/// until the supplier's corrective action, after which it resumes on
/// tightened inspection.
#[test]
fn five_not_accepted_on_tightened_discontinue_until_corrective_action() {
    let dir = tempfile::tempdir().unwrap();
    standard_source(dir.path(), &["--aql", "1.0"]);
    let got = severities(dir.path(), 1, &[4, 4, 3, 3, 3, 3, 3]);
    assert_eq!(got[2..], ["tightened"; 5]);
    let out = crate::common::lotsman()
        .current_dir(dir.path())
        .args([
            "judge", "s.yaml", "--found", "0", "--lot", "L8", "--record", "log.csv",
        ])
        .assert()
        .code(2)
        .get_output()
        .stderr
        .clone();
    let text = String::from_utf8(out).unwrap();
    assert!(
        text.contains("discontinued") && text.contains("4.8"),
        "{text}"
    );
    assert!(text.contains("--corrective-action"), "{text}");
    let log = std::fs::read_to_string(dir.path().join("log.csv")).unwrap();
    assert_eq!(log.lines().count(), 8, "the header and seven lots");
    // 4.8: after the supplier's corrective action, inspection resumes on
    // tightened; the row keeps the action and verify accepts the resumption.
    let resumed = record(
        dir.path(),
        "s.yaml",
        "L8",
        &["0"],
        &[
            "--corrective-action",
            "CA-17: new lapping fixture, approved by QA",
        ],
    );
    assert_eq!(resumed["severity"], "tightened");
    assert_eq!(verify(dir.path(), &["s.yaml"]).0, 0);
    // A corrective action where inspection is not discontinued is refused.
    let out = crate::common::lotsman()
        .current_dir(dir.path())
        .args([
            "judge", "s.yaml", "--found", "0", "--lot", "L9", "--record", "log.csv",
        ])
        .args(["--corrective-action", "again"])
        .assert()
        .code(2)
        .get_output()
        .stderr
        .clone();
    let text = String::from_utf8(out).unwrap();
    assert!(text.contains("on tightened inspection"), "{text}");
    // The corrective action edited out of the row: verify names the break.
    let log = dir.path().join("log.csv");
    let text = std::fs::read_to_string(&log).unwrap();
    std::fs::write(
        &log,
        text.replace("CA-17: new lapping fixture, approved by QA", ""),
    )
    .unwrap();
    let (code, out) = verify(dir.path(), &["s.yaml"]);
    assert_eq!(code, 1);
    assert!(
        out.contains("line 9 (seq 8), severity:") && out.contains("no corrective action"),
        "{out}"
    );
}

/// 4.7: a resubmitted lot does not count: after R on normal, the same lot
/// resubmitted and rejected again does not tighten inspection.
#[test]
fn a_resubmitted_lot_does_not_move_the_state() {
    let dir = tempfile::tempdir().unwrap();
    standard_source(dir.path(), &["--aql", "1.0"]);
    severities(dir.path(), 1, &[4]);
    let again = record(dir.path(), "s.yaml", "L1", &["4"], &["--resubmitted"]);
    assert_eq!(again["decision"], "reject");
    assert_eq!(severities(dir.path(), 2, &[0]), ["normal"]);
    assert_eq!(verify(dir.path(), &["s.yaml"]).0, 0);
}

/// A first lot that is refused, or not decided yet, makes no ledger file:
/// nothing is half-written.
#[test]
fn a_refused_or_undecided_first_lot_leaves_no_file() {
    let dir = tempfile::tempdir().unwrap();
    standard_source(dir.path(), &["--aql", "1.0", "--scheme", "double"]);
    let judge = |extra: &[&str]| {
        lotsman()
            .current_dir(dir.path())
            .args([
                "judge",
                "s.yaml",
                "--record",
                "log.csv",
                "--date",
                "2024-03-15",
            ])
            .args(extra)
            .assert()
            .get_output()
            .status
            .code()
    };
    // Marked resubmitted, but the ledger does not record the lot: refused.
    let code = judge(&["--lot", "L1", "--found", "0", "--resubmitted"]);
    assert_eq!(code, Some(2));
    assert!(!dir.path().join("log.csv").exists(), "refused");
    // Double plan K at AQL 1.0 (Table III-A: 80 units, Ac 1 Re 4): a count
    // of 2 on the first sample goes on to the second: not recorded.
    let code = judge(&["--lot", "L1", "--found", "2"]);
    assert_eq!(code, Some(0));
    assert!(!dir.path().join("log.csv").exists(), "undecided");
    // Decided: the file is made with its header and the row.
    assert_eq!(judge(&["--lot", "L1", "--found", "0"]), Some(0));
    let text = std::fs::read_to_string(dir.path().join("log.csv")).unwrap();
    assert_eq!(text.lines().count(), 2, "{text}");
}
