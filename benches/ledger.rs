//! Speed of the ledger's audit replay and status (issue 17: `verify` and
//! `status` over a ledger of 100,000 lots in at most 1 s each): the ledger is generated in the setup
//! by the library (a standard-indexed source (the `standard` template: three classes, normal and tightened), lots accepted
//! and rejected by a fixed pattern, each at the severity its history
//! requires), then read strictly and replayed against its source: chain,
//! plan revision, severity and decision of every row; the status replays it
//! the same way, then estimates the process average of each class.

// A bench may stop at an unexpected error: unwrap, expect and panic are
// allowed here (the `[lints]` table of Cargo.toml denies them elsewhere).
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::panic)]

use std::hint::black_box;
use std::path::Path;

use criterion::{Criterion, criterion_group, criterion_main};
use lotsman::{
    GENESIS, KnownPlan, Ledger, LedgerRow, LotDate, LotEntry, PlanSource, SwitchingState,
    ledger_header, ledger_status, replay, row_line, template,
};

const LOTS: usize = 100_000;

/// The bytes of a ledger of `LOTS` lots judged by `known`.
fn ledger_bytes(known: &KnownPlan) -> Vec<u8> {
    let rules = known.rules().unwrap();
    let mut state = SwitchingState::new();
    let mut bytes = format!("{}\n", ledger_header()).into_bytes();
    let mut prev = GENESIS.to_string();
    for i in 0..LOTS {
        let severity = state.severity().unwrap_or(lotsman::Severity::Tightened);
        let state_now = if state.is_discontinued() {
            state.resume().unwrap()
        } else {
            state.clone()
        };
        // One lot in seven has 5 majors (rejected at every severity).
        let found = if i % 7 == 3 { "5" } else { "0" };
        let counts = [
            "critical=0".to_string(),
            format!("major={found}"),
            "minor=0".into(),
        ];
        let decided = known.decide_classes(severity, &counts).unwrap();
        let entry = LotEntry {
            date: LotDate::parse("2024-03-15").unwrap(),
            lot: format!("L{i}"),
            lot_size: Some(1500),
            plan_id: known.id.clone(),
            plan_revision: known.revision.clone(),
            plan_sha256: known.sha256.clone(),
            severity: Some(severity),
            code_letter: decided.code_letter.clone(),
            inspected: decided.inspected.clone(),
            found: decided.found.clone(),
            decision: decided.decision,
            inspector: "A. Inspector".into(),
            note: String::new(),
            seed: None,
            resubmitted: false,
            corrective_action: None,
            measured: None,
        };
        state = rules.step(&state_now, &decided.lot.unwrap()).unwrap();
        let row: LedgerRow = entry.chained(i as u64 + 1, &prev);
        prev.clone_from(&row.hash);
        bytes.extend(row_line(&row).unwrap());
    }
    bytes
}

fn bench(c: &mut Criterion) {
    let path = Path::new("bench.yaml");
    let mut source = PlanSource::from_yaml(template("standard").unwrap(), path).unwrap();
    source.record_standard_at(path).unwrap();
    let yaml = source.to_yaml();
    let known = KnownPlan::from_source(path, &yaml, &source).unwrap();
    let bytes = ledger_bytes(&known);
    let plans = [known];
    c.bench_function("verify a ledger of 100,000 lots", |b| {
        b.iter(|| {
            let ledger = Ledger::parse(Path::new("log.csv"), black_box(&bytes)).unwrap();
            replay(&ledger, &plans)
        });
    });
    c.bench_function("status of a ledger of 100,000 lots", |b| {
        b.iter(|| {
            let ledger = Ledger::parse(Path::new("log.csv"), black_box(&bytes)).unwrap();
            ledger_status(&ledger, &plans).unwrap()
        });
    });
}

criterion_group! {
    name = benches;
    config = Criterion::default().sample_size(10);
    targets = bench
}
criterion_main!(benches);
