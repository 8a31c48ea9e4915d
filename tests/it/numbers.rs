//! Wrong or misleading numbers (issue 14, items 1 to 4 and 8): every
//! quantity is guarded by its kind, a Poisson rate is shown per unit and
//! per 100 units, a finite lot's measures are at its own quality D/N, no
//! sample exceeds its lot, and the ends of the double range give true
//! answers. Refusals are in tests/refusals.rs; the invariants in
//! tests/properties.rs; the values against scipy and mpmath in
//! the reference suite, tests/reference/.

use crate::common;
use common::{json_of, lotsman, pdf_text, stdout_of};

/// Runs `args` in `dir` and returns stdout; the run must succeed.
fn run_in(dir: &std::path::Path, args: &[&str]) -> String {
    let out = lotsman()
        .current_dir(dir)
        .args(args)
        .assert()
        .success()
        .get_output()
        .stdout
        .clone();
    String::from_utf8(out).unwrap()
}

/// Item 1: 1.5 and 4 nonconformities per unit are rates, not
/// probabilities. The source that `design` writes is evaluated and printed,
/// and every quality, AOQ and AOQL is shown per unit and per 100 units.
#[test]
fn poisson_rates_above_one_per_unit_are_evaluated_and_printed() {
    let dir = tempfile::tempdir().unwrap();
    let d = dir.path();
    run_in(
        d,
        &[
            "design", "--model", "poisson", "--aql", "1.5", "--rql", "4", "--output", "p.yaml",
        ],
    );
    let table = run_in(d, &["evaluate", "p.yaml"]);
    assert!(
        table.contains("Quality per unit (per 100 units)")
            && table.contains("AOQ per unit (per 100 units)"),
        "{table}"
    );
    // AOQ at the AQL: Pa 0.957379 x 1.5 = 1.436 per unit (hand computation
    // from the achieved producer's risk 0.04262 that design prints).
    assert!(
        table.contains("1.500 (150.0)") && table.contains("1.436 (143.6)"),
        "{table}"
    );
    assert!(
        table.contains("AOQL 1.632 per unit (163.2 per 100 units)"),
        "{table}"
    );
    let v: serde_json::Value =
        serde_json::from_str(&run_in(d, &["evaluate", "p.yaml", "--format", "json"])).unwrap();
    assert_eq!(v["quality_unit"], "per_unit");
    assert!(v["aoql"]["value"].as_f64().unwrap() > 1.0);
    let csv = run_in(d, &["evaluate", "p.yaml", "--format", "csv"]);
    assert!(
        csv.starts_with("quality_per_unit,pa,aoq_per_unit,ati,asn,asn_curtailed\n"),
        "{csv}"
    );
    lotsman()
        .current_dir(d)
        .args(["sheet", "p.yaml"])
        .assert()
        .success();
    let text = pdf_text(&std::fs::read(d.join("p.pdf")).unwrap());
    for part in [
        "Quality per unit",
        "1.5 (150 per 100)",
        "Per 100 units",
        "AOQ per unit",
    ] {
        assert!(text.contains(part), "no '{part}' in\n{text}");
    }
    let design = stdout_of(&[
        "design", "--model", "poisson", "--aql", "1.5", "--rql", "4", "--format", "json",
    ]);
    assert!(
        design.contains("\"quality_unit\": \"per_unit\""),
        "{design}"
    );
}

/// Item 2, the example: 2.29% to 2.32% all mean D = 46 in a lot of
/// 2000, so they get one AOQ, and no AOQ is above the AOQL.
#[test]
fn qualities_that_mean_the_same_lot_get_the_same_measures() {
    let args = [
        "evaluate",
        "--n",
        "125",
        "--c",
        "3",
        "--lot-size",
        "2000",
        "--range",
        "0.0229:0.0233:5",
    ];
    let mut json = args.to_vec();
    json.extend(["--format", "json"]);
    let v = json_of(&json);
    let points = v["points"].as_array().unwrap();
    let aoql = v["aoql"]["value"].as_f64().unwrap();
    for p in &points[..4] {
        assert_eq!(p["lot_nonconforming"], 46);
        assert_eq!(p["lot_quality"].as_f64().unwrap(), 0.023);
        assert_eq!(p["aoq"], points[0]["aoq"]);
    }
    assert_eq!(points[4]["lot_nonconforming"], 47);
    for p in points {
        assert!(p["aoq"].as_f64().unwrap() <= aoql, "{p}");
    }
    let table = stdout_of(&args);
    assert!(
        table.contains("D in the lot") && table.contains("Lot quality D/N"),
        "{table}"
    );
    assert!(
        table.contains("AOQL 1.459% at lot quality 2.300% (D = 46)"),
        "{table}"
    );
    let mut csv = args.to_vec();
    csv.extend(["--format", "csv"]);
    let csv = stdout_of(&csv);
    assert!(
        csv.starts_with(
            "quality,lot_nonconforming,lot_quality,pa,aoq,ati,asn,asn_curtailed\n0.0229,46,0.023,"
        ),
        "{csv}"
    );
}

