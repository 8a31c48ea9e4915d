//! The command-line contract: flags, JSON keys, exit codes and messages.

use crate::common;
use common::{json_of, lotsman};

use predicates::prelude::*;
use serde_json::Value;

#[test]
fn design_json_has_the_documented_keys() {
    let v = json_of(&[
        "design", "--aql", "1%", "--alpha", "0.05", "--rql", "6%", "--beta", "0.10", "--format",
        "json",
    ]);
    for key in [
        "scheme",
        "model",
        "lot_size",
        "stages",
        "producer",
        "consumer",
        "alternatives",
    ] {
        assert!(v.get(key).is_some(), "missing {key}");
    }
    assert_eq!(v["scheme"], "single");
    assert_eq!(v["model"], "binomial");
    assert_eq!(v["lot_size"], Value::Null);
    assert_eq!(v["stages"][0]["n"], 110);
    assert_eq!(v["stages"][0]["accept"], 3);
    assert_eq!(v["stages"][0]["reject"], 4);
    for side in ["producer", "consumer"] {
        for key in ["quality", "risk", "achieved_risk"] {
            assert!(v[side][key].is_number(), "{side}.{key}");
        }
    }
    assert_eq!(v["producer"]["quality"], 0.01);
    let alternatives = v["alternatives"].as_array().unwrap();
    assert_eq!(alternatives.len(), 3 + 1 + 3, "c = 0 .. chosen + 3");
    assert_eq!(alternatives[3]["feasible"], true);
    assert_eq!(alternatives[2]["feasible"], false);
}

#[test]
fn fractions_and_percents_give_the_same_plan() {
    let a = json_of(&[
        "design", "--aql", "0.01", "--rql", "0.06", "--format", "json",
    ]);
    let b = json_of(&["design", "--aql", "1%", "--rql", "6%", "--format", "json"]);
    assert_eq!(a["stages"], b["stages"]);
}

#[test]
fn a_lot_size_without_a_model_means_the_hypergeometric_model() {
    let v = json_of(&[
        "design",
        "--aql",
        "1%",
        "--rql",
        "8%",
        "--lot-size",
        "400",
        "--format",
        "json",
    ]);
    assert_eq!(v["model"], "hypergeometric");
    assert_eq!(v["lot_size"], 400);
    assert_eq!(v["stages"][0]["n"], 62);
}

#[test]
fn evaluate_json_has_the_documented_keys() {
    let v = json_of(&[
        "evaluate",
        "--n",
        "89",
        "--c",
        "2",
        "--lot-size",
        "10000",
        "--model",
        "binomial",
        "--at",
        "1%,2%",
        "--format",
        "json",
    ]);
    let points = v["points"].as_array().unwrap();
    assert_eq!(points.len(), 2);
    for key in ["quality", "pa", "aoq", "ati", "asn"] {
        assert!(points[0][key].is_number(), "points[0].{key}");
    }
    assert!(v["aoql"]["value"].is_number() && v["aoql"]["quality"].is_number());
    assert!(v["indifference_quality"].is_number());
    // Montgomery's n = 89, c = 2 at p = 0.02: Pa 0.7366 (from memory).
    assert!((points[1]["pa"].as_f64().unwrap() - 0.7366).abs() < 5e-5);
}

#[test]
fn evaluate_accepts_a_staged_plan_and_a_range() {
    let v = json_of(&[
        "evaluate",
        "--stage",
        "50:1:4",
        "--stage",
        "100:4:5",
        "--range",
        "1%:10%:10",
        "--format",
        "json",
    ]);
    assert_eq!(v["stages"].as_array().unwrap().len(), 2);
    assert_eq!(v["points"].as_array().unwrap().len(), 10);
    let asn = v["points"][0]["asn"].as_f64().unwrap();
    assert!(
        asn > 50.0 && asn < 100.0,
        "ASN of a double plan lies between the stage sizes: {asn}"
    );
}

#[test]
fn evaluate_csv_has_a_header_and_one_row_per_quality() {
    lotsman()
        .args([
            "evaluate", "--n", "50", "--c", "1", "--at", "1%,2%,3%", "--format", "csv",
        ])
        .assert()
        .success()
        .stdout(predicate::str::starts_with(
            "quality,pa,aoq,ati,asn,asn_curtailed\n",
        ))
        .stdout(predicate::function(|s: &str| s.lines().count() == 4));
}

