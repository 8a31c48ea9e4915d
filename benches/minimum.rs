//! Speed of the minimum-inspection designer (rectifying inspection): a
//! typical single and double design, for an LTPD and for an AOQL, in lots
//! of 5,000 (the conditions of the published table entries in
//! tests/it/rectifying.rs).

// A bench may stop at an unexpected error: unwrap, expect and panic are
// allowed here (the `[lints]` table of Cargo.toml denies them elsewhere).
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::panic)]

use std::hint::black_box;

use criterion::{Criterion, criterion_group, criterion_main};
use lotsman::{
    Model, ModelKind, Protection, RectifyingRequest, RiskPoint, Scheme, design_rectifying,
};

fn benches(c: &mut Criterion) {
    let lot = Model::new(ModelKind::Hypergeometric, Some(5000)).unwrap();
    let ltpd = Protection::Ltpd(RiskPoint {
        quality: 0.01,
        risk: 0.10,
    });
    let cases = [
        ("LTPD 1%, p̄ = 0.25%", ltpd, 0.0025),
        ("AOQL 3%, p̄ = 1%", Protection::Aoql(0.03), 0.01),
    ];
    for (name, protection, pbar) in cases {
        for scheme in [Scheme::Single, Scheme::Double] {
            let request = RectifyingRequest::new(lot, pbar, protection, scheme).unwrap();
            let mut group = c.benchmark_group("minimum inspection");
            if scheme == Scheme::Double {
                group.sample_size(10);
            }
            group.bench_function(format!("{scheme} plan, N = 5000, {name}"), |b| {
                b.iter(|| black_box(design_rectifying(&request).unwrap()))
            });
            group.finish();
        }
    }
}

criterion_group!(minimum, benches);
criterion_main!(minimum);
