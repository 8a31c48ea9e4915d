//! What the benches share.

use lotsman::{Model, RiskPair, RiskPoint};

/// The risk points (p1, 0.05) and (p2, 0.10).
pub fn pair(model: &Model, p1: f64, p2: f64) -> RiskPair {
    RiskPair::new(
        RiskPoint {
            quality: p1,
            risk: 0.05,
        },
        RiskPoint {
            quality: p2,
            risk: 0.10,
        },
        model,
    )
    .unwrap()
}
