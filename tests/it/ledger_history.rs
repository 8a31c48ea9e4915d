//! `lotsman history LOG.csv`: each lot's first sample on Shewhart's
//! p-chart with three-sigma limits for its own n (D. C. Montgomery,
//! Introduction to Statistical Quality Control, ch. 7, from memory), and
//! the chart drawn through the print layer as SVG and PDF. Plans of code
//! letter K at AQL 1.0: normal and tightened n = 125 (Tables II-A, II-B).

use std::path::Path;

use serde_json::Value;

use crate::common::lotsman;
use crate::ledger_fixture::{record, standard_source};

fn lots(dir: &Path, counts: &[u64]) {
    for (i, k) in counts.iter().enumerate() {
        record(
            dir,
            "s.yaml",
            &format!("L{}", i + 1),
            &[&k.to_string()],
            &[],
        );
    }
}

fn history(dir: &Path, extra: &[&str]) -> std::process::Output {
    lotsman()
        .current_dir(dir)
        .args(["history", "log.csv", "--plan", "s.yaml"])
        .args(extra)
        .output()
        .unwrap()
}

/// p̄ = 8 / 625 = 0.0128 over five lots of 125; UCL = p̄ + 3 sqrt(p̄ (1 -
/// p̄) / 125) = 0.042962949457902 (by hand: sqrt(0.0128 · 0.9872 / 125) =
/// 0.010054316486); LCL = p̄ - 0.030163 < 0, clipped to 0.
#[test]
fn limits_match_the_hand_computed_p_chart() {
    let dir = tempfile::tempdir().unwrap();
    standard_source(dir.path(), &["--aql", "1.0"]);
    lots(dir.path(), &[4, 0, 0, 0, 4]);
    let out = history(dir.path(), &["--format", "json"]);
    assert!(out.status.success());
    let json: Value = serde_json::from_slice(&out.stdout).unwrap();
    assert_eq!(json["chart"], "p");
    approx::assert_relative_eq!(
        json["centre"].as_f64().unwrap(),
        0.0128,
        max_relative = 1e-12
    );
    for lot in json["lots"].as_array().unwrap() {
        approx::assert_relative_eq!(
            lot["upper_limit"].as_f64().unwrap(),
            0.042962949457902,
            max_relative = 1e-10
        );
        assert_eq!(lot["lower_limit"].as_f64().unwrap(), 0.0);
        assert_eq!(lot["n"], 125);
    }
    assert_eq!(json["lots"][0]["fraction"].as_f64().unwrap(), 4.0 / 125.0);
    // The running average after lot 1: Clopper-Pearson on 4 in 125.
    let cp = lotsman::clopper_pearson(4, 125, 0.95).unwrap();
    assert_eq!(
        json["lots"][0]["running"]["upper"].as_f64().unwrap(),
        cp.upper
    );
}

/// The u-chart's limits: ū = 0.5 per unit, n = 20: 0.5 ± 3 sqrt(0.5 / 20)
/// = 0.5 ± 0.474341649 (by hand); and a p-chart whose lower limit stays
/// above 0: p̄ = 0.1, n = 400: 0.1 ± 3 · 0.015 = 0.055 to 0.145.
#[test]
fn control_limits_by_hand() {
    let (lo, hi) = lotsman::control_limits(0.5, 20, true);
    approx::assert_relative_eq!(lo, 0.025658350974743, max_relative = 1e-12);
    approx::assert_relative_eq!(hi, 0.974341649025257, max_relative = 1e-12);
    let (lo, hi) = lotsman::control_limits(0.1, 400, false);
    approx::assert_relative_eq!(lo, 0.055, max_relative = 1e-12);
    approx::assert_relative_eq!(hi, 0.145, max_relative = 1e-12);
}

/// R A A A R A A: lots 6 and 7 on tightened inspection. The SVG has a
/// band behind each (and one in the key), a red marker (ring) for each
/// rejected lot, a blue point for each accepted one.
#[test]
fn svg_has_points_bands_and_rejections() {
    let dir = tempfile::tempdir().unwrap();
    standard_source(dir.path(), &["--aql", "1.0"]);
    lots(dir.path(), &[4, 0, 0, 0, 4, 0, 1]);
    let out = history(dir.path(), &["--output", "h.svg"]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let svg = std::fs::read_to_string(dir.path().join("h.svg")).unwrap();
    let count = |c: &str| svg.matches(&format!("fill=\"{c}\"")).count();
    // palette: TIGHTENED_BAND rgb(0.98, 0.86, 0.80), PLAN, REJECT.
    assert_eq!(count("#fadbcc"), 2 + 1);
    assert_eq!(count("#0d408c"), 5 + 1);
    assert_eq!(count("#991a0d"), 2 * 2 + 2);
    assert!(svg.contains("p-chart of first samples"));
    assert!(svg.contains("Running process average"));
    // Not overwritten without --force.
    let again = history(dir.path(), &["--output", "h.svg"]);
    assert_eq!(again.status.code(), Some(2));
    assert!(
        history(dir.path(), &["--output", "h.svg", "--force"])
            .status
            .success()
    );
    assert_eq!(
        history(dir.path(), &["--output", "h.png"]).status.code(),
        Some(2)
    );
}

/// The PDF is written and is a PDF (tests/system renders it with
/// poppler; by hand: pdftoppm -png -r 70 h.pdf p).
#[test]
fn pdf_is_written() {
    let dir = tempfile::tempdir().unwrap();
    standard_source(dir.path(), &["--aql", "1.0"]);
    lots(dir.path(), &[4, 0, 2]);
    let out = history(dir.path(), &["--output", "h.pdf", "--format", "csv"]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let pdf = std::fs::read(dir.path().join("h.pdf")).unwrap();
    assert!(pdf.starts_with(b"%PDF"));
    let csv = String::from_utf8(out.stdout).unwrap();
    assert_eq!(csv.lines().count(), 4);
    assert!(csv.starts_with("seq,date,lot,severity,decision,"));
}
