//! The `tradeoff` command: its flags, JSON and CSV keys, exit codes and
//! messages. Each cell is cross-checked against the `design` and
//! `evaluate` commands for the same points, which the reference suite, tests/reference/ and
//! tests/reference/staged.rs check against the reference scripts.

use crate::common;
use common::{json_of, lotsman, pdf_text, stdout_of};

use predicates::prelude::*;
use serde_json::Value;

fn cell(v: &Value, aql: f64, rql: f64) -> &Value {
    v["cells"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["aql"].as_f64() == Some(aql) && c["rql"].as_f64() == Some(rql))
        .unwrap_or_else(|| panic!("cell {aql} {rql}"))
}

#[test]
fn json_cells_hold_the_plan_design_gives_for_the_same_points() {
    let grid = json_of(&[
        "tradeoff",
        "--aql",
        "0.5%:1.5%:3",
        "--rql",
        "4%,6%",
        "--format",
        "json",
    ]);
    for key in [
        "title",
        "scheme",
        "model",
        "lot_size",
        "alpha",
        "beta",
        "criterion",
        "aql",
        "rql",
        "cost",
        "cells",
        "solved_by",
    ] {
        assert!(grid.get(key).is_some(), "missing {key}");
    }
    assert_eq!(grid["aql"].as_array().unwrap().len(), 3);
    assert_eq!(grid["cells"].as_array().unwrap().len(), 6);
    assert_eq!(grid["cost"], Value::Null);
    for (aql, rql) in [(0.005, 0.04), (0.01, 0.06), (0.015, 0.06)] {
        let c = cell(&grid, aql, rql);
        for key in [
            "n",
            "c",
            "asn_at_aql",
            "producer_risk",
            "consumer_risk",
            "reason",
        ] {
            assert!(c.get(key).is_some(), "missing cells[].{key}");
        }
        assert!(c.get("cost").is_none(), "no cost fields without a cost");
        let design = json_of(&[
            "design",
            "--aql",
            &aql.to_string(),
            "--rql",
            &rql.to_string(),
            "--format",
            "json",
        ]);
        assert_eq!(c["n"], design["stages"][0]["n"], "{aql} {rql}");
        assert_eq!(c["c"], design["stages"][0]["accept"], "{aql} {rql}");
        assert_eq!(
            c["producer_risk"], design["producer"]["achieved_risk"],
            "{aql} {rql}"
        );
    }
    // The plan of 1%/6% (the README's example).
    assert_eq!(cell(&grid, 0.01, 0.06)["n"], 110);
}

#[test]
fn the_cost_is_the_cost_per_unit_times_the_ati_that_evaluate_reports() {
    let grid = json_of(&[
        "tradeoff",
        "--aql",
        "1%",
        "--rql",
        "5%,8%",
        "--lot-size",
        "2000",
        "--cost-per-unit",
        "2.5",
        "--process-average",
        "1.2%",
        "--format",
        "json",
    ]);
    assert_eq!(grid["cost"]["per_unit"], 2.5);
    assert_eq!(grid["cost"]["process_average"], 0.012);
    for rql in [0.05, 0.08] {
        let c = cell(&grid, 0.01, rql);
        let (n, acc) = (c["n"].as_u64().unwrap(), c["c"].as_u64().unwrap());
        let eval = json_of(&[
            "evaluate",
            "--n",
            &n.to_string(),
            "--c",
            &acc.to_string(),
            "--lot-size",
            "2000",
            "--at",
            "1.2%",
            "--format",
            "json",
        ]);
        let ati = eval["points"][0]["ati"].as_f64().unwrap();
        assert_eq!(c["ati"].as_f64().unwrap(), ati);
        assert_eq!(c["pa_at_process"], eval["points"][0]["pa"]);
        assert!((c["cost"].as_f64().unwrap() - 2.5 * ati).abs() < 1e-9 * ati);
    }
}

#[test]
fn a_double_grid_holds_the_double_designer_s_stages() {
    let grid = json_of(&[
        "tradeoff", "--aql", "1%", "--rql", "6%", "--scheme", "double", "--format", "json",
    ]);
    let design = json_of(&[
        "design", "--aql", "1%", "--rql", "6%", "--scheme", "double", "--format", "json",
    ]);
    let c = cell(&grid, 0.01, 0.06);
    assert_eq!(grid["criterion"], "asn-aql");
    assert_eq!(c["stages"], design["stages"]);
    assert_eq!(c["n"], 131, "largest sample n1 + n2 (README's double plan)");
    let asn = c["asn_at_aql"].as_f64().unwrap();
    assert!((asn - design["asn"]["at_aql"].as_f64().unwrap()).abs() < 1e-9 * asn);
}

