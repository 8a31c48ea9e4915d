//! Property tests of the invariants the designer and the models promise.

use lotsman::{
    Criterion, DesignError, Model, ModelKind, RiskPair, RiskPoint, Stage, StagedPlan,
    acceptance_probability, curtailed_outcomes, design_double, design_sequential, design_single,
    evaluate, format_quality, measures, nonconforming_in_lot, stage_outcomes,
};
use proptest::prelude::*;

fn model_strategy() -> impl Strategy<Value = Model> {
    prop_oneof![
        Just(Model::new(ModelKind::Binomial, None).unwrap()),
        Just(Model::new(ModelKind::Poisson, None).unwrap()),
        (200u64..20_000).prop_map(|n| Model::new(ModelKind::Hypergeometric, Some(n)).unwrap()),
    ]
}

/// Risk points with p1 from 0.2% to 10% and p2 / p1 from 1.5 to 12.
fn risks_strategy() -> impl Strategy<Value = (f64, f64, f64, f64)> {
    (
        0.002f64..0.10,
        1.5f64..12.0,
        prop::sample::select(vec![0.01, 0.05, 0.10]),
        prop::sample::select(vec![0.05, 0.10, 0.20]),
    )
        .prop_map(|(p1, ratio, a, b)| (p1, (p1 * ratio).min(0.6), a, b))
}

fn meets(model: &Model, n: u64, c: u64, r: &RiskPair) -> bool {
    let producer = model.tails(n, c, r.producer().quality, 0, 0).sf <= r.producer().risk;
    let consumer = model.tails(n, c, r.consumer().quality, 0, 0).cdf <= r.consumer().risk;
    producer && consumer
}

/// The smallest n over all c, by scanning n upward and every c at each n
/// (only for small answers; the reference fixture covers large ones).
fn brute_force_min_n(model: &Model, r: &RiskPair, n_cap: u64) -> Option<(u64, u64)> {
    for n in 1..=n_cap.min(model.max_sample()) {
        let c_top = if model.kind() == ModelKind::Poisson {
            4 * n + 20
        } else {
            n - 1
        };
        if let Some(c) = (0..=c_top).find(|&c| meets(model, n, c, r)) {
            return Some((n, c));
        }
    }
    None
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(256))]

    #[test]
    fn the_solved_plan_meets_both_points_and_one_unit_less_meets_none(
        model in model_strategy(), (p1, p2, a, b) in risks_strategy()
    ) {
        let risks = RiskPair::new(RiskPoint { quality: p1, risk: a }, RiskPoint { quality: p2, risk: b }, &model).unwrap();
        let Ok(d) = design_single(&model, &risks) else { return Ok(()) };
        prop_assert!(meets(&model, d.n, d.c, &risks));
        prop_assert!((d.producer_risk - model.tails(d.n, d.c, p1, 0, 0).sf).abs() < 1e-15);
        let smaller = d.n - 1;
        if smaller >= 1 {
            let c_top = if model.kind() == ModelKind::Poisson { 4 * smaller + 40 } else { smaller - 1 };
            for c in 0..=c_top {
                prop_assert!(!meets(&model, smaller, c, &risks), "n - 1 = {} meets with c = {}", smaller, c);
            }
        }
    }

    #[test]
    fn the_solver_finds_the_smallest_n_over_all_c(
        model in model_strategy(), p1 in 0.01f64..0.12, ratio in 2.0f64..8.0
    ) {
        let p2 = (p1 * ratio).min(0.7);
        let risks = RiskPair::new(RiskPoint { quality: p1, risk: 0.05 }, RiskPoint { quality: p2, risk: 0.10 }, &model).unwrap();
        let solved = design_single(&model, &risks).ok().map(|d| d.n);
        let brute = brute_force_min_n(&model, &risks, 400).map(|(n, _)| n);
        if let (Some(s), Some(bf)) = (solved, brute) {
            prop_assert_eq!(s, bf);
        } else {
            // The brute force stops at 400: the solver's answer must be above it.
            prop_assert!(solved.is_none_or(|s| s > 400), "solver {:?}, brute force {:?}", solved, brute);
        }
    }

    #[test]
    fn oc_falls_as_quality_worsens(
        model in model_strategy(), n in 2u64..400, c_frac in 0.0f64..0.3, p in 0.001f64..0.5, step in 1.0001f64..1.5
    ) {
        let c = ((n as f64 * c_frac) as u64).min(n - 1);
        let n = n.min(model.max_sample());
        let c = c.min(n - 1);
        let plan = StagedPlan::single(n, c, &model).unwrap();
        let worse = (p * step).min(0.999);
        prop_assert!(acceptance_probability(&plan, &model, worse) <= acceptance_probability(&plan, &model, p) + 1e-14);
    }

    #[test]
    fn probabilities_sum_to_one(model in model_strategy(), n in 1u64..3000, p in 0.0005f64..0.9) {
        let n = n.min(model.max_sample());
        let top = if model.kind() == ModelKind::Poisson { (n as f64 * p * 3.0 + 60.0) as u64 } else { n };
        let total: f64 = (0..=top).map(|k| model.pmf(n, k, p, 0, 0)).sum();
        prop_assert!((total - 1.0).abs() < 1e-12, "sum {}", total);
        // And the tails agree with the pmf at every cut tested.
        let c = top / 3;
        let cdf: f64 = (0..=c).map(|k| model.pmf(n, k, p, 0, 0)).sum();
        let t = model.tails(n, c, p, 0, 0);
        prop_assert!((t.cdf - cdf).abs() < 1e-12 && (t.cdf + t.sf - 1.0).abs() < 1e-14);
    }
}

