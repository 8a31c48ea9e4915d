//! The adversarial input suite (issue 7): every command fed bad input, one
//! case per row. A case names the input, the exit code and a fragment of
//! the message that must explain it; a refusal is one line on stderr that
//! names the parameter, its value and the valid range (a batch command
//! reports it on stdout, in its summary). No case may panic, and every case
//! runs under a time limit, so that a hang fails the suite instead of
//! holding it; the cases marked `fast` must finish within a second.
//!
//! The fixtures are written by [`Fixtures::new`] into a temporary folder,
//! each described where it is made; the plan sources in `plans/` serve as
//! the valid sources they are edited from.

mod common;
use common::lotsman;

use std::path::PathBuf;
use std::time::{Duration, Instant};

/// Where a case's message appears.
#[derive(Clone, Copy, Debug, PartialEq)]
enum Out {
    /// One line on stderr (the command's own refusal).
    Err,
    /// The command's report on stdout (batch summaries, accepted input).
    Std,
}

/// One input and what the tool must answer.
struct Case {
    /// The class of input and what is wrong with it.
    name: &'static str,
    /// The arguments; `@name` stands for the fixture `name`.
    args: Vec<&'static str>,
    /// The exit code.
    code: i32,
    /// Where the message appears.
    out: Out,
    /// A fragment of the message (`@name` as in the arguments).
    fragment: &'static str,
    /// Whether the answer must come within a second.
    fast: bool,
}

/// A refusal on stderr with exit code 2.
fn refused(name: &'static str, args: &[&'static str], fragment: &'static str) -> Case {
    Case {
        name,
        args: args.to_vec(),
        code: 2,
        out: Out::Err,
        fragment,
        fast: false,
    }
}

/// A refusal that must come within a second.
fn refused_fast(name: &'static str, args: &[&'static str], fragment: &'static str) -> Case {
    Case {
        fast: true,
        ..refused(name, args, fragment)
    }
}

/// An outcome reported on stdout with exit code `code`.
fn reported(name: &'static str, args: &[&'static str], code: i32, fragment: &'static str) -> Case {
    Case {
        name,
        args: args.to_vec(),
        code,
        out: Out::Std,
        fragment,
        fast: false,
    }
}

/// The temporary folder of generated fixtures.
struct Fixtures {
    dir: tempfile::TempDir,
}

/// A plan source without a recorded plan, binomial, 1% / 6%.
const BASE: &str = "schema: 1
title: Refusal suite
scheme: single
model: binomial
producer:
  quality: 0.01
  risk: 0.05
consumer:
  quality: 0.06
  risk: 0.1
";

/// The billion-laughs chain: nine levels of ten aliases each over a first
/// list of `width` values, `width 10^9` values when expanded, in about
/// `4 width` bytes.
fn laughs(width: usize) -> String {
    let mut parts = vec![format!("&a0 [{}]", vec!["lol"; width].join(", "))];
    for i in 1..10 {
        parts.push(format!(
            "&a{i} [{}]",
            vec![format!("*a{}", i - 1); 10].join(", ")
        ));
    }
    format!("[{}]", parts.join(", "))
}

impl Fixtures {
    fn new() -> Self {
        let fx = Fixtures {
            dir: tempfile::tempdir().unwrap(),
        };
        let edit = |from: &str, to: &str| {
            assert!(BASE.contains(from), "{from}");
            BASE.replacen(from, to, 1)
        };
        let fit = std::fs::read_to_string("plans/tpw-cover-fit.yaml").unwrap();
        let readings = std::fs::read_to_string("plans/tpw-cover-thickness-readings.csv").unwrap();
        // The 42 readings of the demo lot, one per line, without the header.
        let values: Vec<&str> = readings
            .lines()
            .skip(1)
            .map(|l| l.split(',').nth(1).unwrap())
            .collect();
        let column = |rows: &[&str]| format!("{}\n", rows.join("\n"));
        let with = |at: usize, cell: &str| {
            let mut v = values.clone();
            v[at] = cell;
            column(&v)
        };
        let texts: Vec<(&str, String)> = vec![
            // YAML sources.
            (
                "malformed.yaml",
                "schema: 1\ntitle: T\n  scheme: single\n".into(),
            ),
            ("tab.yaml", "schema: 1\n\ttitle: T\n".into()),
            ("empty.yaml", String::new()),
            ("comments.yaml", "# a plan, some day\n\n".into()),
            ("list.yaml", "- schema: 1\n- title: T\n".into()),
            ("scalar.yaml", "just a sentence\n".into()),
            ("unknown-key.yaml", edit("model:", "modell:")),
            (
                "duplicate-key.yaml",
                edit(
                    "title: Refusal suite\n",
                    "title: Refusal suite\ntitle: Other\n",
                ),
            ),
            (
                "duplicate-nested-key.yaml",
                edit("  quality: 0.01\n", "  quality: 0.01\n  quality: 0.02\n"),
            ),
            ("schema-text.yaml", edit("schema: 1", "schema: one")),
            (
                "quality-list.yaml",
                edit("  quality: 0.01", "  quality: [0.01, 0.02]"),
            ),
            (
                "lot-fraction.yaml",
                edit("model: binomial", "model: hypergeometric\nlot_size: 12.5"),
            ),
            (
                "lot-1e19.yaml",
                edit(
                    "model: binomial",
                    "model: hypergeometric\nlot_size: 10000000000000000000",
                ),
            ),
            (
                "lot-1e20.yaml",
                edit(
                    "model: binomial",
                    "model: hypergeometric\nlot_size: 100000000000000000000",
                ),
            ),
            (
                "lot-zero.yaml",
                edit("model: binomial", "model: hypergeometric\nlot_size: 0"),
            ),
            ("schema-2.yaml", edit("schema: 1", "schema: 2")),
            (
                "quality-nan.yaml",
                edit("  quality: 0.01", "  quality: .nan"),
            ),
            (
                "quality-inf.yaml",
                edit("  quality: 0.06", "  quality: .inf"),
            ),
            (
                "quality-tiny.yaml",
                edit("  quality: 0.01", "  quality: 1e-400"),
            ),
            (
                "quality-percent-percent.yaml",
                edit("  quality: 0.01", "  quality: \"1%%\""),
            ),
            (
                "quality-minus-zero.yaml",
                edit("  quality: 0.01", "  quality: -0.0"),
            ),
            (
                "quality-above-one.yaml",
                edit("  quality: 0.06", "  quality: 1.5"),
            ),
            (
                "points-crossed.yaml",
                edit("  quality: 0.06", "  quality: 0.005"),
            ),
            ("risks-sum.yaml", edit("  risk: 0.05", "  risk: 0.95")),
            ("risk-zero.yaml", edit("  risk: 0.1", "  risk: 0")),
            (
                "bad-date.yaml",
                edit("scheme:", "date: 2026-02-30\nscheme:"),
            ),
            (
                "bomb-quality.yaml",
                edit("  quality: 0.01", &format!("  quality: {}", laughs(10))),
            ),
            // 20,000 values at the first level: before the fix this one
            // was buffered and expanded for minutes.
            (
                "bomb-wide.yaml",
                edit("  quality: 0.06", &format!("  quality: {}", laughs(20_000))),
            ),
            (
                "bomb-notes.yaml",
                edit("scheme:", &format!("notes: {}\nscheme:", laughs(10))),
            ),
            (
                "deep.yaml",
                edit(
                    "title: Refusal suite",
                    &format!("title: {}{}", "[".repeat(100_000), "]".repeat(100_000)),
                ),
            ),
            (
                "c-above-n.yaml",
                format!(
                    "{BASE}plan:\n  stages:\n  - n: 5\n    accept: 7\n    reject: 8\n  producer_risk: 0.01\n  consumer_risk: 0.1\n  solved_by: hand\n"
                ),
            ),
            (
                "stages-shrinking.yaml",
                format!(
                    "{BASE}plan:\n  stages:\n  - n: 50\n    accept: 0\n    reject: 3\n  - n: 40\n    accept: 3\n    reject: 4\n  producer_risk: 0.01\n  consumer_risk: 0.1\n  solved_by: hand\n"
                ),
            ),
            ("fit-bom.yaml", format!("\u{feff}{fit}")),
            ("fit-crlf.yaml", fit.replace('\n', "\r\n")),
            // A plan source whose name ends in .pdf: its default sheet is itself.
            ("plan.pdf", fit.clone()),
            ("source.yaml", fit.clone()),
            ("no-plan.yaml", BASE.to_string()),
            // Measurements for the variables plan of tpw-cover-thickness (n = 42).
            (
                "blank-row.csv",
                format!("{}\n\n{}", column(&values[..4]), column(&values[4..])),
            ),
            ("blank-cell.csv", readings.replacen("5,5.846", "5,", 1)),
            ("text.csv", with(4, "n/a")),
            ("comma-decimals.csv", column(&values).replace('.', ",")),
            (
                "semicolons.csv",
                format!(
                    "plate;thickness_mm\n{}",
                    values
                        .iter()
                        .enumerate()
                        .map(|(i, v)| format!("{};{}\n", i + 1, v.replace('.', ",")))
                        .collect::<String>()
                ),
            ),
            ("nan.csv", with(4, "NaN")),
            ("short.csv", column(&values[..41])),
            ("same.csv", column(&["5.9"; 42])),
            ("overflow.csv", {
                let mut v = values.clone();
                v[4] = "1e308";
                v[5] = "-1e308";
                column(&v)
            }),
            ("empty.csv", String::new()),
            ("bom.csv", format!("\u{feff}{readings}")),
            ("crlf.csv", readings.replace('\n', "\r\n")),
            (
                "bom-crlf.csv",
                format!("\u{feff}{}", readings.replace('\n', "\r\n")),
            ),
            ("cr.csv", readings.replace('\n', "\r")),
        ];
        for (name, text) in texts {
            std::fs::write(fx.path(name), text).unwrap();
        }
        // Bytes that are not UTF-8: a Latin-1 source and a UTF-16 CSV.
        std::fs::write(fx.path("latin1.yaml"), b"schema: 1\ntitle: Pr\xfcfplan\n").unwrap();
        let utf16: Vec<u8> = std::iter::once(0xFEFFu16)
            .chain(column(&values).encode_utf16())
            .flat_map(u16::to_le_bytes)
            .collect();
        std::fs::write(fx.path("utf16.csv"), utf16).unwrap();
        // 100 MiB, sparse: refused by its size, never read.
        let big = std::fs::File::create(fx.path("big.yaml")).unwrap();
        big.set_len(100 << 20).unwrap();
        std::fs::create_dir(fx.path("no-sources")).unwrap();
        std::fs::write(fx.path("a-file"), "not a folder\n").unwrap();
        fx
    }

