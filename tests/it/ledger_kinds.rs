//! Every plan kind `lotsman new` gives, kept in a ledger from the command
//! line (issue 17): the template solved with `design --in-place`, lots
//! recorded with `judge --record` (accepted, rejected, decided at a later
//! stage, and given as one cumulative count with `--inspected`), a lot not
//! decided yet left out, then `verify`, `status`, `history` and `draw` on
//! it. Standard-indexed sources have their own files (ledger_*.rs).
//!
//! The plans the templates solve to (as `design` prints them): binomial
//! n = 110, c = 3; hypergeometric (N = 500) n = 63, c = 2; Poisson n = 36,
//! c = 2; double 42 (Ac 0, Re 3) then 131 in all (Ac 3, Re 4); multiple
//! five stages of 42, Ac 0 1 2 3 4, Re 3 4 5 5 5; sequential lines
//! d <= 0.0281 n - 1.2211 and d >= 0.0281 n + 1.5678, truncated at item
//! 140 with Ac 3; rectifying (N = 5000) n = 766, c = 4.

use std::path::Path;

use serde_json::Value;

use crate::common::{lotsman, stdout_of};

/// One plan kind and what its ledger is given and shows.
struct Kind {
    /// The template (`lotsman new TEMPLATE`).
    template: &'static str,
    /// The lots recorded, L1, L2, ... in order: judge's count flags and
    /// the decision they give.
    lots: &'static [(&'static [&'static str], &'static str)],
    /// Count flags of lots not decided yet, which are not recorded.
    undecided: &'static [&'static [&'static str]],
    /// The process average: count and units of the first samples, and the
    /// estimate with its two-sided 95% interval (see `KINDS`).
    average: (u64, u64, f64, f64, f64),
    /// Lots recorded with one cumulative count past the first stage,
    /// which the process average cannot read.
    unread: u64,
    /// Words each of status's warnings holds, in order.
    warnings: &'static [&'static str],
    /// `draw`'s lot size and sample (the first stage's units).
    draw: (u64, u64),
}

const AQL: &str = "is above the AQL";
const RQL: &str = "may reach the RQL";
const DESIGN_AVERAGE: &str = "is above the one the plan was designed for";

/// The intervals: scipy 1.x, `beta.ppf(0.025, k, n - k + 1)` and
/// `beta.ppf(0.975, k + 1, n - k)` (Clopper–Pearson); for the Poisson
/// plan `chi2.ppf(0.025, 2k) / 2n` and `chi2.ppf(0.975, 2k + 2) / 2n`
/// (Garwood). First samples by hand: a double or multiple lot counts its
/// first stage's count in 42 units; a sequential lot its whole sample.
const KINDS: &[Kind] = &[
    Kind {
        template: "binomial",
        lots: &[
            (&["--found", "1"], "accept"),
            (&["--found", "5"], "reject"),
            (&["--found", "0"], "accept"),
        ],
        undecided: &[],
        // 1 + 5 + 0 in 3 x 110.
        average: (
            6,
            330,
            0.01818181818181818,
            0.006700909510876468,
            0.03915213920113869,
        ),
        unread: 0,
        warnings: &[],
        draw: (1000, 110),
    },
    Kind {
        template: "hypergeometric",
        lots: &[(&["--found", "2"], "accept"), (&["--found", "3"], "reject")],
        undecided: &[],
        average: (
            5,
            126,
            0.03968253968253968,
            0.013008364496261263,
            0.09017638056799737,
        ),
        unread: 0,
        warnings: &[AQL, RQL],
        draw: (500, 63),
    },
    Kind {
        template: "poisson",
        lots: &[(&["--found", "1"], "accept"), (&["--found", "4"], "reject")],
        undecided: &[],
        // Nonconformities per unit: 5 in 72 units.
        average: (
            5,
            72,
            0.06944444444444445,
            0.022548422084978065,
            0.16206016776837043,
        ),
        unread: 0,
        warnings: &[AQL, RQL],
        draw: (1000, 36),
    },
    Kind {
        template: "double",
        lots: &[
            (&["--found", "0"], "accept"),
            (&["--found", "1", "--found", "3"], "reject"),
            (&["--found", "2", "--found", "0"], "accept"),
            (&["--found", "3"], "reject"),
            (&["--inspected", "131", "--found", "2"], "accept"),
        ],
        undecided: &[&["--found", "1"], &["--inspected", "42", "--found", "2"]],
        // 0 + 1 + 2 + 3 in 4 x 42; the cumulative lot is unread.
        average: (
            6,
            168,
            0.03571428571428571,
            0.01321730239128333,
            0.07611127125490692,
        ),
        unread: 1,
        warnings: &[AQL, RQL],
        draw: (1000, 42),
    },
    Kind {
        template: "multiple",
        lots: &[
            (&["--found", "0"], "accept"),
            (&["--found", "1", "--found", "0"], "accept"),
            (&["--found", "2", "--found", "2"], "reject"),
            (&["--inspected", "84", "--found", "1"], "accept"),
        ],
        undecided: &[&["--found", "1"], &["--inspected", "84", "--found", "2"]],
        // 0 + 1 + 2 in 3 x 42.
        average: (
            3,
            126,
            0.023809523809523808,
            0.004937270320116031,
            0.06800486434194064,
        ),
        unread: 1,
        warnings: &[RQL],
        draw: (1000, 42),
    },
    Kind {
        template: "sequential",
        lots: &[
            // At item 100 the acceptance number is 1; at item 20 the
            // rejection number 3; at item 2 it is 2.
            (&["--inspected", "100", "--found", "1"], "accept"),
            (&["--inspected", "20", "--found", "3"], "reject"),
            (&["--found", "1", "--found", "1"], "reject"),
        ],
        undecided: &[&["--found", "0"], &["--inspected", "20", "--found", "1"]],
        // 1 + 3 + 2 in 100 + 20 + 2.
        average: (
            6,
            122,
            0.04918032786885246,
            0.018259603490754492,
            0.10397261607773431,
        ),
        unread: 0,
        warnings: &[AQL, RQL],
        draw: (1000, 140),
    },
    Kind {
        template: "rectifying",
        lots: &[(&["--found", "4"], "accept"), (&["--found", "5"], "reject")],
        undecided: &[],
        average: (
            9,
            1532,
            0.00587467362924282,
            0.0026896887166276175,
            0.011122546488361295,
        ),
        unread: 0,
        // Designed for 0.25% (process_average) with LTPD 1%.
        warnings: &[DESIGN_AVERAGE, RQL],
        draw: (5000, 766),
    },
];