/// A random valid plan of 2 to 5 stages on small numbers.
fn staged_strategy() -> impl Strategy<Value = Vec<Stage>> {
    prop::collection::vec((1u64..40, 0u64..3, 2u64..4), 1..5).prop_map(|parts| {
        let mut stages = Vec::new();
        let (mut n, mut floor) = (0u64, 0u64);
        for (units, gain, width) in parts {
            n += units;
            // Acceptance numbers grow slowly and stay below n; the open band
            // is at least one count wide.
            let accept = floor.min(n - 1);
            stages.push(Stage {
                n,
                accept: Some(accept),
                reject: accept + width,
            });
            floor += gain;
        }
        let last = stages.len() - 1;
        let a = stages[last].accept;
        stages[last].reject = a.map_or(1, |a| a + 1);
        stages
    })
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(128))]

    #[test]
    fn a_staged_plan_decides_every_lot_and_curtailment_only_saves(
        model in model_strategy(), stages in staged_strategy(), p in 0.001f64..0.6
    ) {
        let Ok(plan) = StagedPlan::new(stages, &model) else { return Ok(()) };
        let o = curtailed_outcomes(&plan, &model, p);
        let total: f64 = o.decided().iter().sum();
        prop_assert!((total - 1.0).abs() < 1e-12, "decided {}", total);
        let m = measures(&plan, &model, p);
        prop_assert!(m.asn_curtailed.unwrap() <= m.asn * (1.0 + 1e-12) + 1e-12);
        let worse = (p * 1.3).min(0.99);
        prop_assert!(acceptance_probability(&plan, &model, worse) <= m.pa + 1e-12);
    }
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(24))]

    #[test]
    fn staged_designs_meet_both_points(
        model in model_strategy(), p1 in 0.005f64..0.05, ratio in 3.0f64..8.0
    ) {
        let p2 = (p1 * ratio).min(0.5);
        let risks = RiskPair::new(RiskPoint { quality: p1, risk: 0.05 }, RiskPoint { quality: p2, risk: 0.10 }, &model).unwrap();
        let designs = [
            design_double(&model, &risks, Criterion::AsnAql, None),
            design_sequential(&model, &risks).map(|(d, _)| d),
        ];
        for d in designs.into_iter().flatten() {
            let alpha: f64 = stage_outcomes(&d.plan, &model, p1).reject.iter().sum();
            let beta = stage_outcomes(&d.plan, &model, p2).pa();
            prop_assert!(alpha <= 0.05 && beta <= 0.10, "{}: {} {}", d.plan, alpha, beta);
        }
    }
}

/// A finite lot of 20 to 20,000 units.
fn lot_strategy() -> impl Strategy<Value = Model> {
    (20u64..20_000).prop_map(|n| Model::new(ModelKind::Hypergeometric, Some(n)).unwrap())
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(128))]

    /// Issue 14, items 2 and 8: under the hypergeometric model every
    /// measure is at the lot quality D/N, so no AOQ at any asked quality
    /// exceeds the AOQL (the largest AOQ over the lot qualities D/N),
    /// neither as computed nor as printed, and two qualities that mean the
    /// same lot get the same figures.
    #[test]
    fn no_printed_aoq_exceeds_the_printed_aoql_in_a_finite_lot(
        model in lot_strategy(),
        stages in staged_strategy(),
        qualities in prop::collection::vec(0.0001f64..0.6, 1..12),
    ) {
        let Ok(plan) = StagedPlan::new(stages, &model) else { return Ok(()) };
        let e = evaluate(&plan, &model, &qualities).unwrap();
        let printed = |q: f64| format_quality(q, false).trim_end_matches('%').parse::<f64>().unwrap();
        for m in &e.points {
            let lot = model.lot_size().unwrap();
            let d = m.lot_nonconforming.unwrap();
            prop_assert_eq!(d, nonconforming_in_lot(m.quality, lot));
            prop_assert_eq!(m.lot_quality, Some(d as f64 / lot as f64));
            prop_assert!(m.aoq <= e.aoql.value * (1.0 + 1e-12), "AOQ {} at {} above the AOQL {}", m.aoq, m.quality, e.aoql.value);
            prop_assert!(printed(m.aoq) <= printed(e.aoql.value), "{} above {}", format_quality(m.aoq, false), format_quality(e.aoql.value, false));
            let same_lot = measures(&plan, &model, d as f64 / lot as f64);
            prop_assert_eq!((m.pa, m.aoq, m.ati, m.asn), (same_lot.pa, same_lot.aoq, same_lot.ati, same_lot.asn));
        }
    }
}

