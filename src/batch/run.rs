//! The parallel runner of a batch: every entry over all cores, the answers
//! in input order, and a call after each finished entry for a progress
//! display.

use std::sync::atomic::{AtomicUsize, Ordering};

use rayon::prelude::*;

/// Applies `work` to every item on rayon's pool and returns the answers in
/// the order of `items`, whatever order they finish in. After each item,
/// `progress(done, total)` is called with the number finished so far, from
/// the thread that finished it; `done` takes each value from 1 to
/// `items.len()` once.
///
/// The runner stops for nothing: `work` returns an answer for every item,
/// and an item that failed says so in its answer.
///
/// ```
/// use std::sync::atomic::{AtomicUsize, Ordering};
/// use lotsman::run_in_parallel;
/// let calls = AtomicUsize::new(0);
/// let squares = run_in_parallel(&[1, 2, 3], |x| x * x, &|_, total| {
///     assert_eq!(total, 3);
///     calls.fetch_add(1, Ordering::Relaxed);
/// });
/// assert_eq!(squares, [1, 4, 9]);
/// assert_eq!(calls.load(Ordering::Relaxed), 3);
/// ```
pub fn run_in_parallel<T, R, F>(
    items: &[T],
    work: F,
    progress: &(dyn Fn(usize, usize) + Sync),
) -> Vec<R>
where
    T: Sync,
    R: Send,
    F: Fn(&T) -> R + Sync + Send,
{
    let total = items.len();
    let done = AtomicUsize::new(0);
    items
        .par_iter()
        .map(|item| {
            let answer = work(item);
            progress(done.fetch_add(1, Ordering::Relaxed) + 1, total);
            answer
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use std::sync::Mutex;
    use std::time::Duration;

    use super::*;

    #[test]
    fn answers_keep_the_input_order_when_early_items_finish_last() {
        let items: Vec<u64> = (0..64).collect();
        let answers = run_in_parallel(
            &items,
            |&i| {
                // Early items sleep longest, so they finish after later ones.
                std::thread::sleep(Duration::from_millis(64 - i));
                i * 10
            },
            &|_, _| {},
        );
        assert_eq!(answers, items.iter().map(|i| i * 10).collect::<Vec<_>>());
    }

    #[test]
    fn progress_counts_every_item_once() {
        let items: Vec<usize> = (0..200).collect();
        let seen = Mutex::new(Vec::new());
        run_in_parallel(&items, |&i| i, &|done, total| {
            assert_eq!(total, 200);
            seen.lock().unwrap().push(done);
        });
        let mut seen = seen.into_inner().unwrap();
        seen.sort_unstable();
        assert_eq!(seen, (1..=200).collect::<Vec<_>>());
    }
}