    fn path(&self, name: &str) -> PathBuf {
        self.dir.path().join(name)
    }

    /// `text` with every `@name` replaced by the fixture's path.
    fn expand(&self, text: &str) -> String {
        match text.split_once('@') {
            Some((before, rest)) => {
                let end = rest
                    .find(|ch: char| ch.is_whitespace() || ch == ',' || ch == ':')
                    .unwrap_or(rest.len());
                let (name, after) = rest.split_at(end);
                format!(
                    "{before}{}{}",
                    self.path(name).display(),
                    self.expand(after)
                )
            }
            None => text.to_string(),
        }
    }
}

/// Runs every case on fresh fixtures (see [`run_in`]).
fn run(group: &str, cases: &[Case]) {
    run_in(&Fixtures::new(), group, cases);
}

/// Runs every case on the fixtures `fx` and fails with the list of those
/// that went wrong.
fn run_in(fx: &Fixtures, group: &str, cases: &[Case]) {
    let mut failures = Vec::new();
    for case in cases {
        let args: Vec<String> = case.args.iter().map(|a| fx.expand(a)).collect();
        let fragment = fx.expand(case.fragment);
        let started = Instant::now();
        let output = lotsman()
            .args(&args)
            .timeout(Duration::from_secs(120))
            .output()
            .unwrap();
        let elapsed = started.elapsed();
        let stdout = String::from_utf8_lossy(&output.stdout);
        let stderr = String::from_utf8_lossy(&output.stderr);
        let text = match case.out {
            Out::Err => &stderr,
            Out::Std => &stdout,
        };
        let mut wrong = Vec::new();
        if output.status.code() != Some(case.code) {
            wrong.push(format!(
                "exit code {:?}, expected {}",
                output.status.code(),
                case.code
            ));
        }
        if !text.contains(&fragment) {
            wrong.push(format!("no '{fragment}' in {:?}", case.out));
        }
        if stderr.contains("panicked") {
            wrong.push("panicked".to_string());
        }
        if case.out == Out::Err
            && !(stderr.starts_with("lotsman: error: ") && stderr.lines().count() == 1)
        {
            wrong.push("the refusal is not one line 'lotsman: error: ...'".to_string());
        }
        if case.fast && elapsed > Duration::from_secs(1) {
            wrong.push(format!("took {elapsed:?}, more than a second"));
        }
        if !wrong.is_empty() {
            failures.push(format!(
                "{}: {}\n  lotsman {}\n  stdout: {}\n  stderr: {}",
                case.name,
                wrong.join("; "),
                args.join(" "),
                stdout.chars().take(600).collect::<String>(),
                stderr.chars().take(600).collect::<String>()
            ));
        }
    }
    eprintln!("{group}: {} cases", cases.len());
    assert!(
        failures.is_empty(),
        "{} of {} cases failed:\n{}",
        failures.len(),
        cases.len(),
        failures.join("\n")
    );
}

