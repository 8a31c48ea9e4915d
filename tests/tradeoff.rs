//! The trade-off grid against tests/data/tradeoff_reference.json (written by
//! tests/reference/make_tradeoff_reference.py): every cell solved on its own
//! by the reference script's exhaustive design (scipy.stats, each plan
//! re-checked at 50 digits with mpmath), and ATI at the process quality at
//! 50 digits.

mod common;

use common::{close, fixture, model, rows};
use lotsman::{Criterion, Scheme, TradeoffRequest, tradeoff};
use serde_json::Value;

fn floats(v: &Value) -> Vec<f64> {
    v.as_array()
        .unwrap()
        .iter()
        .map(|x| x.as_f64().unwrap())
        .collect()
}

#[test]
fn every_cell_is_the_reference_design() {
    let reference = fixture("tests/data/tradeoff_reference.json");
    let mut compared = 0;
    for g in rows(&reference, "grids") {
        let m = model(g);
        let process = g["process_quality"].as_f64();
        let request = TradeoffRequest::new(
            floats(&g["aql"]),
            floats(&g["rql"]),
            g["alpha"].as_f64().unwrap(),
            g["beta"].as_f64().unwrap(),
            m,
            Scheme::Single,
            Criterion::AsnAql,
            // A cost of 1 per unit makes the cost the ATI itself.
            process.map(|p| (1.0, p)),
        )
        .unwrap();
        let grid = tradeoff(&request, &|| {});
        let name = g["name"].as_str().unwrap();
        let cells = g["cells"].as_array().unwrap();
        assert_eq!(grid.cells.len(), cells.len(), "{name}");
        for (got, want) in grid.cells.iter().zip(cells) {
            assert_eq!(got.aql, want["aql"].as_f64().unwrap());
            assert_eq!(got.rql, want["rql"].as_f64().unwrap());
            assert!(
                !want["near_tie"].as_bool().unwrap(),
                "{name}: a near tie needs a tolerance"
            );
            let at = format!("{name}, AQL {}, RQL {}", got.aql, got.rql);
            match (&got.outcome, want["n"].as_u64()) {
                (Ok(plan), Some(n)) => {
                    assert_eq!(
                        (plan.n(), plan.c()),
                        (n, want["c"].as_u64().unwrap()),
                        "{at}"
                    );
                    if let Some(ati) = want["ati"].as_f64() {
                        let cost = plan.cost.expect("a cost was asked for").cost;
                        assert!(close(cost, ati, 1e-9), "{at}: ATI {cost} against {ati}");
                    }
                }
                (Err(e), None) => {
                    let why = e.to_string();
                    let expected = match want["reason"].as_str().unwrap() {
                        "aql_not_below_rql" => "must be below",
                        _ => "no sample can tell them apart",
                    };
                    assert!(why.contains(expected), "{at}: {why}");
                }
                (got, _) => panic!("{at}: {got:?} against {want}"),
            }
            compared += 1;
        }
    }
    assert_eq!(compared, 239, "all cells of the fixture");
}
