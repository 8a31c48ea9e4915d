//! Speed of the staged-plan engine and designers (issue figures: exact OC
//! and ASN of a 7-stage plan at 1,001 qualities <= 10 ms; the double
//! designer <= 100 ms at p1 = 1%, p2 = 6% and <= 2 s at p1 = 0.1%,
//! p2 = 0.3%; the sequential plan's exact OC at 1,001 qualities <= 50 ms;
//! issue 19: the 0.1%/0.3% item-by-item plan evaluated at 1,001 qualities,
//! the whole process within 30 times a typical design).

// A bench may stop at an unexpected error: unwrap, expect and panic are
// allowed here (the `[lints]` table of Cargo.toml denies them elsewhere).
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::panic)]

use std::hint::black_box;

mod common;
use common::pair;
use criterion::{Criterion, criterion_group, criterion_main};
use lotsman::{
    Criterion as Minimise, Model, ModelKind, Stage, StagedPlan, design_double, design_sequential,
    evaluate, stage_outcomes,
};

/// OC and ASN of `plan` at 1,001 qualities from 0.01% to 20%.
fn curve(plan: &StagedPlan, model: &Model) -> f64 {
    let stages = plan.stages();
    let mut total = 0.0;
    for i in 0..1001 {
        let p = 1e-4 + 0.2 * i as f64 / 1000.0;
        let o = stage_outcomes(plan, model, p);
        let asn: f64 = stages
            .iter()
            .zip(o.decided())
            .map(|(s, share)| share * s.n as f64)
            .sum();
        total += o.pa() + asn;
    }
    total
}

fn benches(c: &mut Criterion) {
    let binomial = Model::new(ModelKind::Binomial, None).unwrap();
    // A 7-stage plan of 20 units per stage (numbers in the style of the
    // multiple designer's output).
    let numbers = [
        (None, 2),
        (Some(0), 3),
        (Some(0), 3),
        (Some(1), 4),
        (Some(2), 5),
        (Some(3), 5),
        (Some(4), 5),
    ];
    let stages: Vec<Stage> = numbers
        .iter()
        .enumerate()
        .map(|(j, &(accept, reject))| Stage {
            n: 20 * (j as u64 + 1),
            accept,
            reject,
        })
        .collect();
    let seven = StagedPlan::new(stages, &binomial).unwrap();
    c.bench_function("7-stage plan, exact OC and ASN at 1001 qualities", |b| {
        b.iter(|| black_box(curve(&seven, &binomial)))
    });
    let usual = pair(&binomial, 0.01, 0.06);
    c.bench_function("double designer, p1 = 1%, p2 = 6%", |b| {
        b.iter(|| black_box(design_double(&binomial, &usual, Minimise::AsnAql, None).unwrap()))
    });
    let tight = pair(&binomial, 0.001, 0.003);
    let mut group = c.benchmark_group("slow");
    group.sample_size(10);
    group.bench_function("double designer, p1 = 0.1%, p2 = 0.3%", |b| {
        b.iter(|| black_box(design_double(&binomial, &tight, Minimise::AsnAql, None).unwrap()))
    });
    group.finish();
    let (sequential, _) = design_sequential(&binomial, &usual).unwrap();
    c.bench_function(
        "sequential plan (p1 = 1%, p2 = 6%, 140 items), exact OC and ASN at 1001 qualities",
        |b| b.iter(|| black_box(curve(&sequential.plan, &binomial))),
    );
    let (long, _) = design_sequential(&binomial, &tight).unwrap();
    let mut group = c.benchmark_group("slow");
    group.sample_size(10);
    group.bench_function(
        "sequential plan (p1 = 0.1%, p2 = 0.3%), exact OC and ASN at 1001 qualities",
        |b| b.iter(|| black_box(curve(&long.plan, &binomial))),
    );
    // What `lotsman evaluate` does with that plan at 1,001 qualities: the
    // measures at each (curtailed ASN included) and the AOQL and
    // indifference searches, on the machine's cores.
    let qualities: Vec<f64> = (0..1001)
        .map(|i| 1e-4 + 0.0099 * i as f64 / 1000.0)
        .collect();
    group.bench_function(
        "sequential plan (p1 = 0.1%, p2 = 0.3%), evaluate at 1001 qualities",
        |b| b.iter(|| black_box(evaluate(&long.plan, &binomial, &qualities).unwrap())),
    );
    // The hypergeometric item step: each state draws from what its lot has
    // left.
    let lot = Model::new(ModelKind::Hypergeometric, Some(20_000)).unwrap();
    let (in_lot, _) = design_sequential(&lot, &pair(&lot, 0.01, 0.02)).unwrap();
    group.bench_function(
        "sequential plan (lot 20000, p1 = 1%, p2 = 2%), exact OC and ASN at 1001 qualities",
        |b| b.iter(|| black_box(curve(&in_lot.plan, &lot))),
    );
    group.finish();
}

criterion_group!(staged, benches);
criterion_main!(staged);