#[test]
fn design_refuses_bad_risk_points_and_lots() {
    let d = |rest: &[&'static str]| {
        let mut v = vec!["design"];
        v.extend_from_slice(rest);
        v
    };
    let cases = vec![
        refused(
            "p1 = p2",
            &d(&["--aql", "1%", "--rql", "1%"]),
            "the producer's quality (AQL) 0.01 must be below the consumer's quality (RQL) 0.01",
        ),
        refused(
            "p1 > p2",
            &d(&["--aql", "6%", "--rql", "1%"]),
            "must be below the consumer's quality (RQL) 0.01",
        ),
        refused(
            "quality 0",
            &d(&["--aql", "0", "--rql", "6%"]),
            "producer's quality (AQL) = 0 is out of range: it must be between 0 and 1 (exclusive)",
        ),
        refused(
            "quality -0",
            &d(&["--aql", "-0", "--rql", "6%"]),
            "producer's quality (AQL) = -0 is out of range: it must be between 0 and 1",
        ),
        refused(
            "negative quality",
            &d(&["--aql", "-1%", "--rql", "6%"]),
            "producer's quality (AQL) = -0.01 is out of range",
        ),
        refused(
            "quality 1",
            &d(&["--aql", "1", "--rql", "6%"]),
            "producer's quality (AQL) = 1 is out of range",
        ),
        refused(
            "quality above 1",
            &d(&["--aql", "1%", "--rql", "150%"]),
            "consumer's quality (RQL) = 1.5 is out of range: it must be between 0 and 1",
        ),
        refused(
            "quality NaN",
            &d(&["--aql", "NaN", "--rql", "6%"]),
            "--aql = 'NaN' is not a fraction (0.01) or a percent (1%)",
        ),
        refused(
            "quality inf",
            &d(&["--aql", "1%", "--rql", "inf"]),
            "--rql = 'inf' is not a fraction",
        ),
        refused(
            "quality -inf",
            &d(&["--aql", "-inf", "--rql", "6%"]),
            "--aql = '-inf' is not a fraction",
        ),
        refused(
            "quality empty",
            &d(&["--aql", "", "--rql", "6%"]),
            "--aql = '' is not a fraction",
        ),
        refused(
            "quality 1%%",
            &d(&["--aql", "1%%", "--rql", "6%"]),
            "--aql = '1%%' is not a fraction",
        ),
        refused(
            "quality with a decimal comma",
            &d(&["--aql", "1,5%", "--rql", "6%"]),
            "--aql = '1,5%' is not a fraction",
        ),
        refused(
            "quality 1e-400 (rounds to 0)",
            &d(&["--aql", "1e-400", "--rql", "6%"]),
            "--aql = 1e-400 is out of range: it must be a number that double precision can hold: it rounds to 0",
        ),
        refused(
            "alpha 0",
            &d(&["--aql", "1%", "--rql", "6%", "--alpha", "0"]),
            "alpha (producer's risk) = 0 is out of range: it must be between 0 and 1 (exclusive)",
        ),
        refused(
            "alpha negative",
            &d(&["--aql", "1%", "--rql", "6%", "--alpha", "-0.05"]),
            "alpha (producer's risk) = -0.05 is out of range",
        ),
        refused(
            "alpha 1",
            &d(&["--aql", "1%", "--rql", "6%", "--alpha", "1"]),
            "alpha (producer's risk) = 1 is out of range",
        ),
        refused(
            "beta 0",
            &d(&["--aql", "1%", "--rql", "6%", "--beta", "0"]),
            "beta (consumer's risk) = 0 is out of range: it must be between 0 and 1",
        ),
        refused(
            "beta above 1",
            &d(&["--aql", "1%", "--rql", "6%", "--beta", "1.5"]),
            "beta (consumer's risk) = 1.5 is out of range",
        ),
        refused(
            "beta 100%",
            &d(&["--aql", "1%", "--rql", "6%", "--beta", "100%"]),
            "beta (consumer's risk) = 1 is out of range",
        ),
        refused(
            "beta 1e-400",
            &d(&["--aql", "1%", "--rql", "6%", "--beta", "1e-400"]),
            "--beta = 1e-400 is out of range",
        ),
        refused(
            "alpha + beta = 1",
            &d(&[
                "--aql", "1%", "--rql", "6%", "--alpha", "0.5", "--beta", "0.5",
            ]),
            "alpha + beta = 0.5 + 0.5 must be below 1",
        ),
        refused(
            "alpha + beta > 1",
            &d(&[
                "--aql", "1%", "--rql", "6%", "--alpha", "0.6", "--beta", "0.45",
            ]),
            "alpha + beta = 0.6 + 0.45 must be below 1",
        ),
        refused(
            "lot size 0",
            &d(&["--aql", "1%", "--rql", "6%", "--lot-size", "0"]),
            "lot size = 0 is out of range: it must be 1 to 10^12 units",
        ),
        refused(
            "lot size not a whole number",
            &d(&["--aql", "1%", "--rql", "6%", "--lot-size", "12.5"]),
            "--lot-size = '12.5' is not a whole number",
        ),
        refused(
            "lot size in exponent form",
            &d(&["--aql", "1%", "--rql", "6%", "--lot-size", "2e3"]),
            "--lot-size = '2e3' is not a whole number",
        ),
        refused(
            "lot size negative",
            &d(&["--aql", "1%", "--rql", "6%", "--lot-size", "-5"]),
            "--lot-size = '-5' is not a whole number",
        ),
        refused(
            "lot size 10^19",
            &d(&[
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--lot-size",
                "10000000000000000000",
            ]),
            "--lot-size = 10000000000000000000 is out of range: it must be at most 1000000000000",
        ),
        refused(
            "hypergeometric model without a lot",
            &d(&["--aql", "1%", "--rql", "6%", "--model", "hypergeometric"]),
            "the hypergeometric model needs a lot size",
        ),
        refused(
            "a lot too small to tell the points apart",
            &d(&["--aql", "1%", "--rql", "2%", "--lot-size", "20"]),
            "so no sample can tell them apart",
        ),
        refused(
            "Poisson rate 0",
            &d(&["--aql", "0", "--rql", "2", "--model", "poisson"]),
            "producer's quality (AQL) = 0 is out of range: it must be above 0 (nonconformities per unit)",
        ),
        refused(
            "variables without sigma",
            &d(&["--scheme", "variables", "--aql", "1%", "--rql", "6%"]),
            "--scheme variables needs --sigma known (with --sigma-value S) or --sigma unknown",
        ),
        refused(
            "variables sigma 0",
            &d(&[
                "--scheme",
                "variables",
                "--sigma",
                "known",
                "--sigma-value",
                "0",
                "--limit",
                "lower",
                "--lower",
                "5",
                "--aql",
                "1%",
                "--rql",
                "6%",
            ]),
            "sigma value (--sigma-value) = 0 is out of range: it must be a finite number above 0",
        ),
        refused(
            "variables limits crossed",
            &d(&[
                "--scheme",
                "variables",
                "--sigma",
                "unknown",
                "--limit",
                "both",
                "--lower",
                "6",
                "--upper",
                "5",
                "--aql",
                "1%",
                "--rql",
                "6%",
            ]),
            "the lower limit 6 must be below the upper limit 5",
        ),
        refused(
            "variables limit NaN",
            &d(&[
                "--scheme",
                "variables",
                "--sigma",
                "unknown",
                "--limit",
                "lower",
                "--lower",
                "nan",
                "--aql",
                "1%",
                "--rql",
                "6%",
            ]),
            "--lower = 'nan' is not a number",
        ),
        refused(
            "a variables flag on an attributes plan",
            &d(&["--aql", "1%", "--rql", "6%", "--sigma", "unknown"]),
            "--sigma applies to variables plans (--scheme variables)",
        ),
    ];
    run("design", &cases);
}

