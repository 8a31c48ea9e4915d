//! Speed of batch verification (issue figure: `verify` over 1,000 plan
//! sources <= 2 s): 1,000 sources in ten subfolders of a temporary folder,
//! the demo plans in turn (single plans under all three models, a double,
//! a sequential and a variables plan). Each run finds the files, reads,
//! parses, re-solves and compares every source, over all cores and, for
//! comparison, on one.

// A bench may stop at an unexpected error: unwrap, expect and panic are
// allowed here (the `[lints]` table of Cargo.toml denies them elsewhere).
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::panic)]

use std::hint::black_box;
use std::path::PathBuf;

use criterion::{Criterion, criterion_group, criterion_main};
use lotsman::{VerifyStatus, expand_paths, run_in_parallel, verify_file};

/// The number of sources verified per run.
const SOURCES: usize = 1000;

fn plan_folder() -> tempfile::TempDir {
    let plans: Vec<(String, String)> = std::fs::read_dir("plans")
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| p.extension().is_some_and(|e| e == "yaml"))
        .map(|p| {
            let name = p.file_name().unwrap().to_string_lossy().to_string();
            (name, std::fs::read_to_string(p).unwrap())
        })
        .collect();
    let dir = tempfile::tempdir().unwrap();
    for i in 0..SOURCES {
        let (name, text) = &plans[i % plans.len()];
        let sub = dir.path().join(format!("supplier-{}", i % 10));
        std::fs::create_dir_all(&sub).unwrap();
        std::fs::write(sub.join(format!("{i:04}-{name}")), text).unwrap();
    }
    dir
}

fn benches(c: &mut Criterion) {
    let dir = plan_folder();
    let roots = [PathBuf::from(dir.path())];
    let check = |statuses: Vec<VerifyStatus>| {
        assert_eq!(statuses.len(), SOURCES);
        assert!(statuses.iter().all(|s| *s == VerifyStatus::Match));
    };
    check(
        run_in_parallel(
            &expand_paths(&roots),
            |f| verify_file(&f.as_ref().unwrap().path),
            &|_, _| {},
        )
        .into_iter()
        .map(|e| e.status)
        .collect(),
    );
    let mut group = c.benchmark_group("batch");
    group.sample_size(10);
    group.bench_function("verify 1000 sources in parallel", |b| {
        b.iter(|| {
            let found = expand_paths(&roots);
            black_box(run_in_parallel(
                &found,
                |f| verify_file(&f.as_ref().unwrap().path),
                &|_, _| {},
            ))
        })
    });
    group.bench_function("verify 1000 sources on one core", |b| {
        b.iter(|| {
            let found = expand_paths(&roots);
            black_box(
                found
                    .iter()
                    .map(|f| verify_file(&f.as_ref().unwrap().path))
                    .collect::<Vec<_>>(),
            )
        })
    });
    group.finish();
}

criterion_group!(batch, benches);
criterion_main!(batch);
