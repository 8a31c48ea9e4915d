//! Evaluations and walks: the cases of the estimates in src/plan/work.rs.

use lotsman::{
    DesignRequest, Model, ModelKind, Scheme, SchemeOptions, Stage, StagedPlan, aoql, measures,
    quality_at_pa, solve, stage_outcomes, walk_seconds,
};
use std::time::Instant;

use crate::{Case, model, pair, qualities};

/// Evaluations: single, staged and item-by-item plans, each model.
pub(crate) fn evaluations(cases: &mut Vec<Case>) {
    let binomial = model(ModelKind::Binomial, None);
    let poisson = model(ModelKind::Poisson, None);
    let lot = model(ModelKind::Hypergeometric, Some(20_000));
    let seven: Vec<Stage> = [
        (None, 2),
        (Some(0), 3),
        (Some(0), 3),
        (Some(1), 4),
        (Some(2), 5),
        (Some(3), 5),
        (Some(4), 5),
    ]
    .iter()
    .enumerate()
    .map(|(j, &(accept, reject))| Stage {
        n: 20 * (j as u64 + 1),
        accept,
        reject,
    })
    .collect();
    // Ten stages leaving 400 counts open each: the recursion's widest work.
    let mut wide: Vec<Stage> = (1..10)
        .map(|j| Stage {
            n: 2000 * j,
            accept: None,
            reject: 400 + 10 * j,
        })
        .collect();
    wide.push(Stage {
        n: 20_000,
        accept: Some(480),
        reject: 481,
    });
    let plans: Vec<(String, StagedPlan, Model, usize)> = vec![
        (
            "single 125/3 binomial".into(),
            StagedPlan::single(125, 3, &binomial).unwrap(),
            binomial,
            100_000,
        ),
        (
            "single 3631/25 lot 20000".into(),
            StagedPlan::single(3631, 25, &lot).unwrap(),
            lot,
            20_000,
        ),
        (
            "seven stages binomial".into(),
            StagedPlan::new(seven.clone(), &binomial).unwrap(),
            binomial,
            20_000,
        ),
        (
            "seven stages lot 20000".into(),
            StagedPlan::new(seven, &lot).unwrap(),
            lot,
            5_000,
        ),
        (
            "ten wide stages poisson".into(),
            StagedPlan::new(wide, &poisson).unwrap(),
            poisson,
            20,
        ),
        (
            "item by item 0.1%/0.3% binomial".into(),
            sequential_plan(&binomial, 0.001, 0.003),
            binomial,
            1_000,
        ),
        (
            "item by item 1%/2% lot 20000".into(),
            sequential_plan(&lot, 0.01, 0.02),
            lot,
            200,
        ),
    ];
    for (name, plan, m, points) in plans {
        let at = qualities(points, 0.2);
        for decided in [false, true] {
            let (plan, at) = (plan.clone(), at.clone());
            cases.push(Case {
                name: format!(
                    "evaluate {name} at {points}{}",
                    if decided { " with decided_at" } else { "" }
                ),
                estimate: lotsman::evaluation_work(&plan, &m, points, decided),
                shared: false,
                // What `evaluate` computes, without its budget check, so
                // that cases beyond the budget can be timed too.
                job: Box::new(move || {
                    let mut total = 0.0;
                    for &q in &at {
                        total += measures(&plan, &m, q).pa;
                        if decided {
                            total += stage_outcomes(&plan, &m, q).decided()[0];
                        }
                    }
                    total += aoql(&plan, &m).value + quality_at_pa(&plan, &m, 0.5);
                    total.is_finite()
                }),
            });
        }
        println!(
            "  (one walk of {name}: {:.3e} s estimated)",
            walk_seconds(&plan, &m)
        );
    }
}

/// One walk of each kind per plan, timed alone: `stage_outcomes` (the
/// curve searches' walk) and `measures` (with the curtailed sample number).
pub(crate) fn walks() {
    let binomial = model(ModelKind::Binomial, None);
    let lot = model(ModelKind::Hypergeometric, Some(20_000));
    let poisson = model(ModelKind::Poisson, None);
    let plans = [
        (
            "item by item binomial",
            sequential_plan(&binomial, 0.001, 0.003),
            binomial,
        ),
        ("item by item lot", sequential_plan(&lot, 0.01, 0.02), lot),
        (
            "item by item poisson",
            sequential_plan(&poisson, 0.001, 0.003),
            poisson,
        ),
        (
            "single poisson 2000/30",
            StagedPlan::single(2000, 30, &poisson).unwrap(),
            poisson,
        ),
    ];
    for (name, plan, m) in plans {
        let at = qualities(20, 0.02);
        let time = |f: &dyn Fn(f64) -> f64| {
            let started = Instant::now();
            let total: f64 = at.iter().map(|&q| f(q)).sum();
            assert!(total.is_finite());
            started.elapsed().as_secs_f64() / at.len() as f64
        };
        let outcomes = time(&|q| stage_outcomes(&plan, &m, q).pa());
        let curtailed = time(&|q| measures(&plan, &m, q).pa);
        println!(
            "walk {name}: estimate {:.3e}, outcomes {outcomes:.3e}, measures {curtailed:.3e}",
            walk_seconds(&plan, &m)
        );
    }
}

/// The sequential plan designed for `p1` and `p2` under `m`.
fn sequential_plan(m: &Model, p1: f64, p2: f64) -> StagedPlan {
    let request = DesignRequest {
        scheme: Scheme::Sequential,
        options: SchemeOptions::default(),
        model: *m,
        risks: pair(m, p1, p2),
    };
    solve(&request).unwrap().design.plan
}
