//! Calibration of the work budget: times a range of real cases and prints
//! each one's estimate beside the measured time, so that the constants of
//! the estimates in the layers' `work.rs` files (src/plan, src/design,
//! src/source) can be fitted (or checked) on a machine.
//!
//! Run it (a release build) on an otherwise idle machine:
//!
//! ```text
//! cargo bench --bench calibrate_budget             # every case, a few minutes
//! cargo bench --bench calibrate_budget -- double   # cases whose name holds "double"
//! cargo bench --bench calibrate_budget -- walks    # one walk of each kind, alone
//! ```
//!
//! Each case runs once (the longer ones take several seconds); a ratio
//! between 0.5 and 2 is what the estimates aim at.

// A bench may stop at an unexpected error: unwrap, expect and panic are
// allowed here (the `[lints]` table of Cargo.toml denies them elsewhere).
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::panic)]

use std::time::Instant;

use lotsman::{
    Criterion, DesignRequest, Model, ModelKind, PlanSource, Protection, RectifyingRequest,
    RiskGrid, RiskPair, RiskPoint, Scheme, SchemeOptions, SourceJob, Stage, StagedPlan,
    TradeoffRequest, Work, aoql, design_rectifying, design_single, design_work, measures,
    quality_at_pa, rectifying_work, solve, source_work, stage_outcomes, tradeoff, tradeoff_work,
    walk_seconds,
};

/// One case: its name, its estimate, and the job to time.
struct Case {
    name: String,
    estimate: Work,
    /// The job; `false` when the library refused it (over the budget).
    job: Box<dyn Fn() -> bool>,
}

fn model(kind: ModelKind, lot: Option<u64>) -> Model {
    Model::new(kind, lot).unwrap()
}

fn pair(model: &Model, p1: f64, p2: f64) -> RiskPair {
    RiskPair::new(
        RiskPoint {
            quality: p1,
            risk: 0.05,
        },
        RiskPoint {
            quality: p2,
            risk: 0.10,
        },
        model,
    )
    .unwrap()
}

fn qualities(count: usize, top: f64) -> Vec<f64> {
    (1..=count).map(|i| top * i as f64 / count as f64).collect()
}

