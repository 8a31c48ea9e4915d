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

use crate::common;
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
    /// A note or a report of a file written, on stderr, beside an answer
    /// (never an error line).
    Note,
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
            // A CSV file that is not a ledger (another header).
            ("not-ledger.csv", "plate,thickness_mm\n1,5.9\n".into()),
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

/// Wording of serde, serde_yaml, clap and the operating system that a
/// message must have said in plain words instead.
const LIBRARY_WORDS: [&str; 12] = [
    "invalid type",
    "invalid value:",
    "expected struct",
    "unknown variant",
    "unknown field",
    "missing field",
    "duplicate field",
    "expected u64",
    "os error",
    "No such file or directory",
    "Usage:",
    "For more information",
];

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
            Out::Err | Out::Note => &stderr,
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
        if case.out == Out::Note && stderr.contains("lotsman: error: ") {
            wrong.push("a note came with an error".to_string());
        }
        // Nothing reaches the terminal raw but line ends, and no Rust,
        // serde or system wording reaches a user.
        if [&stdout, &stderr]
            .iter()
            .any(|t| t.chars().any(|ch| ch.is_control() && ch != '\n'))
        {
            wrong.push("a control character was printed raw".to_string());
        }
        if let Some(word) = LIBRARY_WORDS
            .iter()
            .find(|w| stdout.contains(*w) || stderr.contains(*w))
        {
            wrong.push(format!("the library's wording '{word}' reached the user"));
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
        // At 1 against 6 parts per million (n = 1.1 million) the double
        // search runs in about 6 s since issue 19; ten times the sample
        // passes the budget.
        refused_fast("double plan at a tenth of a part per million (n = 11 million)", &["design", "--aql", "1e-7", "--rql", "6e-7", "--scheme", "double"], "the double plan's search around the single plan n = 11134637, c = 3 (binomial model, asn-aql) would take about"),
        refused_fast("multiple plan at parts per million", &["design", "--aql", "1e-6", "--rql", "6e-6", "--scheme", "multiple"], "the 7-stage plan's search around the single plan's sample n = 1113463 (binomial model) would take about"),
        // The binomial plan for these points (c = 937) is designed in
        // about 9 s since issue 19; the Poisson terms cost more.
        refused_fast("sequential plan for close points, Poisson (c = 947)", &["design", "--aql", "1%", "--rql", "1.1%", "--scheme", "sequential", "--model", "poisson"], "the sequential plan's truncation search around the single plan n = 89788, c = 947 (poisson model) would take about"),
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
            "@no-plan.yaml: not solved yet: the source records no plan; solve it with: lotsman design @no-plan.yaml --in-place",
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
            "this file separates its values with ';' (row 1: 'plate;thickness_mm')",
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
fn judge_record_refuses_what_a_ledger_cannot_keep() {
    let rec = |more: &[&'static str]| {
        let mut v = vec![
            "judge",
            "plans/tpw-seal-visual.yaml",
            "--found",
            "0",
            "--lot",
            "L1",
            "--record",
        ];
        v.extend_from_slice(more);
        v
    };
    let cases = [
        refused(
            "a record file that is not a ledger",
            &rec(&["@not-ledger.csv"]),
            "line 1: this is not a lotsman ledger",
        ),
        refused(
            "a date that does not exist",
            &rec(&["@log.csv", "--date", "2024-02-30"]),
            "--date: '2024-02-30' is not a calendar date: month 02 of 2024 has days 01 to 29",
        ),
        refused(
            "a lot identifier a spreadsheet reads as a formula",
            &[
                "judge",
                "plans/tpw-seal-visual.yaml",
                "--found",
                "0",
                "--lot",
                "=SUM(A1)",
                "--record",
                "@log.csv",
            ],
            "starts with '=', which a spreadsheet reads as a formula",
        ),
        refused(
            "a resubmitted lot the ledger does not hold",
            &rec(&["@log.csv", "--resubmitted"]),
            "is marked resubmitted but the ledger does not record it",
        ),
        refused(
            "verify --plan without a ledger",
            &[
                "verify",
                "plans/tpw-seal-visual.yaml",
                "--plan",
                "plans/tpw-seal-visual.yaml",
            ],
            "no ledger was given",
        ),
    ];
    run("judge --record", &cases);
}

#[test]
fn plan_sources_that_are_not_valid_yaml_sources_are_refused() {
    let v = |file: &'static str| -> Vec<&'static str> { vec!["verify", file] };
    let cases = vec![
        reported(
            "malformed YAML",
            &v("@malformed.yaml"),
            2,
            "line 3: a 'key: value' here does not line up with the keys above it: check the indentation of this line",
        ),
        reported(
            "a tab in the indentation",
            &v("@tab.yaml"),
            2,
            "line 2: YAML indents with spaces, not tabs: replace the tab at the start of this line with spaces",
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
            "a plan source is a YAML mapping of keys (schema:, title:, scheme:, model:, producer:, consumer:, ..., each at the start of a line); this file is a list",
        ),
        reported(
            "a sentence",
            &v("@scalar.yaml"),
            2,
            "this file is the text 'just a sentence'; start from a template: lotsman new binomial",
        ),
        reported(
            "unknown key",
            &v("@unknown-key.yaml"),
            2,
            "line 4: 'modell' is not a key of a plan source; did you mean model?",
        ),
        reported(
            "duplicated key",
            &v("@duplicate-key.yaml"),
            2,
            "line 3: title: is given twice, and a key may appear once; keep one",
        ),
        reported(
            "duplicated nested key",
            &v("@duplicate-nested-key.yaml"),
            2,
            "line 7: quality: is given twice under producer, and a key may appear once",
        ),
        reported(
            "schema as text",
            &v("@schema-text.yaml"),
            2,
            "line 1: schema must be a whole number such as 1 (digits only, no thousands separator), not the text 'one'",
        ),
        reported(
            "quality as a list",
            &v("@quality-list.yaml"),
            2,
            "line 6: producer.quality must be a fraction such as 0.01 or a percent such as \"1%\", not a list",
        ),
        reported(
            "lot size as a fraction",
            &v("@lot-fraction.yaml"),
            2,
            "line 5: lot_size must be a whole number such as 3000 (digits only, no thousands separator), not 12.5",
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
            "line 5: lot_size must be a whole number from 0 to 18446744073709551615, not 100000000000000000000",
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
            "line 6: producer.quality = '.nan' is not a fraction",
        ),
        reported(
            "quality .inf",
            &v("@quality-inf.yaml"),
            2,
            "line 9: consumer.quality = '.inf' is not a fraction",
        ),
        reported(
            "quality 1e-400 (rounds to 0)",
            &v("@quality-tiny.yaml"),
            2,
            "line 6: producer.quality = 1e-400 is out of range: it must be a number that double precision can hold",
        ),
        reported(
            "quality '1%%'",
            &v("@quality-percent-percent.yaml"),
            2,
            "producer.quality = '1%%' is not a fraction",
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
            "@missing.yaml: does not exist; give a plan source (FILE.yaml) or a folder that holds some",
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
            "@malformed.yaml: line 3: a 'key: value' here does not line up",
        ),
        refused(
            "sheet of a source with a duplicated key",
            &["sheet", "@duplicate-key.yaml", "--output", "@dup.pdf"],
            "line 3: title: is given twice, and a key may appear once; keep one",
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
            "line 6: producer.quality must be a fraction such as 0.01 or a percent such as \"1%\", not a list",
        ),
        refused_fast(
            "billion laughs over 20000 values in a quality",
            &["design", "@bomb-wide.yaml"],
            "line 9: consumer.quality must be a fraction such as 0.01 or a percent such as \"1%\", not a list",
        ),
        refused_fast(
            "billion laughs in the notes",
            &["evaluate", "@bomb-notes.yaml"],
            "line 3: notes must be text (in quotes if it would otherwise read as a number or a list), not a list",
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
                "--process-average",
                "1%",
                "--lot-size",
                "100",
            ],
            "cost per unit inspected = -1 is out of range: it must be a positive number",
        ),
        refused(
            "tradeoff: process average 0",
            &[
                "tradeoff",
                "--aql",
                "1%,2%",
                "--rql",
                "6%,7%",
                "--cost-per-unit",
                "1",
                "--process-average",
                "0",
                "--lot-size",
                "100",
            ],
            "process average = 0 is out of range",
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
                "--process-average",
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

/// Issue 14: a fixture folder with the shared fixtures and these extra
/// files, each written as given.
fn fixtures_with(extra: &[(&str, String)]) -> Fixtures {
    let fx = Fixtures::new();
    for (name, text) in extra {
        std::fs::write(fx.path(name), text).unwrap();
    }
    fx
}

/// [`BASE`] with `from` replaced by `to`.
fn base_with(from: &str, to: &str) -> String {
    assert!(BASE.contains(from), "{from}");
    BASE.replacen(from, to, 1)
}

/// The readings of the demo lot, `plate,thickness_mm` with a header, with
/// `edit` applied to each data row's reading (its line number, its text).
fn readings_with(edit: impl Fn(usize, &str) -> String) -> String {
    let readings = std::fs::read_to_string("plans/tpw-cover-thickness-readings.csv").unwrap();
    let mut lines = readings.lines();
    let mut out = format!("{}\n", lines.next().unwrap());
    for (i, line) in lines.enumerate() {
        let (plate, value) = line.split_once(',').unwrap();
        out.push_str(&format!("{plate},{}\n", edit(i + 2, value)));
    }
    out
}

/// A note or report on stderr beside an answer, exit code 0.
fn noted(name: &'static str, args: &[&'static str], fragment: &'static str) -> Case {
    Case {
        out: Out::Note,
        ..reported(name, args, 0, fragment)
    }
}

/// Issue 14, item 14: what a plan source must hold, said in plain words
/// with its line; a file that cannot be read, in the system's place; a
/// source without a plan, "not solved yet".
#[test]
fn sources_and_files_are_refused_in_plain_words() {
    let stages = |stage: &str| {
        format!(
            "{BASE}plan:\n  stages:\n  - n: 50\n    accept: 1\n    reject: 2\n{stage}  producer_risk: 0.1\n  consumer_risk: 0.1\n  solved_by: hand\n"
        )
    };
    let fx = fixtures_with(&[
        ("number.yaml", "42\n".into()),
        (
            "lot-thousands.yaml",
            base_with("model: binomial", "model: hypergeometric\nlot_size: 3,000"),
        ),
        ("scheme-capital.yaml", base_with("scheme: single", "scheme: Single")),
        ("model-typo.yaml", base_with("model: binomial", "model: binomal")),
        (
            "no-producer.yaml",
            base_with("producer:\n  quality: 0.01\n  risk: 0.05\n", ""),
        ),
        ("no-alpha.yaml", base_with("  risk: 0.05\n", "")),
        ("nested-tab.yaml", base_with("  quality: 0.06", "\tquality: 0.06")),
        ("control.yaml", base_with("title: Refusal suite", "title: \"a\u{1}b\"")),
        ("two-documents.yaml", format!("{BASE}---\n{BASE}")),
        ("open-quote.yaml", base_with("title: Refusal suite", "title: \"Refusal")),
        (
            "stage-text.yaml",
            stages("  - n: ten\n    accept: 1\n    reject: 2\n"),
        ),
        (
            "stage-key-typo.yaml",
            stages("  - n: 100\n    acept: 2\n    reject: 3\n"),
        ),
        (
            "producer-number.yaml",
            base_with("producer:\n  quality: 0.01\n  risk: 0.05", "producer: 0.01"),
        ),
        (
            "variables-unsolved.yaml",
            "schema: 1\ntitle: Unsolved\nscheme: variables\nvariables:\n  sigma: unknown\n  limit: lower\n  lower: 5.7\nmodel: hypergeometric\nlot_size: 600\nproducer:\n  quality: 0.01\n  risk: 0.05\nconsumer:\n  quality: 0.06\n  risk: 0.1\n".into(),
        ),
    ]);
    let v = |file: &'static str| -> Vec<&'static str> { vec!["verify", file] };
    let cases = vec![
        reported(
            "a number instead of a mapping",
            &v("@number.yaml"),
            2,
            "a plan source is a YAML mapping of keys (schema:, title:, scheme:, model:, producer:, consumer:, ..., each at the start of a line); this file is 42",
        ),
        reported(
            "a lot size with a thousands separator",
            &v("@lot-thousands.yaml"),
            2,
            "line 5: lot_size must be a whole number such as 3000 (digits only, no thousands separator), not the text '3,000'",
        ),
        reported(
            "a scheme in capitals (did you mean)",
            &v("@scheme-capital.yaml"),
            2,
            "line 3: scheme must be one of single, double, multiple, sequential, variables, rectifying, standard, not 'Single'; did you mean single?",
        ),
        reported(
            "a misspelt model (did you mean)",
            &v("@model-typo.yaml"),
            2,
            "line 4: model must be one of binomial, hypergeometric, poisson, not 'binomal'; did you mean binomial?",
        ),
        reported(
            "a missing section",
            &v("@no-producer.yaml"),
            2,
            "the source has no producer: line; add producer: with quality: (the AQL) and risk: (alpha) indented below it",
        ),
        reported(
            "a missing key in a section",
            &v("@no-alpha.yaml"),
            2,
            "producer has no risk: (alpha, e.g. risk: 0.05); add it, indented below producer:",
        ),
        reported(
            "a tab indenting a nested key",
            &v("@nested-tab.yaml"),
            2,
            "line 9: YAML indents with spaces, not tabs",
        ),
        reported(
            "a control character in a value",
            &v("@control.yaml"),
            2,
            "line 2: the text holds a control character, which a plan source may not",
        ),
        reported(
            "two YAML documents",
            &v("@two-documents.yaml"),
            2,
            "the file holds more than one YAML document (a line '---' starts each); a plan source is one document",
        ),
        reported(
            "a quote never closed",
            &v("@open-quote.yaml"),
            2,
            "the file ends inside a quoted text or a bracket",
        ),
        reported(
            "a recorded stage counted from one",
            &v("@stage-text.yaml"),
            2,
            "line 16: stage 2 n of the recorded plan must be a whole number such as 50 (digits only, no thousands separator), not the text 'ten'",
        ),
        reported(
            "a misspelt key in a recorded stage",
            &v("@stage-key-typo.yaml"),
            2,
            "'acept' is not a key under stage 2 of the recorded plan; did you mean accept?",
        ),
        reported(
            "a number where a section belongs",
            &v("@producer-number.yaml"),
            2,
            "line 5: producer must be a mapping of quality: and risk:, each on its own line, indented below producer:, not 0.01",
        ),
        refused(
            "a file that does not exist",
            &["design", "@nothing.yaml"],
            "@nothing.yaml does not exist",
        ),
        refused(
            "a folder given as a source",
            &["design", "@no-sources"],
            "@no-sources is a folder, not a file",
        ),
        refused(
            "measurements that do not exist",
            &[
                "judge",
                "plans/tpw-cover-thickness.yaml",
                "--measurements",
                "@nothing.csv",
            ],
            "@nothing.csv does not exist",
        ),
        reported(
            "a sheet that does not exist",
            &[
                "verify",
                "plans/tpw-cover-fit.yaml",
                "--sheet",
                "@nothing.pdf",
            ],
            2,
            "@nothing.pdf does not exist",
        ),
        reported(
            "a sheet that is not a PDF",
            &["verify", "plans/tpw-cover-fit.yaml", "--sheet", "@a-file"],
            2,
            "@a-file: not a PDF that can be read",
        ),
        reported(
            "not solved yet, under verify (invalid, not a mismatch)",
            &v("@no-plan.yaml"),
            2,
            "invalid   @no-plan.yaml: not solved yet: the source records no plan; solve it with: lotsman design @no-plan.yaml --in-place",
        ),
        refused(
            "not solved yet, under judge",
            &["judge", "@no-plan.yaml", "--found", "0"],
            "@no-plan.yaml: not solved yet: the source records no plan; solve it with: lotsman design @no-plan.yaml --in-place",
        ),
        refused(
            "not solved yet, under sheet",
            &["sheet", "@no-plan.yaml", "--output", "@no-plan.pdf"],
            "@no-plan.yaml: not solved yet",
        ),
        refused(
            "a variables source not solved yet",
            &[
                "judge",
                "@variables-unsolved.yaml",
                "--measurements",
                "@bom.csv",
                "--column",
                "thickness_mm",
            ],
            "@variables-unsolved.yaml: not solved yet: the source records no plan; solve it with: lotsman design @variables-unsolved.yaml --in-place",
        ),
    ];
    run_in(&fx, "plain words", &cases);
}

/// Issue 14, items 14 and 15: argument errors are one line like every
/// refusal, control characters in arguments are shown escaped, and one
/// name per idea across commands, in any case.
#[test]
fn arguments_are_refused_in_one_line_and_named_alike() {
    let cases = vec![
        refused(
            "an unknown flag",
            &["design", "--aql", "1%", "--rql", "6%", "--frobnicate"],
            "unexpected argument '--frobnicate' found; tip: a similar argument exists: '--format'; the options: lotsman design --help",
        ),
        refused(
            "a value not among the choices",
            &["sheet", "plans/tpw-cover-fit.yaml", "--paper", "A5"],
            "invalid value 'A5' for '--paper <PAPER>'; [possible values: a4, letter]; the options: lotsman sheet --help",
        ),
        refused(
            "a required flag missing",
            &["design", "--aql", "1%"],
            "the following required arguments were not provided: --rql <P2>; the options: lotsman design --help",
        ),
        refused(
            "no command",
            &[],
            "give a command: design, evaluate, compare, verify, judge, sheet, tradeoff, new, demo, rectify, standard, draw, status, history, serve; what each does: lotsman --help",
        ),
        refused(
            "--in-place with --output",
            &[
                "design",
                "@source.yaml",
                "--in-place",
                "--output",
                "@other.yaml",
            ],
            "the argument '--in-place' cannot be used with '--output <FILE.yaml>'",
        ),
        refused(
            "--in-place without a source",
            &["design", "--aql", "1%", "--rql", "6%", "--in-place"],
            "--in-place re-solves a plan source and replaces it: name the source",
        ),
        refused(
            "a control character in an argument",
            &["design", "--aql", "1\u{1b}[31m%", "--rql", "6%"],
            "--aql = '1\\x1B[31m%' is not a fraction (0.01) or a percent (1%)",
        ),
        refused(
            "a control character in an unknown flag",
            &["design", "--a\u{7}ql", "1%"],
            "unexpected argument '--aql' found",
        ),
        refused(
            "design --output into a PDF",
            &["design", "--aql", "1%", "--rql", "6%", "--output", "@x.pdf"],
            "--output @x.pdf would hold the plan source, which is YAML, and its name does not end in .yaml or .yml; write it with: lotsman design --aql 1% --rql 6% --output @x.yaml, then print its sheet with: lotsman sheet @x.yaml",
        ),
        refused(
            "design --output into a JSON file",
            &[
                "design",
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--format",
                "json",
                "--output=@x.json",
            ],
            "write it with: lotsman design --aql 1% --rql 6% --format json --output @x.yaml",
        ),
        refused(
            "--lot-size beside a source that gives one",
            &["evaluate", "plans/tpw-cover-fit.yaml", "--lot-size", "3000"],
            "--lot-size 3000 is for a source that gives no lot size, and this one gives lot_size: 400",
        ),
        reported(
            "--lot-size beside a source that gives none: accepted",
            &[
                "evaluate",
                "plans/tpw-seal-visual.yaml",
                "--lot-size",
                "3000",
                "--at",
                "1%",
            ],
            0,
            "Plan 166:3:4 (N:AC:RE), binomial model, lot of 3000 units",
        ),
        noted(
            "--paper in capitals: accepted",
            &[
                "sheet",
                "plans/tpw-cover-fit.yaml",
                "--paper",
                "A4",
                "--output",
                "@a4.pdf",
            ],
            "lotsman: wrote sheet @a4.pdf",
        ),
        reported(
            "--model in capitals: accepted",
            &["design", "--aql", "1%", "--rql", "6%", "--model", "POISSON"],
            0,
            "single plan, poisson model",
        ),
        reported(
            "new with a capital: accepted",
            &["new", "Binomial"],
            0,
            "# lotsman plan source: single sampling, binomial model.",
        ),
        reported(
            "judge --format table, as every command",
            &[
                "judge",
                "plans/tpw-seal-visual.yaml",
                "--found",
                "1",
                "--format",
                "table",
            ],
            0,
            "ACCEPT the lot",
        ),
        reported(
            "judge --format text, the earlier name: still read",
            &[
                "judge",
                "plans/tpw-seal-visual.yaml",
                "--found",
                "1",
                "--format",
                "text",
            ],
            0,
            "ACCEPT the lot",
        ),
        reported(
            "tradeoff --process-average, as rectify names it",
            &[
                "tradeoff",
                "--aql",
                "1%,2%",
                "--rql",
                "6%,7%",
                "--lot-size",
                "500",
                "--cost-per-unit",
                "1",
                "--process-average",
                "1%",
            ],
            0,
            "Expected inspection cost per lot at the process average 1.000%",
        ),
        reported(
            "tradeoff --process-quality, the earlier name: still read",
            &[
                "tradeoff",
                "--aql",
                "1%,2%",
                "--rql",
                "6%,7%",
                "--lot-size",
                "500",
                "--cost-per-unit",
                "1",
                "--process-quality",
                "1%",
            ],
            0,
            "Expected inspection cost per lot at the process average 1.000%",
        ),
    ];
    run("arguments", &cases);
}

/// Issue 14, item 6: a measurements file that would be misread is refused
/// with its row and the fix, never decided on.
#[test]
fn measurements_that_would_be_misread_are_refused() {
    let fx = fixtures_with(&[
        (
            "commas-column.csv",
            readings_with(|_, v| v.replace('.', ",")),
        ),
        (
            "one-comma-column.csv",
            readings_with(|line, v| {
                if line == 10 {
                    v.replace('.', ",")
                } else {
                    v.to_string()
                }
            }),
        ),
        (
            "quoted-commas.csv",
            readings_with(|_, v| format!("\"{}\"", v.replace('.', ","))),
        ),
        ("quoted.csv", readings_with(|_, v| format!("\"{v}\""))),
        (
            "tabs.csv",
            readings_with(|_, v| v.to_string()).replace(',', "\t"),
        ),
        (
            "blank-between.csv",
            readings_with(|line, v| {
                if line == 6 {
                    format!("{v}\n")
                } else {
                    v.to_string()
                }
            }),
        ),
    ]);
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
    let cases = vec![
        refused(
            "decimal commas under --column",
            &mc("@commas-column.csv"),
            "row 2 of the measurements has 3 cells and the header row 2 ('1,5,834'): a comma inside a value (a decimal comma, as in 9,950) splits it in two; save the file with decimal points (9.950), or put each such value in quotes",
        ),
        refused(
            "one decimal comma under --column",
            &mc("@one-comma-column.csv"),
            "row 10 of the measurements has 3 cells and the header row 2",
        ),
        refused(
            "quoted decimal commas under --column",
            &mc("@quoted-commas.csv"),
            "measurement in row 2 = '5,834' is not a number written with a decimal point",
        ),
        refused(
            "semicolons under --column",
            &mc("@semicolons.csv"),
            "this file separates its values with ';' (row 1: 'plate;thickness_mm'), and a measurements file is comma-separated with decimal points",
        ),
        refused(
            "tabs under --column",
            &mc("@tabs.csv"),
            "this file separates its values with tabs (row 1: 'plate\\tthickness_mm')",
        ),
        refused(
            "tabs without --column",
            &[
                "judge",
                "plans/tpw-cover-thickness.yaml",
                "--measurements",
                "@tabs.csv",
            ],
            "this file separates its values with tabs",
        ),
        refused(
            "a blank line between readings under --column",
            &mc("@blank-between.csv"),
            "row 7 of the measurements is blank",
        ),
        reported(
            "quoted readings: accepted",
            &mc("@quoted.csv"),
            0,
            "ACCEPT the lot: Q_L = 2.8684 >= k = 1.901",
        ),
    ];
    run_in(&fx, "measurements", &cases);
}

/// Issue 14, item 5: a bare fraction above a fifth, for a model of
/// fractions nonconforming, gets a note saying how it was read; the plan
/// is still given.
#[test]
fn bare_fractions_above_a_fifth_get_a_note_and_the_answer() {
    let cases = vec![
        noted(
            "a bare AQL",
            &["design", "--aql", "0.5", "--rql", "0.8"],
            "lotsman: note: --aql 0.5 was read as 50%; for 0.5 percent write 0.5%",
        ),
        noted(
            "a bare RQL",
            &["design", "--aql", "0.5%", "--rql", "0.3"],
            "lotsman: note: --rql 0.3 was read as 30%; for 0.3 percent write 0.3%",
        ),
        noted(
            "a bare quality to evaluate at",
            &["evaluate", "--n", "20", "--c", "1", "--at", "1%,0.3"],
            "lotsman: note: --at 1%,0.3 was read as 30%; for percents write 1%,0.3%",
        ),
        noted(
            "a bare range",
            &["evaluate", "--n", "20", "--c", "1", "--range", "0.25:0.5:3"],
            "lotsman: note: --range 0.25:0.5:3 was read as 25% to 50%; for percents write 0.25%:0.5%:3",
        ),
        noted(
            "a bare quality for a source",
            &["evaluate", "plans/tpw-seal-visual.yaml", "--at", "0.4"],
            "lotsman: note: --at 0.4 was read as 40%",
        ),
        noted(
            "a bare grid axis",
            &["tradeoff", "--aql", "0.25,0.3", "--rql", "0.5,0.6"],
            "lotsman: note: --aql 0.25,0.3 was read as 25%, 30%; for percents write 0.25%,0.3%",
        ),
        noted(
            "a bare process average (tradeoff)",
            &[
                "tradeoff",
                "--aql",
                "1%,2%",
                "--rql",
                "6%,7%",
                "--lot-size",
                "500",
                "--cost-per-unit",
                "1",
                "--process-average",
                "0.3",
            ],
            "lotsman: note: --process-average 0.3 was read as 30%",
        ),
        noted(
            "a bare process average (rectify)",
            &[
                "rectify",
                "--lot-size",
                "500",
                "--process-average",
                "0.3",
                "--aoql",
                "50%",
            ],
            "lotsman: note: --process-average 0.3 was read as 30%",
        ),
        noted(
            "a bare LTPD",
            &[
                "rectify",
                "--lot-size",
                "500",
                "--process-average",
                "0.1%",
                "--ltpd",
                "0.25",
            ],
            "lotsman: note: --ltpd 0.25 was read as 25%",
        ),
        noted(
            "a bare AOQL",
            &[
                "rectify",
                "--lot-size",
                "500",
                "--process-average",
                "0.1%",
                "--aoql",
                "0.3",
            ],
            "lotsman: note: --aoql 0.3 was read as 30%",
        ),
    ];
    run("bare fractions", &cases);
    // Rates per unit, percents and small fractions get none.
    for args in [
        vec![
            "design", "--aql", "0.5", "--rql", "0.8", "--model", "poisson",
        ],
        vec!["evaluate", "plans/tpw-housing-finish.yaml", "--at", "0.5"],
        vec!["design", "--aql", "0.5%", "--rql", "0.8%"],
        vec!["design", "--aql", "0.01", "--rql", "0.06"],
    ] {
        let out = lotsman().args(&args).output().unwrap();
        assert_eq!(out.status.code(), Some(0), "{args:?}");
        assert!(
            out.stderr.is_empty(),
            "{args:?}: {}",
            String::from_utf8_lossy(&out.stderr)
        );
    }
}

/// The commands a message suggests: each `lotsman ...` after the message's
/// own `lotsman: ` prefix, up to the end of its clause (`;`, `)`, `, ` or
/// the end of the line, outside quotes), as a shell would read it.
fn suggested_commands(message: &str) -> Vec<String> {
    let mut found = Vec::new();
    let mut rest = message;
    while let Some(at) = rest.find("lotsman ") {
        let tail = &rest[at..];
        let mut end = tail.len();
        // Outside quotes, in '...' (no escapes) or in $'...' (backslash
        // escapes).
        #[derive(PartialEq)]
        enum Quote {
            None,
            Plain,
            Ansi,
        }
        let mut quote = Quote::None;
        let chars: Vec<(usize, char)> = tail.char_indices().collect();
        let mut k = 0;
        while k < chars.len() {
            let (i, ch) = chars[k];
            let next = chars.get(k + 1).map(|&(_, c)| c);
            match (&quote, ch) {
                (Quote::None, '\\') | (Quote::Ansi, '\\') => k += 1,
                (Quote::None, '$') if next == Some('\'') => {
                    quote = Quote::Ansi;
                    k += 1;
                }
                (Quote::None, '\'') => quote = Quote::Plain,
                (Quote::Plain | Quote::Ansi, '\'') => quote = Quote::None,
                (Quote::None, ';' | ')' | '\n') => {
                    end = i;
                    break;
                }
                (Quote::None, ',') if next == Some(' ') => {
                    end = i;
                    break;
                }
                _ => {}
            }
            k += 1;
        }
        found.push(tail[..end].trim_end().to_string());
        rest = &tail[end..];
    }
    found
}

/// Runs `command` (a line that starts with `lotsman `) through the shell
/// in `dir`, with this build's binary as `lotsman`.
fn run_suggested(command: &str, dir: &std::path::Path) -> std::process::Output {
    let binary = assert_cmd::cargo::cargo_bin("lotsman");
    std::process::Command::new("bash")
        .arg("-c")
        .arg(format!(
            "lotsman() {{ '{}' \"$@\"; }}; {command}",
            binary.display()
        ))
        .current_dir(dir)
        .output()
        .unwrap()
}

/// Issue 14, item 10: every command a refusal suggests works when
/// followed as written, and after it the refused command succeeds.
#[test]
fn advice_works_when_followed_as_written() {
    let dir = tempfile::tempdir().unwrap();
    let d = dir.path();
    let fit = std::fs::read_to_string("plans/tpw-cover-fit.yaml").unwrap();
    // A folder and a file name with a space and a quote: the advice must
    // quote them for the shell.
    let folder = d.join("supplier's plans");
    std::fs::create_dir(&folder).unwrap();
    let unsolved = folder.join("cover fit.yaml");
    std::fs::write(&unsolved, BASE).unwrap();
    let unsolved_too = folder.join("seal.yaml");
    std::fs::write(&unsolved_too, BASE).unwrap();
    let edited = folder.join("edited.yaml");
    std::fs::write(&edited, fit.replace("  - n: 62\n", "  - n: 50\n")).unwrap();
    let source = folder.join("source.yaml");
    std::fs::write(&source, &fit).unwrap();
    let empty = folder.join("empty.yaml");
    std::fs::write(&empty, "").unwrap();
    let p = |path: &std::path::Path| path.to_str().unwrap().to_string();
    // (the refused command, where its message is, the command to succeed
    // after the advice is followed)
    let cases: Vec<(Vec<String>, Out, Option<Vec<String>>)> = vec![
        (
            vec!["evaluate".into(), p(&unsolved)],
            Out::Err,
            Some(vec!["evaluate".into(), p(&unsolved)]),
        ),
        (
            vec!["verify".into(), p(&unsolved_too)],
            Out::Std,
            Some(vec!["verify".into(), p(&unsolved_too)]),
        ),
        (
            vec!["sheet".into(), p(&edited)],
            Out::Err,
            Some(vec!["sheet".into(), p(&edited)]),
        ),
        (
            vec!["design".into(), p(&source), "--output".into(), p(&source)],
            Out::Err,
            Some(vec!["verify".into(), p(&source)]),
        ),
        (vec!["design".into(), p(&empty)], Out::Err, None),
        (
            vec![
                "design".into(),
                "--aql".into(),
                "1%".into(),
                "--rql".into(),
                "6%".into(),
                "--output".into(),
                p(&folder.join("plan.pdf")),
            ],
            Out::Err,
            Some(vec!["verify".into(), p(&folder.join("plan.yaml"))]),
        ),
        (
            vec!["sheet".into(), p(&source), "--paper".into(), "A5".into()],
            Out::Err,
            None,
        ),
        (vec![], Out::Err, None),
    ];
    let mut count = 0;
    for (args, out, then) in cases {
        let refused = lotsman().args(&args).current_dir(d).output().unwrap();
        assert_ne!(refused.status.code(), Some(0), "{args:?} was not refused");
        let message = String::from_utf8_lossy(match out {
            Out::Std => &refused.stdout,
            _ => &refused.stderr,
        })
        .to_string();
        let commands = suggested_commands(message.trim_start_matches("lotsman: error: "));
        assert!(!commands.is_empty(), "{args:?}: no command in {message}");
        for command in commands {
            assert!(
                !command
                    .split_whitespace()
                    .any(|w| w.contains("FILE") || w.contains("NEW")),
                "{command}: a placeholder where the file is known"
            );
            let ran = run_suggested(&command, d);
            assert!(
                ran.status.success(),
                "{args:?} suggested `{command}`, which failed: {}",
                String::from_utf8_lossy(&ran.stderr)
            );
            count += 1;
        }
        if let Some(then) = then {
            let after = lotsman().args(&then).current_dir(d).output().unwrap();
            assert!(
                after.status.success(),
                "{then:?} after following the advice: {}{}",
                String::from_utf8_lossy(&after.stdout),
                String::from_utf8_lossy(&after.stderr)
            );
        }
    }
    eprintln!("advice: {count} suggested commands run");
    // The re-solved sources are the tool's own, and verify confirms them.
    lotsman()
        .arg("verify")
        .arg(&folder)
        .assert()
        .code(2)
        .stdout(predicates::str::contains("5 match, 0 mismatch, 1 invalid"));
}

/// Issue 14, item 15: a report that cannot be written (a full device, a
/// reader that went away) is exit code 2 with a plain message, help
/// included.
#[test]
fn output_that_cannot_be_written_is_exit_2_with_a_plain_message() {
    let binary = assert_cmd::cargo::cargo_bin("lotsman");
    let full = std::path::Path::new("/dev/full");
    if full.exists() {
        for args in [
            vec!["design", "--aql", "1%", "--rql", "6%"],
            vec!["--help"],
            vec!["verify", "plans/tpw-cover-fit.yaml"],
        ] {
            let out = std::process::Command::new(&binary)
                .args(&args)
                .stdout(std::fs::OpenOptions::new().write(true).open(full).unwrap())
                .output()
                .unwrap();
            assert_eq!(out.status.code(), Some(2), "{args:?}");
            assert_eq!(
                String::from_utf8_lossy(&out.stderr),
                "lotsman: error: standard output cannot be written: the disk is full\n",
                "{args:?}"
            );
        }
    } else {
        eprintln!("no /dev/full on this system: the full-device check is skipped");
    }
    // A pipe whose reader is gone before the first byte.
    let (reader, writer) = std::io::pipe().unwrap();
    drop(reader);
    let out = std::process::Command::new(&binary)
        .args(["design", "--aql", "1%", "--rql", "6%"])
        .stdout(writer)
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2));
    assert_eq!(
        String::from_utf8_lossy(&out.stderr),
        "lotsman: error: standard output was closed by the program reading it\n"
    );
}

