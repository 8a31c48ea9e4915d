//! The design estimates held to the calibration they were fitted on.
//!
//! Each row is a case of `cargo bench --bench calibrate_budget`: its
//! estimate when the constants of [`work`](super::work) were fitted, the
//! time it was measured at (processor seconds, divided between the two
//! threads for work the library shares over them, as the bench prints
//! them) and the date. No timing runs here: the first test recomputes every
//! estimate, so a change to an estimate's formula or constants fails it
//! until the table is updated from a new calibration run; the second keeps
//! the table itself honest (every fitted estimate within a factor of two of
//! its measured time, what the fits aim at).

use crate::budget::Work;
use crate::design::{
    Criterion, DesignRequest, Nearby, Protection, RectifyingRequest, RiskGrid, Scheme,
    SchemeOptions, TradeoffRequest, design_work, rectifying_double_work, rectifying_work,
    single_work, tradeoff_work,
};
use crate::model::{Model, ModelKind, RiskPair, RiskPoint};

/// One calibrated case.
struct Row {
    /// The case, as the bench names it.
    case: &'static str,
    /// Its estimate now.
    estimate: Work,
    /// Its estimate when fitted, in seconds (four significant digits).
    fitted: f64,
    /// The time measured, in seconds.
    measured: f64,
    /// The day of the measurement.
    date: &'static str,
}

/// The calibration machine's threads: the estimates of shared work divide
/// by them, so the table is computed on as many whatever the machine.
const CALIBRATION_THREADS: usize = 2;

fn model(kind: ModelKind, lot: Option<u64>) -> Model {
    Model::new(kind, lot).expect("a valid model")
}

fn lot(size: u64) -> Model {
    model(ModelKind::Hypergeometric, Some(size))
}

/// The request of `scheme` at `p1` (alpha 0.05) against `p2` (beta 0.10).
fn request(scheme: Scheme, m: Model, p1: f64, p2: f64, criterion: Criterion) -> DesignRequest {
    let risks = RiskPair::new(
        RiskPoint {
            quality: p1,
            risk: 0.05,
        },
        RiskPoint {
            quality: p2,
            risk: 0.10,
        },
        &m,
    )
    .expect("valid risk points");
    DesignRequest {
        scheme,
        options: SchemeOptions {
            criterion,
            ..SchemeOptions::default()
        },
        model: m,
        risks,
    }
}

/// A design as `design` runs it (with the window of nearby plans).
fn design(scheme: Scheme, m: Model, p1: f64, p2: f64, criterion: Criterion) -> Work {
    design_work(&request(scheme, m, p1, p2, criterion), Some(Nearby::Window))
}

/// A binomial grid of `rows` AQLs up to 2% against `cols` RQLs from 2.5%
/// to 10%, as the bench builds it.
fn grid(scheme: Scheme, rows: usize, cols: usize) -> Work {
    let request = TradeoffRequest::new(
        RiskGrid {
            aql: (1..=rows).map(|i| 0.02 * i as f64 / rows as f64).collect(),
            rql: (1..=cols)
                .map(|i| 0.025 + 0.075 * i as f64 / cols as f64)
                .collect(),
            alpha: 0.05,
            beta: 0.10,
        },
        model(ModelKind::Binomial, None),
        scheme,
        Criterion::AsnAql,
        None,
    )
    .expect("a valid grid");
    tradeoff_work(&request)
}

fn rectify(size: u64, average: f64, protection: Protection, scheme: Scheme) -> RectifyingRequest {
    RectifyingRequest::new(lot(size), average, protection, scheme).expect("a valid request")
}

fn ltpd(quality: f64) -> Protection {
    Protection::Ltpd(RiskPoint {
        quality,
        risk: 0.10,
    })
}

