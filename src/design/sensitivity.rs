//! Sensitivity of the sample size to the four agreed inputs: how `n`
//! changes when one of `p1`, `alpha`, `p2`, `beta` moves by a stated step
//! and the other three stay, so negotiators see which concession is
//! expensive.
//!
//! Every concession makes the plan smaller: the producer concedes by
//! lowering the AQL (fewer lots are promised acceptance) or accepting a
//! larger alpha; the consumer by raising the RQL or accepting a larger beta.
//! Tightening any input the other way makes the plan larger. Each moved
//! request is solved exactly by the single-plan designer, so the figures
//! are the single plan's `n` and `c` for every scheme (the staged schemes
//! compare themselves with that plan too).

use serde::Serialize;

use super::single::{Memo, design_single_with};
use crate::input::InputError;
use crate::model::Model;
use crate::model::RiskPair;
use crate::numeric::round_significant;

/// One of the four agreed inputs.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Input {
    /// The producer's quality `p1`.
    Aql,
    /// The producer's risk.
    Alpha,
    /// The consumer's quality `p2`.
    Rql,
    /// The consumer's risk.
    Beta,
}

impl Input {
    /// The input's name as the reports print it.
    pub fn label(self) -> &'static str {
        match self {
            Input::Aql => "AQL (p1)",
            Input::Alpha => "alpha",
            Input::Rql => "RQL (p2)",
            Input::Beta => "beta",
        }
    }

    /// The direction of a concession: `-1` for the AQL (lowered), `+1` for
    /// the others (raised).
    fn conceding_sign(self) -> f64 {
        match self {
            Input::Aql => -1.0,
            _ => 1.0,
        }
    }
}

/// The step by which each input moves, in the input's own unit (fractions
/// for qualities and risks). Valid steps are positive and finite.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Steps {
    aql: f64,
    alpha: f64,
    rql: f64,
    beta: f64,
}

impl Steps {
    /// The default steps for `risks`: for each input the largest number
    /// of the 1-2-5 series at most a fifth of its value (`p2 = 6%` moves by
    /// 1%, `alpha = 0.05` by 0.01), overridden where `given` holds a step.
    ///
    /// # Errors
    /// [`InputError::OutOfRange`] naming the step when a given step is not
    /// a positive finite number.
    pub fn new(risks: &RiskPair, given: [Option<f64>; 4]) -> Result<Self, InputError> {
        let (p, c) = (risks.producer(), risks.consumer());
        let names = ["--step-aql", "--step-alpha", "--step-rql", "--step-beta"];
        let values = [p.quality, p.risk, c.quality, c.risk];
        let mut steps = [0.0; 4];
        for i in 0..4 {
            steps[i] = match given[i] {
                Some(s) if s.is_finite() && s > 0.0 => s,
                Some(s) => return Err(InputError::out_of_range(names[i], s, "a positive step")),
                None => nice_fifth(values[i]),
            };
        }
        Ok(Steps {
            aql: steps[0],
            alpha: steps[1],
            rql: steps[2],
            beta: steps[3],
        })
    }

    fn of(&self, input: Input) -> f64 {
        match input {
            Input::Aql => self.aql,
            Input::Alpha => self.alpha,
            Input::Rql => self.rql,
            Input::Beta => self.beta,
        }
    }
}

/// The largest `1, 2, 5 x 10^k` at most `x / 5`.
fn nice_fifth(x: f64) -> f64 {
    let target = x / 5.0;
    let decade = 10f64.powf(target.log10().floor());
    let step = [5.0, 2.0, 1.0]
        .into_iter()
        .map(|m| m * decade)
        .find(|&s| s <= target * (1.0 + 1e-9))
        .unwrap_or(decade);
    // 10^k for negative k is not exact in binary; read the decimal back.
    round_significant(step, 12)
}

