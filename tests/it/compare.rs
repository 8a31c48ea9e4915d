//! `lotsman compare`: two to six plans at one pair of risk points. Its
//! numbers are those `lotsman evaluate` prints for each plan at the same
//! qualities; its refusals say what is wrong in words; its page holds the
//! three charts and every plan's label.

use serde_json::Value;

use crate::common::{json_of, lotsman, refused_message, stdout_of};

/// `evaluate`'s JSON of `args` at the qualities `aql,rql`.
fn evaluated(args: &[&str], at: &str) -> Value {
    let mut all = vec!["evaluate"];
    all.extend_from_slice(args);
    all.extend(["--at", at, "--format", "json"]);
    json_of(&all)
}

/// Checks a compared plan's row against `evaluate`'s report of the same
/// plan at the AQL and the RQL: the very same numbers.
fn same_as_evaluate(row: &Value, evaluation: &Value) {
    let (at_aql, at_rql) = (&evaluation["points"][0], &evaluation["points"][1]);
    assert_eq!(row["pa_at_aql"], at_aql["pa"]);
    assert_eq!(row["consumer_risk"], at_rql["pa"]);
    assert_eq!(row["asn_at_aql"], at_aql["asn"]);
    assert_eq!(row["asn_at_rql"], at_rql["asn"]);
    assert_eq!(row["aoql"], evaluation["aoql"]["value"]);
    assert_eq!(row["aoql_quality"], evaluation["aoql"]["quality"]);
    // 1 - Pa, up to the last digit the JSON reader may round.
    let producer = 1.0 - at_aql["pa"].as_f64().unwrap();
    assert!((row["producer_risk"].as_f64().unwrap() - producer).abs() < 1e-15);
}

#[test]
fn two_typed_single_plans_give_the_numbers_of_evaluate() {
    let compared = json_of(&[
        "compare", "--stage", "125:3:4", "--stage", "80:2:3", "--aql", "1%", "--rql", "6%",
        "--format", "json",
    ]);
    assert_eq!(compared["points_from"], "--aql and --rql");
    assert_eq!(
        (compared["alpha"].as_f64(), compared["beta"].as_f64()),
        (Some(0.05), Some(0.1))
    );
    let plans = compared["plans"].as_array().unwrap();
    assert_eq!(plans.len(), 2);
    for (row, (n, c)) in plans.iter().zip([("125", "3"), ("80", "2")]) {
        same_as_evaluate(row, &evaluated(&["--n", n, "--c", c], "1%,6%"));
    }
    assert_eq!(plans[0]["label"], "125:3:4");
    assert_eq!(plans[1]["n"], 80);
    // n = 80, c = 2 accepts a lot at 6% with Pa = 0.134445749565957
    // (scipy.stats.binom.cdf(2, 80, 0.06) = 0.13444574956595673): above
    // beta = 0.10, so it does not meet the consumer's point.
    let pa = plans[1]["consumer_risk"].as_f64().unwrap();
    assert!((pa - 0.134_445_749_565_956_73).abs() < 1e-12, "{pa}");
    assert_eq!(plans[1]["meets_beta"], false);
    assert_eq!(plans[0]["meets_beta"], true);
}

#[test]
fn a_source_and_a_typed_double_plan_are_held_to_the_sources_points() {
    let source = "plans/tpw-impeller-porosity.yaml";
    let compared = json_of(&[
        "compare",
        source,
        "--stage",
        "50:0:3+100:3:4",
        "--format",
        "json",
    ]);
    assert_eq!(compared["points_from"], source);
    let at = format!("{},{}", compared["aql"], compared["rql"]);
    let plans = compared["plans"].as_array().unwrap();
    same_as_evaluate(&plans[0], &evaluated(&[source], &at));
    let typed = evaluated(&["--stage", "50:0:3", "--stage", "100:3:4"], &at);
    same_as_evaluate(&plans[1], &typed);
    // A double plan has no one n: the table shows its ASN at the AQL.
    assert_eq!(plans[1]["n"], Value::Null);
    assert_eq!(plans[1]["label"], "50:0:3+100:3:4");
    let table = stdout_of(&["compare", source, "--stage", "50:0:3+100:3:4"]);
    assert!(table.contains("ASN 69.1"), "{table}");
    assert!(table.contains("its n column gives the average sample number at the AQL"));
}