/// Runs `lotsman args` in `dir`: exit code, stdout, stderr.
fn run(dir: &Path, args: &[&str]) -> (i32, String, String) {
    let out = lotsman().current_dir(dir).args(args).output().unwrap();
    (
        out.status.code().unwrap(),
        String::from_utf8(out.stdout).unwrap(),
        String::from_utf8(out.stderr).unwrap(),
    )
}

/// Runs `lotsman args` in `dir`, which must succeed, and reads its JSON.
fn json(dir: &Path, args: &[&str]) -> Value {
    let (code, out, err) = run(dir, args);
    assert_eq!(code, 0, "{args:?}: {err}");
    serde_json::from_str(&out).unwrap()
}

/// `judge p.yaml --record log.csv` of lot `lot` on 2024-03-1`day`: the
/// decision and what judge says of the record.
fn judge(dir: &Path, lot: &str, day: usize, counts: &[&str]) -> (String, String) {
    let date = format!("2024-03-1{day}");
    let mut args = vec!["judge", "p.yaml", "--record", "log.csv", "--lot", lot];
    args.extend(["--date", &date, "--format", "json"]);
    args.extend(counts);
    let (code, out, err) = run(dir, &args);
    assert_eq!(code, 0, "{args:?}: {err}");
    let report: Value = serde_json::from_str(&out).unwrap();
    (report["decision"].as_str().unwrap().to_string(), err)
}

/// The ledger's lines.
fn ledger_lines(dir: &Path) -> usize {
    std::fs::read_to_string(dir.join("log.csv"))
        .unwrap()
        .lines()
        .count()
}

/// The rows of a CSV text as maps from its header's names.
fn csv_rows(text: &str) -> Vec<std::collections::HashMap<String, String>> {
    let mut reader = csv::Reader::from_reader(text.as_bytes());
    let header = reader.headers().unwrap().clone();
    reader
        .records()
        .map(|r| {
            let r = r.unwrap();
            header
                .iter()
                .map(str::to_string)
                .zip(r.iter().map(str::to_string))
                .collect()
        })
        .collect()
}

/// Writes the ledger again with one more nonconforming unit in the first
/// stage of the lot of `seq` 2 (the `found` cell, found by its header).
fn edit_second_count(dir: &Path) {
    let path = dir.join("log.csv");
    let text = std::fs::read_to_string(&path).unwrap();
    let mut reader = csv::Reader::from_reader(text.as_bytes());
    let header = reader.headers().unwrap().clone();
    let column = header.iter().position(|h| h == "found").unwrap();
    let mut writer = csv::Writer::from_writer(Vec::new());
    writer.write_record(&header).unwrap();
    for (i, record) in reader.records().enumerate() {
        let mut cells: Vec<String> = record.unwrap().iter().map(str::to_string).collect();
        if i == 1 {
            let (first, rest) = cells[column]
                .split_once(',')
                .map_or((cells[column].as_str(), ""), |(a, b)| (a, b));
            let more = first.parse::<u64>().unwrap() + 1;
            cells[column] = if rest.is_empty() {
                more.to_string()
            } else {
                format!("{more},{rest}")
            };
        }
        writer.write_record(&cells).unwrap();
    }
    std::fs::write(&path, writer.into_inner().unwrap()).unwrap();
}

