//! A validated draw request, its work estimate, and the draw itself.

use serde::Serialize;

use super::cartons::{CartonShare, carton_shares};
use super::floyd::floyd_sample;
use super::generator::Generator;
use super::kind::{DrawKind, check_sizes};
use super::seed::SeedSource;
use super::stages::draw_stages;
use super::work::draw_work;
use crate::input::InputError;
use crate::model::MAX_LOT_SIZE;
use crate::plain::is_unsafe_char;

/// The longest lot ID, in bytes.
const MAX_LOT_ID_BYTES: usize = 200;

/// What to draw: from which lot, how many units in which stages, in how
/// many cartons, with which seed. Built by [`DrawRequest::new`],
/// [`DrawRequest::staged`] or [`DrawRequest::items`], so that a request
/// that exists can be drawn.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct DrawRequest {
    lot: String,
    lot_size: u64,
    kind: DrawKind,
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
        Self::staged(lot, lot_size, &[sample], cartons, seed, seed_source)
    }

    /// A draw in stages of `sizes` units (a double or multiple plan's
    /// sample sizes, stage 1 first); one size is [`DrawRequest::new`]'s
    /// draw. Stage 1 is the same as a single draw of its size, and each
    /// later stage is drawn from the units the stages before it left
    /// ([`draw`]), so that drawing the first stages again gives the same
    /// units.
    ///
    /// # Errors
    /// As [`DrawRequest::new`], and: no stage, a stage of 0 units, stages
    /// that together pass the lot (the refusal names the total), and
    /// cartons with more than one stage (the cartons' shares are of one
    /// sample).
    pub fn staged(
        lot: &str,
        lot_size: u64,
        sizes: &[u64],
        cartons: Option<u64>,
        seed: u64,
        seed_source: SeedSource,
    ) -> Result<Self, InputError> {
        Self::build(
            lot,
            lot_size,
            DrawKind::Stages(sizes.to_vec()),
            cartons,
            seed,
            seed_source,
        )
    }

    /// A draw of `items` units one at a time, in the order to inspect
    /// them, for an item-by-item (sequential) plan: `items` stages of one
    /// unit each ([`DrawRequest::staged`]), each a uniform choice among
    /// the units not drawn yet. The first items of a longer list are the
    /// items of a shorter one.
    ///
    /// # Errors
    /// As [`DrawRequest::new`] without cartons, with `--items` named.
    pub fn items(
        lot: &str,
        lot_size: u64,
        items: u64,
        seed: u64,
        seed_source: SeedSource,
    ) -> Result<Self, InputError> {
        Self::build(
            lot,
            lot_size,
            DrawKind::Items(items),
            None,
            seed,
            seed_source,
        )
    }

    fn build(
        lot: &str,
        lot_size: u64,
        kind: DrawKind,
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
        check_sizes(&kind, lot_size)?;
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
            if kind.stage_count() > 1 || matches!(kind, DrawKind::Items(_)) {
                return Err(InputError::Inconsistent(
                    "--cartons shares one sample among cartons; for a plan of several stages or items draw without --cartons, or draw each stage's carton share by hand".into(),
                ));
            }
        }
        let advice = match kind {
            DrawKind::Items(_) => {
                "draw fewer items: a longer list drawn later begins with the same items"
            }
            DrawKind::Stages(_) => "draw a smaller sample, or split the lot and draw each part",
        };
        draw_work(lot_size, &kind, cartons).check("this draw", advice)?;
        Ok(DrawRequest {
            lot: lot.to_string(),
            lot_size,
            kind,
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

    /// The sample size n: all stages' units together.
    pub fn sample(&self) -> u64 {
        self.kind.total()
    }

    /// How the units are laid out: stages, or items one at a time.
    pub fn kind(&self) -> &DrawKind {
        &self.kind
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

/// A draw: the request, the cartons' shares and the positions drawn,
/// stage by stage and all together.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Draw {
    /// What was drawn.
    pub request: DrawRequest,
    /// The cartons with their shares of the sample; empty when the draw is
    /// not stratified.
    pub shares: Vec<CartonShare>,
    /// The positions drawn, in increasing order, without repeats.
    pub positions: Vec<u64>,
    /// Each stage's positions, in increasing order, stage 1 first: one
    /// stage for a single draw; for an item-by-item draw, one stage per
    /// item, in the order to inspect them.
    pub stages: Vec<Vec<u64>>,
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
/// ([`Generator::new`]); without cartons, the stages of [`draw_stages`]
/// (for one stage, Floyd's sample of the sample size from `1..=N`; each
/// later stage Floyd's sample from the units the stages before it left;
/// an item-by-item draw as stages of one unit); with cartons (one stage),
/// the shares of [`carton_shares`], then Floyd's sample of each carton's
/// share from its units, carton 1 first, all from the one generator, each
/// carton's positions shifted to the lot's numbering.
///
/// ```
/// use lotsman::{DrawRequest, SeedSource, draw};
/// let r = DrawRequest::new("L-1", 500, 20, None, 42, SeedSource::Given).unwrap();
/// let d = draw(&r);
/// assert_eq!(d.positions.len(), 20);
/// assert!(d.positions.windows(2).all(|w| w[0] < w[1]));
/// assert_eq!(d.positions, draw(&r).positions);
/// // Stage 1 of a double plan's draw is the single draw of its size.
/// let two = DrawRequest::staged("L-1", 500, &[20, 20], None, 42, SeedSource::Given).unwrap();
/// assert_eq!(draw(&two).stages[0], d.positions);
/// ```
pub fn draw(request: &DrawRequest) -> Draw {
    let mut generator = Generator::new(request.seed);
    let (shares, stages, positions) = match request.cartons {
        None => {
            let (stages, positions) =
                draw_stages(&mut generator, request.lot_size, &request.kind.sizes());
            (Vec::new(), stages, positions)
        }
        Some(c) => {
            let sample = request.sample();
            let shares = carton_shares(request.lot_size, c, sample);
            let mut positions = Vec::with_capacity(usize::try_from(sample).unwrap_or(0));
            for share in &shares {
                let drawn = floyd_sample(&mut generator, share.size, share.sample);
                positions.extend(drawn.into_iter().map(|p| share.first + p - 1));
            }
            (shares, vec![positions.clone()], positions)
        }
    };
    Draw {
        request: request.clone(),
        shares,
        positions,
        stages,
    }
}