#[test]
fn a_standard_indexed_source_is_compared_by_its_normal_plan_and_says_so() {
    let compared = json_of(&[
        "compare",
        "plans/tpw-seal-face-classes.yaml",
        "--stage",
        "200:1:2",
        "--aql",
        "0.065%",
        "--rql",
        "1%",
        "--format",
        "json",
    ]);
    let first = &compared["plans"][0];
    assert_eq!(first["stages"][0]["n"], 200);
    assert_eq!(first["lot_size"], 1500);
    let note = first["note"].as_str().unwrap();
    assert!(
        note.contains("normal-inspection plan of its first class, critical"),
        "{note}"
    );
}

#[test]
fn the_csv_and_json_keys_are_the_documented_ones() {
    let args = [
        "compare", "--stage", "125:3:4", "--stage", "80:2:3", "--aql", "1%", "--rql", "6%",
    ];
    let csv = stdout_of(&[&args[..], &["--format", "csv"]].concat());
    let header = csv.lines().next().unwrap();
    assert_eq!(
        header,
        "label,model,lot_size,stages,n,aql,alpha,rql,beta,pa_at_aql,producer_risk,consumer_risk,aoql,aoql_quality,asn_at_aql,asn_at_rql,meets_alpha,meets_beta,note"
    );
    assert_eq!(csv.lines().count(), 3);
    let json = json_of(&[&args[..], &["--format", "json"]].concat());
    // The reader sorts the keys.
    let keys = |v: &Value| -> Vec<String> { v.as_object().unwrap().keys().cloned().collect() };
    assert_eq!(
        keys(&json).join(","),
        "alpha,aql,beta,plans,points_from,quality_unit,rql"
    );
    assert_eq!(
        keys(&json["plans"][0]).join(","),
        "aoql,aoql_quality,asn_at_aql,asn_at_rql,consumer_risk,label,lot_size,meets_alpha,meets_beta,model,n,pa_at_aql,producer_risk,stages"
    );
}

#[test]
fn refusals_say_what_is_wrong() {
    let two = ["--stage", "125:3:4", "--stage", "80:2:3"];
    refused_message(
        "compare",
        &["--stage", "125:3:4", "--aql", "1%", "--rql", "6%"],
        &["1 plan was given; a comparison takes 2 to 6 plans"],
    );
    let seven: Vec<&str> = [
        "1:0:1", "2:0:1", "3:0:1", "4:0:1", "5:0:1", "6:0:1", "7:0:1",
    ]
    .iter()
    .flat_map(|s| ["--stage", s])
    .collect();
    refused_message("compare", &seven, &["7 plans were given"]);
    refused_message(
        "compare",
        &two,
        &["no plan source gives risk points", "--aql 1% --rql 6%"],
    );
    refused_message(
        "compare",
        &[
            &two[..],
            &[
                "--model",
                "poisson",
                "--aql",
                "0.01",
                "--rql",
                "0.06",
                "plans/tpw-seal-visual.yaml",
            ],
        ]
        .concat(),
        &["nonconformities per unit (Poisson model)", "different axes"],
    );
    refused_message(
        "compare",
        &["plans/tpw-cover-thickness.yaml", "--stage", "80:2:3"],
        &["is a variables plan", "evaluate it with lotsman evaluate"],
    );
    refused_message(
        "compare",
        &[
            "plans/tpw-seal-visual.yaml",
            "plans/tpw-cover-fit.yaml",
            "--model",
            "binomial",
        ],
        &["--model and --lot-size describe the plans typed with --stage"],
    );
    refused_message(
        "compare",
        &[
            &two[..],
            &["--aql", "1%", "--rql", "6%", "--output", "c.png"],
        ]
        .concat(),
        &["name the file chart.pdf or chart.svg"],
    );
    refused_message(
        "compare",
        &[
            "--stage", "125:3", "--stage", "80:2:3", "--aql", "1%", "--rql", "6%",
        ],
        &["N:AC:RE"],
    );
    // As evaluate refuses it, in the same words: a sample larger than the lot.
    let said = refused_message(
        "compare",
        &[
            &two[..],
            &["--lot-size", "100", "--aql", "1%", "--rql", "6%"],
        ]
        .concat(),
        &["exceeds the lot size 100"],
    );
    let evaluate = refused_message(
        "evaluate",
        &["--n", "125", "--c", "3", "--lot-size", "100"],
        &[],
    );
    assert_eq!(said, evaluate);
}

