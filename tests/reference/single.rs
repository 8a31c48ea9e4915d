//! Comparison with the reference fixture `tests/data/reference.json`, made
//! by `tests/reference/make_reference.py` with mpmath (50 digits) and
//! scipy.stats. See `docs/validation.md` for the versions.
//!
//! Tolerances, per kind of value:
//! - tails, OC, AOQ, ATI, curtailed ASN, indifference quality, Poisson unity
//!   values: relative 1e-9 (the accuracy the models promise);
//! - designs: n, c and every alternative's n_min and n_max exactly, achieved
//!   risks relative 1e-9;
//! - AOQL: value relative 1e-9; the quality where it occurs relative 1e-5,
//!   because AOQ is flat at its maximum (an error e in the value moves the
//!   argmax by about sqrt(e)).

use lotsman::{
    Model, ModelKind, StagedPlan, aoql, design_single, indifference_quality, measures,
    quality_at_pa, single_alternatives,
};
use serde_json::Value;

use crate::fixtures;
use fixtures::{close, f, model, risks, rows, u};

fn fixture() -> Value {
    fixtures::fixture("tests/data/reference.json")
}

#[test]
fn tails_match_mpmath() {
    let v = fixture();
    let tails = rows(&v, "tails");
    assert!(tails.len() >= 60);
    let mut worst: f64 = 0.0;
    for row in tails {
        let m = model(row);
        let t = m.tails(u(row, "n"), u(row, "c"), f(row, "p"), 0, 0);
        for (got, key) in [(t.cdf, "cdf"), (t.sf, "sf")] {
            let want = f(row, key);
            assert!(
                close(got, want, 1e-9),
                "{key}: {got:e} vs {want:e} for {row}"
            );
            if want > 1e-300 {
                worst = worst.max(((got - want) / want).abs());
            }
        }
    }
    eprintln!(
        "worst relative error of {} tail pairs: {worst:.2e}",
        tails.len()
    );
}

#[test]
fn designs_match_the_exhaustive_reference_search() {
    let v = fixture();
    let designs = rows(&v, "designs");
    assert!(designs.len() >= 30);
    for kind in ["binomial", "hypergeometric", "poisson"] {
        let count = designs.iter().filter(|r| r["model"] == kind).count();
        assert!(count >= 10, "{count} {kind} designs");
    }
    for row in designs {
        let m = model(row);
        let risks = risks(row, &m);
        let solved = design_single(&m, &risks);
        if row["n"].is_null() {
            assert!(
                solved.is_err(),
                "reference has no plan, solver gave {solved:?} for {row}"
            );
            continue;
        }
        let d = solved.unwrap_or_else(|e| panic!("{e} for {row}"));
        assert_eq!((d.n, d.c), (u(row, "n"), u(row, "c")), "{row}");
        assert!(
            close(d.producer_risk, f(row, "producer_risk"), 1e-9),
            "{row}"
        );
        assert!(
            close(d.consumer_risk, f(row, "consumer_risk"), 1e-9),
            "{row}"
        );
        let alternatives = row["alternatives"].as_array().unwrap();
        let c_last = alternatives.iter().map(|a| u(a, "c")).max().unwrap();
        let ours = single_alternatives(&m, &risks, 0..=c_last);
        // A bound whose risk sits within rounding of its limit (here
        // 1 - Pa(1, 0, 0.05) = 0.05 = alpha) is decided by the last bit of
        // each library's arithmetic; the script lists those as near ties.
        let near_tie = |c: u64, field: &str| {
            row["near_ties"].as_array().is_some_and(|t| {
                t.iter()
                    .any(|x| x["c"].as_u64() == Some(c) && x["field"] == field)
            })
        };
        for (a, want) in ours.iter().zip(alternatives) {
            assert_eq!(a.c, u(want, "c"));
            if !near_tie(a.c, "n_min") {
                assert_eq!(
                    a.n_min,
                    want["n_min"].as_u64(),
                    "n_min at c = {} of {row}",
                    a.c
                );
            }
            if !near_tie(a.c, "n_max") {
                assert_eq!(
                    a.n_max,
                    want["n_max"].as_u64(),
                    "n_max at c = {} of {row}",
                    a.c
                );
            }
        }
    }
}

