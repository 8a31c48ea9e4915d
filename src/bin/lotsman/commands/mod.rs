//! One file per command: each takes its parsed arguments, calls the
//! library, prints, and returns the outcome that `main` turns into the exit
//! code. What several batch commands share is in [`batch`].

pub mod batch;
pub mod compare;
pub mod demo;
pub mod design;
pub mod draw;
pub mod evaluate;
pub mod history;
pub mod judge;
pub mod new;
pub mod record;
pub mod rectify;
pub mod sheet;
pub mod standard;
pub mod status;
pub mod tradeoff;
pub mod verify;
pub mod verify_ledger;
