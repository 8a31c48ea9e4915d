//! Speed of the designer and the OC curve (issue figures: typical design
//! <= 20 us median; p1 = 0.01%, p2 = 0.0125% <= 5 ms; hypergeometric with
//! N = 10^6 <= 20 ms; 1,001-point OC curve <= 1 ms), and a close pair in
//! a lot of 10^6 with what `design` adds to it (issue 19).

// A bench may stop at an unexpected error: unwrap, expect and panic are
// allowed here (the `[lints]` table of Cargo.toml denies them elsewhere).
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::panic)]

use std::hint::black_box;

mod common;
use common::pair;
use criterion::{Criterion, criterion_group, criterion_main};
use lotsman::{
    DesignRequest, Model, ModelKind, RiskPair, Scheme, SchemeOptions, StagedPlan, Steps,
    acceptance_probability, design_single, sensitivity, solve,
};

/// Typical requests: p1 from 0.1% to 5%, p2 / p1 from 2 to 15, binomial.
fn typical_requests(model: &Model) -> Vec<RiskPair> {
    let mut out = Vec::new();
    for &p1 in &[0.001, 0.0025, 0.005, 0.01, 0.02, 0.05] {
        for &ratio in &[2.0, 3.0, 5.0, 8.0, 15.0] {
            let p2 = p1 * ratio;
            if p2 < 0.8 {
                out.push(pair(model, p1, p2));
            }
        }
    }
    out
}

fn benches(c: &mut Criterion) {
    let binomial = Model::new(ModelKind::Binomial, None).unwrap();
    let requests = typical_requests(&binomial);
    let count = requests.len();
    c.bench_function(
        &format!("typical design (mean over {count} requests)"),
        |b| {
            b.iter_custom(|iters| {
                let start = std::time::Instant::now();
                for _ in 0..iters {
                    for r in &requests {
                        black_box(design_single(&binomial, r).unwrap());
                    }
                }
                start.elapsed() / count as u32
            })
        },
    );
    let close = pair(&binomial, 0.0001, 0.000125);
    c.bench_function("binomial p1 = 0.01%, p2 = 0.0125%", |b| {
        b.iter(|| black_box(design_single(&binomial, &close).unwrap()))
    });
    let lot = Model::new(ModelKind::Hypergeometric, Some(1_000_000)).unwrap();
    let finite = pair(&lot, 0.01, 0.02);
    c.bench_function("hypergeometric N = 10^6, p1 = 1%, p2 = 2%", |b| {
        b.iter(|| black_box(design_single(&lot, &finite).unwrap()))
    });
    // A close pair in a large lot (c = 3594, n = 292,740): the walk over c
    // took 82,494 tail evaluations here before the search galloped.
    let close_lot = pair(&lot, 0.012, 0.0125);
    c.bench_function("hypergeometric N = 10^6, p1 = 1.2%, p2 = 1.25%", |b| {
        b.iter(|| black_box(design_single(&lot, &close_lot).unwrap()))
    });
    let request = DesignRequest {
        scheme: Scheme::Single,
        options: SchemeOptions::default(),
        model: lot,
        risks: close_lot,
    };
    let steps = Steps::new(&close_lot, [None; 4]).unwrap();
    c.bench_function(
        "hypergeometric N = 10^6, p1 = 1.2%, p2 = 1.25%, with nearby plans and sensitivity",
        |b| {
            b.iter(|| {
                let solution = solve(&request).unwrap();
                black_box(sensitivity(&lot, &close_lot, solution.single.n, &steps))
            })
        },
    );
    let plan = StagedPlan::single(200, 4, &binomial).unwrap();
    c.bench_function("OC curve, 1001 points, n = 200, c = 4", |b| {
        b.iter(|| {
            let mut s = 0.0;
            for i in 0..1001 {
                s += acceptance_probability(&plan, &binomial, 1e-4 + 0.1 * i as f64 / 1000.0);
            }
            black_box(s)
        })
    });
}

criterion_group!(design, benches);
criterion_main!(design);
