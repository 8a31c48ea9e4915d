//! The `rectify` command's contract: flags, JSON keys, CSV columns, exit
//! codes and messages. The plans it prints are the exhaustive scipy search's
//! (tests/data/minimum_reference.json) at the same conditions.

use crate::common;
use common::{lotsman, refused_message, stdout_of};

use predicates::prelude::*;
use serde_json::Value;

/// The JSON of `rectify` with `args`.
fn json_of(args: &[&str]) -> Value {
    common::json_of(&[&["rectify"], args, &["--format", "json"]].concat())
}

/// Exit 2 with a message on stderr that contains every `needle`; the
/// message, for the one-line check.
fn refused(args: &[&str], needles: &[&str]) -> String {
    refused_message("rectify", args, needles)
}

/// As [`refused`], and the message is one line.
fn refused_in_one_line(args: &[&str], needles: &[&str]) {
    let text = refused(args, needles);
    assert_eq!(text.lines().count(), 1, "{text}");
}

#[test]
fn json_has_the_documented_keys() {
    // Fixture row (hypergeometric, 5000, 0.25%, LTPD 1%): n = 766, c = 4.
    let v = json_of(&[
        "--lot-size",
        "5000",
        "--process-average",
        "0.25%",
        "--ltpd",
        "1%",
    ]);
    for key in [
        "title",
        "scheme",
        "model",
        "lot_size",
        "process_average",
        "protection",
        "full_inspection",
        "plan",
        "single_plan",
        "by_acceptance_number",
        "notes",
        "solved_by",
    ] {
        assert!(v.get(key).is_some(), "missing {key}");
    }
    assert_eq!(v["model"], "hypergeometric", "the lot is known");
    assert_eq!(v["scheme"], "single");
    assert_eq!(v["protection"]["kind"], "ltpd");
    assert_eq!(v["protection"]["beta"], 0.1, "beta defaults to 0.10");
    assert_eq!(v["full_inspection"], false);
    assert_eq!(v["single_plan"], Value::Null);
    let plan = &v["plan"];
    for key in [
        "stages",
        "pa",
        "ati",
        "asn",
        "saving",
        "aoql",
        "ltpd",
        "ltpd_risk",
        "pa_at_ltpd",
    ] {
        assert!(plan.get(key).is_some(), "missing plan.{key}");
    }
    assert_eq!(plan["stages"][0]["n"], 766);
    assert_eq!(plan["stages"][0]["accept"], 4);
    assert!(plan["aoql"]["value"].is_number() && plan["aoql"]["quality"].is_number());
    let rows = v["by_acceptance_number"].as_array().unwrap();
    assert_eq!(rows.len(), 7, "c = 0 to 6, where the scan stops");
    assert_eq!(rows[6]["n_min"], 1004);
    for key in ["c", "n_min", "ati"] {
        assert!(rows[0].get(key).is_some(), "missing row {key}");
    }
}

#[test]
fn a_double_plan_reports_the_single_plan_beside_it() {
    // Fixture row (binomial, 1000, 1%, AOQL 2%): 20:0:5 163:4:5 against the
    // single plan n = 65, c = 2.
    let v = json_of(&[
        "--lot-size",
        "1000",
        "--process-average",
        "1%",
        "--aoql",
        "2%",
        "--model",
        "binomial",
        "--scheme",
        "double",
    ]);
    assert_eq!(v["scheme"], "double");
    assert_eq!(v["protection"]["kind"], "aoql");
    assert_eq!(v["protection"]["beta"], Value::Null);
    let stages = v["plan"]["stages"].as_array().unwrap();
    assert_eq!(stages.len(), 2);
    assert_eq!(
        (&stages[0]["n"], &stages[0]["accept"], &stages[0]["reject"]),
        (&Value::from(20), &Value::from(0), &Value::from(5))
    );
    assert_eq!(stages[1]["n"], 163);
    assert_eq!(v["single_plan"]["stages"][0]["n"], 65);
    assert_eq!(v["plan"]["pa_at_ltpd"], Value::Null);
    assert_eq!(v["plan"]["ltpd_risk"], 0.1);
}

#[test]
fn when_no_sample_protects_the_answer_is_full_inspection() {
    // Fixture row (binomial, 50, 0.5%, LTPD 2%): (0.98)^50 = 0.36 > 0.10.
    let args = [
        "--lot-size",
        "50",
        "--process-average",
        "0.5%",
        "--ltpd",
        "2%",
        "--model",
        "binomial",
    ];
    let v = json_of(&args);
    assert_eq!(v["full_inspection"], true);
    assert_eq!(v["plan"], Value::Null);
    lotsman()
        .arg("rectify")
        .args(args)
        .assert()
        .success()
        .stdout(predicate::str::contains(
            "PLAN  inspect every unit of the lot (100% inspection)",
        ))
        .stdout(predicate::str::contains(
            "no single plan with a sample within the lot",
        ));
}

