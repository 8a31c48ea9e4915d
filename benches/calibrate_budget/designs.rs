//! Designs of every scheme under each model: the cases of the estimates in
//! src/design/work.rs.

use lotsman::{
    Criterion, DesignRequest, Model, ModelKind, Nearby, Scheme, SchemeOptions, design_single,
    design_work, single_work, solve, solve_listing,
};

use crate::{Case, model, pair};

/// A design case: the scheme, the model, the two qualities, the criterion
/// and the number of stages (multiple plans).
type Run = (Scheme, Model, f64, f64, Criterion, u32);

/// Designs as `design` runs them (`solve`, with the window of nearby plans
/// for a single plan), every nearby plan, and the single designer alone.
pub(crate) fn designs(cases: &mut Vec<Case>) {
    let binomial = model(ModelKind::Binomial, None);
    let poisson = model(ModelKind::Poisson, None);
    let lot = |size: u64| model(ModelKind::Hypergeometric, Some(size));
    let (aql, rql, max) = (Criterion::AsnAql, Criterion::AsnRql, Criterion::AsnMax);
    let (single, double) = (Scheme::Single, Scheme::Double);
    let (sequential, multiple) = (Scheme::Sequential, Scheme::Multiple);
    let runs: Vec<Run> = vec![
        (single, binomial, 0.01, 0.0102, aql, 7),
        (single, poisson, 0.01, 0.0102, aql, 7),
        (single, lot(100_000_000), 0.01, 0.0102, aql, 7),
        (single, lot(1_000_000), 0.012, 0.0125, aql, 7),
        (double, binomial, 0.005, 0.012, aql, 7),
        (double, binomial, 0.005, 0.012, max, 7),
        (double, binomial, 0.01, 0.03, aql, 7),
        (double, binomial, 1e-6, 6e-6, aql, 7),
        (double, poisson, 0.01, 0.03, rql, 7),
        (double, poisson, 0.01, 0.03, aql, 7),
        (double, binomial, 0.01, 0.03, rql, 7),
        (double, lot(20_000), 0.01, 0.03, aql, 7),
        (double, lot(1_000_000), 0.005, 0.012, aql, 7),
        (double, lot(1_000_000), 0.005, 0.012, max, 7),
        (double, lot(1_000_000), 0.005, 0.009, max, 7),
        (sequential, binomial, 0.01, 0.013, aql, 7),
        (sequential, binomial, 0.01, 0.011, aql, 7),
        (sequential, poisson, 0.001, 0.0014, aql, 7),
        (sequential, lot(30_000), 0.005, 0.008, aql, 7),
        (sequential, lot(1_000_000), 0.001, 0.0014, aql, 7),
        (multiple, binomial, 0.005, 0.01, aql, 7),
        (multiple, lot(1_000_000), 0.01, 0.02, aql, 3),
        (multiple, lot(1_000_000), 0.002, 0.004, aql, 7),
    ];
    for (scheme, m, p1, p2, criterion, stages) in runs {
        let request = DesignRequest {
            scheme,
            options: SchemeOptions {
                criterion,
                stages,
                ..SchemeOptions::default()
            },
            model: m,
            risks: pair(&m, p1, p2),
        };
        cases.push(Case {
            name: format!(
                "design {scheme} {} {p1}/{p2} {}{}",
                m.kind(),
                criterion.name(),
                if scheme == multiple {
                    format!(" k = {stages}")
                } else {
                    String::new()
                }
            ),
            estimate: design_work(&request, Some(Nearby::Window)),
            shared: scheme == double,
            job: Box::new(move || solve(&request).is_ok()),
        });
    }
    for (m, p1, p2) in [
        (binomial, 0.01, 0.011),
        (lot(1_000_000), 0.01, 0.012),
        (lot(100_000_000), 0.01, 0.0105),
    ] {
        let request = DesignRequest {
            scheme: single,
            options: SchemeOptions::default(),
            model: m,
            risks: pair(&m, p1, p2),
        };
        cases.push(Case {
            name: format!("design single {} {p1}/{p2}, every nearby plan", m.kind()),
            estimate: design_work(&request, Some(Nearby::All)),
            shared: false,
            job: Box::new(move || solve_listing(&request, Nearby::All).is_ok()),
        });
    }
    for (size, p1, p2) in [
        (100_000_000, 0.01, 0.0101),
        (1_000_000, 0.012, 0.0125),
        (10_000_000_000, 0.01, 0.0101),
    ] {
        let m = lot(size);
        let risks = pair(&m, p1, p2);
        cases.push(Case {
            name: format!("single designer alone, lot {size}, {p1}/{p2}"),
            estimate: single_work(&m, &risks, false),
            shared: false,
            job: Box::new(move || design_single(&m, &risks).is_ok()),
        });
    }
}
