//! Speed of the trade-off map (issue 6: a 100 x 100 map well under 0.1 s):
//! rendering the page of a solved 100 x 100 single-plan grid, p1 0.2% to
//! 2%, p2 3% to 12%; the grid is solved once, outside the measurement.

// A bench may stop at an unexpected error: unwrap, expect and panic are
// allowed here (the `[lints]` table of Cargo.toml denies them elsewhere).
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::panic)]

use std::hint::black_box;

use criterion::{Criterion, criterion_group, criterion_main};
use lotsman::{
    Criterion as DesignCriterion, Model, ModelKind, Paper, RiskGrid, Scheme, TradeoffRequest,
    render_tradeoff_map, tradeoff,
};

/// `count` evenly spaced values from `lo` to `hi`.
fn range(lo: f64, hi: f64, count: usize) -> Vec<f64> {
    (0..count)
        .map(|i| lo + (hi - lo) * i as f64 / (count - 1) as f64)
        .collect()
}

fn benches(c: &mut Criterion) {
    let model = Model::new(ModelKind::Binomial, None).unwrap();
    let request = TradeoffRequest::new(
        RiskGrid {
            aql: range(0.002, 0.02, 100),
            rql: range(0.03, 0.12, 100),
            alpha: 0.05,
            beta: 0.10,
        },
        model,
        Scheme::Single,
        DesignCriterion::AsnAql,
        None,
    )
    .unwrap();
    let grid = tradeoff(&request, &|| {});
    c.bench_function("trade-off map 100 x 100 (A4)", |b| {
        b.iter(|| black_box(render_tradeoff_map(&grid, "Map", None, Paper::A4).unwrap()))
    });
}

criterion_group!(map, benches);
criterion_main!(map);