/// Points that need a plan beyond a documented limit: a refusal at once,
/// from every designer, the grid and rectify.
#[test]
fn points_beyond_the_limits_are_refused_within_a_second() {
    const TOO_CLOSE: &str = "the risk points are too close: a plan would need an acceptance number beyond the designer's limit of 100000";
    let close = |scheme: &'static str| -> Vec<&'static str> {
        vec![
            "design",
            "--aql",
            "1e-9",
            "--rql",
            "1.0001e-9",
            "--scheme",
            scheme,
        ]
    };
    let variables = |rest: &[&'static str]| {
        let mut v = vec![
            "design",
            "--scheme",
            "variables",
            "--aql",
            "1e-9",
            "--rql",
            "1.0001e-9",
        ];
        v.extend_from_slice(rest);
        v
    };
    let cases = vec![
        refused_fast("close points, single", &close("single"), TOO_CLOSE),
        refused_fast("close points, single, Poisson", &["design", "--aql", "1e-9", "--rql", "1.0001e-9", "--model", "poisson"], TOO_CLOSE),
        refused_fast("close points, double", &close("double"), TOO_CLOSE),
        refused_fast("close points, multiple", &close("multiple"), TOO_CLOSE),
        refused_fast("close points, sequential", &close("sequential"), TOO_CLOSE),
        refused_fast("close points, variables sigma unknown", &variables(&["--sigma", "unknown", "--limit", "lower", "--lower", "5"]), "beyond the designer's limit of 10000 measurements"),
        refused_fast("close points, variables sigma known", &variables(&["--sigma", "known", "--sigma-value", "1", "--limit", "upper", "--upper", "5"]), "beyond the designer's limit of 10000 measurements"),
        refused_fast("close points, variables two limits", &variables(&["--sigma", "unknown", "--limit", "both", "--lower", "5", "--upper", "6"]), "beyond the designer's limit of 10000 measurements"),
        refused_fast("double plan with c above 25", &["design", "--aql", "1%", "--rql", "1.6%", "--scheme", "double"], "beyond the designer's limit of 25"),
        refused_fast("double plan at parts per million (n = 1.1 million)", &["design", "--aql", "1e-6", "--rql", "6e-6", "--scheme", "double"], "the double plan's search around the single plan n = 1113463, c = 3 (binomial model, asn-aql) would take about"),
        refused_fast("multiple plan at parts per million", &["design", "--aql", "1e-6", "--rql", "6e-6", "--scheme", "multiple"], "the 7-stage plan's search around the single plan's sample n = 1113463 (binomial model) would take about"),
        refused_fast("sequential plan for close points (c = 937)", &["design", "--aql", "1%", "--rql", "1.1%", "--scheme", "sequential"], "the sequential plan's truncation search around the single plan n = 88840, c = 937 (binomial model) would take about"),
        // Found by the no-panics property: every acceptance number fits at
        // n = 1 here, and listing them once ran out of memory.
        reported("Poisson RQL of 10^9 per unit: answered at once", &["design", "--aql", "0.02", "--rql", "1e9", "--model", "poisson"], 0, "PLAN  n = 1, c = 98"),
        reported("trade-off grid of close points: every cell says why", &["tradeoff", "--aql", "1e-9,2e-9", "--rql", "1.0001e-9,3e-9"], 0, "no plan in 4 of 4 cells"),
        reported("double trade-off grid at parts per million", &["tradeoff", "--aql", "1e-7,2e-7", "--rql", "6e-7,9e-7", "--scheme", "double"], 0, "no plan in 4 of 4 cells"),
        refused_fast("rectify, LTPD beyond the sample limit in a huge lot", &["rectify", "--lot-size", "1000000000000", "--process-average", "1e-9", "--ltpd", "1.0001e-9"], "the protection needs a sample beyond the designer's limit of 1000000000 units, and the lot has 1000000000000"),
        refused_fast("rectify, AOQL double beyond the sample limit", &["rectify", "--lot-size", "1000000000000", "--process-average", "1e-9", "--aoql", "1.0001e-9", "--scheme", "double"], "beyond the designer's limit of 1000000000 units"),
        refused_fast("rectify, double search too large", &["rectify", "--lot-size", "1000000000", "--process-average", "1e-8", "--aoql", "5e-8", "--scheme", "double"], "the double search around the single plans up to n = 27466583 with acceptance number 1 (AOQL protection) would take about"),
    ]
    .into_iter()
    .map(|mut c| {
        c.fast = true;
        c
    })
    .collect::<Vec<_>>();
    run("limits", &cases);
}

#[test]
fn evaluate_refuses_invalid_plans_and_qualities() {
    let cases = vec![
        refused(
            "c > n",
            &["evaluate", "--n", "5", "--c", "7"],
            "stage 1 numbers: acceptance number 7 must be below the cumulative sample size 5",
        ),
        refused(
            "c = n",
            &["evaluate", "--n", "5", "--c", "5"],
            "acceptance number 5 must be below the cumulative sample size 5",
        ),
        refused(
            "n = 0",
            &["evaluate", "--n", "0", "--c", "0"],
            "stage 1 sample size = 0 is out of range: it must be at least 1",
        ),
        refused(
            "n not a whole number",
            &["evaluate", "--n", "10.5", "--c", "1"],
            "--n = '10.5' is not a whole number",
        ),
        refused(
            "c negative",
            &["evaluate", "--n", "10", "--c", "-1"],
            "--c = '-1' is not a whole number",
        ),
        refused_fast(
            "n = 10^19",
            &["evaluate", "--n", "10000000000000000000", "--c", "1"],
            "stage 1 cumulative sample size = 10000000000000000000 is out of range: it must be 1 to 1000000000 units",
        ),
        refused_fast(
            "n and c at the largest whole number",
            &[
                "evaluate",
                "--n",
                "18446744073709551615",
                "--c",
                "18446744073709551614",
            ],
            "cumulative sample size = 18446744073709551615 is out of range",
        ),
        refused_fast(
            "c above the limit",
            &["evaluate", "--n", "1000000000", "--c", "100001"],
            "it must be at most 100000 for the acceptance number",
        ),
        refused(
            "lot smaller than the sample",
            &["evaluate", "--n", "100", "--c", "2", "--lot-size", "50"],
            "stage 1 cumulative sample size 100 exceeds the lot size 50",
        ),
        refused(
            "stage sizes decreasing",
            &["evaluate", "--stage", "50:1:4", "--stage", "40:3:4"],
            "stage 2 cumulative sample size 40 must exceed stage 1's 50",
        ),
        refused(
            "stage sizes equal",
            &["evaluate", "--stage", "50:1:4", "--stage", "50:3:4"],
            "stage 2 cumulative sample size 50 must exceed stage 1's 50",
        ),
        refused(
            "acceptance = rejection",
            &["evaluate", "--stage", "50:3:3", "--stage", "100:4:5"],
            "stage 1 numbers: acceptance number 3 must be below the rejection number 3",
        ),
        refused(
            "acceptance > rejection",
            &["evaluate", "--stage", "50:4:3", "--stage", "100:4:5"],
            "acceptance number 4 must be below the rejection number 3",
        ),
        refused(
            "last stage without a decision",
            &["evaluate", "--stage", "50:1:4"],
            "the last stage must decide every count",
        ),
        refused(
            "last stage that cannot accept",
            &["evaluate", "--stage", "50:1:4", "--stage", "100:-:5"],
            "(got accept none, reject 5)",
        ),
        refused(
            "a stage that leaves nothing for the next",
            &["evaluate", "--stage", "50:1:2", "--stage", "100:4:5"],
            "stage 1 decides every count, so stage 2 is never reached",
        ),
        refused_fast(
            "a stage that leaves 100000 counts open",
            &[
                "evaluate",
                "--stage",
                "50:-:100000",
                "--stage",
                "100:99999:100000",
            ],
            "stage 1 counts left open (rejection number - acceptance number - 1) = 100000 is out of range: it must be at most 500",
        ),
        refused(
            "eleven stages",
            &[
                "evaluate", "--stage", "1:-:1", "--stage", "2:-:2", "--stage", "3:-:3", "--stage",
                "4:-:4", "--stage", "5:-:5", "--stage", "6:-:6", "--stage", "7:-:7", "--stage",
                "8:-:8", "--stage", "9:-:9", "--stage", "10:-:10", "--stage", "11:10:11",
            ],
            "number of stages = 11 is out of range: it must be 1 to 10",
        ),
        refused(
            "malformed stage",
            &["evaluate", "--stage", "50:1"],
            "--stage = '50:1' is not N:AC:RE",
        ),
        refused(
            "quality 0",
            &["evaluate", "--n", "50", "--c", "1", "--at", "0"],
            "quality = 0 is out of range: it must be between 0 and 1",
        ),
        refused(
            "quality -0",
            &["evaluate", "--n", "50", "--c", "1", "--at", "-0"],
            "quality = -0 is out of range",
        ),
        refused(
            "quality 1e-400",
            &["evaluate", "--n", "50", "--c", "1", "--at", "1e-400"],
            "--at = 1e-400 is out of range",
        ),
        refused(
            "empty list element",
            &["evaluate", "--n", "50", "--c", "1", "--at", "1%,,2%"],
            "--at = '' is not a fraction",
        ),
        refused(
            "range upside down",
            &["evaluate", "--n", "50", "--c", "1", "--range", "5%:1%:10"],
            "--range: LO = 0.05 must be below HI = 0.01",
        ),
        refused(
            "range of a million points",
            &[
                "evaluate",
                "--n",
                "50",
                "--c",
                "1",
                "--range",
                "1%:5%:1000000",
            ],
            "--range count = 1000000 is out of range: it must be 2 to 100000",
        ),
        refused(
            "no plan given",
            &["evaluate"],
            "give a plan: FILE.yaml, or --n N --c C",
        ),
        refused(
            "a source that records c > n",
            &["evaluate", "@c-above-n.yaml"],
            "acceptance number 7 must be below the cumulative sample size 5",
        ),
        reported(
            "verify of a source that records c > n: invalid, not a mismatch",
            &["verify", "@c-above-n.yaml"],
            2,
            "acceptance number 7 must be below the cumulative sample size 5",
        ),
        refused(
            "a source that records no plan",
            &["evaluate", "@no-plan.yaml"],
            "records no plan yet; solve it first with: lotsman design FILE --output FILE",
        ),
    ];
    run("evaluate", &cases);
}

