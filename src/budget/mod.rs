//! The work budget: every command estimates its work from its inputs
//! before it starts, and refuses at once, in one line, when the estimate
//! passes [`TIME_BUDGET`] (10 s) or [`MEMORY_BUDGET`] (1 GiB).
//!
//! # Why estimate
//!
//! An exact plan can cost anything from microseconds to hours: a double
//! search grows with the cube of the acceptance numbers, an item-by-item
//! plan's OC with its truncation, a finite lot's hypergeometric terms with
//! every state of the recursion. A user who asks for too much should learn
//! it at once, with the way to ask for less, rather than after a minute or
//! when the memory runs out. The estimates are formulas in the inputs
//! (sample sizes, acceptance numbers, stages, qualities, cells), so they
//! cost microseconds; where a staged designer's work depends on the single
//! plan for the same points, that plan (whose own search is bounded, and
//! estimated first from the closed-form approximation) is designed first.
//!
//! # The units
//!
//! Each estimate counts the operations its algorithm repeats and converts
//! them to seconds with constants fitted on the machine the budget is
//! stated for:
//!
//! * an OC walk ([`walk_seconds`](crate::walk_seconds)): the cells of the recursion
//!   (`open states x next states`, summed over the stages) and the terms of
//!   the count windows (one window per stage for the binomial and Poisson
//!   models, one per open state for the hypergeometric model, whose lot
//!   changes with every state);
//! * the designers' searches: the double sweep's size `n (c + 3)^3`, the
//!   sequential search's `n (c + 1)` item steps, the multiple search's
//!   stage sizes, the minimum-inspection scan;
//! * the variables plans: noncentral-t evaluations;
//! * memory: the rows a report keeps, the text it prints.
//!
//! The hypergeometric model costs more at every step (a window per state,
//! a log-gamma saddle point per window), and its constants are fitted
//! separately.
//!
//! # Calibration
//!
//! The constants were fitted with `cargo bench --bench calibrate_budget`,
//! which times a range of real cases and prints each estimate beside the
//! measured time; rerun it to recalibrate on another machine. Machine: AMD
//! EPYC, 2 cores (shared), x86-64 Linux, release build; date: 3 December
//! 2026 (the constants in the estimates name the cases they come from). A
//! debug build runs about ten to thirty times slower than the estimates,
//! which are stated for the release build.
//!
//! The estimates are of the time a user waits on the idle machine:
//! processor time for work on one thread, and for work shared over the
//! threads (the double sweep, a grid's rows, a batch's sources) that time
//! divided among them. They aim to be within a factor of two of the
//! measured time; the budget is a guard against runaway work, not a
//! promise of a duration. The calibration run (seconds, release build;
//! the cheap cases, whose row formatting the measurement leaves out, are
//! overstated):
//!
//! ```text
//! case                                                     estimate  measured
//! evaluate 7-stage plan, binomial, 20000 qualities             0.13      0.12
//! evaluate 7-stage plan, lot of 2 10^4, 5000 qualities         0.05      0.08
//! evaluate 10 stages of 400 open counts, Poisson, 20           37        17
//! evaluate item by item 0.1%/0.3% (5936 items), 1000           2.1       1.4
//!   the same with the per-stage distribution                   3.4       1.7
//! evaluate item by item 1%/2%, lot of 2 10^4, 200              1.7       0.96
//! design single + alternatives, 1%/1.02%, binomial             1.4       1.6
//!   the same, lot of 10^8                                      3.6       4.0
//! single designer alone, lot of 10^8, 1%/1.01%                 6.9       4.0
//! design double 0.5%/1.2%, binomial                            0.33      0.31
//!   the same, lot of 10^6                                      1.2       0.97
//!   the same, lot of 10^6, asn-max                             2.5       2.8
//! design sequential 1%/1.3%, binomial                          1.4       1.5
//!   0.5%/0.8%, lot of 3 10^4                                   2.9       1.4
//! design multiple 0.5%/1%, binomial, 7 stages                  1.3       1.2
//!   1%/2%, lot of 10^6, 3 stages                               2.0       2.0
//! trade-off grid 5 x 5 of double plans                         0.97      0.57
//! rectify, LTPD, lot of 10^8, 0.95% against 1%                 0.26      0.50
//! rectify, LTPD, lot of 10^12, 0.99% against 1%                18        18 (refused now)
//! sheet of an item-by-item plan of 165 items                   0.20      0.14
//! verify of 1001 demo sources                                  0.46      0.40
//! sheets of 1001 demo sources                                  7.7       8.1
//! ```

mod work;

pub(crate) use work::duration;
pub use work::{Limit, MEMORY_BUDGET, OverBudget, TIME_BUDGET, Work};
