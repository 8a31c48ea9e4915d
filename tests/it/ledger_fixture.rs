//! What the ledger's tests share: a standard-indexed source written by
//! `lotsman standard`, and `judge --record` on it.

use std::path::Path;

use crate::common::lotsman;
use serde_json::Value;

/// Writes `s.yaml` in `dir`: MIL-STD-105E, level II, a lot of 1500 units
/// (code letter K), with `args` (e.g. `--aql 1.0`).
pub fn standard_source(dir: &Path, args: &[&str]) {
    lotsman()
        .current_dir(dir)
        .args(["standard", "--lot-size", "1500", "--level", "II"])
        .args(args)
        .args(["--output", "s.yaml"])
        .assert()
        .success();
}

/// Runs `judge SOURCE --record log.csv --lot LOT` with `found` and `extra`
/// in `dir`, and returns the decision's JSON.
pub fn record(dir: &Path, source: &str, lot: &str, found: &[&str], extra: &[&str]) -> Value {
    let mut cmd = lotsman();
    cmd.current_dir(dir).args([
        "judge",
        source,
        "--record",
        "log.csv",
        "--lot",
        lot,
        "--date",
        "2024-03-15",
        "--format",
        "json",
    ]);
    for f in found {
        cmd.args(["--found", f]);
    }
    let out = cmd
        .args(extra)
        .assert()
        .success()
        .get_output()
        .stdout
        .clone();
    serde_json::from_slice(&out).unwrap()
}

/// Runs `verify log.csv` with `plans` in `dir`: the exit code and stdout.
pub fn verify(dir: &Path, plans: &[&str]) -> (i32, String) {
    let mut cmd = lotsman();
    cmd.current_dir(dir).args(["verify", "log.csv"]);
    for p in plans {
        cmd.args(["--plan", p]);
    }
    let out = cmd.output().unwrap();
    (
        out.status.code().unwrap(),
        String::from_utf8(out.stdout).unwrap(),
    )
}
