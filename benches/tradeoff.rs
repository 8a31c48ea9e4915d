//! Speed of the trade-off grid (issue figure: a 100 x 100 single-plan grid,
//! p1 0.2% to 2% and p2 3% to 12%, in <= 0.2 s including the JSON output;
//! issue 19: a 10 x 10 double-plan grid, p1 0.5% to 2% and p2 3% to 12%, at
//! most 150 times a typical design as a whole process).

// A bench may stop at an unexpected error: unwrap, expect and panic are
// allowed here (the `[lints]` table of Cargo.toml denies them elsewhere).
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::panic)]

use std::hint::black_box;

use criterion::{Criterion, criterion_group, criterion_main};
use lotsman::{
    Criterion as Minimised, Format, Model, ModelKind, QualityRange, RiskGrid, Scheme,
    TradeoffReport, TradeoffRequest, tradeoff, write_report,
};

fn benches(c: &mut Criterion) {
    let axis = |text: &str| QualityRange::parse("axis", text).unwrap().points();
    let model = Model::new(ModelKind::Binomial, None).unwrap();
    let request = TradeoffRequest::new(
        RiskGrid {
            aql: axis("0.2%:2%:100"),
            rql: axis("3%:12%:100"),
            alpha: 0.05,
            beta: 0.10,
        },
        model,
        Scheme::Single,
        Minimised::AsnAql,
        None,
    )
    .unwrap();
    let mut group = c.benchmark_group("tradeoff");
    group.sample_size(30);
    group.bench_function("100 x 100 single grid, solved", |b| {
        b.iter(|| black_box(tradeoff(&request, &|| {})))
    });
    group.bench_function("100 x 100 single grid, solved and written as JSON", |b| {
        b.iter(|| {
            let grid = tradeoff(&request, &|| {});
            let mut out = Vec::with_capacity(3 << 20);
            write_report(&TradeoffReport::new(None, &grid), Format::Json, &mut out).unwrap();
            black_box(out)
        })
    });
    // The numerical guard runs on every report before it is written.
    let grid = tradeoff(&request, &|| {});
    let report = TradeoffReport::new(None, &grid);
    group.bench_function("100 x 100 single grid report, guarded", |b| {
        b.iter(|| black_box(report.check()))
    });
    group.finish();
    let double = TradeoffRequest::new(
        RiskGrid {
            aql: axis("0.5%:2%:10"),
            rql: axis("3%:12%:10"),
            alpha: 0.05,
            beta: 0.10,
        },
        model,
        Scheme::Double,
        Minimised::AsnAql,
        None,
    )
    .unwrap();
    let mut group = c.benchmark_group("tradeoff");
    group.sample_size(10);
    group.bench_function("10 x 10 double grid, solved", |b| {
        b.iter(|| black_box(tradeoff(&double, &|| {})))
    });
    group.finish();
}

criterion_group!(tradeoff_benches, benches);
criterion_main!(tradeoff_benches);