/// Evaluations: single, staged and item-by-item plans, each model.
fn evaluations(cases: &mut Vec<Case>) {
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
    let sequential = |m: &Model, p1: f64, p2: f64| {
        let request = DesignRequest {
            scheme: Scheme::Sequential,
            options: SchemeOptions::default(),
            model: *m,
            risks: pair(m, p1, p2),
        };
        solve(&request).unwrap().design.plan
    };
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
            sequential(&binomial, 0.001, 0.003),
            binomial,
            1_000,
        ),
        (
            "item by item 1%/2% lot 20000".into(),
            sequential(&lot, 0.01, 0.02),
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

/// Designs of every scheme, each model.
fn designs(cases: &mut Vec<Case>) {
    let binomial = model(ModelKind::Binomial, None);
    let poisson = model(ModelKind::Poisson, None);
    let lot6 = model(ModelKind::Hypergeometric, Some(1_000_000));
    let lot8 = model(ModelKind::Hypergeometric, Some(100_000_000));
    let runs: Vec<(Scheme, Model, f64, f64, SchemeOptions)> = vec![
        (
            Scheme::Single,
            binomial,
            0.01,
            0.0102,
            SchemeOptions::default(),
        ),
        (
            Scheme::Single,
            poisson,
            0.01,
            0.0102,
            SchemeOptions::default(),
        ),
        (Scheme::Single, lot8, 0.01, 0.0102, SchemeOptions::default()),
        (
            Scheme::Double,
            binomial,
            0.005,
            0.012,
            SchemeOptions::default(),
        ),
        (Scheme::Double, lot6, 0.005, 0.012, SchemeOptions::default()),
        (
            Scheme::Double,
            lot6,
            0.005,
            0.012,
            SchemeOptions {
                criterion: Criterion::AsnMax,
                ..SchemeOptions::default()
            },
        ),
        (
            Scheme::Sequential,
            binomial,
            0.01,
            0.013,
            SchemeOptions::default(),
        ),
        (
            Scheme::Sequential,
            model(ModelKind::Hypergeometric, Some(30_000)),
            0.005,
            0.008,
            SchemeOptions::default(),
        ),
        (
            Scheme::Multiple,
            binomial,
            0.005,
            0.01,
            SchemeOptions::default(),
        ),
        (
            Scheme::Multiple,
            lot6,
            0.01,
            0.02,
            SchemeOptions {
                stages: 3,
                ..SchemeOptions::default()
            },
        ),
    ];
    for (scheme, m, p1, p2, options) in runs {
        let request = DesignRequest {
            scheme,
            options,
            model: m,
            risks: pair(&m, p1, p2),
        };
        cases.push(Case {
            name: format!(
                "design {scheme} {} {p1}/{p2} {}",
                m.kind(),
                options.criterion.name()
            ),
            estimate: design_work(&request, true),
            job: Box::new(move || solve(&request).is_ok()),
        });
    }
    let risks = pair(&lot8, 0.01, 0.0101);
    cases.push(Case {
        name: "single designer alone, lot 10^8, 1%/1.01%".into(),
        estimate: lotsman::single_work(&lot8, &risks, false),
        job: Box::new(move || design_single(&lot8, &risks).is_ok()),
    });
}

/// Grids, minimum-inspection designs and sheets.
fn commands(cases: &mut Vec<Case>) {
    let binomial = model(ModelKind::Binomial, None);
    for (scheme, rows, cols) in [(Scheme::Single, 200, 200), (Scheme::Double, 5, 5)] {
        let request = TradeoffRequest::new(
            RiskGrid {
                aql: qualities(rows, 0.02),
                rql: (1..=cols)
                    .map(|i| 0.025 + 0.075 * i as f64 / cols as f64)
                    .collect(),
                alpha: 0.05,
                beta: 0.10,
            },
            binomial,
            scheme,
            Criterion::AsnAql,
            None,
        )
        .unwrap();
        cases.push(Case {
            name: format!("tradeoff {scheme} {rows} x {cols}"),
            estimate: tradeoff_work(&request),
            job: Box::new(move || !tradeoff(&request, &|| {}).cells.is_empty()),
        });
    }
    let lots = [
        (
            1_000_000_000_000,
            0.0099,
            Protection::Ltpd(RiskPoint {
                quality: 0.01,
                risk: 0.10,
            }),
        ),
        (
            100_000_000,
            0.0095,
            Protection::Ltpd(RiskPoint {
                quality: 0.01,
                risk: 0.10,
            }),
        ),
        (1_000_000_000, 0.008, Protection::Aoql(0.01)),
    ];
    for (lot, average, protection) in lots {
        let request = RectifyingRequest::new(
            model(ModelKind::Hypergeometric, Some(lot)),
            average,
            protection,
            Scheme::Single,
        )
        .unwrap();
        cases.push(Case {
            name: format!("rectify lot {lot} at {average} {}", protection.name()),
            estimate: rectifying_work(&request),
            job: Box::new(move || design_rectifying(&request).is_ok()),
        });
    }
    for path in [
        "plans/tpw-sleeve-hardness.yaml",
        "plans/tpw-housing-finish.yaml",
        "tests/data/sheet-sequential-long.yaml",
    ] {
        let text = std::fs::read_to_string(path).unwrap();
        let source = PlanSource::from_yaml(&text, std::path::Path::new(path)).unwrap();
        cases.push(Case {
            name: format!("sheet {path}"),
            estimate: source_work(&source, SourceJob::Sheet),
            job: Box::new(move || {
                let dir = std::env::temp_dir().join("lotsman-calibration");
                std::fs::create_dir_all(&dir).unwrap();
                let options = lotsman::SheetOptions {
                    paper: lotsman::Paper::A4,
                    accept_recorded: true,
                    overwrite: lotsman::Overwrite::Replace,
                };
                lotsman::write_sheet(std::path::Path::new(path), &dir.join("sheet.pdf"), &options)
                    .is_ok()
            }),
        });
    }
}

/// The process's CPU time so far (user and system, all threads), from
/// `/proc/self/stat` in clock ticks of 10 ms; `None` off Linux. On a shared
/// machine it is a steadier measure of the work than the wall clock.
fn cpu_seconds() -> Option<f64> {
    let stat = std::fs::read_to_string("/proc/self/stat").ok()?;
    // The fields after the command name (which is in parentheses).
    let rest = &stat[stat.rfind(')')? + 2..];
    let fields: Vec<&str> = rest.split(' ').collect();
    let ticks = |i: usize| fields.get(i)?.parse::<f64>().ok();
    Some((ticks(11)? + ticks(12)?) / 100.0)
}

/// One walk of each kind per plan, timed alone: `stage_outcomes` (the
/// curve searches' walk) and `measures` (with the curtailed sample number).
fn walks() {
    let binomial = model(ModelKind::Binomial, None);
    let lot = model(ModelKind::Hypergeometric, Some(20_000));
    let poisson = model(ModelKind::Poisson, None);
    let sequential = |m: &Model, p1: f64, p2: f64| {
        let request = DesignRequest {
            scheme: Scheme::Sequential,
            options: SchemeOptions::default(),
            model: *m,
            risks: pair(m, p1, p2),
        };
        solve(&request).unwrap().design.plan
    };
    let plans = [
        (
            "item by item binomial",
            sequential(&binomial, 0.001, 0.003),
            binomial,
        ),
        ("item by item lot", sequential(&lot, 0.01, 0.02), lot),
        (
            "item by item poisson",
            sequential(&poisson, 0.001, 0.003),
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

/// Batches of 1001 sources (the demo plans in turn): `verify` and `sheet`
/// over all cores, estimated as the batch check does (the sum of the
/// sources' estimates over the threads).
fn batches(cases: &mut Vec<Case>) {
    let dir = std::env::temp_dir().join("lotsman-calibration-batch");
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(dir.join("sheets")).unwrap();
    let mut paths = Vec::new();
    for i in 0..1001 {
        let (name, text) = lotsman::DEMO_PLANS[i % lotsman::DEMO_PLANS.len()];
        let path = dir.join(format!("{i:04}-{name}"));
        std::fs::write(&path, text).unwrap();
        paths.push(path);
    }
    let threads = rayon::current_num_threads() as f64;
    for job in [SourceJob::Verify, SourceJob::Sheet] {
        let seconds: f64 = paths
            .iter()
            .map(|p| source_work(&PlanSource::load(p).unwrap(), job).seconds)
            .sum();
        let (paths, dir) = (paths.clone(), dir.clone());
        cases.push(Case {
            name: format!("batch {job:?} of 1001 demo sources"),
            estimate: Work::time(seconds / threads),
            job: Box::new(move || {
                let options = lotsman::SheetOptions {
                    paper: lotsman::Paper::A4,
                    accept_recorded: false,
                    overwrite: lotsman::Overwrite::Replace,
                };
                let ok = lotsman::run_in_parallel(
                    &paths,
                    |p| match job {
                        SourceJob::Verify => {
                            lotsman::verify_file(p).status == lotsman::VerifyStatus::Match
                        }
                        _ => {
                            let target = dir.join("sheets").join(p.file_name().unwrap());
                            lotsman::write_sheet(p, &target.with_extension("pdf"), &options).is_ok()
                        }
                    },
                    &|_, _| {},
                );
                ok.iter().all(|&b| b)
            }),
        });
    }
}

fn main() {
    // `cargo bench` passes `--bench`; the first other argument filters.
    let filter = std::env::args()
        .skip(1)
        .find(|a| !a.starts_with("--"))
        .unwrap_or_default();
    if filter == "walks" {
        walks();
        return;
    }
    let mut cases = Vec::new();
    evaluations(&mut cases);
    designs(&mut cases);
    commands(&mut cases);
    batches(&mut cases);
    println!(
        "{:<62} {:>10} {:>10} {:>10} {:>7} {:>10}",
        "case", "estimate", "wall", "cpu", "ratio", "MiB est."
    );
    for case in cases.iter().filter(|c| c.name.contains(&filter)) {
        let (started, cpu) = (Instant::now(), cpu_seconds());
        let ran = (case.job)();
        let wall = started.elapsed().as_secs_f64();
        let cpu = cpu.zip(cpu_seconds()).map_or(f64::NAN, |(a, b)| b - a);
        println!(
            "{:<62} {:>10.4} {:>10.4} {:>10.2} {:>7.2} {:>10.1}{}",
            case.name,
            case.estimate.seconds,
            wall,
            cpu,
            case.estimate.seconds / wall,
            case.estimate.bytes / (1u64 << 20) as f64,
            if ran { "" } else { "  (refused or failed)" }
        );
    }
}
