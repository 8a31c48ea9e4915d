//! The numerical guard of every report: before a report is written, each
//! probability in it must be finite and within `[0, 1]`, and each count of
//! units, quality and cost finite and not negative
//! ([`check_probability`], [`check_amount`]). A report that fails is not
//! printed; the command stops with the [`NumericalError`] instead.

use super::{
    DesignReport, EvaluationReport, PointReport, RectifyingReport, TradeoffReport,
    VariablesDesignReport, VariablesEvaluationReport,
};
use crate::numeric::{NumericalError, check_amount, check_probability};
use crate::plan::{Aoql, MeasurementJudgement, Measures, VariablesPoint};

type Checked = Result<(), NumericalError>;

/// `NAME at quality Q`, written out only when a check fails.
fn at(name: &str, quality: f64) -> impl std::fmt::Display + '_ {
    struct At<'a>(&'a str, f64);
    impl std::fmt::Display for At<'_> {
        fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
            write!(f, "{} at quality {}", self.0, self.1)
        }
    }
    At(name, quality)
}

fn aoql(a: &Aoql) -> Checked {
    check_probability("AOQL", a.value)?;
    check_amount("quality of the AOQL", a.quality)
}

fn measures(m: &Measures) -> Checked {
    check_probability(at("Pa", m.quality), m.pa)?;
    check_probability(at("AOQ", m.quality), m.aoq)?;
    check_amount(at("ASN", m.quality), m.asn)?;
    if let Some(ati) = m.ati {
        check_amount(at("ATI", m.quality), ati)?;
    }
    if let Some(asn) = m.asn_curtailed {
        check_amount(at("curtailed ASN", m.quality), asn)?;
    }
    Ok(())
}

fn variables_point(p: &VariablesPoint) -> Checked {
    check_probability(at("Pa", p.quality), p.pa)?;
    if let Some(pa) = p.pa_centred {
        check_probability(at("Pa (mean centred)", p.quality), pa)?;
    }
    check_probability(at("AOQ", p.quality), p.aoq)?;
    if let Some(ati) = p.ati {
        check_amount(at("ATI", p.quality), ati)?;
    }
    Ok(())
}

fn achieved(producer: &PointReport, consumer: &PointReport) -> Checked {
    check_probability("achieved producer's risk", producer.achieved_risk)?;
    check_probability("achieved consumer's risk", consumer.achieved_risk)
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
                check_amount(name, v)?;
            }
        }
        Ok(())
    }
}

impl EvaluationReport {
    /// Checks every point, the stage shares, the AOQL and the indifference
    /// quality.
    ///
    /// # Errors
    /// [`NumericalError`] naming the first number out of its range.
    pub fn check(&self) -> Checked {
        for m in &self.points {
            measures(m)?;
        }
        for (m, shares) in self.points.iter().zip(self.decided_at.iter().flatten()) {
            for &share in shares {
                check_probability(at("share decided at a stage", m.quality), share)?;
            }
        }
        aoql(&self.aoql)?;
        check_amount("indifference quality", self.indifference_quality)
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
    /// Checks every point, the AOQL and the indifference quality.
    ///
    /// # Errors
    /// [`NumericalError`] naming the first number out of its range.
    pub fn check(&self) -> Checked {
        for p in &self.points {
            variables_point(p)?;
        }
        aoql(&self.aoql)?;
        check_amount("indifference quality", self.indifference_quality)
    }
}

impl TradeoffReport {
    /// Checks every cell's risks, ASN and cost view.
    ///
    /// # Errors
    /// [`NumericalError`] naming the first number out of its range.
    pub fn check(&self) -> Checked {
        for c in &self.cells {
            for (name, v) in [
                ("achieved producer's risk", c.producer_risk),
                ("achieved consumer's risk", c.consumer_risk),
                ("Pa at the process quality", c.pa_at_process.flatten()),
            ] {
                if let Some(v) = v {
                    let cell = format_args!("{name} of the cell AQL {}, RQL {}", c.aql, c.rql);
                    check_probability(cell, v)?;
                }
            }
            for (name, v) in [
                ("ASN at the AQL", c.asn_at_aql),
                ("ATI", c.ati.flatten()),
                ("cost", c.cost.flatten()),
            ] {
                if let Some(v) = v {
                    let cell = format_args!("{name} of the cell AQL {}, RQL {}", c.aql, c.rql);
                    check_amount(cell, v)?;
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
        for p in self.plan.iter().chain(&self.single_plan) {
            check_probability("Pa at the process average", p.pa)?;
            check_amount("ATI at the process average", p.ati)?;
            check_amount("ASN at the process average", p.asn)?;
            aoql(&p.aoql)?;
            check_amount("LTPD", p.ltpd)?;
            if let Some(pa) = p.pa_at_ltpd {
                check_probability("Pa at the agreed LTPD", pa)?;
            }
        }
        for row in &self.by_acceptance_number {
            if let Some(ati) = row.ati {
                check_amount(format_args!("ATI of c = {}", row.c), ati)?;
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
        for side in self.lower.iter().chain(&self.upper) {
            if let Some(e) = side.estimate {
                check_probability("estimated fraction beyond a limit", e)?;
            }
        }
        if let Some(e) = self.estimate {
            check_probability("estimated fraction nonconforming", e)?;
        }
        if let Some(ad) = &self.normality {
            check_probability("Anderson-Darling p-value", ad.p_value)?;
        }
        if let Some(p) = self.sigma_p_value {
            check_probability("chi-square p-value of s", p)?;
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
