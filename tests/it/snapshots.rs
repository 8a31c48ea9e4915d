//! What the main commands print, pinned as insta snapshots
//! (tests/it/snapshots/): the terminal tables, the CSV and the YAML of a
//! solved source. A change of layout or wording shows as a reviewable
//! diff: run the suite, then `cargo insta review` (or set
//! `INSTA_UPDATE=always` and read the diff of the .snap files) and commit
//! the snapshots with the change that made them. The numbers themselves
//! are checked against references elsewhere; these tests pin how they are
//! shown.
//!
//! Every command runs from the repository root, so the demo plans are
//! named `plans/...` as in the docs.

use crate::common::lotsman;

/// What `lotsman ARGS` prints on stdout, after checking its exit code.
fn printed(args: &[&str], code: i32) -> String {
    let out = lotsman()
        .args(args)
        .assert()
        .code(code)
        .get_output()
        .clone();
    String::from_utf8(out.stdout).unwrap()
}

/// Pins what a successful `lotsman ARGS` prints, under `name`, with the
/// command line as the snapshot's description.
fn pin(name: &str, args: &[&str]) {
    pin_with_code(name, args, 0);
}

fn pin_with_code(name: &str, args: &[&str], code: i32) {
    let output = printed(args, code);
    insta::with_settings!({
        description => format!("lotsman {}", args.join(" ")),
        omit_expression => true,
    }, {
        insta::assert_snapshot!(name, output);
    });
}

#[test]
fn design_single_table() {
    pin(
        "design_single",
        &[
            "design",
            "--aql",
            "1%",
            "--rql",
            "6%",
            "--lot-size",
            "2000",
            "--title",
            "Example",
        ],
    );
}

#[test]
fn design_double_table() {
    pin(
        "design_double",
        &["design", "--aql", "1%", "--rql", "6%", "--scheme", "double"],
    );
}

#[test]
fn design_multiple_table() {
    pin(
        "design_multiple",
        &[
            "design",
            "--aql",
            "1%",
            "--rql",
            "6%",
            "--scheme",
            "multiple",
            "--stage-count",
            "4",
        ],
    );
}

#[test]
fn design_sequential_table() {
    pin(
        "design_sequential",
        &[
            "design",
            "--aql",
            "1%",
            "--rql",
            "6%",
            "--scheme",
            "sequential",
        ],
    );
}

#[test]
fn design_variables_table() {
    pin(
        "design_variables",
        &[
            "design",
            "--scheme",
            "variables",
            "--sigma",
            "unknown",
            "--limit",
            "lower",
            "--lower",
            "5.8",
            "--aql",
            "1%",
            "--rql",
            "6%",
            "--lot-size",
            "600",
        ],
    );
}

#[test]
fn a_solved_source_as_yaml() {
    pin(
        "design_yaml",
        &[
            "design",
            "--aql",
            "1%",
            "--rql",
            "5%",
            "--lot-size",
            "2500",
            "--format",
            "yaml",
        ],
    );
}

const EVALUATE: &[&str] = &[
    "evaluate",
    "--n",
    "125",
    "--c",
    "3",
    "--lot-size",
    "2000",
    "--at",
    "0.5%,1%,2%,4%,6%",
];

#[test]
fn evaluate_table() {
    pin("evaluate_table", EVALUATE);
}

#[test]
fn evaluate_csv() {
    pin("evaluate_csv", &[EVALUATE, &["--format", "csv"]].concat());
}

#[test]
fn evaluate_a_staged_source_table() {
    pin(
        "evaluate_double_source",
        &[
            "evaluate",
            "plans/tpw-impeller-porosity.yaml",
            "--at",
            "1%,3%,6%",
        ],
    );
}

#[test]
fn verify_table() {
    pin("verify_list", &["verify", "plans", "--list"]);
}

const TRADEOFF: &[&str] = &[
    "tradeoff",
    "--aql",
    "0.5%:1.5%:5",
    "--rql",
    "3%:7%:5",
    "--lot-size",
    "2500",
    "--cost-per-unit",
    "1.40",
    "--process-average",
    "0.8%",
];

#[test]
fn tradeoff_table() {
    pin("tradeoff_table", TRADEOFF);
}

#[test]
fn tradeoff_csv() {
    pin("tradeoff_csv", &[TRADEOFF, &["--format", "csv"]].concat());
}

const RECTIFY: &[&str] = &[
    "rectify",
    "--lot-size",
    "2500",
    "--process-average",
    "0.8%",
    "--ltpd",
    "5%",
];

#[test]
fn rectify_table() {
    pin("rectify_table", RECTIFY);
}

#[test]
fn rectify_csv() {
    pin("rectify_csv", &[RECTIFY, &["--format", "csv"]].concat());
}

#[test]
fn judge_counts_table() {
    pin(
        "judge_double",
        &[
            "judge",
            "plans/tpw-impeller-porosity.yaml",
            "--found",
            "1",
            "--found",
            "1",
        ],
    );
}

#[test]
fn judge_sequential_table() {
    pin(
        "judge_sequential",
        &[
            "judge",
            "plans/tpw-sleeve-hardness.yaml",
            "--inspected",
            "44",
            "--found",
            "1",
        ],
    );
}

#[test]
fn judge_measurements_table() {
    pin(
        "judge_measurements",
        &[
            "judge",
            "plans/tpw-cover-thickness.yaml",
            "--measurements",
            "plans/tpw-cover-thickness-readings.csv",
            "--column",
            "thickness_mm",
        ],
    );
}

#[test]
fn judge_a_rejected_lot_table() {
    pin(
        "judge_reject",
        &["judge", "plans/tpw-seal-visual.yaml", "--found", "4"],
    );
}
