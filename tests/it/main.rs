//! The cargo suite: everything `cargo test` checks beyond the unit tests
//! and the reference suite, in one binary (one link after a change to the
//! library), one module per topic. It needs nothing outside cargo: PDFs
//! are read with lopdf (tests/common/pdf.rs). What needs other programs
//! (poppler's word boxes and renders) is in the system suite,
//! tests/system.

// A failed check is the point of a test: unwrap, expect and panic are
// allowed here (the `[lints]` table of Cargo.toml denies them elsewhere).
#![allow(clippy::unwrap_used, clippy::expect_used, clippy::panic)]

#[path = "../common/mod.rs"]
mod common;

mod audit;
mod batch;
mod cli;
mod commands_doc;
mod compare;
mod demo_ledger;
mod docs;
mod double_family;
mod draw;
mod guards;
mod layers;
mod ledger_concurrency;
mod ledger_fixture;
mod ledger_history;
mod ledger_kinds;
mod ledger_rules;
mod ledger_status;
mod ledger_tamper;
mod ledger_variables;
mod no_panics;
mod numbers;
mod plain_words;
mod properties;
mod rectify_cli;
mod rectify_source;
mod rectifying;
mod refusals;
mod serve;
mod sheet;
mod single_search;
mod snapshots;
mod staged;
mod standard;
mod standard_classes;
mod standard_cli;
mod standard_judge;
mod standard_risks;
mod standard_sheet;
mod standard_source;
mod standard_tables;
mod svg;
mod switching_chain;
mod switching_rules;
mod tradeoff_cli;
mod tradeoff_map;
mod tradeoff_map_svg;
mod variables;
mod variables_cli;
mod writes;
