//! Speed of the switching scheme's long-run OC (issue 16 figure: a lookup
//! with true risks and the scheme OC at 1,001 qualities <= 20 ms).
//!
//! Plans of letter K at AQL 1.0 as transcribed for issue 16: normal n = 125
//! Ac 3 Re 4, tightened n = 125 Ac 2 Re 3, reduced n = 50 Ac 1 Re 4 (from
//! memory), limit number 7 over ten lots (Table VIII at 1,250 units, from
//! memory); and letter H at AQL 1.0: normal n = 50 Ac 1 Re 2, tightened
//! n = 80 Ac 1 Re 2, reduced n = 20 Ac 0 Re 2, limit number 2. Each run
//! computes every severity's per-lot outcomes from the binomial tails and
//! the scheme's figures, at qualities evenly from 0 to 6%.
//!
//! K's limit-number window needs 18,449 states and is summed lot by lot
//! (bracketed), so it is timed at 11 qualities; H's (166 states) is solved
//! exactly by LU; without reduced inspection there is no window.

// A bench may stop at an unexpected error: unwrap, expect and panic are
// allowed here (the `[lints]` table of Cargo.toml denies them elsewhere).
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::panic)]

use std::hint::black_box;

use criterion::{Criterion, criterion_group, criterion_main};
use lotsman::{
    LimitWindow, LotOutcomes, Model, ModelKind, Severity, SwitchingRules, SwitchingScheme,
};

/// A single plan n, Ac, Re.
#[derive(Clone, Copy)]
struct Single(u64, u64, u64);

fn outcomes(model: &Model, plan: Single, severity: Severity, p: f64) -> LotOutcomes {
    let Single(n, ac, re) = plan;
    let t = model.tails(n, re - 1, p, 0, 0);
    let o = LotOutcomes::new(severity, t.cdf, t.sf, n as f64, t.cdf * n as f64).unwrap();
    match severity {
        Severity::Normal => o
            .with_counts((0..=ac).map(|x| model.pmf(n, x, p, 0, 0)).collect())
            .unwrap(),
        Severity::Tightened => o,
        Severity::Reduced => {
            let below = model.tails(n, ac, p, 0, 0).cdf;
            o.with_between((t.cdf - below).max(0.0)).unwrap()
        }
    }
}

/// The scheme's Pa summed over `points` qualities from 0 to 6%.
fn curve(model: &Model, scheme: &SwitchingScheme, plans: [Single; 3], points: usize) -> f64 {
    let mut total = 0.0;
    for i in 0..points {
        let p = 0.06 * i as f64 / (points - 1) as f64;
        let oc = scheme
            .long_run(
                p,
                Some(1500),
                &outcomes(model, plans[0], Severity::Normal, p),
                &outcomes(model, plans[1], Severity::Tightened, p),
                Some(&outcomes(model, plans[2], Severity::Reduced, p)),
            )
            .unwrap();
        total += oc.figures.pa;
    }
    total
}

fn benches(c: &mut Criterion) {
    let model = Model::new(ModelKind::Binomial, None).unwrap();
    let k = [Single(125, 3, 4), Single(125, 2, 3), Single(50, 1, 4)];
    let h = [Single(50, 1, 2), Single(80, 1, 2), Single(20, 0, 2)];
    let without = SwitchingScheme::new(SwitchingRules::without_reduced(), 3).unwrap();
    let with_k =
        SwitchingScheme::new(SwitchingRules::new(true, Some(LimitWindow::ten(7))), 3).unwrap();
    let with_h =
        SwitchingScheme::new(SwitchingRules::new(true, Some(LimitWindow::ten(2))), 1).unwrap();
    let mut group = c.benchmark_group("switching");
    group.sample_size(10);
    group.bench_function("K at AQL 1.0 without reduced, 1001 qualities", |b| {
        b.iter(|| black_box(curve(&model, &without, k, 1001)))
    });
    group.bench_function(
        "H at AQL 1.0 with reduced (exact window), 1001 qualities",
        |b| b.iter(|| black_box(curve(&model, &with_h, h, 1001))),
    );
    group.bench_function(
        "K at AQL 1.0 with reduced (bracketed window), 11 qualities",
        |b| b.iter(|| black_box(curve(&model, &with_k, k, 11))),
    );
    group.bench_function("building K's window automaton (18,449 states)", |b| {
        b.iter(|| {
            black_box(
                SwitchingScheme::new(SwitchingRules::new(true, Some(LimitWindow::ten(7))), 3)
                    .unwrap(),
            )
        })
    });
    group.finish();
}

criterion_group!(switching, benches);
criterion_main!(switching);
