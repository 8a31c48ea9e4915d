//! The numbers of a double plan and its first stage at one quality, from
//! which the sweep ([`double_sweep`](super::double_sweep)) scores every
//! second sample.
//!
//! With the first count `d1` of `n1` units and the second `d2` of `n2`
//! more, the plan accepts with probability
//!
//! ```text
//! Pa = P(d1 <= c1) + sum_{d = lo}^{r1 - 1} P(d1 = d) P(d2 <= c2 - d)
//! ```
//!
//! and rejects with `P(d1 >= r1) + sum_d P(d1 = d) P(d2 > c2 - d)`, where
//! `lo = c1 + 1`, or `lo = 0` for a first stage that cannot accept (no
//! `c1`). Each term is a sum of positive terms, so a small producer's
//! risk keeps its relative accuracy (the counts' windows,
//! [`Window`](crate::model::Window)).
//!
//! The counts come from the design's store of windows
//! ([`rows`](crate::model::rows)) at the qualities the sweep asks again and
//! again; a quality asked once (an AOQ curve's, the largest ASN's) is
//! computed on its own.

use std::ops::RangeInclusive;
use std::sync::Arc;

use crate::model::rows::Rows;
use crate::model::{Model, Window};

/// Where the counts' windows come from.
#[derive(Clone, Copy)]
pub(super) enum Counts<'a> {
    /// The design's store, for a quality the search asks again.
    Stored(&'a Rows),
    /// Computed on their own, for a quality asked once: only the run the
    /// caller reads, as the designers computed every window before the
    /// store (the points of an AOQ curve cost no more than they did).
    Once(&'a Model),
}

impl Counts<'_> {
    fn model(&self) -> &Model {
        match self {
            Counts::Stored(rows) => rows.model(),
            Counts::Once(model) => model,
        }
    }

    /// The counts in `m` units at quality `p` (a first sample, or a
    /// second one under a model that forgets the past), from which the
    /// caller reads the terms and cuts of `run` and nothing above `top`
    /// (the final acceptance number).
    fn get(&self, m: u64, p: f64, run: RangeInclusive<u64>, top: u64) -> Arc<Window> {
        match self {
            Counts::Stored(rows) => rows.get(m, p, top),
            Counts::Once(model) => Arc::new(model.window(m, *run.start(), *run.end(), p, 0, 0)),
        }
    }
}

/// The numbers of a double plan: on the first sample accept at
/// `d1 <= c1` (never when `c1` is `None`), reject at `d1 >= r1`; after
/// the second sample accept when the cumulative count is at most `c2`.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(super) struct Numbers {
    pub(super) c1: Option<u64>,
    pub(super) r1: u64,
    pub(super) c2: u64,
}

impl Numbers {
    /// The lowest first count that goes on to the second sample.
    pub(super) fn lowest_open(&self) -> u64 {
        self.c1.map_or(0, |c| c + 1)
    }
}

/// The first stage of a double plan at one quality.
pub(super) struct FirstStage {
    k: Numbers,
    /// The counts of the first sample, `0..=c2` at least.
    counts: Arc<Window>,
    /// `P(d1 <= c1)` (0 without `c1`).
    pub(super) accept: f64,
    /// `P(d1 >= r1)`.
    pub(super) reject: f64,
    /// `P(c1 < d1 < r1)`: the chance of a second sample.
    second: f64,
}

impl FirstStage {
    /// The first stage of `n1` units with the numbers `k` at quality `p`.
    pub(super) fn new(source: Counts<'_>, n1: u64, k: Numbers, p: f64) -> Self {
        // The first stage reads P(d1 = d) for the open counts, P(d1 <= c1)
        // below them and P(d1 >= r1) above.
        let counts = source.get(n1, p, k.lowest_open()..=k.r1 - 1, k.c2);
        let second = (k.lowest_open()..k.r1).map(|d| counts.pmf(d)).sum();
        FirstStage {
            k,
            accept: k.c1.map_or(0.0, |c| counts.cdf(c)),
            reject: counts.sf(k.r1 - 1),
            second,
            counts,
        }
    }

    /// `P(c1 < d1 < r1)`: the chance of a second sample.
    pub(super) fn second_sample(&self) -> f64 {
        self.second
    }

    /// Cumulative acceptance and rejection probabilities of the plan at
    /// this first stage's quality `p` with `n2` more units: the first
    /// stage's decisions plus, for each open count `d`, `P(d1 = d)` times
    /// the second sample's tails at `c2 - d`. The hypergeometric second
    /// sample draws from what the first left of the lot.
    /// `source` is where the first stage's counts came from.
    pub(super) fn outcome(&self, source: Counts<'_>, n1: u64, n2: u64, p: f64) -> (f64, f64) {
        let c2 = self.k.c2;
        let lowest = self.k.lowest_open();
        let (mut acc, mut rej) = (self.accept, self.reject);
        let open = lowest..self.k.r1;
        if source.model().forgets_the_past() {
            // The second stage: both tails at the cuts c2 - d.
            let w = source.get(n2, p, c2 + 2 - self.k.r1..=c2 - lowest, c2);
            for d in open {
                let f = self.counts.pmf(d);
                acc += f * w.cdf(c2 - d);
                rej += f * w.sf(c2 - d);
            }
        } else {
            // The hypergeometric second sample depends on the first's size
            // and count too: its windows are seldom asked twice, and the
            // bare cut at c2 - d costs less than a stored run from zero.
            let model = source.model();
            for d in open {
                let f = self.counts.pmf(d);
                let w = model.window(n2, c2 - d + 1, c2 - d, p, n1, d);
                acc += f * w.cdf(c2 - d);
                rej += f * w.sf(c2 - d);
            }
        }
        (acc, rej)
    }
}
