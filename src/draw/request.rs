//! A validated draw request, its work estimate, and the draw itself.

use serde::Serialize;

use super::cartons::{CartonShare, carton_shares};
use super::floyd::floyd_sample;
use super::generator::Generator;
use super::seed::SeedSource;
use crate::budget::Work;
use crate::input::InputError;
use crate::model::MAX_LOT_SIZE;
use crate::plain::is_unsafe_char;

/// The longest lot ID, in bytes.
const MAX_LOT_ID_BYTES: usize = 200;

/// What to draw: from which lot, how many units, in how many cartons, with
/// which seed. Built by [`DrawRequest::new`], so that a request that
/// exists can be drawn.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct DrawRequest {
    lot: String,
    lot_size: u64,
    sample: u64,
    cartons: Option<u64>,
    seed: u64,
    seed_source: SeedSource,
}

impl DrawRequest {
    /// A draw of `sample` units from the lot `lot` of `lot_size` units
    /// (in `cartons` cartons of nearly equal size when given), with `seed`
    /// from `seed_source`.
    ///
    /// # Errors
    /// [`InputError`] naming the value: an empty lot ID or one with
    /// control characters, a lot size outside `1..=10^12`, a sample of 0
    /// or larger than the lot (then every unit is inspected and nothing is
    /// drawn), no cartons or more cartons than units, and a draw whose
    /// work passes the budget ([`draw_work`]).
    pub fn new(
        lot: &str,
        lot_size: u64,
        sample: u64,
        cartons: Option<u64>,
        seed: u64,
        seed_source: SeedSource,
    ) -> Result<Self, InputError> {
        if lot.trim().is_empty() {
            return Err(InputError::Inconsistent(
                "the lot ID (--lot) is empty; give the lot's ID as written on its label".into(),
            ));
        }
        if lot.chars().any(is_unsafe_char) || lot.len() > MAX_LOT_ID_BYTES {
            return Err(InputError::out_of_range(
                "the lot ID (--lot)",
                crate::plain::escape_controls(lot),
                &format!("printable text of at most {MAX_LOT_ID_BYTES} bytes"),
            ));
        }
        if !(1..=MAX_LOT_SIZE).contains(&lot_size) {
            return Err(InputError::out_of_range(
                "lot size (--lot-size)",
                lot_size,
                "a whole number from 1 to 1000000000000",
            ));
        }
        if sample == 0 {
            return Err(InputError::out_of_range(
                "sample size (--n)",
                0,
                "at least 1 unit; a plan that inspects no unit needs no draw",
            ));
        }
        if sample > lot_size {
            return Err(InputError::Inconsistent(format!(
                "the sample (--n {sample}) is larger than the lot (--lot-size {lot_size}): inspect every unit of the lot; there is nothing to draw"
            )));
        }
        if let Some(c) = cartons {
            if c == 0 {
                return Err(InputError::out_of_range(
                    "cartons (--cartons)",
                    0,
                    "at least 1",
                ));
            }
            if c > lot_size {
                return Err(InputError::Inconsistent(format!(
                    "{c} cartons (--cartons) cannot each hold a unit of a lot of {lot_size}: give at most {lot_size} cartons"
                )));
            }
        }
        draw_work(lot_size, sample, cartons).check(
            "this draw",
            "draw a smaller sample, or split the lot and draw each part",
        )?;
        Ok(DrawRequest {
            lot: lot.to_string(),
            lot_size,
            sample,
            cartons,
            seed,
            seed_source,
        })
    }

    /// The lot ID.
    pub fn lot(&self) -> &str {
        &self.lot
    }

    /// The lot size N.
    pub fn lot_size(&self) -> u64 {
        self.lot_size
    }

    /// The sample size n.
    pub fn sample(&self) -> u64 {
        self.sample
    }

    /// The number of cartons of a stratified draw.
    pub fn cartons(&self) -> Option<u64> {
        self.cartons
    }

    /// The seed.
    pub fn seed(&self) -> u64 {
        self.seed
    }

