//! Reading the reference fixtures of tests/data/: a fixture, its rows and
//! their fields, the model and risk points of a row, and the tolerance
//! test.

use lotsman::{Model, ModelKind, RiskPair, RiskPoint};
use serde_json::Value;

/// The fixture at `path` (relative to the repository root).
pub fn fixture(path: &str) -> Value {
    let text = std::fs::read_to_string(path).expect("fixture present");
    serde_json::from_str(&text).expect("fixture is JSON")
}

pub fn rows<'a>(v: &'a Value, key: &str) -> &'a Vec<Value> {
    v[key]
        .as_array()
        .unwrap_or_else(|| panic!("fixture has {key}"))
}

/// The model of a row: `model` and `lot_size`.
pub fn model(row: &Value) -> Model {
    let kind = match row["model"].as_str().unwrap() {
        "binomial" => ModelKind::Binomial,
        "hypergeometric" => ModelKind::Hypergeometric,
        "poisson" => ModelKind::Poisson,
        other => panic!("model {other}"),
    };
    Model::new(kind, row["lot_size"].as_u64()).unwrap()
}

pub fn u(row: &Value, key: &str) -> u64 {
    row[key]
        .as_u64()
        .unwrap_or_else(|| panic!("{key} in {row}"))
}

pub fn f(row: &Value, key: &str) -> f64 {
    row[key]
        .as_f64()
        .unwrap_or_else(|| panic!("{key} in {row}"))
}

/// Relative closeness; values below 1e-300 (where f64 turns subnormal) are
/// compared absolutely.
pub fn close(got: f64, want: f64, rel: f64) -> bool {
    if want.abs() < 1e-300 {
        return (got - want).abs() < 1e-300;
    }
    ((got - want) / want).abs() <= rel
}

/// The risk points `(p1, alpha)` and `(p2, beta)` of a row.
pub fn risks(row: &Value, m: &Model) -> RiskPair {
    pair(
        m,
        f(row, "p1"),
        f(row, "alpha"),
        f(row, "p2"),
        f(row, "beta"),
    )
}

/// The risk points `(p1, alpha)` and `(p2, beta)` under `model`.
fn pair(model: &Model, p1: f64, alpha: f64, p2: f64, beta: f64) -> RiskPair {
    RiskPair::new(
        RiskPoint {
            quality: p1,
            risk: alpha,
        },
        RiskPoint {
            quality: p2,
            risk: beta,
        },
        model,
    )
    .unwrap()
}
