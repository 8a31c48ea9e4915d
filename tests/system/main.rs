//! The system suite: checks that need programs outside cargo. Today that
//! is poppler-utils (pdftotext's word boxes and text, pdftoppm's renders):
//! a second PDF reader, independent of the lopdf the cargo suite reads
//! with. Every test here is ignored by a plain `cargo test`, which needs
//! nothing outside cargo; `.ci/run` installs poppler-utils and runs
//!
//! ```text
//! cargo test --test system -- --ignored
//! ```

// A failed check is the point of a test: unwrap, expect and panic are
// allowed here (the `[lints]` table of Cargo.toml denies them elsewhere).
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::panic)]

#[path = "../common/mod.rs"]
mod common;

mod poppler;

mod browser;
mod pages;
mod sheet;