/// Any model with a lot of 5 to 3000 units.
fn model_with_lot_strategy() -> impl Strategy<Value = Model> {
    (
        prop::sample::select(vec![
            ModelKind::Binomial,
            ModelKind::Poisson,
            ModelKind::Hypergeometric,
        ]),
        5u64..3000,
    )
        .prop_map(|(kind, lot)| Model::new(kind, Some(lot)).unwrap())
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(32))]

    /// Issue 14, item 3: whenever the lot size is known, no designer
    /// proposes a sample larger than the lot; when the points need one, the
    /// answer is the refusal that says to inspect the whole lot, and the
    /// sample it names is the one the lot-free design finds.
    #[test]
    fn no_designed_sample_exceeds_its_lot(
        model in model_with_lot_strategy(), (p1, p2, a, b) in risks_strategy()
    ) {
        let risks = RiskPair::new(RiskPoint { quality: p1, risk: a }, RiskPoint { quality: p2, risk: b }, &model).unwrap();
        let lot = model.lot_size().unwrap();
        let designs = [
            design_single(&model, &risks).map(|d| d.plan),
            design_double(&model, &risks, Criterion::AsnAql, None).map(|d| d.plan),
            design_sequential(&model, &risks).map(|(d, _)| d.plan),
        ];
        for d in designs {
            match d {
                Ok(plan) => prop_assert!(plan.max_sample() <= lot, "{} in a lot of {}", plan, lot),
                Err(DesignError::WholeLot { needed, lot: l, .. }) => {
                    prop_assert_eq!(l, lot);
                    prop_assert!(needed > lot);
                    let free = Model::new(model.kind(), None).unwrap();
                    let unbounded = design_single(&free, &RiskPair::new(risks.producer(), risks.consumer(), &free).unwrap()).unwrap();
                    prop_assert_eq!(unbounded.n, needed);
                }
                Err(_) => {}
            }
        }
    }
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(64))]

    /// Issue 14, item 4: risks from 1e-40 to 0.3 (where 1 - alpha rounds to
    /// 1 below about 1e-16) give the smallest plan that meets both points
    /// on their own tails, P(X > c) <= alpha and P(X <= c) <= beta, and one
    /// unit less meets neither with any acceptance number.
    #[test]
    fn risks_far_below_double_precision_get_the_smallest_plan(
        model in model_strategy(),
        p1 in 0.005f64..0.05,
        ratio in 4.0f64..40.0,
        ln_alpha in -92.0f64..-1.2,
        ln_beta in -92.0f64..-1.2,
    ) {
        let (alpha, beta) = (ln_alpha.exp(), ln_beta.exp());
        let p2 = (p1 * ratio).min(0.95);
        let risks = RiskPair::new(RiskPoint { quality: p1, risk: alpha }, RiskPoint { quality: p2, risk: beta }, &model).unwrap();
        let d = match design_single(&model, &risks) {
            Ok(d) => d,
            // A lot too small to tell the points apart is the only refusal
            // these points may meet.
            Err(e) => {
                prop_assert!(matches!(e, DesignError::NoPlan { .. }), "{}", e);
                return Ok(());
            }
        };
        prop_assert!(meets(&model, d.n, d.c, &risks), "n = {}, c = {}", d.n, d.c);
        let smaller = d.n - 1;
        if smaller >= 1 && d.n <= 2000 {
            let c_top = if model.kind() == ModelKind::Poisson { 4 * smaller + 40 } else { smaller - 1 };
            for c in 0..=c_top {
                prop_assert!(!meets(&model, smaller, c, &risks), "n - 1 = {} meets with c = {}", smaller, c);
            }
        }
    }
}
