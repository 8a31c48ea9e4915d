//! The process-average intervals against scipy: the fixture
//! `tests/data/interval_reference.json`, made by
//! `tests/reference/make_interval_reference.py` (scipy.stats' `beta.ppf`,
//! `beta.isf`, `chi2.ppf` and `chi2.isf`; each row names its calls).
//!
//! Tolerance: relative 1e-9 on every limit (the accuracy the models
//! promise); a limit of exactly 0 or 1 (nothing found, everything found)
//! must be exact.

use lotsman::{clopper_pearson, poisson_rate_interval};
use serde_json::Value;

use crate::fixtures::{close, f, fixture, rows, u};

const REL: f64 = 1e-9;

fn data() -> Value {
    fixture("tests/data/interval_reference.json")
}

fn check(what: &str, row: &Value, lower: f64, upper: f64) {
    for (name, got, call) in [
        ("lower", lower, "call_lower"),
        ("upper", upper, "call_upper"),
    ] {
        let want = f(row, name);
        let ok = if want == 0.0 || want == 1.0 {
            got == want
        } else {
            close(got, want, REL)
        };
        assert!(ok, "{what} {name}: {got} against {want} ({})", row[call]);
    }
}

#[test]
fn clopper_pearson_matches_scipy() {
    let v = data();
    let cases = rows(&v, "clopper_pearson");
    assert!(cases.len() >= 20);
    for row in cases {
        let (x, n, level) = (u(row, "found"), u(row, "inspected"), f(row, "level"));
        let i = clopper_pearson(x, n, level).unwrap();
        check(&format!("{x} in {n} at {level}"), row, i.lower, i.upper);
        assert_eq!(i.estimate, x as f64 / n as f64);
    }
}

#[test]
fn poisson_interval_matches_scipy() {
    let v = data();
    let cases = rows(&v, "poisson");
    assert!(cases.len() >= 10);
    for row in cases {
        let (x, units, level) = (u(row, "found"), u(row, "units"), f(row, "level"));
        let i = poisson_rate_interval(x, units, level).unwrap();
        check(
            &format!("{x} in {units} units at {level}"),
            row,
            i.lower,
            i.upper,
        );
    }
}

/// The inputs that give no interval are refused, naming the value.
#[test]
fn impossible_inputs_are_refused() {
    for level in [0.0, 1.0, -0.5, 95.0, f64::NAN] {
        let e = clopper_pearson(1, 10, level).unwrap_err().to_string();
        assert!(e.contains("confidence level"), "{e}");
        assert!(poisson_rate_interval(1, 10, level).is_err());
    }
    let e = clopper_pearson(11, 10, 0.95).unwrap_err().to_string();
    assert!(e.contains("cannot exceed the units inspected"), "{e}");
    assert!(clopper_pearson(0, 0, 0.95).is_err());
    assert!(poisson_rate_interval(0, 0, 0.95).is_err());
}
