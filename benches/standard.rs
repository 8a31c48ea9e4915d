//! Speed of a standard-indexed lookup (issue 16 figure: a lookup with true
//! risks and the scheme OC at 1,001 qualities in at most 20 ms).
//!
//! The lookup is the issue's own example: lot 1,500, general inspection
//! level II, AQL 1.0 (code letter K; normal n = 125 Ac 3 Re 4, tightened
//! Ac 2 Re 3, reduced n = 50 Ac 1 Re 4). `assess` reads the tables, finds
//! every severity's plan, the true risks of the plan in force, and Pa of
//! each severity and of the switching scheme at 1,001 qualities from
//! 0.006% to 6%.
//!
//! Without reduced inspection the scheme's chain is two alternating spells
//! and exact in closed form. With reduced inspection, Table VIII's
//! limit-number rule over ten lots needs an automaton of 18,449 states for
//! K (summed lot by lot, with a proven bound), so that lookup is timed at
//! 101 qualities and reported beside the figure; a letter whose window is
//! small (H, lot 400, 166 states, solved exactly) is timed at 1,001.

// A bench may stop at an unexpected error: unwrap, expect and panic are
// allowed here (the `[lints]` table of Cargo.toml denies them elsewhere).
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::panic)]

use std::hint::black_box;

use criterion::{Criterion, criterion_group, criterion_main};
use lotsman::{
    ClassRule, InspectionLevel, Model, ModelKind, Scheme, Severity, StandardIndex, StandardRequest,
    Tables, assess, parse_classes,
};

fn request(lot_size: u64, reduced: bool) -> StandardRequest {
    let index = StandardIndex {
        lot_size,
        level: InspectionLevel::II,
        classes: parse_classes(&["1.0"]).unwrap(),
        severity: Severity::Normal,
        scheme: Scheme::Single,
        reduced,
        rule: ClassRule::OwnPlans,
    };
    StandardRequest::new(index, Model::new(ModelKind::Binomial, None).unwrap()).unwrap()
}

fn qualities(count: usize) -> Vec<f64> {
    (1..=count)
        .map(|i| 0.06 * i as f64 / count as f64)
        .collect()
}

fn benches(c: &mut Criterion) {
    let tables = Tables::builtin().unwrap();
    let mut group = c.benchmark_group("standard");
    group.sample_size(10);
    for (name, lot, reduced, count) in [
        (
            "K (lot 1,500, AQL 1.0) without reduced, 1001 qualities",
            1500,
            false,
            1001,
        ),
        (
            "H (lot 400, AQL 1.0) with reduced, 1001 qualities",
            400,
            true,
            1001,
        ),
        (
            "K (lot 1,500, AQL 1.0) with reduced, 101 qualities",
            1500,
            true,
            101,
        ),
    ] {
        let r = request(lot, reduced);
        let at = qualities(count);
        let a = assess(&r, tables, Some(&at), None).unwrap();
        let class = &a.classes[0];
        assert!(class.risks.is_some(), "{name}: true risks");
        assert!(
            class.points.iter().all(|p| p.scheme.is_some()),
            "{name}: scheme OC not given: {:?}",
            class.scheme_note
        );
        group.bench_function(name, |b| {
            b.iter(|| black_box(assess(&r, tables, Some(black_box(&at)), None).unwrap()))
        });
    }
    group.finish();
}

criterion_group!(standard, benches);
criterion_main!(standard);