#[test]
fn bad_inputs_exit_2_with_a_message_naming_the_value() {
    let cases: &[(&[&str], &str)] = &[
        (
            &["design", "--aql", "6%", "--rql", "1%"],
            "must be below the consumer's quality",
        ),
        (
            &["design", "--aql", "0", "--rql", "1%"],
            "producer's quality (AQL) = 0 is out of range",
        ),
        (
            &["design", "--aql", "1%%", "--rql", "6%"],
            "--aql = '1%%' is not a fraction",
        ),
        (
            &["design", "--aql", "1%", "--rql", "6%", "--alpha", "1.5"],
            "alpha (producer's risk) = 1.5",
        ),
        (
            &[
                "design", "--aql", "1%", "--rql", "6%", "--alpha", "0.6", "--beta", "0.5",
            ],
            "alpha + beta",
        ),
        (
            &["design", "--aql", "1%", "--rql", "6%", "--lot-size", "0"],
            "lot size = 0 is out of range",
        ),
        (
            &["design", "--aql", "1%", "--rql", "6%", "--lot-size", "12.5"],
            "--lot-size = '12.5' is not a whole number",
        ),
        (
            &[
                "design",
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--model",
                "hypergeometric",
            ],
            "needs a lot size",
        ),
        (
            &["evaluate", "--n", "5", "--c", "5"],
            "acceptance number 5 must be below the cumulative sample size 5",
        ),
        (
            &["evaluate", "--stage", "50:1:3", "--stage", "40:2:3"],
            "must exceed stage 1's 50",
        ),
        (
            &["evaluate", "--stage", "50:1:4"],
            "the last stage must decide every count",
        ),
        (
            &["evaluate", "--n", "50", "--c", "1", "--at", "1.5"],
            "quality = 1.5 is out of range",
        ),
        (
            &["new", "double-helix"],
            "one of: binomial, hypergeometric, poisson",
        ),
    ];
    for (args, message) in cases {
        lotsman()
            .args(*args)
            .assert()
            .code(2)
            .stderr(predicate::str::contains(*message))
            .stderr(predicate::str::contains("panicked").not());
    }
}

#[test]
fn a_lot_too_small_to_separate_the_points_has_no_plan() {
    lotsman()
        .args(["design", "--aql", "1%", "--rql", "2%", "--lot-size", "20"])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("no sample can tell them apart"))
        .stderr(predicate::str::contains(
            "inspect 100% of the lot, or widen the pair of points",
        ));
}

#[test]
fn risk_points_too_close_are_refused_quickly() {
    let started = std::time::Instant::now();
    lotsman()
        .args(["design", "--aql", "0.0000001", "--rql", "0.00000010001"])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("too close"));
    assert!(started.elapsed().as_secs_f64() < 5.0);
}

#[test]
fn design_writes_a_source_that_verifies_and_will_not_overwrite_its_input() {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("p.yaml");
    let p = path.to_str().unwrap();
    lotsman()
        .args([
            "design",
            "--aql",
            "0.5%",
            "--rql",
            "3%",
            "--title",
            "Test plan",
            "--output",
            p,
        ])
        .assert()
        .success();
    lotsman()
        .args(["verify", p])
        .assert()
        .success()
        .stdout(predicate::str::contains("1 match"));
    lotsman()
        .args(["design", p, "--output", p])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("is the plan source being read"));
    // design FILE re-solves the source and prints the same plan as YAML.
    let again = lotsman()
        .args(["design", p, "--format", "yaml"])
        .assert()
        .success()
        .get_output()
        .stdout
        .clone();
    assert_eq!(
        again,
        std::fs::read(&path).unwrap(),
        "a tool-written source round-trips byte for byte"
    );
}

#[test]
fn verify_reports_a_hand_edited_plan_with_exit_1() {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("edited.yaml");
    let original = std::fs::read_to_string("plans/tpw-seal-visual.yaml").unwrap();
    std::fs::write(&path, original.replace("n: 166", "n: 150")).unwrap();
    lotsman()
        .args(["verify", path.to_str().unwrap(), "plans/tpw-cover-fit.yaml"])
        .assert()
        .code(1)
        .stdout(predicate::str::contains(
            "stage 1 n: recorded 150, re-solved 166",
        ))
        .stdout(predicate::str::contains("1 match, 1 mismatch, 0 invalid"));
}

