//! Wrong or misleading numbers (issue 14, items 1 to 4 and 8): every
//! quantity is guarded by its kind, a Poisson rate is shown per unit and
//! per 100 units, a finite lot's measures are at its own quality D/N, no
//! sample exceeds its lot, and the ends of the double range give true
//! answers. Refusals are in tests/refusals.rs; the invariants in
//! tests/properties.rs; the values against scipy and mpmath in
//! tests/reference.rs.

mod common;
use common::{json_of, lotsman, pdf_text, stdout_of};

/// Runs `args` in `dir` and returns stdout; the run must succeed.
fn run_in(dir: &std::path::Path, args: &[&str]) -> String {
    let out = lotsman()
        .current_dir(dir)
        .args(args)
        .assert()
        .success()
        .get_output()
        .stdout
        .clone();
    String::from_utf8(out).unwrap()
}

/// Item 1: 1.5 and 4 nonconformities per unit are rates, not
/// probabilities. The source that `design` writes is evaluated and printed,
/// and every quality, AOQ and AOQL is shown per unit and per 100 units.
#[test]
fn poisson_rates_above_one_per_unit_are_evaluated_and_printed() {
    let dir = tempfile::tempdir().unwrap();
    let d = dir.path();
    run_in(
        d,
        &[
            "design", "--model", "poisson", "--aql", "1.5", "--rql", "4", "--output", "p.yaml",
        ],
    );
    let table = run_in(d, &["evaluate", "p.yaml"]);
    assert!(
        table.contains("Quality per unit (per 100 units)")
            && table.contains("AOQ per unit (per 100 units)"),
        "{table}"
    );
    // AOQ at the AQL: Pa 0.957379 x 1.5 = 1.436 per unit (hand computation
    // from the achieved producer's risk 0.04262 that design prints).
    assert!(
        table.contains("1.500 (150.0)") && table.contains("1.436 (143.6)"),
        "{table}"
    );
    assert!(
        table.contains("AOQL 1.632 per unit (163.2 per 100 units)"),
        "{table}"
    );
    let v: serde_json::Value =
        serde_json::from_str(&run_in(d, &["evaluate", "p.yaml", "--format", "json"])).unwrap();
    assert_eq!(v["quality_unit"], "per_unit");
    assert!(v["aoql"]["value"].as_f64().unwrap() > 1.0);
    let csv = run_in(d, &["evaluate", "p.yaml", "--format", "csv"]);
    assert!(
        csv.starts_with("quality_per_unit,pa,aoq_per_unit,ati,asn,asn_curtailed\n"),
        "{csv}"
    );
    lotsman()
        .current_dir(d)
        .args(["sheet", "p.yaml"])
        .assert()
        .success();
    let text = pdf_text(&std::fs::read(d.join("p.pdf")).unwrap());
    for part in [
        "Quality per unit",
        "1.5 (150 per 100)",
        "Per 100 units",
        "AOQ per unit",
    ] {
        assert!(text.contains(part), "no '{part}' in\n{text}");
    }
    let design = stdout_of(&[
        "design", "--model", "poisson", "--aql", "1.5", "--rql", "4", "--format", "json",
    ]);
    assert!(
        design.contains("\"quality_unit\": \"per_unit\""),
        "{design}"
    );
}

/// Item 2, the example: 2.29% to 2.32% all mean D = 46 in a lot of
/// 2000, so they get one AOQ, and no AOQ is above the AOQL.
#[test]
fn qualities_that_mean_the_same_lot_get_the_same_measures() {
    let args = [
        "evaluate",
        "--n",
        "125",
        "--c",
        "3",
        "--lot-size",
        "2000",
        "--range",
        "0.0229:0.0233:5",
    ];
    let mut json = args.to_vec();
    json.extend(["--format", "json"]);
    let v = json_of(&json);
    let points = v["points"].as_array().unwrap();
    let aoql = v["aoql"]["value"].as_f64().unwrap();
    for p in &points[..4] {
        assert_eq!(p["lot_nonconforming"], 46);
        assert_eq!(p["lot_quality"].as_f64().unwrap(), 0.023);
        assert_eq!(p["aoq"], points[0]["aoq"]);
    }
    assert_eq!(points[4]["lot_nonconforming"], 47);
    for p in points {
        assert!(p["aoq"].as_f64().unwrap() <= aoql, "{p}");
    }
    let table = stdout_of(&args);
    assert!(
        table.contains("D in the lot") && table.contains("Lot quality D/N"),
        "{table}"
    );
    assert!(
        table.contains("AOQL 1.459% at lot quality 2.300% (D = 46)"),
        "{table}"
    );
    let mut csv = args.to_vec();
    csv.extend(["--format", "csv"]);
    let csv = stdout_of(&csv);
    assert!(
        csv.starts_with(
            "quality,lot_nonconforming,lot_quality,pa,aoq,ati,asn,asn_curtailed\n0.0229,46,0.023,"
        ),
        "{csv}"
    );
}

/// Item 8: in a lot of 300, the AQL 0.65% means D = 2, a lot quality of
/// 0.6667%. The sheet's quality table shows the AQL as agreed, with D and
/// the lot quality its row is computed at.
#[test]
fn the_sheet_shows_the_lot_quality_and_d_beside_the_agreed_quality() {
    let dir = tempfile::tempdir().unwrap();
    let d = dir.path();
    run_in(
        d,
        &[
            "design",
            "--aql",
            "0.65%",
            "--rql",
            "5%",
            "--lot-size",
            "300",
            "--output",
            "h.yaml",
        ],
    );
    lotsman()
        .current_dir(d)
        .args(["sheet", "h.yaml"])
        .assert()
        .success();
    let text = pdf_text(&std::fs::read(d.join("h.pdf")).unwrap());
    for part in ["D in the lot", "Lot quality D/N", "0.6500%", "0.6667%"] {
        assert!(text.contains(part), "no '{part}' in\n{text}");
    }
}
