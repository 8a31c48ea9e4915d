//! The `standard` command's contract (issue 16): flags, JSON keys, CSV
//! columns, exit codes and messages. Plans are MIL-STD-105E's (the spot
//! values of tests/it/standard.rs); probabilities are checked against
//! scipy.stats, named beside each value.

use crate::common;
use common::{lotsman, refused_message};

use serde_json::Value;

/// The JSON of `standard` with `args`.
fn json_of(args: &[&str]) -> Value {
    common::json_of(&[&["standard"], args, &["--format", "json"]].concat())
}

/// Exit 2 with a one-line message on stderr that contains every `needle`.
fn refused(args: &[&str], needles: &[&str]) {
    let text = refused_message("standard", args, needles);
    assert_eq!(text.lines().count(), 1, "{text}");
}

/// `(n, accept, reject)` of each stage of `stages`.
fn stages(stages: &Value) -> Vec<(u64, Option<u64>, u64)> {
    stages
        .as_array()
        .unwrap()
        .iter()
        .map(|s| {
            (
                s["n"].as_u64().unwrap(),
                s["accept"].as_u64(),
                s["reject"].as_u64().unwrap(),
            )
        })
        .collect()
}

/// The plan of `severity` among a class's plans.
fn plan_at<'a>(class: &'a Value, severity: &str) -> &'a Value {
    class["plans"]
        .as_array()
        .unwrap()
        .iter()
        .find(|p| p["severity"] == severity)
        .unwrap()
}

/// The point at `quality`.
fn point_at(v: &Value, quality: f64) -> &Value {
    v["points"]
        .as_array()
        .unwrap()
        .iter()
        .find(|p| (p["quality"].as_f64().unwrap() - quality).abs() < 1e-12)
        .unwrap()
}

#[test]
fn the_issue_example_lot_1500_level_ii_aql_1() {
    // Issue 16: letter K, n = 125; normal Ac 3 Re 4, tightened Ac 2 Re 3,
    // double 80/80 with Ac 1, 4 and Re 4, 5 (MIL-STD-105E Tables I,
    // II-A, II-B, III-A).
    let v = json_of(&["--lot-size", "1500", "--level", "II", "--aql", "1.0"]);
    assert_eq!(v["code_letter"], "K");
    assert_eq!(v["plan_letter"], "K");
    assert_eq!(v["severity"], "normal");
    assert_eq!(v["sample_size"], 125);
    assert_eq!(stages(&v["stages"]), [(125, Some(3), 4)]);
    let class = &v["classes"][0];
    assert_eq!(
        stages(&plan_at(class, "tightened")["stages"]),
        [(125, Some(2), 3)]
    );
    let double = json_of(&[
        "--lot-size",
        "1500",
        "--level",
        "II",
        "--aql",
        "1.0",
        "--scheme",
        "double",
    ]);
    assert_eq!(
        stages(&double["stages"]),
        [(80, Some(1), 4), (160, Some(4), 5)]
    );
}

#[test]
fn points_give_pa_at_each_severity() {
    let v = json_of(&[
        "--lot-size",
        "1500",
        "--level",
        "II",
        "--aql",
        "1.0",
        "--at",
        "1%",
    ]);
    let p = point_at(&v, 0.01);
    // scipy.stats.binom.cdf(3, 125, 0.01) = 0.9625509378366359
    assert!((p["pa_normal"].as_f64().unwrap() - 0.962_550_937_836_635_9).abs() < 1e-12);
    // scipy.stats.binom.cdf(2, 125, 0.01) = 0.8693158680719985
    assert!((p["pa_tightened"].as_f64().unwrap() - 0.869_315_868_071_998_5).abs() < 1e-12);
    // Reduced K at 1.0: n = 50, Ac 1 Re 4 (Table II-C, from memory); a count
    // below Re accepts the lot (105E 4.10.1.4):
    // scipy.stats.binom.cdf(3, 50, 0.01) = 0.9984038269092671
    assert!((p["pa_reduced"].as_f64().unwrap() - 0.998_403_826_909_267_1).abs() < 1e-12);
    let without = json_of(&[
        "--lot-size",
        "1500",
        "--level",
        "II",
        "--aql",
        "1.0",
        "--at",
        "1%",
        "--no-reduced",
    ]);
    assert!(point_at(&without, 0.01)["pa_reduced"].is_null());
    // Without reduced inspection the scheme alternates normal and tightened
    // spells (the closed form derived in tests/it/switching_chain.rs):
    // m_N = (2 - a^4) / (rho (1 - a^4)), E_T = (1 - b^5) / ((1 - b) b^5),
    // scheme Pa = (m_N a + E_T b) / (m_N + E_T), with a and b from scipy
    // above: 0.9593069329401029 (python3 with scipy.stats.binom).
    let scheme = point_at(&without, 0.01)["scheme_pa"].as_f64().unwrap();
    assert!((scheme - 0.959_306_932_940_102_9).abs() < 1e-12, "{scheme}");
    let plans = without["classes"][0]["plans"].as_array().unwrap();
    assert_eq!(plans.len(), 2, "no reduced plan with --no-reduced");
}