#[test]
fn the_table_shows_the_steps_the_trade_off_and_the_caution() {
    lotsman()
        .args([
            "rectify",
            "--lot-size",
            "5000",
            "--process-average",
            "1%",
            "--aoql",
            "3%",
        ])
        .assert()
        .success()
        .stdout(predicate::str::contains(
            "PLAN  n = 64, c = 3 (reject at 4)",
        ))
        .stdout(predicate::str::contains("1. Draw 64 units at random"))
        // The last step screens rejected lots: ATI and AOQ assume it, so
        // the generic "returned or screened" must not appear.
        .stdout(predicate::str::contains(
            "4. Rectifying inspection: screen every rejected lot 100%",
        ))
        .stdout(predicate::str::contains("returned or screened").not())
        .stdout(predicate::str::contains("average total inspection ATI"))
        .stdout(predicate::str::contains("100% inspection"))
        .stdout(predicate::str::contains(" 3 *"))
        .stdout(predicate::str::contains("The scan stops at c = 4"))
        .stdout(predicate::str::contains(lotsman::words::CAUTION));
}

#[test]
fn csv_lists_the_single_plans_by_acceptance_number() {
    let text = stdout_of(&[
        "rectify",
        "--lot-size",
        "5000",
        "--process-average",
        "1%",
        "--aoql",
        "3%",
        "--format",
        "csv",
    ]);
    let lines: Vec<&str> = text.lines().collect();
    assert_eq!(lines[0], "c,n_min,ati,best_single");
    assert_eq!(lines.len(), 1 + 5, "c = 0 to 4");
    assert!(lines[4].starts_with("3,64,") && lines[4].ends_with(",true"));
    assert!(lines[1].ends_with(",false"));
}

#[test]
fn invalid_input_exits_2_with_a_message_naming_the_parameter() {
    let base = ["--lot-size", "5000", "--process-average"];
    refused_in_one_line(
        &[&base[..], &["1%", "--ltpd", "1%"]].concat(),
        &["process average 0.01 must be below the LTPD 0.01"],
    );
    refused_in_one_line(
        &[&base[..], &["4%", "--aoql", "3%"]].concat(),
        &["must be below the AOQL"],
    );
    refused_in_one_line(
        &["--lot-size", "1", "--process-average", "1%", "--ltpd", "5%"],
        &["lot size = 1 is out of range"],
    );
    refused_in_one_line(
        &[&base[..], &["1%", "--ltpd", "5%", "--beta", "1.5"]].concat(),
        &["beta", "1.5", "between 0 and 1"],
    );
    refused_in_one_line(
        &[&base[..], &["0.5%", "--ltpd", "150%"]].concat(),
        &["LTPD (--ltpd) = 1.5 is out of range"],
    );
    refused_in_one_line(
        &[
            "--lot-size",
            "40",
            "--process-average",
            "0.5%",
            "--ltpd",
            "1%",
        ],
        &["means no nonconforming unit in a lot of 40"],
    );
    refused_in_one_line(
        &[&base[..], &["1%", "--ltpd", "x"]].concat(),
        &["--ltpd", "'x'"],
    );
}

#[test]
fn the_flags_are_checked_by_the_parser() {
    // One protection, and --beta only with --ltpd.
    refused(
        &["--lot-size", "5000", "--process-average", "1%"],
        &["--ltpd", "--aoql"],
    );
    refused(
        &[
            "--lot-size",
            "5000",
            "--process-average",
            "1%",
            "--ltpd",
            "5%",
            "--aoql",
            "3%",
        ],
        &["cannot be used with"],
    );
    refused(
        &[
            "--lot-size",
            "5000",
            "--process-average",
            "1%",
            "--aoql",
            "3%",
            "--beta",
            "0.05",
        ],
        &["'--aoql <L>' cannot be used with '--beta <B>'"],
    );
}

#[test]
fn a_double_search_beyond_its_limit_is_refused() {
    // The best single plan for lots of 100,000 at 0.5% with an LTPD of 1%
    // has c = 29, past the double search's limit of 25.
    refused_in_one_line(
        &[
            "--lot-size",
            "100000",
            "--process-average",
            "0.5%",
            "--ltpd",
            "1%",
            "--scheme",
            "double",
        ],
        &[
            "no minimum-inspection plan",
            "limit of 25",
            "use the single plan",
        ],
    );
}
