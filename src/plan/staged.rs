//! The staged attribute plan: one type for single, double, multiple and
//! item-by-item plans.

use std::fmt;

use super::limits::{MAX_ACCEPTANCE_NUMBER, MAX_OPEN_COUNTS, MAX_SAMPLE_SIZE, MAX_STAGES};
use super::sequential::SequentialLines;
use super::stage::Stage;
use crate::input::InputError;
use crate::model::{Model, ModelKind};

/// A validated staged plan.
///
/// A single plan `(n, c)` is one stage with `accept = c` and
/// `reject = c + 1`.
///
/// Valid means: 1 to [`MAX_STAGES`] stages; cumulative sizes strictly
/// increasing from at least 1; on every stage `accept < reject`; every stage
/// but the last leaves some count undecided (otherwise the later stages are
/// never reached); the last stage decides every count
/// (`reject = accept + 1`); no stage leaves more than [`MAX_OPEN_COUNTS`]
/// counts undecided; and, for the unit-count models, every acceptance
/// number is below its cumulative sample size (otherwise the stage accepts
/// every lot); whenever the model knows the lot size, under every model,
/// no stage takes more units than the lot holds ([`Model::check_sample`]);
/// and every plan stays within the designers' limits, samples of at most
/// [`MAX_SAMPLE_SIZE`] units and acceptance numbers of at most
/// [`MAX_ACCEPTANCE_NUMBER`] (beyond them a plan's measures cost minutes and
/// its sample sizes no longer fit a double's 53 bits).
///
/// # Example
/// ```
/// use lotsman::{Model, ModelKind, StagedPlan};
/// let m = Model::new(ModelKind::Binomial, None).unwrap();
/// let plan = StagedPlan::single(80, 2, &m).unwrap();
/// assert_eq!(plan.stages()[0].reject, 3);
/// assert!(StagedPlan::single(2, 2, &m).is_err());
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct StagedPlan {
    stages: Vec<Stage>,
    /// For an item-by-item plan, the lines its stages come from.
    lines: Option<SequentialLines>,
}

impl StagedPlan {
    /// The single plan: draw `n`, accept when at most `c` are nonconforming.
    ///
    /// # Errors
    /// As [`StagedPlan::new`].
    pub fn single(n: u64, c: u64, model: &Model) -> Result<Self, InputError> {
        Self::new(
            vec![Stage {
                n,
                accept: Some(c),
                reject: c.saturating_add(1),
            }],
            model,
        )
    }

    /// The single plan `(n, c)` of a designer that has already checked it
    /// against the model (`n >= 1`, `c < n` for the unit-count models, `n`
    /// within the lot).
    pub(crate) fn single_checked_by_designer(n: u64, c: u64) -> Self {
        debug_assert!(n >= 1);
        StagedPlan {
            stages: vec![Stage {
                n,
                accept: Some(c),
                reject: c + 1,
            }],
            lines: None,
        }
    }

    /// The double plan `(n1, c1, r1; n1 + n2, c2)` of a designer that has
    /// already checked it against the model (`c1 + 2 <= r1 <= c2 + 1`, or
    /// `1 <= r1 <= c2 + 1` for a first stage that cannot accept,
    /// `c1 < n1` and `c2 < n1 + n2` for the unit-count models, the whole
    /// sample within the lot).
    pub(crate) fn double_checked_by_designer(
        n1: u64,
        c1: Option<u64>,
        r1: u64,
        n2: u64,
        c2: u64,
    ) -> Self {
        debug_assert!(n1 >= 1 && n2 >= 1 && c1.map_or(1, |c| c + 2) <= r1 && r1 <= c2 + 1);
        StagedPlan {
            stages: vec![
                Stage {
                    n: n1,
                    accept: c1,
                    reject: r1,
                },
                Stage {
                    n: n1 + n2,
                    accept: Some(c2),
                    reject: c2 + 1,
                },
            ],
            lines: None,
        }
    }

    /// A plan from its stages, validated for `model`.
    ///
    /// # Errors
    /// [`InputError`] naming the stage and the rule it breaks.
    pub fn new(stages: Vec<Stage>, model: &Model) -> Result<Self, InputError> {
        if stages.is_empty() || stages.len() > MAX_STAGES {
            return Err(InputError::out_of_range(
                "number of stages",
                stages.len(),
                "1 to 10",
            ));
        }
        check_stages(&stages, model)?;
        Ok(StagedPlan {
            stages,
            lines: None,
        })
    }

    /// The item-by-item plan of `lines`: one stage per item up to the
    /// truncation, each with the acceptance and rejection numbers of the
    /// lines, the last closed by the final acceptance number.
    ///
    /// # Errors
    /// [`InputError`] for lines that are not valid
    /// ([`SequentialLines::check`]) or whose numbers leave no count open at
    /// an item before the truncation (the later items would never be
    /// reached).
    pub fn sequential(lines: SequentialLines, model: &Model) -> Result<Self, InputError> {
        lines.check(model)?;
        let stages = lines.stages();
        check_stages(&stages, model)?;
        Ok(StagedPlan {
            stages,
            lines: Some(lines),
        })
    }