/// Issue 15: a stderr that cannot be written (a reader that went away, a
/// full device) loses the lines meant for it, and nothing else: a refusal
/// still exits 2, a note leaves the report on stdout, a sheet is still
/// written and the run exits 0. No run panics (exit code 101).
#[test]
fn a_stderr_that_cannot_be_written_changes_no_outcome() {
    let binary = assert_cmd::cargo::cargo_bin("lotsman");
    let dir = tempfile::tempdir().unwrap();
    let sheet = dir.path().join("fit.pdf");
    for (what, full) in [
        ("a pipe whose reader is gone", false),
        ("a full device", true),
    ] {
        if unwritable_stderr(full).is_none() {
            eprintln!("no /dev/full on this system: the full-device check is skipped");
            continue;
        }
        let run = |args: &[&std::ffi::OsStr]| {
            std::process::Command::new(&binary)
                .args(args)
                .stderr(unwritable_stderr(full).unwrap())
                .output()
                .unwrap()
        };
        // A refusal: one line on stderr, lost.
        let out = run(&["new".as_ref(), "nosuch".as_ref()]);
        assert_eq!(out.status.code(), Some(2), "refusal, stderr {what}");
        assert!(out.stdout.is_empty(), "refusal, stderr {what}");
        // A note on a bare fraction beside the report.
        let out = run(&["design", "--aql", "0.5", "--rql", "0.9"].map(std::ffi::OsStr::new));
        assert_eq!(out.status.code(), Some(0), "note, stderr {what}");
        assert!(
            String::from_utf8_lossy(&out.stdout).contains("PLAN  n = 11, c = 8"),
            "note, stderr {what}"
        );
        // A sheet, and the line that says where it went.
        let _ = std::fs::remove_file(&sheet);
        let out = run(&[
            "sheet".as_ref(),
            "plans/tpw-cover-fit.yaml".as_ref(),
            "--output".as_ref(),
            sheet.as_os_str(),
        ]);
        assert_eq!(out.status.code(), Some(0), "sheet, stderr {what}");
        assert!(sheet.exists(), "sheet, stderr {what}");
    }
}

