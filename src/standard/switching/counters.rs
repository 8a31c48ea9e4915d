//! The counters behind each rule, in plain words, for a status report.

use serde::Serialize;

use super::rules::SwitchingRules;
use super::state::{
    ACCEPTED_TO_NORMAL, NOT_ACCEPTED_TO_STOP, Phase, REJECTION_SPAN, SwitchingState,
};

/// One counter of the switching rules: its value, the value at which its
/// rule acts, and what it means in words.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct Counter {
    /// A short key: `rejections_in_window`, `accepted_run`,
    /// `run_total`, `consecutive_accepted`, `not_accepted_on_tightened`.
    pub key: &'static str,
    /// The counter's value.
    pub value: u64,
    /// The value at which its rule acts, where one applies.
    pub limit: Option<u64>,
    /// What the counter means and what happens next, in plain words.
    pub words: String,
}

fn lots(n: u64) -> String {
    if n == 1 {
        "1 lot".into()
    } else {
        format!("{n} lots")
    }
}

impl SwitchingState {
    /// The counters behind the rules that can act on the next lot, each
    /// with a sentence for a quality engineer (issue 17's `status`).
    ///
    /// ```
    /// use lotsman::{LimitWindow, LotResult, SwitchingRules, SwitchingState};
    /// let rules = SwitchingRules::new(true, Some(LimitWindow::ten(7)));
    /// let s = rules
    ///     .step(&SwitchingState::new(), &LotResult::rejected(5, 125).unwrap())
    ///     .unwrap();
    /// let c = s.counters(&rules);
    /// assert_eq!(c[0].key, "rejections_in_window");
    /// assert_eq!(c[0].value, 1);
    /// ```
    pub fn counters(&self, rules: &SwitchingRules) -> Vec<Counter> {
        match &self.phase {
            Phase::Normal(record) => {
                let in_window = u64::from(record.since_rejection.is_some());
                let rejection_words = match record.since_rejection {
                    Some(k) => format!(
                        "a lot was not accepted {} ago on normal inspection; one more not accepted within the next {} switches to tightened inspection (MIL-STD-105E 4.7.1)",
                        lots(u64::from(k) + 1),
                        lots(u64::from(REJECTION_SPAN - 2 - k) + 1),
                    ),
                    None if record.lots == 0 => format!(
                        "no lot judged yet on normal inspection; two not accepted within {REJECTION_SPAN} consecutive lots switch to tightened inspection (MIL-STD-105E 4.7.1)"
                    ),
                    None => format!(
                        "{}; two not accepted within {REJECTION_SPAN} consecutive lots switch to tightened inspection (MIL-STD-105E 4.7.1)",
                        match record.lots.min(REJECTION_SPAN - 1) {
                            1 => "the last lot on normal inspection was accepted".to_string(),
                            n => format!("the last {n} lots on normal inspection were all accepted"),
                        }
                    ),
                };
                let mut out = vec![Counter {
                    key: "rejections_in_window",
                    value: in_window,
                    limit: Some(2),
                    words: rejection_words,
                }];
                let run = record.run.len() as u64;
                let total: u64 = record.run.iter().map(|r| r.0).sum();
                let units: u64 = record.run.iter().map(|r| r.1).sum();
                match (rules.reduced(), rules.window()) {
                    (false, _) => {}
                    (true, None) => out.push(Counter {
                        key: "accepted_run",
                        value: run,
                        limit: None,
                        words: "reduced inspection cannot be reached: Table VIII gives no limit number for this plan over the lots taken (MIL-STD-105E 4.7.3)".into(),
                    }),
                    (true, Some(w)) => {
                        let need = u64::from(w.lots());
                        let confirm = if rules.confirmed() {
                            String::new()
                        } else {
                            "; steady production and the responsible authority's approval are not confirmed, so reduced inspection will not start until they are".into()
                        };
                        out.push(Counter {
                            key: "accepted_run",
                            value: run,
                            limit: Some(need),
                            words: format!(
                                "{} accepted in a row on normal inspection (kept up to {need}); reduced inspection needs the last {need} all accepted on normal inspection (MIL-STD-105E 4.7.3 a){confirm}",
                                lots(run)
                            ),
                        });
                        out.push(Counter {
                            key: "run_total",
                            value: total,
                            limit: Some(u64::from(w.limit())),
                            words: format!(
                                "{total} found in the {units} units of those {}; their total over the last {need} lots must be at most the limit number {} (MIL-STD-105E 4.7.3 b, Table VIII)",
                                lots(run),
                                w.limit()
                            ),
                        });
                    }
                }
                out
            }
            &Phase::Tightened {
                accepted_in_row,
                not_accepted,
            } => vec![
                Counter {
                    key: "consecutive_accepted",
                    value: u64::from(accepted_in_row),
                    limit: Some(u64::from(ACCEPTED_TO_NORMAL)),
                    words: format!(
                        "{} accepted in a row on tightened inspection; {ACCEPTED_TO_NORMAL} in a row restore normal inspection (MIL-STD-105E 4.7.2)",
                        lots(u64::from(accepted_in_row))
                    ),
                },
                Counter {
                    key: "not_accepted_on_tightened",
                    value: u64::from(not_accepted),
                    limit: Some(u64::from(NOT_ACCEPTED_TO_STOP)),
                    words: format!(
                        "{} not accepted on this spell of tightened inspection; at {NOT_ACCEPTED_TO_STOP} inspection under the standard is discontinued (MIL-STD-105E 4.8)",
                        lots(u64::from(not_accepted))
                    ),
                },
            ],
            Phase::Reduced => vec![Counter {
                key: "reduced",
                value: 0,
                limit: None,
                words: "on reduced inspection: a lot not accepted, or accepted with its count between the acceptance and rejection numbers, returns normal inspection from the next lot, as do irregular production or the authority's judgement (MIL-STD-105E 4.7.4)".into(),
            }],
            Phase::Discontinued => vec![Counter {
                key: "discontinued",
                value: u64::from(NOT_ACCEPTED_TO_STOP),
                limit: Some(u64::from(NOT_ACCEPTED_TO_STOP)),
                words: "inspection under the standard is discontinued after five lots not accepted on one spell of tightened inspection; it resumes on tightened inspection after the supplier's corrective action (MIL-STD-105E 4.8)".into(),
            }],
        }
    }
}
