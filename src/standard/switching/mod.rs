//! The switching rules of MIL-STD-105E (10 May 1989, public domain) as a
//! pure state machine, and the exact long-run OC of the whole scheme.
//!
//! # The rules, in our words (section numbers of MIL-STD-105E)
//!
//! - **Start (4.6).** Inspection starts on normal inspection and stays at a
//!   severity until a rule below changes it. Each class of defects keeps
//!   its own state. Only original inspection counts: a resubmitted lot
//!   changes nothing (4.7).
//! - **Normal to tightened (4.7.1).** On normal inspection, when two lots
//!   out of at most five consecutive lots have not been accepted, the next
//!   lot is on tightened inspection. Lots count from the start of normal
//!   inspection; a lot not accepted more than four lots before the current
//!   one no longer counts.
//! - **Tightened to normal (4.7.2).** On tightened inspection, five
//!   consecutive lots accepted restore normal inspection.
//! - **Normal to reduced (4.7.3).** On normal inspection, reduced inspection
//!   starts when all of these hold: (a) the last ten lots (more where Table
//!   VIII's note allows) were on normal inspection and all were accepted;
//!   (b) the counts of those lots, every sample inspected included, add up
//!   to at most Table VIII's limit number for their units and the AQL; (c)
//!   production is steady; (d) the responsible authority approves. The user
//!   confirms (c) and (d) ([`SwitchingRules::new`]); a contract may leave
//!   reduced inspection out ([`SwitchingRules::without_reduced`]).
//! - **Reduced to normal (4.7.4).** On reduced inspection, normal inspection
//!   returns from the next lot when (a) a lot is not accepted, (b) a lot is
//!   accepted with its count above the acceptance number and below the
//!   rejection number (4.10.1.4), (c) production becomes irregular or
//!   delayed, or (d) other conditions call for it. The user records (c) and
//!   (d) ([`SwitchingState::reinstate_normal`]).
//! - **Discontinuation (4.8).** When five lots in all have not been accepted
//!   on one spell of tightened inspection, inspection under the standard
//!   stops. It resumes, on tightened inspection, after the supplier's
//!   corrective action ([`SwitchingState::resume`]). This is a state of its
//!   own, reported, never folded into the OC.
//!
//! # What is exact
//!
//! [`SwitchingRules::step`] applies the rules to one lot, exactly. The
//! scheme's long-run OC ([`SwitchingScheme::long_run`]) is a Markov chain
//! over the rules' counters, solved through its renewals at the start of
//! normal inspection (the `chain` module's doc has the algebra): exact for
//! every figure, apart from the limit-number rule's window, which needs the
//! totals of the last lots' counts (the `window` module). Its minimal exact
//! automaton is small where acceptance numbers are 0 or 1 and grows fast
//! beyond; up to [`EXACT_STATES`] states it is solved by LU decomposition
//! (exact); beyond, it is summed lot by lot with a proven bound on the rest
//! and the result says so ([`WindowSolution::Bracketed`]), with both ends;
//! beyond [`WINDOW_STATE_BUDGET`] states it is refused
//! ([`SwitchingError::WindowTooLarge`]).
//!
//! # Double and multiple plans
//!
//! Their lots inspect different units (first samples only, or more), and
//! Table VIII's row depends on the units of the window's lots, so the exact
//! rule would carry the units too. The rules here take one limit number per
//! plan ([`LimitWindow`]); for a double or multiple plan we recommend (and
//! the scheme's figures then follow) the reading that takes Table VIII's
//! row for the window's first-sample units (lots times the first sample
//! size): the fewest units those lots can have, so the smallest limit
//! number. Under that reading every switch to reduced is one the standard
//! allows; the standard may allow a switch a little sooner when second
//! samples raised the units into the next row.

mod chain;
mod counters;
mod error;
mod lot;
mod outcomes;
mod rules;
mod run;
mod state;
mod window;

pub use chain::{SchemeFigures, SchemeOc, SwitchingScheme, WindowSolution};
pub use counters::Counter;
pub use error::SwitchingError;
pub use lot::LotResult;
pub use outcomes::LotOutcomes;
pub use rules::{LimitWindow, MAX_WINDOW_LOTS, MIN_WINDOW_LOTS, SwitchingRules};
pub use run::EXACT_STATES;
pub use state::{ACCEPTED_TO_NORMAL, NOT_ACCEPTED_TO_STOP, REJECTION_SPAN, SwitchingState};
pub use window::{WINDOW_STATE_BUDGET, WindowAutomaton, state_bound};
