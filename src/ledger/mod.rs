//! The lot record: a ledger of judged lots, one CSV row per lot, appended
//! and never rewritten, chained by SHA-256 hashes, and its audit replay.
//!
//! A ledger is one plain-text CSV file per supplier and part (or per plan
//! source). Its first line is the header ([`ledger_header`]); each row
//! records one decided lot ([`LedgerRow`]: the columns are listed in the
//! `row` module) and the hash that chains it to the row before
//! ([`chain_hash`]). Rows are added by [`append_lot`] under a lock on the
//! file, read strictly by [`Ledger::read`], and replayed by [`replay`]:
//! the chain, the plan revision each row names ([`KnownPlan`]), the
//! severity the switching rules of MIL-STD-105E required, and each
//! decision from its counts.
//!
//! For the commands built on it: the next lot's severity and the rules'
//! counters are [`Replay::state`] (a [`SwitchingState`](crate::SwitchingState));
//! the lots' counts and units are each row's
//! [`LotEntry::found`] and [`LotEntry::inspected`]; where the supplier
//! stands, with the process average over first samples, is
//! [`ledger_status`].

mod append;
mod date;
mod error;
mod find_plans;
mod hash;
mod history;
mod measured;
mod plan;
mod read;
mod replay;
mod row;
mod status;
mod tally;

pub use append::{append_lot, row_line};
pub use date::LotDate;
pub use error::LedgerError;
pub use find_plans::{MAX_FOLDER_FILES, ledger_plans, plans_beside};
pub use hash::{GENESIS, chain_hash};
pub use history::{History, HistoryLot, SIGMAS, control_limits, ledger_history};
pub use measured::Measured;
pub use plan::{Decided, KnownPlan, QualityTarget};
pub use read::{Ledger, LedgerLine, MAX_LEDGER_BYTES, TornLine};
pub use replay::{Finding, Replay, chain_break, replay};
pub use row::{COLUMNS, LEDGER_FORMAT, LedgerRow, LotEntry, decision_name, ledger_header};
pub use status::{
    ClassAverage, LedgerStatus, LotSample, PROCESS_AVERAGE_LEVEL, ledger_status, lot_samples,
    process_averages,
};
pub use tally::Tally;