/// Item 8: in a lot of 300, the AQL 0.65% means D = 2, a lot quality of
/// 0.6667%. The sheet's quality table shows the AQL as agreed, with D and
/// the lot quality its row is computed at.
#[test]
fn the_sheet_shows_the_lot_quality_and_d_beside_the_agreed_quality() {
    let dir = tempfile::tempdir().unwrap();
    let d = dir.path();
    run_in(
        d,
        &[
            "design",
            "--aql",
            "0.65%",
            "--rql",
            "5%",
            "--lot-size",
            "300",
            "--output",
            "h.yaml",
        ],
    );
    lotsman()
        .current_dir(d)
        .args(["sheet", "h.yaml"])
        .assert()
        .success();
    let text = pdf_text(&std::fs::read(d.join("h.pdf")).unwrap());
    for part in ["D in the lot", "Lot quality D/N", "0.6500%", "0.6667%"] {
        assert!(text.contains(part), "no '{part}' in\n{text}");
    }
}

/// Item 4: alpha = 5e-17, where 1 - alpha rounds to 1. The smallest plan
/// for 1% / 99% is n = 9, c = 8 (hand computation: P(X = 9) = 0.01^9 =
/// 1e-18 <= 5e-17, while n = 8, c = 7 has 1e-16; Pa(99%) = 1 - 0.99^9 =
/// 0.0865), not a refusal as "too close"; the risk prints as written.
#[test]
fn a_risk_where_one_minus_alpha_rounds_to_one_gets_its_smallest_plan() {
    let args = [
        "design", "--aql", "1%", "--rql", "99%", "--alpha", "5e-17", "--format", "json",
    ];
    let v = json_of(&args);
    assert_eq!(
        (
            v["stages"][0]["n"].as_u64(),
            v["stages"][0]["accept"].as_u64()
        ),
        (Some(9), Some(8))
    );
    let alpha = v["producer"]["achieved_risk"].as_f64().unwrap();
    assert!((alpha - 1e-18).abs() < 1e-30, "{alpha:e}");
    let table = stdout_of(&args[..7]);
    assert!(table.contains("alpha 5e-17"), "{table}");
}

