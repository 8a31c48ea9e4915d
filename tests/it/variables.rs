//! Variables plans against textbook formulas and worked numbers, and the
//! designer's minimality as a property.

use crate::common;
use lotsman::{
    LimitKind, Model, ModelKind, NoncentralT, RiskPair, SigmaKind, Specification, design_variables,
};
use proptest::prelude::*;

fn risks(p1: f64, alpha: f64, p2: f64, beta: f64) -> RiskPair {
    common::pair(
        &Model::new(ModelKind::Binomial, None).unwrap(),
        p1,
        alpha,
        p2,
        beta,
    )
}

fn upper(sigma: SigmaKind) -> Specification {
    let value = (sigma == SigmaKind::Known).then_some(1.0);
    Specification::new(sigma, value, LimitKind::Upper, None, Some(10.0)).unwrap()
}

/// The classical sigma-known design: n = ((z_a + z_b)/(z_p1 - z_p2))^2 and
/// k = (z_p1 z_b + z_p2 z_a)/(z_a + z_b) (e.g. A. J. Duncan, *Quality
/// Control and Industrial Statistics*, and D. C. Montgomery, *Introduction
/// to Statistical Quality Control*, the chapters on variables sampling;
/// from memory). For p1 = 1%, alpha = 5%, p2 = 6%, beta = 10% the normal
/// quantiles 2.3263, 1.5548, 1.6449, 1.2816 (standard normal table) give
/// n = 14.39, so 15, and k = 1.893, which lies in the exact interval.
#[test]
fn sigma_known_matches_the_textbook_formula() {
    let d = design_variables(&upper(SigmaKind::Known), &risks(0.01, 0.05, 0.06, 0.10)).unwrap();
    assert_eq!(d.plan.n(), 15);
    let k_formula: f64 = (2.3263 * 1.2816 + 1.5548 * 1.6449) / (1.6449 + 1.2816);
    assert!((k_formula - 1.893).abs() < 1e-3);
    assert!(d.range.0 < k_formula && k_formula < d.range.1);
    assert!(d.producer_risk <= 0.05 && d.consumer_risk <= 0.10);
}

/// The sigma-unknown plan for the same points: the large-sample
/// approximation n = (1 + k^2/2) 14.39 = 40.2 (the textbook formula,
/// from memory) sits just under the exact noncentral t answer, which
/// needs a larger sample than sigma known, and k stays near 1.9.
#[test]
fn sigma_unknown_is_near_the_large_sample_approximation() {
    let d = design_variables(&upper(SigmaKind::Unknown), &risks(0.01, 0.05, 0.06, 0.10)).unwrap();
    let approx = d.approximate_n.unwrap();
    assert!((approx - 40.2).abs() < 0.1, "{approx}");
    assert!(d.plan.n() as f64 >= approx && (d.plan.n() as f64) < approx + 4.0);
    assert_eq!(d.known_sigma_n, 15);
    assert!((d.plan.k().unwrap() - 1.9).abs() < 0.01);
}

/// Two limits far apart behave like one limit: the nearer tail alone
/// matters, so the sigma-known two-limit plan needs the one-limit n.
#[test]
fn distant_second_limit_changes_nothing() {
    let two = Specification::new(
        SigmaKind::Known,
        Some(1.0),
        LimitKind::Both,
        Some(-30.0),
        Some(10.0),
    )
    .unwrap();
    let r = risks(0.01, 0.05, 0.06, 0.10);
    let d = design_variables(&two, &r).unwrap();
    assert_eq!(d.plan.n(), 15);
}

/// `k sqrt n` bounds at `n` for sigma unknown, straight from the
/// noncentral t quantiles (the definition, independent of the designer).
fn unknown_interval(r: &RiskPair, n: u64) -> (f64, f64) {
    let z = |p: f64| -normal_quantile(p);
    let root = (n as f64).sqrt();
    let lo = NoncentralT::new(n - 1, z(r.consumer().quality) * root)
        .quantile(1.0 - r.consumer().risk)
        / root;
    let hi =
        NoncentralT::new(n - 1, z(r.producer().quality) * root).quantile(r.producer().risk) / root;
    (lo, hi)
}

/// `Phi^-1(p)` by bisection on `Phi(x) = erfc(-x / sqrt 2) / 2` with
/// libm's erfc, independent of the crate's own quantile.
fn normal_quantile(p: f64) -> f64 {
    let phi = |x: f64| 0.5 * libm::erfc(-x / std::f64::consts::SQRT_2);
    let (mut lo, mut hi) = (-40.0, 40.0);
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if phi(mid) < p {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    0.5 * (lo + hi)
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(40))]

    /// The chosen (n, k) meets both points, and at n - 1 no k does.
    #[test]
    fn chosen_plan_meets_both_points_and_is_smallest(
        p1 in 0.001f64..0.04,
        ratio in 2.0f64..8.0,
        alpha in 0.01f64..0.10,
        beta in 0.05f64..0.20,
        known in any::<bool>(),
    ) {
        let p2 = (p1 * ratio).min(0.3);
        let r = risks(p1, alpha, p2, beta);
        let sigma = if known { SigmaKind::Known } else { SigmaKind::Unknown };
        let d = design_variables(&upper(sigma), &r).unwrap();
        let plan = d.plan;
        prop_assert!(1.0 - plan.pa(p1) <= alpha);
        prop_assert!(plan.pa(p2) <= beta);
        let n = plan.n();
        if known {
            let z = |p: f64| -normal_quantile(p);
            let m = (n - 1) as f64;
            if m >= 1.0 {
                let lo = z(p2) + z(beta) / m.sqrt();
                let hi = z(p1) - z(alpha) / m.sqrt();
                prop_assert!(lo > hi, "n - 1 = {} fits: [{lo}, {hi}]", n - 1);
            }
        } else if n > 2 {
            let (lo, hi) = unknown_interval(&r, n - 1);
            prop_assert!(lo > hi, "n - 1 = {} fits: [{lo}, {hi}]", n - 1);
        }
    }
}
