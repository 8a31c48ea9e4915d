//! The numerical guard of every report: before a report is written, each
//! number in it must be a value of its kind ([`Quantity`]): a probability
//! within `[0, 1]`; a quality, AOQ or AOQL a fraction within `[0, 1]` under
//! the binomial and hypergeometric models and a rate (finite, not negative,
//! possibly above 1) under the Poisson model; a count of units or a cost
//! finite and not negative. A report that fails is not printed; the
//! command stops with the [`NumericalError`] instead.

use super::compare::CompareReport;
use super::design::DesignReport;
use super::evaluation::EvaluationReport;
use super::parts::PointReport;
use super::rectifying::RectifyingReport;
use super::tradeoff::TradeoffReport;
use super::variables_design::VariablesDesignReport;
use super::variables_evaluation::VariablesEvaluationReport;
use crate::numeric::{NumericalError, Quantity, Short, check};
use crate::plan::{Aoql, MeasurementJudgement, Measures, VariablesPoint};

type Checked = Result<(), NumericalError>;

use Quantity::{Amount, Probability};

/// `NAME at quality Q`, written out only when a check fails.
fn at(name: &str, quality: f64) -> impl std::fmt::Display + '_ {
    struct At<'a>(&'a str, f64);
    impl std::fmt::Display for At<'_> {
        fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
            write!(f, "{} at quality {}", self.0, Short(self.1))
        }
    }
    At(name, quality)
}

/// The AOQL and its quality, both of the model's quality kind.
fn aoql(a: &Aoql, quality: Quantity) -> Checked {
    check(quality, "AOQL", a.value)?;
    check(quality, "quality of the AOQL", a.quality)
}

fn measures(m: &Measures, quality: Quantity) -> Checked {
    check(Probability, at("Pa", m.quality), m.pa)?;
    check(quality, at("AOQ", m.quality), m.aoq)?;
    check(Amount, at("ASN", m.quality), m.asn)?;
    if let Some(ati) = m.ati {
        check(Amount, at("ATI", m.quality), ati)?;
    }
    if let Some(asn) = m.asn_curtailed {
        check(Amount, at("curtailed ASN", m.quality), asn)?;
    }
    Ok(())
}

fn variables_point(p: &VariablesPoint) -> Checked {
    check(Probability, at("Pa", p.quality), p.pa)?;
    if let Some(pa) = p.pa_centred {
        check(Probability, at("Pa (mean centred)", p.quality), pa)?;
    }
    check(Quantity::Fraction, at("AOQ", p.quality), p.aoq)?;
    if let Some(ati) = p.ati {
        check(Amount, at("ATI", p.quality), ati)?;
    }
    Ok(())
}

fn achieved(producer: &PointReport, consumer: &PointReport) -> Checked {
    check(
        Probability,
        "achieved producer's risk",
        producer.achieved_risk,
    )?;
    check(
        Probability,
        "achieved consumer's risk",
        consumer.achieved_risk,
    )
}

impl DesignReport {
    /// Checks the achieved risks and the ASN figures.
    ///
    /// # Errors
    /// [`NumericalError`] naming the first number out of its range.
    pub fn check(&self) -> Checked {
        achieved(&self.producer, &self.consumer)?;
        if let Some(a) = &self.asn {
            for (name, v) in [
                ("ASN at the AQL", a.at_aql),
                ("ASN at the RQL", a.at_rql),
                ("largest ASN", a.max),
            ] {
                check(Amount, name, v)?;
            }
        }
        Ok(())
    }
}

impl CompareReport {
    /// Checks each plan's risks, AOQL and average sample numbers.
    ///
    /// # Errors
    /// [`NumericalError`] naming the first number out of its range.
    pub fn check(&self) -> Checked {
        for p in &self.plans {
            let quality = Quantity::quality(p.model);
            check(Probability, at("Pa", self.aql), p.pa_at_aql)?;
            check(Probability, at("Pa", self.rql), p.consumer_risk)?;
            check(Probability, "producer's true risk", p.producer_risk)?;
            aoql(
                &Aoql {
                    value: p.aoql,
                    quality: p.aoql_quality,
                },
                quality,
            )?;
            check(Amount, at("ASN", self.aql), p.asn_at_aql)?;
            check(Amount, at("ASN", self.rql), p.asn_at_rql)?;
        }
        Ok(())
    }
}

impl EvaluationReport {
    /// Checks every point, the stage shares, the AOQL and the indifference
    /// quality; qualities and AOQs by the model's kind.
    ///
    /// # Errors
    /// [`NumericalError`] naming the first number out of its range.
    pub fn check(&self) -> Checked {
        let quality = Quantity::quality(self.model);
        for m in &self.points {
            measures(m, quality)?;
        }
        for (m, shares) in self.points.iter().zip(self.decided_at.iter().flatten()) {
            for &share in shares {
                check(
                    Probability,
                    at("share decided at a stage", m.quality),
                    share,
                )?;
            }
        }
        aoql(&self.aoql, quality)?;
        check(quality, "indifference quality", self.indifference_quality)
    }
}