/// Item 4: alpha = beta = 1e-30 with every designer. Each plan is checked
/// on its own tails by the exact stage recursion (never as 1 - Pa); the
/// single plan for 1% / 99% is n = 41, c = 20, as the mpmath reference
/// finds (tests/data/reference.json, extreme_designs).
#[test]
fn every_designer_meets_risks_of_1e_30() {
    use lotsman::{
        Criterion, LimitKind, Model, ModelKind, Protection, RectifyingRequest, RiskGrid, RiskPoint,
        Scheme, SigmaKind, Specification, TradeoffRequest, VariablesRequest, design_double,
        design_multiple, design_rectifying, design_sequential, design_single, stage_outcomes,
        tradeoff,
    };
    let model = Model::new(ModelKind::Binomial, None).unwrap();
    let risks = common::pair(&model, 0.01, 1e-30, 0.99, 1e-30);
    let single = design_single(&model, &risks).unwrap();
    assert_eq!((single.n, single.c), (41, 20));
    let staged = [
        design_double(&model, &risks, Criterion::AsnAql, None).unwrap(),
        design_multiple(&model, &risks, 7, Criterion::AsnAql).unwrap(),
        design_sequential(&model, &risks).unwrap().0,
    ];
    for d in staged.iter().map(|d| &d.plan).chain([&single.plan]) {
        let alpha: f64 = stage_outcomes(d, &model, 0.01).reject.iter().sum();
        let beta: f64 = stage_outcomes(d, &model, 0.99).accept.iter().sum();
        assert!(alpha <= 1e-30 && beta <= 1e-30, "{d}: {alpha:e}, {beta:e}");
        assert!(
            alpha > 0.0 && beta > 0.0,
            "{d}: risks kept, not rounded away"
        );
    }
    // Variables, sigma known, one limit: the producer's risk from its own
    // tail, not 1 - Pa (which would say 0).
    let spec = Specification::new(
        SigmaKind::Known,
        Some(1.0),
        LimitKind::Upper,
        None,
        Some(5.0),
    )
    .unwrap();
    let variables = common::pair(&model, 0.01, 1e-30, 0.10, 1e-30);
    let v = VariablesRequest::new(spec, variables, model)
        .unwrap()
        .design()
        .unwrap();
    assert!(
        v.producer_risk > 0.0 && v.producer_risk <= 1e-30,
        "{:e}",
        v.producer_risk
    );
    assert!(v.consumer_risk <= 1e-30, "{:e}", v.consumer_risk);
    // Rectify, LTPD with a consumer's risk of 1e-30.
    let lot = Model::new(ModelKind::Hypergeometric, Some(1000)).unwrap();
    let ltpd = Protection::Ltpd(RiskPoint {
        quality: 0.5,
        risk: 1e-30,
    });
    let r = design_rectifying(&RectifyingRequest::new(lot, 0.005, ltpd, Scheme::Single).unwrap())
        .unwrap();
    let pa = r.plan.unwrap().pa_at_ltpd.unwrap();
    assert!(pa <= 1e-30, "{pa:e}");
    // The grid: every cell a plan.
    let grid = tradeoff(
        &TradeoffRequest::new(
            RiskGrid {
                aql: vec![0.01, 0.05],
                rql: vec![0.9, 0.99],
                alpha: 1e-30,
                beta: 1e-30,
            },
            model,
            Scheme::Single,
            Criterion::AsnAql,
            None,
        )
        .unwrap(),
        &|| {},
    );
    assert!(grid.cells.iter().all(|c| c.outcome.is_ok()));
}

/// Item 4: a subnormal quality (1e-310) is evaluated, and every number is
/// printed in a short scientific form, not three hundred zeros. At such a
/// quality a lot is all but certainly accepted: the fully curtailed ASN of
/// n = 10, c = 1 is the 9 units after which acceptance is certain.
#[test]
fn subnormal_qualities_are_evaluated_and_printed_short() {
    let csv = stdout_of(&[
        "evaluate", "--n", "10", "--c", "1", "--at", "1e-310", "--format", "csv",
    ]);
    assert_eq!(csv.lines().nth(1), Some("1e-310,1,1e-310,,10,9"), "{csv}");
    let table = stdout_of(&["evaluate", "--n", "10", "--c", "1", "--at", "1e-310"]);
    assert!(
        table.contains("1.000e-308%") && !table.contains("0.0000000000"),
        "{table}"
    );
    // n = 4, c = 0 against 50%: the producer's risk 1 - (1 - p)^4 = 4e-310
    // (hand computation), kept as a subnormal, not rounded to 0.
    let v = json_of(&[
        "design", "--aql", "1e-310", "--rql", "50%", "--format", "json",
    ]);
    assert_eq!(v["stages"][0]["n"], 4);
    let alpha = v["producer"]["achieved_risk"].as_f64().unwrap();
    assert!((alpha - 4e-310).abs() < 1e-322, "{alpha:e}");
    let seq = json_of(&[
        "design",
        "--aql",
        "1e-310",
        "--rql",
        "50%",
        "--scheme",
        "sequential",
        "--format",
        "json",
    ]);
    assert_eq!(seq["sequential"]["truncation"], 4, "{seq}");
}

/// Item 4: a Poisson count whose mean overflows (a rate near the largest
/// double times a billion units) is above every acceptance number: Pa is
/// 0, where the tail sum once gave NaN and a clamp turned it into 1.
#[test]
fn a_poisson_mean_beyond_the_double_range_accepts_nothing() {
    use lotsman::{Model, ModelKind, StagedPlan, measures};
    let model = Model::new(ModelKind::Poisson, None).unwrap();
    let plan = StagedPlan::single(1_000_000_000, 1, &model).unwrap();
    let m = measures(&plan, &model, 1e306);
    assert_eq!(m.pa, 0.0);
    assert!(m.aoq == 0.0 && m.asn.is_finite());
}