#[test]
fn judge_refuses_counts_and_measurements_it_cannot_use() {
    let m = |file: &'static str| -> Vec<&'static str> {
        vec![
            "judge",
            "plans/tpw-cover-thickness.yaml",
            "--measurements",
            file,
        ]
    };
    let mc = |file: &'static str| -> Vec<&'static str> {
        vec![
            "judge",
            "plans/tpw-cover-thickness.yaml",
            "--measurements",
            file,
            "--column",
            "thickness_mm",
        ]
    };
    const ACCEPT: &str = "ACCEPT the lot: Q_L = 2.8684 >= k = 1.901";
    let cases = vec![
        refused(
            "count above the sample",
            &["judge", "plans/tpw-seal-visual.yaml", "--found", "167"],
            "--found for stage 1 = 167 is out of range: it must be 0 to 166",
        ),
        refused(
            "negative count",
            &["judge", "plans/tpw-seal-visual.yaml", "--found", "-1"],
            "--found = '-1' is not a whole number",
        ),
        refused(
            "inspected beyond the truncation",
            &[
                "judge",
                "plans/tpw-sleeve-hardness.yaml",
                "--inspected",
                "9999",
                "--found",
                "0",
            ],
            "--inspected = 9999 is out of range: it must be a count of units at which a stage ends",
        ),
        refused(
            "two counts with --inspected",
            &[
                "judge",
                "plans/tpw-sleeve-hardness.yaml",
                "--inspected",
                "3",
                "--found",
                "0",
                "--found",
                "1",
            ],
            "with --inspected give one --found",
        ),
        refused(
            "counts for a variables plan",
            &["judge", "plans/tpw-cover-thickness.yaml", "--found", "1"],
            "is a variables plan, decided from measurements (judge --measurements FILE.csv)",
        ),
        refused(
            "measurements for an attributes plan",
            &[
                "judge",
                "plans/tpw-seal-visual.yaml",
                "--measurements",
                "@bom.csv",
            ],
            "is a single attributes plan, decided from counts (judge --found K)",
        ),
        refused(
            "a source whose stages shrink",
            &["judge", "@stages-shrinking.yaml", "--found", "1"],
            "stage 2 cumulative sample size 40 must exceed stage 1's 50",
        ),
        refused(
            "blank row",
            &m("@blank-row.csv"),
            "row 5 of the measurements is blank; every unit of the sample needs its reading",
        ),
        refused(
            "blank cell",
            &mc("@blank-cell.csv"),
            "row 6 of the measurements is blank",
        ),
        refused(
            "text",
            &m("@text.csv"),
            "measurement in row 5 = 'n/a' is not a number written with a decimal point",
        ),
        refused(
            "commas as decimal marks",
            &m("@comma-decimals.csv"),
            "(if commas are decimal marks, write the decimals with points)",
        ),
        refused(
            "semicolons and decimal commas",
            &m("@semicolons.csv"),
            "row 2 of the measurements has 2 cells ('1;5,834')",
        ),
        refused(
            "NaN",
            &m("@nan.csv"),
            "measurement in row 5 = 'NaN' is not a number",
        ),
        refused(
            "one reading short",
            &m("@short.csv"),
            "the file holds 41 measurements and the plan's sample is n = 42",
        ),
        refused(
            "every reading the same",
            &m("@same.csv"),
            "every measurement is the same, so the sample shows no spread",
        ),
        refused(
            "readings that overflow",
            &m("@overflow.csv"),
            "largest measurement (absolute value) = 1e308 is out of range",
        ),
        refused(
            "empty file",
            &m("@empty.csv"),
            "the measurements file is empty",
        ),
        refused(
            "UTF-16 text",
            &m("@utf16.csv"),
            "the measurements file is not UTF-8 text",
        ),
        refused(
            "missing column",
            &[
                "judge",
                "plans/tpw-cover-thickness.yaml",
                "--measurements",
                "@bom.csv",
                "--column",
                "thickness",
            ],
            "the measurements file has no column 'thickness'",
        ),
        refused_fast(
            "an endless file",
            &m("/dev/zero"),
            "the file has more than 10485760 bytes; a measurements file may have at most 10485760",
        ),
        reported("byte-order mark: accepted", &mc("@bom.csv"), 0, ACCEPT),
        reported("Windows line ends: accepted", &mc("@crlf.csv"), 0, ACCEPT),
        reported(
            "byte-order mark and Windows line ends: accepted",
            &mc("@bom-crlf.csv"),
            0,
            ACCEPT,
        ),
        reported(
            "old Macintosh line ends: accepted",
            &mc("@cr.csv"),
            0,
            ACCEPT,
        ),
    ];
    run("judge", &cases);
}

