//! Minimum-inspection plans against the fixture
//! `tests/data/minimum_reference.json`, made by
//! `tests/reference/make_minimum_reference.py`: exhaustive searches with
//! scipy.stats over every sample size of small lots (single plans) and over
//! a box of Dodge and Romig double plans, with every stored measure at 50
//! digits (mpmath). See `docs/validation.md`.
//!
//! Tolerances: plan numbers and the rows' smallest n exactly; ATI, Pa, AOQL
//! and the LTPD of the continuous models relative 1e-9 (the models'
//! accuracy); a finite lot's qualities D / N exactly; the quality where a
//! continuous AOQ curve peaks relative 1e-6 (the curve is flat there, so
//! rounding in the last digits of the AOQ moves its argmax).

use lotsman::{
    DesignError, Protection, RectifyingDesign, RectifyingPlan, RectifyingRequest, RiskPoint,
    Scheme, design_rectifying,
};
use serde_json::Value;

use crate::fixtures;
use fixtures::{close, f, model, rows, u};

fn fixture() -> Value {
    fixtures::fixture("tests/data/minimum_reference.json")
}

fn request(row: &Value, scheme: Scheme) -> RectifyingRequest {
    let m = model(row);
    let protection = match row["protection"].as_str().unwrap() {
        "ltpd" => Protection::Ltpd(RiskPoint {
            quality: f(row, "quality"),
            risk: f(row, "beta"),
        }),
        _ => Protection::Aoql(f(row, "quality")),
    };
    RectifyingRequest::new(m, f(row, "process_average"), protection, scheme)
        .unwrap_or_else(|e| panic!("{e} for {row}"))
}

/// The AOQL, LTPD and Pa of a chosen plan against the row's 50-digit values.
fn check_measures(got: &RectifyingPlan, row: &Value) {
    let finite_lot = row["model"] == "hypergeometric";
    assert!(
        close(got.ati, f(row, "ati"), 1e-9),
        "ati {} for {row}",
        got.ati
    );
    assert!(close(got.pa, f(row, "pa"), 1e-9), "pa {} for {row}", got.pa);
    assert!(
        close(got.aoql.value, f(row, "aoql"), 1e-9),
        "aoql {:?} for {row}",
        got.aoql
    );
    let (quality_tol, ltpd_tol) = if finite_lot { (0.0, 0.0) } else { (1e-6, 1e-9) };
    assert!(
        close(got.aoql.quality, f(row, "aoql_quality"), quality_tol),
        "aoql quality {:?} for {row}",
        got.aoql
    );
    assert!(
        close(got.ltpd, f(row, "ltpd"), ltpd_tol),
        "ltpd {} for {row}",
        got.ltpd
    );
    match row["pa_at_ltpd"].as_f64() {
        Some(pa) => assert!(close(got.pa_at_ltpd.unwrap(), pa, 1e-9), "{row}"),
        None => assert!(got.pa_at_ltpd.is_none(), "{row}"),
    }
}

fn single_numbers(plan: &RectifyingPlan) -> (u64, u64) {
    plan.plan.as_single().expect("a single plan")
}

#[test]
fn the_fixture_has_no_near_ties() {
    // A decision within 1e-9 of its limit could fall either way in binary64;
    // none occurs, so every comparison below is exact. If a regenerated
    // fixture has one, the comparisons need a rule for it.
    let v = fixture();
    for key in ["single", "double"] {
        for row in rows(&v, key) {
            assert_eq!(row["near_ties"].as_array().unwrap().len(), 0, "{row}");
        }
    }
}

#[test]
fn single_plans_match_the_exhaustive_search() {
    let v = fixture();
    let rows = rows(&v, "single");
    assert!(rows.len() >= 15);
    for row in rows {
        let d: RectifyingDesign = design_rectifying(&request(row, Scheme::Single))
            .unwrap_or_else(|e| panic!("{e} for {row}"));
        // The scan over c: the same acceptance numbers, smallest n and ATI.
        let want = row["rows"].as_array().unwrap();
        assert_eq!(d.rows.len(), want.len(), "rows of {row}");
        for (got, want) in d.rows.iter().zip(want) {
            assert_eq!(got.c, u(want, "c"), "{row}");
            assert_eq!(got.n_min, want["n_min"].as_u64(), "c = {} of {row}", got.c);
            match want["ati"].as_f64() {
                Some(ati) => assert!(close(got.ati.unwrap(), ati, 1e-9), "c = {}", got.c),
                None => assert!(got.ati.is_none()),
            }
        }
        match &d.plan {
            None => assert_eq!(row["full_inspection"], true, "{row}"),
            Some(plan) => {
                assert_eq!(row["full_inspection"], false, "{row}");
                assert_eq!(single_numbers(plan), (u(row, "n"), u(row, "c")), "{row}");
                check_measures(plan, row);
            }
        }
    }
}

#[test]
fn double_plans_match_the_box_search() {
    let v = fixture();
    let rows = rows(&v, "double");
    assert!(rows.len() >= 6);
    for row in rows {
        let got = design_rectifying(&request(row, Scheme::Double));
        let Some(want) = row["stages"].as_array() else {
            // No double plan in the box: 100% inspection when no single plan
            // beats it either, otherwise no answer (use the single plan).
            match row["single_n"].as_u64() {
                None => assert!(
                    matches!(&got, Ok(d) if d.plan.is_none() && d.single.is_none()),
                    "{got:?} for {row}"
                ),
                Some(_) => assert!(
                    matches!(got, Err(DesignError::NoRectifyingPlan { .. })),
                    "{got:?} for {row}"
                ),
            }
            continue;
        };
        let d = got.unwrap_or_else(|e| panic!("{e} for {row}"));
        let single = d.single.as_ref().expect("a best single plan");
        assert_eq!(
            single_numbers(single),
            (u(row, "single_n"), u(row, "single_c")),
            "{row}"
        );
        assert!(close(single.ati, f(row, "single_ati"), 1e-9), "{row}");
        let plan = d.plan.as_ref().expect("a double plan");
        let stages: Vec<[u64; 3]> = plan
            .plan
            .stages()
            .iter()
            .map(|s| [s.n, s.accept.unwrap(), s.reject])
            .collect();
        let want: Vec<[u64; 3]> = want
            .iter()
            .map(|s| [0, 1, 2].map(|i| s[i].as_u64().unwrap()))
            .collect();
        assert_eq!(stages, want, "{row}");
        assert!(close(plan.asn, f(row, "asn"), 1e-9), "asn for {row}");
        check_measures(plan, row);
    }
}
