//! The reference suite: lotsman's numbers against values computed outside
//! the project. The fixtures in tests/data/ are written by the Python
//! scripts beside this file (mpmath at 50 digits, scipy.stats; see
//! docs/validation.md); `.ci/run` checks that the scripts reproduce them.
//! The published worked examples and tables are in `published`.
//!
//! Run it alone with `cargo test --test reference`.

// A failed check is the point of a test: unwrap, expect and panic are
// allowed here (the `[lints]` table of Cargo.toml denies them elsewhere).
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::panic)]

mod fixtures;

mod interval;
mod published;
mod rectifying;
mod single;
mod staged;
mod tradeoff;
mod variables;