#[test]
fn cells_without_a_plan_say_why_and_the_rest_still_solve() {
    let grid = json_of(&[
        "tradeoff", "--aql", "2%,5%", "--rql", "4%", "--format", "json",
    ]);
    assert!(cell(&grid, 0.02, 0.04)["n"].is_u64());
    let bad = cell(&grid, 0.05, 0.04);
    assert_eq!(bad["n"], Value::Null);
    assert!(bad["reason"].as_str().unwrap().contains("must be below"));
    lotsman()
        .args(["tradeoff", "--aql", "2%,5%", "--rql", "4%"])
        .assert()
        .success()
        .stdout(predicate::str::contains("no plan in 1 of 2 cells"));
}

#[test]
fn the_table_shows_n_and_c_in_blocks_of_columns() {
    lotsman()
        .args([
            "tradeoff",
            "--aql",
            "1%",
            "--rql",
            "2%:11%:10",
            "--title",
            "Seal negotiation",
        ])
        .assert()
        .success()
        .stdout(predicate::str::contains("Seal negotiation"))
        .stdout(predicate::str::contains("110/3"))
        .stdout(predicate::str::contains("AQL \\ RQL").count(2))
        .stdout(predicate::str::contains("Sampling does not guarantee"));
}

#[test]
fn csv_has_one_row_per_cell() {
    let text = stdout_of(&[
        "tradeoff",
        "--aql",
        "0.5%:1%:2",
        "--rql",
        "4%:6%:3",
        "--format",
        "csv",
    ]);
    let lines: Vec<&str> = text.lines().collect();
    assert_eq!(
        lines[0],
        "aql,rql,n,c,asn_at_aql,producer_risk,consumer_risk,stages,pa_at_process,ati,cost,full_inspection,reason"
    );
    assert_eq!(lines.len(), 1 + 6);
    assert!(lines.iter().any(|l| l.starts_with("0.01,0.06,110,3,")));
}

#[test]
fn output_writes_the_report_to_a_file() {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("grid.json");
    lotsman()
        .args(["tradeoff", "--aql", "1%", "--rql", "6%", "--format", "json"])
        .arg("--output")
        .arg(&path)
        .assert()
        .success()
        .stdout(predicate::str::is_empty());
    let v: Value = serde_json::from_str(&std::fs::read_to_string(&path).unwrap()).unwrap();
    assert_eq!(v["cells"][0]["n"], 110);
}

#[test]
fn bad_requests_exit_2_with_a_message_naming_the_problem() {
    for (args, message) in [
        (
            vec![
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--cost-per-unit",
                "2",
                "--process-average",
                "1%",
            ],
            "needs a lot size",
        ),
        (
            vec![
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--lot-size",
                "500",
                "--cost-per-unit",
                "-2",
                "--process-average",
                "1%",
            ],
            "cost per unit inspected = -2",
        ),
        (
            vec!["--aql", "0.1%:1%:600", "--rql", "2%:9%:600"],
            "number of grid cells = 360000",
        ),
        (
            vec!["--aql", "1%", "--rql", "6%", "--criterion", "asn-rql"],
            "--criterion applies to double plans",
        ),
        (
            vec!["--aql", "1%", "--rql", "6%", "--beta", "0.96"],
            "alpha + beta",
        ),
        (vec!["--aql", "1%,x", "--rql", "6%"], "--aql = 'x'"),
        (vec!["--aql", "1%", "--rql", "6%:3%:4"], "must be below HI"),
    ] {
        lotsman()
            .arg("tradeoff")
            .args(&args)
            .assert()
            .code(2)
            .stderr(predicate::str::contains(message));
    }
}

#[test]
fn pdf_writes_the_heat_map_and_needs_an_output_file() {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("map.pdf");
    lotsman()
        .args([
            "tradeoff",
            "--aql",
            "0.5%:1.5%:5",
            "--rql",
            "3%:7%:5",
            "--title",
            "Packing rings",
            "--format",
            "pdf",
            "--paper",
            "letter",
        ])
        .arg("--output")
        .arg(&path)
        .assert()
        .success();
    let text = pdf_text(&std::fs::read(&path).unwrap());
    assert!(text.contains("Packing rings"), "{text}");
    assert!(
        text.contains("lotsman tradeoff --aql 0.5%:1.5%:5"),
        "{text}"
    );
    lotsman()
        .args([
            "tradeoff", "--aql", "1%,2%", "--rql", "6%,8%", "--format", "pdf",
        ])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("--output FILE.pdf"));
}