/// A stderr that cannot be written: the full device (where there is one),
/// or a pipe whose reader is gone.
fn unwritable_stderr(full: bool) -> Option<std::process::Stdio> {
    if full {
        let device = std::fs::OpenOptions::new().write(true).open("/dev/full");
        return device.ok().map(Into::into);
    }
    let (reader, writer) = std::io::pipe().unwrap();
    drop(reader);
    Some(writer.into())
}

/// Issue 14, item 10: `design FILE --in-place` re-solves the source and
/// replaces it; the file is the tool's own source afterwards.
#[test]
fn design_in_place_replaces_the_source_with_the_solved_one() {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("cover.yaml");
    let fit = std::fs::read_to_string("plans/tpw-cover-fit.yaml").unwrap();
    std::fs::write(&path, fit.replace("  - n: 62\n", "  - n: 50\n")).unwrap();
    lotsman()
        .arg("design")
        .arg(&path)
        .arg("--in-place")
        .assert()
        .success()
        .stderr(format!("lotsman: re-solved {} in place\n", path.display()));
    assert_eq!(std::fs::read_to_string(&path).unwrap(), fit);
    // No temporary file is left beside it.
    let names: Vec<_> = std::fs::read_dir(dir.path()).unwrap().collect();
    assert_eq!(names.len(), 1);
}

