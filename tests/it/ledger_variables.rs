//! A variables plan's lots in the ledger: `judge --measurements --record`
//! keeps the readings' mean and standard deviation and the file's
//! SHA-256, and `verify` decides each lot again from them.
//!
//! The plan is the demo's pump cover plates (plans/tpw-cover-thickness.yaml:
//! n = 42, k = 1.901, lower limit 5.8 mm, sigma unknown). The checks are
//! computed here from the readings by the definitions: mean, standard
//! deviation with the n - 1 divisor, `Q_L = (xbar - L) / s`, accept when
//! `Q_L >= k` (the k method; from memory), and SHA-256 of the file's
//! bytes (the sha2 crate, FIPS 180-4).

use std::fs;
use std::path::Path;

use serde_json::Value;
use sha2::{Digest, Sha256};

use crate::common::lotsman;

const SOURCE: &str = "plans/tpw-cover-thickness.yaml";
const READINGS: &str = "plans/tpw-cover-thickness-readings.csv";

/// The demo's 42 readings, shifted by `shift` mm.
fn readings(shift: f64) -> Vec<f64> {
    let text = fs::read_to_string(READINGS).unwrap();
    let mut rows = text.lines();
    let header: Vec<&str> = rows.next().unwrap().split(',').collect();
    let col = header.iter().position(|h| *h == "thickness_mm").unwrap();
    rows.filter(|r| !r.is_empty())
        .map(|r| r.split(',').nth(col).unwrap().parse::<f64>().unwrap() + shift)
        .collect()
}

/// Writes `values` as a one-column file and records it as lot `lot`.
fn record(dir: &Path, lot: &str, values: &[f64]) -> (Value, Vec<u8>) {
    let file = format!("{lot}.csv");
    let text: String = values.iter().map(|v| format!("{v}\n")).collect();
    fs::write(dir.join(&file), &text).unwrap();
    let out = lotsman()
        .current_dir(dir)
        .args(["judge", "s.yaml", "--measurements", &file, "--lot", lot])
        .args([
            "--record",
            "log.csv",
            "--date",
            "2024-05-02",
            "--format",
            "json",
        ])
        .assert()
        .success()
        .get_output()
        .stdout
        .clone();
    (serde_json::from_slice(&out).unwrap(), text.into_bytes())
}

/// The cells of the ledger's row `seq`, by column name.
fn cell(dir: &Path, seq: usize, column: &str) -> String {
    let text = fs::read_to_string(dir.join("log.csv")).unwrap();
    let mut lines = text.lines();
    let header: Vec<&str> = lines.next().unwrap().split(',').collect();
    let row: Vec<String> = lines
        .nth(seq - 1)
        .unwrap()
        .split(',')
        .map(str::to_string)
        .collect();
    row[header.iter().position(|h| *h == column).unwrap()].clone()
}

fn mean_sd(v: &[f64]) -> (f64, f64) {
    let n = v.len() as f64;
    let mean = v.iter().sum::<f64>() / n;
    let ss: f64 = v.iter().map(|x| (x - mean).powi(2)).sum();
    (mean, (ss / (n - 1.0)).sqrt())
}

#[test]
fn measured_lots_are_recorded_with_their_statistics_and_decided_again() {
    let dir = tempfile::tempdir().unwrap();
    fs::copy(SOURCE, dir.path().join("s.yaml")).unwrap();
    // The demo lot, and the same plates 0.04 mm thinner.
    let good = readings(0.0);
    let thin = readings(-0.04);
    for (seq, (lot, values)) in [("C1", &good), ("C2", &thin)].into_iter().enumerate() {
        let (json, bytes) = record(dir.path(), lot, values);
        let (mean, sd) = mean_sd(values);
        let q = (mean - 5.8) / sd;
        let expected = if q >= 1.901 { "accept" } else { "reject" };
        assert_eq!(json["decision"], expected, "{lot}: Q_L = {q}");
        let row = seq + 1;
        assert_eq!(cell(dir.path(), row, "decision"), expected);
        assert_eq!(cell(dir.path(), row, "inspected"), "42");
        let recorded_mean: f64 = cell(dir.path(), row, "mean").parse().unwrap();
        let recorded_sd: f64 = cell(dir.path(), row, "sd").parse().unwrap();
        assert!(
            (recorded_mean - mean).abs() <= 1e-12 * mean,
            "{recorded_mean} {mean}"
        );
        assert!((recorded_sd - sd).abs() <= 1e-9 * sd, "{recorded_sd} {sd}");
        let sha: String = Sha256::digest(&bytes)
            .iter()
            .map(|b| format!("{b:02x}"))
            .collect();
        assert_eq!(cell(dir.path(), row, "data_sha256"), sha);
        let beyond = values.iter().filter(|&&v| v < 5.8).count();
        assert_eq!(cell(dir.path(), row, "found"), beyond.to_string());
    }
    assert_eq!(cell(dir.path(), 1, "decision"), "accept");
    assert_eq!(cell(dir.path(), 2, "decision"), "reject");
    let verify = |code: i32| {
        let out = lotsman()
            .current_dir(dir.path())
            .args(["verify", "log.csv", "--plan", "s.yaml"])
            .assert()
            .code(code)
            .get_output()
            .stdout
            .clone();
        String::from_utf8(out).unwrap()
    };
    verify(0);
    // The status names the plan of the next lot and averages the readings
    // beyond the limit over both lots' 84 units.
    let out = lotsman()
        .current_dir(dir.path())
        .args(["status", "log.csv", "--plan", "s.yaml", "--format", "json"])
        .assert()
        .success()
        .get_output()
        .stdout
        .clone();
    let status: Value = serde_json::from_slice(&out).unwrap();
    let plan = status["next_plan"]["classes"][0]["plan"].as_str().unwrap();
    assert!(plan.contains("n = 42, k = 1.901"), "{plan}");
    assert_eq!(status["process_average"]["inspected"], 84);
    // A mean raised after the lot was judged: the hash and the decision
    // both catch it.
    let log = dir.path().join("log.csv");
    let text = fs::read_to_string(&log).unwrap();
    let mean = cell(dir.path(), 2, "mean");
    fs::write(&log, text.replace(&format!(",{mean},"), ",5.95,")).unwrap();
    let out = verify(1);
    assert!(out.contains("line 3 (seq 2), hash:"), "{out}");
    assert!(
        out.contains(
            "line 3 (seq 2), decision: is reject but the readings' mean and sd give accept"
        ),
        "{out}"
    );
}

#[test]
fn counts_and_measurements_go_to_their_own_plans() {
    let dir = tempfile::tempdir().unwrap();
    fs::copy(SOURCE, dir.path().join("s.yaml")).unwrap();
    let refused = |args: &[&str], words: &str| {
        let out = lotsman()
            .current_dir(dir.path())
            .args(args)
            .args(["--lot", "L1", "--record", "log.csv"])
            .assert()
            .code(2)
            .get_output()
            .stderr
            .clone();
        let text = String::from_utf8(out).unwrap();
        assert!(text.contains(words), "{text}");
        assert!(!dir.path().join("log.csv").exists(), "nothing written");
    };
    refused(&["judge", "s.yaml", "--found", "0"], "--measurements FILE");
    fs::write(dir.path().join("r.csv"), "5.9\n5.91\n").unwrap();
    lotsman()
        .current_dir(dir.path())
        .args(["design", "--aql", "1%", "--rql", "6%", "--output", "b.yaml"])
        .assert()
        .success();
    refused(
        &["judge", "b.yaml", "--measurements", "r.csv"],
        "--measurements is for variables plans",
    );
}
