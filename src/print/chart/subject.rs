//! What the charts of an attributes plan are drawn from: the plan, its
//! model and what it was agreed on, and the points of its curves against
//! quality, computed once for every chart.

use super::scale::nice_ceiling;
use crate::model::Model;
use crate::numeric::Quantity::{Amount, Probability};
use crate::numeric::{NumericalError, Quantity, Short, check};
use crate::plan::{StagedPlan, measures, quality_at_pa};
use crate::print::agreement::Agreement;
use crate::print::wording::sheet::quality;

/// An attributes plan as its charts see it.
pub struct Subject<'a> {
    /// The plan.
    pub plan: &'a StagedPlan,
    /// Its model.
    pub model: &'a Model,
    /// What it was agreed on, with what it achieves there.
    pub agreement: &'a Agreement,
    /// Whether qualities are nonconformities per unit.
    pub per_unit: bool,
}

/// One point of the curves against quality, from one evaluation.
#[derive(Clone, Copy)]
pub struct CurvePoint {
    /// The quality.
    pub p: f64,
    /// The probability of acceptance there.
    pub pa: f64,
    /// The average outgoing quality there.
    pub aoq: f64,
    /// The average sample number there.
    pub asn: f64,
}

/// The quality axis's end and the points of the curves on it.
pub struct Curves {
    /// The end of the quality axis.
    pub x_max: f64,
    /// The points, from quality 0 (or just above) to `x_max`.
    pub points: Vec<CurvePoint>,
}

impl Curves {
    /// The curve of one measure, as `(quality, value)` points.
    pub fn of(&self, measure: impl Fn(&CurvePoint) -> f64) -> Vec<(f64, f64)> {
        self.points.iter().map(|pt| (pt.p, measure(pt))).collect()
    }
}

impl Subject<'_> {
    /// A quality as the charts print it.
    pub fn q(&self, v: f64) -> String {
        quality(v, self.per_unit)
    }

    /// The quality axis and the curve points of the plan: 241 even steps
    /// up to where Pa has fallen to 0.02 (or 1.2 times the upper quality
    /// of the agreement if that is further).
    ///
    /// # Errors
    /// [`NumericalError`] when a point of a curve is out of its range: it
    /// stops the chart rather than bend a curve.
    pub fn curves(&self) -> Result<Curves, NumericalError> {
        let upper = self.agreement.qualities().1;
        let x_max = nice_ceiling(quality_at_pa(self.plan, self.model, 0.02).max(upper * 1.2));
        let points = (0..=240)
            .map(|i| x_max * i as f64 / 240.0)
            .map(|v| v.max(x_max * 1e-6))
            // One evaluation per point serves every curve.
            .map(|p| {
                let m = measures(self.plan, self.model, p);
                let (p_short, quality) = (Short(p), Quantity::quality(self.model.kind()));
                check(
                    Probability,
                    format_args!("Pa at quality {p_short} on the OC curve"),
                    m.pa,
                )?;
                check(
                    quality,
                    format_args!("AOQ at quality {p_short} on the AOQ curve"),
                    m.aoq,
                )?;
                check(
                    Amount,
                    format_args!("ASN at quality {p_short} on the ASN curve"),
                    m.asn,
                )?;
                Ok(CurvePoint {
                    p,
                    pa: m.pa,
                    aoq: m.aoq,
                    asn: m.asn,
                })
            })
            .collect::<Result<_, NumericalError>>()?;
        Ok(Curves { x_max, points })
    }
}