impl VariablesDesignReport {
    /// Checks the achieved risks.
    ///
    /// # Errors
    /// [`NumericalError`] naming the first number out of its range.
    pub fn check(&self) -> Checked {
        achieved(&self.producer, &self.consumer)
    }
}

impl VariablesEvaluationReport {
    /// Checks every point, the AOQL and the indifference quality (fractions
    /// beyond the limits).
    ///
    /// # Errors
    /// [`NumericalError`] naming the first number out of its range.
    pub fn check(&self) -> Checked {
        for p in &self.points {
            variables_point(p)?;
        }
        aoql(&self.aoql, Quantity::Fraction)?;
        check(
            Quantity::Fraction,
            "indifference quality",
            self.indifference_quality,
        )
    }
}

impl TradeoffReport {
    /// Checks every cell's risks, ASN and cost view.
    ///
    /// # Errors
    /// [`NumericalError`] naming the first number out of its range.
    pub fn check(&self) -> Checked {
        for c in &self.cells {
            for (kind, name, v) in [
                (Probability, "achieved producer's risk", c.producer_risk),
                (Probability, "achieved consumer's risk", c.consumer_risk),
                (
                    Probability,
                    "Pa at the process average",
                    c.pa_at_process.flatten(),
                ),
                (Amount, "ASN at the AQL", c.asn_at_aql),
                (Amount, "ATI", c.ati.flatten()),
                (Amount, "cost", c.cost.flatten()),
            ] {
                if let Some(v) = v {
                    let cell = format_args!(
                        "{name} of the cell AQL {}, RQL {}",
                        Short(c.aql),
                        Short(c.rql)
                    );
                    check(kind, cell, v)?;
                }
            }
        }
        Ok(())
    }
}

impl RectifyingReport {
    /// Checks the chosen plan's and the comparison plan's measures.
    ///
    /// # Errors
    /// [`NumericalError`] naming the first number out of its range.
    pub fn check(&self) -> Checked {
        let quality = Quantity::quality(self.model);
        for p in self.plan.iter().chain(&self.single_plan) {
            check(Probability, "Pa at the process average", p.pa)?;
            check(Amount, "ATI at the process average", p.ati)?;
            check(Amount, "ASN at the process average", p.asn)?;
            aoql(&p.aoql, quality)?;
            check(quality, "LTPD", p.ltpd)?;
            if let Some(pa) = p.pa_at_ltpd {
                check(Probability, "Pa at the agreed LTPD", pa)?;
            }
        }
        for row in &self.by_acceptance_number {
            if let Some(ati) = row.ati {
                check(Amount, format_args!("ATI of c = {}", row.c), ati)?;
            }
        }
        Ok(())
    }
}

impl MeasurementJudgement {
    /// Checks the estimates and the p-values.
    ///
    /// # Errors
    /// [`NumericalError`] naming the first number out of its range.
    pub fn check(&self) -> Checked {
        for side in self.decided.lower.iter().chain(&self.decided.upper) {
            if let Some(e) = side.estimate {
                check(Quantity::Fraction, "estimated fraction beyond a limit", e)?;
            }
        }
        if let Some(e) = self.decided.estimate {
            check(Quantity::Fraction, "estimated fraction nonconforming", e)?;
        }
        if let Some(ad) = &self.normality {
            check(Probability, "Anderson-Darling p-value", ad.p_value)?;
        }
        if let Some(p) = self.sigma_p_value {
            check(Probability, "chi-square p-value of s", p)?;
        }
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::{Model, ModelKind};
    use crate::plan::{StagedPlan, evaluate_with_decided};

    #[test]
    fn a_report_with_a_nan_or_an_impossible_probability_is_withheld() {
        let model = Model::new(ModelKind::Binomial, Some(1000)).unwrap();
        let plan = StagedPlan::single(50, 1, &model).unwrap();
        let evaluation = evaluate_with_decided(&plan, &model, &[0.01, 0.05]).unwrap();
        let mut report = EvaluationReport::from(&evaluation);
        assert!(report.check().is_ok());
        report.points[1].pa = f64::NAN;
        let e = report.check().unwrap_err().to_string();
        assert!(e.contains("Pa at quality 0.05 = NaN"), "{e}");
        report.points[1].pa = 0.3;
        report.decided_at.as_mut().unwrap()[0][0] = 1.5;
        assert!(report.check().is_err());
    }
}