/// Issue 14, item 14: control characters from file names, YAML values, CSV
/// cells and arguments are shown escaped, never sent to the terminal raw
/// (the runner fails any case that prints one).
#[test]
fn control_characters_are_shown_escaped() {
    let fx = fixtures_with(&[
        (
            "escape-title.yaml",
            base_with("title: Refusal suite", "title: \"Cover \\e[2J fit\""),
        ),
        (
            "escape-cell.csv",
            readings_with(|line, v| {
                if line == 3 {
                    format!("{v}\u{1b}[31m")
                } else {
                    v.to_string()
                }
            }),
        ),
    ]);
    let cases = vec![
        reported(
            "an escape sequence in a title",
            &["design", "@escape-title.yaml"],
            0,
            "Cover \\x1B[2J fit",
        ),
        refused(
            "an escape sequence in a CSV cell",
            &[
                "judge",
                "plans/tpw-cover-thickness.yaml",
                "--measurements",
                "@escape-cell.csv",
                "--column",
                "thickness_mm",
            ],
            "measurement in row 3 = '5.885\\x1B[31m' is not a number",
        ),
        refused(
            "an escape sequence in a file name",
            &["design", "@missing\u{1b}[2J.yaml"],
            "missing\\x1B[2J.yaml does not exist",
        ),
        reported(
            "an escape sequence in a file name, in a batch",
            &["verify", "@gone\u{1b}]0;title\u{7}.yaml"],
            2,
            "gone\\x1B]0;title\\x07.yaml: does not exist",
        ),
        refused(
            "a carriage return in an argument",
            &["evaluate", "--n", "20", "--c", "1", "--at", "1%\rREWRITTEN"],
            "--at = '1%\\rREWRITTEN' is not a fraction",
        ),
        refused(
            "a right-to-left override in an argument",
            &["new", "double\u{202e}"],
            "template kind = 'double\\u202E' is not one of",
        ),
    ];
    run_in(&fx, "control characters", &cases);
}