/// The table, estimated on [`CALIBRATION_THREADS`] threads.
fn rows() -> Vec<Row> {
    let (single, double) = (Scheme::Single, Scheme::Double);
    let (aql, max) = (Criterion::AsnAql, Criterion::AsnMax);
    let binomial = model(ModelKind::Binomial, None);
    let poisson = model(ModelKind::Poisson, None);
    let row = |case, estimate, fitted, measured| Row {
        case,
        estimate,
        fitted,
        measured,
        date: "2026-12-04",
    };
    let every_nearby =
        |m: Model, p1, p2| design_work(&request(single, m, p1, p2, aql), Some(Nearby::All));
    let alone = |m: Model, p1, p2| single_work(&m, &request(single, m, p1, p2, aql).risks, false);
    let (seq, multiple) = (Scheme::Sequential, Scheme::Multiple);
    let multiple_lot = |stages| DesignRequest {
        options: SchemeOptions {
            stages,
            ..SchemeOptions::default()
        },
        ..request(multiple, lot(1_000_000), 0.01, 0.02, aql)
    };
    let scan =
        |size, average, protection| rectifying_work(&rectify(size, average, protection, single));
    vec![
        row(
            "design single binomial 1%/1.02%",
            design(single, binomial, 0.01, 0.0102, aql),
            1.255e-3,
            0.0012,
        ),
        row(
            "design single, lot 10^8, 1%/1.02%",
            design(single, lot(100_000_000), 0.01, 0.0102, aql),
            2.962e-3,
            0.0030,
        ),
        row(
            "single designer alone, lot 10^8, 1%/1.01%",
            alone(lot(100_000_000), 0.01, 0.0101),
            1.483e-3,
            0.0015,
        ),
        row(
            "design single binomial 1%/1.1%, every nearby plan",
            every_nearby(binomial, 0.01, 0.011),
            5.718e-3,
            0.0059,
        ),
        row(
            "design double binomial 0.5%/1.2% asn-aql",
            design(double, binomial, 0.005, 0.012, aql),
            2.075e-2,
            0.0171,
        ),
        row(
            "design double binomial 1e-6/6e-6 asn-aql",
            design(double, binomial, 1e-6, 6e-6, aql),
            3.081,
            3.02,
        ),
        row(
            "design double, lot 10^6, 0.5%/1.2% asn-aql",
            design(double, lot(1_000_000), 0.005, 0.012, aql),
            0.2072,
            0.214,
        ),
        row(
            "design double, lot 10^6, 0.5%/0.9% asn-max",
            design(double, lot(1_000_000), 0.005, 0.009, max),
            11.29,
            11.6,
        ),
        row(
            "design sequential binomial 1%/1.1%",
            design(seq, binomial, 0.01, 0.011, aql),
            8.763,
            8.98,
        ),
        row(
            "design sequential Poisson 0.1%/0.14%",
            design(seq, poisson, 0.001, 0.0014, aql),
            3.548,
            3.63,
        ),
        row(
            "design sequential, lot 10^6, 0.1%/0.14%",
            design(seq, lot(1_000_000), 0.001, 0.0014, aql),
            1.036,
            0.99,
        ),
        row(
            "design multiple binomial 0.5%/1% k = 7",
            design(multiple, binomial, 0.005, 0.01, aql),
            0.8004,
            0.79,
        ),
        row(
            "design multiple, lot 10^6, 1%/2% k = 3",
            design_work(&multiple_lot(3), None),
            1.211,
            1.27,
        ),
        row(
            "tradeoff single binomial 200 x 200",
            grid(single, 200, 200),
            4.600e-2,
            0.0405,
        ),
        row(
            "tradeoff double binomial 20 x 20",
            grid(double, 20, 20),
            0.6237,
            0.773,
        ),
        row(
            "rectify single, lot 10^12, 0.99%, LTPD 1%",
            scan(1_000_000_000_000, 0.0099, ltpd(0.01)),
            9.547,
            8.69,
        ),
        row(
            "rectify single, lot 10^12, 0.95%, AOQL 1%",
            scan(1_000_000_000_000, 0.0095, Protection::Aoql(0.01)),
            1.866,
            2.04,
        ),
        // The double search reaches the best single plan's ATI, 811 units,
        // from its acceptance number 5.
        row(
            "rectify double, lot 10^5, 0.2%, AOQL 0.5%",
            scan(100_000, 0.002, Protection::Aoql(0.005)).and(rectifying_double_work(
                &rectify(100_000, 0.002, Protection::Aoql(0.005), double),
                811.048_318_610_751_4,
                5,
            )),
            0.2295,
            0.249,
        ),
    ]
}

#[test]
fn the_design_estimates_are_those_of_their_calibration() {
    let pool = rayon::ThreadPoolBuilder::new()
        .num_threads(CALIBRATION_THREADS)
        .build()
        .expect("a thread pool");
    let rows = pool.install(rows);
    let drifted: Vec<String> = rows
        .iter()
        .filter(|r| (r.estimate.seconds / r.fitted - 1.0).abs() > 5e-3)
        .map(|r| {
            format!(
                "{}: {:.3e} s now, {:.3e} s fitted",
                r.case, r.estimate.seconds, r.fitted
            )
        })
        .collect();
    assert!(
        drifted.is_empty(),
        "estimates changed since their calibration; run the calibration bench and update the table:\n{}",
        drifted.join("\n")
    );
}

#[test]
fn every_fitted_estimate_lies_within_a_factor_of_two_of_its_measured_time() {
    for r in rows() {
        let ratio = r.fitted / r.measured;
        assert!(
            (0.5..=2.0).contains(&ratio),
            "{} (measured {}): estimate {} s against {} s measured",
            r.case,
            r.date,
            r.fitted,
            r.measured
        );
    }
}