#[test]
fn the_svg_page_holds_three_charts_and_every_plans_label() {
    let dir = tempfile::tempdir().unwrap();
    let page = dir.path().join("compared.svg");
    let page_arg = page.to_str().unwrap();
    let args = [
        "compare",
        "plans/tpw-impeller-porosity.yaml",
        "--stage",
        "50:0:3+100:3:4",
        "--stage",
        "80:1:2",
        "--output",
        page_arg,
    ];
    lotsman().args(args).assert().success();
    let text = std::fs::read_to_string(&page).unwrap();
    let doc = roxmltree::Document::parse(&text).unwrap();
    let texts: Vec<&str> = doc
        .descendants()
        .filter(|n| n.is_element())
        .filter_map(|n| n.text())
        .collect();
    for title in [
        "Operating characteristic (OC)",
        "Average outgoing quality (AOQ)",
        "Average sample number (ASN)",
    ] {
        assert_eq!(texts.iter().filter(|t| **t == title).count(), 1, "{title}");
    }
    for label in [
        "plans/tpw-impeller-porosity.yaml",
        "50:0:3+100:3:4",
        "80:1:2",
    ] {
        // In each chart's legend and in the table.
        let shown = texts.iter().filter(|t| **t == label).count();
        assert_eq!(shown, 4, "{label} shown {shown} times");
    }
    // A second run does not replace the page without --force.
    lotsman().args(args).assert().code(2);
    lotsman().args(args).arg("--force").assert().success();
}

#[test]
fn the_pdf_page_is_one_a4_landscape_page_with_the_plans_and_their_units() {
    let dir = tempfile::tempdir().unwrap();
    let page = dir.path().join("housings.pdf");
    lotsman()
        .args([
            "compare",
            "plans/tpw-housing-finish.yaml",
            "--stage",
            "20:1:2",
            "--model",
            "poisson",
            "--output",
            page.to_str().unwrap(),
        ])
        .assert()
        .success();
    let pdf = std::fs::read(&page).unwrap();
    let sizes = crate::common::pdf::page_sizes(&pdf);
    assert_eq!(sizes.len(), 1);
    // A4 turned: 297 x 210 mm.
    let (w, h) = sizes[0];
    assert!((w - 297.0 / 25.4 * 72.0).abs() < 0.5 && (h - 210.0 / 25.4 * 72.0).abs() < 0.5);
    let text = crate::common::pdf::pdf_text(&pdf);
    for needle in [
        "plans/tpw-housing-finish.yaml",
        "20:1:2",
        "AOQL per unit (per 100)",
        "Lot quality (nonconformities per unit)",
        "poisson model, no lot size",
    ] {
        assert!(text.contains(needle), "{needle} not in the page");
    }
}

#[test]
fn a_recorded_plan_the_audit_does_not_confirm_is_refused_or_compared_as_recorded() {
    let dir = tempfile::tempdir().unwrap();
    let source = dir.path().join("seal-visual.yaml");
    let text = std::fs::read_to_string("plans/tpw-seal-visual.yaml").unwrap();
    assert!(text.contains("  - n: 166\n"));
    std::fs::write(&source, text.replace("  - n: 166\n", "  - n: 150\n")).unwrap();
    let path = source.to_str().unwrap();
    refused_message(
        "compare",
        &[path, "--stage", "80:2:3"],
        &[
            "stage 1 n: recorded 150, re-solved 166",
            "--accept-recorded",
        ],
    );
    let compared = json_of(&[
        "compare",
        path,
        "--stage",
        "80:2:3",
        "--accept-recorded",
        "--format",
        "json",
    ]);
    let first = &compared["plans"][0];
    assert_eq!(first["n"], 150);
    let note = first["note"].as_str().unwrap();
    assert!(
        note.starts_with("compared as recorded (--accept-recorded): "),
        "{note}"
    );
}

#[test]
fn six_plans_fit_one_page_and_a_seventh_is_refused_before_any_work() {
    let dir = tempfile::tempdir().unwrap();
    let page = dir.path().join("six.svg");
    let mut args = vec!["compare"];
    for plan in [
        "125:3:4",
        "80:2:3",
        "50:0:3+100:3:4",
        "200:5:6",
        "32:0:1",
        "315:7:8",
    ] {
        args.extend(["--stage", plan]);
    }
    args.extend([
        "--aql",
        "1%",
        "--rql",
        "6%",
        "--output",
        page.to_str().unwrap(),
    ]);
    lotsman().args(&args).assert().success();
    let svg = std::fs::read_to_string(&page).unwrap();
    assert!(svg.contains(">315:7:8<"));
    args.truncate(13);
    args.extend(["--stage", "20:0:1", "--aql", "1%", "--rql", "6%"]);
    refused_message("compare", &args[1..], &["7 plans were given"]);
}