    /// Where the seed came from.
    pub fn seed_source(&self) -> &SeedSource {
        &self.seed_source
    }
}

/// The work of a draw of `sample` units from `lot_size` in `cartons`.
///
/// Time: 150 ns per unit drawn (one ChaCha20 word, a set insertion, the
/// sort and the printed row) and 100 ns per carton, on the calibration
/// machine: a sample of 10^7 takes about 1.5 s. Memory: per unit drawn, 8
/// bytes of position, 24 of hash set (or one bit per position of the
/// carton, when smaller) and 48 of printed text; 80 bytes per carton. A
/// sample of 10^7 needs about 800 MB, within the budget of 1 GiB.
pub fn draw_work(lot_size: u64, sample: u64, cartons: Option<u64>) -> Work {
    #[allow(clippy::cast_precision_loss)]
    let (n, k, c) = (lot_size as f64, sample as f64, cartons.unwrap_or(1) as f64);
    let set = (24.0 * k).min(n / 8.0);
    Work {
        seconds: 150e-9 * k + 100e-9 * c,
        bytes: (8.0 + 48.0) * k + set + 80.0 * c,
    }
}

/// One unit drawn: its lot position, and its carton and place in the
/// carton in a stratified draw.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
pub struct DrawnUnit {
    /// The unit's position in the lot, from 1.
    pub position: u64,
    /// Its carton, from 1 (stratified draws).
    pub carton: Option<u64>,
    /// Its position in the carton, from 1 (stratified draws).
    pub in_carton: Option<u64>,
}

/// A draw: the request, the cartons' shares and the positions drawn.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Draw {
    /// What was drawn.
    pub request: DrawRequest,
    /// The cartons with their shares of the sample; empty when the draw is
    /// not stratified.
    pub shares: Vec<CartonShare>,
    /// The positions drawn, in increasing order, without repeats.
    pub positions: Vec<u64>,
}

impl Draw {
    /// The units drawn, in increasing order of position, with their
    /// cartons.
    pub fn units(&self) -> impl Iterator<Item = DrawnUnit> + '_ {
        let mut shares = self.shares.iter().peekable();
        self.positions.iter().map(move |&position| {
            while shares.peek().is_some_and(|s| s.last() < position) {
                shares.next();
            }
            let share = shares.peek();
            DrawnUnit {
                position,
                carton: share.map(|s| s.carton),
                in_carton: share.map(|s| position - s.first + 1),
            }
        })
    }
}

/// Draws the units of `request`: the generator keyed by its seed
/// ([`Generator::new`]); without cartons, Floyd's sample of the sample
/// size from `1..=N`; with cartons, the shares of [`carton_shares`], then
/// Floyd's sample of each carton's share from its units, carton 1 first,
/// all from the one generator, each carton's positions shifted to the
/// lot's numbering.
///
/// ```
/// use lotsman::{DrawRequest, SeedSource, draw};
/// let r = DrawRequest::new("L-1", 500, 20, None, 42, SeedSource::Given).unwrap();
/// let d = draw(&r);
/// assert_eq!(d.positions.len(), 20);
/// assert!(d.positions.windows(2).all(|w| w[0] < w[1]));
/// assert_eq!(d.positions, draw(&r).positions);
/// ```
pub fn draw(request: &DrawRequest) -> Draw {
    let mut generator = Generator::new(request.seed);
    let (shares, positions) = match request.cartons {
        None => (
            Vec::new(),
            floyd_sample(&mut generator, request.lot_size, request.sample),
        ),
        Some(c) => {
            let shares = carton_shares(request.lot_size, c, request.sample);
            let mut positions = Vec::with_capacity(usize::try_from(request.sample).unwrap_or(0));
            for share in &shares {
                let drawn = floyd_sample(&mut generator, share.size, share.sample);
                positions.extend(drawn.into_iter().map(|p| share.first + p - 1));
            }
            (shares, positions)
        }
    };
    Draw {
        request: request.clone(),
        shares,
        positions,
    }
}
