//! Numerical guards: a plan whose achieved risk sits on its limit is
//! reported as such, and the designer's answer agrees across the models
//! where probability theory says they agree.

use crate::common;
use common::json_of;
use lotsman::{Model, ModelKind, RiskPair, design_single};

/// The risk points `(p1, 0.05)` and `(p2, 0.10)`.
fn pair(model: &Model, p1: f64, p2: f64) -> RiskPair {
    common::pair(model, p1, 0.05, p2, 0.10)
}

/// Lot of 10 holding D = 2 at the RQL of 20%: the plan n = 9, c = 1 accepts
/// unless both nonconforming units are drawn, Pa = 1 - C(8, 7) / C(10, 9)
/// = 1 - 8/10 = 0.2 exactly (hand computation), which is beta itself.
#[test]
fn an_achieved_risk_on_its_limit_is_reported_as_such() {
    let v = json_of(&[
        "design",
        "--aql",
        "10%",
        "--alpha",
        "0.1",
        "--rql",
        "20%",
        "--beta",
        "0.2",
        "--lot-size",
        "10",
        "--format",
        "json",
    ]);
    assert_eq!(v["stages"][0]["n"], 9);
    assert_eq!(v["stages"][0]["accept"], 1);
    assert!((v["consumer"]["achieved_risk"].as_f64().unwrap() - 0.2).abs() < 1e-15);
    assert_eq!(v["consumer"]["near_limit"], true);
    assert_eq!(v["producer"]["near_limit"], false);
    let notes: Vec<&str> = v["notes"]
        .as_array()
        .unwrap()
        .iter()
        .map(|n| n.as_str().unwrap())
        .collect();
    assert!(
        notes
            .iter()
            .any(|n| n.contains("consumer's risk") && n.contains("within 1e-9 of beta")),
        "{notes:?}"
    );
    // A plan with margins carries no such note.
    let v = json_of(&["design", "--aql", "1%", "--rql", "6%", "--format", "json"]);
    assert_eq!(v["producer"]["near_limit"], false);
    assert_eq!(v["consumer"]["near_limit"], false);
}

const POINTS: [(f64, f64); 12] = [
    (0.001, 0.002),
    (0.001, 0.005),
    (0.001, 0.01),
    (0.002, 0.004),
    (0.002, 0.01),
    (0.005, 0.0075),
    (0.005, 0.01),
    (0.005, 0.05),
    (0.01, 0.02),
    (0.01, 0.05),
    (0.02, 0.06),
    (0.05, 0.25),
];

/// A lot of 10^9 units drawn without replacement is, for samples of a
/// few thousand, the binomial model: the hypergeometric tail differs from
/// the binomial one by a relative O(n / N), at most about 1e-5 here (the
/// finite-population factor), far below any design's margin at these
/// points. The plans must be identical.
#[test]
fn a_huge_lot_gives_the_binomial_plan() {
    let binomial = Model::new(ModelKind::Binomial, None).unwrap();
    let lot = Model::new(ModelKind::Hypergeometric, Some(1_000_000_000)).unwrap();
    for (p1, p2) in POINTS {
        let b = design_single(&binomial, &pair(&binomial, p1, p2)).unwrap();
        let h = design_single(&lot, &pair(&lot, p1, p2)).unwrap();
        assert_eq!((h.n, h.c), (b.n, b.c), "{p1} {p2}");
    }
}

/// For small p the Poisson model approximates the binomial: Le Cam's
/// inequality bounds the difference of any tail by n p^2 (L. Le Cam, 1960,
/// from memory), and the sample that reaches a given expected count scales
/// with 1 / p against 1 / (-ln(1 - p)), a relative shift of about p / 2.
/// So at p2 <= 1% both models give the same acceptance number, and sample
/// sizes within p2 of each other (relative), plus two units for rounding.
#[test]
fn small_qualities_give_the_poisson_plan_within_the_stated_tolerance() {
    let binomial = Model::new(ModelKind::Binomial, None).unwrap();
    let poisson = Model::new(ModelKind::Poisson, None).unwrap();
    let mut compared = 0;
    for (p1, p2) in POINTS.into_iter().filter(|&(_, p2)| p2 <= 0.01) {
        let b = design_single(&binomial, &pair(&binomial, p1, p2)).unwrap();
        let p = design_single(&poisson, &pair(&poisson, p1, p2)).unwrap();
        assert_eq!(p.c, b.c, "{p1} {p2}");
        let gap = (p.n as f64 - b.n as f64).abs();
        assert!(
            gap <= p2 * b.n as f64 + 2.0,
            "{p1} {p2}: binomial n = {}, Poisson n = {}",
            b.n,
            p.n
        );
        compared += 1;
    }
    assert_eq!(compared, 7);
}