#[test]
fn verify_of_an_invalid_source_exits_2_and_still_checks_the_others() {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("typo.yaml");
    let original = std::fs::read_to_string("plans/tpw-cover-fit.yaml").unwrap();
    std::fs::write(&path, original.replace("lot_size: 400", "lotsize: 400")).unwrap();
    lotsman()
        .args([
            "verify",
            path.to_str().unwrap(),
            "plans/tpw-seal-visual.yaml",
            "--format",
            "json",
        ])
        .assert()
        .code(2)
        .stdout(predicate::str::contains(
            "'lotsize' is not a key of a plan source; did you mean lot_size?",
        ))
        .stdout(predicate::str::contains("line 15"))
        .stdout(predicate::str::contains("\"status\": \"match\""));
}

#[test]
fn every_template_is_a_source_that_solves() {
    let dir = tempfile::tempdir().unwrap();
    for kind in [
        "binomial",
        "hypergeometric",
        "poisson",
        "double",
        "multiple",
        "sequential",
    ] {
        let text = lotsman()
            .args(["new", kind])
            .assert()
            .success()
            .get_output()
            .stdout
            .clone();
        let path = dir.path().join(format!("{kind}.yaml"));
        std::fs::write(&path, text).unwrap();
        let v = json_of(&["design", path.to_str().unwrap(), "--format", "json"]);
        match kind {
            "double" | "multiple" | "sequential" => assert_eq!(v["scheme"], kind),
            _ => assert_eq!(v["model"], kind),
        }
    }
}

#[test]
fn the_demo_plans_verify_and_the_demo_writes_its_files() {
    lotsman()
        .args([
            "verify",
            "plans/tpw-seal-visual.yaml",
            "plans/tpw-cover-fit.yaml",
            "plans/tpw-housing-finish.yaml",
            "plans/tpw-impeller-porosity.yaml",
            "plans/tpw-sleeve-hardness.yaml",
            "plans/tpw-cover-thickness.yaml",
            "plans/tpw-packing-ring.yaml",
        ])
        .assert()
        .success();
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("demo");
    lotsman()
        .args(["demo", "--output-dir", out.to_str().unwrap()])
        .assert()
        .success()
        .stdout(predicate::str::contains(
            "the recorded plan matches a fresh solve",
        ))
        .stdout(predicate::str::contains("Sampling does not guarantee"))
        .stdout(predicate::str::contains(
            "judged the demo lot's readings: ACCEPT",
        ));
    for name in [
        "tpw-seal-visual.yaml",
        "tpw-cover-fit-oc.csv",
        "tpw-housing-finish.yaml",
        "tpw-cover-fit.pdf",
        "tpw-impeller-porosity.pdf",
        "tpw-sleeve-hardness-oc.csv",
        "tpw-sleeve-hardness.pdf",
        "tpw-cover-thickness.pdf",
        "tpw-cover-thickness-oc.csv",
        "tpw-cover-thickness-readings.csv",
        "tpw-packing-ring.pdf",
    ] {
        assert!(out.join(name).is_file(), "{name}");
    }
    assert_eq!(
        std::fs::read(out.join("tpw-cover-fit.yaml")).unwrap(),
        std::fs::read("plans/tpw-cover-fit.yaml").unwrap()
    );
}

#[test]
fn judge_gives_the_lot_decision_as_text_and_json() {
    lotsman()
        .args(["judge", "plans/tpw-seal-visual.yaml", "--found", "3"])
        .assert()
        .success()
        .stdout(predicate::str::starts_with("ACCEPT the lot"));
    let v = json_of(&[
        "judge",
        "plans/tpw-seal-visual.yaml",
        "--found",
        "4",
        "--format",
        "json",
    ]);
    assert_eq!(v["decision"], "reject");
    assert_eq!(v["cumulative_count"], 4);
    lotsman()
        .args(["judge", "plans/tpw-seal-visual.yaml", "--found", "167"])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("0 to 166"));
}

