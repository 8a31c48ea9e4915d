//! Staged plans against published worked examples and the invariants the
//! staged designers promise. The exact values against an independent
//! reference are in the reference suite, tests/reference/ (staged_reference.json).

use crate::common;
use common::pair;
use lotsman::{
    Criterion, Decision, Model, ModelKind, Stage, StagedPlan, curtailed_outcomes, design_double,
    design_multiple, design_sequential, design_single, judge, judge_cumulative, measures,
    stage_outcomes, wald_lines,
};

fn binomial() -> Model {
    Model::new(ModelKind::Binomial, None).unwrap()
}

fn double(n1: u64, c1: u64, r1: u64, n2: u64, c2: u64, model: &Model) -> StagedPlan {
    let stages = vec![
        Stage {
            n: n1,
            accept: Some(c1),
            reject: r1,
        },
        Stage {
            n: n1 + n2,
            accept: Some(c2),
            reject: c2 + 1,
        },
    ];
    StagedPlan::new(stages, model).unwrap()
}

/// Montgomery, *Introduction to Statistical Quality Control*, the worked
/// double-sampling example n1 = 50, c1 = 1, n2 = 100, c2 = 3 at p = 0.05
/// (from memory): P(d1 <= 1) = 0.279; the second-stage acceptance
/// 0.261 x 0.037 + 0.220 x 0.0059 = 0.011; Pa = 0.290. The rounded
/// factors hold to the printed three digits.
#[test]
fn montgomery_double_plan_at_five_percent() {
    let m = binomial();
    let plan = double(50, 1, 4, 100, 3, &m);
    let o = stage_outcomes(&plan, &m, 0.05);
    assert!((o.accept[0] - 0.279).abs() < 5e-4, "{}", o.accept[0]);
    assert!((o.accept[1] - 0.011).abs() < 5e-4, "{}", o.accept[1]);
    assert!((o.pa() - 0.290).abs() < 5e-4, "{}", o.pa());
    // The factors: P(d1 = 2), P(d1 = 3), P(d2 <= 1), P(d2 = 0).
    for (n, k, cumulative, want) in [
        (50, 2, false, 0.261),
        (50, 3, false, 0.220),
        (100, 1, true, 0.037),
        (100, 0, true, 0.0059),
    ] {
        let got = if cumulative {
            m.tails(n, k, 0.05, 0, 0).cdf
        } else {
            m.pmf(n, k, 0.05, 0, 0)
        };
        assert!(
            (got - want).abs() < 5e-4 * want.max(0.01) * 10.0,
            "{n} {k}: {got}"
        );
    }
    // ASN = n1 + n2 P(second sample) = 50 + 100 (0.261 + 0.220) = 98.1
    // from the same printed factors.
    let asn = measures(&plan, &m, 0.05).asn;
    assert!((asn - 98.1).abs() < 0.5, "{asn}");
}

/// Montgomery's sequential example, p1 = 0.01, alpha = 0.05, p2 = 0.06,
/// beta = 0.10 (from memory): h1 = 1.22, h2 = 1.57, s = 0.028.
#[test]
fn montgomery_sequential_lines() {
    let m = binomial();
    let (h1, h2, s) = wald_lines(&m, &pair(&m, 0.01, 0.05, 0.06, 0.10));
    assert!((h1 - 1.22).abs() < 0.005, "{h1}");
    assert!((h2 - 1.57).abs() < 0.005, "{h2}");
    assert!((s - 0.028).abs() < 0.0005, "{s}");
}