/// The single plan after one input moved, or why there is none.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Moved {
    /// The input's new value.
    pub value: f64,
    /// Sample size of the single plan, `null` when there is none.
    pub n: Option<u64>,
    /// Its acceptance number.
    pub c: Option<u64>,
    /// `n` minus the agreed plan's `n`.
    pub change: Option<i64>,
    /// Why there is no plan (an invalid pair of points, or the designer's
    /// refusal), `null` otherwise.
    pub reason: Option<String>,
}

/// How the single plan's sample size answers one input.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Sensitivity {
    /// The input that moves.
    pub input: Input,
    /// Its agreed value.
    pub value: f64,
    /// The step it moves by.
    pub step: f64,
    /// After a concession (smaller plan).
    pub conceded: Moved,
    /// After a tightening (larger plan).
    pub tightened: Moved,
}

/// How the sample size of the single plan for `risks` under `model`
/// changes when each of the four inputs moves by its step, in the order
/// AQL, alpha, RQL, beta. `n` is the agreed single plan's sample size.
///
/// # Example
/// ```
/// use lotsman::{Model, ModelKind, RiskPair, RiskPoint, Steps, sensitivity};
/// let model = Model::new(ModelKind::Binomial, None).unwrap();
/// let risks = RiskPair::new(
///     RiskPoint { quality: 0.01, risk: 0.05 },
///     RiskPoint { quality: 0.06, risk: 0.10 },
///     &model,
/// ).unwrap();
/// let rows = sensitivity(&model, &risks, 110, &Steps::new(&risks, [None; 4]).unwrap());
/// // The consumer asking for 5% instead of 6% costs units.
/// assert_eq!(rows[2].tightened.value, 0.05);
/// assert!(rows[2].tightened.change.unwrap() > 0);
/// ```
pub fn sensitivity(model: &Model, risks: &RiskPair, n: u64, steps: &Steps) -> Vec<Sensitivity> {
    // The eight designs lie close together: each starts its searches from
    // the one before (the memo's acceptance number, its sample sizes, and
    // the producer's sample sizes while the producer's point stays), which
    // changes no answer (see `design_single_with`).
    let mut memo = Memo::default();
    [Input::Aql, Input::Alpha, Input::Rql, Input::Beta]
        .into_iter()
        .map(|input| {
            let value = value_of(risks, input);
            let step = steps.of(input);
            let sign = input.conceding_sign();
            let mut moved = |v: f64| moved(model, risks, input, v, n, &mut memo);
            Sensitivity {
                input,
                value,
                step,
                // 12 digits: 0.06 - 0.01 is the 0.05 the user means.
                conceded: moved(round_significant(value + sign * step, 12)),
                tightened: moved(round_significant(value - sign * step, 12)),
            }
        })
        .collect()
}

fn value_of(risks: &RiskPair, input: Input) -> f64 {
    match input {
        Input::Aql => risks.producer().quality,
        Input::Alpha => risks.producer().risk,
        Input::Rql => risks.consumer().quality,
        Input::Beta => risks.consumer().risk,
    }
}

fn moved(
    model: &Model,
    risks: &RiskPair,
    input: Input,
    value: f64,
    n: u64,
    memo: &mut Memo,
) -> Moved {
    let (mut p, mut c) = (risks.producer(), risks.consumer());
    match input {
        Input::Aql => p.quality = value,
        Input::Alpha => p.risk = value,
        Input::Rql => c.quality = value,
        Input::Beta => c.risk = value,
    }
    let design = RiskPair::new(p, c, model)
        .map_err(|e| e.to_string())
        .and_then(|pair| design_single_with(model, &pair, memo).map_err(|e| e.to_string()));
    match design {
        Ok(d) => Moved {
            value,
            n: Some(d.n),
            c: Some(d.c),
            change: Some(d.n as i64 - n as i64),
            reason: None,
        },
        Err(e) => Moved {
            value,
            n: None,
            c: None,
            change: None,
            reason: Some(e),
        },
    }
}