#[test]
fn plan_sources_that_are_not_valid_yaml_sources_are_refused() {
    let v = |file: &'static str| -> Vec<&'static str> { vec!["verify", file] };
    let cases = vec![
        reported(
            "malformed YAML",
            &v("@malformed.yaml"),
            2,
            "mapping values are not allowed in this context at line 3 column 9",
        ),
        reported(
            "a tab in the indentation",
            &v("@tab.yaml"),
            2,
            "found a tab character that violates indentation at line 2",
        ),
        reported("empty file", &v("@empty.yaml"), 2, "the file is empty"),
        reported(
            "comments only",
            &v("@comments.yaml"),
            2,
            "the file is empty (nothing but blank lines and comments)",
        ),
        reported(
            "a list",
            &v("@list.yaml"),
            2,
            "invalid type: sequence, expected struct PlanSource",
        ),
        reported(
            "a sentence",
            &v("@scalar.yaml"),
            2,
            "invalid type: string \"just a sentence\", expected struct PlanSource",
        ),
        reported(
            "unknown key",
            &v("@unknown-key.yaml"),
            2,
            "unknown field `modell`, expected one of",
        ),
        reported(
            "duplicated key",
            &v("@duplicate-key.yaml"),
            2,
            "duplicate field `title`",
        ),
        reported(
            "duplicated nested key",
            &v("@duplicate-nested-key.yaml"),
            2,
            "producer: duplicate field `quality` at line 6 column 3; `quality` is given again at line 7",
        ),
        reported(
            "schema as text",
            &v("@schema-text.yaml"),
            2,
            "schema: invalid type: string \"one\", expected u32 at line 1",
        ),
        reported(
            "quality as a list",
            &v("@quality-list.yaml"),
            2,
            "producer.quality: invalid type: sequence, expected a fraction (0.01) or a percent (\"1%\")",
        ),
        reported(
            "lot size as a fraction",
            &v("@lot-fraction.yaml"),
            2,
            "lot_size: invalid type: floating point `12.5`, expected u64",
        ),
        reported(
            "lot size 10^19",
            &v("@lot-1e19.yaml"),
            2,
            "lot size = 10000000000000000000 is out of range: it must be 1 to 10^12 units",
        ),
        reported(
            "lot size 10^20",
            &v("@lot-1e20.yaml"),
            2,
            "lot_size: invalid type: integer `100000000000000000000` as u128, expected u64",
        ),
        reported(
            "lot size 0",
            &v("@lot-zero.yaml"),
            2,
            "lot size = 0 is out of range",
        ),
        reported(
            "a future schema version",
            &v("@schema-2.yaml"),
            2,
            "schema = 2 is out of range: it must be 1 (the version this tool reads; a newer file needs a newer lotsman)",
        ),
        reported(
            "quality .nan",
            &v("@quality-nan.yaml"),
            2,
            "producer.quality: value = '.nan' is not a fraction",
        ),
        reported(
            "quality .inf",
            &v("@quality-inf.yaml"),
            2,
            "consumer.quality: value = '.inf' is not a fraction",
        ),
        reported(
            "quality 1e-400 (rounds to 0)",
            &v("@quality-tiny.yaml"),
            2,
            "producer.quality: value = 1e-400 is out of range: it must be a number that double precision can hold",
        ),
        reported(
            "quality '1%%'",
            &v("@quality-percent-percent.yaml"),
            2,
            "value = '1%%' is not a fraction",
        ),
        reported(
            "quality -0.0",
            &v("@quality-minus-zero.yaml"),
            2,
            "producer's quality (AQL) = -0 is out of range",
        ),
        reported(
            "quality above 1",
            &v("@quality-above-one.yaml"),
            2,
            "consumer's quality (RQL) = 1.5 is out of range",
        ),
        reported(
            "p1 > p2",
            &v("@points-crossed.yaml"),
            2,
            "the producer's quality (AQL) 0.01 must be below the consumer's quality (RQL) 0.005",
        ),
        reported(
            "alpha + beta >= 1",
            &v("@risks-sum.yaml"),
            2,
            "alpha + beta = 0.95 + 0.1 must be below 1",
        ),
        reported(
            "beta 0",
            &v("@risk-zero.yaml"),
            2,
            "beta (consumer's risk) = 0 is out of range",
        ),
        reported(
            "30 February",
            &v("@bad-date.yaml"),
            2,
            "date = '2026-02-30' is not a date YYYY-MM-DD",
        ),
        reported(
            "not UTF-8",
            &v("@latin1.yaml"),
            2,
            "the file is not UTF-8 text (byte 20 is not); save it as UTF-8",
        ),
        reported(
            "a missing file",
            &v("@missing.yaml"),
            2,
            "No such file or directory",
        ),
        reported(
            "a folder without sources",
            &v("@no-sources"),
            2,
            "the folder holds no plan sources",
        ),
        reported(
            "byte-order mark: accepted",
            &v("@fit-bom.yaml"),
            0,
            "1 match, 0 mismatch, 0 invalid",
        ),
        reported(
            "Windows line ends: accepted",
            &v("@fit-crlf.yaml"),
            0,
            "1 match, 0 mismatch, 0 invalid",
        ),
        refused(
            "design from a malformed source",
            &["design", "@malformed.yaml"],
            "@malformed.yaml: mapping values are not allowed",
        ),
        refused(
            "sheet of a source with a duplicated key",
            &["sheet", "@duplicate-key.yaml", "--output", "@dup.pdf"],
            "duplicate field `title`",
        ),
    ];
    run("sources", &cases);
}

/// Inputs built to exhaust the reader: each is refused at once, never
/// expanded or read to its end.
#[test]
fn oversized_endless_and_explosive_sources_are_refused_within_a_second() {
    let cases = vec![
        refused_fast(
            "a 100 MiB source, refused by its size",
            &["design", "@big.yaml"],
            "@big.yaml: the file has 104857600 bytes; a plan source may have at most 1048576",
        ),
        refused_fast(
            "an endless source",
            &["design", "/dev/zero"],
            "/dev/zero: the file has more than 1048576 bytes",
        ),
        refused_fast(
            "a sheet of an endless source",
            &["sheet", "/dev/zero", "--output", "@zero.pdf"],
            "the file has more than 1048576 bytes",
        ),
        Case {
            fast: true,
            ..reported(
                "an endless sheet to verify against",
                &["verify", "plans/tpw-cover-fit.yaml", "--sheet", "/dev/zero"],
                2,
                "the file has more than 16777216 bytes; a plan sheet may have at most 16777216",
            )
        },
        refused_fast(
            "billion laughs in a quality",
            &["design", "@bomb-quality.yaml"],
            "producer.quality: invalid type: sequence, expected a fraction",
        ),
        refused_fast(
            "billion laughs over 20000 values in a quality",
            &["design", "@bomb-wide.yaml"],
            "consumer.quality: invalid type: sequence, expected a fraction",
        ),
        refused_fast(
            "billion laughs in the notes",
            &["evaluate", "@bomb-notes.yaml"],
            "notes: invalid type: sequence, expected a string",
        ),
        refused_fast(
            "brackets nested 100000 deep",
            &["design", "@deep.yaml"],
            "brackets [ and { nest more than 64 deep at line 2",
        ),
    ];
    run("exhaustion", &cases);
}

#[test]
fn outputs_are_never_written_where_they_cannot_or_must_not_go() {
    let cases = vec![
        refused(
            "design --output in a missing folder",
            &[
                "design",
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--output",
                "@missing/plan.yaml",
            ],
            "@missing/plan.yaml: the folder @missing does not exist; create it first",
        ),
        refused(
            "sheet --output in a missing folder",
            &[
                "sheet",
                "plans/tpw-cover-fit.yaml",
                "--output",
                "@missing/fit.pdf",
            ],
            "the folder @missing does not exist",
        ),
        refused(
            "tradeoff --output in a missing folder",
            &[
                "tradeoff",
                "--aql",
                "1%,2%",
                "--rql",
                "5%,6%",
                "--format",
                "csv",
                "--output",
                "@missing/grid.csv",
            ],
            "the folder @missing does not exist",
        ),
        refused(
            "design --output onto its source",
            &["design", "@source.yaml", "--output", "@source.yaml"],
            "the output @source.yaml is the plan source being read",
        ),
        refused(
            "sheet --output onto its source",
            &["sheet", "@source.yaml", "--output", "@source.yaml"],
            "the output @source.yaml is the plan source being read",
        ),
        refused(
            "a sheet whose default name is its source",
            &["sheet", "@plan.pdf"],
            "the output @plan.pdf is the plan source being read",
        ),
        refused(
            "design --output onto a folder",
            &[
                "design",
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--output",
                "@no-sources",
            ],
            "is a folder; name a file to write",
        ),
        refused(
            "demo --output-dir onto a file",
            &["demo", "--output-dir", "@a-file"],
            "@a-file: this is a file; give --output-dir a folder",
        ),
        refused(
            "tradeoff pdf without --output",
            &[
                "tradeoff", "--aql", "1%,2%", "--rql", "5%,6%", "--format", "pdf",
            ],
            "--format pdf writes a file: give --output FILE.pdf",
        ),
    ];
    let fx = Fixtures::new();
    run_in(&fx, "outputs", &cases);
    assert!(!fx.path("missing").exists(), "no folder was made");
    for name in ["source.yaml", "plan.pdf"] {
        assert_eq!(
            std::fs::read_to_string(fx.path(name)).unwrap(),
            std::fs::read_to_string("plans/tpw-cover-fit.yaml").unwrap(),
            "{name} is intact"
        );
    }
}

