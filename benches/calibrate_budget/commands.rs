//! Grids, minimum-inspection designs, sheets and batches: the cases of the
//! estimates of the trade-off grid and the minimum-inspection scan
//! (src/design) and of sources (src/source/work.rs).

use lotsman::{
    Criterion, MAX_SAMPLE_SIZE, ModelKind, PlanSource, Protection, RectifyingRequest, Report,
    RiskGrid, RiskPoint, Scheme, SourceJob, TradeoffReport, TradeoffRequest, Work,
    design_rectifying, rectifying_double_work, rectifying_work, source_work, tradeoff,
    tradeoff_work,
};

use crate::{Case, model, qualities};

/// Grids (timed with their table, as `tradeoff` prints it), minimum-inspection
/// designs and sheets.
pub(crate) fn commands(cases: &mut Vec<Case>) {
    let binomial = model(ModelKind::Binomial, None);
    let lot = model(ModelKind::Hypergeometric, Some(100_000));
    for (scheme, m, rows, cols) in [
        (Scheme::Single, binomial, 200, 200),
        (Scheme::Single, lot, 100, 100),
        (Scheme::Double, binomial, 5, 5),
        (Scheme::Double, binomial, 10, 10),
        (Scheme::Double, binomial, 20, 20),
        (Scheme::Double, lot, 7, 7),
    ] {
        let request = TradeoffRequest::new(
            RiskGrid {
                aql: qualities(rows, 0.02),
                rql: (1..=cols)
                    .map(|i| 0.025 + 0.075 * i as f64 / cols as f64)
                    .collect(),
                alpha: 0.05,
                beta: 0.10,
            },
            m,
            scheme,
            Criterion::AsnAql,
            None,
        )
        .unwrap();
        cases.push(Case {
            name: format!("tradeoff {scheme} {} {rows} x {cols}", m.kind()),
            estimate: tradeoff_work(&request),
            shared: true,
            // The grid and its table, as `tradeoff` prints it.
            job: Box::new(move || {
                let grid = tradeoff(&request, &|| {});
                let mut table = Vec::new();
                TradeoffReport::new(None, &grid)
                    .write_table(&mut table)
                    .unwrap();
                !table.is_empty()
            }),
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
        (1_000_000, 0.002, Protection::Aoql(0.004)),
        (1_000_000_000_000, 0.0095, Protection::Aoql(0.01)),
    ];
    let scanned = lots
        .iter()
        .map(|&(lot, average, protection)| (lot, average, protection, Scheme::Single));
    let doubled = [
        (
            5_000,
            0.0025,
            Protection::Ltpd(RiskPoint {
                quality: 0.01,
                risk: 0.10,
            }),
        ),
        (
            100_000,
            0.002,
            Protection::Ltpd(RiskPoint {
                quality: 0.01,
                risk: 0.10,
            }),
        ),
        (100_000, 0.002, Protection::Aoql(0.005)),
    ]
    .map(|(lot, average, protection)| (lot, average, protection, Scheme::Double));
    for (lot, average, protection, scheme) in scanned.chain(doubled) {
        let request = RectifyingRequest::new(
            model(ModelKind::Hypergeometric, Some(lot)),
            average,
            protection,
            scheme,
        )
        .unwrap();
        cases.push(Case {
            name: format!(
                "rectify {scheme} lot {lot} at {average} {}",
                protection.name()
            ),
            estimate: rectifying_work(&request).and(double_search_work(&request)),
            shared: scheme == Scheme::Double,
            job: Box::new(move || design_rectifying(&request).is_ok()),
        });
    }
    sheets(cases);
}

/// Sheets of a sequential, a single Poisson and a long item-by-item plan.
fn sheets(cases: &mut Vec<Case>) {
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
            shared: false,
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

/// The estimate of a minimum-inspection double search, as the designer
/// makes it from the single scan's answer (run here untimed): the sweep
/// around the single plans up to the best one's ATI, from its acceptance
/// number.
fn double_search_work(request: &RectifyingRequest) -> Work {
    if request.scheme() != Scheme::Double {
        return Work::default();
    }
    let single = RectifyingRequest::new(
        *request.model(),
        request.process_average(),
        request.protection(),
        Scheme::Single,
    )
    .unwrap();
    let Ok(design) = design_rectifying(&single) else {
        return Work::default();
    };
    let Some(best) = design.plan else {
        return Work::default();
    };
    let start = best.plan.as_single().map_or(0, |(_, c)| c);
    rectifying_double_work(request, best.ati.min(MAX_SAMPLE_SIZE as f64), start)
}

/// Batches of 1001 sources (the demo plans in turn): `verify` and `sheet`
/// over all cores, estimated as the batch check does (the sum of the
/// sources' estimates over the threads).
pub(crate) fn batches(cases: &mut Vec<Case>) {
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
            shared: true,
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
