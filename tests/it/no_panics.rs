//! No panics (proptest): arbitrary text and numbers fed to every parser and
//! to the design, evaluate, judge and verify entry points give a value or a
//! typed error with a message, never a panic. (A panic fails a proptest
//! case, so every property below is "the call returns".)
//!
//! The designers are exact searches, so a pair of points one part in a
//! thousand apart is a legitimate, slow request; the staged and variables
//! designers are fed points that differ by at least a factor 1.2, where
//! each call returns within milliseconds. The input suite
//! (tests/refusals.rs) times the refusals of closer points.

use std::path::Path;

use lotsman::{
    Criterion, LimitKind, Model, ModelKind, PlanSource, Protection, QualityRange,
    RectifyingRequest, RiskGrid, RiskPair, RiskPoint, Scheme, SigmaKind, Specification, Stage,
    StagedPlan, TradeoffRequest, VariablesPlan, design_double, design_multiple, design_rectifying,
    design_sequential, design_single, design_variables, evaluate, judge, judge_cumulative,
    judge_measurements, parse_count, parse_fraction, parse_fraction_list, parse_measurements,
    parse_number, parse_stage, tradeoff, verify,
};
use proptest::prelude::*;

/// Text that looks like what a user types into a number flag, and text
/// that does not look like anything.
fn typed() -> impl Strategy<Value = String> {
    prop_oneof![
        "[-+0-9.eE%, :_]{0,24}",
        "\\PC{0,40}",
        Just("1e-400".to_string()),
        Just("-0".to_string()),
        Just("1%%".to_string()),
        Just("NaN".to_string()),
        Just("inf".to_string()),
        Just("18446744073709551616".to_string()),
    ]
}

/// Any f64, the awkward ones included.
fn number() -> impl Strategy<Value = f64> {
    prop_oneof![
        any::<f64>(),
        Just(f64::NAN),
        Just(f64::INFINITY),
        Just(-0.0),
        Just(0.0),
        Just(1.0),
        Just(f64::MIN_POSITIVE),
        0.0..1.0f64,
    ]
}

fn model_of(kind: u8, lot: Option<u64>) -> Result<Model, lotsman::InputError> {
    let kind = match kind % 3 {
        0 => ModelKind::Binomial,
        1 => ModelKind::Hypergeometric,
        _ => ModelKind::Poisson,
    };
    Model::new(kind, lot)
}

