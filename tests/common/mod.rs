//! What the fixture comparisons share: loading a fixture, reading its rows
//! and the tolerance test. Each test binary uses a subset of them.
#![allow(dead_code)]

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
    RiskPair::new(
        RiskPoint {
            quality: f(row, "p1"),
            risk: f(row, "alpha"),
        },
        RiskPoint {
            quality: f(row, "p2"),
            risk: f(row, "beta"),
        },
        m,
    )
    .unwrap()
}