#[test]
fn other_commands_refuse_bad_input() {
    let cases = vec![
        refused(
            "new: unknown kind",
            &["new", "double-helix"],
            "template kind = 'double-helix' is not one of: binomial, hypergeometric, poisson, double, multiple, sequential, variables",
        ),
        refused(
            "new: empty kind",
            &["new", ""],
            "template kind = '' is not one of",
        ),
        refused(
            "tradeoff: one point on an axis",
            &["tradeoff", "--aql", "1%:5%:1", "--rql", "6%,7%"],
            "--aql count = 1 is out of range: it must be 2 to 100000",
        ),
        refused(
            "tradeoff: too many cells",
            &["tradeoff", "--aql", "0.1%:5%:501", "--rql", "6%:9%:501"],
            "number of grid cells = 251001 is out of range: it must be at most 250000",
        ),
        refused(
            "tradeoff: negative cost",
            &[
                "tradeoff",
                "--aql",
                "1%,2%",
                "--rql",
                "6%,7%",
                "--cost-per-unit",
                "-1",
                "--process-quality",
                "1%",
                "--lot-size",
                "100",
            ],
            "cost per unit inspected = -1 is out of range: it must be a positive number",
        ),
        refused(
            "tradeoff: process quality 0",
            &[
                "tradeoff",
                "--aql",
                "1%,2%",
                "--rql",
                "6%,7%",
                "--cost-per-unit",
                "1",
                "--process-quality",
                "0",
                "--lot-size",
                "100",
            ],
            "process quality = 0 is out of range",
        ),
        refused(
            "tradeoff: cost without a lot",
            &[
                "tradeoff",
                "--aql",
                "1%,2%",
                "--rql",
                "6%,7%",
                "--cost-per-unit",
                "1",
                "--process-quality",
                "1%",
            ],
            "the cost view needs a lot size",
        ),
        refused(
            "tradeoff: alpha 0",
            &[
                "tradeoff", "--aql", "1%,2%", "--rql", "6%,7%", "--alpha", "0",
            ],
            "alpha (producer's risk) = 0 is out of range",
        ),
        refused(
            "tradeoff: quality 1e-400",
            &["tradeoff", "--aql", "1e-400,2%", "--rql", "6%,7%"],
            "--aql = 1e-400 is out of range",
        ),
        refused(
            "rectify: process average at the LTPD",
            &[
                "rectify",
                "--lot-size",
                "5000",
                "--process-average",
                "1%",
                "--ltpd",
                "1%",
            ],
            "the process average 0.01 must be below the LTPD 0.01",
        ),
        refused(
            "rectify: lot of one unit",
            &[
                "rectify",
                "--lot-size",
                "1",
                "--process-average",
                "0.1%",
                "--ltpd",
                "1%",
            ],
            "lot size = 1 is out of range: it must be 2 to 1000000000000 units",
        ),
        refused(
            "rectify: lot 0",
            &[
                "rectify",
                "--lot-size",
                "0",
                "--process-average",
                "0.1%",
                "--ltpd",
                "1%",
            ],
            "lot size = 0 is out of range",
        ),
        refused(
            "rectify: beta 0",
            &[
                "rectify",
                "--lot-size",
                "5000",
                "--process-average",
                "0.1%",
                "--ltpd",
                "1%",
                "--beta",
                "0",
            ],
            "beta (consumer's risk at the LTPD, --beta) = 0 is out of range",
        ),
        refused(
            "rectify: negative AOQL",
            &[
                "rectify",
                "--lot-size",
                "5000",
                "--process-average",
                "0.1%",
                "--aoql",
                "-1%",
            ],
            "AOQL (--aoql) = -0.01 is out of range",
        ),
        refused(
            "rectify: LTPD 1e-400",
            &[
                "rectify",
                "--lot-size",
                "5000",
                "--process-average",
                "0.1%",
                "--ltpd",
                "1e-400",
            ],
            "--ltpd = 1e-400 is out of range",
        ),
        refused(
            "rectify: process average NaN",
            &[
                "rectify",
                "--lot-size",
                "5000",
                "--process-average",
                "nan",
                "--ltpd",
                "1%",
            ],
            "--process-average = 'nan' is not a fraction",
        ),
        refused(
            "rectify: LTPD below one unit of the lot",
            &[
                "rectify",
                "--lot-size",
                "50",
                "--process-average",
                "0.1%",
                "--ltpd",
                "0.5%",
            ],
            "means no nonconforming unit in a lot of 50",
        ),
    ];
    run("other commands", &cases);
}

/// A read-only folder refuses the write with a message that names it.
/// Permissions do not bind the superuser, so when the tests run as root
/// (found by trying to write there) this check is skipped, and says so.
#[test]
fn a_read_only_folder_is_named_in_the_refusal() {
    use std::os::unix::fs::PermissionsExt;
    let dir = tempfile::tempdir().unwrap();
    let locked = dir.path().join("locked");
    std::fs::create_dir(&locked).unwrap();
    std::fs::set_permissions(&locked, std::fs::Permissions::from_mode(0o555)).unwrap();
    let probe = locked.join("probe");
    if std::fs::write(&probe, b"").is_ok() {
        eprintln!(
            "running with permissions that do not bind (root): the read-only folder check is skipped"
        );
        return;
    }
    let target = locked.join("plan.yaml");
    let fragment = format!(
        "the folder {} cannot be written to (permission denied)",
        locked.display()
    );
    for args in [
        vec![
            "design",
            "--aql",
            "1%",
            "--rql",
            "6%",
            "--output",
            target.to_str().unwrap(),
        ],
        vec![
            "sheet",
            "plans/tpw-cover-fit.yaml",
            "--output",
            locked.join("fit.pdf").to_str().unwrap(),
        ],
    ] {
        lotsman()
            .args(&args)
            .assert()
            .code(2)
            .stderr(predicates::str::contains(fragment.as_str()));
    }
    assert!(std::fs::read_dir(&locked).unwrap().next().is_none());
}

/// The item-by-item plan for 0.1% against 0.3% (binomial), as `design`
/// records it: 5936 items, whose evaluation costs about a millisecond a
/// quality.
const ITEM_BY_ITEM: &str = "schema: 1
title: Budget suite, item by item
scheme: sequential
model: binomial
producer:
  quality: 0.001
  risk: 0.05
consumer:
  quality: 0.003
  risk: 0.1
plan:
  sequential:
    h_accept: 2.0944749055057312
    h_reject: 2.677777205137267
    slope: 0.00182080593530335
    truncation: 5936
    final_acceptance: 10
  producer_risk: 0.04419079013501153
  consumer_risk: 0.0999886486453762
  solved_by: lotsman 0.1.0
";

/// A double plan at 0.5% against 0.9% in a lot of 10^6, minimising the
/// largest ASN: about a minute of search, not solved yet.
const HEAVY_DOUBLE: &str = "schema: 1
title: Budget suite, double in a large lot
scheme: double
criterion: asn-max
model: hypergeometric
lot_size: 1000000
producer:
  quality: 0.005
  risk: 0.05
