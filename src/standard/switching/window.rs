//! The limit-number rule as a finite automaton: the smallest exact state of
//! a run of accepted lots on normal inspection.
//!
//! Reduced inspection starts after a lot when the last `m` lots were all
//! accepted on normal inspection and their counts add up to at most the
//! limit number `L` (MIL-STD-105E 4.7.3). A lot not accepted empties the
//! window, so only the current run of accepted lots matters (a renewal).
//! Within a run, what the future needs of the past is, for each `j < m`, the
//! total `S_j` of the last `j` counts: the window `k` lots from now holds the
//! last `m - k` old lots plus `k` new ones. Two clamps keep this exact:
//!
//! ```text
//! S_j >= L + 1                  every future window holding them fails:   S_j := L + 1
//! S_j <= L - (m - j) c          every future window holding them passes:  S_j := that floor
//! ```
//!
//! where `c` is the largest count an accepted lot can have (the normal
//! plan's acceptance number). The clamped vectors `(S_1, .., S_min(r, m-1))`
//! for a run of `r` lots are the states; each lot appends its count. Moore's
//! partition refinement then merges states no future input tells apart, so
//! what remains is the minimal automaton of the rule (Myhill-Nerode): no
//! exact state of the rule is smaller. When `L >= m c` it shrinks to the
//! run's length alone (reduced after `m` accepted lots).
//!
//! The state count grows fast with `c` and `L`. Over the normal single
//! plans of Table II-A with Table VIII at ten lots (measured with this
//! code, minimal states after merging): `c = 0` has no limit number at ten
//! lots (with more lots, the run's length alone); `c = 1`, `L = 1, 2`: 55
//! and 166; `c = 2`, `L = 3, 4`: 661 and 1,618; `c = 3`, `L = 7, 8`: 18,449
//! and 31,770; from `c = 5`, `L = 13` on, more than a million clamped
//! states. The count is bounded before anything is built ([`state_bound`]),
//! and windows beyond [`WINDOW_STATE_BUDGET`] are refused.

use std::collections::HashMap;

use super::error::SwitchingError;
use super::rules::LimitWindow;

/// The most states (counted before merging) a window automaton may have.
pub const WINDOW_STATE_BUDGET: u64 = 250_000;

/// A transition that completes the rule: reduced inspection starts.
pub(crate) const FIRE: u32 = u32::MAX;

/// The limit-number rule as a minimal deterministic automaton over the
/// counts of accepted lots.
#[derive(Clone, Debug)]
pub struct WindowAutomaton {
    window: LimitWindow,
    largest: u64,
    /// `next[s * (largest + 1) + x]`: the state after an accepted lot with
    /// count `x` in state `s`, or [`FIRE`].
    next: Vec<u32>,
    start: u32,
    built: usize,
}

/// An upper bound on the states of the window automaton before merging:
/// the clamped vectors without the floor clamp, counted by their shortest
/// distinguishing prefix.
pub fn state_bound(window: LimitWindow, largest: u64) -> u64 {
    let m = window.lots() as usize;
    let cap = u64::from(window.limit()) + 1;
    let c = largest;
    // ways[s]: distinct prefixes of the current length whose total s <= L.
    let width = usize::try_from(cap).unwrap_or(usize::MAX);
    let mut ways = vec![0u64; width];
    ways[0] = 1;
    let mut total: u64 = 1; // the empty run
    let mut capped: u64 = 0; // prefixes that already passed L
    for _ in 1..m {
        let mut next = vec![0u64; width];
        for (s, &w) in ways.iter().enumerate() {
            if w == 0 {
                continue;
            }
            for x in 0..=c {
                let t = s as u64 + x;
                if t < cap {
                    next[t as usize] = next[t as usize].saturating_add(w);
                } else {
                    capped = capped.saturating_add(w);
                }
            }
        }
        ways = next;
        let live = ways.iter().fold(0u64, |a, &w| a.saturating_add(w));
        total = total.saturating_add(live).saturating_add(capped);
    }
    total
}

impl WindowAutomaton {
    /// The minimal automaton of `window` for accepted lots whose counts are
    /// at most `largest`.
    ///
    /// ```
    /// use lotsman::{LimitWindow, WindowAutomaton};
    /// // Ten lots, acceptance number 1, limit number 2 (e.g. Table II-A
    /// // letter G at AQL 0.65 with Table VIII at 320 units).
    /// let w = WindowAutomaton::new(LimitWindow::ten(2), 1).unwrap();
    /// assert_eq!(w.states(), 166);
    /// // L >= 10 c: the run's length alone.
    /// assert_eq!(WindowAutomaton::new(LimitWindow::ten(20), 2).unwrap().states(), 10);
    /// ```
    ///
    /// # Errors
    /// [`SwitchingError::WindowTooLarge`] when [`state_bound`] passes
    /// [`WINDOW_STATE_BUDGET`].
    pub fn new(window: LimitWindow, largest: u64) -> Result<Self, SwitchingError> {
        let bound = state_bound(window, largest);
        if bound > WINDOW_STATE_BUDGET {
            return Err(SwitchingError::WindowTooLarge {
                states: bound,
                lots: window.lots(),
                largest_count: largest,
                limit: window.limit(),
                budget: WINDOW_STATE_BUDGET,
            });
        }
        let (next, built) = Self::clamped(window, largest);
        let (next, start) = Self::minimise(&next, largest);
        Ok(WindowAutomaton {
            window,
            largest,
            next,
            start,
            built,
        })
    }

