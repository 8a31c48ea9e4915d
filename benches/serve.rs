//! Speed of the web face's pages (issue 18: every page in at most 50 ms,
//! apart from heat maps larger than 30 x 30): `lotsman serve`, built in
//! release, over a workspace the demo fills (its plan sources, sheets and
//! its ledger of lots), each page asked for over HTTP by a plain client
//! and timed from the request to the last byte of the answer.

// A bench may stop at an unexpected error: unwrap, expect and panic are
// allowed here (the `[lints]` table of Cargo.toml denies them elsewhere).
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::panic)]

use std::io::{BufRead, BufReader};
use std::process::{Child, Command, Stdio};
use std::time::Duration;

use criterion::{Criterion, criterion_group, criterion_main};

const BIN: &str = env!("CARGO_BIN_EXE_lotsman");

/// Each page: a name for the bench and its address.
const PAGES: &[(&str, &str)] = &[
    ("home", "/"),
    (
        "design 1%/6%",
        "/design?aql=1%25&rql=6%25&alpha=0.05&beta=0.10&model=binomial",
    ),
    (
        "negotiate 1%/6%, lot 2000, cost 2",
        "/design?aql=1%25&rql=6%25&lot_size=2000&cost=2",
    ),
    (
        "negotiate, double",
        "/design?aql=1%25&rql=6%25&lot_size=2000&scheme=double",
    ),
    (
        "negotiate, multiple",
        "/design?aql=1%25&rql=6%25&lot_size=2000&scheme=multiple",
    ),
    (
        "negotiate, sequential",
        "/design?aql=1%25&rql=6%25&scheme=sequential",
    ),
    (
        "trade-off map 7 x 7, cost",
        "/design/map?aql=1%25&rql=6%25&lot_size=2000&cost=2&map=7",
    ),
    (
        "trade-off map 30 x 30",
        "/design/map?aql=1%25&rql=6%25&lot_size=2000&map=30",
    ),
    ("plans", "/plans"),
    ("one plan", "/plans/view?file=tpw-cover-fit.yaml"),
    (
        "one plan, three classes",
        "/plans/view?file=tpw-seal-face-classes.yaml",
    ),
    ("sheet download", "/plans/sheet?file=tpw-cover-fit.yaml"),
    ("audit of the sources", "/audit?check=sources&folder="),
    (
        "audit of the ledger",
        "/audit?check=ledger&ledger=tpw-seal-face-ledger.csv&plan=",
    ),
    (
        "inspect, three classes",
        "/inspect?plan=tpw-seal-face-classes.yaml&ledger=tpw-seal-face-ledger.csv&lot=L-900&lot_size=1500",
    ),
    (
        "history of the demo ledger",
        "/history?ledger=tpw-seal-face-ledger.csv",
    ),
    (
        "compare three plans",
        "/compare?source=tpw-cover-fit.yaml&source=tpw-seal-visual.yaml&stages=125%3A3%3A4",
    ),
];

/// The server, stopped when dropped.
struct Server(Child, String);

impl Drop for Server {
    fn drop(&mut self) {
        let _ = self.0.kill();
        let _ = self.0.wait();
    }
}

fn start(dir: &std::path::Path) -> Server {
    let out = Command::new(BIN)
        .args(["demo", "--output-dir"])
        .arg(dir)
        .output()
        .unwrap();
    assert!(out.status.success(), "{out:?}");
    let mut child = Command::new(BIN)
        .args(["serve", "--port", "0", "--workspace"])
        .arg(dir)
        .stdout(Stdio::piped())
        .stderr(Stdio::null())
        .spawn()
        .unwrap();
    let mut line = String::new();
    BufReader::new(child.stdout.take().unwrap())
        .read_line(&mut line)
        .unwrap();
    let at = line.find("http://").unwrap();
    let url = line[at..].split_whitespace().next().unwrap().to_string();
    Server(child, url.trim_end_matches('/').to_string())
}

fn pages(c: &mut Criterion) {
    let dir = tempfile::tempdir().unwrap();
    let server = start(dir.path());
    let agent: ureq::Agent = ureq::Agent::config_builder()
        .http_status_as_error(false)
        .proxy(None)
        .build()
        .into();
    let mut group = c.benchmark_group("serve");
    group.measurement_time(Duration::from_secs(4));
    group.sample_size(20);
    for (name, path) in PAGES {
        let url = format!("{}{path}", server.1);
        // Every page must answer, and answer 200, before it is timed.
        let mut first = agent.get(&url).call().unwrap();
        assert_eq!(
            first.status(),
            200,
            "{name}: {}",
            first.body_mut().read_to_string().unwrap()
        );
        group.bench_function(*name, |b| {
            b.iter(|| {
                let mut r = agent.get(&url).call().unwrap();
                r.body_mut().read_to_vec().unwrap()
            })
        });
    }
    group.finish();
}

criterion_group!(benches, pages);
criterion_main!(benches);
