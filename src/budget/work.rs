//! The budget's core: a job's estimated [`Work`], the two budgets it must
//! fit ([`TIME_BUDGET`], [`MEMORY_BUDGET`]), and the one-line refusal
//! ([`OverBudget`]) when it does not. The estimates themselves sit beside
//! the work they estimate: evaluations in `plan`, designs in `design`, the
//! commands on plan sources in `source`.

use std::fmt;

use thiserror::Error;

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
pub(crate) fn duration(seconds: f64) -> String {
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