    /// The automaton on clamped suffix totals, state 0 the empty run.
    fn clamped(window: LimitWindow, largest: u64) -> (Vec<u32>, usize) {
        let m = window.lots() as usize;
        let limit = u64::from(window.limit());
        let cap = limit + 1;
        let clamp = |j: usize, s: u64| -> u64 {
            // Totals of the last j lots, j counted from 1.
            let floor = limit.saturating_sub((m - j) as u64 * largest);
            s.clamp(floor.min(cap), cap)
        };
        let mut index: HashMap<Vec<u64>, u32> = HashMap::new();
        let mut order: Vec<Vec<u64>> = vec![Vec::new()];
        index.insert(Vec::new(), 0);
        let arity = largest as usize + 1;
        let mut next = Vec::new();
        let mut k = 0;
        while k < order.len() {
            let sums = order[k].clone();
            k += 1;
            for x in 0..=largest {
                if sums.len() == m - 1 && sums[m - 2].saturating_add(x) <= limit {
                    next.push(FIRE);
                    continue;
                }
                let keep = sums.len().min(m - 2);
                let mut new = Vec::with_capacity(keep + 1);
                new.push(clamp(1, x));
                for (j, &s) in sums[..keep].iter().enumerate() {
                    new.push(clamp(j + 2, s.saturating_add(x)));
                }
                let id = match index.get(&new) {
                    Some(&id) => id,
                    None => {
                        let id = order.len() as u32;
                        index.insert(new.clone(), id);
                        order.push(new);
                        id
                    }
                };
                next.push(id);
            }
        }
        debug_assert_eq!(next.len(), order.len() * arity);
        let built = order.len();
        (next, built)
    }

    /// Moore's partition refinement: states are merged until no input
    /// sequence tells two classes apart. Returns the merged transitions and
    /// the start state's class.
    fn minimise(next: &[u32], largest: u64) -> (Vec<u32>, u32) {
        let arity = largest as usize + 1;
        let n = next.len() / arity;
        let mut class = vec![0u32; n];
        let mut classes = 1;
        loop {
            let mut ids: HashMap<Vec<u32>, u32> = HashMap::new();
            let mut refined = Vec::with_capacity(n);
            for s in 0..n {
                let mut signature = Vec::with_capacity(arity + 1);
                signature.push(class[s]);
                for &t in &next[s * arity..(s + 1) * arity] {
                    signature.push(if t == FIRE { FIRE } else { class[t as usize] });
                }
                let fresh = ids.len() as u32;
                refined.push(*ids.entry(signature).or_insert(fresh));
            }
            let count = ids.len();
            class = refined;
            if count == classes {
                break;
            }
            classes = count;
        }
        // Number the classes in the order their first state was built, so
        // that the start (state 0) is class 0.
        let mut renumber = vec![u32::MAX; classes];
        let mut first = Vec::with_capacity(classes);
        for (s, &k) in class.iter().enumerate() {
            if renumber[k as usize] == u32::MAX {
                renumber[k as usize] = first.len() as u32;
                first.push(s);
            }
        }
        let mut merged = Vec::with_capacity(classes * arity);
        for &s in &first {
            for &t in &next[s * arity..(s + 1) * arity] {
                merged.push(if t == FIRE {
                    FIRE
                } else {
                    renumber[class[t as usize] as usize]
                });
            }
        }
        (merged, 0)
    }

    /// The number of states of the minimal automaton.
    pub fn states(&self) -> usize {
        self.next.len() / self.arity()
    }

    /// The number of clamped states built before merging.
    pub fn states_before_merging(&self) -> usize {
        self.built
    }

    /// The rule's window.
    pub fn window(&self) -> LimitWindow {
        self.window
    }

    /// The largest count of an accepted lot.
    pub fn largest_count(&self) -> u64 {
        self.largest
    }

    pub(crate) fn arity(&self) -> usize {
        self.largest as usize + 1
    }

    pub(crate) fn start(&self) -> usize {
        self.start as usize
    }

    pub(crate) fn transitions(&self) -> &[u32] {
        &self.next
    }
}
