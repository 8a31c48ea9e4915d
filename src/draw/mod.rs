//! The random draw of the units to inspect (`lotsman draw`): which unit
//! positions of a lot, numbered 1 to N, go into the sample, drawn so that
//! an auditor can draw them again from the recorded seed.
//!
//! # What makes a draw reproducible
//!
//! * The seed ([`draw_seed`]): a `u64` given by the user, or derived from
//!   the lot ID and the SHA-256 of the plan source's text.
//! * The generator ([`Generator`]): ChaCha20 (Bernstein's stream cipher,
//!   20 rounds, as in RFC 8439) keyed by the seed, from the `rand_chacha`
//!   crate, read as raw 64-bit words. The keystream of a key is fixed by
//!   the cipher's definition, not by the crate's version.
//! * The bounded integers ([`Generator::below`]): Lemire's multiply-and-
//!   reject method, unbiased.
//! * The sample without replacement ([`floyd_sample`]): Floyd's algorithm,
//!   one bounded integer per unit drawn.
//! * Cartons ([`carton_shares`]): the sample is allocated to the cartons
//!   in proportion to their sizes by largest remainders, then drawn
//!   carton by carton, in carton order, from the one generator.
//! * Stages ([`draw_stages`]): stage 1 is the single draw of its size;
//!   each later stage, from the same generator, is Floyd's sample of the
//!   units the stages before it left, so that no unit is drawn twice and
//!   the first stages of a longer draw are the draw of those stages alone.
//!   An item-by-item draw is stages of one unit each, in order.
//!
//! No higher-level sampling method of the `rand` crates is used: their
//! output may change between versions, these steps cannot.

mod cartons;
mod floyd;
mod generator;
mod kind;
mod nested;
mod request;
mod seed;
mod stages;
mod work;

pub use cartons::{CartonShare, carton_shares};
pub use floyd::floyd_sample;
pub use generator::{DRAW_GENERATOR, Generator};
pub use kind::DrawKind;
pub use nested::{NestedPart, nested_parts};
pub use request::{Draw, DrawRequest, DrawnUnit, draw};
pub use seed::{SeedSource, draw_seed};
pub use stages::draw_stages;
pub use work::draw_work;