consumer:
  quality: 0.009
  risk: 0.1
";

/// A variables plan for two limits with sigma unknown (1% against 5%,
/// n = 57), whose every acceptance probability is a two-dimensional
/// integral of most of a millisecond.
const TWO_LIMITS: &str = "schema: 1
title: Budget suite, two limits
scheme: variables
variables:
  sigma: unknown
  limit: both
  lower: 5.0
  upper: 6.0
model: binomial
producer:
  quality: 0.01
  risk: 0.05
consumer:
  quality: 0.05
  risk: 0.1
plan:
  variables:
    n: 57
    m: 0.024
  producer_risk: 0.049747759734721675
  consumer_risk: 0.0997400112877811
  solved_by: lotsman 0.1.0
";

/// Work beyond the budget (10 s of work or 1 GiB of memory, estimated from
/// the inputs before any starts): every command refuses it at once, in
/// one line naming the limit, the estimate and how to ask for less, and
/// each refusal comes within half a second (timed here, the best of three
/// runs so that a busy machine does not fail the suite; the timings are
/// printed with `--nocapture`). The examples are those that ran for
/// minutes or ran out of memory before the budget (issue 14, item 12).
#[test]
fn work_beyond_the_budget_is_refused_within_half_a_second() {
    let fx = Fixtures::new();
    std::fs::write(fx.path("item-by-item.yaml"), ITEM_BY_ITEM).unwrap();
    std::fs::write(fx.path("heavy-double.yaml"), HEAVY_DOUBLE).unwrap();
    std::fs::write(fx.path("two-limits.yaml"), TWO_LIMITS).unwrap();
    let folder = fx.path("heavy-folder");
    std::fs::create_dir(&folder).unwrap();
    std::fs::write(folder.join("heavy-double.yaml"), HEAVY_DOUBLE).unwrap();
    std::fs::copy("plans/tpw-cover-fit.yaml", folder.join("cover-fit.yaml")).unwrap();
    const TIME: &str = "beyond the work budget of 10 s;";
    let cases = vec![
        refused_fast(
            "item-by-item plan at 100,000 qualities (ran 130 s to an allocator panic)",
            &[
                "evaluate",
                "@item-by-item.yaml",
                "--range",
                "0.01%:1%:100000",
            ],
            "evaluating @item-by-item.yaml would take about",
        ),
        refused_fast(
            "item-by-item plan at 40,000 qualities (ran 100 s, 3.6 GB)",
            &[
                "evaluate",
                "@item-by-item.yaml",
                "--range",
                "0.01%:1%:40000",
                "--format",
                "json",
            ],
            "; ask for at most",
        ),
        refused_fast(
            "the per-stage distribution of 4,000 qualities",
            &[
                "evaluate",
                "@item-by-item.yaml",
                "--range",
                "0.01%:1%:4000",
                "--format",
                "json",
                "--decided-at",
            ],
            "leave out --decided-at",
        ),
        refused_fast(
            "--decided-at outside JSON",
            &["evaluate", "@item-by-item.yaml", "--decided-at"],
            "--decided-at adds the per-stage distribution to the JSON report; give --format json",
        ),
        refused_fast(
            "a wide ten-stage plan given by hand",
            &[
                "evaluate",
                "--model",
                "poisson",
                "--stage",
                "2000:-:410",
                "--stage",
                "4000:-:420",
                "--stage",
                "6000:-:430",
                "--stage",
                "8000:-:440",
                "--stage",
                "10000:-:450",
                "--stage",
                "12000:-:460",
                "--stage",
                "14000:-:470",
                "--stage",
                "16000:-:480",
                "--stage",
                "18000:-:490",
                "--stage",
                "20000:480:481",
                "--range",
                "1%:20%:100",
            ],
            "evaluating the 10-stage plan",
        ),
        refused_fast(
            "variables plan, two limits, sigma unknown, at 100,000 qualities",
            &["evaluate", "@two-limits.yaml", "--range", "1.1%:20%:100000"],
            TIME,
        ),
        refused_fast(
            "double hypergeometric design, lot 10^6, asn-max (about a minute)",
            &[
                "design",
                "--aql",
                "0.5%",
                "--rql",
                "0.9%",
                "--lot-size",
                "1000000",
                "--scheme",
                "double",
                "--criterion",
                "asn-max",
            ],
            "the double plan's search around the single plan n = 3630, c = 25 (hypergeometric model, lot of 1000000, asn-max) would take about",
        ),
        refused_fast(
            "verify of that design's source re-solves it",
            &["verify", "@heavy-double.yaml"],
            "verifying @heavy-double.yaml would take about",
        ),
        refused_fast(
            "sheet of that source audits it",
            &["sheet", "@heavy-double.yaml", "--output", "@heavy.pdf"],
            "printing the sheets of @heavy-double.yaml would take about",
        ),
        refused_fast(
            "a folder with one heavy source is refused whole, naming it",
            &["verify", "@heavy-folder"],
            "verifying 2 plan sources would take about",
        ),
        refused_fast(
            "20 x 20 grid of double plans (ran for minutes)",
            &[
                "tradeoff",
                "--aql",
                "0.1%:2%:20",
                "--rql",
                "0.5%:10%:20",
                "--scheme",
                "double",
            ],
            "solving the 20 x 20 grid of double plans would take about",
        ),
        refused_fast(
            "single plan with its alternatives up to c = 85,000",
            &["design", "--aql", "1%", "--rql", "1.01%"],
            "the single plan and its alternatives (binomial model) would take about",
        ),
        refused_fast(
            "single plan in a lot of 10^8 at 1% against 1.01%",
            &[
                "design",
                "--aql",
                "1%",
                "--rql",
                "1.01%",
                "--lot-size",
                "100000000",
            ],
            TIME,
        ),
        refused_fast(
            "sequential plan in a lot of 10^6 (ran 30 s)",
            &[
                "design",
                "--aql",
                "0.1%",
                "--rql",
                "0.14%",
                "--lot-size",
                "1000000",
                "--scheme",
                "sequential",
            ],
            "the sequential plan's truncation search",
        ),
        refused_fast(
            "multiple plan in a lot of 10^6 (ran 25 s)",
            &[
                "design",
                "--aql",
                "0.2%",
                "--rql",
                "0.4%",
                "--lot-size",
                "1000000",
                "--scheme",
                "multiple",
            ],
            "the 7-stage plan's search",
        ),
        refused_fast(
            "minimum-inspection scan to c = 100,000 in a lot of 10^12 (ran 20 s)",
            &[
                "rectify",
                "--lot-size",
                "1000000000000",
                "--process-average",
                "0.99%",
                "--ltpd",
                "1%",
            ],
            "the scan over acceptance numbers in a lot of 1000000000000 would take about",
        ),
    ];
    let mut timings = Vec::new();
    for case in &cases {
        let args: Vec<String> = case.args.iter().map(|a| fx.expand(a)).collect();
        let best = (0..3)
            .map(|_| {
                // A runaway job is cut at 5 s and counted as slow.
                let started = Instant::now();
                lotsman()
                    .args(&args)
                    .timeout(Duration::from_secs(5))
                    .output()
                    .unwrap();
                started.elapsed()
            })
            .min()
            .unwrap();
        timings.push((case.name, best));
    }
    for (name, took) in &timings {
        eprintln!("{:>8.3} s  {name}", took.as_secs_f64());
    }
    let slow: Vec<_> = timings
        .iter()
        .filter(|(_, took)| *took > Duration::from_millis(500))
        .collect();
    assert!(slow.is_empty(), "refusals slower than 0.5 s: {slow:?}");
    run_in(&fx, "work budget", &cases);
}
