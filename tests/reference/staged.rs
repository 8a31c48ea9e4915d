//! Staged plans against the fixture `tests/data/staged_reference.json`,
//! made by `tests/reference/make_staged_reference.py` with mpmath (50
//! digits): item-level dynamic programmes for OC, ASN and curtailed ASN,
//! brute-force searches for the double and multiple designs, and the
//! sequential truncation rule replayed from scratch. See
//! `docs/validation.md`.
//!
//! Tolerances: probabilities, ASN, AOQ and ATI relative 1e-9 (the models'
//! accuracy); plan numbers exactly; the sequential lines to 1e-15 relative
//! (both sides form them with the same binary64 operations).

use lotsman::{
    Criterion, Stage, StagedPlan, curtailed_outcomes, design_double, design_multiple,
    design_sequential, measures, stage_outcomes,
};
use serde_json::Value;

use crate::fixtures;
use fixtures::{close, f, model, risks, rows, u};

fn fixture() -> Value {
    fixtures::fixture("tests/data/staged_reference.json")
}

fn stages(row: &Value) -> Vec<Stage> {
    row["stages"]
        .as_array()
        .unwrap()
        .iter()
        .map(|s| Stage {
            n: s[0].as_u64().unwrap(),
            accept: s[1].as_u64(),
            reject: s[2].as_u64().unwrap(),
        })
        .collect()
}

#[test]
fn staged_measures_match_the_item_level_programme() {
    let v = fixture();
    let rows = rows(&v, "staged_measures");
    assert!(rows.len() >= 60);
    for row in rows {
        let m = model(row);
        let plan = StagedPlan::new(stages(row), &m).unwrap();
        let p = f(row, "p");
        let got = measures(&plan, &m, p);
        for (name, g) in [
            ("pa", got.pa),
            ("asn", got.asn),
            ("aoq", got.aoq),
            ("asn_curtailed", got.asn_curtailed.unwrap()),
        ] {
            assert!(close(g, f(row, name), 1e-9), "{name} {g:e} for {row}");
        }
        match row["ati"].as_f64() {
            Some(ati) => assert!(close(got.ati.unwrap(), ati, 1e-9), "ati for {row}"),
            None => assert!(got.ati.is_none()),
        }
        let o = curtailed_outcomes(&plan, &m, p);
        for (key, values) in [("accept", &o.accept), ("reject", &o.reject)] {
            for (g, w) in values.iter().zip(row[key].as_array().unwrap()) {
                let w = w.as_f64().unwrap();
                assert!(close(*g, w, 1e-9), "{key} {g:e} vs {w:e} for {row}");
            }
        }
    }
}

#[test]
fn the_published_double_plan_matches_the_reference() {
    let v = fixture();
    for row in rows(&v, "published_double") {
        let m = model(row);
        let plan = StagedPlan::new(stages(row), &m).unwrap();
        let o = stage_outcomes(&plan, &m, f(row, "p"));
        assert!(close(o.pa(), f(row, "pa"), 1e-9), "{row}");
        assert!(close(o.accept[0], f(row, "accept_first"), 1e-9), "{row}");
        assert!(close(o.reject[0], f(row, "reject_first"), 1e-9), "{row}");
        assert!(close(
            measures(&plan, &m, f(row, "p")).asn,
            f(row, "asn"),
            1e-9
        ));
    }
}

#[test]
fn double_designs_match_the_exhaustive_search() {
    let v = fixture();
    let rows = rows(&v, "double_designs");
    assert!(rows.len() >= 10);
    for row in rows {
        let m = model(row);
        let criterion = match row["criterion"].as_str().unwrap() {
            "asn-aql" => Criterion::AsnAql,
            "asn-rql" => Criterion::AsnRql,
            _ => Criterion::AsnMax,
        };
        let d = design_double(&m, &risks(row, &m), criterion, row["second_ratio"].as_f64())
            .unwrap_or_else(|e| panic!("{e} for {row}"));
        let s = d.plan.stages();
        // A first stage that cannot accept has c1 = null.
        let got = (
            s[0].n,
            s[0].accept,
            s[0].reject,
            s[1].n - s[0].n,
            s[1].accept.unwrap(),
        );
        let want = (
            u(row, "n1"),
            row["c1"].as_u64(),
            u(row, "r1"),
            u(row, "n2"),
            u(row, "c2"),
        );
        assert_eq!(got, want, "{row}");
        assert!(
            close(d.producer_risk, f(row, "producer_risk"), 1e-9),
            "{row}"
        );
        assert!(
            close(d.consumer_risk, f(row, "consumer_risk"), 1e-9),
            "{row}"
        );
    }
}

#[test]
fn multiple_designs_match_the_family_search() {
    let v = fixture();
    for row in rows(&v, "multiple_designs") {
        let m = model(row);
        let k = u(row, "k") as u32;
        let d = design_multiple(&m, &risks(row, &m), k, Criterion::AsnAql)
            .unwrap_or_else(|e| panic!("{e} for {row}"));
        assert_eq!(d.plan.stages(), stages(row).as_slice(), "{row}");
        let asn = measures(&d.plan, &m, f(row, "p1")).asn;
        assert!(close(asn, f(row, "asn_p1"), 1e-9), "{row}");
    }
}

#[test]
fn sequential_plans_match_the_replayed_truncation() {
    let v = fixture();
    let rows = rows(&v, "sequential");
    assert!(rows.len() >= 8);
    for row in rows {
        let m = model(row);
        let (d, wald) =
            design_sequential(&m, &risks(row, &m)).unwrap_or_else(|e| panic!("{e} for {row}"));
        let lines = d.plan.sequential_lines().unwrap();
        for (got, key) in [
            (lines.h_accept, "h_accept"),
            (lines.h_reject, "h_reject"),
            (lines.slope, "slope"),
        ] {
            assert!(close(got, f(row, key), 1e-15), "{key} for {row}");
        }
        assert_eq!(lines.truncation, u(row, "truncation"), "{row}");
        assert_eq!(lines.final_acceptance, u(row, "final_acceptance"), "{row}");
        assert!(
            close(d.producer_risk, f(row, "producer_risk"), 1e-9),
            "{row}"
        );
        assert!(
            close(d.consumer_risk, f(row, "consumer_risk"), 1e-9),
            "{row}"
        );
        for point in row["points"].as_array().unwrap() {
            let got = measures(&d.plan, &m, f(point, "p"));
            assert!(
                close(got.pa, f(point, "pa"), 1e-9),
                "pa at {point} for {row}"
            );
            assert!(
                close(got.asn, f(point, "asn"), 1e-9),
                "asn at {point} for {row}"
            );
        }
        for (got, key) in [
            (wald.asn_aql, "wald_asn_p1"),
            (wald.asn_rql, "wald_asn_p2"),
            (wald.asn_max, "wald_asn_max"),
        ] {
            assert!(close(got, f(row, key), 1e-12), "{key} for {row}");
        }
    }
}
