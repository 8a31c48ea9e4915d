//! Speed of the variables designer and OC (issue figures: a sigma-unknown
//! design <= 5 ms; a 1,001-point exact OC <= 20 ms).

// A bench may stop at an unexpected error: unwrap, expect and panic are
// allowed here (the `[lints]` table of Cargo.toml denies them elsewhere).
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::panic)]

use std::hint::black_box;

mod common;
use common::pair;
use criterion::{Criterion, criterion_group, criterion_main};
use lotsman::{LimitKind, Model, ModelKind, SigmaKind, Specification, design_variables};

fn bench(c: &mut Criterion) {
    let model = Model::new(ModelKind::Binomial, None).unwrap();
    let one =
        Specification::new(SigmaKind::Unknown, None, LimitKind::Upper, None, Some(1.0)).unwrap();
    let risks = pair(&model, 0.01, 0.06);
    c.bench_function("variables design, sigma unknown, one limit, 1%/6%", |b| {
        b.iter(|| design_variables(black_box(&one), black_box(&risks)).unwrap())
    });
    let tight = pair(&model, 0.02, 0.04);
    c.bench_function(
        "variables design, sigma unknown, one limit, 2%/4% (n = 332)",
        |b| b.iter(|| design_variables(black_box(&one), black_box(&tight)).unwrap()),
    );
    let plan = design_variables(&one, &risks).unwrap().plan;
    c.bench_function("variables OC, sigma unknown, 1,001 qualities", |b| {
        b.iter(|| {
            (0..1001)
                .map(|i| plan.pa(black_box(1e-4 + 0.2 * i as f64 / 1000.0)))
                .sum::<f64>()
        })
    });
    let two = Specification::new(
        SigmaKind::Unknown,
        None,
        LimitKind::Both,
        Some(0.0),
        Some(1.0),
    )
    .unwrap();
    let mut slow = c.benchmark_group("slow");
    slow.sample_size(10);
    slow.bench_function("variables design, sigma unknown, two limits, 1%/6%", |b| {
        b.iter(|| design_variables(black_box(&two), black_box(&risks)).unwrap())
    });
    slow.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);
