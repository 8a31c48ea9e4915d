//! The trade-off grid against tests/data/tradeoff_reference.json (written by
//! tests/reference/make_tradeoff_reference.py): every cell solved on its own
//! by the reference script's exhaustive design (scipy.stats, each plan
//! re-checked at 50 digits with mpmath), and ATI at the process quality at
//! 50 digits; and the sensitivity of the sample size, each moved point
//! designed on its own by the same reference design.

use crate::fixtures;

use fixtures::{close, fixture, model, risks, rows};
use lotsman::{
    Criterion, RiskGrid, Scheme, Steps, TradeoffRequest, design_single, sensitivity, tradeoff,
};
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
            RiskGrid {
                aql: floats(&g["aql"]),
                rql: floats(&g["rql"]),
                alpha: g["alpha"].as_f64().unwrap(),
                beta: g["beta"].as_f64().unwrap(),
            },
            m,
            Scheme::Single,
            Criterion::AsnAql, // A cost of 1 per unit makes the cost the ATI itself.
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

#[test]
fn each_move_of_the_sensitivity_is_the_reference_design_at_the_moved_point() {
    let reference = fixture("tests/data/tradeoff_reference.json");
    let mut compared = 0;
    for case in rows(&reference, "sensitivity") {
        let base = &case["base"];
        let m = model(base);
        let pair = risks(base, &m);
        let n = design_single(&m, &pair).unwrap().n;
        let steps: Vec<Option<f64>> = floats(&case["steps"]).into_iter().map(Some).collect();
        let steps = Steps::new(&pair, steps.try_into().unwrap()).unwrap();
        let got: Vec<_> = sensitivity(&m, &pair, n, &steps)
            .into_iter()
            .flat_map(|s| [s.conceded, s.tightened])
            .collect();
        let moves = case["moves"].as_array().unwrap();
        assert_eq!(got.len(), moves.len());
        for (g, want) in got.iter().zip(moves) {
            let at = format!("{base} {} {}", want["input"], want["way"]);
            assert_eq!(g.value, want["value"].as_f64().unwrap(), "{at}");
            assert_eq!(g.n, want["n"].as_u64(), "{at}");
            assert_eq!(g.c, want["c"].as_u64(), "{at}");
            assert_eq!(g.reason.is_some(), want["n"].is_null(), "{at}");
            assert_eq!(g.change, g.n.map(|x| x as i64 - n as i64), "{at}");
            compared += 1;
        }
    }
    assert_eq!(compared, 32);
}