/// An error must say something: a typed error with an empty message would
/// leave the user with nothing.
fn said<T, E: std::fmt::Display>(r: Result<T, E>) -> Option<T> {
    match r {
        Ok(v) => Some(v),
        Err(e) => {
            assert!(!e.to_string().trim().is_empty(), "an error with no message");
            None
        }
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 256, ..ProptestConfig::default() })]

    #[test]
    fn the_number_parsers_return(text in typed()) {
        said(parse_fraction("--aql", &text));
        said(parse_number("--second-ratio", &text));
        said(parse_count("--lot-size", &text, u64::MAX));
        said(parse_stage(&text));
        said(parse_fraction_list("--at", &text));
        if let Some(range) = said(QualityRange::parse("--range", &text)) {
            prop_assert!(range.points().iter().all(|p| p.is_finite()));
        }
    }

    #[test]
    fn the_measurement_reader_returns(text in "\\PC{0,200}|[-0-9.,;\\n\\r\"a-z\u{feff} ]{0,200}", column in proptest::option::of("[a-z_]{0,8}")) {
        said(parse_measurements(&text, column.as_deref()));
    }

    #[test]
    fn the_risk_points_and_the_single_designer_return(
        kind in any::<u8>(),
        lot in proptest::option::of(prop_oneof![any::<u64>(), 1..5000u64]),
        p1 in number(), alpha in number(), p2 in number(), beta in number(),
    ) {
        if let Some(model) = said(model_of(kind, lot)) {
            let risks = RiskPair::new(
                RiskPoint { quality: p1, risk: alpha },
                RiskPoint { quality: p2, risk: beta },
                &model,
            );
            if let Some(risks) = said(risks)
                && let Some(d) = said(design_single(&model, &risks)) {
                    prop_assert!(d.producer_risk <= alpha && d.consumer_risk <= beta);
                }
        }
    }

    #[test]
    fn evaluate_and_judge_return_for_any_valid_plan(
        kind in any::<u8>(),
        lot in proptest::option::of(1..3000u64),
        raw in proptest::collection::vec((0..400u64, proptest::option::of(0..30u64), 0..40u64), 1..5),
        qualities in proptest::collection::vec(number(), 0..6),
        found in proptest::collection::vec(0..50u64, 0..6),
        inspected in 0..500u64,
    ) {
        let Some(model) = said(model_of(kind, lot)) else { return Ok(()); };
        let stages: Vec<Stage> = raw.into_iter().map(|(n, accept, reject)| Stage { n, accept, reject }).collect();
        if let Some(plan) = said(StagedPlan::new(stages, &model)) {
            if let Some(e) = said(evaluate(&plan, &model, &qualities)) {
                for m in &e.points {
                    prop_assert!((0.0..=1.0).contains(&m.pa), "Pa {}", m.pa);
                }
            }
            said(judge(&plan, &model, &found));
            said(judge_cumulative(&plan, &model, inspected, found.first().copied().unwrap_or(0)));
        }
    }

    #[test]
    fn the_grid_and_the_minimum_inspection_designer_return(
        kind in any::<u8>(),
        lot in proptest::option::of(prop_oneof![0..10u64, 10..5000u64]),
        aql in proptest::collection::vec(number(), 0..3),
        rql in proptest::collection::vec(number(), 0..3),
        alpha in number(), beta in number(),
        cost in proptest::option::of((number(), number())),
        average in number(), ltpd in number(), aoql in number(), double in any::<bool>(),
    ) {
        let Some(model) = said(model_of(kind, lot)) else { return Ok(()); };
        let scheme = if double { Scheme::Double } else { Scheme::Single };
        // The grid: every cell is a single design; keep its points apart.
        let apart = |v: &[f64]| v.iter().all(|&q| q.is_nan() || q <= 0.0 || q >= 1e-4);
        if apart(&aql) && apart(&rql)
            && let Some(request) = said(TradeoffRequest::new(
                RiskGrid { aql, rql, alpha, beta }, model, Scheme::Single, Criterion::AsnAql, cost,
            )) {
                tradeoff(&request, &|| {});
            }
        for protection in [
            Protection::Ltpd(RiskPoint { quality: ltpd, risk: beta }),
            Protection::Aoql(aoql),
        ] {
            if let Some(request) = said(RectifyingRequest::new(model, average, protection, scheme)) {
                // Close qualities are slow, not wrong; keep these apart too.
                if ltpd.max(aoql) > 2.0 * average && average > 1e-3 {
                    said(design_rectifying(&request));
                }
            }
        }
    }

    #[test]
    fn a_plan_source_of_any_text_loads_or_is_refused(text in "\\PC{0,300}") {
        if let Some(source) = said(PlanSource::from_yaml(&text, Path::new("any.yaml"))) {
            said(verify(&source));
        }
    }

    #[test]
    fn a_demo_source_with_one_value_changed_loads_verifies_or_is_refused(
        which in 0..7usize,
        line in any::<prop::sample::Index>(),
        value in typed(),
    ) {
        let (_, text) = lotsman::DEMO_PLANS[which % lotsman::DEMO_PLANS.len()];
        let lines: Vec<&str> = text.lines().collect();
        let i = line.index(lines.len());
        let edited: String = lines
            .iter()
            .enumerate()
            .map(|(j, l)| match l.split_once(": ") {
                Some((key, _)) if j == i => format!("{key}: {value}\n"),
                _ => format!("{l}\n"),
            })
            .collect();
        if let Some(source) = said(PlanSource::from_yaml(&edited, Path::new("edited.yaml"))) {
            said(verify(&source));
        }
    }

    #[test]
    fn judging_any_readings_returns(
        values in proptest::collection::vec(number(), 0..60),
        n in 2..50u64,
        k in number(),
        sigma in proptest::option::of(number()),
        aql in number(),
    ) {
        let kind = if sigma.is_some() { SigmaKind::Known } else { SigmaKind::Unknown };
        if let Some(spec) = said(Specification::new(kind, sigma, LimitKind::Lower, Some(5.8), None))
            && let Some(plan) = said(VariablesPlan::new(spec, n, k)) {
                said(judge_measurements(&plan, &values, aql));
            }
    }
}

proptest! {
    // Each case runs four exact designers: fewer cases keep the debug build's
    // test run short.
    #![proptest_config(ProptestConfig { cases: 48, ..ProptestConfig::default() })]

    #[test]
    fn the_staged_and_variables_designers_return(
        kind in any::<u8>(),
        lot in 20..100_000u64,
        p1 in 0.001..0.2f64,
        ratio in 1.2..30.0f64,
        alpha in 0.01..0.2f64,
        beta in 0.01..0.2f64,
        stages in 2..8u32,
        sigma in proptest::option::of(number()),
        lower in proptest::option::of(number()),
        upper in proptest::option::of(number()),
        limit in 0..3u8,
    ) {
        let model = model_of(kind, Some(lot)).unwrap();
        let Ok(risks) = RiskPair::new(
            RiskPoint { quality: p1, risk: alpha },
            RiskPoint { quality: (p1 * ratio).min(0.95), risk: beta },
            &model,
        ) else {
            return Ok(());
        };
        said(design_double(&model, &risks, Criterion::AsnAql, None));
        said(design_multiple(&model, &risks, stages, Criterion::AsnAql));
        said(design_sequential(&model, &risks));
        let limit = [LimitKind::Lower, LimitKind::Upper, LimitKind::Both][limit as usize];
        let kind = if sigma.is_some() { SigmaKind::Known } else { SigmaKind::Unknown };
        if let Some(spec) = said(Specification::new(kind, sigma, limit, lower, upper)) {
            said(design_variables(&spec, &risks));
        }
    }
}