#[test]
fn staged_designers_meet_both_points_and_inspect_less_than_the_single_plan() {
    for kind in [ModelKind::Binomial, ModelKind::Poisson] {
        let m = Model::new(kind, None).unwrap();
        let r = pair(&m, 0.01, 0.05, 0.06, 0.10);
        let single = design_single(&m, &r).unwrap();
        let designs = [
            design_double(&m, &r, Criterion::AsnAql, None).unwrap(),
            design_double(&m, &r, Criterion::AsnRql, None).unwrap(),
            design_double(&m, &r, Criterion::AsnMax, None).unwrap(),
            design_multiple(&m, &r, 5, Criterion::AsnAql).unwrap(),
            design_sequential(&m, &r).unwrap().0,
        ];
        for d in &designs {
            let at_p1 = stage_outcomes(&d.plan, &m, 0.01);
            let at_p2 = stage_outcomes(&d.plan, &m, 0.06);
            let alpha: f64 = at_p1.reject.iter().sum();
            assert!(alpha <= 0.05 && at_p2.pa() <= 0.10, "{kind:?} {}", d.plan);
            assert_eq!(alpha, d.producer_risk);
            let asn = measures(&d.plan, &m, 0.01).asn;
            assert!(asn < single.n as f64, "{kind:?} {}: {asn}", d.plan);
        }
        let seq = designs[4].plan.sequential_lines().unwrap();
        assert!(seq.truncation >= single.n && seq.truncation <= 4 * single.n);
    }
}

#[test]
fn a_fixed_second_sample_ratio_is_kept() {
    let m = binomial();
    let r = pair(&m, 0.01, 0.05, 0.06, 0.10);
    let d = design_double(&m, &r, Criterion::AsnAql, Some(2.0)).unwrap();
    let s = d.plan.stages();
    assert_eq!(s[1].n - s[0].n, 2 * s[0].n);
    let free = design_double(&m, &r, Criterion::AsnAql, None).unwrap();
    assert!(measures(&free.plan, &m, 0.01).asn <= measures(&d.plan, &m, 0.01).asn);
}

#[test]
fn curtailment_never_inspects_more_and_keeps_the_oc() {
    let m = Model::new(ModelKind::Hypergeometric, Some(600)).unwrap();
    let plan = double(40, 0, 3, 80, 3, &m);
    for p in [0.005, 0.02, 0.05, 0.1] {
        let full = stage_outcomes(&plan, &m, p);
        let cut = curtailed_outcomes(&plan, &m, p);
        assert_eq!(full.pa(), cut.pa());
        let asn = measures(&plan, &m, p).asn;
        assert!(cut.curtailed_units.unwrap() <= asn + 1e-9, "{p}");
    }
}

#[test]
fn judging_an_item_by_item_plan() {
    let m = binomial();
    let (d, _) = design_sequential(&m, &pair(&m, 0.01, 0.05, 0.06, 0.10)).unwrap();
    let lines = *d.plan.sequential_lines().unwrap();
    // Rejection number 2 for the first items: two nonconforming in the
    // first two units reject at once.
    assert_eq!(lines.rejection_number(2), 2);
    assert_eq!(
        judge(&d.plan, &m, &[1, 1]).unwrap().decision,
        Decision::Reject
    );
    let n = (1..lines.truncation)
        .find(|&n| lines.acceptance_number(n) == Some(0))
        .unwrap();
    let at = judge_cumulative(&d.plan, &m, n, 0).unwrap();
    assert_eq!((at.decision, at.stage as u64), (Decision::Accept, n));
    let before = judge_cumulative(&d.plan, &m, n - 1, 0).unwrap();
    assert_eq!(
        (before.decision, before.next_units),
        (Decision::Continue, Some(1))
    );
    assert!(judge_cumulative(&d.plan, &m, lines.truncation + 1, 0).is_err());
}

/// For close points Wald's lines from the agreed risks have no truncation
/// within four single samples that meets them; the designer then builds the
/// lines from scaled-down nominal risks and says so.
#[test]
fn close_points_get_lines_from_smaller_nominal_risks() {
    let m = binomial();
    let r = pair(&m, 0.001, 0.05, 0.003, 0.10);
    let (d, wald) = design_sequential(&m, &r).unwrap();
    assert!(wald.nominal_alpha < 0.05 && wald.nominal_beta < 0.10);
    assert!((wald.nominal_alpha / 0.05 - wald.nominal_beta / 0.10).abs() < 1e-12);
    assert!(d.producer_risk <= 0.05 && d.consumer_risk <= 0.10);
    let single = design_single(&m, &r).unwrap();
    assert!(d.plan.max_sample() <= 4 * single.n);
}
