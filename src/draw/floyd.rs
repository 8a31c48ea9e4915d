//! Floyd's algorithm: a uniform random subset of `k` of the positions
//! `1..=n`, drawn with `k` bounded integers.

use std::collections::HashSet;

use super::generator::Generator;

/// `k` distinct positions of `1..=n`, sorted (`k <= n`; a larger `k` is
/// taken as `n`).
///
/// Floyd's algorithm (J. Bentley, "Programming pearls: a sample of
/// brilliance", Communications of the ACM 30(9), 1987): for `j` from
/// `n - k + 1` to `n`, draw `t` uniform in `1..=j`
/// ([`Generator::below`]`(j) + 1`); add `t` to the sample unless it is
/// there already, then add `j` instead. Every subset of `k` positions has
/// the same probability `1 / C(n, k)`, and exactly `k` integers are drawn.
///
/// Which positions are drawn depends only on the generator's words; the
/// set that remembers them is a bit per position when that takes less
/// memory than a hash set of the sample (`n / 8 <= 16 k` bytes), a hash
/// set otherwise.
pub fn floyd_sample(generator: &mut Generator, n: u64, k: u64) -> Vec<u64> {
    let k = k.min(n);
    if n / 8 <= k.saturating_mul(16) {
        let mut taken = Bits::new(n);
        for j in n - k + 1..=n {
            let t = generator.below(j) + 1;
            let pick = if taken.get(t) { j } else { t };
            taken.set(pick);
        }
        taken.positions(k)
    } else {
        let mut taken: HashSet<u64> = HashSet::with_capacity(usize::try_from(k).unwrap_or(0));
        for j in n - k + 1..=n {
            let t = generator.below(j) + 1;
            if !taken.insert(t) {
                taken.insert(j);
            }
        }
        let mut positions: Vec<u64> = taken.into_iter().collect();
        positions.sort_unstable();
        positions
    }
}

/// One bit per position `1..=n`.
struct Bits {
    words: Vec<u64>,
}

impl Bits {
    fn new(n: u64) -> Self {
        Bits {
            words: vec![0; usize::try_from(n.div_ceil(64)).unwrap_or(0)],
        }
    }

    /// The word and bit of position `p` (1-based).
    fn place(p: u64) -> (usize, u64) {
        let i = p - 1;
        (usize::try_from(i / 64).unwrap_or(usize::MAX), 1 << (i % 64))
    }

    fn get(&self, p: u64) -> bool {
        let (w, bit) = Self::place(p);
        self.words.get(w).is_some_and(|x| x & bit != 0)
    }

    fn set(&mut self, p: u64) {
        let (w, bit) = Self::place(p);
        if let Some(x) = self.words.get_mut(w) {
            *x |= bit;
        }
    }

    /// The positions set, in order (`count` of them).
    fn positions(&self, count: u64) -> Vec<u64> {
        let mut out = Vec::with_capacity(usize::try_from(count).unwrap_or(0));
        for (w, &word) in (0u64..).zip(&self.words) {
            let mut rest = word;
            while rest != 0 {
                out.push(w * 64 + u64::from(rest.trailing_zeros()) + 1);
                rest &= rest - 1;
            }
        }
        out
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Both ways of remembering the sample give the same positions from
    /// the same words: the sample does not depend on the lot's memory.
    #[test]
    fn bits_and_hash_set_agree() {
        for (n, k) in [
            (1000u64, 10u64),
            (200, 150),
            (64, 64),
            (65, 1),
            (100_000, 10),
        ] {
            let mut g = Generator::new(5);
            let a = floyd_sample(&mut g, n, k);
            let mut g = Generator::new(5);
            let mut taken = HashSet::new();
            for j in n - k + 1..=n {
                let t = g.below(j) + 1;
                if !taken.insert(t) {
                    taken.insert(j);
                }
            }
            let mut b: Vec<u64> = taken.into_iter().collect();
            b.sort_unstable();
            assert_eq!(a, b, "n {n}, k {k}");
        }
    }

    #[test]
    fn a_whole_lot_is_every_position() {
        let mut g = Generator::new(1);
        assert_eq!(floyd_sample(&mut g, 5, 5), vec![1, 2, 3, 4, 5]);
        assert_eq!(floyd_sample(&mut g, 5, 0), Vec::<u64>::new());
    }
}
