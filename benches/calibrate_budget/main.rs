//! Calibration of the work budget: times a range of real cases and prints
//! each one's estimate beside the measured time, so that the constants of
//! the estimates in the layers' `work.rs` files (src/plan, src/design,
//! src/source) can be fitted (or checked) on a machine.
//!
//! Run it (a release build), with `nice` on a shared machine:
//!
//! ```text
//! cargo bench --bench calibrate_budget             # every case, a few minutes
//! cargo bench --bench calibrate_budget -- double   # cases whose name holds "double"
//! cargo bench --bench calibrate_budget -- walks    # one walk of each kind, alone
//! ```
//!
//! The estimates are of the time a user waits on the idle machine, so the
//! ratio is taken against processor time, which other work on a shared
//! machine does not stretch as it stretches the wall clock: the process's
//! processor time for work on one thread, and that time divided among the
//! threads for work the library shares over them (the double sweep, a
//! grid's rows, a batch's sources). Short cases are repeated (see
//! `measure`). A ratio between 0.5 and 2 is what the estimates aim at.
//!
//! The cases live by layer: `evaluations` (src/plan's estimates),
//! `designs` (src/design's) and `commands` (grids, minimum-inspection
//! designs, sheets and batches).

// A bench may stop at an unexpected error: unwrap, expect and panic are
// allowed here (the `[lints]` table of Cargo.toml denies them elsewhere).
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::panic)]

mod commands;
#[path = "../common/mod.rs"]
mod common;
mod designs;
mod evaluations;

use std::time::Instant;

pub(crate) use common::pair;
use lotsman::{Model, ModelKind, Work};

/// One case: its name, its estimate, and the job to time.
pub(crate) struct Case {
    pub(crate) name: String,
    pub(crate) estimate: Work,
    /// Whether the library shares the job over its threads (its estimate is
    /// of the processor time divided among them).
    pub(crate) shared: bool,
    /// The job; `false` when the library refused it (over the budget) or
    /// found no plan.
    pub(crate) job: Box<dyn Fn() -> bool>,
}

pub(crate) fn model(kind: ModelKind, lot: Option<u64>) -> Model {
    Model::new(kind, lot).unwrap()
}

pub(crate) fn qualities(count: usize, top: f64) -> Vec<f64> {
    (1..=count).map(|i| top * i as f64 / count as f64).collect()
}

/// The process's processor time so far (user and system, every thread), in
/// seconds: the sum of its threads' run times in nanoseconds from
/// `/proc/self/task/*/schedstat` (the pool's threads live as long as the
/// process, so none is missed), or `/proc/self/stat` in ticks of 10 ms
/// where those are not kept; `None` off Linux.
fn cpu_seconds() -> Option<f64> {
    let from_tasks = || -> Option<f64> {
        let mut nanos = 0.0;
        for task in std::fs::read_dir("/proc/self/task").ok()? {
            let stat = std::fs::read_to_string(task.ok()?.path().join("schedstat")).ok()?;
            nanos += stat.split(' ').next()?.parse::<f64>().ok()?;
        }
        Some(nanos * 1e-9)
    };
    from_tasks().or_else(|| {
        let stat = std::fs::read_to_string("/proc/self/stat").ok()?;
        // The fields after the command name (which is in parentheses).
        let rest = &stat[stat.rfind(')')? + 2..];
        let fields: Vec<&str> = rest.split(' ').collect();
        let ticks = |i: usize| fields.get(i)?.parse::<f64>().ok();
        Some((ticks(11)? + ticks(12)?) / 100.0)
    })
}

/// One run of `case`: whether it ran, its wall and processor seconds.
fn run_once(case: &Case) -> (bool, f64, f64) {
    let (started, cpu) = (Instant::now(), cpu_seconds());
    let ran = (case.job)();
    let wall = started.elapsed().as_secs_f64();
    let cpu = cpu.zip(cpu_seconds()).map_or(f64::NAN, |(a, b)| b - a);
    (ran, wall, cpu)
}

/// The time of one run of `case`: a job under a third of a second is
/// repeated until the repeats take that long and their mean is kept (the
/// kernel counts a running thread's time in steps of a few milliseconds);
/// one under two seconds runs three times and keeps its median (a busy
/// moment of a shared machine is then one run, not the figure); a longer
/// one runs once.
fn measure(case: &Case) -> (bool, f64, f64) {
    let first = run_once(case);
    if first.1 < 0.3 {
        let (mut runs, mut wall, mut cpu) = (1.0, first.1, first.2);
        while wall < 0.3 && runs < 100_000.0 {
            let (_, w, c) = run_once(case);
            (runs, wall, cpu) = (runs + 1.0, wall + w, cpu + c);
        }
        return (first.0, wall / runs, cpu / runs);
    }
    if first.1 >= 2.0 {
        return first;
    }
    let mut runs = [first, run_once(case), run_once(case)];
    runs.sort_by(|a, b| a.2.total_cmp(&b.2));
    runs[1]
}

fn main() {
    // `cargo bench` passes `--bench`; the first other argument filters.
    let filter = std::env::args()
        .skip(1)
        .find(|a| !a.starts_with("--"))
        .unwrap_or_default();
    if filter == "walks" {
        evaluations::walks();
        return;
    }
    let mut cases = Vec::new();
    evaluations::evaluations(&mut cases);
    designs::designs(&mut cases);
    commands::commands(&mut cases);
    commands::batches(&mut cases);
    let threads = rayon::current_num_threads() as f64;
    println!(
        "{:<62} {:>9} {:>9} {:>9} {:>6} {:>6} {:>9}",
        "case", "estimate", "wall", "cpu", "ratio", "wall r", "MiB est."
    );
    for case in cases.iter().filter(|c| c.name.contains(&filter)) {
        let (ran, wall, cpu) = measure(case);
        let idle = if case.shared { cpu / threads } else { cpu };
        println!(
            "{:<62} {:>9.4} {:>9.4} {:>9.4} {:>6.2} {:>6.2} {:>9.1}{}",
            case.name,
            case.estimate.seconds,
            wall,
            cpu,
            case.estimate.seconds / idle,
            case.estimate.seconds / wall,
            case.estimate.bytes / (1u64 << 20) as f64,
            if ran { "" } else { "  (refused, or no plan)" }
        );
    }
}