/// Judge and evaluate on a source that no longer verifies (issue 14,
/// item 7): a recorded plan edited by hand, which a re-solve and the
/// recorded risk points no longer confirm, is refused naming the field and
/// both values, as `sheet` refuses it; in a batch it is that source's
/// failure. `--accept-recorded` is the way to use it anyway (tested in
/// tests/audit.rs).
#[test]
fn judge_and_evaluate_on_a_source_that_no_longer_verifies_are_refused() {
    let fx = Fixtures::new();
    let seal = std::fs::read_to_string("plans/tpw-seal-visual.yaml").unwrap();
    let cover = std::fs::read_to_string("plans/tpw-cover-thickness.yaml").unwrap();
    std::fs::write(
        fx.path("n-edited.yaml"),
        seal.replacen("n: 166", "n: 150", 1),
    )
    .unwrap();
    std::fs::write(
        fx.path("k-edited.yaml"),
        cover.replacen("k: 1.901", "k: 1.7", 1),
    )
    .unwrap();
    std::fs::create_dir(fx.path("folder")).unwrap();
    std::fs::write(fx.path("folder/a.yaml"), &seal).unwrap();
    std::fs::write(
        fx.path("folder/b.yaml"),
        seal.replacen("n: 166", "n: 150", 1),
    )
    .unwrap();
    let cases = vec![
        refused(
            "judge, a single plan with its n edited",
            &["judge", "@n-edited.yaml", "--found", "2"],
            "recorded 150, re-solved 166",
        ),
        refused(
            "judge, the advice names the way out",
            &["judge", "@n-edited.yaml", "--found", "2"],
            "or use the plan as recorded with --accept-recorded",
        ),
        refused(
            "judge, a variables plan with its k edited",
            &[
                "judge",
                "@k-edited.yaml",
                "--measurements",
                "plans/tpw-cover-thickness-readings.csv",
                "--column",
                "thickness_mm",
            ],
            "plan.variables.k: recorded 1.7, re-solved 1.901",
        ),
        refused(
            "evaluate, a single plan with its n edited",
            &["evaluate", "@n-edited.yaml"],
            "recorded 150, re-solved 166",
        ),
        refused(
            "evaluate, a variables plan with its k edited",
            &["evaluate", "@k-edited.yaml", "--format", "json"],
            "plan.variables.k: recorded 1.7, re-solved 1.901",
        ),
        reported(
            "evaluate, a folder: the edited source is that source's failure",
            &["evaluate", "@folder"],
            2,
            "1 evaluated, 1 invalid",
        ),
        reported(
            "evaluate, a folder: the failure names the field",
            &["evaluate", "@folder", "--at", "1%"],
            2,
            "recorded 150, re-solved 166",
        ),
    ];
    run_in(&fx, "judge on a source that no longer verifies", &cases);
}