/// The whole round for the kind of `template`, in a fresh folder.
fn round(template: &str) {
    let kind = KINDS.iter().find(|k| k.template == template).unwrap();
    let dir = tempfile::tempdir().unwrap();
    let dir = dir.path();
    let name = kind.template;
    std::fs::write(dir.join("p.yaml"), stdout_of(&["new", name])).unwrap();
    let (code, _, err) = run(dir, &["design", "p.yaml", "--in-place"]);
    assert_eq!(code, 0, "{name}: {err}");

    // 1-2. The lots, each appended; an undecided one is not.
    for (i, (counts, decision)) in kind.lots.iter().enumerate() {
        let (got, err) = judge(dir, &format!("L{}", i + 1), i + 1, counts);
        assert_eq!(&got, decision, "{name} L{}: {counts:?}", i + 1);
        assert!(
            err.contains(&format!("recorded as seq {} in log.csv", i + 1)),
            "{name}: {err}"
        );
    }
    let lines = ledger_lines(dir);
    assert_eq!(lines, kind.lots.len() + 1, "{name}");
    for counts in kind.undecided {
        let (got, err) = judge(dir, "U1", 9, counts);
        assert_eq!(got, "continue", "{name}: {counts:?}");
        let again = if counts.contains(&"--inspected") {
            "with the units inspected in all and the cumulative count (--inspected N --found K)"
        } else {
            "with every stage's count"
        };
        assert!(err.contains("not recorded in log.csv"), "{name}: {err}");
        assert!(err.contains(again), "{name}: {err}");
        assert_eq!(ledger_lines(dir), lines, "{name}: {counts:?}");
    }

    // 4. The status: no switching rules, and the process average.
    let status = json(
        dir,
        &["status", "log.csv", "--plan", "p.yaml", "--format", "json"],
    );
    assert_eq!(status["lots"], kind.lots.len(), "{name}");
    assert_eq!(status["severity"], Value::Null, "{name}");
    assert_eq!(status["counters"], serde_json::json!([]), "{name}");
    assert_eq!(status["next_plan"]["severity"], Value::Null, "{name}");
    let pa = &status["process_average"];
    let (found, units, estimate, lower, upper) = kind.average;
    assert_eq!(pa["found"], found, "{name}");
    assert_eq!(pa["inspected"], units, "{name}");
    for (key, want) in [("estimate", estimate), ("lower", lower), ("upper", upper)] {
        approx::assert_relative_eq!(pa[key].as_f64().unwrap(), want, max_relative = 1e-9);
    }
    assert_eq!(status["unread_left_out"], kind.unread, "{name}");
    let warnings = status["warnings"].as_array().unwrap();
    assert_eq!(warnings.len(), kind.warnings.len(), "{name}: {warnings:?}");
    for (w, words) in warnings.iter().zip(kind.warnings) {
        assert!(w.as_str().unwrap().contains(words), "{name}: {w}");
    }
    let (code, table, err) = run(dir, &["status", "log.csv", "--plan", "p.yaml"]);
    assert_eq!(code, 0, "{name}: {err}");
    assert!(
        table.contains("Next lot: the recorded plan,") && table.contains("(no switching rules)"),
        "{name}: {table}"
    );

    // 5. The history: one row per lot, and its chart.
    let (code, text, err) = run(
        dir,
        &[
            "history",
            "log.csv",
            "--plan",
            "p.yaml",
            "--format",
            "csv",
            "--output",
            "chart.svg",
        ],
    );
    assert_eq!(code, 0, "{name}: {err}");
    let rows = csv_rows(&text);
    let lots: Vec<&str> = rows.iter().map(|r| r["lot"].as_str()).collect();
    let want: Vec<String> = (1..=kind.lots.len()).map(|i| format!("L{i}")).collect();
    assert_eq!(lots, want, "{name}");
    for (row, (_, decision)) in rows.iter().zip(kind.lots) {
        assert_eq!(row["decision"], *decision, "{name}");
    }
    let chart = std::fs::read_to_string(dir.join("chart.svg")).unwrap();
    assert!(chart.contains("<svg"), "{name}");

    // 6. The draw, seeded by the plan source the ledger names.
    let (lot_size, n) = kind.draw;
    let draw = json(
        dir,
        &[
            "draw",
            "--lot",
            "L1",
            "--lot-size",
            &lot_size.to_string(),
            "--n",
            &n.to_string(),
            "--plan",
            "p.yaml",
            "--format",
            "json",
        ],
    );
    assert_eq!(draw["plan_sha256"], status["plan_sha256"], "{name}");
    let positions = draw["positions"].as_array().unwrap();
    assert_eq!(positions.len() as u64, n, "{name}");
    assert!(
        positions
            .iter()
            .all(|p| (1..=lot_size).contains(&p.as_u64().unwrap()))
    );

    // 3. The chain holds, and an edited count breaks it at its row.
    let verify = ["verify", "log.csv", "--plan", "p.yaml"];
    let (code, out, _) = run(dir, &verify);
    assert_eq!(
        (code, out.contains("the chain holds")),
        (0, true),
        "{name}: {out}"
    );
    edit_second_count(dir);
    let (code, out, _) = run(dir, &verify);
    assert_eq!(code, 1, "{name}: {out}");
    assert!(out.contains("line 3 (seq 2), hash:"), "{name}: {out}");
}

