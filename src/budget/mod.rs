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
//! * an OC walk ([`walk_seconds`]): the cells of the recursion
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
//! 2026 (the constants in [`estimate`] name the cases they come from). A
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

mod estimate;
mod jobs;

use std::fmt;

use thiserror::Error;

pub use estimate::{
    design_work, double_work, evaluation_work, multiple_work, sequential_work, single_work,
    variables_design_work, variables_evaluation_work, walk_seconds,
};
pub(crate) use estimate::{evaluation_advice, evaluation_advice_for, most_variables_qualities};
pub(crate) use jobs::minimum_double_work;
pub use jobs::{SourceJob, check_batch, check_source, minimum_work, source_work, tradeoff_work};

/// The most seconds of work a command may need (on the calibration machine,
/// release build): 10 s.
pub const TIME_BUDGET: f64 = 10.0;

/// The most memory a command may need: 1 GiB.
pub const MEMORY_BUDGET: f64 = (1u64 << 30) as f64;

/// An estimate of a job's work: its time and its peak memory.
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct Work {
    /// Seconds on the calibration machine (release build).
    pub seconds: f64,
    /// Bytes held at the peak.
    pub bytes: f64,
}

impl Work {
    /// Work of `seconds`, with no memory to speak of.
    pub fn time(seconds: f64) -> Self {
        Work {
            seconds,
            bytes: 0.0,
        }
    }

    /// Memory of `bytes`, taking no time to speak of.
    pub fn memory(bytes: f64) -> Self {
        Work {
            seconds: 0.0,
            bytes,
        }
    }

    /// Both jobs, one after the other (times add, memories add: what the
    /// first keeps is held while the second runs).
    #[must_use]
    pub fn and(self, other: Work) -> Self {
        Work {
            seconds: self.seconds + other.seconds,
            bytes: self.bytes + other.bytes,
        }
    }

    /// Whether the work fits both budgets.
    pub fn fits(&self) -> bool {
        self.seconds <= TIME_BUDGET && self.bytes <= MEMORY_BUDGET
    }

    /// `Ok` when the work fits both budgets; otherwise the refusal, saying
    /// which limit `job` passes, by how much, and `advice` on how to bring
    /// it within.
    ///
    /// ```
    /// use lotsman::Work;
    /// assert!(Work::time(2.0).check("a design", "ask for less").is_ok());
    /// let e = Work::time(95.0).check("a design", "ask for less").unwrap_err();
    /// assert_eq!(
    ///     e.to_string(),
    ///     "a design would take about 95 s, beyond the work budget of 10 s; ask for less"
    /// );
    /// ```
    ///
    /// # Errors
    /// [`OverBudget`] when either estimate passes its budget (time first).
    pub fn check(self, job: &str, advice: &str) -> Result<Self, OverBudget> {
        let (limit, need, budget) = if self.seconds > TIME_BUDGET {
            (
                Limit::Time,
                format!("take about {}", duration(self.seconds)),
                duration(TIME_BUDGET),
            )
        } else if self.bytes > MEMORY_BUDGET {
            (
                Limit::Memory,
                format!("need about {} of memory", size(self.bytes)),
                size(MEMORY_BUDGET),
            )
        } else {
            return Ok(self);
        };
        Err(OverBudget {
            limit,
            message: format!("{job} would {need}, beyond the work budget of {budget}; {advice}"),
        })
    }
}

/// Which budget a job passes.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Limit {
    /// [`TIME_BUDGET`].
    Time,
    /// [`MEMORY_BUDGET`].
    Memory,
}

/// A job refused because its estimated work passes the budget: one line
/// naming the job, the limit it passes, its estimate, and how to bring it
/// within.
#[derive(Clone, Debug, PartialEq, Error)]
#[error("{message}")]
pub struct OverBudget {
    /// The limit passed.
    pub limit: Limit,
    /// The refusal, in words.
    pub message: String,
}

/// A duration in words: seconds below two minutes, then minutes, hours,
/// days.
fn duration(seconds: f64) -> String {
    let (value, unit) = if !seconds.is_finite() {
        return "forever".to_string();
    } else if seconds < 120.0 {
        (seconds, "s")
    } else if seconds < 7200.0 {
        (seconds / 60.0, "min")
    } else if seconds < 172_800.0 {
        (seconds / 3600.0, "h")
    } else {
        (seconds / 86_400.0, "days")
    };
    format!("{} {unit}", Rounded(value))
}

/// A size in words: MiB below a GiB, then GiB, TiB.
fn size(bytes: f64) -> String {
    const MIB: f64 = (1u64 << 20) as f64;
    let (value, unit) = if !bytes.is_finite() {
        return "unbounded memory".to_string();
    } else if bytes < 1024.0 * MIB {
        (bytes / MIB, "MiB")
    } else if bytes < 1024.0 * 1024.0 * MIB {
        (bytes / (1024.0 * MIB), "GiB")
    } else {
        (bytes / (1024.0 * 1024.0 * MIB), "TiB")
    };
    format!("{} {unit}", Rounded(value))
}

/// A positive number to two significant digits, without exponent below
/// `10^15` (an estimate has no more precision to show).
struct Rounded(f64);

impl fmt::Display for Rounded {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let x = self.0;
        if x >= 1e15 {
            return write!(f, "{x:.1e}");
        }
        if x >= 10.0 {
            let magnitude = 10f64.powi(x.log10().floor() as i32 - 1);
            return write!(f, "{}", (x / magnitude).round() * magnitude);
        }
        let rounded = (x * 10.0).round() / 10.0;
        if rounded.fract() == 0.0 {
            write!(f, "{rounded:.0}")
        } else {
            write!(f, "{rounded:.1}")
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn durations_and_sizes_read_as_words() {
        assert_eq!(duration(0.25), "0.3 s");
        assert_eq!(duration(11.0), "11 s");
        assert_eq!(duration(163.0), "2.7 min");
        assert_eq!(duration(3.0 * 3600.0), "3 h");
        assert_eq!(duration(10.0 * 86_400.0), "10 days");
        assert_eq!(size(3.6 * (1u64 << 30) as f64), "3.6 GiB");
        assert_eq!(size(123_456_789.0), "120 MiB");
    }

    #[test]
    fn the_refusal_names_the_limit_passed() {
        let time = Work::time(11.0).check("a job", "less").unwrap_err();
        assert_eq!(time.limit, Limit::Time);
        assert!(time.to_string().contains("beyond the work budget of 10 s"));
        let memory = Work::memory(2.0 * MEMORY_BUDGET)
            .check("a job", "less")
            .unwrap_err();
        assert_eq!(memory.limit, Limit::Memory);
        assert_eq!(
            memory.to_string(),
            "a job would need about 2 GiB of memory, beyond the work budget of 1 GiB; less"
        );
        assert!(
            Work::time(10.0)
                .and(Work::memory(1.0))
                .check("a job", "less")
                .is_ok()
        );
    }
}
