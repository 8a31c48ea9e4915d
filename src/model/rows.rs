//! A store of count windows from zero for one design's search, which asks
//! for the same distributions over and over.
//!
//! The double-plan sweep ([`double_sweep`](crate::design::double_sweep))
//! tries thousands of number sets `(c1, r1, c2)` at the same two qualities,
//! and every set needs the first and second stages' counts in samples of
//! the same sizes: `P(X = d)`, `P(X <= d)` and `P(X > d)` for `d = 0..=c2`
//! of the count `X` in `m` units. Computed afresh for every candidate
//! (one saddle-point log-probability and two tail sums each), they took
//! about 60% of a design, and the buffers of each window another 19%. Here
//! each distribution's run `0..=hi` is computed once per design and thread
//! and kept in that thread's part of the store, indexed by the sample size
//! (the sweep steps through neighbouring sizes), which is dropped with the
//! design. The threads do not share runs: a run read by two cores at once
//! sends its reference count back and forth between their caches, which
//! cost more (half of a design, measured) than computing each run twice.
//!
//! # Accuracy
//!
//! A run from zero is the window of [`window`](super::window) over
//! `0..=hi`: `P(X <= d)` is a sum of positive terms from zero, `P(X > d)`
//! the tail above the run (summed directly when it is the small one) plus
//! the terms above `d`, so both keep their relative accuracy as in a
//! narrower window; only the last bits differ from one.
//!
//! The run's top `hi` is the asked top rounded up to `8 j + 7`, so that the
//! slowly growing final acceptance number of a search reuses its runs, and
//! a run is served only to a request with the same rounded top: a value
//! never depends on which requests came before it, or on which thread.

use std::sync::{Arc, Mutex};

use super::{Model, Window};

/// Sample sizes up to this one are stored (an index of 8 bytes a size);
/// larger ones, beyond any search the work budget allows, are computed
/// each time.
const MAX_STORED: u64 = 1 << 20;

/// The runs of one quality and top, indexed by the sample size.
struct Column {
    p: u64,
    hi: u64,
    runs: Vec<Option<Arc<Window>>>,
}

/// One thread's part, alone on its cache lines: two parts on one line
/// would send the line between the cores at every lock (measured: half of
/// a grid's time).
#[repr(align(128))]
struct Part(Mutex<Vec<Column>>);

/// The runs of one design's search under one model: one part for each
/// thread of the pool, and one for a caller outside it.
pub(crate) struct Rows {
    model: Model,
    parts: Vec<Part>,
}

/// The top of the run served for a request reaching count `top`.
fn rounded(top: u64) -> u64 {
    top | 7
}

impl Rows {
    /// An empty store for `model`.
    pub(crate) fn new(model: &Model) -> Self {
        Rows {
            model: *model,
            parts: (0..=rayon::current_num_threads())
                .map(|_| Part(Mutex::new(Vec::new())))
                .collect(),
        }
    }

    /// The model.
    pub(crate) fn model(&self) -> &Model {
        &self.model
    }

    /// `P(X = d)`, `P(X <= d)` and `P(X > d)` for `d = 0..=top` (at least)
    /// of the count `X` in `m` units at quality `p` (as [`Model::window`]
    /// with nothing drawn before).
    pub(crate) fn get(&self, m: u64, p: f64, top: u64) -> Arc<Window> {
        let (bits, hi) = (p.to_bits(), rounded(top));
        let fresh = || Arc::new(self.model.window(m, 0, hi, p, 0, 0));
        if m > MAX_STORED {
            return fresh();
        }
        // This thread's part: its lock is never contended (a caller
        // outside the pool shares the last part, still correct).
        let last = self.parts.len() - 1;
        let part = &self.parts[rayon::current_thread_index().map_or(last, |i| i.min(last))];
        // A panic elsewhere cannot leave a half-written run: take the part
        // as it is.
        let mut part = part.0.lock().unwrap_or_else(|e| e.into_inner());
        let at = match part.iter().position(|c| c.p == bits && c.hi == hi) {
            Some(at) => at,
            None => {
                part.push(Column {
                    p: bits,
                    hi,
                    runs: Vec::new(),
                });
                part.len() - 1
            }
        };
        let runs = &mut part[at].runs;
        let i = m as usize;
        if runs.len() <= i {
            runs.resize(i + 1, None);
        }
        Arc::clone(runs[i].get_or_insert_with(fresh))
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::ModelKind;

    #[test]
    fn a_stored_run_equals_a_window_from_zero_and_the_tails() {
        let model = Model::new(ModelKind::Binomial, None).unwrap();
        let rows = Rows::new(&model);
        let a = rows.get(300, 0.02, 5);
        let b = rows.get(300, 0.02, 6);
        assert!(
            Arc::ptr_eq(&a, &b),
            "the same rounded top is served from the store"
        );
        assert_eq!(*a, model.window(300, 0, 7, 0.02, 0, 0));
        // Against the tails summed on their own (the computation the
        // designers used before the store), to the last bits.
        for d in 0..=7 {
            let t = model.tails(300, d, 0.02, 0, 0);
            assert!((a.cdf(d) - t.cdf).abs() <= 1e-14 * t.cdf, "cdf {d}");
            assert!((a.sf(d) - t.sf).abs() <= 1e-14 * t.sf, "sf {d}");
        }
    }

    #[test]
    fn hypergeometric_runs_of_every_size_agree_with_their_tails() {
        let model = Model::new(ModelKind::Hypergeometric, Some(500)).unwrap();
        let rows = Rows::new(&model);
        for m in 1..200 {
            let w = rows.get(m, 0.03, 3);
            let t = model.tails(m, 3, 0.03, 0, 0);
            assert!((w.cdf(3) - t.cdf).abs() <= 1e-14 && (w.sf(3) - t.sf).abs() <= 1e-14);
        }
    }
}