    /// The lines of an item-by-item plan.
    pub fn sequential_lines(&self) -> Option<&SequentialLines> {
        self.lines.as_ref()
    }

    /// The stages, in order.
    pub fn stages(&self) -> &[Stage] {
        &self.stages
    }

    /// The largest number of units the plan can inspect.
    pub fn max_sample(&self) -> u64 {
        self.stages[self.stages.len() - 1].n
    }

    /// `Some((n, c))` when the plan is a single plan.
    pub fn as_single(&self) -> Option<(u64, u64)> {
        match self.stages.as_slice() {
            [s] => s.accept.map(|c| (s.n, c)),
            _ => None,
        }
    }
}

/// The rules of [`StagedPlan::new`] on a list of stages of any length.
fn check_stages(stages: &[Stage], model: &Model) -> Result<(), InputError> {
    {
        let last = stages.len() - 1;
        let mut previous_n = 0;
        for (i, s) in stages.iter().enumerate() {
            let name = |what: &str| format!("stage {} {what}", i + 1);
            if s.n <= previous_n {
                return Err(if i == 0 {
                    InputError::out_of_range(&name("sample size"), s.n, "at least 1")
                } else {
                    InputError::Inconsistent(format!(
                        "stage {} cumulative sample size {} must exceed stage {}'s {}",
                        i + 1,
                        s.n,
                        i,
                        previous_n
                    ))
                });
            }
            previous_n = s.n;
            if s.n > MAX_SAMPLE_SIZE {
                return Err(InputError::out_of_range(
                    &name("cumulative sample size"),
                    s.n,
                    &format!("1 to {MAX_SAMPLE_SIZE} units"),
                ));
            }
            if s.accept.is_some_and(|a| a > MAX_ACCEPTANCE_NUMBER)
                || s.reject > MAX_ACCEPTANCE_NUMBER + 1
            {
                return Err(InputError::out_of_range(
                    &name("acceptance or rejection number"),
                    s,
                    &format!(
                        "at most {MAX_ACCEPTANCE_NUMBER} for the acceptance number and {} for the rejection number",
                        MAX_ACCEPTANCE_NUMBER + 1
                    ),
                ));
            }
            model.check_sample(name("cumulative sample size"), s.n)?;
            if let Some(a) = s.accept {
                if a >= s.reject {
                    return Err(InputError::Inconsistent(format!(
                        "{}: acceptance number {a} must be below the rejection number {}",
                        name("numbers"),
                        s.reject
                    )));
                }
                if model.kind() != ModelKind::Poisson && a >= s.n {
                    return Err(InputError::Inconsistent(format!(
                        "{}: acceptance number {a} must be below the cumulative sample size {}, or every lot is accepted",
                        name("numbers"),
                        s.n
                    )));
                }
            }
            if s.reject == 0 {
                return Err(InputError::out_of_range(
                    &name("rejection number"),
                    0,
                    "at least 1",
                ));
            }
            let lowest_open = s.accept.map_or(0, |a| a + 1);
            if i < last && lowest_open + 1 > s.reject {
                return Err(InputError::Inconsistent(format!(
                    "stage {} decides every count, so stage {} is never reached",
                    i + 1,
                    i + 2
                )));
            }
            if s.reject - lowest_open > MAX_OPEN_COUNTS {
                return Err(InputError::out_of_range(
                    &name("counts left open (rejection number - acceptance number - 1)"),
                    s.reject - lowest_open,
                    &format!("at most {MAX_OPEN_COUNTS}"),
                ));
            }
            if i == last && s.accept.map(|a| a + 1) != Some(s.reject) {
                return Err(InputError::Inconsistent(format!(
                    "the last stage must decide every count: its rejection number must be its acceptance number + 1 (got accept {}, reject {})",
                    s.accept.map_or("none".to_string(), |a| a.to_string()),
                    s.reject
                )));
            }
        }
    }
    Ok(())
}

impl fmt::Display for StagedPlan {
    /// `n = 80, c = 2` for a single plan, the lines for an item-by-item
    /// plan, the stages in `N:AC:RE` notation otherwise.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if let Some(l) = &self.lines {
            return write!(
                f,
                "item by item: accept d <= {:.4} n - {:.4}, reject d >= {:.4} n + {:.4}, at item {} accept d <= {}",
                l.slope, l.h_accept, l.slope, l.h_reject, l.truncation, l.final_acceptance
            );
        }
        if let Some((n, c)) = self.as_single() {
            return write!(f, "n = {n}, c = {c}");
        }
        let parts: Vec<String> = self.stages.iter().map(Stage::to_string).collect();
        f.write_str(&parts.join(" "))
    }
}