/// A forged sheet (issue 14, item 9): `verify --sheet` prints the sheet
/// again from the source and compares the bytes, so neither a PDF made by
/// hand that carries the source's hash nor another plan's real sheet with
/// its subject swapped passes; each is a mismatch (exit 1) that says the
/// sheet does not come from this source and names the version the sheet
/// claims. A PDF that is no lotsman sheet at all is invalid (exit 2).
#[test]
fn forged_sheets_are_caught_by_verify() {
    let fx = Fixtures::new();
    let fit = "plans/tpw-cover-fit.yaml";
    let hash = lotsman::source_hash(&std::fs::read_to_string(fit).unwrap());
    std::fs::write(
        fx.path("hand-made.pdf"),
        common::hand_made_sheet(&hash, false),
    )
    .unwrap();
    std::fs::write(
        fx.path("hand-made-letter.pdf"),
        common::hand_made_sheet(&hash, true),
    )
    .unwrap();
    let seal = fx.path("seal.pdf");
    lotsman()
        .args(["sheet", "plans/tpw-seal-visual.yaml", "--output"])
        .arg(&seal)
        .assert()
        .success();
    let subject = format!("{}{hash}", lotsman::HASH_PREFIX);
    let swapped = common::with_info(&std::fs::read(&seal).unwrap(), "Subject", &subject);
    std::fs::write(fx.path("swapped.pdf"), swapped).unwrap();
    std::fs::write(fx.path("not-a-sheet.pdf"), b"%PDF-1.7\nnothing here\n").unwrap();
    let claim = "the sheet does not come from this source (or this tool version)";
    let cases = vec![
        reported(
            "a hand-made PDF carrying the source's hash",
            &["verify", fit, "--sheet", "@hand-made.pdf"],
            1,
            claim,
        ),
        reported(
            "a hand-made Letter PDF carrying the source's hash",
            &["verify", fit, "--sheet", "@hand-made-letter.pdf"],
            1,
            claim,
        ),
        reported(
            "the verdict names the version the forgery claims",
            &["verify", fit, "--sheet", "@hand-made.pdf"],
            1,
            "the sheet says it was made by lotsman",
        ),
        reported(
            "another plan's sheet with its subject swapped",
            &["verify", fit, "--sheet", "@swapped.pdf"],
            1,
            claim,
        ),
        reported(
            "a file that is no PDF",
            &["verify", fit, "--sheet", "@not-a-sheet.pdf"],
            2,
            "not a PDF that can be read",
        ),
    ];
    run_in(&fx, "forged sheet", &cases);
}

/// The document fields `design` takes for the sheet (issue 14, item 16):
/// a date that is no date of the calendar, an empty text or one with a
/// control character is refused before any work, naming the flag.
#[test]
fn design_refuses_document_fields_it_cannot_record() {
    let cases = vec![
        refused_fast(
            "a date that is no date",
            &[
                "design",
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--date",
                "2026-02-30",
            ],
            "--date = '2026-02-30' is not a date YYYY-MM-DD",
        ),
        refused_fast(
            "a date in another order",
            &[
                "design",
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--date",
                "30.01.2026",
            ],
            "--date = '30.01.2026' is not a date YYYY-MM-DD",
        ),
        refused_fast(
            "an empty item",
            &["design", "--aql", "1%", "--rql", "6%", "--item", ""],
            "--item = '' is out of range",
        ),
        refused_fast(
            "a name with a tab",
            &[
                "design",
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--prepared-by",
                "R.\tOdumbe",
            ],
            "--prepared-by holds a control character (U+0009)",
        ),
        refused_fast(
            "a variables design with a bad date",
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
                "--date",
                "2026-13-01",
            ],
            "--date = '2026-13-01' is not a date",
        ),
    ];
    run("design document fields", &cases);
}