fn plan(row: &Value, m: &Model) -> StagedPlan {
    StagedPlan::single(u(row, "n"), u(row, "c"), m).unwrap()
}

#[test]
fn measures_match_mpmath() {
    let v = fixture();
    let table = rows(&v, "measures");
    assert!(table.len() >= 40);
    for row in table {
        let m = model(row);
        let got = measures(&plan(row, &m), &m, f(row, "p"));
        // A finite lot's D = round(p N) and its quality D/N, at which every
        // measure is taken (issue 14, item 2).
        assert_eq!(got.lot_nonconforming, row["lot_nonconforming"].as_u64());
        assert_eq!(got.lot_quality, row["lot_quality"].as_f64());
        assert!(close(got.pa, f(row, "pa"), 1e-9), "pa {} for {row}", got.pa);
        assert!(
            close(got.aoq, f(row, "aoq"), 1e-9),
            "aoq {} for {row}",
            got.aoq
        );
        assert_eq!(got.asn, f(row, "asn"));
        match row["ati"].as_f64() {
            Some(ati) => assert!(
                close(got.ati.unwrap(), ati, 1e-9),
                "ati {:?} for {row}",
                got.ati
            ),
            None => assert!(got.ati.is_none()),
        }
        match row["asn_curtailed"].as_f64() {
            Some(a) => assert!(
                close(got.asn_curtailed.unwrap(), a, 1e-9),
                "{:?} for {row}",
                got.asn_curtailed
            ),
            None => assert!(got.asn_curtailed.is_none()),
        }
    }
}

#[test]
fn aoql_matches_the_reference_maximisation() {
    let v = fixture();
    for row in rows(&v, "aoql") {
        let m = model(row);
        let got = aoql(&plan(row, &m), &m);
        assert!(
            close(got.value, f(row, "aoql"), 1e-9),
            "AOQL {} for {row}",
            got.value
        );
        assert!(
            close(got.quality, f(row, "quality"), 1e-5),
            "quality {} for {row}",
            got.quality
        );
    }
}

#[test]
fn indifference_quality_matches_the_reference_root() {
    let v = fixture();
    for row in rows(&v, "indifference") {
        let m = model(row);
        let got = indifference_quality(&plan(row, &m), &m);
        assert!(close(got, f(row, "quality"), 1e-9), "{got} for {row}");
    }
}

#[test]
fn poisson_unity_values_match_mpmath() {
    let v = fixture();
    let m = Model::new(ModelKind::Poisson, None).unwrap();
    for row in rows(&v, "poisson_unity") {
        // With n = 1 the quality is the Poisson mean itself.
        let p = StagedPlan::single(1, u(row, "c"), &m).unwrap();
        let l1 = quality_at_pa(&p, &m, 1.0 - f(row, "alpha"));
        let l2 = quality_at_pa(&p, &m, f(row, "beta"));
        assert!(close(l1, f(row, "lambda1"), 1e-9), "{l1} for {row}");
        assert!(close(l2, f(row, "lambda2"), 1e-9), "{l2} for {row}");
    }
}

/// Issue 14, item 4: risks at the end of double precision (alpha = 5e-17,
/// where 1 - alpha rounds to 1; alpha = beta = 1e-30). The reference tests
/// each point on its own tail at 50 digits (mpmath); the designer must
/// find the same smallest plan, with the same achieved risks.
#[test]
fn extreme_risk_designs_match_mpmath() {
    let v = fixture();
    let table = rows(&v, "extreme_designs");
    assert!(table.len() >= 8);
    for row in table {
        let m = model(row);
        let d = design_single(&m, &risks(row, &m)).unwrap_or_else(|e| panic!("{e} for {row}"));
        assert_eq!((d.n, d.c), (u(row, "n"), u(row, "c")), "{row}");
        for (got, key) in [
            (d.producer_risk, "producer_risk"),
            (d.consumer_risk, "consumer_risk"),
        ] {
            assert!(close(got, f(row, key), 1e-9), "{key} {got:e} for {row}");
        }
    }
}