#[test]
fn double_design_json_has_stages_asn_and_the_criterion() {
    let v = json_of(&[
        "design", "--aql", "1%", "--rql", "6%", "--scheme", "double", "--format", "json",
    ]);
    assert_eq!(v["scheme"], "double");
    assert_eq!(v["criterion"], "asn-aql");
    let stages = v["stages"].as_array().unwrap();
    assert_eq!(stages.len(), 2);
    assert_eq!(
        stages[1]["reject"],
        stages[1]["accept"].as_u64().unwrap() + 1
    );
    assert_eq!(v["single_plan"]["n"], 110);
    let asn = &v["asn"];
    assert!(asn["at_aql"].as_f64().unwrap() < 110.0);
    for key in [
        "at_rql",
        "max",
        "max_quality",
        "max_sample",
        "saving_at_aql",
    ] {
        assert!(asn[key].is_number(), "asn.{key}");
    }
    assert!(v["producer"]["achieved_risk"].as_f64().unwrap() <= 0.05);
    assert!(v["alternatives"].as_array().unwrap().is_empty());
}

#[test]
fn second_ratio_fixes_the_second_sample() {
    let v = json_of(&[
        "design",
        "--aql",
        "1%",
        "--rql",
        "6%",
        "--scheme",
        "double",
        "--second-ratio",
        "2",
        "--format",
        "json",
    ]);
    let s = v["stages"].as_array().unwrap();
    let (n1, n) = (s[0]["n"].as_u64().unwrap(), s[1]["n"].as_u64().unwrap());
    assert_eq!(n - n1, 2 * n1);
}

#[test]
fn sequential_design_json_has_the_lines_and_the_item_table() {
    let v = json_of(&[
        "design",
        "--aql",
        "1%",
        "--rql",
        "6%",
        "--scheme",
        "sequential",
        "--format",
        "json",
    ]);
    let seq = &v["sequential"];
    for key in ["h_accept", "h_reject", "slope"] {
        assert!(seq[key].as_f64().unwrap() > 0.0, "sequential.{key}");
    }
    let truncation = seq["truncation"].as_u64().unwrap();
    assert!(truncation >= 110);
    assert_eq!(v["stages"].as_array().unwrap().len() as u64, truncation);
    let table = seq["table"].as_array().unwrap();
    assert_eq!(table[0]["first"], 1);
    assert_eq!(table[table.len() - 1]["last"], truncation);
    assert!(seq["wald"]["asn_aql"].is_number());
}

#[test]
fn multiple_design_has_the_stage_count_asked_for() {
    let v = json_of(&[
        "design",
        "--aql",
        "2%",
        "--rql",
        "10%",
        "--scheme",
        "multiple",
        "--stage-count",
        "4",
        "--format",
        "json",
    ]);
    assert_eq!(v["stages"].as_array().unwrap().len(), 4);
}

#[test]
fn scheme_options_on_the_wrong_scheme_are_refused() {
    for args in [
        &["--criterion", "asn-rql"][..],
        &["--scheme", "sequential", "--second-ratio", "2"][..],
        &["--scheme", "double", "--stage-count", "3"][..],
        &["--scheme", "multiple", "--criterion", "asn-max"][..],
        &["--scheme", "multiple", "--stage-count", "9"][..],
    ] {
        lotsman()
            .args(["design", "--aql", "1%", "--rql", "6%"])
            .args(args)
            .assert()
            .code(2)
            .stderr(predicate::str::contains("lotsman: error"));
    }
}

#[test]
fn judge_follows_a_double_and_a_sequential_plan() {
    let v = json_of(&[
        "judge",
        "plans/tpw-impeller-porosity.yaml",
        "--found",
        "1",
        "--format",
        "json",
    ]);
    assert_eq!(v["decision"], "continue");
    assert!(v["next_units"].as_u64().unwrap() > 0);
    for (inspected, found, code, said) in [
        ("1", "0", 0, "GO ON to the next item"),
        ("2", "2", 0, "REJECT"),
        ("9999", "0", 2, "--inspected"),
    ] {
        let run = lotsman()
            .args(["judge", "plans/tpw-sleeve-hardness.yaml"])
            .args(["--inspected", inspected, "--found", found])
            .assert()
            .code(code);
        let output = run.get_output();
        let text = String::from_utf8_lossy(if code == 0 {
            &output.stdout
        } else {
            &output.stderr
        });
        assert!(text.contains(said), "{inspected} {found}: {text}");
    }
}

