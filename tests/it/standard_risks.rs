//! The risks a MIL-STD-105E table plan really gives (issue 16): its exact
//! OC through the crate's evaluation, checked against `evaluate` on the
//! same stages written by hand and against scipy.stats, and the table plan
//! beside the two-point plan for a consumer's point.

use super::standard::{model, plan};
use lotsman::{
    ConsumerPoint, ModelKind, Scheme, Severity, Stage, StagedPlan, evaluate, true_risks,
};

/// The table plans' OC through `true_risks` equals `evaluate` on the same
/// stages written by hand, and both equal scipy.stats: binom.cdf(3, 125,
/// p) for K at 1.0 single; for the double and multiple plans the stage
/// recursion summed with scipy.stats.binom.pmf (values computed for this
/// test, 16 digits); poisson.cdf(3, 1.25); hypergeom.cdf(3, 1500, 15,
/// 125).
#[test]
fn table_plans_have_the_exact_oc_of_their_stages() {
    let stage = |n, accept, reject| Stage { n, accept, reject };
    let binomial = model(ModelKind::Binomial, None);
    // (scheme, the stages by hand, (quality, Pa) from scipy)
    type Case = (Scheme, Vec<Stage>, Vec<(f64, f64)>);
    let cases: Vec<Case> = vec![
        (
            Scheme::Single,
            vec![stage(125, Some(3), 4)],
            vec![(0.01, 0.962_550_937_836_635_9)],
        ),
        (
            Scheme::Double,
            vec![stage(80, Some(1), 4), stage(160, Some(4), 5)],
            vec![
                (0.01, 0.977_391_952_305_540_7),
                (0.05, 0.136_417_702_096_363_78),
            ],
        ),
        (
            Scheme::Multiple,
            [
                (None, 3),
                (Some(0), 3),
                (Some(1), 4),
                (Some(2), 5),
                (Some(3), 6),
                (Some(4), 6),
                (Some(6), 7),
            ]
            .iter()
            .enumerate()
            .map(|(i, &(a, r))| stage(32 * (i as u64 + 1), a, r))
            .collect(),
            vec![
                (0.01, 0.961_652_921_725_059_8),
                (0.03, 0.452_300_427_153_317_9),
                (0.05, 0.099_296_648_718_851_95),
            ],
        ),
    ];
    for (scheme, stages, reference) in cases {
        let p = plan("K", "1.0", Severity::Normal, scheme);
        let qualities: Vec<f64> = reference.iter().map(|r| r.0).collect();
        let risks = true_risks(&p, &binomial, &qualities, None).unwrap();
        let by_hand = evaluate(
            &StagedPlan::new(stages, &binomial).unwrap(),
            &binomial,
            &qualities,
        )
        .unwrap();
        for ((got, hand), (q, pa)) in risks
            .evaluation
            .points
            .iter()
            .zip(&by_hand.points)
            .zip(&reference)
        {
            assert_eq!(got.pa, hand.pa, "{scheme} at {q}");
            assert!(
                (got.pa - pa).abs() < 1e-12,
                "{scheme} at {q}: {} vs {pa}",
                got.pa
            );
        }
        // The producer's risk is the OC's complement at the AQL, and the
        // qualities at Pa 0.95, 0.50, 0.10 sit where the OC says.
        let pa = |q: f64| lotsman::acceptance_probability(&p.stages, &binomial, q);
        assert!((risks.producer_risk - (1.0 - pa(0.01))).abs() < 1e-15);
        for (target, q) in [
            (0.95, risks.quality_at_pa_95),
            (0.50, risks.quality_at_pa_50),
            (0.10, risks.quality_at_pa_10),
        ] {
            assert!(
                (pa(q) - target).abs() < 1e-9,
                "{scheme}: Pa({q}) = {}",
                pa(q)
            );
        }
    }
    let p = plan("K", "1.0", Severity::Normal, Scheme::Single);
    let poisson = true_risks(&p, &model(ModelKind::Poisson, None), &[0.01], None).unwrap();
    assert!((poisson.evaluation.points[0].pa - 0.961_730_945_710_377_6).abs() < 1e-12);
    let hyper = model(ModelKind::Hypergeometric, Some(1500));
    let r = true_risks(&p, &hyper, &[0.01], None).unwrap();
    assert!((r.evaluation.points[0].pa - 0.969_546_335_509_244_2).abs() < 1e-12);
    assert!((r.producer_risk - (1.0 - 0.969_546_335_509_244_2)).abs() < 1e-12);
}

/// Against a consumer's point the table plan's risk there is reported
/// with the two-point plan for the same points beside it: for K at 1.0
/// (n = 125, Ac 3), Pa(5%) = binom.cdf(3, 125, 0.05) = 0.1238 (scipy), more
/// than beta = 0.10; the designer's single plan for (1%, 0.05) and (5%,
/// 0.10) is n = 132, c = 3 (scipy: binom.cdf(3, 132, 0.01) = 0.9557,
/// binom.cdf(3, 132, 0.05) = 0.0992; n = 131 gives 0.1025 at 5%, and
/// c = 2 needs n = 105, where the risk at 1% is 0.089).
#[test]
fn the_consumer_point_and_the_two_point_plan() {
    let p = plan("K", "1.0", Severity::Normal, Scheme::Single);
    let binomial = model(ModelKind::Binomial, None);
    let point = ConsumerPoint {
        rql: 0.05,
        beta: 0.10,
        alpha: 0.05,
    };
    let r = true_risks(&p, &binomial, &[], Some(point)).unwrap();
    let c = r.consumer.unwrap();
    assert!(
        (c.consumer_risk - 0.123_784_7).abs() < 1e-7,
        "{}",
        c.consumer_risk
    );
    assert!(!c.meets_beta);
    assert_eq!(c.table_n, 125);
    let d = c.design.unwrap();
    assert_eq!(d.design.plan.as_single(), Some((132, 3)));
    assert_eq!(d.n, 132);
    // An RQL not above the AQL is refused, not designed.
    let bad = ConsumerPoint {
        rql: 0.005,
        ..point
    };
    assert!(true_risks(&p, &binomial, &[], Some(bad)).is_err());
}