/// Minimum-inspection plan sources (`scheme: rectifying`, issue 14,
/// item 15) that cannot be what they claim, and `rectify --output` where
/// it must not write: each is refused with the key or the flag named.
#[test]
fn rectifying_sources_that_are_not_valid_are_refused() {
    let fx = Fixtures::new();
    let head = "schema: 1\ntitle: Bushes\nscheme: rectifying\n";
    let section =
        "rectifying:\n  form: single\n  process_average: 0.25%\n  ltpd: 1%\n  beta: 0.1\n";
    let lot = "model: hypergeometric\nlot_size: 5000\n";
    let texts = [
        ("no-section.yaml", format!("{head}{lot}")),
        (
            "two-protections.yaml",
            format!("{head}{section}  aoql: 1%\n{lot}"),
        ),
        (
            "beta-with-aoql.yaml",
            format!(
                "{head}rectifying:\n  form: single\n  process_average: 0.25%\n  aoql: 1%\n  beta: 0.1\n{lot}"
            ),
        ),
        (
            "with-producer.yaml",
            format!("{head}{section}{lot}producer:\n  quality: 0.01\n  risk: 0.05\n"),
        ),
        ("no-lot.yaml", format!("{head}{section}model: binomial\n")),
        (
            "form-multiple.yaml",
            format!(
                "{head}{}{lot}",
                section.replace("form: single", "form: multiple")
            ),
        ),
        (
            "average-above.yaml",
            format!("{head}{}{lot}", section.replace("0.25%", "2%")),
        ),
        ("section-on-single.yaml", format!("{BASE}{section}")),
        (
            "no-producer.yaml",
            BASE.replace("producer:\n  quality: 0.01\n  risk: 0.05\n", ""),
        ),
        (
            "ati-on-single.yaml",
            format!(
                "{BASE}plan:\n  stages:\n  - n: 110\n    accept: 3\n    reject: 4\n  producer_risk: 0.025\n  consumer_risk: 0.098\n  ati: 120\n  solved_by: hand\n"
            ),
        ),
        (
            "risks-missing.yaml",
            format!(
                "{head}{section}{lot}plan:\n  stages:\n  - n: 766\n    accept: 4\n    reject: 5\n  solved_by: hand\n"
            ),
        ),
    ];
    for (name, text) in &texts {
        std::fs::write(fx.path(name), text).unwrap();
    }
    let cases = vec![
        reported(
            "scheme: rectifying without its section",
            &["verify", "@no-section.yaml"],
            2,
            "scheme: rectifying needs a 'rectifying' section",
        ),
        refused(
            "an LTPD and an AOQL at once",
            &["design", "@two-protections.yaml"],
            "give one protection in 'rectifying': ltpd (with beta) or aoql, not both",
        ),
        refused(
            "beta beside an AOQL",
            &["design", "@beta-with-aoql.yaml"],
            "rectifying.beta goes with an LTPD",
        ),
        refused(
            "a producer's point on a minimum-inspection plan",
            &["design", "@with-producer.yaml"],
            "'producer' does not belong to a minimum-inspection plan",
        ),
        refused(
            "no lot size",
            &["design", "@no-lot.yaml"],
            "a minimum-inspection plan needs lot_size",
        ),
        refused(
            "a form other than single or double",
            &["design", "@form-multiple.yaml"],
            "rectifying.form = multiple is out of range",
        ),
        refused(
            "a process average above the LTPD",
            &["design", "@average-above.yaml"],
            "must be below the LTPD",
        ),
        refused(
            "a rectifying section on a single plan",
            &["design", "@section-on-single.yaml"],
            "'rectifying' applies to minimum-inspection plans (scheme: rectifying) only",
        ),
        refused(
            "a single plan without its producer's point",
            &["design", "@no-producer.yaml"],
            "the source has no producer: line; add producer: with quality: (the AQL) and risk: (alpha)",
        ),
        reported(
            "an ATI recorded on a single plan",
            &["verify", "@ati-on-single.yaml"],
            2,
            "plan.ati belongs to minimum-inspection plans",
        ),
        refused(
            "a recorded minimum-inspection plan without its figures",
            &["judge", "@risks-missing.yaml", "--found", "1"],
            "the recorded plan gives no ati",
        ),
        refused(
            "rectify --output naming a PDF",
            &[
                "rectify",
                "--lot-size",
                "5000",
                "--process-average",
                "0.25%",
                "--ltpd",
                "1%",
                "--output",
                "@r.pdf",
            ],
            "--output writes the plan source, YAML",
        ),
        refused(
            "rectify --output when the answer is 100% inspection",
            &[
                "rectify",
                "--lot-size",
                "50",
                "--process-average",
                "0.5%",
                "--ltpd",
                "2%",
                "--model",
                "binomial",
                "--output",
                "@full.yaml",
            ],
            "there is no sampling plan to record",
        ),
    ];
    run_in(&fx, "rectifying source", &cases);
    assert!(!fx.path("r.pdf").exists() && !fx.path("full.yaml").exists());
}

/// Issue 14, item 3: a sample larger than the lot. Whenever a lot size is
/// known, under every model, every scheme and every command refuses it: a
/// designer answers "inspect all N units (100%)" with the sample the points
/// need; a plan given by hand or recorded in a source is refused naming
/// its stage (from 1). A trade-off cell beyond the lot is 100% inspection,
/// and rectify answers with 100% inspection (both reported, not refused).
#[test]
fn a_sample_larger_than_the_lot_is_refused_everywhere() {
    let fx = Fixtures::new();
    let base = std::fs::read_to_string(fx.path("no-plan.yaml")).unwrap();
    let in_lot = base.replace("model: binomial", "model: binomial\nlot_size: 30");
    // The binomial plan for 1% / 6% (n = 110, c = 3), recorded by hand in a
    // lot of 30.
    std::fs::write(
        fx.path("above-lot.yaml"),
        format!(
            "{in_lot}plan:\n  stages:\n  - n: 110\n    accept: 3\n    reject: 4\n  producer_risk: 0.0257\n  consumer_risk: 0.0962\n  solved_by: hand\n"
        ),
    )
    .unwrap();
    // A double plan whose second stage passes the lot of 30.
    std::fs::write(
        fx.path("above-lot-double.yaml"),
        format!(
            "{}plan:\n  stages:\n  - n: 20\n    accept: 0\n    reject: 3\n  - n: 40\n    accept: 3\n    reject: 4\n  producer_risk: 0.01\n  consumer_risk: 0.1\n  solved_by: hand\n",
            in_lot.replace("scheme: single", "scheme: double")
        ),
    )
    .unwrap();
    // The demo's variables plan (n = 42) in a lot of 30.
    let thickness = std::fs::read_to_string("plans/tpw-cover-thickness.yaml").unwrap();
    assert!(thickness.contains("lot_size: 600"));
    std::fs::write(
        fx.path("variables-above-lot.yaml"),
        thickness.replace("lot_size: 600", "lot_size: 30"),
    )
    .unwrap();
    const NEEDS: &str = "no plan: the risk points need a sample of n = 110 units from a lot of 30 units, and a sample cannot be larger than its lot; inspect all 30 units (100%)";
    const STAGE_1: &str = "stage 1 cumulative sample size 110 exceeds the lot size 30: a sample cannot be larger than its lot; inspect all 30 units (100%)";
    let design = |rest: &[&'static str]| {
        let mut v = vec![
            "design",
            "--aql",
            "1%",
            "--rql",
            "6%",
            "--lot-size",
            "30",
            "--model",
        ];
        v.extend_from_slice(rest);
        v
    };
    let readings = "plans/tpw-cover-thickness-readings.csv";
    let cases = vec![
        refused(
            "sample larger than the lot: single, binomial",
            &design(&["binomial"]),
            NEEDS,
        ),
        // scipy.stats.poisson: the smallest Poisson plan for 1% / 6% is
        // n = 112, c = 3.
        refused(
            "sample larger than the lot: single, Poisson",
            &design(&["poisson"]),
            "no plan: the risk points need a sample of n = 112 units from a lot of 30 units",
        ),
        refused(
            "sample larger than the lot: double",
            &design(&["binomial", "--scheme", "double"]),
            NEEDS,
        ),
        refused(
            "sample larger than the lot: multiple",
            &design(&["binomial", "--scheme", "multiple"]),
            NEEDS,
        ),
        refused(
            "sample larger than the lot: sequential",
            &design(&["binomial", "--scheme", "sequential"]),
            NEEDS,
        ),
        refused(
            "sample larger than the lot: variables (n = 42)",
            &[
                "design",
                "--scheme",
                "variables",
                "--sigma",
                "unknown",
                "--limit",
                "lower",
                "--lower",
                "5",
                "--aql",
                "1%",
                "--rql",
                "6%",
                "--lot-size",
                "30",
            ],
            "no plan: the risk points need a sample of n = 42 measurements from a lot of 30 units, and a sample cannot be larger than its lot; inspect all 30 units (100%)",
        ),
        refused(
            "sample larger than the lot: a plan given by hand, binomial",
            &[
                "evaluate",
                "--n",
                "110",
                "--c",
                "3",
                "--lot-size",
                "30",
                "--model",
                "binomial",
            ],
            STAGE_1,
        ),
        refused(
            "sample larger than the lot: a second stage given by hand, Poisson",
            &[
                "evaluate",
                "--stage",
                "20:0:3",
                "--stage",
                "40:3:4",
                "--lot-size",
                "30",
                "--model",
                "poisson",
            ],
            "stage 2 cumulative sample size 40 exceeds the lot size 30",
        ),
        refused(
            "sample larger than the lot: design of a source",
            &["design", "@above-lot.yaml"],
            NEEDS,
        ),
        refused(
            "sample larger than the lot: evaluate a recorded plan",
            &["evaluate", "@above-lot.yaml"],
            STAGE_1,
        ),
        refused(
            "sample larger than the lot: judge a recorded plan",
            &["judge", "@above-lot.yaml", "--found", "1"],
            STAGE_1,
        ),
        refused(
            "sample larger than the lot: judge a recorded second stage",
            &[
                "judge",
                "@above-lot-double.yaml",
                "--found",
                "1",
                "--found",
                "0",
            ],
            "stage 2 cumulative sample size 40 exceeds the lot size 30",
        ),
        refused(
            "sample larger than the lot: sheet of a recorded plan",
            &["sheet", "@above-lot.yaml"],
            STAGE_1,
        ),
        refused(
            "sample larger than the lot: sheet printed as recorded",
            &["sheet", "@above-lot.yaml", "--accept-recorded"],
            STAGE_1,
        ),
        reported(
            "sample larger than the lot: verify",
            &["verify", "@above-lot.yaml"],
            2,
            NEEDS,
        ),
        refused(
            "sample larger than the lot: judge measurements for a recorded variables plan",
            &[
                "judge",
                "@variables-above-lot.yaml",
                "--measurements",
                readings,
                "--column",
                "thickness_mm",
            ],
            "the recorded plan's sample size n 42 exceeds the lot size 30",
        ),
        refused(
            "sample larger than the lot: sheet of a recorded variables plan",
            &["sheet", "@variables-above-lot.yaml"],
            "the recorded plan's sample size n 42 exceeds the lot size 30",
        ),
        reported(
            "sample larger than the lot: verify a recorded variables plan",
            &["verify", "@variables-above-lot.yaml"],
            2,
            "n = 42 measurements from a lot of 30 units",
        ),
        reported(
            "sample larger than the lot: a trade-off cell is 100% inspection at the cost of the whole lot",
            &[
                "tradeoff",
                "--aql",
                "1%,2%",
                "--rql",
                "6%,9%",
                "--lot-size",
                "100",
                "--model",
                "binomial",
                "--cost-per-unit",
                "2",
                "--process-quality",
                "1%",
            ],
            0,
            "- 100% in 2 of 4 cells: their points need a sample larger than the lot of 100 units, so every unit is inspected (ATI 100, cost 200.00 per lot)",
        ),
        reported(
            "sample larger than the lot: rectify answers 100% inspection",
            &[
                "rectify",
                "--lot-size",
                "30",
                "--model",
                "binomial",
                "--process-average",
                "0.5%",
                "--ltpd",
                "6%",
            ],
            0,
            "PLAN  inspect every unit of the lot (100% inspection), 30 units per lot",
        ),
    ];
    run_in(&fx, "sample larger than the lot", &cases);
}

