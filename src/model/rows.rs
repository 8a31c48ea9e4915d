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
//! and kept in that thread's part of the store, which is dropped with the
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

use std::collections::HashMap;
use std::hash::{BuildHasherDefault, Hasher};
use std::sync::{Arc, Mutex};

use super::{Model, Window};

/// Runs a thread's part holds before it is emptied (some hundred bytes
/// each): more than the searches the work budget allows ask for (a double
/// design at 0.1% and 0.3%, single plan n = 3,922, asks for 20,000 a
/// thread), so that no search grows without bound.
const PART_CAP: usize = 1 << 18;

/// What a run depends on besides the model.
#[derive(Clone, Copy, PartialEq, Eq, Hash)]
struct Key {
    p: u64,
    m: u64,
    drawn: u64,
    found: u64,
    hi: u64,
}

/// A multiplicative hash (Fibonacci hashing) of the key's words: the keys
/// are the store's own, so a hash built against adversaries is not needed.
#[derive(Default)]
struct WordHash(u64);

impl Hasher for WordHash {
    fn finish(&self) -> u64 {
        self.0
    }

    fn write(&mut self, bytes: &[u8]) {
        for &b in bytes {
            self.write_u64(u64::from(b));
        }
    }

    fn write_u64(&mut self, x: u64) {
        self.0 = (self.0.rotate_left(5) ^ x).wrapping_mul(0x9E37_79B9_7F4A_7C15);
    }
}

type Part = HashMap<Key, Arc<Window>, BuildHasherDefault<WordHash>>;

/// The runs of one design's search under one model: one part for each
/// thread of the pool, and one for a caller outside it.
pub(crate) struct Rows {
    model: Model,
    parts: Vec<Mutex<Part>>,
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
                .map(|_| Mutex::new(Part::default()))
                .collect(),
        }
    }

    /// The model.
    pub(crate) fn model(&self) -> &Model {
        &self.model
    }

    /// `P(X = d)`, `P(X <= d)` and `P(X > d)` for `d = 0..=top` (at least)
    /// of the count `X` in the next `m` units at quality `p`, after `drawn`
    /// units holding `found` (as [`Model::window`]).
    pub(crate) fn get(&self, m: u64, p: f64, drawn: u64, found: u64, top: u64) -> Arc<Window> {
        let key = Key {
            p: p.to_bits(),
            m,
            drawn,
            found,
            hi: rounded(top),
        };
        // This thread's part: its lock is never contended (a caller
        // outside the pool shares the last part, still correct).
        let last = self.parts.len() - 1;
        let part = &self.parts[rayon::current_thread_index().map_or(last, |i| i.min(last))];
        // A panic elsewhere cannot leave a half-written run: take the part
        // as it is.
        let mut part = part.lock().unwrap_or_else(|e| e.into_inner());
        if let Some(w) = part.get(&key) {
            return Arc::clone(w);
        }
        if part.len() >= PART_CAP {
            part.clear();
        }
        let w = Arc::new(self.model.window(m, 0, key.hi, p, drawn, found));
        part.insert(key, Arc::clone(&w));
        w
    }
}

/// The same run computed without a store, for a quality that is asked
/// once (the quality of the largest ASN, the points of an AOQ curve).
pub(crate) fn once(model: &Model, m: u64, p: f64, drawn: u64, found: u64, top: u64) -> Arc<Window> {
    Arc::new(model.window(m, 0, rounded(top), p, drawn, found))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::ModelKind;

    #[test]
    fn a_stored_run_equals_a_fresh_one_and_the_tails() {
        let model = Model::new(ModelKind::Binomial, None).unwrap();
        let rows = Rows::new(&model);
        let a = rows.get(300, 0.02, 0, 0, 5);
        let b = rows.get(300, 0.02, 0, 0, 6);
        assert!(
            Arc::ptr_eq(&a, &b),
            "the same rounded top is served from the store"
        );
        assert_eq!(*a, *once(&model, 300, 0.02, 0, 0, 7));
        // Against the tails summed on their own (the computation the
        // designers used before the store), to the last bits.
        for d in 0..=7 {
            let t = model.tails(300, d, 0.02, 0, 0);
            assert!((a.cdf(d) - t.cdf).abs() <= 1e-14 * t.cdf, "cdf {d}");
            assert!((a.sf(d) - t.sf).abs() <= 1e-14 * t.sf, "sf {d}");
        }
    }

    #[test]
    fn runs_after_earlier_draws_agree_with_their_tails() {
        let model = Model::new(ModelKind::Hypergeometric, Some(500)).unwrap();
        let rows = Rows::new(&model);
        for m in 1..200 {
            let w = rows.get(m, 0.03, 20, 1, 3);
            let t = model.tails(m, 3, 0.03, 20, 1);
            assert!((w.cdf(3) - t.cdf).abs() <= 1e-14 && (w.sf(3) - t.sf).abs() <= 1e-14);
        }
    }
}
