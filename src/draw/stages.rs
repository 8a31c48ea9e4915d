//! A draw in stages: each stage a uniform sample of the units the stages
//! before it left, from the one generator, so that a double or multiple
//! plan's later stages never inspect a unit twice, and an item-by-item
//! plan's units come in the order to inspect them.

use super::floyd::floyd_sample;
use super::generator::Generator;

/// The positions of each stage of a draw of `sizes` units, stage by stage,
/// from a lot of `lot_size` units numbered `1..=lot_size`, each stage
/// sorted, and all their positions together, sorted (the sizes must sum
/// to at most the lot size; a stage larger than the units left takes them
/// all).
///
/// The rule: stage 1 is Floyd's sample ([`floyd_sample`]) of its size from
/// `1..=lot_size`, exactly a single draw of that size. Stage `s` then
/// draws, from the same generator, Floyd's sample of its size `n_s` from
/// `1..=R`, where `R` is the number of units the stages before it left,
/// and index `i` of that sample stands for the `i`-th unit not yet drawn,
/// in increasing position. Floyd's sample is uniform over the subsets of
/// `1..=R` and the indices map one to one onto the units left, so each
/// stage is a uniform sample of the units left, and no unit is drawn
/// twice. A stage of one unit is one bounded integer: an item-by-item
/// draw is a draw of stages of one unit each.
///
/// The work: the generator's words as for a single draw of the sizes'
/// total, plus, from stage 2 on, a walk over the units drawn before
/// (`O(drawn + n_s)` per stage; `O(K^2)` for `K` stages of one unit).
pub fn draw_stages(
    generator: &mut Generator,
    lot_size: u64,
    sizes: &[u64],
) -> (Vec<Vec<u64>>, Vec<u64>) {
    let mut stages = Vec::with_capacity(sizes.len());
    // Every position drawn so far, sorted; `spare` is the buffer the next
    // merge writes into.
    let mut taken: Vec<u64> = Vec::new();
    let mut spare: Vec<u64> = Vec::new();
    for &size in sizes {
        let left = lot_size.saturating_sub(u64::try_from(taken.len()).unwrap_or(u64::MAX));
        let indices = floyd_sample(generator, left, size);
        let positions = units_left(&taken, &indices);
        if sizes.len() == 1 {
            taken.clone_from(&positions);
        } else {
            merge_sorted(&taken, &positions, &mut spare);
            std::mem::swap(&mut taken, &mut spare);
        }
        stages.push(positions);
    }
    (stages, taken)
}

/// The units that the sorted, 1-based `indices` stand for among the
/// positions not in `taken` (sorted): index `i` is the `i`-th position not
/// taken, in increasing order. The result is sorted, as the indices are.
fn units_left(taken: &[u64], indices: &[u64]) -> Vec<u64> {
    let mut out = Vec::with_capacity(indices.len());
    let mut before = taken.iter().peekable();
    // How many taken positions lie below the current unit.
    let mut skipped = 0u64;
    for &i in indices {
        let mut position = i + skipped;
        while before.next_if(|&&t| t <= position).is_some() {
            skipped += 1;
            position += 1;
        }
        out.push(position);
    }
    out
}

/// `a` and `b` (each sorted, no position in both) merged into `out`,
/// sorted.
fn merge_sorted(a: &[u64], b: &[u64], out: &mut Vec<u64>) {
    out.clear();
    out.reserve(a.len() + b.len());
    let (mut a, mut b) = (a.iter().peekable(), b.iter().peekable());
    loop {
        let next = match (a.peek(), b.peek()) {
            (Some(&&x), Some(&&y)) if x < y => a.next(),
            (Some(_), Some(_)) | (None, Some(_)) => b.next(),
            (Some(_), None) => a.next(),
            (None, None) => break,
        };
        out.extend(next);
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Hand computed: with 2, 5 and 6 taken from 1..=8, the units left are
    /// 1, 3, 4, 7, 8; indices 1, 3 and 5 stand for 1, 4 and 8.
    #[test]
    fn indices_stand_for_the_units_left() {
        assert_eq!(units_left(&[2, 5, 6], &[1, 3, 5]), vec![1, 4, 8]);
        assert_eq!(units_left(&[1, 2, 3], &[1, 2]), vec![4, 5]);
        assert_eq!(units_left(&[], &[2, 7]), vec![2, 7]);
    }

    #[test]
    fn merging_keeps_the_order() {
        let mut out = Vec::new();
        merge_sorted(&[1, 4, 9], &[2, 3, 10, 12], &mut out);
        assert_eq!(out, vec![1, 2, 3, 4, 9, 10, 12]);
        merge_sorted(&[], &[5], &mut out);
        assert_eq!(out, vec![5]);
    }

    /// Stage 1 is the single draw; drawing a whole lot in stages of one
    /// unit gives every position once.
    #[test]
    fn the_first_stage_is_the_single_draw_and_a_whole_lot_is_a_permutation() {
        let single = floyd_sample(&mut Generator::new(3), 100, 12);
        let (staged, all) = draw_stages(&mut Generator::new(3), 100, &[12, 30, 7]);
        assert_eq!(staged[0], single);
        let mut joined: Vec<u64> = staged.concat();
        joined.sort_unstable();
        assert_eq!(joined, all);
        let (items, all) = draw_stages(&mut Generator::new(4), 50, &[1; 50]);
        let mut order: Vec<u64> = items.concat();
        order.sort_unstable();
        assert_eq!(order, (1..=50).collect::<Vec<_>>());
        assert_eq!(all, order);
    }
}