#[test]
fn evaluate_reads_staged_and_sequential_sources() {
    for source in [
        "plans/tpw-impeller-porosity.yaml",
        "plans/tpw-sleeve-hardness.yaml",
    ] {
        let v = json_of(&["evaluate", source, "--format", "json", "--decided-at"]);
        let points = v["points"].as_array().unwrap();
        assert!(!points.is_empty());
        for (p, decided) in points.iter().zip(v["decided_at"].as_array().unwrap()) {
            assert!(p["asn_curtailed"].as_f64().unwrap() <= p["asn"].as_f64().unwrap() + 1e-9);
            let total: f64 = decided
                .as_array()
                .unwrap()
                .iter()
                .map(|x| x.as_f64().unwrap())
                .sum();
            assert!((total - 1.0).abs() < 1e-12, "{source}: {total}");
        }
    }
    let v = json_of(&[
        "evaluate",
        "plans/tpw-sleeve-hardness.yaml",
        "--format",
        "json",
    ]);
    assert!(v["sequential"]["truncation"].as_u64().unwrap() > 0);
}

#[test]
fn verify_names_the_sequential_field_that_was_edited() {
    let dir = tempfile::tempdir().unwrap();
    let text = std::fs::read_to_string("plans/tpw-sleeve-hardness.yaml").unwrap();
    let line = text
        .lines()
        .find(|l| l.trim_start().starts_with("h_accept:"))
        .unwrap();
    let edited = text.replace(line, "    h_accept: 1.41");
    let path = dir.path().join("edited.yaml");
    std::fs::write(&path, edited).unwrap();
    lotsman()
        .args(["verify", path.to_str().unwrap()])
        .assert()
        .code(1)
        .stdout(predicate::str::contains("plan.sequential.h_accept"));
}

#[test]
fn close_points_are_refused_by_the_double_designer_at_once() {
    let start = std::time::Instant::now();
    lotsman()
        .args([
            "design", "--aql", "1%", "--rql", "1.6%", "--scheme", "double",
        ])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("limit of 25"));
    assert!(start.elapsed().as_secs() < 5);
}

#[test]
fn design_reports_what_one_step_of_each_input_does_to_n() {
    let v = json_of(&[
        "design",
        "--aql",
        "1%",
        "--rql",
        "6%",
        "--step-rql",
        "1%",
        "--format",
        "json",
    ]);
    let rows = v["sensitivity"].as_array().unwrap();
    let inputs: Vec<&str> = rows.iter().map(|r| r["input"].as_str().unwrap()).collect();
    assert_eq!(inputs, ["aql", "alpha", "rql", "beta"]);
    let rql = &rows[2];
    assert_eq!(rql["step"], 0.01);
    // The consumer asking for 5% instead of 6%: the exhaustive reference
    // design (tests/data/tradeoff_reference.json) gives n = 132, c = 3.
    assert_eq!(rql["tightened"]["value"], 0.05);
    assert_eq!(rql["tightened"]["n"], 132);
    assert_eq!(rql["tightened"]["change"], 22);
    for key in ["value", "n", "c", "change", "reason"] {
        assert!(rql["conceded"].get(key).is_some(), "missing {key}");
    }
    lotsman()
        .args(["design", "--aql", "1%", "--rql", "6%"])
        .assert()
        .success()
        .stdout(predicate::str::contains("What one step of each input does"))
        .stdout(predicate::str::contains("132 (+22)"));
}

#[test]
fn a_step_that_leaves_no_plan_says_why_and_a_bad_step_is_refused() {
    lotsman()
        .args([
            "design",
            "--aql",
            "5%",
            "--alpha",
            "0.02",
            "--rql",
            "6%",
            "--step-aql",
            "1%",
        ])
        .assert()
        .success()
        .stdout(predicate::str::contains("no plan at AQL (p1) = 6%"));
    lotsman()
        .args([
            "design",
            "--aql",
            "1%",
            "--rql",
            "6%",
            "--step-beta",
            "-0.1",
        ])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("--step-beta"));
}