#[test]
fn true_risks_and_the_two_point_design() {
    let v = json_of(&[
        "--lot-size",
        "1500",
        "--level",
        "II",
        "--aql",
        "1.0",
        "--rql",
        "5%",
    ]);
    let t = &v["true_risks"];
    // 1 - scipy.stats.binom.cdf(3, 125, 0.01) = 0.0374490621633641
    assert!((t["producer_risk"].as_f64().unwrap() - 0.037_449_062_163_364_1).abs() < 1e-12);
    let c = &t["consumer"];
    // scipy.stats.binom.cdf(3, 125, 0.05) = 0.12378469778322654, above beta 0.10
    assert!((c["consumer_risk"].as_f64().unwrap() - 0.123_784_697_783_226_54).abs() < 1e-12);
    assert_eq!(c["meets_beta"], false);
    assert_eq!(c["table_n"], 125);
    // The two-point design for (1%, 0.05) and (5%, 0.10): n = 132, c = 3
    // (tests/it/standard_risks.rs, checked there in scipy).
    assert_eq!(c["design"]["n"], 132);
    for key in ["quality_at_pa_95", "quality_at_pa_50", "quality_at_pa_10"] {
        assert!(t[key].as_f64().unwrap() > 0.0, "{key}");
    }
}

#[test]
fn a_sample_reaching_the_lot_means_every_unit() {
    // Lot 20, level II: letter C; AQL 0.065 points down to L (n = 200),
    // more than the lot: the standard's rule is 100% inspection.
    let v = json_of(&["--lot-size", "20", "--level", "II", "--aql", "0.065"]);
    assert_eq!(v["code_letter"], "C");
    assert_eq!(v["inspect_all"], true);
    assert_eq!(v["sample_size"], 20);
    assert!(v["stages"].as_array().unwrap().is_empty());
    assert!(v["true_risks"].is_null());
}

#[test]
fn several_classes_on_one_sample() {
    let v = json_of(&[
        "--lot-size",
        "1500",
        "--level",
        "II",
        "--aql",
        "critical=0.065",
        "--aql",
        "major=1.0",
        "--aql",
        "minor=4.0",
    ]);
    let classes = v["classes"].as_array().unwrap();
    let names: Vec<&str> = classes
        .iter()
        .map(|c| c["class"].as_str().unwrap())
        .collect();
    assert_eq!(names, ["critical", "major", "minor"]);
    // Critical's arrow leads to L (n = 200, Ac 0 Re 1); major K Ac 3 Re 4;
    // minor K at 4.0 Ac 10 Re 11 (Table II-A).
    assert_eq!(stages(&classes[0]["stages"]), [(200, Some(0), 1)]);
    assert_eq!(stages(&classes[1]["stages"]), [(125, Some(3), 4)]);
    assert_eq!(stages(&classes[2]["stages"]), [(125, Some(10), 11)]);
    assert_eq!(v["sample_size"], 200);
}

#[test]
fn every_level_severity_and_scheme_answers() {
    for level in ["I", "II", "III", "S-1", "S-2", "S-3", "S-4"] {
        for severity in ["normal", "tightened", "reduced"] {
            for scheme in ["single", "double", "multiple"] {
                let mut args = vec![
                    "--lot-size",
                    "5000",
                    "--level",
                    level,
                    "--aql",
                    "1.0",
                    "--severity",
                    severity,
                    "--scheme",
                    scheme,
                ];
                // Table IV-C (multiple, reduced) is not transcribed: reduced
                // inspection is left out of multiple sampling here.
                if scheme == "multiple" {
                    if severity == "reduced" {
                        continue;
                    }
                    args.push("--no-reduced");
                }
                let v = json_of(&args);
                assert_eq!(v["severity"], severity, "{args:?}");
                assert!(v["sample_size"].as_u64().unwrap() > 0, "{args:?}");
            }
        }
    }
}

#[test]
fn csv_has_one_row_per_class_and_quality() {
    let out = lotsman()
        .args([
            "standard",
            "--lot-size",
            "1500",
            "--level",
            "II",
            "--aql",
            "major=1.0",
            "--aql",
            "minor=4.0",
            "--at",
            "1%,2%",
            "--format",
            "csv",
        ])
        .assert()
        .success()
        .get_output()
        .stdout
        .clone();
    let text = String::from_utf8(out).unwrap();
    let lines: Vec<&str> = text.lines().collect();
    assert_eq!(
        lines[0],
        "class,aql,code_letter,plan_letter,severity,n,quality,pa_normal,pa_tightened,pa_reduced,scheme_pa"
    );
    assert_eq!(lines.len(), 5);
    assert!(
        lines[1].starts_with("major,1.0,K,K,normal,125,0.01,"),
        "{}",
        lines[1]
    );
}

#[test]
fn refusals_say_what_and_how_to_fix() {
    let base = ["--lot-size", "1500", "--level", "II"];
    let with = |extra: &[&'static str]| [&base[..], extra].concat();
    refused(
        &with(&["--aql", "1.1"]),
        &["AQL '1.1' is not one of the standard's values"],
    );
    refused(
        &["--lot-size", "1500", "--level", "IV", "--aql", "1.0"],
        &["inspection level 'IV'"],
    );
    refused(
        &with(&["--aql", "25", "--model", "binomial"]),
        &["nonconformities per 100 units only", "poisson"],
    );
    refused(
        &with(&["--aql", "1.0", "--scheme", "multiple"]),
        &["Table IV-C", "--no-reduced", "--table SEVERITY=FILE.csv"],
    );
    refused(
        &with(&["--aql", "1.0", "--severity", "reduced", "--no-reduced"]),
        &["drop --no-reduced"],
    );
    refused(
        &with(&["--aql", "1.0", "--table", "absent.csv"]),
        &["absent.csv"],
    );
}
