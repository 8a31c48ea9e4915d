//! The count of one more unit: it either stays or rises by one, under the
//! two models whose unit is conforming or nonconforming.
//!
//! An item-by-item plan inspects one unit per stage. Its count window is
//! then two terms, `P(X = 0)` and `P(X = 1)`, which follow from the model in
//! one division each, without the saddle-point logarithm and the tail sums
//! a general window needs:
//!
//! ```text
//! binomial:        P(X = 1) = p,                    P(X = 0) = 1 - p
//! hypergeometric:  P(X = 1) = (D - d) / (N - n),     P(X = 0) = (N - n - D + d) / (N - n)
//! ```
//!
//! after `n` units holding `d` nonconforming ones from a lot of `N` units
//! holding `D` (Bernoulli trials, and drawing one unit from what is left of
//! the lot: e.g. Feller, *An Introduction to Probability Theory and Its
//! Applications*, vol. I, ch. II and VI, from memory). A Poisson unit may
//! carry any number of nonconformities, so the Poisson model has no such
//! step.

use super::hypergeometric::nonconforming_in_lot;
use super::{Model, ModelKind};

/// How one more unit changes the count of lots of one quality.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) enum OneUnit {
    /// Every unit is nonconforming with probability `up`, whatever came
    /// before.
    Binomial {
        /// `1 - p`, formed as `Binomial` forms it.
        stay: f64,
        /// `p`.
        up: f64,
    },
    /// The unit is drawn from what is left of a lot of `lot` units holding
    /// `bad` nonconforming ones.
    Hypergeometric {
        /// `N`.
        lot: u64,
        /// `D = round(p N)`.
        bad: u64,
    },
}

impl OneUnit {
    /// `(P(X = 0), P(X = 1))` for the next unit after `drawn` units holding
    /// `found` nonconforming ones; `None` for a hypergeometric state the
    /// earlier draws cannot produce (more found than the lot holds, or no
    /// unit left).
    pub(crate) fn odds(&self, drawn: u64, found: u64) -> Option<(f64, f64)> {
        match *self {
            OneUnit::Binomial { stay, up } => Some((stay, up)),
            OneUnit::Hypergeometric { lot, bad } => {
                let left = lot.checked_sub(drawn).filter(|&l| l > 0)?;
                let bad_left = bad.checked_sub(found).filter(|&b| b <= left)?;
                // Both numerators are whole numbers below 2^53 (the lot
                // limit), so each probability is one correctly rounded
                // division.
                let whole = left as f64;
                Some(((left - bad_left) as f64 / whole, bad_left as f64 / whole))
            }
        }
    }
}

impl Model {
    /// The one-unit step of lots of quality `p`, or `None` under the
    /// Poisson model (a unit may carry several nonconformities).
    pub(crate) fn one_unit(&self, p: f64) -> Option<OneUnit> {
        match self.kind {
            ModelKind::Binomial => Some(OneUnit::Binomial {
                stay: 1.0 - p,
                up: p,
            }),
            ModelKind::Hypergeometric => {
                // As `Model::count`: a model without a lot size is not built.
                let lot = self.lot_size.unwrap_or(u64::MAX);
                Some(OneUnit::Hypergeometric {
                    lot,
                    bad: nonconforming_in_lot(p, lot),
                })
            }
            ModelKind::Poisson => None,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn one_unit_odds_are_the_draw_of_one_unit() {
        let m = Model::new(ModelKind::Binomial, None).unwrap();
        assert_eq!(
            m.one_unit(0.25).unwrap().odds(7, 3),
            Some((0.75, 0.25)),
            "hand computed: a Bernoulli(0.25) unit"
        );
        let m = Model::new(ModelKind::Hypergeometric, Some(10)).unwrap();
        // D = 3 of 10; after 4 units holding 1: 6 left, 2 of them bad.
        let one = m.one_unit(0.3).unwrap();
        assert_eq!(
            one.odds(4, 1),
            Some((4.0 / 6.0, 2.0 / 6.0)),
            "hand computed"
        );
        assert_eq!(one.odds(4, 4), None, "more found than the lot holds");
        assert_eq!(one.odds(10, 3), None, "no unit left");
        assert!(
            Model::new(ModelKind::Poisson, None)
                .unwrap()
                .one_unit(0.1)
                .is_none()
        );
    }
}