#[test]
fn binomial_single_plan() {
    round("binomial");
}

#[test]
fn hypergeometric_single_plan() {
    round("hypergeometric");
}

#[test]
fn poisson_single_plan() {
    round("poisson");
}

#[test]
fn double_plan() {
    round("double");
}

#[test]
fn multiple_plan() {
    round("multiple");
}

#[test]
fn sequential_plan() {
    round("sequential");
}

#[test]
fn rectifying_plan() {
    round("rectifying");
}

/// A ledger of one multiple-plan lot given as one cumulative count: its
/// first sample is not shown, and history and verify say so in words
/// ("1 lot", no centre, the lot left off the chart), as status does.
#[test]
fn a_lot_without_its_first_sample_is_explained() {
    let dir = tempfile::tempdir().unwrap();
    let dir = dir.path();
    std::fs::write(dir.join("p.yaml"), stdout_of(&["new", "multiple"])).unwrap();
    run(dir, &["design", "p.yaml", "--in-place"]);
    judge(dir, "L1", 1, &["--inspected", "84", "--found", "1"]);
    let (_, history, _) = run(dir, &["history", "log.csv", "--plan", "p.yaml"]);
    for words in [
        "log.csv: 1 lot, p-chart of first samples, no first sample counted yet\n",
        "(judge --inspected) shows no first sample: the chart leaves it out",
    ] {
        assert!(history.contains(words), "{history}");
    }
    let (code, verify, _) = run(dir, &["verify", "log.csv", "--plan", "p.yaml"]);
    assert_eq!(code, 0);
    assert!(
        verify.starts_with("log.csv: 1 lot, the chain holds"),
        "{verify}"
    );
}

/// Issue 17: the draw is reproducible from its recorded seed. A lot judged
/// with --seed-from-lot keeps the seed `draw --plan` used, and `draw
/// --seed` with that cell draws the same units; --seed keeps a given one.
#[test]
fn the_recorded_seed_draws_the_same_units() {
    let dir = tempfile::tempdir().unwrap();
    let dir = dir.path();
    std::fs::write(dir.join("p.yaml"), stdout_of(&["new", "binomial"])).unwrap();
    run(dir, &["design", "p.yaml", "--in-place"]);
    let (_, said) = judge(dir, "L1", 1, &["--found", "0", "--seed-from-lot"]);
    // The template's id is still a placeholder: the ledger keeps it, and
    // judge says so.
    assert!(
        said.contains("the id still holds the template's placeholder <document number>"),
        "{said}"
    );
    judge(dir, "L2", 2, &["--found", "0", "--seed", "987654321"]);
    let rows = csv_rows(&std::fs::read_to_string(dir.join("log.csv")).unwrap());
    let by_plan = json(
        dir,
        &[
            "draw",
            "--lot",
            "L1",
            "--lot-size",
            "1000",
            "--n",
            "50",
            "--plan",
            "p.yaml",
            "--format",
            "json",
        ],
    );
    let seed = rows[0]["seed"].as_str();
    assert_eq!(seed, by_plan["seed"].to_string());
    let again = json(
        dir,
        &[
            "draw",
            "--lot",
            "L1",
            "--lot-size",
            "1000",
            "--n",
            "50",
            "--seed",
            seed,
            "--format",
            "json",
        ],
    );
    assert_eq!(again["positions"], by_plan["positions"]);
    assert_eq!(rows[1]["seed"], "987654321");
    assert_eq!(run(dir, &["verify", "log.csv", "--plan", "p.yaml"]).0, 0);
}