/// Issue 14, item 4: qualities and risks at the ends of the double range
/// are answered truly (the smallest plan, an evaluation in short
/// scientific form) or refused with the true reason, never as "too close"
/// because 1 - alpha rounded to 1, never with hundreds of zeros.
#[test]
fn the_ends_of_the_double_range_get_true_answers_or_true_reasons() {
    let cases = vec![
        reported(
            "ends of the double range: alpha = 5e-17 (1 - alpha rounds to 1)",
            &["design", "--aql", "1%", "--rql", "99%", "--alpha", "5e-17"],
            0,
            "PLAN  n = 9, c = 8",
        ),
        // mpmath: tests/data/reference.json, extreme_designs.
        reported(
            "ends of the double range: alpha = beta = 1e-30",
            &[
                "design", "--aql", "1%", "--rql", "99%", "--alpha", "1e-30", "--beta", "1e-30",
            ],
            0,
            "PLAN  n = 41, c = 20",
        ),
        reported(
            "ends of the double range: a subnormal quality is evaluated",
            &["evaluate", "--n", "10", "--c", "1", "--at", "1e-310"],
            0,
            "1.000e-308%",
        ),
        refused_fast(
            "ends of the double range: points a subnormal apart need a sample beyond the limit",
            &["design", "--aql", "1e-310", "--rql", "1e-300"],
            "the risk points are too close: a plan would need a sample beyond the designer's limit of 1000000000 units",
        ),
        refused_fast(
            "ends of the double range: a rate whose rate per 100 units overflows",
            &[
                "evaluate", "--n", "10", "--c", "1", "--model", "poisson", "--at", "1e308",
            ],
            "quality = 1e308 is out of range: it must be above 0 (nonconformities per unit) and at most 1.7e306, so that the rate per 100 units is a number",
        ),
        refused_fast(
            "ends of the double range: a Poisson RQL beyond the largest rate",
            &[
                "design", "--model", "poisson", "--aql", "1", "--rql", "1.8e306",
            ],
            "consumer's quality (RQL) = 1.8e306 is out of range",
        ),
        refused_fast(
            "ends of the double range: two limits, sigma unknown, risks below what the quadrature vouches for",
            &[
                "design",
                "--scheme",
                "variables",
                "--sigma",
                "unknown",
                "--limit",
                "both",
                "--lower",
                "1",
                "--upper",
                "9",
                "--aql",
                "1%",
                "--rql",
                "10%",
                "--alpha",
                "1e-30",
                "--beta",
                "1e-30",
            ],
            "alpha = 1e-30 and beta = 1e-30 are below the 1e-8 it can vouch for",
        ),
    ];
    run("ends of the double range", &cases);
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
/// largest ASN: 23 s of processor time over two threads, not solved yet.
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
            // 40,000 qualities ran 100 s before the two-term item step of
            // issue 19 and fit the budget since (about 6 s of walks).
            "item-by-item plan at 80,000 qualities (about 12 s of walks)",
            &[
                "evaluate",
                "@item-by-item.yaml",
                "--range",
                "0.01%:1%:80000",
                "--format",
                "json",
            ],
            "; ask for at most",
        ),
        refused_fast(
            // 4,000 qualities fit since the distribution comes from the
            // measures' walk (issue 19); 6,000 need 1.4 GiB.
            "the per-stage distribution of 6,000 qualities",
            &[
                "evaluate",
                "@item-by-item.yaml",
                "--range",
                "0.01%:1%:6000",
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
            "double hypergeometric design, lot 10^6, asn-max (23 s of processor time)",
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
            // Without the lot (binomial) this grid ran for minutes before
            // issue 19 and takes about a second since.
            "20 x 20 grid of double plans in a lot of 10^6",
            &[
                "tradeoff",
                "--aql",
                "0.1%:2%:20",
                "--rql",
                "0.5%:10%:20",
                "--scheme",
                "double",
                "--lot-size",
                "1000000",
            ],
            "solving the 20 x 20 grid of double plans would take about",
        ),
        refused_fast(
            "single plan with every nearby plan up to c = 85,000",
            &["design", "--aql", "1%", "--rql", "1.01%", "--nearby", "all"],
            "the single plan and its alternatives (binomial model) would take about",
        ),
        refused_fast(
            "single plan in a lot of 10^8 at 1% against 1.01%, every nearby plan",
            &[
                "design",
                "--aql",
                "1%",
                "--rql",
                "1.01%",
                "--lot-size",
                "100000000",
                "--nearby",
                "all",
            ],
            TIME,
        ),
        refused_fast(
            // At 0.1% against 0.14% (ran 30 s before issue 19) it takes 1 s.
            "sequential plan in a lot of 10^6 at 1% against 1.1% (c = 860)",
            &[
                "design",
                "--aql",
                "1%",
                "--rql",
                "1.1%",
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
            // The scan over acceptance numbers, even to c = 100,000 in a lot
            // of 10^12 (ran 20 s), fits the budget since issue 19 (9 s).
            "minimum-inspection double search in a lot of 10^9 (LTPD 1e-6)",
            &[
                "rectify",
                "--lot-size",
                "1000000000",
                "--process-average",
                "1e-7",
                "--ltpd",
                "1e-6",
                "--scheme",
                "double",
            ],
            "the double search around the single plans up to n = 9265888 with acceptance number 4 (LTPD protection) would take about",
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
