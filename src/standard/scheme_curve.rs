//! The long-run OC of the switching scheme for one class of an assessment:
//! each severity's single plan turned into the per-lot outcomes the chain
//! takes ([`LotOutcomes`]), and [`SwitchingScheme::long_run`] at each
//! quality.
//!
//! Per-lot outcomes of a single plan `n, Ac, Re` at quality `p` (`X` the
//! count in the sample under the class's model):
//!
//! ```text
//! accept = P(X <= Ac'),  reject = 1 - accept,  ASN = n,  accepted units = accept * n
//! normal:  accepted_counts[x] = P(X = x),  x = 0 ..= Ac
//! reduced: between = P(Ac < X <= Re - 1)      (105E 4.10.1.4)
//! ```
//!
//! where `Ac'` is the plan that decides the lot (on reduced inspection
//! `Re - 1`, the gap included). Double and multiple plans need the law of
//! the total count over the stages an accepted lot went through, which is
//! not built yet: their scheme curve is refused with the reason.

use super::assessment::StandardAssessment;
use super::limit_numbers::LimitNumber;
use super::severity::Severity;
use super::switching::{LimitWindow, LotOutcomes, SwitchingRules, SwitchingScheme};
use crate::model::Model;

/// Why a class has no scheme curve, in plain words for the sheet.
pub type SchemeRefusal = String;

/// The scheme's long-run `Pa` of class `k` of `a` at each of `qualities`
/// (fractions or nonconformities per unit, each from 0 to 1), with
/// reduced inspection reached under the limit number `limit` (Table VIII
/// for ten lots of the normal plan) when the scheme has it.
///
/// # Errors
/// A [`SchemeRefusal`] when the class is inspected in full at some
/// severity, its plans are not single, Table VIII gives no number for ten
/// lots, or the chain refuses (its window beyond the state budget, a sum
/// that does not settle).
pub fn scheme_curve(
    a: &StandardAssessment,
    k: usize,
    limit: Option<LimitNumber>,
    qualities: &[f64],
) -> Result<Vec<(f64, f64)>, SchemeRefusal> {
    let class = &a.classes[k];
    let model = a.request.model();
    let single = |s: Severity| -> Result<Option<(u64, u64, u64)>, SchemeRefusal> {
        let Some(answer) = class.at(s) else {
            return Ok(None);
        };
        let Some(plan) = answer.plan() else {
            return Err(format!(
                "{s} inspection takes every unit of the lot, so the scheme has no sampling OC"
            ));
        };
        match (plan.table_numbers.as_slice(), plan.stages.stages()) {
            ([table], [decides]) => Ok(Some((
                decides.n,
                table.accept.unwrap_or(0),
                decides.accept.unwrap_or(0),
            ))),
            _ => Err(
                "the scheme's long-run OC is drawn for single plans only; the chart shows each severity's own curve"
                    .to_string(),
            ),
        }
    };
    let (Some(normal), Some(tightened)) = (single(Severity::Normal)?, single(Severity::Tightened)?)
    else {
        return Err("the class has no normal or tightened plan".to_string());
    };
    let reduced = single(Severity::Reduced)?;
    let rules = match (reduced, limit) {
        (None, _) => SwitchingRules::without_reduced(),
        (Some(_), Some(LimitNumber::Number(l))) => SwitchingRules::new(
            true,
            Some(LimitWindow::ten(u32::try_from(l).unwrap_or(u32::MAX))),
        ),
        (Some(_), _) => {
            return Err(
                "Table VIII gives no limit number for ten lots of this plan, so the move to reduced inspection cannot be followed"
                    .to_string(),
            );
        }
    };
    let scheme = SwitchingScheme::new(rules, normal.1).map_err(|e| e.to_string())?;
    let mut points = Vec::with_capacity(qualities.len());
    for &p in qualities.iter().filter(|&&p| p <= 1.0) {
        let n = outcomes(model, Severity::Normal, normal, p)?;
        let t = outcomes(model, Severity::Tightened, tightened, p)?;
        let r = match reduced {
            Some(plan) => Some(outcomes(model, Severity::Reduced, plan, p)?),
            None => None,
        };
        let oc = scheme
            .long_run(p, model.lot_size(), &n, &t, r.as_ref())
            .map_err(|e| e.to_string())?;
        points.push((p, oc.figures.pa));
    }
    Ok(points)
}

/// The per-lot outcomes of the single plan `(n, table Ac, deciding Ac)`
/// at `severity` and quality `p`.
fn outcomes(
    model: &Model,
    severity: Severity,
    (n, table_ac, ac): (u64, u64, u64),
    p: f64,
) -> Result<LotOutcomes, SchemeRefusal> {
    let t = model.tails(n, ac, p, 0, 0);
    let o = LotOutcomes::new(severity, t.cdf, t.sf, n as f64, t.cdf * n as f64)
        .map_err(|e| e.to_string())?;
    match severity {
        Severity::Normal => {
            let counts = (0..=ac).map(|x| model.pmf(n, x, p, 0, 0)).collect();
            o.with_counts(counts).map_err(|e| e.to_string())
        }
        Severity::Tightened => Ok(o),
        Severity::Reduced => {
            // The gap between the table's Ac and Re - 1 (the deciding Ac).
            let below = model.tails(n, table_ac, p, 0, 0).cdf;
            o.with_between((t.cdf - below).max(0.0))
                .map_err(|e| e.to_string())
        }
    }
}
